package check

import (
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// arena hands out the cells and typed nodes of a program from blocks, and
// shares one number type per dimension. A sheet of 100,000 cells types
// about a million nodes: one allocation per node made checking a large
// sheet slow, mostly by the memory it took up fresh. The program keeps
// every cell and node for its whole life, so a block never pins memory
// that would otherwise be freed. Each kind of block grows on its own from
// a few items, so a small sheet stays small. An arena belongs to one
// checker and is used from one goroutine.
type arena struct {
	cells              []cellAndFormula
	srcs               []typed
	nodes              []Node
	cellN, srcN, nodeN int // size of the next block of each kind
	nums               map[units.Dim]*funcs.Type
}

// grow doubles a block size, from 16 up to limit, and returns it.
func grow(size *int, limit int) int {
	*size = min(max(2**size, 16), limit)
	return *size
}

// cellAndFormula is a cell with room for its formula, so that the two
// are one allocation.
type cellAndFormula struct {
	cell Cell
	f    formula.Formula
}

// cellWith returns a new cell whose Formula is an unparsed formula of e.
func (a *arena) cellWith(e sheet.Expr) *Cell {
	if len(a.cells) == 0 {
		a.cells = make([]cellAndFormula, grow(&a.cellN, 256))
	}
	x := &a.cells[0]
	a.cells = a.cells[1:]
	x.f.Source = e
	x.cell.Formula = &x.f
	return &x.cell
}

// typed returns room for the typed nodes of f, one slot per syntax node.
func (a *arena) typed(f *formula.Formula, p *Program) *typed {
	if len(a.srcs) == 0 {
		a.srcs = make([]typed, grow(&a.srcN, 256))
	}
	s := &a.srcs[0]
	a.srcs = a.srcs[1:]
	k := len(f.Nodes)
	switch {
	case k > 256:
		s.nodes = make([]Node, k)
	default:
		if len(a.nodes) < k {
			a.nodes = make([]Node, max(grow(&a.nodeN, 4096), k))
		}
		s.nodes = a.nodes[:k:k]
		a.nodes = a.nodes[k:]
	}
	s.f, s.prog = f, p
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
