package units

import (
	"strconv"
	"strings"
)

// Base dimensions in the order of ISO 80000-1 / the SI brochure.
const (
	Length = iota
	Mass
	Time
	Current
	Temperature
	Amount
	Luminous
	nBase
)

var baseSymbols = [nBase]string{"L", "M", "T", "I", "Θ", "N", "J"}

// Dim is a physical dimension: the exponents of the seven SI base dimensions.
// Each exponent is stored doubled, so half exponents (from a square root, as in
// √MPa inside an empirical formula) are exact. Dim is a comparable value of
// seven bytes: copying, comparing, multiplying and dividing allocate nothing.
type Dim [nBase]int8

// None is the dimension of a pure number.
var None Dim

// Base returns the dimension of base quantity i raised to the first power.
func Base(i int) Dim {
	var d Dim
	d[i] = 2
	return d
}

// IsNone reports whether d is dimensionless.
func (d Dim) IsNone() bool { return d == None }

// Mul returns the dimension of a product.
func (d Dim) Mul(e Dim) Dim {
	for i := range d {
		d[i] += e[i]
	}
	return d
}

// Div returns the dimension of a quotient.
func (d Dim) Div(e Dim) Dim {
	for i := range d {
		d[i] -= e[i]
	}
	return d
}

// Inv returns 1/d.
func (d Dim) Inv() Dim { return None.Div(d) }

// Pow returns d raised to the rational power num/den. It reports false when a
// resulting exponent is not a multiple of one half or would overflow.
func (d Dim) Pow(num, den int) (Dim, bool) {
	if den == 0 {
		return d, false
	}
	var r Dim
	for i, e := range d {
		p := int(e) * num
		if p%den != 0 {
			return d, false
		}
		p /= den
		if p > 126 || p < -126 {
			return d, false
		}
		r[i] = int8(p)
	}
	return r, true
}

// Sqrt returns the dimension of a square root; false if an exponent would
// fall below one half (e.g. √(m^(1/2))).
func (d Dim) Sqrt() (Dim, bool) { return d.Pow(1, 2) }

// Exp returns the exponent of base dimension i as numerator over 2.
func (d Dim) Exp(i int) (num int, halves bool) {
	e := int(d[i])
	if e%2 != 0 {
		return e, true
	}
	return e / 2, false
}

// String renders d in base-dimension notation, e.g. "L·M·T^-2", "1" for None,
// "L^(1/2)" for half exponents.
func (d Dim) String() string {
	if d.IsNone() {
		return "1"
	}
	var parts []string
	for i, e := range d {
		if e == 0 {
			continue
		}
		s := baseSymbols[i]
		switch {
		case e == 2:
		case e%2 == 0:
			s += "^" + strconv.Itoa(int(e)/2)
		default:
			s += "^(" + strconv.Itoa(int(e)) + "/2)"
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "·")
}
