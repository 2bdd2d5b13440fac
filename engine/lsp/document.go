package lsp

import (
	"regexp"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/funcs"
)

// document is one open sheet: its current text, the parse of that text,
// and, when the text checks, the compiled sheet and a State with its
// values.
type document struct {
	uri     string
	path    string // the name positions carry: the file path for file URIs
	version int
	lines   *text
	file    *sheet.File // the parse of the current text, always set

	sheet  *engine.Sheet // nil when the current text does not check
	state  *engine.State // values of sheet
	errs   diag.List     // the problems of the last check (sheet or not)
	failed bool          // the last check found errors: sheet is nil
	// last is the last sheet that checked, kept for what a broken text
	// still needs and no value depends on: the fields a record has, the
	// cells a template brings, for completion.
	last *engine.Sheet

	// stale says that the text changed since sheet was compiled, but only
	// in the values of input cells: state holds the new values, and every
	// line still holds the item it held (see setText). Requests that need
	// more than values check the text again first (ensure).
	stale bool
	// unparsed says that file is the parse of an older text: the edits
	// since changed input values on their lines and nothing else, so each
	// line still holds the item file has for it (see lineEdit).
	unparsed bool
}

func newDocument(uri string, version int, src string) *document {
	d := &document{uri: uri, path: uriToPath(uri), version: version}
	d.parse(src)
	d.check()
	return d
}

func (d *document) parse(src string) {
	d.lines = newText(src)
	d.file, _ = sheet.Parse(d.path, []byte(src), sheet.MaxBytes(engine.DefaultMaxBytes))
}

// check compiles the parsed text and evaluates it.
func (d *document) check() {
	d.stale = false
	s, err := engine.CompileFile(d.file)
	if err != nil {
		d.sheet, d.state, d.failed = nil, nil, true
		if l, ok := err.(diag.List); ok {
			d.errs = l
		} else {
			d.errs = diag.List{{Range: diag.FileOnly(d.path).Whole(), Summary: err.Error()}}
		}
		return
	}
	d.sheet, d.last, d.failed, d.errs = s, s, false, nil
	d.state = s.NewState()
	d.state.Recompute()
}

// ensure brings the analysis up to the current text.
func (d *document) ensure() {
	if d.unparsed {
		d.parse(d.lines.src)
		d.unparsed = false
	}
	if d.stale {
		d.check()
	}
}

// setText takes a new full text. When the edit changed nothing but the
// values of number inputs (`d [mm] = 16 mm` -> `d [mm] = 20 mm`), the new
// values go into the State and only what depends on them recomputes: that
// is the path typing takes, and it reports true. Any other edit checks the
// whole text again.
func (d *document) setText(version int, src string) (fast bool) {
	d.version = version
	if d.sheet != nil && d.lineEdit(src) {
		return true
	}
	d.ensure()
	old := d.file
	d.parse(src)
	if d.sheet != nil && !d.failed && d.inputsOnly(old, d.file) {
		d.stale = true
		return true
	}
	d.check()
	return false
}

// lineEdit takes the fast path without parsing the new text: it compares
// the new text with the current one line by line, and succeeds when every
// changed line is a one-line cell (or template override) of the current
// parse whose text before the expression and annotation after it stay,
// and whose new expression is a quantity literal that fits the input.
// The parse is then left as it is (unparsed), since every item keeps its
// lines; whatever needs the items parses the text again first (ensure).
func (d *document) lineEdit(src string) bool {
	nt := newText(src)
	if nt.lineCount() != d.lines.lineCount() {
		return false
	}
	type set struct {
		name string
		text string
	}
	var sets []set
	var byLine []sheet.Item
	for i := 0; i < nt.lineCount(); i++ {
		cur, nw := d.lines.line(i), nt.line(i)
		if cur == nw {
			continue
		}
		if byLine == nil {
			byLine = make([]sheet.Item, d.lines.lineCount()+1)
			for _, it := range d.file.Items {
				r := it.Span()
				if r.Start().Line == r.End().Line && r.Start().Line >= 1 && r.Start().Line <= len(byLine) {
					byLine[r.Start().Line-1] = it
				}
				if u, ok := it.(*sheet.Use); ok {
					for _, o := range u.Overrides {
						if o.Range.Start().Line == o.Range.End().Line && o.Range.Start().Line <= len(byLine) {
							byLine[o.Range.Start().Line-1] = &override{prefix: u.Name.Name + ".", Cell: o}
						}
					}
				}
			}
		}
		var c *sheet.Cell
		prefix := ""
		switch it := byLine[i].(type) {
		case *sheet.Cell:
			c = it
		case *override:
			c, prefix = it.Cell, it.prefix
		default:
			return false
		}
		e := byteCol(cur, c.Expr.Range.Start().Col)
		if e < 0 || e > len(nw) || cur[:e] != nw[:e] {
			return false
		}
		v0, a0 := splitAnnot(cur[e:])
		v1, a1 := splitAnnot(nw[e:])
		if a0 != a1 || v0 == "" || !quantityLit.MatchString(v1) {
			return false
		}
		sets = append(sets, set{prefix + c.Name.Name, v1})
	}
	if len(sets) == 0 {
		return src == d.lines.src // the same text (else line breaks changed)
	}
	vals := make([]funcs.Value, len(sets))
	for i, st := range sets {
		c := d.sheet.Lookup(st.name)
		if c == nil || c.Kind != engine.Input || c.Type == nil || c.Type.Kind != funcs.Number {
			return false
		}
		v, err := d.sheet.ParseInput(st.name, st.text)
		if err != nil {
			return false
		}
		vals[i] = v
	}
	for i, st := range sets {
		if err := d.state.Set(st.name, vals[i]); err != nil {
			return false
		}
	}
	d.state.Recompute()
	d.lines, d.stale, d.unparsed = nt, true, true
	return true
}

