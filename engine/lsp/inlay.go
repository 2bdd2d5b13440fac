package lsp

import (
	"encoding/json"
	"fmt"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// sigFigs is the precision of the values shown, the engine's default: a
// utilisation of 0.9996 shows as 99.96 %, not as 100 %.
const sigFigs = engine.DefaultSigFigs

// Words for a check's outcome, as the text listing writes them.
const (
	passWord = "ok"
	failWord = "FAILS"
)

// inlayHints puts every cell's value at the end of its line: `= 109.5 MPa`,
// a check's utilisation and outcome `= 31.4 % ok`, and beside a `use` line
// how the template's checks came out. A sheet that does not check shows
// none: its problems say why.
func (s *Server) inlayHints(params json.RawMessage) (any, *rpcError) {
	var p documentParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	out := []inlayHint{}
	if d.sheet == nil {
		return out, nil
	}
	first, last := 0, d.lines.lineCount()-1
	if p.Range != nil {
		first, last = p.Range.Start.Line, p.Range.End.Line
	}
	for _, c := range d.sheet.Cells() {
		if c.Kind == engine.Function || !d.own(c.Range().Start()) {
			continue
		}
		line := c.Range().End().Line - 1
		if c.Range().End().Col == 1 && line > c.Range().Start().Line-1 {
			line-- // an end at the start of the next line
		}
		if c.Kind == engine.Table {
			line = c.Range().Start().Line - 1 // beside `table name`, not its last row
		}
		if line < first || line > last {
			continue
		}
		// No tooltip: the SI value is in the hover, and on a sheet of
		// thousands of cells it would double what each request sends.
		label, _ := d.valueText(c)
		out = append(out, inlayHint{Position: d.lines.lineEnd(line), Label: "= " + label, PaddingLeft: true})
	}
	for _, it := range d.file.Items {
		u, ok := it.(*sheet.Use)
		if !ok {
			continue
		}
		line := u.Range.Start().Line - 1
		if line < first || line > last {
			continue
		}
		if label := d.useSummary(u.Name.Name); label != "" {
			out = append(out, inlayHint{Position: d.lines.lineEnd(line), Label: label, PaddingLeft: true})
		}
	}
	return encodeHints(out), nil
}

// encodeHints writes the hints as JSON. A sheet of thousands of cells has
// as many hints, and encoding them by reflection costs more than finding
// their values.
func encodeHints(hs []inlayHint) rawResult {
	b := make([]byte, 0, 64*len(hs)+2)
	b = append(b, '[')
	for i, h := range hs {
		if i > 0 {
			b = append(b, ',')
		}
		b = append(b, `{"position":{"line":`...)
		b = strconv.AppendInt(b, int64(h.Position.Line), 10)
		b = append(b, `,"character":`...)
		b = strconv.AppendInt(b, int64(h.Position.Character), 10)
		b = append(b, `},"label":`...)
		lb, _ := json.Marshal(h.Label) // escapes as encoding/json does (<, >, & included)
		b = append(b, lb...)
		if h.PaddingLeft {
			b = append(b, `,"paddingLeft":true`...)
		}
		b = append(b, '}')
	}
	return append(b, ']')
}

// valueText returns the current value of c as shown beside its line, and
// a tooltip with more precision.
func (d *document) valueText(c *engine.Cell) (label, tooltip string) {
	label, tooltip = d.plainValueText(c)
	// A sheet with actions: a value that depends on them is that of one
	// combination, which is named as the listing names it.
	if m := d.state.CellCombination(c); m != "" {
		label += " (" + m + ")"
	}
	return label, tooltip
}

func (d *document) plainValueText(c *engine.Cell) (label, tooltip string) {
	if c.Kind == engine.Check {
		util, ok := d.state.Number(c)
		if !ok {
			return "not assessed: a value it needs is unknown", ""
		}
		word := passWord
		if !(util <= 1) {
			word = failWord
		}
		return units.FormatNumber(util*100, sigFigs) + " % " + word, "utilisation " + strconv.FormatFloat(util, 'g', -1, 64)
	}
	if x, ok := d.state.Number(c); ok {
		u := d.sheet.DisplayUnit(c)
		return units.Format(x, u, sigFigs), siText(x, c.Type)
	}
	v, ok := d.state.Value(c.Name)
	if !ok {
		return "unknown: see the problems", ""
	}
	return describe(v, d.sheet.System()), ""
}

// siText writes an SI value with its coherent unit, for tooltips.
func siText(x float64, t *funcs.Type) string {
	if t == nil || t.Kind != funcs.Number || t.Dim.IsNone() {
		return strconv.FormatFloat(x, 'g', -1, 64)
	}
	return strconv.FormatFloat(x, 'g', -1, 64) + " " + units.Coherent(t.Dim).Symbol + " (SI)"
}

// describe writes a value that is not a number briefly; a record written
// in a sheet shows its numbers in the preferred units of the system.
func describe(v funcs.Value, sys units.System) string {
	switch v := v.(type) {
	case bool:
		if v {
			return "yes"
		}
		return "no"
	case string:
		return strconv.Quote(v)
	case float64:
		return units.FormatNumber(v, sigFigs)
	case []float64:
		return fmt.Sprintf("list of %d", len(v))
	case []funcs.Value:
		return fmt.Sprintf("list of %d", len(v))
	case *funcs.TableValue:
		return fmt.Sprintf("table, %d rows", v.Rows())
	case *funcs.FuncValue:
		return "function"
	case *funcs.RecordValue:
		if v.Type == nil {
			return "record"
		}
		if v.Type.Name != "" {
			return v.Type.Name + " record"
		}
		var b strings.Builder
		b.WriteString("{")
		for i, f := range v.Type.Fields {
			if i > 0 {
				b.WriteString(", ")
			}
			if b.Len() > 80 {
				b.WriteString("...")
				break
			}
			b.WriteString(f.Name + ": ")
			if x, ok := v.Fields[i].(float64); ok && f.Type != nil && f.Type.Kind == funcs.Number {
				u, _ := units.Preferred(f.Type.Dim, sys)
				if u.Factor == 0 {
					u = units.Coherent(f.Type.Dim)
				}
				b.WriteString(units.Format(x, u, sigFigs))
			} else {
				b.WriteString(describe(v.Fields[i], sys))
			}
		}
		b.WriteString("}")
		return b.String()
	}
	return "value"
}

// useSummary says how the design checks of template instance name came
// out, e.g. "→ 2 checks ok, highest 45.6 %".
func (d *document) useSummary(name string) string {
	n, failed, unknown := 0, 0, 0
	worst := -1.0
	for _, c := range d.sheet.Cells() {
		if c.Kind != engine.Check || !strings.HasPrefix(c.Name, name+".") {
			continue
		}
		n++
		util, ok := d.state.Number(c)
		switch {
		case !ok:
			unknown++
		case !(util <= 1):
			failed++
		}
		if ok && util > worst {
			worst = util
		}
	}
	if n == 0 {
		return ""
	}
	s := "→ "
	switch {
	case failed > 0:
		s += fmt.Sprintf("%d of %d checks %s", failed, n, failWord)
	case unknown > 0:
		s += fmt.Sprintf("%d of %d checks not assessed", unknown, n)
	case n == 1:
		s += "1 check " + passWord
	default:
		s += fmt.Sprintf("%d checks %s", n, passWord)
	}
	if worst >= 0 {
		s += ", highest " + units.FormatNumber(worst*100, sigFigs) + " %"
	}
	return s
}
