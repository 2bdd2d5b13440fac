package stability

import (
	"fmt"
	"math"
	"sort"
)

// Curve is a buckling curve given point by point: reduction factor Chi at
// non-dimensional slenderness Lambda, Lambda strictly increasing.
type Curve struct {
	Lambda, Chi []float64
}

// NewCurve checks the points of a curve: at least two, finite, Lambda
// strictly increasing and ≥ 0, Chi in (0, 1.5] (a factor above 1 is allowed
// for curves that start with a plateau above unity in some codes, but a
// typing slip such as 95 for 0.95 is caught).
func NewCurve(lambda, chi []float64) (*Curve, error) {
	if len(lambda) != len(chi) {
		return nil, fmt.Errorf("the curve has %d lambda values and %d chi values", len(lambda), len(chi))
	}
	if len(lambda) < 2 {
		return nil, fmt.Errorf("the curve has %d row(s); hint: give at least two rows of lambda and chi", len(lambda))
	}
	for i := range lambda {
		l, c := lambda[i], chi[i]
		if math.IsNaN(l) || math.IsInf(l, 0) || l < 0 {
			return nil, fmt.Errorf("curve row %d: lambda = %g must be a finite number ≥ 0", i+1, l)
		}
		if math.IsNaN(c) || math.IsInf(c, 0) || c <= 0 || c > 1.5 {
			return nil, fmt.Errorf("curve row %d: chi = %g must lie in (0, 1.5]; hint: chi is a factor such as 0.85, not a percentage", i+1, c)
		}
		if i > 0 && l <= lambda[i-1] {
			return nil, fmt.Errorf("curve row %d: lambda = %g does not increase (previous %g); hint: sort the rows by lambda", i+1, l, lambda[i-1])
		}
	}
	return &Curve{Lambda: lambda, Chi: chi}, nil
}

// At returns χ at λ̄ by linear interpolation between the rows. It refuses to
// extrapolate: outside the tabulated range the code's curve is unknown.
func (c *Curve) At(lambda float64) (float64, error) {
	n := len(c.Lambda)
	lo, hi := c.Lambda[0], c.Lambda[n-1]
	if math.IsNaN(lambda) || lambda < lo || lambda > hi {
		return 0, fmt.Errorf("lambda = %g lies outside the curve's range %g … %g; hint: extend the table, the curve is not extrapolated", lambda, lo, hi)
	}
	j := sort.SearchFloat64s(c.Lambda, lambda) // first index with Lambda[j] ≥ lambda
	if j < n && c.Lambda[j] == lambda {
		return c.Chi[j], nil
	}
	x0, x1 := c.Lambda[j-1], c.Lambda[j]
	y0, y1 := c.Chi[j-1], c.Chi[j]
	t := (lambda - x0) / (x1 - x0)
	return y0 + t*(y1-y0), nil
}
