// Command sheaf checks, evaluates and exports structural calculation
// sheets for axially loaded members.
//
// Usage:
//
//	sheaf run FILE [--set name=value]... [--json]   evaluate and print
//	sheaf check FILE                                check without evaluating
//	sheaf export FILE [-o OUT.xlsx]                 write the client workbook
//	sheaf batch SHEET CASES.csv [--out file]        one evaluation per case
//	sheaf diff OLD NEW | --rev REV FILE             compare two versions
//	sheaf fmt [--check] FILE...                     canonical layout
//	sheaf watch FILE                                re-run on every save
//	sheaf new TEMPLATE OUT.sheaf                    start from a template
//	sheaf funcs [NAME], sheaf units [--dim D]       what the language offers
//
// Exit status: 0 when everything ran and every design check passed, 1 when
// a check failed or could not be assessed (or a diff flipped one to fail),
// 2 when the input is wrong (sheet errors, flags, files), 3 for a fault in
// Sheaf itself. Scripts and CI gate on these, so they are mapped in one
// place, exitCode in root.go.
//
// Every command has the same shape: an options struct, a newXCmd
// constructor that builds the cobra command, and an unexported run
// function that writes to the injected streams of app, so that tests run
// the whole command line in process through Main. The work itself is in
// the engine packages; this package parses flags, prints and writes files
// (whole or not at all, through internal/atomicfile).
//
// Results must be checked by a qualified engineer; limits, factors and
// load combinations come from the local code and licensed practice.
package main
