package batch

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync"
	"sync/atomic"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Options tune Run.
type Options struct {
	// Workers is the number of goroutines; 0 means runtime.GOMAXPROCS(0).
	Workers int
	// Pick names the cells whose values go into the output. Nil means the
	// default (DefaultPick); an empty non-nil slice means none.
	Pick []string
	// Progress, when set, is called from the workers with the number of
	// cases just finished (in blocks, not once per case).
	Progress func(done int)
}

// Row is the outcome of one case.
type Row struct {
	Case    *Case
	Picks   []float64 // SI; NaN when the cell could not be computed
	Utils   []float64 // one per check; NaN when not assessed
	Problem string    // the first run-time problem of the case, if any
	// Uncomputed is set when a cell of the case could not be computed (a
	// check that is not assessed is not an uncomputed cell).
	Uncomputed bool
	// Sheets with actions: the combination the picked cells that depend on
	// actions show, and each check's governing combination.
	Shown     string
	Governing []string
}

// Verdict of check k: "pass", "fail", "not assessed" (the words of the
// listing and of the JSON) or "" for a bad row.
func (r *Row) Verdict(k int) string {
	switch {
	case r.Case.Err != nil:
		return ""
	case math.IsNaN(r.Utils[k]):
		return "not assessed"
	case r.Utils[k] <= 1:
		return "pass"
	}
	return "fail"
}

// Outcome is a whole batch run.
type Outcome struct {
	Sheet  *engine.Sheet
	Cases  *Cases
	Picks  []*engine.Cell
	Checks []*engine.Cell
	Rows   []Row
}

// block is how many cases a worker takes at a time: large enough that the
// shared counter is rarely touched, small enough to keep both cores busy
// to the end.
const block = 256

// Run evaluates every good case of cs on s. It stops early, returning
// ctx.Err(), when ctx is cancelled.
func Run(ctx context.Context, s *engine.Sheet, cs *Cases, o Options) (*Outcome, error) {
	picks, err := resolvePicks(s, o.Pick)
	if err != nil {
		return nil, err
	}
	out := &Outcome{Sheet: s, Cases: cs, Picks: picks, Rows: make([]Row, len(cs.Cases))}
	for _, c := range s.Cells() {
		if c.Kind == engine.Check {
			out.Checks = append(out.Checks, c)
		}
	}
	workers := o.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	// Each worker holds a clone of the sheet's state: more workers than
	// cores buys nothing, and more than cases holds clones for nothing
	// (--workers 20000 once exhausted memory).
	workers = min(workers, max(4*runtime.GOMAXPROCS(0), 1), max(len(cs.Cases), 1))
	// Evaluate once with the written inputs; every worker starts from a
	// clone of it, so its first case recomputes only what that case sets.
	base := s.NewState()
	base.Recompute()
	// One backing array for all rows' numbers: two allocations instead of
	// two per case.
	np, nc := len(picks), len(out.Checks)
	nums := make([]float64, len(cs.Cases)*(np+nc))
	for i := range out.Rows {
		r := &out.Rows[i]
		r.Case = &cs.Cases[i]
		off := i * (np + nc)
		r.Picks = nums[off : off+np : off+np]
		r.Utils = nums[off+np : off+np+nc : off+np+nc]
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			wk := &worker{st: base.Clone(), out: out, prev: make([]funcs.Value, len(cs.Columns))}
			for ctx.Err() == nil {
				lo := int(next.Add(block)) - block
				if lo >= len(out.Rows) {
					return
				}
				hi := min(lo+block, len(out.Rows))
				for i := lo; i < hi; i++ {
					wk.run(&out.Rows[i])
				}
				if o.Progress != nil {
					o.Progress(hi - lo)
				}
			}
		}()
	}
	wg.Wait()
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	return out, nil
}

// worker evaluates cases on its own State.
type worker struct {
	st   *engine.State
	out  *Outcome
	prev []funcs.Value // the value of each column last set, nil if never
}

