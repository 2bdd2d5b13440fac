package batch

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Value reads one field of column col as an SI value: a bare number is in
// the column's header unit (or a plain number when the header has none), a
// number with a unit (`45 kN`, `45kN`) is converted after its dimension is
// checked, and anything else is read as a value on a command line
// (engine.Sheet.ParseInput), which also covers records and expressions.
//
// The common forms take a fast path without the formula parser: a case
// table of 100,000 rows reads in well under a second.
func Value(s *engine.Sheet, col *Column, text string) (funcs.Value, error) {
	text = strings.TrimSpace(text)
	if text == "" {
		return nil, fmt.Errorf("the value is empty")
	}
	isNum := col.Cell.Type != nil && col.Cell.Type.Kind == funcs.Number
	if isNum && !decimal(text) && looksNumeric(text) {
		return nil, fmt.Errorf("%q is not a decimal number: write digits, a point and an exponent, as in 2.5 or 1.2e-3 (no hexadecimal, NaN, Inf or digit groups)", text)
	}
	if x, err := strconv.ParseFloat(text, 64); err == nil && isNum && decimal(text) {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, fmt.Errorf("%q is out of range: its magnitude must be below about 1.8e308", text)
		}
		switch {
		case col.HasUnit:
			return finiteSI(text, x*col.Unit.Factor, col.Unit.Symbol)
		case col.Cell.Type.Dim.IsNone() && col.Cell.HasUnit && col.Cell.Unit().Factor != 1:
			// The cell is shown in % (or ‰): a bare 5 would be 500 %.
			return nil, fmt.Errorf("`%s` is shown in %s and a plain number is a fraction of one: write %s %s, or put the unit in the header: %s [%s]",
				col.Name, col.Cell.Unit().Symbol, text, col.Cell.Unit().Symbol, col.Name, col.Cell.Unit().Symbol)
		case col.Cell.Type.Dim.IsNone():
			return x, nil
		}
		u := s.DisplayUnit(col.Cell)
		return nil, fmt.Errorf("`%s` must be %s, but %q has no unit; write %s %s, or put the unit in the header: %s [%s]",
			col.Name, describe(s, col.Cell), text, text, u.Symbol, col.Name, u.Symbol)
	}
	if isNum {
		if num, unit, ok := splitQuantity(text); ok {
			x, err1 := strconv.ParseFloat(num, 64)
			u, err2 := units.Parse(unit)
			if err1 == nil && err2 == nil {
				if u.Dim != col.Cell.Type.Dim {
					got := "of another dimension"
					if u.Dim.IsNone() {
						got = "a plain number"
					} else if u.Quantity != "" {
						got = article(u.Quantity) + " " + u.Quantity
					}
					return nil, fmt.Errorf("`%s` must be %s, but %q is %s", col.Name, describe(s, col.Cell), text, got)
				}
				return finiteSI(text, x*u.Factor, u.Symbol)
			}
		}
	}
	return s.ParseInput(col.Name, text)
}

// finiteSI returns si, the value of text in SI, unless scaling to SI
// overflowed (`1e308` in a column of km).
func finiteSI(text string, si float64, unit string) (funcs.Value, error) {
	if math.IsInf(si, 0) || math.IsNaN(si) {
		return nil, fmt.Errorf("%q in %s is out of range once converted to SI units", text, unit)
	}
	return si, nil
}

// decimal reports whether text is a plain decimal number, as a sheet
// writes one: [+-] digits [. digits] [e [+-] digits]. strconv.ParseFloat
// also reads hexadecimal floats, NaN, Inf and digit groups, which a case
// table must not slip in.
func decimal(text string) bool {
	i := 0
	if i < len(text) && (text[i] == '+' || text[i] == '-') {
		i++
	}
	digits := 0
	for i < len(text) && isDigit(text[i]) {
		i, digits = i+1, digits+1
	}
	if i < len(text) && text[i] == '.' {
		i++
		for i < len(text) && isDigit(text[i]) {
			i, digits = i+1, digits+1
		}
	}
	if digits == 0 {
		return false
	}
	if i < len(text) && (text[i] == 'e' || text[i] == 'E') {
		i++
		if i < len(text) && (text[i] == '+' || text[i] == '-') {
			i++
		}
		n := 0
		for i < len(text) && isDigit(text[i]) {
			i, n = i+1, n+1
		}
		if n == 0 {
			return false
		}
	}
	return i == len(text)
}

// looksNumeric reports whether text reads as a number although it is not a
// plain decimal: a form strconv.ParseFloat accepts (0x1p4, NaN, Inf) or
// digits grouped with `_` (1_000).
func looksNumeric(text string) bool {
	_, err := strconv.ParseFloat(text, 64)
	return err == nil || strings.Contains(text, "_") && decimal(strings.ReplaceAll(text, "_", ""))
}

// splitQuantity splits "45 kN", "45kN" or "2.5e3 N/mm^2" into the number and
// the unit text. It reports false when text does not start with a number
// followed by something.
func splitQuantity(text string) (num, unit string, ok bool) {
	i := 0
	if i < len(text) && (text[i] == '+' || text[i] == '-') {
		i++
	}
	start := i
	for i < len(text) && (isDigit(text[i]) || text[i] == '.') {
		i++
	}
	if i == start {
		return "", "", false
	}
	if i+1 < len(text) && (text[i] == 'e' || text[i] == 'E') {
		j := i + 1
		if text[j] == '+' || text[j] == '-' {
			j++
		}
		if j < len(text) && isDigit(text[j]) {
			for j < len(text) && isDigit(text[j]) {
				j++
			}
			i = j
		}
	}
	unit = strings.TrimSpace(text[i:])
	if unit == "" {
		return "", "", false
	}
	return text[:i], unit, true
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// article is "an" before a vowel sound (as far as a quantity name goes),
// else "a".
func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "an"
	}
	return "a"
}
