package report

import (
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/combine"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// typesetter writes a typed tree as MathML, either with its symbols or,
// with subst set, with the value of every number cell put in its place.
type typesetter struct {
	d     *doc
	fn    *engine.Cell // the user function whose parameters OpParam reads
	scope string       // prefix dropped from names ("access." in a template use)
	subst bool
	// combo is the combination of the cell being written (-1 for none), in
	// a sheet with actions: an action is put in as its factor in it times
	// its characteristic value; mixed is set when a value put in is of
	// another combination (the substituted line is then left out).
	combo int
	mixed bool
	// substituted counts the values put in place: a substituted line that
	// replaced nothing repeats the formula and is left out.
	substituted int
}

// Precedence levels, loosest first, as SPEC.md §4 orders the grammar.
const (
	precCond = 1 + iota
	precOr
	precAnd
	precCmp
	precSum
	precProd
	precUnary
	precPow
	precAtom
)

func (t *typesetter) prec(n check.Node) int {
	switch n.Op() {
	case check.OpCond:
		return precCond
	case check.OpOr:
		return precOr
	case check.OpAnd:
		return precAnd
	case check.OpLT, check.OpLE, check.OpGT, check.OpGE, check.OpEQ, check.OpNE:
		return precCmp
	case check.OpAdd, check.OpSub:
		return precSum
	case check.OpMul:
		return precProd
	case check.OpNeg, check.OpNot:
		return precUnary
	case check.OpPow:
		return precPow
	case check.OpConst:
		if strings.HasPrefix(strings.TrimSpace(t.d.text(n)), "-") {
			return precUnary
		}
	}
	return precAtom // a fraction is a block of its own and needs no brackets
}

// expr writes n, in brackets when it binds looser than min.
func (t *typesetter) expr(b *strings.Builder, n check.Node, min int) {
	if n.IsZero() {
		b.WriteString("<mi>?</mi>")
		return
	}
	wrap := t.prec(n) < min
	if min > precAtom {
		wrap = !t.atomic(n) // the base of a power: only what reads as one symbol goes bare
	}
	if wrap {
		b.WriteString("<mrow><mo>(</mo>")
		t.node(b, n)
		b.WriteString("<mo>)</mo></mrow>")
		return
	}
	t.node(b, n)
}

// atomic reports whether n needs no brackets even as the base of a power.
func (t *typesetter) atomic(n check.Node) bool {
	switch n.Op() {
	case check.OpCell, check.OpParam, check.OpField, check.OpIndex, check.OpColumn,
		check.OpBuiltin, check.OpPlugin, check.OpUser, check.OpList, check.OpString:
		return true
	case check.OpConst:
		s := t.d.text(n)
		return !strings.ContainsAny(s, " -") && !strings.ContainsAny(s, "eE")
	}
	return false
}

var opText = map[check.Op]string{
	check.OpAdd: "+", check.OpSub: "−", check.OpMul: "·",
	check.OpLT: "&lt;", check.OpLE: "≤", check.OpGT: "&gt;", check.OpGE: "≥", check.OpEQ: "=", check.OpNE: "≠",
	check.OpAnd: "and", check.OpOr: "or",
}

func (t *typesetter) node(b *strings.Builder, n check.Node) {
	if t.subst && t.value(b, n) {
		return
	}
	switch n.Op() {
	case check.OpConst:
		t.literal(b, n)
	case check.OpBool:
		if n.Num() != 0 {
			b.WriteString("<mtext>true</mtext>")
		} else {
			b.WriteString("<mtext>false</mtext>")
		}
	case check.OpString:
		b.WriteString("<mtext>“" + esc(n.Str()) + "”</mtext>")
	case check.OpCell:
		symbol(b, t.name(t.d.cellName(int(n.Index()))))
	case check.OpParam:
		if t.fn != nil && int(n.Index()) < len(t.fn.Extra().Params) {
			symbol(b, t.fn.Extra().Params[n.Index()].Name)
		} else {
			b.WriteString("<mi>?</mi>")
		}
	case check.OpNeg:
		b.WriteString("<mrow><mo>−</mo>")
		t.expr(b, n.Arg(0), precUnary)
		b.WriteString("</mrow>")
	case check.OpNot:
		b.WriteString("<mrow><mo>¬</mo>")
		t.expr(b, n.Arg(0), precUnary)
		b.WriteString("</mrow>")
	case check.OpAdd, check.OpSub, check.OpMul, check.OpAnd, check.OpOr,
		check.OpLT, check.OpLE, check.OpGT, check.OpGE, check.OpEQ, check.OpNE:
		p := t.prec(n)
		right := p
		if n.Op() == check.OpSub || p == precCmp {
			right = p + 1
		}
		b.WriteString("<mrow>")
		t.expr(b, n.Arg(0), p)
		b.WriteString("<mo>" + opText[n.Op()] + "</mo>")
		if n.Arg(1).Op() == check.OpNeg || t.prec(n.Arg(1)) == precUnary {
			right = precAtom
		}
		t.expr(b, n.Arg(1), right)
		b.WriteString("</mrow>")
	case check.OpDiv:
		b.WriteString("<mfrac><mrow>")
		t.expr(b, n.Arg(0), 0)
		b.WriteString("</mrow><mrow>")
		t.expr(b, n.Arg(1), 0)
		b.WriteString("</mrow></mfrac>")
	case check.OpPow:
		t.power(b, n.Arg(0), n.Arg(1))
	case check.OpCond:
		b.WriteString("<mrow>")
		t.expr(b, n.Arg(1), precCond+1)
		b.WriteString("<mtext>&#x2003;if&#x2003;</mtext>")
		t.expr(b, n.Arg(0), precCond+1)
		b.WriteString("<mtext>,&#x2003;else&#x2003;</mtext>")
		t.expr(b, n.Arg(2), precCond+1)
		b.WriteString("</mrow>")
	case check.OpBuiltin:
		t.builtin(b, n)
	case check.OpPlugin, check.OpUser:
		name := n.Str()
		if name == "" && n.Op() == check.OpUser {
			name = t.name(t.d.cellName(int(n.Index())))
		}
		t.call(b, name, n.Args())
	case check.OpFuncRef:
		name := n.Str()
		if name == "" {
			name = t.name(t.d.cellName(int(n.Index())))
		}
		b.WriteString("<mi mathvariant=\"normal\">" + esc(name) + "</mi>")
	case check.OpField, check.OpColumn:
		b.WriteString("<mrow>")
		t.expr(b, n.Arg(0), precAtom)
		b.WriteString("<mo lspace=\"0\" rspace=\"0\">.</mo>")
		symbol(b, memberName(n))
		b.WriteString("</mrow>")
	case check.OpIndex:
		b.WriteString("<mrow>")
		t.expr(b, n.Arg(0), precAtom)
		b.WriteString("<mo>[</mo>")
		t.expr(b, n.Arg(1), 0)
		b.WriteString("<mo>]</mo></mrow>")
	case check.OpList:
		b.WriteString("<mrow><mo>[</mo>")
		t.list(b, n.Args())
		b.WriteString("<mo>]</mo></mrow>")
	case check.OpRecord:
		b.WriteString("<mrow><mo>{</mo>")
		for i, a := range n.Args() {
			if i > 0 {
				b.WriteString("<mo separator=\"true\">,</mo>")
			}
			if n.Type() != nil && i < len(n.Type().Fields) {
				symbol(b, n.Type().Fields[i].Name)
				b.WriteString("<mo>:</mo>")
			}
			t.expr(b, a, 0)
		}
		b.WriteString("<mo>}</mo></mrow>")
	default:
		b.WriteString("<mtext>" + esc(t.d.text(n)) + "</mtext>")
	}
}

// name drops the scope of the cell being typeset from a qualified name, so
// the cells of a template use read as they do in the template.
func (t *typesetter) name(s string) string {
	if t.scope != "" && strings.HasPrefix(s, t.scope) {
		return s[len(t.scope):]
	}
	return s
}

// memberName is the field or column an OpField or OpColumn node reads.
func memberName(n check.Node) string {
	if n.NArg() == 0 || n.Arg(0).Type() == nil {
		return "?"
	}
	fs := n.Arg(0).Type().Fields
	if int(n.Index()) < len(fs) {
		return fs[n.Index()].Name
	}
	return "?"
}

func (t *typesetter) power(b *strings.Builder, base, exp check.Node) {
	if exp.Op() == check.OpConst && exp.Num() == 0.5 {
		b.WriteString("<msqrt>")
		t.expr(b, base, 0)
		b.WriteString("</msqrt>")
		return
	}
	b.WriteString("<msup>")
	if t.subst && base.Type() != nil && base.Type().Kind == funcs.Number && (base.Op() == check.OpCell || base.Op() == check.OpField || base.Op() == check.OpIndex) {
		// a value with its unit: (16 mm)², never 16 mm², which reads as an area
		var vb strings.Builder
		if t.value(&vb, base) {
			if v := vb.String(); strings.HasPrefix(v, "<mrow><mo>(</mo>") {
				b.WriteString(v) // a negative value is bracketed already
			} else {
				b.WriteString("<mrow><mo>(</mo>" + v + "<mo>)</mo></mrow>")
			}
			b.WriteString("<mrow>")
			t.expr(b, exp, 0)
			b.WriteString("</mrow></msup>")
			return
		}
	}
	t.expr(b, base, precAtom+1)
	b.WriteString("<mrow>")
	t.expr(b, exp, 0)
	b.WriteString("</mrow></msup>")
}

func (t *typesetter) builtin(b *strings.Builder, n check.Node) {
	switch name := n.Str(); {
	case name == "sqrt" && n.NArg() == 1:
		b.WriteString("<msqrt>")
		t.expr(b, n.Arg(0), 0)
		b.WriteString("</msqrt>")
	case name == "cbrt" && n.NArg() == 1:
		b.WriteString("<mroot><mrow>")
		t.expr(b, n.Arg(0), 0)
		b.WriteString("</mrow><mn>3</mn></mroot>")
	case name == "abs" && n.NArg() == 1:
		b.WriteString("<mrow><mo>|</mo>")
		t.expr(b, n.Arg(0), 0)
		b.WriteString("<mo>|</mo></mrow>")
	case name == "pow" && n.NArg() == 2:
		t.power(b, n.Arg(0), n.Arg(1))
	default:
		t.call(b, name, n.Args())
	}
}

func (t *typesetter) call(b *strings.Builder, name string, args []check.Node) {
	b.WriteString("<mrow><mi mathvariant=\"normal\">" + esc(name) + "</mi><mo>(</mo>")
	t.list(b, args)
	b.WriteString("<mo>)</mo></mrow>")
}

func (t *typesetter) list(b *strings.Builder, args []check.Node) {
	for i, a := range args {
		if i > 0 {
			b.WriteString("<mo separator=\"true\">,</mo>")
		}
		t.expr(b, a, 0)
	}
}

// value writes the number n stands for, with its unit, when n reads a
// number (a cell, a field of a record, an element of a list) and its value
// is known; it reports whether it wrote anything.
func (t *typesetter) value(b *strings.Builder, n check.Node) bool {
	if n.Type() == nil || n.Type().Kind != funcs.Number {
		return false
	}
	var x float64
	var u units.Unit
	if t.d.res.Combos != nil && t.inOtherCombo(n) {
		t.mixed = true
	}
	switch n.Op() {
	case check.OpCell:
		cr := &t.d.res.Cells[n.Index()]
		if !cr.Known || cr.Cell.Kind == engine.Function {
			return false
		}
		x, u = cr.SI, cr.Unit
		if a := t.d.actionOf(int(n.Index())); a >= 0 {
			if t.combo < 0 {
				t.mixed = true
				return false
			}
			t.substituted++
			f := t.d.res.Combos.All[t.combo].Factors[a]
			b.WriteString("<mrow>")
			number(b, combine.FormatFactor(f))
			b.WriteString("<mo>·</mo>")
			if x < 0 || math.Signbit(x) {
				b.WriteString("<mrow><mo>(</mo>")
				quantity(b, x, u, t.d.sig)
				b.WriteString("<mo>)</mo></mrow>")
			} else {
				quantity(b, x, u, t.d.sig)
			}
			b.WriteString("</mrow>")
			return true
		}
	case check.OpField, check.OpIndex:
		v, ok := t.d.eval(n)
		if !ok {
			return false
		}
		f, ok := v.(float64)
		if !ok {
			return false
		}
		x, u = f, t.d.unitFor(n.Type().Dim)
	default:
		return false
	}
	t.substituted++
	neg := x < 0 || math.Signbit(x)
	if neg {
		b.WriteString("<mrow><mo>(</mo>")
	}
	quantity(b, x, u, t.d.sig)
	if neg {
		b.WriteString("<mo>)</mo></mrow>")
	}
	return true
}

// quantity writes an SI value in unit u.
func quantity(b *strings.Builder, si float64, u units.Unit, sig int) {
	b.WriteString("<mrow>")
	number(b, units.FormatNumber(si/u.Factor, sig))
	unitML(b, u.Pretty())
	b.WriteString("</mrow>")
}

// number writes a formatted number; an exponent becomes a power of ten.
func number(b *strings.Builder, s string) {
	neg := strings.HasPrefix(s, "-")
	if neg {
		s = s[1:]
		b.WriteString("<mrow><mo>−</mo>")
	}
	if i := strings.IndexAny(s, "eE"); i > 0 {
		exp := strings.TrimPrefix(s[i+1:], "+")
		exp = strings.Replace(exp, "-", "−", 1)
		b.WriteString("<mrow><mn>" + esc(s[:i]) + "</mn><mo>·</mo><msup><mn>10</mn><mn>" + esc(exp) + "</mn></msup></mrow>")
	} else {
		b.WriteString("<mn>" + esc(s) + "</mn>")
	}
	if neg {
		b.WriteString("</mrow>")
	}
}

// unitML writes a unit symbol upright after a thin space (ISO 80000-1).
func unitML(b *strings.Builder, sym string) {
	if sym == "" || sym == "1" {
		return
	}
	b.WriteString("<mspace width=\"0.2em\"/><mi mathvariant=\"normal\" class=\"u\">" + esc(sym) + "</mi>")
}

// literal writes a constant as it was written in the sheet: the number
// and its unit (12e-6 1/K is 12·10⁻⁶ 1/K), pi as π.
func (t *typesetter) literal(b *strings.Builder, n check.Node) {
	s := strings.TrimSpace(t.d.text(n))
	switch s {
	case "pi":
		b.WriteString("<mi>π</mi>")
		return
	case "g_n":
		symbol(b, s)
		return
	}
	num, unit := splitLiteral(s)
	if num == "" {
		if s == "" {
			number(b, units.FormatNumber(n.Num(), 6))
			return
		}
		b.WriteString("<mtext>" + esc(s) + "</mtext>")
		return
	}
	if unit == "" {
		number(b, num)
		return
	}
	b.WriteString("<mrow>")
	number(b, num)
	unitML(b, units.Unit{Symbol: unit}.Pretty())
	b.WriteString("</mrow>")
}

// splitLiteral splits a quantity literal into its number and its unit
// (SPEC.md §3); num is "" when s does not start with a number.
func splitLiteral(s string) (num, unit string) {
	i := 0
	if i < len(s) && (s[i] == '-' || s[i] == '+') {
		i++
	}
	start := i
	for i < len(s) && (s[i] >= '0' && s[i] <= '9' || s[i] == '.') {
		i++
	}
	if i == start {
		return "", ""
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '-' || s[j] == '+') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	num, unit = s[:i], strings.TrimSpace(s[i:])
	if strings.ContainsAny(unit, " ()+*") && !strings.HasPrefix(unit, "1/") {
		if strings.ContainsAny(unit, " ()+") {
			return "", "" // not a lone literal: an expression the checker folded
		}
	}
	return num, unit
}

// inOtherCombo reports whether the value n reads (a cell, or a field or
// element of one) depends on actions and is shown in a combination other
// than the one of the cell being written.
func (t *typesetter) inOtherCombo(n check.Node) bool {
	for n.Op() == check.OpField || n.Op() == check.OpIndex || n.Op() == check.OpColumn {
		n = n.Arg(0)
	}
	if n.Op() != check.OpCell {
		return false
	}
	m := t.d.cellCombo(int(n.Index()))
	return m >= 0 && m != t.combo
}
