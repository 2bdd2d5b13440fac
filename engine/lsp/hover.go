package lsp

import (
	"encoding/json"
	"fmt"
	"sort"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

func (s *Server) hover(params json.RawMessage) (any, *rpcError) {
	var p textDocumentPositionParams
	d, err := s.positioned(params, &p)
	if err != nil {
		return nil, err
	}
	t := d.resolve(p.Position)
	if t == nil {
		return nil, nil
	}
	var md string
	switch t.kind {
	case tCell:
		md = s.cellHover(d, t.cell)
	case tField:
		md = d.fieldHover(t.cell, t.name)
	case tParam:
		md = "**" + t.name + "**: a parameter of the function"
		if x := d.cellAt(p.Position.Line+1, d.lines.runeCol(p.Position)); x != nil && x.Kind == engine.Function {
			for _, q := range x.Extra().Params {
				if q.Name == t.name && q.Unit.Symbol != "" {
					md = "**" + t.name + "** [" + q.Unit.Symbol + "]: a parameter of `" + signature(x) + "`"
				}
			}
		}
	case tPlugin:
		md = pluginHover(t.def, d.system())
	case tBuiltin:
		if b := builtin(t.name); b != nil {
			md = "```sheaf\n" + b.Sig + "\n```\n" + b.Rule + "\n\nbuilt-in (`sheaf funcs " + b.Name + "`)"
		}
	case tConst:
		c := check.Constants[t.name]
		md = "**" + t.name + "** = " + strconv.FormatFloat(c.SI, 'g', -1, 64)
		if !c.Dim.IsNone() {
			md += " " + units.Coherent(c.Dim).Symbol
		}
		md += " (built-in constant)"
	case tUnit:
		md = unitHover(t.unit, t.name)
	case tItem:
		md = itemHover(t.item)
	}
	if md == "" {
		return nil, nil
	}
	r := t.rng
	return hover{Contents: markupContent{Kind: "markdown", Value: md}, Range: &r}, nil
}

func (d *document) system() units.System {
	if d.sheet != nil {
		return d.sheet.System()
	}
	return units.Metric
}

// cellHover shows a cell: its value in its display unit, what it
// measures, its formula as written and with the values of the cells it
// uses put in, its description and reference.
func (s *Server) cellHover(d *document, c *engine.Cell) string {
	var b strings.Builder
	b.WriteString("**" + c.Name + "**")
	if c.HasUnit {
		b.WriteString(" [" + c.Unit().Symbol + "]")
	}
	b.WriteString(" — " + c.Kind.String())
	if c.Kind != engine.Function {
		label, tip := d.valueText(c)
		b.WriteString("\n\n= **" + label + "**")
		if tip != "" {
			b.WriteString("  (" + tip + ")")
		}
	}
	if c.Type != nil && c.Type.Kind == funcs.Number && c.Kind != engine.Check {
		u := d.sheet.DisplayUnit(c)
		q := u.Quantity
		if q == "" && !c.Type.Dim.IsNone() {
			q = "quantity"
		}
		if c.Type.Dim.IsNone() {
			b.WriteString("\n\nplain number")
		} else {
			b.WriteString("\n\n" + q + ", dimension " + c.Type.Dim.String())
		}
	} else if c.Type != nil && c.Kind != engine.Check && c.Kind != engine.Function {
		b.WriteString("\n\n" + typeText(c.Type, d.system()))
	}
	if c.Kind == engine.Function {
		b.WriteString("\n\n```sheaf\n" + signature(c) + "\n```")
	}
	if c.Expr() != "" {
		b.WriteString("\n\n```sheaf\n" + c.Expr() + "\n```")
		if sub := s.substituted(d, c); sub != "" && sub != c.Expr() {
			b.WriteString("\n```sheaf\n= " + sub + "\n```")
		}
	}
	if c.Description() != "" {
		b.WriteString("\n\n" + c.Description())
	}
	if c.Reference() != "" {
		b.WriteString("\n\nReference: " + c.Reference())
	}
	if !d.own(c.NameRange().Start()) {
		b.WriteString("\n\nDefined in " + c.NameRange().Start().String())
	}
	return b.String()
}

// signature writes a user function's head from its parameters.
func signature(c *engine.Cell) string {
	var ps []string
	for _, p := range c.Extra().Params {
		if p.Unit.Symbol != "" {
			ps = append(ps, p.Name+" ["+p.Unit.Symbol+"]")
		} else {
			ps = append(ps, p.Name)
		}
	}
	out := c.Name + "(" + strings.Join(ps, ", ") + ")"
	if c.HasUnit {
		out += " [" + c.Unit().Symbol + "]"
	}
	return out
}

// substituted returns the cell's formula with every cell it reads
// replaced by that cell's value in its display unit, from the source the
// cell was written in; "" when the formula cannot be found there.
func (s *Server) substituted(d *document, c *engine.Cell) string {
	t := s.textOf(d, c.Range().Start().File)
	from, to := t.offsetOfDiag(c.Range().Start()), t.offsetOfDiag(c.Range().End())
	if from < 0 || to > len(t.src) || from >= to {
		return ""
	}
	item := t.src[from:to]
	at := strings.Index(item, c.Expr())
	if at < 0 {
		return ""
	}
	exprFrom, exprTo := from+at, from+at+len(c.Expr())
	type rep struct {
		from, to int
		text     string
	}
	var reps []rep
	cells := d.sheet.Cells()
	var walk func(n check.Node)
	walk = func(n check.Node) {
		if n.IsZero() {
			return
		}
		text := ""
		switch n.Op() {
		case check.OpCell:
			if int(n.Index()) < len(cells) {
				x := cells[n.Index()]
				if v, ok := d.state.Number(x); ok {
					text = units.Format(v, d.sheet.DisplayUnit(x), sigFigs)
				}
			}
		case check.OpField:
			if n.NArg() == 1 && n.Arg(0).Op() == check.OpCell && int(n.Arg(0).Index()) < len(cells) {
				if v, ok := d.state.Value(cells[n.Arg(0).Index()].Name); ok {
					if r, ok := v.(*funcs.RecordValue); ok && r.Type != nil && int(n.Index()) < len(r.Fields) {
						if f := r.Type.Fields[n.Index()]; f.Type != nil && f.Type.Kind == funcs.Number {
							if x, ok := r.Fields[n.Index()].(float64); ok {
								text = units.Format(x, preferred(f.Type.Dim, d.sheet.System()), sigFigs)
							}
						}
					}
				}
			}
		}
		if text != "" {
			r := n.Range()
			a, b := t.offsetOfDiag(r.Start()), t.offsetOfDiag(r.End())
			if a >= exprFrom && b <= exprTo && a < b {
				if strings.Contains(text, " ") {
					text = "(" + text + ")"
				}
				reps = append(reps, rep{a, b, text})
				return
			}
		}
		for _, a := range n.Args() {
			walk(a)
		}
	}
	for _, tr := range trees(c) {
		walk(tr)
	}
	sort.Slice(reps, func(i, j int) bool { return reps[i].from < reps[j].from })
	var b strings.Builder
	pos := exprFrom
	for _, r := range reps {
		if r.from < pos {
			continue
		}
		b.WriteString(t.src[pos:r.from])
		b.WriteString(r.text)
		pos = r.to
	}
	b.WriteString(t.src[pos:exprTo])
	return b.String()
}

// offsetOfDiag returns the byte offset of an engine position in t.
func (t *text) offsetOfDiag(p diag.Pos) int { return t.offset(t.fromDiag(p)) }

// preferred returns the display unit of dimension dim in system sys.
func preferred(dim units.Dim, sys units.System) units.Unit {
	u, _ := units.Preferred(dim, sys)
	if u.Factor == 0 {
		u = units.Coherent(dim)
	}
	return u
}

// fieldHover shows a field of a record cell.
func (d *document) fieldHover(c *engine.Cell, field string) string {
	var b strings.Builder
	b.WriteString("**" + c.Name + "." + field + "**")
	if c.Type != nil {
		if i := c.Type.Field(field); i >= 0 {
			f := c.Type.Fields[i]
			if v, ok := d.state.Value(c.Name); ok {
				if r, ok := v.(*funcs.RecordValue); ok && i < len(r.Fields) {
					if x, ok := r.Fields[i].(float64); ok && f.Type != nil && f.Type.Kind == funcs.Number {
						b.WriteString(" = **" + units.Format(x, preferred(f.Type.Dim, d.system()), sigFigs) + "**")
						if !f.Type.Dim.IsNone() {
							b.WriteString("\n\ndimension " + f.Type.Dim.String())
						}
					} else {
						b.WriteString(" = " + describe(r.Fields[i], d.system()))
					}
				}
			}
			if f.Doc != "" {
				b.WriteString("\n\n" + f.Doc)
			}
		}
	}
	b.WriteString("\n\nfield of " + c.Name)
	if c.Description() != "" {
		b.WriteString(" (" + c.Description() + ")")
	}
	return b.String()
}

// typeText writes a parameter or result type with a unit in the system's
// practice ("force [kN]").
func typeText(t *funcs.Type, sys units.System) string { return typeTextAt(t, sys, 0) }

// typeTextAt writes a type nested depth deep: a named record within
// another, or in a signature, is written by its name alone.
func typeTextAt(t *funcs.Type, sys units.System, depth int) string {
	if t == nil {
		return "any"
	}
	if t.Kind == funcs.Number {
		if t.Dim.IsNone() {
			return "number"
		}
		u := preferred(t.Dim, sys)
		if u.Quantity != "" {
			return u.Quantity + " [" + u.Symbol + "]"
		}
		return "[" + u.Symbol + "]"
	}
	switch t.Kind {
	case funcs.List:
		if t.Elem != nil {
			return "list of " + typeTextAt(t.Elem, sys, depth)
		}
	case funcs.Record, funcs.Table:
		if t.Name != "" && (len(t.Fields) == 0 || depth > 0) {
			return t.Name
		}
		var fs []string
		for _, f := range t.Fields {
			fs = append(fs, f.Name+": "+typeTextAt(f.Type, sys, depth+1))
		}
		head := t.Kind.String()
		if t.Name != "" {
			head = t.Name
		}
		return head + " {" + strings.Join(fs, ", ") + "}"
	}
	return t.String()
}

// pluginSignature writes a plugin's call with units.
func pluginSignature(def *funcs.Def, sys units.System) string {
	var ps []string
	for _, p := range def.Params {
		s := p.Name + ": " + typeTextAt(p.Type, sys, 1)
		if p.Optional {
			s += "?"
		}
		ps = append(ps, s)
	}
	out := def.Name + "(" + strings.Join(ps, ", ") + ")"
	if def.Result != nil {
		out += " → " + typeTextAt(def.Result, sys, 1)
	}
	return out
}

func pluginHover(def *funcs.Def, sys units.System) string {
	var b strings.Builder
	b.WriteString("```sheaf\n" + pluginSignature(def, sys) + "\n```\n")
	if def.Summary != "" {
		b.WriteString(def.Summary + "\n\n")
	}
	if def.Formula != "" {
		b.WriteString("`" + def.Formula + "`\n\n")
	}
	for _, p := range def.Params {
		if p.Doc != "" {
			b.WriteString("- `" + p.Name + "`: " + p.Doc + "\n")
		}
	}
	if def.Doc != "" {
		b.WriteString("\n" + def.Doc + "\n")
	}
	if def.Source != "" {
		b.WriteString("\nSource: " + def.Source + "\n")
	}
	b.WriteString("\nfamily " + def.Family)
	return b.String()
}

// unitHover names a unit and gives its factor to SI.
func unitHover(u units.Unit, written string) string {
	var b strings.Builder
	b.WriteString("**" + written + "**")
	if u.Quantity != "" {
		b.WriteString(" — " + u.Quantity)
	}
	si := units.Coherent(u.Dim)
	fmt.Fprintf(&b, "\n\n1 %s = %s %s (SI)", u.Symbol, strconv.FormatFloat(u.Factor, 'g', -1, 64), si.Symbol)
	if !u.Dim.IsNone() {
		b.WriteString("\n\ndimension " + u.Dim.String())
	}
	return b.String()
}

// itemHover shows an item of a sheet that does not check: what is
// written, and no value.
func itemHover(it sheet.Item) string {
	var b strings.Builder
	b.WriteString("**" + itemName(it) + "**")
	switch it := it.(type) {
	case *sheet.Cell:
		if it.Unit != nil {
			b.WriteString(" [" + it.Unit.Text + "]")
		}
		b.WriteString("\n\n```sheaf\n" + it.Expr.Text + "\n```")
		desc, ref := it.Annot.Text()
		if desc != "" {
			b.WriteString("\n\n" + desc)
		}
		if ref != "" {
			b.WriteString("\n\nReference: " + ref)
		}
	case *sheet.Check:
		b.WriteString(" — check\n\n```sheaf\n" + it.Body.Text + "\n```")
	case *sheet.Use:
		b.WriteString(" — template " + it.Path)
	}
	b.WriteString("\n\nno value: the sheet has problems")
	return b.String()
}
