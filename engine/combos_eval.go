package engine

import (
	"math"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/combine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
)

// comboState is what a State of a sheet with actions keeps beside its
// base state (the inputs and the cells that do not depend on actions): the
// state of the combination shown, and per check the outcome of every
// combination of its limit state.
type comboState struct {
	view *eval.State // the base state with the actions of the shown combination; checks at their governing values
	// util[k*len(All)+m] is the utilisation of dependent check k in
	// combination m (NaN when not assessed, or not of its limit state).
	util    []float64
	dem     []float64 // demand, in the same layout as util
	capa    []float64 // capacity, likewise
	gov     []int     // per dependent check: the governing combination (index into All), -1 when none
	rank    []float64 // per dependent check: how much it governs the choice of the combination cells show
	cellIn  []int     // per cell: the combination whose value it shows, -1 for a cell that does not depend on actions
	failing []int     // per dependent check: combinations in which it fails or cannot be assessed
	count   []int     // per dependent check: combinations evaluated
	shown   int       // the combination whose values the cells show
	// term is, per dependent check whose capacity is a min(...) or
	// max(...), the term that governs it in the check's governing
	// combination ("" when none is known); nil entries elsewhere.
	term  []*string
	probs diag.List
}

// recomputeCombos evaluates the base state and then every combination.
// For each combination the action cells are set to their factored
// characteristic values on a clone of the base state, and only the cells
// downstream of them are recomputed (the incremental evaluation of
// eval.State). The clone is made once per call, not once per combination.
func (st *State) recomputeCombos() {
	cs := st.sheet.combos
	base := st.st
	base.Eval()
	cs.evalPins(base)
	cm := st.cmb
	if cm == nil {
		cm = &comboState{}
		st.cmb = cm
	}
	nc, nm := len(cs.checks), len(cs.All)
	if len(cm.util) != nc*nm {
		cm.util = make([]float64, nc*nm)
		cm.dem, cm.capa = make([]float64, nc*nm), make([]float64, nc*nm)
		cm.gov, cm.failing, cm.count = make([]int, nc), make([]int, nc), make([]int, nc)
		cm.rank = make([]float64, nc)
		cm.term = make([]*string, nc)
	}
	cm.probs = cm.probs[:0]
	chars := make([]float64, len(cs.Cells))
	known := make([]bool, len(cs.Cells))
	for a, c := range cs.Cells {
		chars[a], known[a] = base.F.Num[c.Index], base.Known(c.Index)
	}
	work := base.Clone()
	apply := func(m int) {
		f := cs.All[m].Factors
		for a, c := range cs.Cells {
			if known[a] {
				work.Set(c.Index, f[a]*chars[a])
			}
		}
		work.Eval()
	}
	for m := 0; m < nm; m++ {
		apply(m)
		state := cs.All[m].State
		for k, i := range cs.checks {
			u, d, c := math.NaN(), math.NaN(), math.NaN()
			if cs.states[k] == state {
				switch {
				case work.Known(i):
					u, d, c = work.F.Num[i], work.Demand[i], work.Capacity[i]
				case work.Unassessed(i):
					// Both sides computed, the check refused by
					// eval.Assess: a reversed demand is kept as a
					// utilisation below zero, so the most reversed
					// combination can govern; the other refusals
					// (a capacity that is not positive) stay NaN.
					d, c = work.Demand[i], work.Capacity[i]
					if reversed(d, c) {
						u = d / c
					}
				}
			}
			cm.util[k*nm+m], cm.dem[k*nm+m], cm.capa[k*nm+m] = u, d, c
		}
	}
	cur := nm - 1 // the combination work holds
	// The governing combination of each check: the first in which it cannot
	// be assessed (a failed cell, a capacity that is not positive), else the
	// one in which its demand is most reversed (a utilisation below zero),
	// else the one of the largest utilisation.
	worst, worstU := -1, math.Inf(-1)
	for k := range cs.checks {
		g, gu, unknown, rev := -1, math.Inf(-1), false, false
		cm.failing[k], cm.count[k] = 0, 0
		for m := 0; m < nm; m++ {
			if cs.All[m].State != cs.states[k] {
				continue
			}
			cm.count[k]++
			u := cm.util[k*nm+m]
			if math.IsNaN(u) || u < 0 || u > 1 {
				cm.failing[k]++
			}
			switch {
			case unknown:
			case math.IsNaN(u):
				g, unknown = m, true
			case u < 0:
				if !rev || u < gu {
					g, gu, rev = m, u, true
				}
			case rev:
			case u > gu:
				g, gu = m, u
			}
		}
		cm.gov[k] = g
		// The cells show the governing combination of the most utilised
		// check, a check of the default (ultimate) limit state before the
		// others: a design value is what a reader of N_Ed expects.
		rank := gu
		if unknown || rev {
			rank = math.Inf(1)
		}
		if cs.states[k] == combine.Default {
			rank += 1e300
		}
		cm.rank[k] = rank
		if g >= 0 && (worst < 0 || rank > worstU) {
			worst, worstU = g, rank
		}
	}
	if worst < 0 {
		worst = 0
	}
	cm.shown = worst
	// The governing values of each check, then the view: the shown
	// combination's values with every dependent check at its governing
	// combination.
	type gv struct {
		d, c, u float64
		kn      bool
		own     *diag.Diagnostic // why the check has no verdict in its governing combination
	}
	vals := make([]gv, nc)
	seen := map[string]bool{}
	prog := st.sheet.prog
	for k, i := range cs.checks {
		g := cm.gov[k]
		cm.term[k] = nil
		if g < 0 {
			continue
		}
		x := k*nm + g
		v := gv{d: cm.dem[x], c: cm.capa[x], u: cm.util[x]}
		v.kn = !math.IsNaN(v.u) && v.u >= 0
		var probs []*diag.Diagnostic
		switch {
		case v.kn:
		case !math.IsNaN(v.d) && !math.IsNaN(v.c):
			// Both sides computed: not assessed, for the reason the
			// evaluation of every sheet gives (eval.Assess).
			v.own = eval.Assess(prog.Cells[i], v.d, v.c)
		case g != worst: // the view shows the problems of worst itself
			if g != cur {
				apply(g)
				cur = g
			}
			// The check's own problem, or those of the cells it depends
			// on: in this combination only, so the view may not show them.
			if p := work.Problem(i); p != nil {
				v.own = p
			} else {
				for j, p := range work.Problems() {
					if p != nil && cs.Depends[j] {
						probs = append(probs, p)
					}
				}
			}
		}
		for _, p := range probs {
			cp := inCombo(p, cs, g)
			if !seen[cp.Summary] {
				seen[cp.Summary] = true
				cm.probs = append(cm.probs, cp)
			}
		}
		vals[k] = v
	}
	// Each cell that depends on actions shows its value in the governing
	// combination of the check it feeds that governs the most (a check of
	// the default limit state first); a cell that feeds no check, in
	// worst. The values of the other combinations are kept aside while
	// work is brought back to worst.
	n := len(st.sheet.prog.Cells)
	if len(cm.cellIn) != n {
		cm.cellIn = make([]int, n)
	}
	need := map[int][]int{}
	for i := range cm.cellIn {
		cm.cellIn[i] = -1
		if !cs.direct[i] || st.sheet.prog.Cells[i].Kind == Check {
			// A cell that reads actions only through in_combination is
			// the same in each; one that names a single combination in
			// its own formula shows that name.
			if cs.Depends[i] && !cs.direct[i] && cs.pinIn[i] >= 0 && st.sheet.prog.Cells[i].Kind != Check {
				cm.cellIn[i] = cs.pinIn[i]
			}
			continue
		}
		m, best := worst, math.Inf(-1)
		for _, k := range cs.feeds[i] {
			if cm.gov[k] >= 0 && cm.rank[k] > best {
				m, best = cm.gov[k], cm.rank[k]
			}
		}
		cm.cellIn[i] = m
		if m != worst {
			need[m] = append(need[m], i)
		}
	}
	type saved struct {
		i     int
		num   float64
		val   any
		known bool
	}
	// The governing term of a min/max capacity is found in the check's
	// own governing combination, which the view may not show.
	terms := map[int][]int{}
	for k, i := range cs.checks {
		if g := cm.gov[k]; g >= 0 && vals[k].kn && capacityChoice(prog, prog.Cells[i]) {
			terms[g] = append(terms[g], k)
		}
	}
	findTerms := func(m int) {
		for _, k := range terms[m] {
			t := ""
			if n := work.Governing(cs.checks[k]); !n.IsZero() {
				t = n.Text()
			}
			cm.term[k] = &t
		}
	}
	var keep []saved
	for m := 0; m < nm; m++ { // in order, so the result does not depend on map order
		cells := need[m]
		if m == worst || (len(cells) == 0 && len(terms[m]) == 0) {
			continue
		}
		if cur != m {
			apply(m)
			cur = m
		}
		findTerms(m)
		for _, i := range cells {
			sv := saved{i: i, num: work.F.Num[i], known: work.Known(i)}
			if work.F.Val != nil {
				sv.val = work.F.Val[i]
			}
			keep = append(keep, sv)
		}
	}
	if nm > 0 && cur != worst {
		apply(worst)
	}
	if nm > 0 {
		findTerms(worst)
	}
	for _, sv := range keep {
		work.F.Num[sv.i] = sv.num
		work.SetKnown(sv.i, sv.known)
		if work.F.Val != nil {
			work.F.Val[sv.i] = sv.val
		}
	}
	for k, i := range cs.checks {
		g := cm.gov[k]
		if g < 0 {
			continue
		}
		v := vals[k]
		own := v.own
		if !v.kn && own == nil && g == worst {
			own = work.Problem(i) // nil when a cell it uses failed (the view shows that one)
		}
		if own != nil {
			own = inCombo(own, cs, g)
		}
		work.SetProblem(i, own)
		work.F.Num[i], work.Demand[i], work.Capacity[i] = v.u, v.d, v.c
		work.SetKnown(i, v.kn)
	}
	// Action cells show their characteristic values (the cells downstream
	// keep those of the shown combination).
	for a, c := range cs.Cells {
		if known[a] {
			work.F.Num[c.Index] = chars[a]
		}
	}
	cm.view = work
}

