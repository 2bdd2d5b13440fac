package eval_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"sync"
	"testing"

	"github.com/sheafcalc/sheaf/engine/eval"
)

// randomSheet writes a sheet of plain numbers: inputs in0..in{n-1}, then
// derived cells each over one to three earlier cells, so that the
// dependency graph is a random DAG with shared and independent parts.
func randomSheet(rng *rand.Rand, inputs, derived int) string {
	var b strings.Builder
	names := make([]string, 0, inputs+derived)
	for i := range inputs {
		n := fmt.Sprintf("in%d", i)
		fmt.Fprintf(&b, "%s = %g\n", n, float64(rng.IntN(200)-100)/8)
		names = append(names, n)
	}
	forms := []string{
		"(%[1]s + %[2]s) / 2",
		"0.75 * %[1]s - 0.25 * %[2]s",
		"hypot(%[1]s, %[3]s)",
		"max(%[1]s, %[2]s) - min(%[1]s, %[3]s)",
		"sin(%[1]s * 1 rad) * %[2]s",
		"%[1]s > %[2]s ? %[1]s : %[3]s + 1",
		"%[1]s * 1.5",
	}
	for i := range derived {
		// Prefer recent cells, so that chains are long as well as wide.
		pick := func() string {
			k := len(names) - 1 - rng.IntN(min(len(names), 12))
			if rng.IntN(4) == 0 {
				k = rng.IntN(len(names))
			}
			return names[k]
		}
		n := fmt.Sprintf("c%d", i)
		fmt.Fprintf(&b, "%s = %s\n", n, fmt.Sprintf(forms[rng.IntN(len(forms))], pick(), pick(), pick()))
		names = append(names, n)
	}
	return b.String()
}

// sameValues reports the first cell where two states differ in whether a
// value is known, in the value's bits, or in whether a problem is
// reported; "" when they agree everywhere.
func sameValues(m *eval.Machine, a, b *eval.State) string {
	for _, c := range m.P.Cells {
		i := c.Index
		if a.Known(i) != b.Known(i) || (a.Problem(i) == nil) != (b.Problem(i) == nil) ||
			math.Float64bits(a.F.Num[i]) != math.Float64bits(b.F.Num[i]) {
			return fmt.Sprintf("%s: known %v/%v, value %.17g/%.17g, problem %v/%v",
				c.Name, a.Known(i), b.Known(i), a.F.Num[i], b.F.Num[i], a.Problem(i), b.Problem(i))
		}
	}
	return ""
}

// downstream lists the cells that use any of the changed cells, directly
// or not, the changed cells included; it follows the names each cell
// depends on (Program.DepNames), not the evaluator's reverse edges.
func downstream(m *eval.Machine, changed []int) map[int]bool {
	users := map[string][]int{}
	for _, c := range m.P.Cells {
		for _, d := range m.P.DepNames(c) {
			users[d] = append(users[d], c.Index)
		}
	}
	out := map[int]bool{}
	work := slices.Clone(changed)
	for len(work) > 0 {
		i := work[len(work)-1]
		work = work[:len(work)-1]
		if out[i] {
			continue
		}
		out[i] = true
		work = append(work, users[m.P.Cells[i].Name]...)
	}
	return out
}

