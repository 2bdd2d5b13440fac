package bar

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/integrate/quad"
)

// glOrder is the number of Gauss–Legendre points per panel. Ten points
// integrate polynomials up to degree 19 exactly, so the prismatic and tapered
// cases with polynomial loads converge on the first comparison, and smooth
// user functions converge at order h^20 per panel.
const glOrder = 10

// glNodes and glWeights are the rule on [-1, 1], computed once by gonum.
var glNodes, glWeights = func() ([]float64, []float64) {
	x := make([]float64, glOrder)
	w := make([]float64, glOrder)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	return x, w
}()

// quadRelTol is the relative accuracy asked of every adaptive integral,
// measured against ∫|f|, so that integrands that change sign (N through zero)
// still stop. It is well below the 1e-10 agreement promised between the
// shortcut formulas and the general solver.
const quadRelTol = 1e-13

// maxDepth bounds the bisection; 2^-40 of a panel is below any length an
// engineer means, so reaching it signals a singular or erratic integrand.
const maxDepth = 40

// errNaN is returned when the integrand produced NaN or ±Inf; callers
// replace it with a message naming the user function and the position.
var errNaN = errors.New("integrand is not a finite number")

// errNoConvergence is returned when bisection hit maxDepth.
var errNoConvergence = errors.New("quadrature did not converge")

// nanAt records the first x at which the integrand was not finite.
type integrand struct {
	f      func(float64) float64
	badAt  float64
	bad    bool
	panels int // panels evaluated, against maxPanels
	// perWidth is the error allowed per unit length of x.
	perWidth float64
}

// maxPanels bounds the work of one adaptive integral. A smooth integrand
// needs a few dozen panels; an integrand whose values are rounding noise
// around zero can never meet a relative test, and must stop here.
const maxPanels = 1 << 12

// panel integrates f over [a, b] with the fixed rule and returns the integral
// and the integral of |f| (the scale for the relative test).
func (g *integrand) panel(a, b float64) (sum, abs float64) {
	g.panels++
	h := (b - a) / 2
	m := (a + b) / 2
	for i, xi := range glNodes {
		x := m + h*xi
		v := g.f(x)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			if !g.bad {
				g.bad, g.badAt = true, x
			}
			return math.NaN(), math.NaN()
		}
		sum += glWeights[i] * v
		abs += glWeights[i] * math.Abs(v)
	}
	return sum * h, abs * h
}

// adaptive integrates f over [a, b] to a relative accuracy quadRelTol of ∫|f|
// by Gauss–Legendre panels bisected until the whole-panel value agrees with
// the sum over its halves. It returns the integral, an estimate of its
// absolute error, and errNaN (with the failing x) or errNoConvergence.
//
// The tolerance is shared out over [a, b] in proportion to panel width, so
// that the total error stays below quadRelTol·∫|f| while panels where f is
// small are not asked for more than the whole needs. It is never asked below
// the rounding of the positions themselves: an interval far from x = 0 and
// short (a piece 5 cm long at x = 80 m) has nodes known only to about
// eps·|x|/(b − a) relative to its length, and the integrand inherits that.
func adaptive(f func(float64) float64, a, b float64) (val, errEst, badAt float64, err error) {
	if a == b {
		return 0, 0, 0, nil
	}
	g := integrand{f: f}
	whole, abs := g.panel(a, b)
	if g.bad {
		return math.NaN(), 0, g.badAt, errNaN
	}
	tol := max(quadRelTol, 16*eps*max(math.Abs(a), math.Abs(b))/math.Abs(b-a))
	g.perWidth = tol * abs / math.Abs(b-a)
	val, errEst, err = g.refine(a, b, whole, abs, 0)
	if g.bad {
		return math.NaN(), 0, g.badAt, errNaN
	}
	return val, errEst, 0, err
}

// refine compares the panel [a, b] (value whole) with its two halves and
// bisects further where they disagree by more than the panel's share of the
// tolerance.
func (g *integrand) refine(a, b, whole, abs float64, depth int) (float64, float64, error) {
	m := (a + b) / 2
	l, labs := g.panel(a, m)
	r, rabs := g.panel(m, b)
	if g.bad {
		return math.NaN(), 0, errNaN
	}
	diff := math.Abs(l + r - whole)
	scale := math.Max(abs, labs+rabs)
	if diff <= g.perWidth*math.Abs(b-a) || diff <= 4*eps*scale || m == a || m == b {
		return l + r, diff, nil
	}
	if depth >= maxDepth || g.panels > maxPanels {
		return l + r, diff, errNoConvergence
	}
	lv, le, err := g.refine(a, m, l, labs, depth+1)
	if err != nil {
		return math.NaN(), 0, err
	}
	rv, re, err := g.refine(m, b, r, rabs, depth+1)
	if err != nil {
		return math.NaN(), 0, err
	}
	return lv + rv, le + re, nil
}

// eps is the float64 machine epsilon.
const eps = 0x1p-52

// composite integrates f over [a, b] with an n-point Gauss–Legendre rule on m
// equal panels. The solver does not use it; the convergence tests do, to show
// that the error of the rule falls as h^(2n) for smooth integrands.
func composite(f func(float64) float64, a, b float64, m, n int) float64 {
	x := make([]float64, n)
	w := make([]float64, n)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	h := (b - a) / float64(m)
	sum := 0.0
	for k := range m {
		lo := a + float64(k)*h
		s := 0.0
		for i := range x {
			s += w[i] * f(lo+h*(x[i]+1)/2)
		}
		sum += s * h / 2
	}
	return sum
}
