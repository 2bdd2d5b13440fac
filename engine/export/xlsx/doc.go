// Package xlsxout writes the client workbook of a sheet: the deliverable an
// engineer sends, which the client reads, prints, checks and re-uses.
//
// # Layout
//
// The workbook has up to seven tabs, in the order a reader needs them:
//
//   - Summary: the header of the sheet (title, project, basis, author,
//     checker, date, revision; a placeholder is flagged), every design
//     check with its demand, capacity, utilisation (as a percentage) and
//     verdict, the caution, the record (the Sheaf version, the SHA-256 of
//     the sheet and of each template, a sign-off block) and a short guide.
//   - Calculation: every cell in reading order under its section heading,
//     with the sheet's comments in their places: name, description, the
//     expression as written, the same expression with the values
//     substituted (hand-calculation style), the value in its display
//     unit, the unit, the reference and a note.
//   - Data: the tables of the sheet, in display units under a unit-bearing
//     header; their entries are inputs unless they are locked (below).
//   - Samples: the tables Sheaf computed (bar samples, N–ε curves).
//   - Combinations (a sheet with actions, see combos.go): the actions with
//     their kinds and characteristic values, every combination in words
//     with the clause it follows and each check's utilisation in it, and
//     the factors with their sources, editable and guarded.
//   - Charts: N(x), u(x) and σ(x) of every bar result, N(ε) of every
//     curve, one a printed page, titled by the sheet's description. A
//     check that compares a sample with a limit is marked on its chart:
//     the limit as a line, the sample it uses as a point, both in the
//     legend with value and unit (chartmarks.go).
//   - Run record: the inputs as Sheaf computed with them (see Guards).
//
// A chart of bar samples marks the limit and the design point of each check
// that compares one of its samples; a chart of an N–ε curve marks the
// squash load of its composite and the strain Sheaf finds at the design
// force (chartmarks.go).
//
// Every tab prints on A4 with the column headers of the Calculation tab
// on each page; TestPrintedWorkbook checks the printed pages.
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
// Quantity literals become SI numbers, user functions are inlined, interp
// over table columns becomes an INDEX/MATCH interpolation over the Data
// tab, and a plugin function with a spreadsheet form in the registry
// (funcs.Spreadsheet: euler_load, concrete_ecm, buckling_factor,
// buckling_reduction, the fields of circle, chs, rect, rhs, i_section,
// rolled_i, rhs_rounded, angle and cft_resistance, …) becomes that form
// with its arguments in place, divided by its validity condition so that it
// is an error where the Go function is. A form may read a field of a record
// argument (transformed_area reads the composite's EA cell) or numbers Go
// computes from one (squash_load takes the plateau sums of the composite's
// laws, written as numbers: it follows its coefficient live and the
// composite through the guard of that cell). What only Sheaf can compute
// (the other plugin functions, records built by them, lists) is written as
// a value, styled grey and italic. Every formula cell also carries Sheaf's value,
// and the workbook asks for a full recalculation on load.
//
// # Guards
//
// A value only Sheaf computes cannot follow an edit, so the workbook never
// lets it pass for current. For each such value it knows the inputs it
// was computed from; the Run record tab keeps their values at the Sheaf
// run and compares them with the input cells. Once one differs, the value
// and every formula that reads it are marked out of date (their note reads
// [NoteStale], by conditional formatting they turn amber), every check that
// depends on one reads [VerdictRerun] instead of a verdict, the overall line
// counts those checks, and a banner under the Summary's title names the
// changed inputs. Tables that feed such values are locked. Verdict colours
// are conditional formats, so a verdict that flips takes its colour with
// it. TestRecomputeInAnotherSpreadsheet raises every input of every bundled
// sheet in turn and checks, in another spreadsheet engine, that each value
// is Sheaf's or marked out of date and each verdict Sheaf's or VerdictRerun.
//
// # Safety
//
// Text is always written as a string cell, never parsed as a formula. The
// file is written to a temporary file beside the destination and renamed,
// so an existing workbook is replaced only by a complete one.
package xlsxout