// TestIncrementalExact: after any sequence of Set, Reset and Eval, a state
// holds exactly the values (to the bit) that a fresh state with the same
// overrides computes from scratch, and each Eval ran exactly the cells
// downstream of what changed, every cell after the cells it uses.
func TestIncrementalExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	const inputs = 12
	m := compile(t, randomSheet(rng, inputs, 300))
	st := m.NewState()
	if got := len(st.Eval()); got != len(m.P.Cells) {
		t.Fatalf("the first Eval ran %d cells of %d", got, len(m.P.Cells))
	}
	if got := st.Eval(); len(got) != 0 {
		t.Fatalf("an Eval with nothing changed ran %d cells", len(got))
	}
	over := map[int]float64{}
	for round := range 200 {
		var changed []int
		for range 1 + rng.IntN(3) {
			i := cell(t, m, fmt.Sprintf("in%d", rng.IntN(inputs))).Index
			changed = append(changed, i)
			if rng.IntN(5) == 0 {
				st.Reset(i)
				delete(over, i)
				continue
			}
			v := float64(rng.IntN(2000)-1000) / 16
			st.Set(i, v)
			over[i] = v
		}
		ran := st.Eval()
		if !slices.Equal(ran, st.Last()) {
			t.Fatalf("round %d: Last does not report the cells Eval ran", round)
		}

		want := downstream(m, changed)
		if len(ran) != len(want) {
			t.Fatalf("round %d: Eval ran %d cells, %d lie downstream of %v", round, len(ran), len(want), changed)
		}
		pos := map[int]int{}
		for k, i := range ran {
			if !want[i] {
				t.Fatalf("round %d: Eval ran %s, which is not downstream of the change", round, m.P.Cells[i].Name)
			}
			pos[i] = k
		}
		for k, i := range ran {
			for _, dep := range m.P.Deps(i) {
				d := int(dep)
				if p, ok := pos[d]; ok && p > k {
					t.Fatalf("round %d: %s ran before %s, which it uses", round, m.P.Cells[i].Name, m.P.Cells[d].Name)
				}
			}
		}

		fresh := m.NewState()
		for i, v := range over {
			fresh.Set(i, v)
		}
		fresh.Eval()
		if d := sameValues(m, st, fresh); d != "" {
			t.Fatalf("round %d: incremental and fresh differ at %s", round, d)
		}
		for _, c := range m.P.Cells {
			_, isOver := over[c.Index]
			if st.Overridden(c.Index) != isOver {
				t.Fatalf("round %d: %s overridden=%v, want %v", round, c.Name, st.Overridden(c.Index), isOver)
			}
		}
	}
	if ran := st.Eval(); len(ran) != 0 || len(st.Last()) != 0 {
		t.Errorf("an Eval with nothing changed ran %d cells (Last says %d)", len(ran), len(st.Last()))
	}
}

// TestClone: a clone is independent of its original in both directions
// (values, overrides, pending changes), and starts from the original's
// state: evaluated or not, with its pending changes.
func TestClone(t *testing.T) {
	m := compile(t, randomSheet(rand.New(rand.NewPCG(3, 5)), 6, 80))
	in0, in1 := cell(t, m, "in0").Index, cell(t, m, "in1").Index

	fresh := m.NewState().Clone()
	if got := len(fresh.Eval()); got != len(m.P.Cells) {
		t.Errorf("a clone of an unevaluated state ran %d cells on its first Eval, want all %d", got, len(m.P.Cells))
	}

	st := m.NewState()
	st.Eval()
	before := slices.Clone(st.F.Num)
	cl := st.Clone()
	cl.Set(in0, 42)
	cl.Eval()
	cl.F.Num[in1] = -1 // a write through the clone's slots
	if !slices.Equal(st.F.Num, before) {
		t.Error("changing the clone changed the original's values")
	}
	if got := st.Eval(); len(got) != 0 {
		t.Errorf("the clone's Set made the original run %d cells", len(got))
	}
	if st.Overridden(in0) || !cl.Overridden(in0) {
		t.Error("overrides are not independent")
	}

	// A change pending in the original goes with the clone, and stays
	// pending in the original.
	st.Set(in1, 9.5)
	cl2 := st.Clone()
	a, b := slices.Clone(st.Eval()), slices.Clone(cl2.Eval())
	if !slices.Equal(a, b) || len(a) == 0 {
		t.Errorf("pending change: original ran %d cells, clone %d", len(a), len(b))
	}
	if d := sameValues(m, st, cl2); d != "" {
		t.Errorf("original and clone differ after the same change at %s", d)
	}
	st.Set(in0, 1)
	st.Eval()
	if d := sameValues(m, cl2, func() *eval.State {
		f := m.NewState()
		f.Set(in1, 9.5)
		f.Eval()
		return f
	}()); d != "" {
		t.Errorf("the original's later Set reached the clone at %s", d)
	}
}

