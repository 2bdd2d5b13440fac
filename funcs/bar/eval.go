package bar

import (
	"errors"
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

// solver holds a validated bar and evaluates its properties and loads along
// x. User functions that fail record the first failure in fail, so that the
// message names the function and the position rather than the quadrature.
type solver struct {
	segs    []Segment
	x0      []float64 // start of each segment
	lt      float64   // total length
	b0, b1  float64   // linear distributed load
	gamma   float64
	fns     []Fn
	patches []Patch
	hasDist bool // any distributed load at all
	fail    error
}

// closedForm reports whether the segment's flexibility ∫dx/(EA) and area
// integral have closed forms (constant modulus, area constant or tapered).
func (s *Segment) closedForm() bool { return s.EFn == nil && s.Shape != AreaFunc }

// uniformEA reports whether EA is constant over the segment.
func (s *Segment) uniformEA() bool {
	return s.EFn == nil && (s.Shape == Constant ||
		(s.Shape == TaperArea && s.A1 == s.A2) || (s.Shape == TaperDiameter && s.D1 == s.D2))
}

// uniformA reports whether A is constant over the segment.
func (s *Segment) uniformA() bool {
	return s.Shape == Constant || (s.Shape == TaperArea && s.A1 == s.A2) ||
		(s.Shape == TaperDiameter && s.D1 == s.D2)
}

// callUser evaluates a user function and records a failure; what says what
// the value is ("area", "modulus", "distributed load"); positive demands > 0.
func (v *solver) callUser(f *Fn, what string, x float64, positive bool) float64 {
	y := f.F(x)
	switch {
	case !finite(y):
		v.failf("the %s function %s gave no finite value at x = %s", what, f.Name, funcs.Length(x))
		return math.NaN()
	case positive && y <= 0:
		v.failf("the %s function %s gave %.4g at x = %s; it must be positive over the whole bar", what, f.Name, y, funcs.Length(x))
		return math.NaN()
	}
	return y
}

func (v *solver) failf(format string, args ...any) {
	if v.fail == nil {
		v.fail = fmt.Errorf(format, args...)
	}
}

// area returns A at x in segment i.
func (v *solver) area(i int, x float64) float64 {
	s := &v.segs[i]
	switch s.Shape {
	case Constant:
		return s.A1
	case TaperArea:
		t := (x - v.x0[i]) / s.L
		return s.A1 + (s.A2-s.A1)*t
	case TaperDiameter:
		t := (x - v.x0[i]) / s.L
		d := s.D1 + (s.D2-s.D1)*t
		return math.Pi * d * d / 4
	}
	return v.callUser(s.AreaFn, "area", x, true)
}

// modulus returns E at x in segment i.
func (v *solver) modulus(i int, x float64) float64 {
	s := &v.segs[i]
	if s.EFn == nil {
		return s.E
	}
	return v.callUser(s.EFn, "modulus", x, true)
}

// quadErr turns a quadrature failure into a message for the user.
func (v *solver) quadErr(err error, what string, a, c float64) error {
	if v.fail != nil {
		return v.fail
	}
	if errors.Is(err, errNaN) {
		return fmt.Errorf("the %s over x = %s … %s is not a finite number", what, funcs.Length(a), funcs.Length(c))
	}
	return fmt.Errorf("the %s over x = %s … %s did not converge; hint: the area, modulus or load may vanish or jump inside a segment: split the segment there", what, funcs.Length(a), funcs.Length(c))
}

// areaInt returns ∫_a^x A dξ within segment i.
func (v *solver) areaInt(i int, a, x float64) (float64, error) {
	s := &v.segs[i]
	switch s.Shape {
	case Constant:
		return s.A1 * (x - a), nil
	case TaperArea:
		return (v.area(i, a) + v.area(i, x)) / 2 * (x - a), nil
	case TaperDiameter:
		da := s.D1 + (s.D2-s.D1)*(a-v.x0[i])/s.L
		dx := s.D1 + (s.D2-s.D1)*(x-v.x0[i])/s.L
		return math.Pi / 4 * (x - a) * (da*da + da*dx + dx*dx) / 3, nil
	}
	r, _, _, err := adaptive(func(t float64) float64 { return v.area(i, t) }, a, x)
	if err != nil {
		return 0, v.quadErr(err, "area integral", a, x)
	}
	return r, nil
}

// loadInt returns ∫_a^x b dξ within segment i.
func (v *solver) loadInt(i int, a, x float64) (float64, error) {
	if !v.hasDist || a == x {
		return 0, nil
	}
	r := v.b0*(x-a) + (v.b1-v.b0)/(2*v.lt)*(x-a)*(x+a)
	for k := range v.patches {
		r += v.patches[k].integral(a, x)
	}
	if v.gamma != 0 {
		ai, err := v.areaInt(i, a, x)
		if err != nil {
			return 0, err
		}
		r += v.gamma * ai
	}
	for k := range v.fns {
		f := &v.fns[k]
		q, _, _, err := adaptive(func(t float64) float64 { return v.callUser(f, "distributed load", t, false) }, a, x)
		if err != nil {
			return 0, v.quadErr(err, "distributed load integral", a, x)
		}
		r += q
	}
	return r, nil
}

// flex returns ∫_a^x dξ/(EA) within segment i: closed forms for constant and
// tapered segments (for a linear diameter ∫dξ/d² = Δx/(d_a·d_x) exactly),
// adaptive quadrature otherwise.
func (v *solver) flex(i int, a, x float64) (float64, error) {
	s := &v.segs[i]
	if s.closedForm() {
		switch s.Shape {
		case Constant:
			return (x - a) / (s.E * s.A1), nil
		case TaperDiameter:
			da := s.D1 + (s.D2-s.D1)*(a-v.x0[i])/s.L
			dx := s.D1 + (s.D2-s.D1)*(x-v.x0[i])/s.L
			return 4 * (x - a) / (math.Pi * s.E * da * dx), nil
		case TaperArea:
			aa, ax := v.area(i, a), v.area(i, x)
			return (x - a) / (s.E * aa) * log1pOver(ax/aa-1), nil
		}
	}
	r, _, _, err := adaptive(func(t float64) float64 { return 1 / (v.modulus(i, t) * v.area(i, t)) }, a, x)
	if err != nil {
		return 0, v.quadErr(err, "flexibility integral ∫dx/(EA)", a, x)
	}
	return r, nil
}

// log1pOver returns ln(1+r)/r, continuous at r = 0, so that a taper with
// nearly equal end areas loses no digits.
func log1pOver(r float64) float64 {
	if math.Abs(r) < 1e-5 {
		return 1 - r/2 + r*r/3 - r*r*r/4
	}
	return math.Log1p(r) / r
}

// gpart returns ∫_a^x (N₀(ξ)/(EA) + α·ΔT) dξ over a piece that starts at a
// with N₀(a+) = na, for a < x within segment i.
func (v *solver) gpart(i int, a, na, x float64) (float64, error) {
	s := &v.segs[i]
	th := s.Alpha * s.DT * (x - a)
	if !v.hasDist {
		f, err := v.flex(i, a, x)
		return na*f + th, err
	}
	// N₀(ξ) = na − ∫_a^ξ b: integrate the two parts apart, so that the
	// integrand never carries the cancellation of na against the load
	// integral (which would hold the relative test at rounding noise).
	f, err := v.flex(i, a, x)
	if err != nil {
		return 0, err
	}
	var inner error
	r, _, _, err := adaptive(func(t float64) float64 {
		li, err := v.loadInt(i, a, t)
		if err != nil {
			if inner == nil {
				inner = err
			}
			return math.NaN()
		}
		return li / (v.modulus(i, t) * v.area(i, t))
	}, a, x)
	if inner != nil {
		return 0, inner
	}
	if err != nil {
		return 0, v.quadErr(err, "integral ∫N/(EA)dx", a, x)
	}
	r = na*f - r
	return r + th, nil
}
