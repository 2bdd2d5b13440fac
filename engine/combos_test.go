package engine_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// A canopy tie (our own scenario): own weight 4 kN, wind uplift 10 kN,
// more than 0.9 × 4 kN, so the tie goes into compression.
const upliftSheet = `combinations: EN 1990 6.10
action permanent favourable G [kN] = 4 kN
action wind W [kN] = -10 kN -- uplift
N [kN] = G + W
check tension: N <= 20 kN
`

func TestUpliftReversesTheTie(t *testing.T) {
	s := compile(t, upliftSheet)
	r := s.Run(nil)
	ch := r.Checks[0]
	// EN 1990 6.10 with Table A1.2(B) (REFERENCES D7): 1.35 G, 1.0 G,
	// 1.35 G + 1.5 W = -9.6 kN, 1.0 G + 1.5 W = -11 kN. The most reversed
	// governs, and the check cannot pass.
	if ch.Pass || ch.Known {
		t.Fatalf("a tie in compression passes its tension check: %+v", ch)
	}
	if ch.Combo == nil || ch.Combo.Text != "1.0 G + 1.5 W" || ch.Combo.Evaluated != 4 || ch.Combo.Failing != 2 || !ch.Combo.Reversed {
		t.Fatalf("combination outcome %+v", ch.Combo)
	}
	if r.Failed() != 1 {
		t.Errorf("Failed() = %d", r.Failed())
	}
	// The reason is the one every sheet gives for a demand of the other
	// sense (eval.Assess), naming the combination; the demand shown is
	// that of the governing combination, and the check is not assessed,
	// not an uncomputed cell.
	if math.Abs(ch.Demand-(-11000)) > 1e-9 || math.Abs(ch.Capacity-20000) > 1e-9 {
		t.Errorf("governing demand %g N, capacity %g N; want -11000 N of 20000 N", ch.Demand, ch.Capacity)
	}
	if ch.Problem == nil || !strings.Contains(ch.Problem.Summary, "demand is compression; this check is written for tension") ||
		!strings.Contains(ch.Problem.Summary, "(in ULS 4: 1.0 G + 1.5 W)") {
		t.Errorf("the check does not say why it is not assessed: %v", ch.Problem)
	}
	found := 0
	for _, p := range r.Problems {
		if p == ch.Problem {
			found++
		}
	}
	if found != 1 || len(r.Problems) != 1 || r.Uncomputed() != 0 {
		t.Errorf("problems %v (the check's reason %d times), uncomputed %d", r.Problems, found, r.Uncomputed())
	}
	st := s.NewState()
	if rr := st.Eval(); st.Uncomputed() != rr.Uncomputed() {
		t.Errorf("State.Uncomputed %d, Results.Uncomputed %d", st.Uncomputed(), rr.Uncomputed())
	}
	// With less uplift the tie stays in tension: 1.0 × 4 − 1.5 × 2 = 1 kN
	// at least, 1.35 × 4 = 5.4 kN at most.
	v, err := s.ParseInput("W", "-2 kN")
	if err != nil {
		t.Fatal(err)
	}
	r = s.Run(map[string]any{"W": v})
	ch = r.Checks[0]
	if !ch.Pass || math.Abs(ch.Demand-5400) > 1e-9 || ch.Combo.Text != "1.35 G" {
		t.Errorf("with 2 kN uplift: %+v %+v", ch, ch.Combo)
	}
}

// TestEnvelopeEqualsSeparateRuns evaluates a sheet with actions and the same
// sheet with each combination written out by hand: the governing
// utilisation is the largest of the hand-written ones, for each check.
func TestEnvelopeEqualsSeparateRuns(t *testing.T) {
	src := `combinations: EN 1990 6.10a/b
L [m] = 3 m
action permanent favourable G [kN] = 2.4 kN/m * L
action imposed B Q [kN] = 1.5 kN/m * L
action snow S [kN] = 0.9 kN/m * L
N [kN] = G + Q + S
check tension: N <= 16 kN
check sls in characteristic: N <= 12 kN
`
	s := compile(t, src)
	r := s.Run(nil)
	cs := s.Combos()
	for _, ch := range r.Checks {
		best := math.Inf(-1)
		for m, c := range cs.All {
			if c.State != ch.Combo.State {
				continue
			}
			// The same cell written with the combination's factors.
			hand := fmt.Sprintf("L [m] = 3 m\nN [kN] = %g * 2.4 kN/m * L + %g * 1.5 kN/m * L + %g * 0.9 kN/m * L\ncheck c: N <= %s\n",
				c.Factors[0], c.Factors[1], c.Factors[2], map[string]string{"uls": "16 kN", "characteristic": "12 kN"}[c.State])
			u := compile(t, hand).Run(nil).Checks[0].Util
			if got := ch.Combo.Utils[m]; math.Abs(got-u) > 1e-12 {
				t.Errorf("%s in %s: %g, by hand %g", ch.Cell.Name, c.Name, got, u)
			}
			best = max(best, u)
		}
		if math.Abs(ch.Util-best) > 1e-12 {
			t.Errorf("%s: governing %g, largest by hand %g", ch.Cell.Name, ch.Util, best)
		}
	}
	// 6.10a/b, G, Q (B), S: 8 ULS combinations, each with G at γG,sup
	// and at γG,inf; 5 characteristic ones (engine/combine lists them).
	if n := r.Checks[0].Combo.Evaluated; n != 16 {
		t.Errorf("%d ULS combinations evaluated", n)
	}
	if n := r.Checks[1].Combo.Evaluated; n != 5 {
		t.Errorf("%d characteristic combinations evaluated", n)
	}
}

