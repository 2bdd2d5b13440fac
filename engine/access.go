package engine

import "github.com/sheafcalc/sheaf/funcs"

// Files returns the source files the sheet was built from, the sheet itself
// first. A watcher watches all of them; when a sheet uses templates, their
// files join this list, so callers that watch or hash the sources need not
// change.
func (s *Sheet) Files() []string { return []string{s.name} }

// Number returns the current SI value of a number cell (a check's
// utilisation for a check) and whether it is known. Unlike Value it neither
// looks the cell up by name nor boxes the number, so a batch of many cases
// can read its results without allocating.
func (st *State) Number(c *Cell) (float64, bool) {
	if c == nil || c.Index >= len(st.sheet.prog.Cells) || st.sheet.prog.Cells[c.Index] != c || !st.st.Known[c.Index] {
		return 0, false
	}
	if c.Type != nil && (c.Type.Kind == funcs.Number || c.Kind == Check) {
		return st.st.F.Num[c.Index], true
	}
	return 0, false
}
