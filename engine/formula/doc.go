// Package formula is the expression layer of a sheet. It takes the text of
// one expression as written (with quantity literals such as `38 kN` or
// `7850 kg/m^3`), replaces every quantity literal by a synthetic identifier
// so that expr-lang's parser accepts the text, parses it, and maps every
// position back to the sheet. It also rejects, with a clear message, the
// parts of expr-lang's syntax that the sheet language does not offer
// (closures, pipes, `let`, ranges, `??`, `%` as modulo, ...).
//
// Parsing goes through a hand-written parser for the common subset of
// formulas (fastparse.go) that builds the very nodes, with the very
// locations, that expr-lang's parser builds; anything outside the subset
// and every syntax error goes to expr-lang, so its messages are unchanged.
// A differential test over every formula of the repository and a fuzz
// target hold the two parsers to the same trees. Loading a sheet of
// 100,000 cells spent most of its time in expr-lang's parser before.
//
// The result keeps the expr-lang syntax tree (Tree), the literals that were
// replaced (Quantities) and the names the formula refers to (Refs): the
// checker types the tree, the evaluator compiles it, and the workbook
// exporter rewrites it as a spreadsheet formula.
package formula
