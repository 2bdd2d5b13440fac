package bar

import (
	"math"
	"testing"
)

// Convergence of the quadrature. Source: the error of the n-point
// Gauss–Legendre rule on a panel of width h is O(h^(2n+1)), so a composite
// rule errs as h^(2n) and the rule is exact for polynomials of degree
// ≤ 2n − 1 (Davis & Rabinowitz, Methods of Numerical Integration, §2.7; from
// memory).
func TestGaussLegendreOrder(t *testing.T) {
	f := func(x float64) float64 { return 1 / (1 + x) } // ∫₀¹ = ln 2
	want := math.Ln2
	for _, n := range []int{1, 2, 3} {
		e1 := math.Abs(composite(f, 0, 1, 4, n) - want)
		e2 := math.Abs(composite(f, 0, 1, 8, n) - want)
		order := math.Log2(e1 / e2)
		if math.Abs(order-float64(2*n)) > 0.25 {
			t.Errorf("n = %d: observed order %.3f, want %d", n, order, 2*n)
		}
	}
}

func TestPolynomialsExact(t *testing.T) {
	// x^k over [0, 2]: exact value 2^(k+1)/(k+1).
	for k := 0; k <= 2*glOrder-1; k++ {
		f := func(x float64) float64 { return math.Pow(x, float64(k)) }
		want := math.Pow(2, float64(k+1)) / float64(k+1)
		got := composite(f, 0, 2, 1, glOrder)
		if relErr(got, want) > 4e-15 {
			t.Errorf("degree %d: %.17g, want %.17g", k, got, want)
		}
		a, _, _, err := adaptive(f, 0, 2)
		if err != nil || relErr(a, want) > 4e-15 {
			t.Errorf("adaptive degree %d: %.17g (%v), want %.17g", k, a, err, want)
		}
	}
}

// The adaptive rule meets its tolerance on a tapered-bar flexibility
// integrand with a closed form, ∫₀ᴸ dx/(a+bx)² = L/(a(a+bL)), even for a steep
// taper, and reports a singular integrand instead of looping.
func TestAdaptiveTolerance(t *testing.T) {
	for _, ratio := range []float64{1.01, 2, 10, 100} {
		a, L := 1.0, 3.0
		b := (ratio - 1) * a / L
		f := func(x float64) float64 { return 1 / ((a + b*x) * (a + b*x)) }
		want := L / (a * (a + b*L))
		got, est, _, err := adaptive(f, 0, L)
		if err != nil {
			t.Fatal(err)
		}
		if relErr(got, want) > 1e-13 {
			t.Errorf("ratio %g: relative error %g", ratio, relErr(got, want))
		}
		if est > 1e-12*want {
			t.Errorf("ratio %g: error estimate %g too large", ratio, est)
		}
	}
	_, _, _, err := adaptive(func(x float64) float64 { return 1 / math.Sqrt(math.Abs(x-1)+1e-300) }, 0, 2)
	if err == nil {
		t.Error("singular integrand: no error")
	}
	_, _, bad, err := adaptive(func(x float64) float64 {
		if x > 1.5 {
			return math.NaN()
		}
		return x
	}, 0, 2)
	if err != errNaN || bad <= 1.5 {
		t.Errorf("NaN integrand: err %v at %g", err, bad)
	}
}

// The solver's quadrature path for a user area converges to the closed form
// for a tapered bar to 1e-12 for tapers from mild to extreme.
func TestSolverQuadratureAgreesWithClosedForm(t *testing.T) {
	for _, r := range []float64{1.001, 1.5, 3, 8} {
		L, d1, E, P := 2.5, 0.05, 200*GPa, 80*kN
		d2 := d1 / r
		area := &Fn{Name: "A", F: func(x float64) float64 {
			d := d1 + (d2-d1)*x/L
			return math.Pi * d * d / 4
		}}
		bq := &Bar{Segments: []Segment{{L: L, Shape: AreaFunc, AreaFn: area, E: E}}, Points: []PointLoad{{L, P}}, Gamma: 77 * kN}
		bc := &Bar{Segments: []Segment{TaperedDiameter(L, d1, d2, E)}, Points: []PointLoad{{L, P}}, Gamma: 77 * kN}
		rq := mustSolve(t, bq, fixed, free)
		rc := mustSolve(t, bc, fixed, free)
		near(t, "elongation", rq.Elongation, rc.Elongation, 1e-12)
		near(t, "R_start", rq.RStart, rc.RStart, 1e-12)
	}
}
