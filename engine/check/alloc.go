package check

import (
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// arena hands out the typed nodes of a program from blocks, and shares one
// number type per dimension. A sheet of 100,000 cells types about a million
// nodes: one allocation per node (and one per argument list) made checking
// a large sheet slow, mostly by the memory it took up fresh. The program
// keeps every node for its whole life, so a block never pins memory that
// would otherwise be freed. An arena belongs to one checker and is used
// from one goroutine.
type arena struct {
	cells []cellAndFormula
	nodes []Node
	args  []*Node
	block int // size of the next block; grows so small programs stay small
	nums  map[units.Dim]*funcs.Type
}

const maxBlock = 1024

func (a *arena) grow() int {
	a.block = min(max(2*a.block, 16), maxBlock)
	return a.block
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
		a.cells = make([]cellAndFormula, min(a.grow(), 256))
	}
	x := &a.cells[0]
	a.cells = a.cells[1:]
	x.f.Source = e
	x.cell.Formula = &x.f
	return &x.cell
}

// node returns a new node holding a copy of args.
func (a *arena) node() *Node {
	if len(a.nodes) == 0 {
		a.nodes = make([]Node, a.grow())
	}
	n := &a.nodes[0]
	a.nodes = a.nodes[1:]
	return n
}

// argList returns a copy of args with no spare capacity, so an append by
// a later phase cannot write into the next node's arguments.
func (a *arena) argList(args []*Node) []*Node {
	k := len(args)
	if k == 0 {
		return nil
	}
	if k > maxBlock/4 {
		return append([]*Node(nil), args...)
	}
	if len(a.args) < k {
		a.args = make([]*Node, max(a.grow(), k))
	}
	out := a.args[:k:k]
	a.args = a.args[k:]
	copy(out, args)
	return out
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
