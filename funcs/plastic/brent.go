package plastic

import (
	"errors"
	"math"
)

// errNoBracket is returned when f(a) and f(b) have the same sign.
var errNoBracket = errors.New("the root is not bracketed")

// brent finds x in [a, b] with f(x) = 0, given that f(a) and f(b) have
// opposite signs (or one is zero), to an absolute tolerance tol (plus four
// ulps of x). It combines bisection, the secant step and inverse quadratic
// interpolation and never leaves the bracket, so it converges for any
// continuous f and superlinearly for a smooth one.
// Source: R. P. Brent, Algorithms for Minimization without Derivatives,
// Prentice-Hall 1973, Ch. 4, procedure zero.
func brent(f func(float64) float64, a, b, tol float64, maxIter int) (float64, int, error) {
	fa, fb := f(a), f(b)
	if math.IsNaN(fa) || math.IsNaN(fb) {
		return 0, 0, errors.New("the function has no value at an end of the bracket")
	}
	if fa == 0 {
		return a, 0, nil
	}
	if fb == 0 {
		return b, 0, nil
	}
	if (fa > 0) == (fb > 0) {
		return 0, 0, errNoBracket
	}
	c, fc := a, fa
	d := b - a
	e := d
	for it := 1; it <= maxIter; it++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*0x1p-52*math.Abs(b) + tol/2
		m := (c - b) / 2
		if math.Abs(m) <= tol1 || fb == 0 {
			return b, it, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p = 2 * m * s // secant
				q = 1 - s
			} else { // inverse quadratic interpolation
				q = fa / fc
				r := fb / fc
				p = s * (2*m*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d, e = m, m
			}
		} else {
			d, e = m, m
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, m)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return 0, it, errors.New("the function has no value inside the bracket")
		}
	}
	return b, maxIter, errors.New("no convergence within the iteration limit")
}