func (w *worker) run(r *Row) {
	cs := r.Case
	if cs.Err != nil {
		for k := range r.Picks {
			r.Picks[k] = math.NaN()
		}
		for k := range r.Utils {
			r.Utils[k] = math.NaN()
		}
		return
	}
	cols := w.out.Cases.Columns
	for j, v := range cs.Values {
		if same(w.prev[j], v) {
			continue
		}
		if err := w.st.Set(cols[j].Name, v); err != nil {
			// Read checked the value against the input; this is a fault.
			panic(fmt.Sprintf("batch: setting %s: %v", cols[j].Name, err))
		}
		w.prev[j] = v
	}
	w.st.Recompute()
	unknown := false
	for k, c := range w.out.Picks {
		x, ok := w.st.Number(c)
		if !ok {
			x, unknown = math.NaN(), true
		}
		r.Picks[k] = x
	}
	for k, c := range w.out.Checks {
		x, ok := w.st.Number(c)
		if !ok {
			x, unknown = math.NaN(), true
		}
		r.Utils[k] = x
	}
	if w.out.Sheet.Combos() != nil {
		r.Shown = shownIn(w.st, w.out.Picks)
		r.Governing = make([]string, len(w.out.Checks))
		for k, c := range w.out.Checks {
			r.Governing[k] = w.st.Governing(c)
		}
	}
	r.Uncomputed = w.st.Uncomputed() > 0
	if unknown || r.Uncomputed {
		// Rare: build the full results once to say why.
		if p := w.st.Results().Problems; len(p) > 0 {
			r.Problem = p[0].Summary
		}
	}
}

// same reports whether a and b are the same value, so that Set can be
// skipped. Numbers compare by value; other values only by identity.
func same(a, b funcs.Value) bool {
	if a == nil {
		return false
	}
	x, ok1 := a.(float64)
	y, ok2 := b.(float64)
	if ok1 && ok2 {
		return x == y
	}
	return false
}

// DefaultPick returns the cells picked when none are named: the derived
// numbers that the design checks compare (the cells each check's demand and
// capacity read directly), in reading order. These are what an engineer
// scans a case table for; the utilisation of each check is always output.
// A sheet without checks gives every derived number instead: its results
// are all there is to read.
func DefaultPick(s *engine.Sheet) []*engine.Cell {
	hasCheck := false
	for _, c := range s.Cells() {
		hasCheck = hasCheck || c.Kind == engine.Check
	}
	if !hasCheck {
		var out []*engine.Cell
		for _, c := range s.Cells() {
			if c.Kind == engine.Derived && c.Type != nil && c.Type.Kind == funcs.Number {
				out = append(out, c)
			}
		}
		return out
	}
	seen := map[int]bool{}
	for _, c := range s.Cells() {
		if c.Kind != engine.Check {
			continue
		}
		for _, i := range s.Program().Deps(c.Index) {
			seen[int(i)] = true
		}
	}
	var out []*engine.Cell
	for _, c := range s.Cells() {
		if seen[c.Index] && c.Kind == engine.Derived && c.Type != nil && c.Type.Kind == funcs.Number {
			out = append(out, c)
		}
	}
	return out
}

func resolvePicks(s *engine.Sheet, names []string) ([]*engine.Cell, error) {
	if names == nil {
		return DefaultPick(s), nil
	}
	var all []string
	for _, c := range s.Cells() {
		all = append(all, c.Name)
	}
	var out []*engine.Cell
	for _, n := range names {
		c := s.Lookup(n)
		switch {
		case c == nil:
			msg := fmt.Sprintf("--pick: the sheet has no cell `%s`", n)
			if m := diag.Nearest(n, all); m != "" {
				msg += fmt.Sprintf("; did you mean `%s`?", m)
			}
			return nil, fmt.Errorf("%s", msg)
		case c.Kind == engine.Check:
			return nil, fmt.Errorf("--pick: `%s` is a design check; its utilisation is always in the output", n)
		case c.Type == nil || c.Type.Kind != funcs.Number:
			return nil, fmt.Errorf("--pick: `%s` is a %s; only numbers can be picked", n, kindOf(c))
		}
		out = append(out, c)
	}
	return out, nil
}

// PickUnit is the unit a picked cell is written in.
func (o *Outcome) PickUnit(k int) units.Unit { return o.Sheet.DisplayUnit(o.Picks[k]) }

func kindOf(c *engine.Cell) string {
	if c.Kind == engine.Function {
		return "function"
	}
	if c.Type == nil {
		return "cell without a value"
	}
	return c.Type.Kind.String()
}

// shownIn names the combination whose values the picked cells that depend
// on actions show: one name when they all show the same one (the shown
// combination when none depends on actions), else each cell's ("N: ULS 2;
// delta: SLS-c 2"), since a cell shows the governing combination of the
// check it feeds and a serviceability check's cells are not in ULS.
func shownIn(st *engine.State, picks []*engine.Cell) string {
	var names, per []string
	for _, c := range picks {
		if n := st.CellCombination(c); n != "" {
			per = append(per, c.Name+": "+n)
			if !slices.Contains(names, n) {
				names = append(names, n)
			}
		}
	}
	switch len(names) {
	case 0:
		return st.Shown()
	case 1:
		return names[0]
	}
	return strings.Join(per, "; ")
}
