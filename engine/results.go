package engine

import (
	"cmp"
	"math"
	"slices"
	"strconv"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Caution is the line every listing and JSON document of results carries:
// Sheaf computes, the engineer decides.
const Caution = "Results must be checked by a qualified engineer; limits, factors and load combinations come from the local code and licensed practice."

// Results are the values of every cell after an evaluation.
type Results struct {
	Meta     Meta
	Cells    []CellResult  // every cell, reading order (checks included)
	Checks   []CheckResult // the design checks, reading order
	Problems diag.List     // run-time problems, one per failed cell
	// Combos says how a sheet with actions was evaluated (nil for a sheet
	// without): the cells that depend on actions show their values in the
	// combination Combos.Shown, and each check its governing combination.
	Combos *ComboSummary
	prog   *check.Program // for Deps
}

// Deps returns the cells c uses, as indices into Cells, in order of first
// use; nil for results not made by a State.
func (r *Results) Deps(c *Cell) []int32 {
	if r.prog == nil {
		return nil
	}
	return r.prog.Deps(c.Index)
}

// CellResult is the value of one cell.
type CellResult struct {
	Cell    *Cell
	Known   bool        // false when the cell failed or a cell it uses failed
	Value   funcs.Value // SI value (float64 for numbers)
	SI      float64     // numbers: the value in SI base units
	Unit    units.Unit  // display unit
	Display float64     // numbers: the value in the display unit
	Text    string      // numbers: e.g. "121 MPa"; other kinds: a short description
}

// CheckResult is the outcome of one design check.
type CheckResult struct {
	Cell     *Cell
	Known    bool
	Demand   float64    // SI
	Capacity float64    // SI
	Unit     units.Unit // display unit of demand and capacity
	Util     float64    // demand / capacity
	Pass     bool       // Util <= 1
	// Problem says why a check whose two sides were computed is not
	// assessed (a demand of the other sense than the capacity, a capacity
	// that is not positive); nil otherwise. It is in Results.Problems too.
	// For a check that depends on actions, it is the reason in its
	// governing combination, which it names.
	Problem *diag.Diagnostic
	// Governing is the term of a min(...) or max(...) capacity that gives
	// the capacity, as written (e.g. `N_bRd`); "" when the capacity is not
	// such a choice. For a check that depends on actions, the term in its
	// governing combination.
	Governing string
	// Combo is the outcome over the combinations of its limit state, for a
	// check that depends on actions (nil for the others).
	Combo *ComboOutcome
}

// Failed returns the number of checks that fail or could not be assessed.
func (r *Results) Failed() int {
	n := 0
	for _, c := range r.Checks {
		if !c.Pass {
			n++
		}
	}
	return n
}

// Uncomputed returns the number of cells that could not be computed (run-time
// problems other than a check that is not assessed): a sheet with any is
// not a finished calculation, whatever its checks say.
func (r *Results) Uncomputed() int {
	n := len(r.Problems)
	for _, c := range r.Checks {
		if c.Problem != nil {
			n--
		}
	}
	return n
}

// Cell returns the result of the named cell, or nil.
func (r *Results) Cell(name string) *CellResult {
	for i := range r.Cells {
		if r.Cells[i].Cell.Name == name {
			return &r.Cells[i]
		}
	}
	return nil
}

// Results builds the results of the current values. The texts of the
// numbers are written into one buffer and cut from one string: a large
// sheet then allocates a few blocks instead of a string per cell.
func (st *State) Results() *Results {
	s := st.sheet
	e := st.read()
	n := len(s.prog.Cells)
	r := &Results{Meta: s.prog.Meta, Cells: make([]CellResult, n), prog: s.prog}
	buf := make([]byte, 0, 12*n)
	ends := make([]int32, n) // end of cell i's text in buf; -1 when not a number
	for i, c := range s.prog.Cells {
		cr := &r.Cells[i]
		ends[i] = -1
		if p := e.Problem(i); p != nil {
			r.Problems = append(r.Problems, p)
		}
		if st.fill(cr, i) {
			buf = units.AppendFormat(buf, cr.SI, cr.Unit, s.sigFigs)
			ends[i] = int32(len(buf))
		}
		if c.Kind == Check {
			r.Checks = append(r.Checks, st.checkResult(cr, i))
		}
	}
	texts := string(buf)
	from := int32(0)
	for i, end := range ends {
		if end >= 0 {
			r.Cells[i].Text = texts[from:end]
			from = end
		}
	}
	// Sorted by position but not thinned to one per line as diag.List.Sort
	// does: there is one problem per failed cell already, and the cells of
	// a template used twice fail on the same line of the template.
	st.addCombos(r)
	slices.SortStableFunc(r.Problems, func(a, b *diag.Diagnostic) int {
		return cmp.Or(a.Range.Start().Compare(b.Range.Start()), cmp.Compare(a.Summary, b.Summary))
	})
	return r
}

// fill sets the result of cell i but, for a number, its text; it reports
// whether the text is still to write (units.Format of SI in Unit).
func (st *State) fill(cr *CellResult, i int) (numText bool) {
	s, e := st.sheet, st.read()
	c := s.prog.Cells[i]
	*cr = CellResult{Cell: c, Known: e.Known(i), Unit: s.DisplayUnit(c)}
	if cr.Known {
		cr.Value = st.value(c)
		if x, ok := cr.Value.(float64); ok {
			cr.SI = x
			cr.Display = x / cr.Unit.Factor
			numText = c.Kind != Function
		} else {
			cr.Text = describeValue(cr.Value, s.sigFigs)
		}
	} else {
		cr.SI = math.NaN()
		cr.Display = math.NaN()
		cr.Text = "unknown"
	}
	if c.Kind == Function {
		cr.Text = "function"
	}
	return numText
}

// checkResult is the outcome of check cell i, whose cell result is cr.
func (st *State) checkResult(cr *CellResult, i int) CheckResult {
	s, e := st.sheet, st.read()
	c := s.prog.Cells[i]
	ch := CheckResult{Cell: c, Known: cr.Known, Unit: s.checkUnit(c), Demand: e.Demand[i], Capacity: e.Capacity[i], Util: math.NaN()}
	if cr.Known {
		ch.Util = cr.SI
		ch.Pass = ch.Util <= 1
		if term, ok := st.comboTerm(i); ok {
			// The view's cells may show another combination than this
			// check's governing one: the term was found in its own.
			ch.Governing = term
		} else if g := e.Governing(i); !g.IsZero() {
			ch.Governing = g.Text()
		}
	} else if e.Unassessed(i) {
		ch.Problem = e.Problem(i)
	}
	return ch
}

// Recomputed returns the indices (into Results.Cells) of the cells the
// last evaluation computed, in reading order: only their results can
// differ from those of the evaluation before.
func (st *State) Recomputed() []int {
	if st.sheet.combos != nil {
		// Every cell: the combinations move values the base state did
		// not recompute (see Update).
		idx := make([]int, len(st.sheet.prog.Cells))
		for i := range idx {
			idx[i] = i
		}
		return idx
	}
	idx := slices.Clone(st.lastIdx())
	slices.Sort(idx)
	return idx
}

// Update brings r, the results of an earlier evaluation of this state, up
// to date in place, redoing only the cells at idx (Recomputed): on a large
// sheet where one input changed, a few cells instead of all. It panics if
// r is of another sheet.
func (st *State) Update(r *Results, idx []int) {
	s := st.sheet
	if len(r.Cells) != len(s.prog.Cells) || (len(r.Cells) > 0 && r.Cells[0].Cell != s.prog.Cells[0]) {
		panic("engine: Update of the results of another sheet")
	}
	if s.combos != nil {
		// A change of one input can change the combination every cell
		// that depends on actions shows, and the governing one of every
		// check: the results are built again (Recomputed names every cell).
		*r = *st.Results()
		return
	}
	for _, i := range idx {
		cr := &r.Cells[i]
		if st.fill(cr, i) {
			cr.Text = units.Format(cr.SI, cr.Unit, s.sigFigs)
		}
		if cr.Cell.Kind == Check {
			for k := range r.Checks {
				if r.Checks[k].Cell == cr.Cell {
					r.Checks[k] = st.checkResult(cr, i)
				}
			}
		}
	}
	r.Problems = r.Problems[:0]
	for _, p := range st.st.Problems() {
		if p != nil {
			r.Problems = append(r.Problems, p)
		}
	}
	slices.SortStableFunc(r.Problems, func(a, b *diag.Diagnostic) int {
		return cmp.Or(a.Range.Start().Compare(b.Range.Start()), cmp.Compare(a.Summary, b.Summary))
	})
}

// checkUnit is the display unit of a check's demand and capacity: the
// written unit of the capacity or demand cell when the side is a bare cell
// reference, else the preferred unit.
func (s *Sheet) checkUnit(c *Cell) units.Unit {
	if c.Extra().Demand.IsZero() {
		return units.Unit{Factor: 1}
	}
	for _, side := range []Node{c.Extra().Capacity, c.Extra().Demand} {
		if side.Op() == OpCell {
			if d := s.prog.Cells[side.Index()]; d.HasUnit {
				return d.Unit()
			}
		}
	}
	u, _ := units.Preferred(c.Extra().Demand.Type().Dim, s.system)
	if u.Factor == 0 {
		u.Factor = 1
	}
	return u
}

// describeValue writes a non-numeric value briefly.
func describeValue(v funcs.Value, sig int) string {
	switch v := v.(type) {
	case bool:
		if v {
			return "yes"
		}
		return "no"
	case string:
		return v
	case []float64:
		return "list of " + strconv.Itoa(len(v))
	case []funcs.Value:
		return "list of " + strconv.Itoa(len(v))
	case *funcs.RecordValue:
		if v.Type != nil && v.Type.Name != "" {
			return v.Type.Name + " record"
		}
		return "record"
	case *funcs.TableValue:
		return "table, " + plural.Count(v.Rows(), "row")
	case *funcs.FuncValue:
		return "function"
	}
	return ""
}
