package engine

import "github.com/sheafcalc/sheaf/funcs"

// Files returns the source files the sheet was built from, the sheet itself
// first, then each template it uses (directly or through other templates)
// once, in the order first used. A watcher watches all of them.
func (s *Sheet) Files() []string {
	out := []string{s.name}
	for _, f := range s.prog.Files {
		if f.Name != s.name {
			out = append(out, f.Name)
		}
	}
	return out
}

// Number returns the current SI value of a number cell (a check's
// utilisation for a check) and whether it is known. Unlike Value it neither
// looks the cell up by name nor boxes the number, so a batch of many cases
// can read its results without allocating.
func (st *State) Number(c *Cell) (float64, bool) {
	e := st.read()
	if c == nil || c.Index >= len(st.sheet.prog.Cells) || st.sheet.prog.Cells[c.Index] != c || !e.Known(c.Index) {
		return 0, false
	}
	if c.Type != nil && (c.Type.Kind == funcs.Number || c.Kind == Check) {
		return e.F.Num[c.Index], true
	}
	return 0, false
}

// Uncomputed returns the number of cells the last evaluation could not
// compute (as Results.Uncomputed, without building the results).
func (st *State) Uncomputed() int {
	if st.cmb != nil && st.cmb.view != nil {
		// The view's cells, and the cells that failed in a check's
		// governing combination only (Results lists both).
		return st.cmb.view.Uncomputed() + len(st.cmb.probs)
	}
	return st.st.Uncomputed()
}