// reversed reports whether a check with demand d and capacity c (both
// computed) was refused only because the demand has the other sign: the
// case of eval.Assess that actions produce (a tie in compression under
// uplift).
func reversed(d, c float64) bool {
	return d < 0 && !math.IsInf(d, 0) && c > 0 && !math.IsInf(c, 0)
}

// inCombo is a copy of problem p that names combination g, in which it
// holds.
func inCombo(p *diag.Diagnostic, cs *Combos, g int) *diag.Diagnostic {
	cp := *p
	cp.Summary += " (in " + cs.All[g].Name + ": " + cs.Text(g) + ")"
	return &cp
}

// capacityChoice reports whether the capacity of check c is a min(...) or
// max(...) of several terms, written in the check or in the cell it names
// (the cases eval.State.Governing names a term for).
func capacityChoice(prog *check.Program, c *Cell) bool {
	n := c.Extra().Capacity
	if n.IsZero() {
		return false
	}
	if n.Op() == check.OpCell {
		if k := int(n.Index()); k >= 0 && k < len(prog.Cells) && !prog.Cells[k].Body().IsZero() {
			n = prog.Cells[k].Body()
		}
	}
	return n.Op() == check.OpBuiltin && (n.Builtin() == check.BMin || n.Builtin() == check.BMax) && n.NArg() >= 2
}

