// Package report writes a sheet as a calculation document a checking
// engineer can read, mark up and sign: one self-contained HTML file (inline
// CSS and SVG, formulas in MathML, no network access) that prints on A4 or
// US Letter with a running header and footer, and that a headless browser
// turns into a PDF.
//
// The document follows the sheet's reading order: a title block with every
// header field, the Sheaf version and a SHA-256 of the sheet and of each
// template; the caution; the summary of the design checks with the
// governing one marked; for a sheet with actions, the actions, every
// combination with each check's utilisation in it and the factors with their
// sources (combos.go); the numbered sections with the sheet's comments as
// prose where they stand; for each cell its symbol, its formula typeset,
// the formula with the values substituted, the result in its display unit,
// the description and, set apart in a margin column, the reference; tables
// as tables; records as fields with units; template uses as sub-sections
// with their overrides; diagrams of bar results and drawings of sections;
// and a sign-off block.
//
// The report reads only the checked program (cells, typed trees and their
// source spans), the sheet's items for comments and reading order, and the
// results; it never parses a formula. The same sheet and results give the
// same bytes: nothing depends on the time unless Options.Stamp is set.
//
// The pictures are drawn with the package's own small SVG writer rather
// than a plotting library: they are a handful of paths, lines and labels,
// the output must be byte-for-byte deterministic and small enough to inline
// in every report, and the section drawings need exact geometry (to scale,
// holes as holes) that a general chart library does not give.
package report
