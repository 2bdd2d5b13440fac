package check

import (
	"slices"

	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/block"
)

// arena hands out the cells and typed formulas of a program from blocks
// (their typed nodes lie in one slice, Program.slots), and shares one
// number type per dimension. A sheet of 100,000 cells types about a
// million nodes: one allocation per node made checking a large sheet
// slow, mostly by the memory it took up fresh. The program keeps every
// cell and node for its whole life, so a block never pins memory that
// would otherwise be freed. Each kind of block grows on its own from a
// few items, so a small sheet stays small. An arena belongs to one
// checker and is used from one goroutine.
type arena struct {
	cells block.Block[cellAndFormula]
	srcs  block.Block[typed]
	nums  map[units.Dim]*funcs.Type
}

// cellAndFormula is a cell with room for its formula, so that the two
// are one allocation.
type cellAndFormula struct {
	cell Cell
	f    formula.Formula
}

// cellWith returns a new cell whose Formula is an unparsed formula of e.
func (a *arena) cellWith(e *sheet.Expr) *Cell {
	x := a.cells.One()
	x.f.Source = e
	x.cell.Formula, x.cell.expr = &x.f, e
	return &x.cell
}

// reserveCells makes room for the cells of items (at most limit) in one
// block, so a file's cells are one allocation rather than a run of
// doubling blocks, the last of them half empty.
func (a *arena) reserveCells(items []sheet.Item, limit int) {
	n := 0
	for _, it := range items {
		switch it.(type) {
		case *sheet.Cell, *sheet.FuncDef, *sheet.Check:
			n++
		}
	}
	a.cells.Reserve(min(n, limit))
}

// reserveTyped makes room for the typed nodes of every formula of p in
// p.slots: they are all parsed before the first is typed, so their sizes
// are known.
func (a *arena) reserveTyped(p *Program) {
	nodes, formulas := 0, 0
	add := func(f *formula.Formula) {
		if f != nil {
			nodes += len(f.Nodes)
			formulas++
		}
	}
	for _, c := range p.Cells {
		add(c.Formula)
		for _, e := range c.Extra().Entries {
			add(e.Formula)
		}
	}
	p.slots = slices.Grow(p.slots, nodes)
	a.srcs.Reserve(formulas)
}

// typed returns room for the typed nodes of f, one slot per syntax node.
func (a *arena) typed(f *formula.Formula, p *Program) *typed {
	s := a.srcs.One()
	s.f, s.prog, s.at = f, p, int32(len(p.slots))
	p.slots = append(p.slots, make([]slot, len(f.Nodes))...)
	return s
}

// num returns the number type of dimension d, shared by every node of that
// dimension (types are never modified once made).
func (a *arena) num(d units.Dim) *funcs.Type {
	if d == units.None {
		return numNone
	}
	if t, ok := a.nums[d]; ok {
		return t
	}
	if a.nums == nil {
		a.nums = map[units.Dim]*funcs.Type{}
	}
	t := funcs.Num(d)
	a.nums[d] = t
	return t
}