// comboTerm returns the governing term of check cell i in its governing
// combination, and false when i does not depend on actions or its capacity
// is not a min/max (eval.State.Governing on the view then answers).
func (st *State) comboTerm(i int) (string, bool) {
	cs, cm := st.sheet.combos, st.cmb
	if cs == nil || cm == nil || cm.view == nil {
		return "", false
	}
	for k, j := range cs.checks {
		if j == i {
			if cm.term[k] == nil {
				return "", cm.gov[k] >= 0
			}
			return *cm.term[k], true
		}
	}
	return "", false
}

// read returns the state readers see: the view of a sheet with actions,
// else the base state.
func (st *State) read() *eval.State {
	if st.cmb != nil && st.cmb.view != nil {
		return st.cmb.view
	}
	return st.st
}

// clone copies the combination outcome for State.Clone.
func (cm *comboState) clone() *comboState {
	if cm == nil {
		return nil
	}
	c := *cm
	if cm.view != nil {
		c.view = cm.view.Clone()
	}
	c.util = append([]float64(nil), cm.util...)
	c.dem = append([]float64(nil), cm.dem...)
	c.capa = append([]float64(nil), cm.capa...)
	c.term = append([]*string(nil), cm.term...)
	c.gov = append([]int(nil), cm.gov...)
	c.rank = append([]float64(nil), cm.rank...)
	c.cellIn = append([]int(nil), cm.cellIn...)
	c.failing = append([]int(nil), cm.failing...)
	c.count = append([]int(nil), cm.count...)
	c.probs = append(diag.List(nil), cm.probs...)
	return &c
}

