package sheet

// cellUnit holds a cell and its display unit: one allocation for both, as
// a long sheet is mostly cells.
type cellUnit struct {
	c Cell
	u UnitSpec
}

// newCell returns a zero cell with room for its unit, cut from a block
// the parser keeps (a sheet of 100,000 cells is 100,000 allocations
// fewer; BenchmarkLoadCheckEval100k in engine). The block grows from a
// few cells, so a small sheet stays small.
func (p *parser) newCell() *cellUnit {
	if len(p.cells) == 0 {
		p.cellBlock = min(max(2*p.cellBlock, 8), 256)
		p.cells = make([]cellUnit, p.cellBlock)
	}
	c := &p.cells[0]
	p.cells = p.cells[1:]
	return c
}
