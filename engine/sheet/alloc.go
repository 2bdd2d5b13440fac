package sheet

// cellUnit holds a cell and its display unit: one allocation for both, as
// a long sheet is mostly cells.
type cellUnit struct {
	c Cell
	u UnitSpec
}

// newCell returns a zero cell with room for its unit.
func (p *parser) newCell() *cellUnit { return &cellUnit{} }
