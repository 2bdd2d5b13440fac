// Package xlsxout writes the client workbook of a sheet: the deliverable an
// engineer sends, which the client reads, prints, checks and re-uses.
//
// # Layout
//
// The workbook has up to four tabs, in the order a reader needs them:
//
//   - Summary: the header of the sheet (title, project, basis, author,
//     checker, date, revision), every design check with its demand,
//     capacity, utilisation and verdict, the caution, and a short guide to
//     the colours.
//   - Calculation: every cell in reading order under its section heading:
//     name, description, the expression as written, the same expression
//     with the values substituted (hand-calculation style), the value in
//     its display unit, the unit, the reference and a note.
//   - Data: every table (tables of the sheet, bar samples, N–ε curves) in
//     display units under a unit-bearing header.
//   - Charts: N(x), u(x) and σ(x) of every bar result, N(ε) of every curve.
//
// # Live formulas
//
// Every value cell is a workbook defined name (see [DefinedName] for the
// names a spreadsheet would misread). Values are stored in their display
// units, so a client types 45 in a kN cell. A formula is the expression in
// SI built from the names, each multiplied by its display factor, divided
// by the result's display factor:
//
//	sigma [MPa] = N_Ed / A_s   ->   ((N_Ed*1000)/(A_s*1E-06))/1000000
//
// Quantity literals become SI numbers, user functions are inlined, and
// interp over table columns becomes an INDEX/MATCH interpolation over the
// Data tab. What only Sheaf can compute (plugin functions, records built by
// them, lists) is written as a value, styled grey and italic, with a note
// saying why. Every formula cell also carries Sheaf's value, and the
// workbook asks for a full recalculation on load.
//
// # Safety
//
// Text is always written as a string cell, never parsed as a formula. The
// file is written to a temporary file beside the destination and renamed,
// so an existing workbook is replaced only by a complete one.
package xlsxout