// TestCellsOutsideActionsOnce: a cell that does not depend on an action is
// not recomputed by the combinations.
func TestCellsOutsideActionsOnce(t *testing.T) {
	s := compile(t, upliftSheet+"R [kN] = 20 kN\n")
	cs := s.Combos()
	for _, name := range []string{"G", "W", "N", "tension"} {
		if !cs.Depends[s.Lookup(name).Index] {
			t.Errorf("%s should depend on actions", name)
		}
	}
	if cs.Depends[s.Lookup("R").Index] {
		t.Error("R does not depend on actions")
	}
}

func TestComboErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"no rules", "action permanent G [kN] = 4 kN\ncheck c: G <= 5 kN\n", "actions without combination rules"},
		{"unknown rules", "combinations: EN 1990 6.1\naction permanent G [kN] = 4 kN\n", "unknown combination rules `EN 1990 6.1`"},
		{"action from action", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\naction wind W [kN] = 2 * G\ncheck c: W <= 5 kN\n", "action `W` uses the action `G`"},
		{"factor typo", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\nfactor gama_Q = 1.5\ncheck c: G <= 5 kN\n", "cannot replace factor `gama_Q`"},
		{"factor out of range", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\nfactor gamma_Q = 15\ncheck c: G <= 5 kN\n", "cannot replace factor `gamma_Q`"},
		{"factor without actions", "factor gamma_Q = 1.5\n", "factor line without actions"},
		{"state the rules lack", "combinations: ASCE 7 LRFD\naction permanent D [kN] = 4 kN\ncheck c in frequent: D <= 5 kN\n", "no combinations of ASCE 7 LRFD for the limit state `frequent`"},
		{"thermal under ASCE", "combinations: ASCE 7 ASD\naction permanent D [kN] = 4 kN\naction thermal T [K] = 20 K\ncheck c: D + T * 0.1 kN/K <= 5 kN\n", "cannot combine the actions for `uls`"},
		{"accidental state without accidental actions", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\ncheck c in accidental: G <= 5 kN\n", "cannot combine the actions for `accidental`"},
		{"action used by no check", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\naction wind W [kN] = 2 kN\ncheck c: G <= 5 kN\n", "action `W` reaches no check"},
		{"accidental action without an accidental check", "combinations: EN 1990 6.10\naction permanent G [kN] = 4 kN\naction accidental A [kN] = 2 kN\ncheck c: G + A <= 5 kN\n", "accidental action `A` reaches no check in accidental"},
		{"action of a record", "combinations: EN 1990 6.10\naction permanent G = {a: 1 kN}\n", "action `G` is a record, not a number"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := engine.Compile("t.sheaf", []byte(tc.src))
			l, ok := err.(diag.List)
			if !ok {
				t.Fatalf("want diagnostics, got %v", err)
			}
			for _, d := range l {
				if strings.Contains(d.Summary, tc.want) {
					if d.Range.Start().Line == 0 {
						t.Errorf("no position: %v", d)
					}
					return
				}
			}
			t.Errorf("want %q in %v", tc.want, l)
		})
	}
}

// TestComboSetAndClone: --set changes a characteristic value, and a clone
// keeps its own outcome.
func TestComboSetAndClone(t *testing.T) {
	s := compile(t, upliftSheet)
	st := s.NewState()
	v, _ := s.ParseInput("W", "-1 kN")
	if err := st.Set("W", v); err != nil {
		t.Fatal(err)
	}
	st.Recompute()
	cl := st.Clone()
	v2, _ := s.ParseInput("W", "-20 kN")
	_ = st.Set("W", v2)
	st.Recompute()
	// 1.35 × 4 kN = 5.4 kN of 20 kN governs with 1 kN uplift (D7).
	if u, ok := cl.Number(s.Lookup("tension")); !ok || math.Abs(u-5.4/20) > 1e-12 {
		t.Errorf("clone: %g %v", u, ok)
	}
	if _, ok := st.Number(s.Lookup("tension")); ok {
		t.Error("20 kN uplift: the tension check should not be assessed")
	}
}

// benchSheet is a sheet of about 100 cells whose chain depends on five
// actions: 1 permanent (favourable too) and 4 variable ones give 2 × (1 +
// 4 × 2^3) = 66 combinations of EN 1990 (6.10).
func benchSheet(cells int) string {
	var b strings.Builder
	b.WriteString("combinations: EN 1990 6.10\n")
	b.WriteString("action permanent favourable G [kN] = 10 kN\naction imposed B Q [kN] = 6 kN\naction snow S [kN] = 3 kN\naction wind W [kN] = -4 kN\naction imposed E Q_2 [kN] = 2 kN\n")
	b.WriteString("N_0 [kN] = G + Q + S + W + Q_2\n")
	for i := 1; i < cells; i++ {
		fmt.Fprintf(&b, "N_%d [kN] = N_%d * 1.0 + 0 kN\n", i, i-1)
	}
	fmt.Fprintf(&b, "check t: N_%d <= 100 kN\n", cells-1)
	return b.String()
}

// BenchmarkCombinations evaluates every combination of a 100-cell chain
// that depends on actions (66 combinations); the target is 50 combinations
// in under 1 ms.
func BenchmarkCombinations(b *testing.B) {
	s := compile(b, benchSheet(95))
	st := s.NewState()
	if n := len(s.Combos().All); n != 66 {
		b.Fatalf("%d combinations", n)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		_ = st.Set("G", 10e3) // marks the base stale, so every run recomputes all
		st.Recompute()
	}
	b.StopTimer()
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/66/1e3, "µs/combination")
	// 1.35 × 10 + 1.5 × 6 + 1.5 × 0.5 × 3 + 1.5 × 1.0 × 2 = 27.75 kN: Q
	// leading, snow and the storage load accompanying, wind left out
	// (REFERENCES D6, D7).
	u, ok := st.Number(s.Lookup("t"))
	if want := 27.75 / 100; !ok || math.Abs(u-want) > 1e-12 {
		b.Fatalf("utilisation %g, want %g", u, want)
	}
}

// FuzzCombinations compiles and runs sheets with actions: nothing panics,
// and a check that passes has a utilisation from 0 to 1 in its governing
// combination, never a passing negative one.
func FuzzCombinations(f *testing.F) {
	f.Add(upliftSheet)
	f.Add(benchSheet(5))
	f.Add("combinations: EN 1990 6.10a/b\naction permanent favourable G [kN] = 4 kN\naction snow high S [kN] = 3 kN\naction thermal T [K] = 20 K\nN [kN] = G + S + T * 1 kN/K\ncheck t: N <= 20 kN\ncheck f in frequent: N <= 9 kN\ncheck q in quasi-permanent: N <= 9 kN\n")
	f.Add("combinations: ASCE 7 ASD\naction permanent D [kN] = 4 kN\naction imposed H L_r [kN] = 1 kN\naction wind W [kN] = -9 kN\nN [kN] = D + L_r + W\ncheck t: N <= 20 kN\n")
	f.Add("combinations: EN 1990 6.10\nfactor psi accidental leading = 2\naction permanent G [kN] = 4 kN\naction accidental A [kN] = 30 kN\naction imposed B Q [kN] = 2 kN\ncheck a in accidental: G + A + Q <= 40 kN\n")
	f.Fuzz(func(t *testing.T, src string) {
		s, err := engine.Compile("f.sheaf", []byte(src), engine.WithMaxCells(200))
		if err != nil {
			return
		}
		r := s.Run(nil)
		for _, ch := range r.Checks {
			if ch.Pass && !(ch.Util >= 0 && ch.Util <= 1) {
				t.Fatalf("check %s passes with utilisation %g", ch.Cell.Name, ch.Util)
			}
			if ch.Combo != nil && ch.Combo.Evaluated == 0 {
				t.Fatalf("check %s evaluated in no combination", ch.Cell.Name)
			}
		}
	})
}

// TestCellShowsItsChecksCombination: a cell that feeds only a
// serviceability check shows its value in that check's governing
// combination, one that feeds the ultimate check in its own.
func TestCellShowsItsChecksCombination(t *testing.T) {
	s := compile(t, `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 4 kN
N [kN] = G + Q
N_s [kN] = N * 1
N_u [kN] = N * 1
check u: N_u <= 40 kN
check s in characteristic: N_s <= 30 kN
`)
	r := s.Run(nil)
	// 1.35 × 10 + 1.5 × 4 = 19.5 kN (ULS 2); 10 + 4 = 14 kN (SLS-c 2);
	// REFERENCES D7. N feeds both: the uls check decides.
	for name, want := range map[string]struct {
		v     float64
		combo string
	}{"N_u": {19500, "ULS 2"}, "N_s": {14000, "SLS-c 2"}, "N": {19500, "ULS 2"}, "G": {10000, ""}} {
		c := r.Cell(name)
		got := ""
		if m := r.Combos.CellIn[c.Cell.Index]; m >= 0 {
			got = r.Combos.All[m].Name
		}
		if math.Abs(c.SI-want.v) > 1e-9 || got != want.combo {
			t.Errorf("%s = %g in %q, want %g in %q", name, c.SI, got, want.v, want.combo)
		}
	}
}

// TestGoverningTermInItsCombination: the term of a min(...) capacity that
// governs is found in the check's own governing combination, not in the
// one the cells show. Our own scenario, EN 1990 6.10 (Table A1.2(B)):
// ULS 1 = 1.35 G, ULS 2 = 1.35 G + 1.5 Q with G = Q = 10 kN. R1 = 40 kN −
// 0.5 Q is 40 kN in ULS 1 and 32.5 kN in ULS 2, so R = min(R1, 35 kN) is
// 35 kN (the constant governs) and 32.5 kN (R1 governs). Check a: 13.5/35
// and 28.5/32.5, governs in ULS 2, which the cells show; check b:
// (20 − 0)/35 = 0.571 and (20 − 15)/32.5 = 0.154, governs in ULS 1, where
// the constant term gives the capacity.
func TestGoverningTermInItsCombination(t *testing.T) {
	s := compile(t, `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 10 kN
N [kN] = G + Q
R1 [kN] = 40 kN - 0.5 * Q
R [kN] = min(R1, 35 kN)
D_b [kN] = 20 kN - Q
check a: N <= R
check b: D_b <= R
`)
	r := s.Run(nil)
	want := map[string]struct {
		combo, term string
		util        float64
	}{
		"a": {"ULS 2", "R1", 28.5 / 32.5},
		"b": {"ULS 1", "35 kN", 20.0 / 35},
	}
	for _, ch := range r.Checks {
		w := want[ch.Cell.Name]
		if ch.Combo == nil || ch.Combo.Governing != w.combo || ch.Governing != w.term || math.Abs(ch.Util-w.util) > 1e-12 {
			t.Errorf("check %s: governs in %v with term %q, utilisation %g; want %s, %q, %g",
				ch.Cell.Name, ch.Combo, ch.Governing, ch.Util, w.combo, w.term, w.util)
		}
	}
}

// TestRangeCheckWithActions: a check between two limits becomes two checks
// (name_min, name_max); both keep the limit state written after `in` and
// are checked in each of its combinations. Our own scenario, EN 1990 6.10
// characteristic combinations (Eq. 6.14b with ψ0 of Table A1.1: imposed B
// 0.7, snow 0.5), G = 5 kN, Q = 3 kN, S = 2 kN: G = 5, G + Q = 8,
// G + Q + 0.5 S = 9, G + S = 7, G + 0.7 Q + S = 9.1 kN. The lower limit
// 4 kN (utilisation 4/N) governs where N is least, G alone: 80 %; the upper
// limit 12 kN where N is most, G + 0.7 Q + S: 9.1/12 = 75.83 %.
func TestRangeCheckWithActions(t *testing.T) {
	s := compile(t, `combinations: EN 1990 6.10
action permanent G [kN] = 5 kN
action imposed B Q [kN] = 3 kN
action snow S [kN] = 2 kN
N [kN] = G + Q + S
check band in characteristic: 4 kN <= N <= 12 kN
`)
	r := s.Run(nil)
	if len(r.Checks) != 2 {
		t.Fatalf("%d checks, want band_min and band_max", len(r.Checks))
	}
	want := map[string]struct {
		util float64
		text string
	}{
		"band_min": {4.0 / 5, "1.0 G"},
		"band_max": {9.1 / 12, "1.0 G + 0.7 Q + 1.0 S"},
	}
	for _, ch := range r.Checks {
		w, ok := want[ch.Cell.Name]
		if !ok || ch.Combo == nil || ch.Combo.State != "characteristic" || !ch.Pass || math.Abs(ch.Util-w.util) > 1e-12 {
			t.Fatalf("check %s: %+v %+v", ch.Cell.Name, ch, ch.Combo)
		}
		if ch.Combo.Text != w.text {
			t.Errorf("check %s governs in %q, want %q", ch.Cell.Name, ch.Combo.Text, w.text)
		}
	}
}
