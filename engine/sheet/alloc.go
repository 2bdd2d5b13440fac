package sheet

// cellUnit holds a cell and its display unit: one allocation for both, as
// a long sheet is mostly cells.
type cellUnit struct {
	c Cell
	u UnitSpec
}

// newCell returns a zero cell with room for its unit, cut from a block
// the parser keeps (a sheet of 100,000 cells is 100,000 allocations
// fewer; BenchmarkLoadCheckEval100k in engine). The blocks grow from a
// few cells, so a small sheet stays small.
func (p *parser) newCell() *cellUnit {
	return p.cells.One()
}
