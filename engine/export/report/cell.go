package report

import (
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

// cell writes one cell: the symbol, the formula typeset, the formula with
// the values in place, the result in its display unit, the description,
// and the reference in the margin column.
func (d *doc) cell(c *engine.Cell) {
	cr := &d.res.Cells[c.Index]
	kind := c.Kind.String()
	d.w("<div class=\"cell ", kind, "\" id=\"", anchor(c.Name), "\">\n<div class=\"eq\">")
	switch c.Kind {
	case engine.Check:
		d.checkLine(c)
	case engine.Function:
		d.functionLine(c)
	default:
		d.valueLine(c, cr)
	}
	if d.replaced[c.Name] {
		d.w("<span class=\"kindnote\">replaced in this use</span>")
	}
	d.comboNote(c)
	d.w("</div>\n")
	if c.Reference() != "" {
		d.w("<div class=\"ref\">", esc(c.Reference()), "</div>\n")
	}
	if c.Description() != "" {
		d.w("<div class=\"desc\">", esc(c.Description()), "</div>\n")
	}
	if cr.Known && c.Kind != engine.Function && c.Kind != engine.Check {
		d.details(c, cr.Value)
	}
	d.w("</div>\n")
}

// part writes one piece of an equation chain that may wrap to the next
// line before its "=" (MathML itself does not break lines in browsers).
func (d *doc) part(f func(b *strings.Builder)) {
	d.w("<span class=\"part\">")
	d.math(f)
	d.w("</span>")
}

func (d *doc) valueLine(c *engine.Cell, cr *engine.CellResult) {
	scope := c.Scope()
	sym := func(b *strings.Builder) { symbol(b, d.local(c)) }
	body := c.Body()
	lone := body.IsZero() || body.Op() == check.OpConst || body.Op() == check.OpString || body.Op() == check.OpBool
	if !body.IsZero() && body.Op() == check.OpRecord {
		d.part(func(b *strings.Builder) { sym(b); b.WriteString("<mo>=</mo><mtext>record of the fields below</mtext>") })
		return
	}
	t := &typesetter{d: d, scope: scope}
	d.part(func(b *strings.Builder) {
		sym(b)
		b.WriteString("<mo>=</mo>")
		t.expr(b, body, 0)
	})
	if !lone && !pathOnly(body) {
		var sb strings.Builder
		st := &typesetter{d: d, scope: scope, subst: true, combo: d.cellCombo(c.Index)}
		st.expr(&sb, body, 0)
		if st.substituted > 0 && !st.mixed {
			d.part(func(b *strings.Builder) { b.WriteString("<mo>=</mo>"); b.WriteString(sb.String()) })
		}
	}
	if !cr.Known {
		d.part(func(b *strings.Builder) { b.WriteString("<mo>=</mo><mtext class=\"unknown\">not computed</mtext>") })
		return
	}
	x, isNum := cr.Value.(float64)
	if !isNum {
		return // records, lists and tables show their fields below
	}
	res := d.formatSI(x, cr.Unit)
	if lone && (normalise(d.text(body)) == normalise(res) || d.sameUnit(body, cr)) {
		return // the value as written is the value shown
	}
	d.part(func(b *strings.Builder) {
		b.WriteString("<mo>=</mo><mrow class=\"result\">")
		quantity(b, x, cr.Unit, d.sig)
		b.WriteString("</mrow>")
	})
}

// local is the name a cell shows under: without the prefix of its
// template use, inside the use's sub-section.
func (d *doc) local(c *engine.Cell) string {
	if d.usePrefix != "" && strings.HasPrefix(c.Name, d.usePrefix) {
		return c.Name[len(d.usePrefix):]
	}
	return strings.TrimPrefix(c.Name, c.Scope())
}

// pathOnly reports whether n only reads a value (a cell, a field of a
// record, an element of a list): substituting it repeats the result.
func pathOnly(n check.Node) bool {
	switch n.Op() {
	case check.OpCell:
		return true
	case check.OpField, check.OpColumn:
		return pathOnly(n.Arg(0))
	case check.OpIndex:
		return pathOnly(n.Arg(0)) && n.Arg(1).Op() == check.OpConst
	case check.OpNeg:
		return pathOnly(n.Arg(0))
	}
	return false
}

// sameUnit reports whether a lone literal is written in the cell's display
// unit, so that the value shown is the number as written (3.0 m is 3 m).
func (d *doc) sameUnit(n check.Node, cr *engine.CellResult) bool {
	_, unit := splitLiteral(strings.TrimSpace(d.text(n)))
	if unit == "" {
		return cr.Unit.Symbol == "" || cr.Unit.Symbol == "1"
	}
	return unit == cr.Unit.Symbol
}

// normalise makes "16 mm", "16mm" and "16 mm" compare equal.
func normalise(s string) string {
	s = strings.ReplaceAll(s, " ", "")
	s = strings.ReplaceAll(s, "−", "-")
	return strings.NewReplacer("^2", "²", "^3", "³", "^4", "⁴", "*", "·").Replace(s)
}

func (d *doc) functionLine(c *engine.Cell) {
	t := &typesetter{d: d, fn: c, scope: c.Scope()}
	d.part(func(b *strings.Builder) {
		b.WriteString("<mrow><mi mathvariant=\"normal\">" + esc(strings.TrimPrefix(c.Name, c.Scope())) + "</mi><mo>(</mo>")
		for i, p := range c.Extra().Params {
			if i > 0 {
				b.WriteString("<mo separator=\"true\">,</mo>")
			}
			symbol(b, p.Name)
			if p.Unit.Symbol != "" {
				b.WriteString("<mspace width=\"0.2em\"/><mtext class=\"u\">[" + esc(p.Unit.Pretty()) + "]</mtext>")
			}
		}
		b.WriteString("<mo>)</mo></mrow><mo>=</mo>")
		t.expr(b, c.Body(), 0)
	})
	d.w("<span class=\"kindnote\">function of the sheet</span>")
}

func (d *doc) checkLine(c *engine.Cell) {
	var ch *engine.CheckResult
	for i := range d.res.Checks {
		if d.res.Checks[i].Cell == c {
			ch = &d.res.Checks[i]
		}
	}
	xc := c.Extra()
	left, right, op := xc.Demand, xc.Capacity, "≤"
	if xc.Op == ">=" {
		left, right, op = xc.Capacity, xc.Demand, "≥"
	}
	d.w("<span class=\"checkname\">check ", esc(d.local(c)), "</span>")
	t := &typesetter{d: d, scope: c.Scope()}
	d.part(func(b *strings.Builder) {
		t.expr(b, left, 0)
		b.WriteString("<mo>" + op + "</mo>")
		t.expr(b, right, 0)
	})
	if ch == nil || !ch.Known {
		why := "a cell it uses was not computed"
		if ch != nil && ch.Combo != nil && ch.Problem != nil {
			why = ch.Problem.Summary // a demand of the other sense, in its combination
		}
		d.w("<span class=\"verdict unknown\">not assessed: ", esc(why), "</span>")
		if ch != nil {
			if line := d.checkCombo(ch); line != "" {
				d.w("<span class=\"kindnote combo\">", esc(line), "</span>")
			}
		}
		return
	}
	dem := func(b *strings.Builder) { quantity(b, ch.Demand, ch.Unit, d.sig) }
	capa := func(b *strings.Builder) { quantity(b, ch.Capacity, ch.Unit, d.sig) }
	if c.Extra().Op == ">=" {
		dem, capa = capa, dem
	}
	d.part(func(b *strings.Builder) {
		b.WriteString("<mo>:</mo>")
		dem(b)
		b.WriteString("<mo>" + op + "</mo>")
		capa(b)
	})
	word, class := verdict(*ch)
	d.w("<span class=\"checkres\">utilisation ")
	d.utilBar(*ch)
	d.w(" <span class=\"v ", class, "\">", word, "</span></span>")
	if line := d.checkCombo(ch); line != "" {
		d.w("<span class=\"kindnote combo\">", esc(line), "</span>")
	}
}

// resultText is a cell's value as plain text.
func (d *doc) resultText(c *engine.Cell) string {
	cr := &d.res.Cells[c.Index]
	if !cr.Known {
		return "not computed"
	}
	if x, ok := cr.Value.(float64); ok {
		return d.formatSI(x, cr.Unit)
	}
	return cr.Text
}

// details writes what a value holds beyond one number: the fields of a
// record with their units, the items of a list, and the pictures.
func (d *doc) details(c *engine.Cell, v funcs.Value) {
	switch v := v.(type) {
	case *funcs.RecordValue:
		d.record(c, v)
		d.figures(c, v)
	case *funcs.TableValue:
		if c.Kind != engine.Table {
			d.tableValue(c, v)
		}
		d.figures(c, v)
	case []float64:
		if c.Type != nil && c.Type.Elem != nil {
			u := d.unitFor(c.Type.Elem.Dim)
			parts := make([]string, len(v))
			for i, x := range v {
				parts[i] = d.formatSI(x, u)
			}
			d.w("<div class=\"list\">[", esc(strings.Join(parts, ", ")), "]</div>\n")
		}
	case bool:
		word := "no"
		if v {
			word = "yes"
		}
		d.w("<div class=\"list\">", word, "</div>\n")
	case string:
		d.w("<div class=\"list\">“", esc(v), "”</div>\n")
	}
}

// record lists the fields of a record with their values: as written when
// the sheet wrote the record itself, else in the preferred unit of each
// field's dimension.
func (d *doc) record(c *engine.Cell, r *funcs.RecordValue) {
	if r.Type == nil {
		return
	}
	written := !c.Body().IsZero() && c.Body().Op() == check.OpRecord
	name := ""
	if r.Type.Name != "" {
		name = " <span class=\"rtype\">" + esc(r.Type.Name) + "</span>"
	}
	d.w("<table class=\"fields\">", "<caption>fields of ", esc(strings.TrimPrefix(c.Name, c.Scope())), name, "</caption><tbody>")
	n := 0
	for i, f := range r.Type.Fields {
		if i >= len(r.Fields) || f.Type == nil || f.Type.Kind == funcs.Table {
			continue
		}
		if n%3 == 0 {
			if n > 0 {
				d.w("</tr>")
			}
			d.w("<tr>")
		}
		n++
		d.w("<th>")
		d.math(func(b *strings.Builder) { symbol(b, f.Name) })
		d.w("</th><td>")
		switch {
		case written && i < c.Body().NArg():
			t := &typesetter{d: d, scope: c.Scope()}
			arg := c.Body().Arg(i)
			d.math(func(b *strings.Builder) { t.expr(b, arg, 0) })
			if arg.Op() != check.OpConst {
				if x, ok := r.Fields[i].(float64); ok {
					d.w(" = ", esc(d.formatSI(x, d.unitFor(f.Type.Dim))))
				}
			}
		default:
			d.w(esc(d.fieldText(f.Type, r.Fields[i])))
		}
		d.w("</td>")
	}
	if n > 0 {
		d.w("</tr>")
	}
	d.w("</tbody></table>\n")
}

// fieldText writes a field's value as text.
func (d *doc) fieldText(t *funcs.Type, v funcs.Value) string {
	switch v := v.(type) {
	case float64:
		return d.formatSI(v, d.unitFor(t.Dim))
	case []float64:
		u := d.unitFor(t.Elem.Dim)
		parts := make([]string, len(v))
		for i, x := range v {
			parts[i] = d.formatSI(x, u)
		}
		return "[" + strings.Join(parts, ", ") + "]"
	case bool:
		if v {
			return "yes"
		}
		return "no"
	case string:
		return "“" + v + "”"
	case *funcs.RecordValue:
		if v.Type != nil && v.Type.Name != "" {
			return v.Type.Name
		}
		return "record"
	case []funcs.Value:
		return "list of " + itoa(len(v))
	}
	return ""
}
