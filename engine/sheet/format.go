package sheet

import (
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// Format prints f in the one canonical layout of a sheet:
//
//   - header values aligned after their keys (`title:   ...`);
//   - runs of blank lines collapsed to one, none at the start or the end,
//     and exactly one blank line before each heading;
//   - in each run of consecutive cells (not parted by a blank line, comment,
//     heading or item of another kind) the `[unit]`, `=` and `--` columns
//     aligned; runs of functions likewise, apart from cells (a long
//     parameter list would push every cell's `=` far right); in each run of
//     checks the `--` column aligned (lines longer than 60 runes stay out
//     of the `--` alignment); at least two spaces before `--`, one space
//     around `=` and `@`;
//   - continuation lines of an expression indented four spaces past their
//     item, keeping their indentation relative to one another;
//   - table columns right-aligned (numbers line up on their last digit),
//     two spaces apart, four spaces in;
//   - use overrides four spaces in, aligned like cells; runs of actions
//     and runs of factor lines aligned like cells, each apart;
//   - comments, names, units, numbers and expression text exactly as
//     written; one trailing newline; no trailing spaces.
//
// The layout depends only on the items, so Format is idempotent. A file that
// Parse found syntax errors in is refused with those errors: a broken sheet
// is never rewritten.
func Format(f *File) ([]byte, error) {
	if f.Syntax.HasErrors() {
		return nil, f.Syntax
	}
	var pr printer
	for _, it := range f.Items {
		if m, ok := it.(*Meta); ok {
			pr.metaWidth = max(pr.metaWidth, utf8.RuneCountInString(m.Key.Name)+1)
		}
	}
	items := f.Items
	for i := 0; i < len(items); {
		switch it := items[i].(type) {
		case *Blank:
			pr.blank = true
			i++
		case *Heading:
			pr.blank = true
			pr.start()
			pr.line("## " + it.Text)
			i++
		case *Comment:
			pr.start()
			pr.line("#" + it.Text)
			i++
		case *Meta:
			pr.start()
			pr.line(pad(it.Key.Name+":", pr.metaWidth) + " " + it.Value)
			i++
		case *Cell:
			j := i
			var run []defRow
			for ; j < len(items); j++ {
				c, ok := items[j].(*Cell)
				if !ok {
					break
				}
				run = append(run, cellRow(c))
			}
			pr.start()
			pr.defs(run, "")
			i = j
		case *FuncDef:
			j := i
			var run []defRow
			for ; j < len(items); j++ {
				d, ok := items[j].(*FuncDef)
				if !ok {
					break
				}
				run = append(run, funcRow(d))
			}
			pr.start()
			pr.defs(run, "")
			i = j
		case *Check:
			j := i
			var run []defRow
			for ; j < len(items); j++ {
				c, ok := items[j].(*Check)
				if !ok {
					break
				}
				head := "check " + c.Name.Name
				if c.State.Name != "" {
					head += " in " + c.State.Name
				}
				run = append(run, defRow{head: head + ":", body: c.Body.Text, annot: annotText(c.Annot), check: true})
			}
			pr.start()
			pr.defs(run, "")
			i = j
		case *Action:
			j := i
			var run []defRow
			for ; j < len(items); j++ {
				a, ok := items[j].(*Action)
				if !ok {
					break
				}
				r := cellRow(&a.Cell)
				r.head = "action " + a.Kind.Text() + " " + r.head
				run = append(run, r)
			}
			pr.start()
			pr.defs(run, "")
			i = j
		case *Factor:
			j := i
			var run []defRow
			for ; j < len(items); j++ {
				f, ok := items[j].(*Factor)
				if !ok {
					break
				}
				run = append(run, defRow{head: "factor " + f.Key, body: f.Value.Text, annot: annotText(f.Annot)})
			}
			pr.start()
			pr.defs(run, "")
			i = j
		case *Table:
			pr.start()
			pr.table(it)
			i++
		case *Use:
			pr.start()
			pr.use(it)
			i++
		default:
			return nil, diag.List{{Summary: "cannot print an item of unknown kind"}}
		}
	}
	return []byte(pr.b.String()), nil
}

// FormatSource parses src and prints it in canonical layout; it returns the
// syntax errors instead when there are any.
func FormatSource(name string, src []byte, opts ...Option) ([]byte, error) {
	f, errs := Parse(name, src, opts...)
	if errs.HasErrors() {
		return nil, errs
	}
	return Format(f)
}

// printer accumulates canonical text.
type printer struct {
	b         strings.Builder
	blank     bool // a blank line is owed before the next item
	metaWidth int
}

// start writes an owed blank line, unless nothing has been written yet.
func (pr *printer) start() {
	if pr.blank && pr.b.Len() > 0 {
		pr.b.WriteByte('\n')
	}
	pr.blank = false
}

// line writes s without trailing spaces and a newline.
func (pr *printer) line(s string) {
	pr.b.WriteString(strings.TrimRight(s, " \t"))
	pr.b.WriteByte('\n')
}

// defRow is one cell, function or check laid out in columns.
type defRow struct {
	head, unit, body, annot string
	check                   bool
}

func cellRow(c *Cell) defRow {
	return defRow{head: c.Name.Name, unit: unitText(c.Unit), body: c.Expr.Text, annot: annotText(c.Annot)}
}

func funcRow(f *FuncDef) defRow {
	var b strings.Builder
	b.WriteString(f.Name.Name)
	b.WriteByte('(')
	for i, p := range f.Params {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(p.Name.Name)
		if p.Unit != nil {
			b.WriteString(" " + unitText(p.Unit))
		}
	}
	b.WriteByte(')')
	return defRow{head: b.String(), unit: unitText(f.Unit), body: f.Body.Text, annot: annotText(f.Annot)}
}

func unitText(u *UnitSpec) string {
	if u == nil {
		return ""
	}
	return "[" + u.Text + "]"
}

// annotText prints an annotation: "-- description @ reference".
func annotText(a *Annot) string {
	switch {
	case a == nil:
		return ""
	case a.Description == "" && a.Reference == "":
		return ""
	case a.Reference == "":
		return "-- " + a.Description
	case a.Description == "":
		return "-- @ " + a.Reference
	}
	return "-- " + a.Description + " @ " + a.Reference
}

// annotColumnMax is the widest line that takes part in aligning the `--`
// column. A longer line gets its annotation two spaces after its end, so one
// long record literal does not push every annotation of its run far right
// (and adding it does not re-indent every line of the run in a diff).
const annotColumnMax = 60

// defs prints a run of definitions with aligned columns, each line starting
// with indent.
func (pr *printer) defs(run []defRow, indent string) {
	wHead, wUnit := 0, 0
	for _, r := range run {
		wHead = max(wHead, width(r.head))
		wUnit = max(wUnit, width(r.unit))
	}
	firsts := make([]string, len(run))
	wLine := 0
	for i, r := range run {
		var s string
		if r.check {
			s = indent + r.head + " "
		} else {
			s = indent + pad(r.head, wHead)
			if wUnit > 0 {
				s += " " + pad(r.unit, wUnit)
			}
			s += " = "
		}
		first, _, multi := strings.Cut(r.body, "\n")
		firsts[i] = s + strings.TrimRight(first, " \t\r")
		if w := width(firsts[i]); !multi && r.annot != "" && w <= annotColumnMax {
			wLine = max(wLine, w)
		}
	}
	for i, r := range run {
		lines := continuation(r.body, indent+"    ")
		if len(lines) == 0 {
			if r.annot != "" {
				pr.line(pad(firsts[i], wLine) + "  " + r.annot)
			} else {
				pr.line(firsts[i])
			}
			continue
		}
		pr.line(firsts[i])
		for k, l := range lines {
			if k == len(lines)-1 && r.annot != "" {
				l += "  " + r.annot
			}
			pr.line(l)
		}
	}
}

// continuation returns the lines of a multi-line expression after its first,
// re-indented: the least indented one gets indent, the others keep their
// indentation relative to it.
func continuation(body, indent string) []string {
	_, rest, multi := strings.Cut(body, "\n")
	if !multi {
		return nil
	}
	lines := strings.Split(rest, "\n")
	least := -1
	for i, l := range lines {
		l = strings.TrimRight(l, " \t\r")
		lines[i] = l
		n := len(l) - len(strings.TrimLeft(l, " \t"))
		if least < 0 || n < least {
			least = n
		}
	}
	for i, l := range lines {
		lines[i] = indent + l[least:]
	}
	return lines
}

// table prints a table with right-aligned columns.
func (pr *printer) table(t *Table) {
	head := "table " + t.Name.Name
	if a := annotText(t.Annot); a != "" {
		head += "  " + a
	}
	pr.line(head)
	cells := make([][]string, 0, len(t.Rows)+1)
	hdr := make([]string, len(t.Columns))
	for i, c := range t.Columns {
		hdr[i] = c.Name.Name
		if c.Unit != nil {
			hdr[i] += " " + unitText(c.Unit)
		}
	}
	cells = append(cells, hdr)
	for _, row := range t.Rows {
		r := make([]string, len(row))
		for i, l := range row {
			r[i] = l.Text
		}
		cells = append(cells, r)
	}
	widths := make([]int, len(t.Columns))
	for _, r := range cells {
		for i, s := range r {
			if i < len(widths) {
				widths[i] = max(widths[i], width(s))
			}
		}
	}
	var b strings.Builder
	for _, r := range cells {
		b.Reset()
		b.WriteString("    ")
		for i, s := range r {
			w := 0
			if i < len(widths) {
				w = widths[i]
			}
			if i > 0 {
				b.WriteString("  ")
			}
			b.WriteString(strings.Repeat(" ", max(w-width(s), 0)))
			b.WriteString(s)
		}
		pr.line(b.String())
	}
}

// use prints a template use and its overrides.
func (pr *printer) use(u *Use) {
	head := "use " + u.Name.Name + " from \"" + u.Path + "\""
	if a := annotText(u.Annot); a != "" {
		head += "  " + a
	}
	pr.line(head)
	run := make([]defRow, len(u.Overrides))
	for i, c := range u.Overrides {
		run[i] = cellRow(c)
	}
	pr.defs(run, "    ")
}

// width is the printed width of s in runes.
func width(s string) int { return utf8.RuneCountInString(s) }

// pad right-pads s with spaces to n runes.
func pad(s string, n int) string {
	if w := width(s); w < n {
		return s + strings.Repeat(" ", n-w)
	}
	return s
}
