// Package check turns a parsed sheet into a checked program: it resolves
// every name, builds the dependency graph and its topological order, finds
// cycles, and types every formula with Sheaf's own rules (numbers carry a
// physical dimension; records, lists, tables and functions have shapes).
// Problems of the whole file are collected at once, each with a range, a
// detail sentence and a hint.
//
// A plane angle is a dimension of its own (units.Angle), not a plain number:
// sin, cos and tan take one, asin, acos, atan and atan2 give one, and a
// plain number in a cell shown in degrees is refused (builtins.go). A product
// or quotient whose dimension exponent overflows (units.Overflow) is an error
// at that expression, never a wrapped dimension.
//
// One mistake gives one message, yet a second, independent mistake is not
// hidden by the first: a cell that fails but declares its dimension (a
// display unit `P [kN] = ...`, or a user function's result unit) stands in
// with that dimension for the cells that use it, which are then checked as
// usual; a failed cell that declares nothing keeps its users silent. Cells
// that failed or were typed from stand-ins stay untyped and never run.
//
// A sheet that uses templates (`use rod from "hanger.sheaf"`) is checked
// as one program: the checker asks the caller's Loader (template.go) for
// each template — the files on disk by default (fileloader.go: inside the
// project root, regular files only), or a git revision — refuses absolute
// paths and loops, and parses each file once; the
// template's cells are inlined under qualified names such as `rod.sigma`
// (use.go), so dependencies, typing and evaluation cross the boundary
// without a second mechanism. Positions keep their own file, and
// Program.Files lists every file read.
//
// The output is a typed tree of Nodes per cell that the evaluator compiles;
// nothing here runs a formula, except folding the constant exponent of a
// power, which the dimension rule needs.
package check
