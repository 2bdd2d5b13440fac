package funcs

import "github.com/sheafcalc/sheaf/engine/units"

// Length writes an SI length for a message in millimetres with four
// significant figures ("323.9 mm"), as a listing shows it, instead of the
// float64 noise of SI metres ("0.32389999999999997 m").
func Length(m float64) string { return Quantity(m, units.Base(units.Length)) }

// Quantity writes an SI value of dimension d for a message in the
// preferred metric unit of d with four significant figures.
func Quantity(si float64, d units.Dim) string {
	u, _ := units.Preferred(d, units.Metric)
	if u.Factor == 0 {
		u.Factor = 1
	}
	return units.Format(si, u, 4)
}

// Dimensions the messages of the families name most.
var (
	Force  = units.Base(units.Length).Mul(units.Base(units.Mass)).Div(units.Base(units.Time).Mul(units.Base(units.Time)))
	Stress = Force.Div(units.Base(units.Length).Mul(units.Base(units.Length)))
)
