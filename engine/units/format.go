package units

import (
	"math"
	"math/big"
	"strconv"
	"strings"
)

// Plain decimal notation is used for magnitudes in [1e-4, 1e9); outside it
// the number is written in e-notation ("1.23e9", "4.5e-7"), which sheets and
// spreadsheets read back.
const (
	plainMinExp = -4
	plainMaxExp = 9
)

// FormatNumber writes x rounded to sig significant figures (clamped to
// 1..17). Trailing zeros after the decimal point are dropped ("2.5", not
// "2.50"): a calculation sheet states what was computed, and padded zeros
// would claim a precision the inputs rarely have. Zero is "0" (also -0),
// non-finite values are "NaN", "+Inf" and "-Inf".
func FormatNumber(x float64, sig int) string {
	var buf [32]byte
	return string(appendNumber(buf[:0], x, sig))
}

func appendNumber(b []byte, x float64, sig int) []byte {
	switch {
	case math.IsNaN(x):
		return append(b, "NaN"...)
	case math.IsInf(x, 1):
		return append(b, "+Inf"...)
	case math.IsInf(x, -1):
		return append(b, "-Inf"...)
	case x == 0:
		return append(b, '0')
	}
	sig = min(max(sig, 1), 17)
	// Round once in e-notation, then read the decimal exponent of the
	// rounded value (99.96 at 3 figures is 1.00e+02).
	var eb [32]byte
	e := strconv.AppendFloat(eb[:0], x, 'e', sig-1, 64)
	i := len(e) - 1
	for e[i] != 'e' {
		i--
	}
	exp, _ := strconv.Atoi(string(e[i+1:]))
	if exp >= plainMinExp && exp < plainMaxExp {
		rounded, _ := strconv.ParseFloat(string(e), 64)
		start := len(b)
		b = strconv.AppendFloat(b, rounded, 'f', max(0, sig-1-exp), 64)
		return trimZeros(b, start)
	}
	mant := e[:i]
	start := len(b)
	b = append(b, mant...)
	b = trimZeros(b, start)
	b = append(b, 'e')
	if exp < 0 {
		b = append(b, '-')
		exp = -exp
	}
	return strconv.AppendInt(b, int64(exp), 10)
}

// appendQuotient appends si/factor rounded to sig significant figures.
func appendQuotient(b []byte, si, factor float64, sig int) []byte {
	x := si / factor
	if !isFinite(si) || !isFinite(factor) || factor == 0 || si == 0 ||
		(isFinite(x) && math.Abs(x) >= minNormal) {
		return appendNumber(b, x, sig)
	}
	// The quotient overflowed or lost precision as a subnormal: divide with
	// a wider exponent range (big.Float exponents are 32-bit) and a 64-bit
	// mantissa, then print as appendNumber prints e-notation.
	q := new(big.Float).SetPrec(64).Quo(big.NewFloat(si), big.NewFloat(factor))
	sig = min(max(sig, 1), 17)
	e := q.Text('e', sig-1) // "-2.36e+310"
	i := strings.LastIndexByte(e, 'e')
	start := len(b)
	b = append(b, e[:i]...)
	b = trimZeros(b, start)
	b = append(b, 'e')
	exp := e[i+1:]
	switch exp[0] {
	case '-':
		b = append(b, '-')
		exp = exp[1:]
	case '+':
		exp = exp[1:]
	}
	return append(b, strings.TrimLeft(exp, "0")...)
}

// minNormal is the smallest positive normal float64; below it a quotient has
// fewer than 53 bits of precision.
const minNormal = 0x1p-1022

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// trimZeros drops trailing zeros after a decimal point in b[start:], and the
// point itself when nothing follows it.
func trimZeros(b []byte, start int) []byte {
	if !strings.Contains(string(b[start:]), ".") {
		return b
	}
	for len(b) > start && b[len(b)-1] == '0' {
		b = b[:len(b)-1]
	}
	if len(b) > start && b[len(b)-1] == '.' {
		b = b[:len(b)-1]
	}
	return b
}

// Format writes the SI value si in unit u with sig significant figures and a
// space before the symbol: "121 MPa", "0.757 mm", "5 %". A plain number
// (symbol "" or "1") gives the number alone. Format does not check
// that si has u's dimension; the checker has done that before evaluation.
func Format(si float64, u Unit, sig int) string {
	var buf [48]byte
	return string(AppendFormat(buf[:0], si, u, sig))
}

// AppendFormat appends the text Format gives to b, for callers that write
// many values into one buffer (the results of a large sheet).
//
// A finite value stays finite in any unit: when si/u.Factor leaves the range
// of float64 (2.36e304 m² in mm² is 2.36e310) or falls into its subnormal
// range, the quotient is taken in extended precision and written in
// e-notation, never as "+Inf" or "0".
func AppendFormat(b []byte, si float64, u Unit, sig int) []byte {
	b = appendQuotient(b, si, u.Factor, sig)
	if u.Symbol != "" && u.Symbol != "1" {
		b = append(b, ' ')
		b = append(b, u.Symbol...)
	}
	return b
}