// override is a template override with the name of its `use`.
type override struct {
	prefix string
	*sheet.Cell
}

func (o *override) Span() diag.Range { return o.Cell.Range }

// byteCol returns the byte offset of 1-based rune column col in ln, or -1.
func byteCol(ln string, col int) int {
	n := 1
	for i := range ln {
		if n == col {
			return i
		}
		n++
	}
	if n == col {
		return len(ln)
	}
	return -1
}

// splitAnnot splits the rest of a cell's line after its expression's
// start into the expression (trimmed) and the annotation from `--` on.
func splitAnnot(s string) (expr, annot string) {
	if i := strings.Index(s, "--"); i >= 0 {
		return strings.TrimSpace(s[:i]), s[i:]
	}
	return strings.TrimSpace(s), ""
}

// quantityLit is a number with an optional unit and nothing else: the only
// new text the fast path takes for an input, so that a value can never
// turn into a formula (which would make the cell derived) unnoticed.
var quantityLit = regexp.MustCompile(`^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?( ?[^\s0-9+\-*/^()\[\]{},.<>=!?:'"][^\s()\[\]{},]*| ?1/[^\s()\[\]{},]+)?$`)

// inputsOnly compares two parses item by item. It reports true, after
// setting the changed inputs on d.state and recomputing, when every item
// that differs is a cell (or a template override) whose name, unit,
// annotation and lines stay and whose new expression is a quantity
// literal that fits the input.
func (d *document) inputsOnly(a, b *sheet.File) bool {
	if len(a.Syntax) > 0 || len(b.Syntax) > 0 || len(a.Items) != len(b.Items) {
		return false
	}
	type set struct {
		name string
		v    funcs.Value
	}
	var sets []set
	cellChange := func(prefix string, x, y *sheet.Cell) bool {
		if x.Expr.Text == y.Expr.Text {
			return sameCell(x, y)
		}
		if !sameCell(x, y) || !quantityLit.MatchString(y.Expr.Text) {
			return false
		}
		name := prefix + x.Name.Name
		c := d.sheet.Lookup(name)
		if c == nil || c.Kind != engine.Input || c.Type == nil || c.Type.Kind != funcs.Number {
			return false
		}
		v, err := d.sheet.ParseInput(name, y.Expr.Text)
		if err != nil {
			return false
		}
		sets = append(sets, set{name, v})
		return true
	}
	for i := range a.Items {
		x, y := a.Items[i], b.Items[i]
		if !sameLines(x.Span(), y.Span()) {
			return false
		}
		if spanText(a, x.Span()) == spanText(b, y.Span()) {
			continue
		}
		switch x := x.(type) {
		case *sheet.Comment, *sheet.Blank:
			switch y.(type) {
			case *sheet.Comment, *sheet.Blank:
			default:
				return false
			}
		case *sheet.Cell:
			y, ok := y.(*sheet.Cell)
			if !ok || !cellChange("", x, y) {
				return false
			}
		case *sheet.Use:
			y, ok := y.(*sheet.Use)
			if !ok || x.Name.Name != y.Name.Name || x.Path != y.Path || !sameAnnot(x.Annot, y.Annot) || len(x.Overrides) != len(y.Overrides) {
				return false
			}
			for j := range x.Overrides {
				if !sameLines(x.Overrides[j].Range, y.Overrides[j].Range) || !cellChange(x.Name.Name+".", x.Overrides[j], y.Overrides[j]) {
					return false
				}
			}
		default:
			return false
		}
	}
	for _, s := range sets {
		if err := d.state.Set(s.name, s.v); err != nil {
			return false // cannot happen after ParseInput; check the text instead
		}
	}
	d.state.Recompute()
	return true
}

// sameAnnot reports whether two annotations say the same (where they
// stand aside).
func sameAnnot(x, y *sheet.Annot) bool {
	xd, xr := x.Text()
	yd, yr := y.Text()
	return xd == yd && xr == yr
}

// sameCell reports whether two cells agree in all but their expression.
func sameCell(x, y *sheet.Cell) bool {
	if x.Name.Name != y.Name.Name || !sameAnnot(x.Annot, y.Annot) {
		return false
	}
	if (x.Unit == nil) != (y.Unit == nil) || (x.Unit != nil && x.Unit.Text != y.Unit.Text) {
		return false
	}
	return sameLines(x.Range, y.Range) && x.Name.Range.Start().Col == y.Name.Range.Start().Col
}

func sameLines(a, b diag.Range) bool {
	return a.Start().Line == b.Start().Line && a.End().Line == b.End().Line
}

func spanText(f *sheet.File, r diag.Range) string {
	from, to := r.Start().Offset, r.End().Offset
	if from < 0 || to > len(f.Src) || from > to {
		return ""
	}
	return string(f.Src[from:to])
}

// own reports whether a position lies in this document (not a template).
func (d *document) own(p diag.Pos) bool { return p.File == d.path }
