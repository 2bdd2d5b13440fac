package bar

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

// A pile 18 m long, 450 × 450 mm, E = 32 GPa, head load 1800 kN (own
// scenario): soft fill with no friction over the top 6 m, then layers with
// uniform skin friction q_i down to the toe, which bears the rest. With x
// down from the head, F(x) = Σ q_i·clip(x − a_i, 0, b_i − a_i) is the
// friction shed above x, the compression is P − F(x), the toe reaction
// P − Σ q_i·(b_i − a_i), and the head settles relative to the toe by
//
//	δ = (P·L − ∫₀ᴸ F dx)/(EA),  ∫₀ᴸ F dx = Σ q_i·[(b_i − a_i)²/2 + (b_i − a_i)(L − b_i)].
//
// Source: statics and δ = ∫N/(EA) dx, Gere & Goodno, Mechanics of Materials,
// §2.3 (non-uniform conditions); REFERENCES.md C10 is the one-layer case
// with friction to the head.
func TestLayeredPile(t *testing.T) {
	const L, A, E, P = 18.0, 0.45 * 0.45, 32e9, 1800e3
	type layer struct{ a, b, q float64 }
	closed := func(ls []layer) (delta, toe float64) {
		intF, sum := 0.0, 0.0
		for _, l := range ls {
			h := l.b - l.a
			intF += l.q * (h*h/2 + h*(L-l.b))
			sum += l.q * h
		}
		return (P*L - intF) / (E * A), P - sum
	}
	cases := []struct {
		name   string
		layers []layer
	}{
		{"friction below the fill", []layer{{6, 18, 80e3}}},
		{"two friction layers", []layer{{6, 12, 40e3}, {12, 18, 100e3}}},
	}
	for _, c := range cases {
		wantD, wantToe := closed(c.layers)
		// As patches over part of the bar.
		b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{X: 0, P: P}}}
		for _, l := range c.layers {
			b.Patches = append(b.Patches, Patch{X0: l.a, X1: l.b, B0: -l.q, B1: -l.q})
		}
		// As one stepped function with its steps.
		f := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{X: 0, P: P}}}
		f.LoadFns = []Fn{{Name: "q", F: func(x float64) float64 {
			for _, l := range c.layers {
				if x >= l.a && x < l.b {
					return -l.q
				}
			}
			return 0
		}}}
		for _, l := range c.layers {
			f.Breaks = append(f.Breaks, l.a, l.b)
		}
		for _, m := range []struct {
			how string
			bar *Bar
		}{{"patches", b}, {"stepped function", f}} {
			r, err := Solve(m.bar, Support{Kind: Free}, Support{Kind: Fixed})
			if err != nil {
				t.Fatalf("%s, %s: %v", c.name, m.how, err)
			}
			if relErr(r.UStart, wantD) > 1e-10 {
				t.Errorf("%s, %s: head settlement %.12g m, closed form %.12g m", c.name, m.how, r.UStart, wantD)
			}
			if relErr(-r.REnd, wantToe) > 1e-10 {
				t.Errorf("%s, %s: toe reaction %.12g N, closed form %.12g N", c.name, m.how, -r.REnd, wantToe)
			}
			n, err := r.N(9)
			if want := -(P - func() float64 {
				s := 0.0
				for _, l := range c.layers {
					s += l.q * math.Max(0, math.Min(9, l.b)-l.a)
				}
				return s
			}()); err != nil || relErr(n, want) > 1e-10 {
				t.Errorf("%s, %s: N(9 m) = %.12g N, want %.12g N (%v)", c.name, m.how, n, want, err)
			}
		}
	}
	// The stepped function without its steps is refused, not smoothed.
	g := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{X: 0, P: P}},
		LoadFns: []Fn{{Name: "q", F: func(x float64) float64 {
			if x < 6.1 {
				return 0
			}
			return -80e3
		}}}}
	// It either fails to converge (and says so) or, where the quadrature
	// happens to resolve the jump, agrees with the closed form: never a
	// silent wrong number.
	wantG := (P*L - 80e3*(11.9*11.9/2)) / (E * A)
	if r, err := Solve(g, Support{Kind: Free}, Support{Kind: Fixed}); err == nil && relErr(r.UStart, wantG) > 1e-6 {
		t.Errorf("a step at 6.1 m without steps gave %.9g m, closed form %.9g m", r.UStart, wantG)
	}
	bad := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Patches: []Patch{{X0: 12, X1: 20, B0: 1, B1: 1}}}
	if _, err := Solve(bad, Support{Kind: Fixed}, Support{Kind: Free}); err == nil {
		t.Error("a patch beyond the end of the bar must be refused")
	}
}

// TestLayeredPileRegistry: the one-layer pile of TestLayeredPile through the
// registry as a sheet builds it, with with_line_load_over and with the
// stepped with_line_load_fn and its steps list.
// Source: as TestLayeredPile (statics, δ = ∫N/(EA) dx).
func TestLayeredPileRegistry(t *testing.T) {
	const L, A, E, P, q = 18.0, 0.45 * 0.45, 32e9, 1800e3, 80e3
	want := (P*L - q*12*12/2) / (E * A)
	base := functest.Call(t, "with_point_load", functest.Call(t, "bar_uniform", L, A, E), 0.0, P)
	over := functest.Call(t, "with_line_load_over", base, 6.0, 18.0, -q, nil)
	step := &funcs.FuncValue{Name: "q", Call: func(x ...float64) float64 {
		if x[0] < 6 {
			return 0
		}
		return -q
	}}
	fn := functest.Call(t, "with_line_load_fn", base, step, []float64{6})
	for name, b := range map[string]funcs.Value{"over": over, "fn with steps": fn} {
		r := functest.Call(t, "solve_bar", b, "free", "fixed").(*funcs.RecordValue)
		if got := r.Num("u_start", math.NaN()); relErr(got, want) > 1e-10 {
			t.Errorf("%s: head settlement %.12g m, closed form %.12g m", name, got, want)
		}
	}
	if _, err := functest.TryCall(t, "with_line_load_over", base, 10.0, 4.0, -q, nil); err == nil {
		t.Error("x1 < x0 must be refused")
	}
	if _, err := functest.TryCall(t, "solve_bar", functest.Call(t, "with_line_load_over", base, 10.0, 30.0, -q, nil), "free", "fixed"); err == nil {
		t.Error("a stretch beyond the end of the bar must be refused")
	}
}
