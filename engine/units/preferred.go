package units

import (
	"math"
	"strconv"
)

// Preferred display units, in order, for each system. The first unit of a
// dimension wins. These are the units a structural engineer reads without
// converting: forces in kN, stresses in MPa, lengths of members and
// deflections in mm, moments in kN·m (metric); kip, ksi, in, kip·ft (US).
var preferredSymbols = map[System][]string{
	Metric: {
		"1", "kN", "MPa", "mm", "kN*m", "kN/m", "mm^2", "mm^3", "mm^4",
		"kN/m^3", "kg/m^3", "kg", "s", "K", "1/K", "kN*m^2",
		"m/s", "m/s^2", "kW", "Hz", "deg",
	},
	US: {
		"1", "kip", "ksi", "in", "kip*ft", "klf", "in^2", "in^3", "in^4",
		"pcf", "lb/ft^3", "lb", "s", "degF", "1/degF", "kip*in^2",
		"ft/s", "ft/s^2", "Hz", "deg",
	},
}

// buildPreferred maps system and dimension to the unit to show, parsing
// the lists against t (whose catalogue is complete), for build.
func buildPreferred(t *tables) map[System]map[Dim]Unit {
	preferred := make(map[System]map[Dim]Unit, len(preferredSymbols))
	for sys, syms := range preferredSymbols {
		m := make(map[Dim]Unit, len(syms))
		for _, s := range syms {
			u, err := parse(s, t)
			if err != nil {
				panic("units: preferred unit " + s + ": " + err.Error())
			}
			if s == "1" {
				u.Symbol = "" // a plain number shows no unit
			}
			if _, dup := m[u.Dim]; !dup {
				m[u.Dim] = u
			}
		}
		preferred[sys] = m
	}
	return preferred
}

// Preferred returns the display unit for dimension d in system s (Neutral
// uses the metric list). When the list has no unit of that dimension it
// returns the coherent SI unit composed from base units, such as
// "kg*m^-1*s^-2", and false; the unit is usable either way. The preferred
// unit of a plain number has an empty symbol, so Format shows the number alone.
func Preferred(d Dim, s System) (Unit, bool) {
	if s == Neutral {
		s = Metric
	}
	if u, ok := tab().preferred[s][d]; ok {
		return u, true
	}
	return Coherent(d), false
}

// baseOrder is the order base units appear in a composed symbol: mass
// first, as stresses and forces read best that way (kg*m^-1*s^-2).
var baseOrder = [...]struct {
	i   int
	sym string
}{
	{Mass, "kg"}, {Length, "m"}, {Time, "s"}, {Current, "A"},
	{Temperature, "K"}, {Amount, "mol"}, {Luminous, "cd"}, {Angle, "rad"},
}

// Coherent returns the coherent SI unit of d (factor 1) written as a product
// of base units with signed exponents, e.g. "kg*m^-1*s^-2" or "m^(1/2)".
// Its symbol parses back to the same dimension.
//
// Overflow has no unit: its symbol is "?" and its factor NaN, so a value
// that reached it anyway is never shown as a number in some unit.
func Coherent(d Dim) Unit {
	u := Unit{Dim: d, Factor: 1, Quantity: tab().defaultQty[d], System: Neutral}
	if d.IsNone() {
		u.Symbol = "1"
		return u
	}
	if !d.Valid() {
		u.Symbol, u.Factor = "?", math.NaN()
		return u
	}
	var b []byte
	for _, base := range baseOrder {
		e := int(d[base.i])
		if e == 0 {
			continue
		}
		if len(b) > 0 {
			b = append(b, '*')
		}
		b = append(b, base.sym...)
		switch {
		case e == 2:
		case e%2 == 0:
			b = append(b, '^')
			b = strconv.AppendInt(b, int64(e/2), 10)
		default:
			b = append(b, "^("...)
			b = strconv.AppendInt(b, int64(e), 10)
			b = append(b, "/2)"...)
		}
	}
	u.Symbol = string(b)
	return u
}
