// Package diag holds source positions, ranges and diagnostics for every phase
// of Sheaf. It imports only the standard library so that the sheet reader,
// the unit parser, the checker and the evaluator can all report problems in
// one shape, and so that rendering stays apart from producing.
package diag
