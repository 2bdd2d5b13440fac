// Package batch evaluates one compiled sheet over a table of cases: a CSV
// file whose header names inputs of the sheet (`P [kN]`, `d [mm]`, or a bare
// name when the values carry their units) and whose rows give one case each.
//
// The sheet is compiled once. Each worker holds one engine.State, cloned
// from an evaluated base state, and sets only the inputs that differ from
// the row it evaluated before, so a case recomputes only the cells
// downstream of what changed. Rows are handed out in blocks and the results
// are written into a slice indexed by case, so the output is in input order
// and byte-identical whatever the number of workers.
//
// A row that cannot be read (a value of the wrong dimension, a number that
// does not parse, a wrong count of fields) is reported with its line and
// skipped; the other rows still run. A header that names no input of the
// sheet is an error for the whole file, since every row would be wrong.
package batch
