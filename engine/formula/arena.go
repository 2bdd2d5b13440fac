package formula

import (
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/block"
)

// Arena hands out the slices of many formulas from shared blocks. Parsing
// a formula on its own allocates three small slices; a sheet of 100,000
// cells parsed so spends much of its time in the allocator and the
// garbage collector (BenchmarkLoadCheckEval100k, engine/bench_test.go).
// With an Arena the parser works in slices it reuses and copies each
// result into a block at its exact length, so a formula takes no spare
// capacity and no allocation of its own. The slices have no spare
// capacity: an append by a caller copies, never writes into the next
// formula. Each kind of slice has blocks of its own, which grow with what
// the sheet holds of it (a sheet with few quantities keeps small quantity
// blocks). An Arena is used from one goroutine; its formulas live as long
// as any of them is reachable.
type Arena struct {
	// the slices the parser appends to, reused
	scratchNodes  []Node
	scratchArgs   []int32
	scratchQuants []Quantity
	nodes         block.Block[Node]
	args          block.Block[int32]
	quants        block.Block[Quantity]
	sides         block.Block[side]
	units         map[string]*units.Unit // the units of quantity literals, by their text
}

// keep copies the parsed slices of f and p (held in the scratch slices)
// into the arena's blocks, and keeps the grown scratch slices for the next
// formula.
func (a *Arena) keep(f *Formula, p *parser) {
	a.scratchNodes, a.scratchArgs, a.scratchQuants = f.Nodes, p.argList, p.quants
	f.Nodes = a.nodes.Copy(f.Nodes)
	if len(p.argList) > 0 || len(p.quants) > 0 {
		f.side = a.sides.One()
		f.side.args = a.args.Copy(p.argList)
		f.side.quants = a.quants.Copy(p.quants)
	}
}
