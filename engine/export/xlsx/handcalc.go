package xlsxout

import (
	"cmp"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// span is a piece of an expression to replace by a value.
type span struct {
	off, end int
	text     string
}

// substituted writes the expression text with every value it reads
// (cells and fields of records) replaced by that value in its display
// unit, as in a hand calculation: "N_Ed / A_s" -> "17.2 kN / 157 mm²".
// It returns "" when the positions of the tree do not fit the text.
func (x *exporter) substituted(c *check.Cell, body ...check.Node) string {
	if c.Formula == nil {
		return ""
	}
	src := c.Formula.Source
	base := src.Range.Start().Offset
	var spans []span
	mixed := false // a value of another combination than c's
	var walk func(n check.Node, base bool)
	walk = func(n check.Node, powBase bool) {
		if n.IsZero() {
			return
		}
		switch n.Op() {
		case check.OpCell, check.OpField:
			if n.Type().Kind == funcs.Number {
				if v, ok := x.pathValue(x.tr.path(n)); ok {
					if v, ok = x.comboSubst(c, n, v); !ok {
						mixed = true
						return
					}
					if powBase && !strings.HasPrefix(v, "(") && strings.Contains(v, " ") {
						v = "(" + v + ")" // (16 mm)^2, not 16 mm^2
					}
					r := n.Range()
					spans = append(spans, span{r.Start().Offset - base, r.End().Offset - base, v})
					return
				}
			}
		case check.OpParam, check.OpFuncRef:
			return
		}
		for i, a := range n.Args() {
			walk(a, i == 0 && (n.Op() == check.OpPow || n.Op() == check.OpBuiltin && n.Builtin() == check.BPow))
		}
	}
	for _, b := range body {
		walk(b, false)
	}
	if mixed {
		return ""
	}
	text := src.Text
	slices.SortFunc(spans, func(a, b span) int { return cmp.Compare(a.off, b.off) })
	var b strings.Builder
	last := 0
	for _, s := range spans {
		if s.off < last || s.end > len(text) || s.off > s.end {
			return ""
		}
		b.WriteString(text[last:s.off])
		b.WriteString(s.text)
		last = s.end
	}
	b.WriteString(text[last:])
	return oneLine(b.String())
}

// oneLine folds an expression written over several lines into one.
func oneLine(s string) string {
	if isOneLine(s) {
		return s // most expressions are: no need to split and join them
	}
	return strings.Join(strings.Fields(s), " ")
}

// isOneLine reports whether oneLine(s) == s: ASCII only (strings.Fields
// splits at Unicode spaces too), no space at either end, no control
// character that strings.Fields counts as space, no two spaces in a row.
func isOneLine(s string) bool {
	if s == "" {
		return true
	}
	if s[0] == ' ' || s[len(s)-1] == ' ' {
		return false
	}
	for i := 0; i < len(s); i++ {
		switch b := s[i]; {
		case b >= 0x80, b >= '\t' && b <= '\r':
			return false
		case b == ' ' && s[i+1] == ' ':
			return false
		}
	}
	return true
}

// pathValue formats the value of a cell or field for a hand calculation,
// bracketed when negative so that "a - b" stays readable.
func (x *exporter) pathValue(p string) (string, bool) {
	v, ok := x.values[p]
	if !ok {
		return "", false
	}
	s := x.format(v.si, v.unit)
	if v.si < 0 {
		s = "(" + s + ")"
	}
	return s, true
}

// format writes an SI value in unit u with the export's significant
// figures and the typographic unit symbol: "121 MPa", "157 mm²", "0.9".
func (x *exporter) format(si float64, u units.Unit) string {
	s := units.Format(si, units.Unit{Factor: u.Factor}, x.sig) // finite stays finite
	if p := u.Pretty(); p != "" && p != "1" {
		s += " " + p
	}
	return s
}

// handCalc is the hand-calculation line of a value cell:
// "sigma = N_Ed / A_s = 17.2 kN / 157 mm² = 109.5 MPa". A literal input
// has none: its expression already says everything. expr is
// oneLine(c.Expr), which the caller has at hand.
func (x *exporter) handCalc(c *check.Cell, expr, result string) string {
	sub := x.substituted(c, c.Body())
	if sub == "" {
		sub = expr
	}
	if len(x.s.Program().Deps(c.Index)) == 0 && (c.Body().IsZero() || c.Body().Op() == check.OpConst || c.Body().Op() == check.OpNeg && c.Body().Arg(0).Op() == check.OpConst) {
		return ""
	}
	line := c.Name + " = " + expr
	if sub != expr {
		line += " = " + sub
	}
	return line + " = " + result
}

// checkCalc is the hand-calculation line of a check.
func (x *exporter) checkCalc(c *check.Cell, cr *checkRow) string {
	if !cr.known {
		return oneLine(c.Expr()) + ": not assessed"
	}
	sub := x.substituted(c, c.Extra().Demand, c.Extra().Capacity)
	if sub == "" {
		sub = oneLine(c.Expr())
	}
	return sub + "; utilisation " + x.format(cr.demand, cr.unit) + " / " + x.format(cr.capacity, cr.unit) +
		" = " + units.FormatNumber(cr.util*100, 3) + " %"
}
