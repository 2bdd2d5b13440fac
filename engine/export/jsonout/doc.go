// Package jsonout writes the results of a sheet as JSON for scripts: every
// cell with its kind, its value in SI base units and in its display unit,
// the design checks with their utilisation, and the run-time problems. Key
// order is fixed and nothing depends on the clock, so the output of one
// sheet is byte-for-byte reproducible.
package jsonout
