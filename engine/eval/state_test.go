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
		if a.Known[i] != b.Known[i] || (a.Problem[i] == nil) != (b.Problem[i] == nil) ||
			math.Float64bits(a.F.Num[i]) != math.Float64bits(b.F.Num[i]) {
			return fmt.Sprintf("%s: known %v/%v, value %.17g/%.17g, problem %v/%v",
				c.Name, a.Known[i], b.Known[i], a.F.Num[i], b.F.Num[i], a.Problem[i], b.Problem[i])
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
			for _, d := range m.P.Cells[i].DepIdx {
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
