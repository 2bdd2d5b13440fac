package sheet

import "github.com/sheafcalc/sheaf/engine/diag"

// File is a parsed sheet: every line of the source, in reading order, as an
// Item. Nothing is dropped, so the canonical printer can rewrite the file
// without losing a comment or a blank line.
type File struct {
	Name string // path as given, used in positions
	Src  []byte
	// Source is the text under Name that every range of the file points
	// into.
	Source *diag.Source
	Items  []Item
	// Syntax holds the syntax problems Parse found (the same list it
	// returns). Format refuses a file that has any, so that a broken sheet
	// is never rewritten.
	Syntax diag.List
}

// Item is one top-level construct: *Meta, *Heading, *Comment, *Blank, *Cell,
// *FuncDef, *Check, *Table, *Use, *Action or *Factor.
type Item interface {
	Span() diag.Range
}

// Ident is a name with its place.
type Ident struct {
	Name  string
	Range diag.Range
}

// UnitSpec is a display unit or parameter unit written in square brackets,
// kept as written (without the brackets).
type UnitSpec struct {
	Text  string
	Range diag.Range // of Text, inside the brackets
}

// Annot is the trailing annotation of a cell: "-- description @ reference".
// Items hold it by pointer, nil when none is written: most cells of a large
// sheet have none, and the pointer is 40 bytes less than the value.
type Annot struct {
	Description string
	Reference   string
	Range       diag.Range // from "--" to the end of the line
}

// Text returns the description and the reference of a; both are "" for a
// nil a (no annotation written).
func (a *Annot) Text() (description, reference string) {
	if a == nil {
		return "", ""
	}
	return a.Description, a.Reference
}

// Expr is an expression exactly as written: Text is the source between the
// "=" (or ":") and the annotation, trimmed, possibly spanning several lines
// (newlines and indentation kept). Number and unit literals are kept verbatim.
type Expr struct {
	Text  string
	Range diag.Range
}

// RangeAt returns the source range of bytes [from, to) within e.Text.
func (e Expr) RangeAt(from, to int) diag.Range {
	from = min(max(from, 0), len(e.Text))
	to = min(max(to, from), len(e.Text))
	return e.Range.Sub(from, to)
}

// Meta is a header line "key: value" (title, project, basis, author,
// checker, date, revision, units).
type Meta struct {
	Key   Ident
	Value string
	Range diag.Range
}

// Heading is a section heading line "## text".
type Heading struct {
	Text  string
	Range diag.Range
}

// Comment is a full-line comment "# text"; Text excludes the "#".
type Comment struct {
	Text  string
	Range diag.Range
}

// Blank is an empty line (kept so the printer can keep paragraphs).
type Blank struct {
	Range diag.Range
}

// Def is what every item that defines a cell has: the name, the
// annotation and the span of the whole item, all its lines. The checker's
// cells point at it rather than copy it.
type Def struct {
	Name  Ident
	Annot *Annot     // nil when none is written
	Range diag.Range // the whole item, all its lines
}

// Cell is "name [unit] = expr -- description @ reference".
type Cell struct {
	Def
	Unit *UnitSpec // nil when no display unit is written
	Expr Expr
}

// Param is a parameter of a user function: "name [unit]"; Unit may be nil
// (a plain number).
type Param struct {
	Name Ident
	Unit *UnitSpec
}

// FuncDef is a user function "name(p1 [unit], p2) [unit] = expr -- ...".
type FuncDef struct {
	Def
	Params []Param
	Unit   *UnitSpec // result display unit; nil if not written
	Body   Expr
}

// Check is "check name: demand <= capacity -- ... @ ...". Body holds the whole
// comparison; the checker splits it at its top-level comparison operator.
type Check struct {
	Def
	// State is the limit state written after `in` (`check sag in
	// frequent: ...`); its Name is "" when none is written (the default,
	// ultimate limit state).
	State Ident
	Body  Expr
}

// Column is a table column header "name [unit]".
type Column struct {
	Name Ident
	Unit *UnitSpec
}

// Literal is one table entry as written: a plain number in the unit of
// its column, or (Expr set) a bracketed expression of the sheet's cells,
// such as `(A_p)` or `(2 * A_p)`.
type Literal struct {
	Text  string
	Range diag.Range
	Expr  bool
}

// Table is "table name -- ..." followed by an indented header row and
// indented data rows.
type Table struct {
	Def
	Columns []Column
	Rows    [][]Literal
}

// Use is "use name from "path" -- ..." followed by indented override cells.
type Use struct {
	Name      Ident
	Path      string
	PathRange diag.Range
	Overrides []*Cell
	Annot     *Annot // nil when none is written
	Range     diag.Range
}

// Span returns the header line's range.
func (m *Meta) Span() diag.Range { return m.Range }

// Span returns the heading line's range.
func (h *Heading) Span() diag.Range { return h.Range }

// Span returns the comment line's range.
func (c *Comment) Span() diag.Range { return c.Range }

// Span returns the blank line's range.
func (b *Blank) Span() diag.Range { return b.Range }

// Span returns the range of the cell, continuation lines included.
func (c *Cell) Span() diag.Range { return c.Range }

// Span returns the range of the function definition.
func (f *FuncDef) Span() diag.Range { return f.Range }

// Span returns the range of the check.
func (c *Check) Span() diag.Range { return c.Range }

// Span returns the range of the table, its rows included.
func (t *Table) Span() diag.Range { return t.Range }

// Span returns the range of the use line and its overrides.
func (u *Use) Span() diag.Range { return u.Range }
