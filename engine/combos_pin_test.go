package engine_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// A hanger whose weld the fabricator sized for one combination, snow
// leading (our own scenario).
const pinSheet = `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 6 kN
action snow S [kN] = 4 kN
N [kN] = G + Q + S
check tension: N <= 40 kN
N_snow [kN] = in_combination(N, "1.35 G + 1.05 Q + 1.5 S")  -- snow leading
N_2 [kN] = in_combination(N, "ULS 2")
check weld: N_snow <= 30 kN
`

// TestInCombination: a cell in one named combination, by its words or its
// label, is that combination's value in every combination. Source: EN
// 1990:2002 (6.10) with Table A1.2(B): γG,sup = 1.35, γQ = 1.5; ψ0 = 0.7
// for imposed category B and 0.5 for snow below 1000 m (Table A1.1) —
// REFERENCES D6, D7, from memory. By hand: snow leading 1.35·10 + 1.5·0.7·6
// + 1.5·4 = 25.8 kN; ULS 2 (the first with Q leading, alone) 1.35·10 +
// 1.5·6 = 22.5 kN.
func TestInCombination(t *testing.T) {
	s := compile(t, pinSheet)
	cs := s.Combos()
	if got := cs.Text(1); cs.All[1].Name != "ULS 2" || got != "1.35 G + 1.5 Q" {
		t.Fatalf("ULS 2 is %q", got)
	}
	st := s.NewState()
	r := st.Eval()
	for name, want := range map[string]struct {
		v     float64
		combo string
	}{"N_snow": {25.8e3, "ULS 5"}, "N_2": {22.5e3, "ULS 2"}} {
		c := r.Cell(name)
		if c == nil || math.Abs(c.SI-want.v) > 1e-6 {
			t.Errorf("%s = %+v, want %g N", name, c, want.v)
		}
		// The same in every combination; the one it names is shown beside it.
		if m := st.CellCombination(c.Cell); m != want.combo {
			t.Errorf("%s is shown in %q, want %q", name, m, want.combo)
		}
	}
	for _, ch := range r.Checks {
		switch ch.Cell.Name {
		case "tension": // snow leading governs N itself: 25.8 kN of 40 kN
			if ch.Combo == nil || ch.Combo.Text != "1.35 G + 1.05 Q + 1.5 S" || math.Abs(ch.Util-25.8/40) > 1e-12 {
				t.Errorf("tension: %g in %+v", ch.Util, ch.Combo)
			}
		case "weld": // reads actions only through the pin: checked once
			if ch.Combo != nil || math.Abs(ch.Util-25.8/30) > 1e-12 {
				t.Errorf("weld: %g in %+v", ch.Util, ch.Combo)
			}
		}
	}
	// --set changes the characteristic value, and the pin follows:
	// 1.35·10 + 1.05·6 + 1.5·8 = 31.8 kN > 30 kN.
	v, _ := s.ParseInput("S", "8 kN")
	if err := st.Set("S", v); err != nil {
		t.Fatal(err)
	}
	r = st.Eval()
	if c := r.Cell("N_snow"); math.Abs(c.SI-31.8e3) > 1e-6 {
		t.Errorf("N_snow with S = 8 kN: %g N", c.SI)
	}
	if r.Failed() != 1 {
		t.Errorf("%d checks fail, want the weld", r.Failed())
	}
}

func TestInCombinationErrors(t *testing.T) {
	head := "combinations: EN 1990 6.10\naction permanent G [kN] = 10 kN\naction imposed B Q [kN] = 6 kN\nN [kN] = G + Q\ncheck c: N <= 40 kN\n"
	cases := []struct{ name, src, want, hint string }{
		{"no such label", head + "x [kN] = in_combination(N, \"ULS 9\")\n", "no combination `ULS 9`", "combinations of that kind are ULS 1 to ULS 2"},
		{"words of none", head + "x [kN] = in_combination(N, \"1.35 G + 1.5 S\")\n", "no combination `1.35 G + 1.5 S`", "did you mean `1.35 G + 1.5 Q`?"},
		{"a cell without actions", head + "L [m] = 3 m\nx [m] = in_combination(L, \"ULS 1\")\n", "`L` has no combination to choose", "write `L` alone"},
		{"no actions", "L [m] = 3 m\nx [m] = in_combination(L, \"ULS 1\")\n", "in_combination without actions", "write the actions"},
		{"not a cell", head + "x [kN] = in_combination(2 * N, \"ULS 1\")\n", "in_combination needs the name of a cell", "in_combination(cell"},
		{"not a text", head + "x [kN] = in_combination(N, 2)\n", "in_combination needs the combination as a text in quotes", "--combinations"},
		{"in a function", head + "f(a [kN]) [kN] = a + in_combination(N, \"ULS 1\")\n", "in_combination in the function `f`", "in a cell"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := engine.Compile("t.sheaf", []byte(tc.src))
			var l diag.List
			if !errors.As(err, &l) {
				t.Fatalf("want diagnostics, got %v", err)
			}
			for _, d := range l {
				if strings.Contains(d.Summary, tc.want) {
					if d.Range.Start().Line < 2 || !strings.Contains(d.Hint, tc.hint) {
						t.Errorf("at %v, hint %q", d.Range.Start(), d.Hint)
					}
					return
				}
			}
			t.Errorf("want %q in %v", tc.want, l)
		})
	}
}
