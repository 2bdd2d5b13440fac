package bar

import (
	"strings"
	"testing"
)

// Gaps that close or stay open, against hand calculations by compatibility
// (common practice): a bar heated by ΔT grows by δ₀ = α·ΔT·L when free; if
// δ₀ exceeds the clearance g the stop takes N = −(δ₀ − g)/(L/(EA) + 1/k)
// (k → ∞ for a rigid stop), else N = 0 and the end moves δ₀.
func TestGaps(t *testing.T) {
	const (
		L, E, A = 10.0, 210 * GPa, 2000 * mm2
		alpha   = 12e-6
		dT      = 50.0 // δ₀ = 6 mm
	)
	ea := E * A
	d0 := alpha * dT * L
	heated := func() *Bar {
		s := Prismatic(L, A, E)
		s.Alpha, s.DT = alpha, dT
		return &Bar{Segments: []Segment{s}}
	}
	cases := []struct {
		name         string
		s0, s1       Support
		wantN        float64
		wantU0       float64
		wantUL       float64
		closed0, cl1 bool
	}{
		{"end gap stays open", fixed, Support{Kind: Gap, Gap: 8 * mm}, 0, 0, d0, false, false},
		{"end gap closes on a rigid stop", fixed, Support{Kind: Gap, Gap: 2 * mm}, -ea * (d0 - 2*mm) / L, 0, 2 * mm, false, true},
		{"end gap closes on an elastic stop", fixed, Support{Kind: Gap, Gap: 2 * mm, K: 1e8},
			-(d0 - 2*mm) / (L/ea + 1/1e8), 0, 2*mm + (d0-2*mm)/(L/ea+1/1e8)/1e8, false, true},
		{"gap exactly taken up", fixed, Support{Kind: Gap, Gap: 6 * mm}, 0, 0, d0, false, false},
		{"start gap closes", Support{Kind: Gap, Gap: 2 * mm}, fixed, -ea * (d0 - 2*mm) / L, -2 * mm, 0, true, false},
		{"both gaps close", Support{Kind: Gap, Gap: 1 * mm}, Support{Kind: Gap, Gap: 2 * mm}, -ea * (d0 - 3*mm) / L, -1 * mm, 2 * mm, true, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := mustSolve(t, heated(), c.s0, c.s1)
			n, _ := r.N(L / 2)
			if c.wantN == 0 {
				if abs := n; abs > 1e-6 || abs < -1e-6 {
					t.Errorf("N = %g N, want 0", n)
				}
			} else {
				near(t, "N", n, c.wantN, 1e-12)
			}
			near(t, "u_start", r.UStart+1, c.wantU0+1, 1e-12)
			near(t, "u_end", r.UEnd, c.wantUL, 1e-12)
			if r.GapClosedStart != c.closed0 || r.GapClosedEnd != c.cl1 {
				t.Errorf("closed = %v, %v; want %v, %v", r.GapClosedStart, r.GapClosedEnd, c.closed0, c.cl1)
			}
		})
	}

	// Sheet path: gap_support and the gap_closed field.
	bv := call(t, "with_temperature", call(t, "bar_uniform", L, A, E), dT, alpha)
	res := call(t, "solve_bar", bv, "fixed", call(t, "gap_support", 2*mm))
	if field(t, res, "gap_closed") != 1 || field(t, res, "gap_closed_end") != 1 {
		t.Errorf("gap_closed = %g, want 1", field(t, res, "gap_closed"))
	}
	near(t, "sheet R_end", field(t, res, "R_end"), -ea*(d0-2*mm)/L, 1e-12)
	res = call(t, "solve_bar", bv, "fixed", call(t, "gap_support", 8*mm, nil))
	if field(t, res, "gap_closed") != 0 {
		t.Errorf("gap_closed = %g, want 0", field(t, res, "gap_closed"))
	}
}

// A bar free at its start pushed toward a stop: the stop takes the load.
// Hand calculation (common practice): N = −P beyond the load, 0 before it.
func TestGapMechanicalLoad(t *testing.T) {
	const L, E, A, P, g = 4.0, 200 * GPa, 1000 * mm2, 50 * kN, 0.5 * mm
	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{L / 2, P}}}
	r := mustSolve(t, b, free, Support{Kind: Gap, Gap: g})
	near(t, "R_end", r.REnd, -P, 1e-12)
	near(t, "u_end", r.UEnd, g, 1e-12)
	near(t, "u_start", r.UStart, g+P*(L/2)/(E*A), 1e-12)
	if !r.GapClosedEnd {
		t.Error("gap did not close")
	}
	// Pulled away from the stop, nothing holds the bar.
	b.Points[0].P = -P
	_, err := Solve(b, free, Support{Kind: Gap, Gap: g})
	if err == nil || !strings.Contains(err.Error(), "not held") {
		t.Errorf("err = %v, want a message that the bar is not held", err)
	}
}
