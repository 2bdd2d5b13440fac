package units

import (
	"math"
	"strconv"
	"strings"
)

// Base dimensions: the seven of ISO 80000-1 / the SI brochure in their order,
// then plane angle, which Sheaf keeps as a dimension of its own.
//
// The SI counts the radian as a coherent derived unit equal to one, so to the
// SI an angle is a plain number. A calculation sheet that followed it could
// not tell `alpha [deg] = 35` (35 rad, shown as 2005°) from an angle the
// engineer meant: the wrong number would go on silently. Keeping angle apart,
// as temperature intervals are kept apart, makes that an error at check time;
// a formula that needs the plain number in radians divides by `1 rad`.
const (
	Length = iota
	Mass
	Time
	Current
	Temperature
	Amount
	Luminous
	Angle
	nBase
)

// baseSymbols are the dimension symbols of ISO 80000-1 and, for Angle, our
// own choice: A (for angle; the dimension of electric current is I).
var baseSymbols = [nBase]string{"L", "M", "T", "I", "Θ", "N", "J", "A"}

// Dim is a physical dimension: the exponents of the base dimensions. Each
// exponent is stored doubled, so half exponents (from a square root, as in
// √MPa inside an empirical formula) are exact. Dim is a comparable value of
// eight bytes: copying, comparing, multiplying and dividing allocate nothing.
//
// A stored exponent lies within ±MaxExp2. Mul, Div and Inv return Overflow
// when a result would leave that range, and Overflow stays Overflow through
// every later product, so a caller can test the final result once (Valid).
type Dim [nBase]int8

// MaxExp2 is the largest doubled exponent a Dim holds: a whole exponent of at
// most 63 (m^63) or a half of at most 126/2.
const MaxExp2 = 126

// None is the dimension of a pure number.
var None Dim

// Overflow is the result of dimension arithmetic whose exponent left the
// range ±MaxExp2 (as in (m^-32)·(m^-32)·(m^-32)). It is not the dimension of
// any quantity: every exponent holds -128, a value no valid Dim has.
var Overflow = Dim{math.MinInt8, math.MinInt8, math.MinInt8, math.MinInt8,
	math.MinInt8, math.MinInt8, math.MinInt8, math.MinInt8}

// Base returns the dimension of base quantity i raised to the first power.
func Base(i int) Dim {
	var d Dim
	d[i] = 2
	return d
}

// IsNone reports whether d is dimensionless.
func (d Dim) IsNone() bool { return d == None }

// Valid reports whether d is a dimension, not the Overflow of an arithmetic
// whose exponent left the range.
func (d Dim) Valid() bool { return d[0] != math.MinInt8 }

// Mul returns the dimension of a product, or Overflow.
func (d Dim) Mul(e Dim) Dim { return d.add(e, 1) }

// Div returns the dimension of a quotient, or Overflow.
func (d Dim) Div(e Dim) Dim { return d.add(e, -1) }

// add is d + sign·e on the exponents; Overflow when either is Overflow or a
// sum leaves ±MaxExp2. Sums are taken in int, so nothing wraps.
func (d Dim) add(e Dim, sign int) Dim {
	if !d.Valid() || !e.Valid() {
		return Overflow
	}
	for i := range d {
		s := int(d[i]) + sign*int(e[i])
		if s > MaxExp2 || s < -MaxExp2 {
			return Overflow
		}
		d[i] = int8(s)
	}
	return d
}

// Inv returns 1/d, or Overflow.
func (d Dim) Inv() Dim { return None.Div(d) }

// Pow returns d raised to the rational power num/den. It reports false when a
// resulting exponent is not a multiple of one half or would leave ±MaxExp2,
// or when d is Overflow.
func (d Dim) Pow(num, den int) (Dim, bool) {
	if den == 0 || !d.Valid() {
		return d, false
	}
	var r Dim
	for i, e := range d {
		p := int(e) * num
		if p%den != 0 {
			return d, false
		}
		p /= den
		if p > MaxExp2 || p < -MaxExp2 {
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
// "L^(1/2)" for half exponents, "A" for an angle, and "overflow" for Overflow.
func (d Dim) String() string {
	if d.IsNone() {
		return "1"
	}
	if !d.Valid() {
		return "overflow"
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
