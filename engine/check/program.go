package check

import (
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Kind says what a cell is.
type Kind uint8

const (
	Input    Kind = iota // its expression refers to no other cell: may be overridden
	Derived              // computed from other cells
	Check                // a design check: demand against capacity
	Function             // a user function with parameters
	Table                // a table of numbers with unit-bearing columns
)

var kindNames = [...]string{"input", "derived", "check", "function", "table"}

// String names the kind as listings and the JSON output show it
// ("input", "derived", "check", "function", "table").
func (k Kind) String() string { return kindNames[k] }

// Meta is the header of a sheet.
type Meta struct {
	Title, Project, Basis, Author, Checker, Date, Revision string
	Units                                                  string       // "metric", "us" or "" as written
	System                                                 units.System // from Units; Metric when not written
	// Combinations names the combination rules of the sheet's actions as
	// written after `combinations:` ("" when none).
	Combinations    string
	CombinationsPos diag.Range
}

// Cell is one named item of a sheet: an input, a derived cell, a check, a
// user function or a table.
type Cell struct {
	Name    string
	Kind    Kind
	HasUnit bool // a display unit was written
	Index   int  // position in Program.Cells (reading order)
	// place is the heading above the cell and the scope of its formula
	// (Section and Scope read it); nil for a cell of the sheet itself
	// before its first heading.
	place *place
	// def is the written name, annotation and span of the item (Range,
	// NameRange, Description and Reference read it); nil for a stand-in
	// cell of the checker's own.
	def *sheet.Def
	// expr is the expression as written (Expr reads it); nil for a table.
	expr *sheet.Expr
	// unit is the display unit (Unit reads it), shared by the cells that
	// write the same text; nil when none is written.
	unit    *units.Unit
	Type    *funcs.Type
	Formula *formula.Formula

	// body is the typed formula of the value (Input, Derived, Function;
	// Body reads it); nil when none was typed.
	body *typed
	// extra holds what a check, function, table or action cell has
	// beyond that; nil for an input or a derived cell, which are most of
	// a large sheet (Extra reads it).
	extra *Extra
}

// Extra is what some kinds of cell have beyond a name, a formula and its
// typed tree. It lies apart from Cell, which inputs and derived cells (most
// of a sheet) fill without it: a cell is 104 bytes smaller for them.
type Extra struct {
	// Check cells: the two sides and the operator as written ("<=" or ">=").
	Demand, Capacity Node
	Op               string
	// State is the limit state a check names after `in` (nil for the
	// default one); Cell.LimitState gives its name.
	State *sheet.Ident
	// Function cells: the parameters.
	Params []Param
	// Table cells: the value, in SI. An entry written as an expression
	// holds 0 here; Entries computes it.
	Table   *funcs.TableValue
	Entries []Entry
	// Action is the item of an action cell (`action permanent G = ...`),
	// nil for every other cell.
	Action *sheet.Action
}

// place is where a cell was written. The cells under one heading of one
// file share one place (checker.setPlace), which keeps the two texts out of
// every cell.
type place struct {
	section, scope string
}

// Section is the text of the heading above the cell, "" before the first.
func (c *Cell) Section() string {
	if c.place == nil {
		return ""
	}
	return c.place.section
}

// Scope is the prefix under which the formula's names are read: "" for a
// cell of the sheet itself, "rod." for a cell inlined from `use rod from
// ...` (an override keeps the scope of the sheet that wrote it, though its
// name is the template's "rod.P").
func (c *Cell) Scope() string {
	if c.place == nil {
		return ""
	}
	return c.place.scope
}

// Range is the span of the whole item that defines the cell.
func (c *Cell) Range() diag.Range {
	if c.def == nil {
		return diag.Range{}
	}
	return c.def.Range
}

// NameRange is the span of the cell's name as written.
func (c *Cell) NameRange() diag.Range {
	if c.def == nil {
		return diag.Range{}
	}
	return c.def.Name.Range
}

// Expr is the expression as written, "" for a table.
func (c *Cell) Expr() string {
	if c.expr == nil {
		return ""
	}
	return c.expr.Text
}

// Body is the typed tree of the value (Input, Derived, Function); the zero
// Node when the cell has none or it failed.
func (c *Cell) Body() Node {
	if c.body == nil {
		return Node{}
	}
	return c.body.node(c.body.f.Root)
}

// setBody makes n, the typed root of the cell's formula, its Body.
func (c *Cell) setBody(n Node) { c.body = n.src }

// Description is the cell's description, written after `--`.
func (c *Cell) Description() string {
	d, _ := c.annot().Text()
	return d
}

// Reference is the cell's reference, written after `@`.
func (c *Cell) Reference() string {
	_, r := c.annot().Text()
	return r
}

// annot is the cell's annotation, nil when none is written or the cell is
// a stand-in of the checker's own.
func (c *Cell) annot() *sheet.Annot {
	if c.def == nil {
		return nil
	}
	return c.def.Annot
}

// setAnnot gives the cell a description and a reference of its own: a
// copy of its definition, which other cells may share.
func (c *Cell) setAnnot(description, reference string) {
	var d sheet.Def
	if c.def != nil {
		d = *c.def
	}
	d.Annot = &sheet.Annot{Description: description, Reference: reference}
	c.def = &d
}

// Unit is the display unit, its Symbol as written; the zero Unit when
// none is written (HasUnit).
func (c *Cell) Unit() units.Unit {
	if c.unit == nil {
		return units.Unit{}
	}
	return *c.unit
}

// Extra returns what the cell has beyond its value's formula (see Extra);
// the zero Extra for an input or a derived cell. It is a copy: the checker
// alone fills a cell.
func (c *Cell) Extra() Extra {
	if c.extra == nil {
		return Extra{}
	}
	return *c.extra
}

// more returns the cell's Extra for the checker to fill, made on first use.
func (c *Cell) more() *Extra {
	if c.extra == nil {
		c.extra = new(Extra)
	}
	return c.extra
}

// Pos is where the cell's name is.
func (c *Cell) Pos() diag.Pos { return c.NameRange().Start() }

// LimitState is the limit state a check names after `in` ("" for the
// default one).
func (c *Cell) LimitState() string {
	if c.extra == nil || c.extra.State == nil {
		return ""
	}
	return c.extra.State.Name
}

// Users returns the cells that use cell i, in reading order. The slice is
// the program's: callers read it and do not change it.
func (p *Program) Users(i int) []int32 {
	at := p.userAt[i : i+2 : i+2] // one bounds check for both ends
	return p.users[at[0]:at[1]:at[1]]
}

// Deps returns the cells cell i uses, as indices into Cells, in order of
// first use (DepNames gives their names). The slice is the program's:
// callers read it and do not change it.
func (p *Program) Deps(i int) []int32 {
	if i+1 >= len(p.depAt) {
		return nil // a program the checker left before resolving names
	}
	at := p.depAt[i : i+2 : i+2] // one bounds check for both ends
	return p.deps[at[0]:at[1]:at[1]]
}

// DepNames returns the names of the cells c uses, in order of first use.
func (p *Program) DepNames(c *Cell) []string {
	deps := p.Deps(c.Index)
	names := make([]string, len(deps))
	for k, j := range deps {
		names[k] = p.Cells[j].Name
	}
	return names
}

// Entry is a table entry written as an expression of the sheet's cells,
// such as `(A_p)`: its place in the table, its formula and its typed tree,
// whose value in SI is the entry.
type Entry struct {
	Row, Col int
	Formula  *formula.Formula
	Node     Node
}

// Param is a parameter of a user function.
type Param struct {
	Name string
	Unit units.Unit // declared unit (zero for a plain number)
	Type *funcs.Type
}

// Program is a checked sheet.
type Program struct {
	File *sheet.File
	// Files lists every file the program was built from: File first, then
	// each template in the order it was first used (once each).
	Files []*sheet.File
	Meta  Meta
	Cells []*Cell
	// Factors are the sheet's factor lines (`factor gamma_Q = 1.5`), which
	// replace factors of its combination rules.
	Factors []*sheet.Factor
	// Templates lists, per template use, the template's own combination
	// rules and factor lines (a use whose template has neither is left
	// out). The using sheet's rules govern; engine.setupCombos refuses a
	// template written for another standard or with a factor the using
	// sheet does not repeat.
	Templates []TemplateCombos
	// names finds a cell by its name (index, Lookup).
	names nameIndex
	// Order lists every cell index in a topological order of the
	// dependency graph (dependencies first, level by level; see order).
	Order []int
	// users are the reverse edges, read by Users: the cells that use
	// cell i are users[userAt[i]:userAt[i+1]], in reading order. Two
	// flat int32 slices, not a slice per cell: a slice header and an int
	// per edge cost four times the room.
	userAt, users []int32
	// deps are the edges, read by Deps: the cells cell i uses are
	// deps[depAt[i]:depAt[i+1]], in order of first use.
	depAt, deps []int32
	// InCombination is set when a formula calls in_combination, so that
	// a sheet without one is not searched for its calls.
	InCombination bool
	// plugins are the plugin functions the formulas call, each once, as
	// the registry gave them when the sheet was checked (Node.Def).
	plugins []*funcs.Def
	// types are the types of the typed nodes (Node.Type), each once;
	// typeAt finds one in it.
	types  []*funcs.Type
	typeAt map[*funcs.Type]int32
	// slots are the typed nodes of every formula, one formula's after
	// another (typed.at is where a formula's begin).
	slots []slot
}

// typeIndex returns the index of t in p.types, adding it when new. Types
// are shared by pointer (every number of one dimension has one), so a
// sheet holds few.
func (p *Program) typeIndex(t *funcs.Type) int32 {
	// Most nodes of a sheet share a few types, which the program met
	// first: a look at those costs less than a map lookup per node.
	for i, x := range p.types[:min(len(p.types), 8)] {
		if x == t {
			return int32(i)
		}
	}
	if i, ok := p.typeAt[t]; ok {
		return i
	}
	if p.typeAt == nil {
		p.typeAt = map[*funcs.Type]int32{}
	}
	p.types = append(p.types, t)
	p.typeAt[t] = int32(len(p.types) - 1)
	return p.typeAt[t]
}

// plugin returns the index of d in p.plugins, adding it when new.
func (p *Program) plugin(d *funcs.Def) int32 {
	for i, x := range p.plugins {
		if x == d {
			return int32(i)
		}
	}
	p.plugins = append(p.plugins, d)
	return int32(len(p.plugins) - 1)
}

// Lookup returns the named cell or nil.
func (p *Program) Lookup(name string) *Cell {
	if i, ok := p.index(name); ok {
		return p.Cells[i]
	}
	return nil
}

// index returns the index of the named cell.
func (p *Program) index(name string) (int, bool) { return p.names.find(p.Cells, name) }

// TemplateCombos is what one template use declares about combinations.
type TemplateCombos struct {
	Prefix string     // the qualified name of the use and a dot: "hanger."
	Use    diag.Range // the use line's path in the file that writes it
	File   string     // the template's file as positions show it
	// Combinations is the template's `combinations:` value ("" when none),
	// at CombinationsPos in the template.
	Combinations    string
	CombinationsPos diag.Range
	Factors         []*sheet.Factor // the template's factor lines
}
