package eval

// schedule returns the run order of m's program and records each cell's
// position in it in m.runPos. Evaluations run the cells in this order and
// the closures are compiled (laid out in memory) in it: a topological
// order that keeps reading order wherever the dependencies allow (a
// depth-first walk from each cell in reading order that places a cell's
// dependencies, in their order of first use, before it). On a sheet
// written top down it is reading order itself.
//
// Program.Order is also topological, but breadth first: on a large sheet
// of many chains it takes one cell of each chain in turn, so the cells an
// incremental recompute runs (one chain) would lie a chain's width apart
// in memory, each on its own cache lines. Laid out in this order they lie
// side by side, for the full evaluation and for a recompute alike. Any
// topological order gives the same values; Program.Order stays the order
// State.Last reports.
//
// The cells on a cycle (which check left untyped: they evaluate as
// unknown) are placed where the walk meets them; every other cell still
// comes after all its dependencies, since a dependency still being walked
// when a cell is placed would put that cell on a cycle.
func (m *Machine) schedule() []int {
	p := m.P
	n := len(p.Cells)
	order := make([]int, 0, n)
	const (
		unseen = iota
		walking
		placed
	)
	state := make([]uint8, n)
	type visit struct{ i, next int } // next: the dependency to look at next
	var stack []visit
	for root := range p.Cells {
		if state[root] != unseen {
			continue
		}
		state[root] = walking
		stack = append(stack, visit{i: root})
		for len(stack) > 0 {
			top := &stack[len(stack)-1]
			if deps := p.Cells[top.i].DepIdx; top.next < len(deps) {
				j := deps[top.next]
				top.next++
				if state[j] == unseen {
					state[j] = walking
					stack = append(stack, visit{i: j})
				}
				continue
			}
			state[top.i] = placed
			order = append(order, top.i)
			stack = stack[:len(stack)-1]
		}
	}
	m.runPos = make([]int32, n)
	for k, i := range order {
		m.runPos[i] = int32(k)
	}
	return order
}