// ComboOutcome is the outcome of one check of a sheet with actions.
type ComboOutcome struct {
	State     string // the limit state it is checked in
	Governing string // name of the governing combination ("ULS 3")
	Text      string // the governing combination in words
	Clause    string // the expression it follows
	Evaluated int    // combinations evaluated for it
	Reversed  bool   // the demand has the opposite sign in the governing combination (not assessed)
	Failing   int    // combinations in which it fails or cannot be assessed
	// Utils is the utilisation in each combination of Combos.All: NaN
	// where not of its limit state or not computed, below zero where the
	// demand reversed (not assessed: such a combination governs).
	Utils []float64
}

// ComboSummary says how the cells of a sheet with actions were evaluated.
type ComboSummary struct {
	*Combos
	Shown     int // the combination that governs the most (that of the most utilised uls check)
	Evaluated int // combinations evaluated (all limit states)
	// CellIn is, per cell index, the combination whose value the cell
	// shows: the governing one of the check it feeds that governs the
	// most, else Shown; -1 for a cell that does not depend on actions and
	// for an action (it shows its characteristic value) or a check.
	CellIn []int
}

// addCombos completes r with the outcome of the combinations.
func (st *State) addCombos(r *Results) {
	cs, cm := st.sheet.combos, st.cmb
	if cs == nil || cm == nil {
		return
	}
	r.Combos = &ComboSummary{Combos: cs, Shown: cm.shown, Evaluated: len(cs.All), CellIn: append([]int(nil), cm.cellIn...)}
	for _, c := range cs.Cells {
		r.Combos.CellIn[c.Index] = -1
	}
	// The problems of the view's cells that depend on actions hold in the
	// shown combination: say which.
	// (A check's own problem names its governing combination already.)
	inView := map[*diag.Diagnostic]bool{}
	prog := st.sheet.prog
	for i, p := range cm.view.Problems() {
		if p != nil && cs.Depends[i] && prog.Cells[i].Kind != Check && (cm.cellIn[i] == cm.shown || cm.cellIn[i] < 0) {
			inView[p] = true
		}
	}
	for n, p := range r.Problems {
		if inView[p] {
			cp := *p
			cp.Summary += " (in " + cs.All[cm.shown].Name + ": " + cs.Text(cm.shown) + ")"
			r.Problems[n] = &cp
		}
	}
	r.Problems = append(r.Problems, cm.probs...)
	nm := len(cs.All)
	at := map[int]int{}
	for k, i := range cs.checks {
		at[i] = k
	}
	for n := range r.Checks {
		ch := &r.Checks[n]
		k, ok := at[ch.Cell.Index]
		if !ok {
			continue
		}
		o := &ComboOutcome{State: cs.states[k], Evaluated: cm.count[k], Failing: cm.failing[k],
			Utils: append([]float64(nil), cm.util[k*nm:(k+1)*nm]...)}
		if g := cm.gov[k]; g >= 0 {
			o.Governing, o.Text, o.Clause = cs.All[g].Name, cs.Text(g), cs.All[g].Clause
			o.Reversed = o.Utils[g] < 0
		}
		ch.Combo = o
	}
}

// Shown returns the name of the combination whose values the cells that
// depend on actions hold after the last Recompute ("" for a sheet without
// actions, or before the first).
func (st *State) Shown() string {
	cs, cm := st.sheet.combos, st.cmb
	if cs == nil || cm == nil || cm.view == nil || len(cs.All) == 0 {
		return ""
	}
	return cs.All[cm.shown].Name
}

// Governing returns the name of the governing combination of check c after
// the last Recompute ("" when c does not depend on actions).
func (st *State) Governing(c *Cell) string {
	cs, cm := st.sheet.combos, st.cmb
	if cs == nil || cm == nil || cm.view == nil {
		return ""
	}
	for k, i := range cs.checks {
		if i == c.Index && cm.gov[k] >= 0 {
			return cs.All[cm.gov[k]].Name
		}
	}
	return ""
}

// CellCombination returns the name of the combination whose value cell c
// shows after the last Recompute: for a check, its governing combination;
// for a cell that depends on actions, the combination named beside it in
// the listing. It is "" for an action (its characteristic value), for a
// cell that does not depend on actions and for a sheet without actions.
func (st *State) CellCombination(c *Cell) string {
	cs, cm := st.sheet.combos, st.cmb
	if cs == nil || cm == nil || cm.view == nil || c == nil || c.Index >= len(cm.cellIn) || st.sheet.prog.Cells[c.Index] != c {
		return ""
	}
	if c.Kind == Check {
		return st.Governing(c)
	}
	if c.Extra().Action != nil || cm.cellIn[c.Index] < 0 {
		return ""
	}
	return cs.All[cm.cellIn[c.Index]].Name
}
