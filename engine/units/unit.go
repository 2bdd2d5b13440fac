package units

import (
	"fmt"
	"strings"
)

// Unit is a unit of measurement: how to write it, what it measures and how
// large it is in SI.
type Unit struct {
	// Symbol is the canonical spelling, which Parse reads back to the same
	// unit: ASCII operators (`*` for a product, `/` for a quotient, `^` for a
	// power) around the SI letter symbols (`kN*m`, `N/mm^2`, `µm`).
	Symbol string
	// Dim is the physical dimension.
	Dim Dim
	// Factor is the SI value of one of this unit: 1 kN -> 1000.
	Factor float64
	// Quantity is what the unit measures in structural terms ("stress",
	// "weight density"); empty when no name is known for the dimension.
	Quantity string
	// System is the practice the unit belongs to.
	System System
}

// String returns the symbol.
func (u Unit) String() string { return u.Symbol }

// FromSI converts an SI value to a number of this unit.
func (u Unit) FromSI(si float64) float64 { return si / u.Factor }

// ToSI converts a number of this unit to SI.
func (u Unit) ToSI(x float64) float64 { return x * u.Factor }

// Convert converts x from unit from to unit to. It fails when the two units
// measure different dimensions, naming both.
func Convert(x float64, from, to Unit) (float64, error) {
	if from.Dim != to.Dim {
		return 0, fmt.Errorf("cannot convert `%s` (%s) to `%s` (%s)", from.Symbol, from.Dim, to.Symbol, to.Dim)
	}
	return x * from.Factor / to.Factor, nil
}

// Pretty returns the symbol in typographic form for reports and workbooks:
// a middle dot for products and superscript exponents ("kN·m", "N/mm²",
// "m⁻¹", "MPa^(1/2)" keeps its half exponent spelt out). Parse reads it back.
func (u Unit) Pretty() string {
	s := u.Symbol
	if !strings.ContainsAny(s, "*^") {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '*':
			b.WriteString("·")
		case c == '^' && i+1 < len(s) && (s[i+1] == '-' || isDigit(rune(s[i+1]))):
			i++
			if s[i] == '-' {
				b.WriteString("⁻")
				i++
			}
			for ; i < len(s) && isDigit(rune(s[i])); i++ {
				b.WriteString(superscripts[s[i]-'0'])
			}
			i--
		default:
			b.WriteByte(c)
		}
	}
	return b.String()
}

var superscripts = [10]string{"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"}
