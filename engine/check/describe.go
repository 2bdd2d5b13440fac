package check

import (
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// describeDim renders a dimension for a message as a quantity and its
// preferred unit, e.g. "force (kN)", falling back to SI base units.
func (t *typer) describeDim(d units.Dim) string {
	if d.IsNone() {
		return "a plain number"
	}
	if !d.Valid() {
		return "a quantity whose dimension exponents are out of range"
	}
	u, ok := units.Preferred(d, t.system)
	if !ok {
		return "a quantity in " + siSymbol(d)
	}
	if u.Quantity != "" {
		return u.Quantity + " (" + u.Symbol + ")"
	}
	return "a quantity in " + u.Symbol
}

// unitOf names a unit of dimension d for hints.
func (t *typer) unitOf(d units.Dim) string {
	if u, ok := units.Preferred(d, t.system); ok {
		return u.Symbol
	}
	return siSymbol(d)
}

// siNames are the units of the base dimensions of units.Dim, in its order;
// the radian stands for Sheaf's angle dimension.
var siNames = [...]string{"m", "kg", "s", "A", "K", "mol", "cd", "rad"}

// siSymbol writes d in SI base units, e.g. "kg*m^-1*s^-2".
func siSymbol(d units.Dim) string {
	s := ""
	for i, e := range d {
		if e == 0 {
			continue
		}
		if s != "" {
			s += "*"
		}
		s += siNames[i]
		switch {
		case e == 2:
		case e%2 == 0:
			s += "^" + strconv.Itoa(int(e)/2)
		default:
			s += "^(" + strconv.Itoa(int(e)) + "/2)"
		}
	}
	if s == "" {
		return "1"
	}
	return s
}

// describeType renders a type for a message, with dimensions as units.
func (t *typer) describeType(ty *funcs.Type) string {
	if ty == nil {
		return "nothing"
	}
	switch ty.Kind {
	case funcs.Number:
		return t.describeDim(ty.Dim)
	case funcs.List:
		if ty.Elem != nil && ty.Elem.Kind == funcs.Number {
			return "a list of " + t.describeDim(ty.Elem.Dim)
		}
		return "a list"
	case funcs.Record:
		if ty.Name != "" {
			return "a " + ty.Name + " record"
		}
		return "a record"
	case funcs.Table:
		// A table is told by its columns: "must be a table, got a table"
		// says nothing of the column that is missing or in the wrong unit.
		if len(ty.Fields) == 0 {
			return "a table"
		}
		cols := make([]string, len(ty.Fields))
		for i, f := range ty.Fields {
			cols[i] = f.Name
			if f.Optional {
				cols[i] += "?"
			}
			if f.Type != nil && f.Type.Kind == funcs.Number {
				if f.Type.Dim.IsNone() {
					cols[i] += " [1]"
				} else {
					cols[i] += " [" + t.unitOf(f.Type.Dim) + "]"
				}
			}
		}
		return "a table with columns " + strings.Join(cols, ", ")
	case funcs.Bool:
		return "a yes/no value (a comparison)"
	case funcs.String:
		return "text"
	case funcs.Func:
		return "a function"
	}
	return ty.Kind.String()
}

// plainNumberHint is the hint for a plain number in a cell whose display
// unit u has a dimension (`d [mm] = 16`, `alpha [deg] = 35`): the number
// needs its unit. body is the cell's expression; a literal is quoted back
// with the unit.
func plainNumberHint(u units.Unit, body Node) string {
	sym := u.Symbol
	if body.Op() == OpConst {
		lit := "`" + units.FormatNumber(body.Num(), 15) + " " + sym + "`"
		if u.Dim == angleDim {
			return "a plain number is not an angle: write " + lit + ", or multiply a number of radians by 1 rad"
		}
		return "write the number with its unit: " + lit
	}
	if u.Dim == angleDim {
		return "a plain number is not an angle: a number of degrees becomes one as x * 1 deg, of radians as x * 1 rad"
	}
	return "give the result its unit, as in x * 1 " + sym + ", or correct the formula"
}