// TestClonesInParallel: clones of one state evaluated on several
// goroutines (run with -race) give what each case gives alone.
func TestClonesInParallel(t *testing.T) {
	m := compile(t, randomSheet(rand.New(rand.NewPCG(9, 1)), 4, 200))
	base := m.NewState()
	base.Eval()
	in0 := cell(t, m, "in0").Index
	const workers = 8
	got := make([]*eval.State, workers)
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			cl := base.Clone()
			for k := range 50 {
				cl.Set(in0, float64(w*100+k))
				cl.Eval()
			}
			got[w] = cl
		}()
	}
	wg.Wait()
	for w, cl := range got {
		want := m.NewState()
		want.Set(in0, float64(w*100+49))
		want.Eval()
		if d := sameValues(m, cl, want); d != "" {
			t.Errorf("worker %d differs from a lone evaluation at %s", w, d)
		}
	}
}

// TestRecomputeSteps: an incremental Eval after each change gives what a
// fresh evaluation with the same overrides gives, and lists exactly the
// cells downstream of the change in Program.Order, through the paths off
// the fast one: a cell that fails (or becomes NaN or infinite) in the
// middle of a recompute and recovers later, a cell that failed before and
// lies outside the change, an overridden cell downstream of the change
// (the evaluator's own Set takes any cell), function bodies, checks,
// tables with entries that follow a cell, cells written before the cells
// they use, and cells that run in another order than they are listed in.
func TestRecomputeSteps(t *testing.T) {
	type step struct {
		reset   bool // Reset cell instead of setting it to v
		cell    string
		v       float64
		unknown []string           // the cells left without a value
		values  map[string]float64 // hand arithmetic, exact
	}
	cases := []struct {
		name  string
		src   string
		steps []step
		// reordered: the cells of the first step run in another order
		// than they are written (Program.Order puts a cell after the ones
		// it uses), and Last lists them in the order they ran.
		reordered bool
	}{
		{name: "a cell fails mid-recompute and recovers",
			src: "in0 = 1\nd = 1 / (in0 - 2)\ne = d + in0\nf = in0 * 3\n",
			steps: []step{
				{cell: "in0", v: 2, unknown: []string{"d", "e"}, values: map[string]float64{"f": 6}},
				{cell: "in0", v: 3, values: map[string]float64{"d": 1, "e": 4, "f": 9}},
			}},
		{name: "a failure reaches cells through other stale cells",
			src: "in0 = 1\nd = 1 / (in0 - 2)\ne = d * 2\nf = e + 1\ng = in0 + 1\n",
			steps: []step{
				{cell: "in0", v: 2, unknown: []string{"d", "e", "f"}, values: map[string]float64{"g": 3}},
				{cell: "in0", v: 4, values: map[string]float64{"d": 0.5, "e": 1, "f": 2, "g": 5}},
				{cell: "in0", v: 2, unknown: []string{"d", "e", "f"}, values: map[string]float64{"g": 3}},
			}},
		{name: "infinite and NaN mid-recompute",
			src: "x = 1\ny = x * 1e300\nz = y * 1e10\nw = x * 0\n",
			steps: []step{
				{cell: "x", v: 2, unknown: []string{"z"}, values: map[string]float64{"y": 2e300, "w": 0}},
				{cell: "x", v: math.Inf(1), unknown: []string{"y", "z", "w"}},
				{cell: "x", v: 0.5e-20, values: map[string]float64{"y": 0.5e280, "w": 0}},
			}},
		{name: "a cell that failed before, outside the change",
			src: "zero = 0\nbad = 1 / zero\nin0 = 1\ne = bad + in0\ng = in0 * 2\n",
			steps: []step{
				{cell: "in0", v: 4, unknown: []string{"bad", "e"}, values: map[string]float64{"g": 8}},
			}},
		{name: "an overridden cell downstream",
			src: "in0 = 1\nc = in0 * 2\nd = c + in0\n",
			steps: []step{
				{cell: "c", v: 7, values: map[string]float64{"c": 7, "d": 8}},
				{cell: "in0", v: 5, values: map[string]float64{"c": 7, "d": 12}},
				{reset: true, cell: "c", values: map[string]float64{"c": 10, "d": 15}},
			}},
		{name: "a function body reads a cell",
			src: "k = 3\nf(z) = z * k\nin0 = 2\ny = f(in0) + 1\n",
			steps: []step{
				{cell: "k", v: 4, values: map[string]float64{"y": 9}},
				{cell: "in0", v: 5, values: map[string]float64{"y": 21}},
			}},
		{name: "a check",
			src: "dem = 1\ncap = 2\ncheck u: dem <= cap\n",
			steps: []step{
				{cell: "cap", v: 0, unknown: []string{"u"}},
				{cell: "cap", v: 4, values: map[string]float64{"u": 0.25}},
			}},
		{name: "a table with an entry that follows a cell",
			src: "w = 4\ntable t\n    L [m]  q\n    1      (w)\n    2      3\nn = sum(t.q) + w\n",
			steps: []step{
				{cell: "w", v: 6, values: map[string]float64{"n": 15}},
			}},
		{name: "cells written before the cells they use",
			src: "d = c + b\nc = b * 2\nb = in0 + 1\nin0 = 3\n",
			steps: []step{
				{cell: "in0", v: 1, values: map[string]float64{"b": 2, "c": 4, "d": 6}},
			}},
		{name: "cells run in another order than written",
			src:       "in0 = 1\nb2 = b1 + a1\nb1 = in0 * 2\na1 = in0 + 1\n",
			reordered: true,
			steps: []step{
				{cell: "in0", v: 5, values: map[string]float64{"a1": 6, "b1": 10, "b2": 16}},
			}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := compile(t, c.src)
			st := m.NewState()
			st.Eval()
			over := map[int]float64{}
			for k, s := range c.steps {
				i := cell(t, m, s.cell).Index
				if s.reset {
					st.Reset(i)
					delete(over, i)
				} else {
					st.Set(i, s.v)
					over[i] = s.v
				}
				ran := slices.Clone(st.Eval())

				down := downstream(m, []int{i})
				var want []int
				for _, j := range m.P.Order {
					if down[j] {
						want = append(want, j)
					}
				}
				if !slices.Equal(ran, want) {
					t.Fatalf("step %d: ran %v, want %v (Program.Order)", k, names(m, ran), names(m, want))
				}
				if k == 0 && c.reordered {
					reading := slices.Sorted(slices.Values(want))
					if slices.Equal(reading, want) {
						t.Fatalf("the case does not test a reordering: %v", names(m, want))
					}
				}

				fresh := m.NewState()
				for j, v := range over {
					fresh.Set(j, v)
				}
				fresh.Eval()
				// The slot of a cell without a value keeps what it held
				// (nothing reads it), so only known values are compared.
				for _, cl := range m.P.Cells {
					j := cl.Index
					a, b := st.Problem(j), fresh.Problem(j)
					if st.Known(j) != fresh.Known(j) || (a == nil) != (b == nil) || a != nil && a.Summary != b.Summary ||
						st.Known(j) && math.Float64bits(st.F.Num[j]) != math.Float64bits(fresh.F.Num[j]) {
						t.Fatalf("step %d: incremental and fresh differ at %s: known %v/%v, value %g/%g, problem %v/%v",
							k, cl.Name, st.Known(j), fresh.Known(j), st.F.Num[j], fresh.F.Num[j], a, b)
					}
				}
				for _, name := range s.unknown {
					if j := cell(t, m, name).Index; st.Known(j) {
						t.Errorf("step %d: %s has the value %g, want none", k, name, st.F.Num[j])
					}
				}
				for name, v := range s.values {
					if j := cell(t, m, name).Index; !st.Known(j) || st.F.Num[j] != v {
						t.Errorf("step %d: %s = %g (known %v), want %g", k, name, st.F.Num[j], st.Known(j), v)
					}
				}
				known := 0
				for _, cl := range m.P.Cells {
					if st.Known(cl.Index) {
						known++
					}
				}
				if want := len(m.P.Cells) - len(s.unknown); known != want {
					t.Errorf("step %d: %d cells known, want %d", k, known, want)
				}
			}
		})
	}
}

// names returns the names of cells idx of m.
func names(m *eval.Machine, idx []int) []string {
	out := make([]string, len(idx))
	for k, i := range idx {
		out[k] = m.P.Cells[i].Name
	}
	return out
}
