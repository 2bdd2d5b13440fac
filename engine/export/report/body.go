package report

import (
	"path/filepath"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// sections walks the sheet's items in reading order: headings open
// numbered sections, comments become prose where they stand, and each
// cell, check, function, table and template use is written at its line.
func (d *doc) sections() {
	f := d.s.File()
	if f == nil {
		return
	}
	sec, sub := 0, 0
	open := false
	var comments []string
	flush := func() {
		if len(comments) > 0 {
			d.prose(comments)
			comments = comments[:0]
		}
	}
	start := func(title string, numbered bool) {
		if open {
			d.w("</section>\n")
		}
		open = true
		if numbered {
			sec++
			sub = 0
			d.w("<section class=\"sec\">\n<h2 id=\"s", strconv.Itoa(sec), "\"><span class=\"no\">", strconv.Itoa(sec), "</span>", esc(title), "</h2>\n")
		} else {
			d.w("<section class=\"sec intro\">\n")
		}
	}
	for _, it := range f.Items {
		switch it := it.(type) {
		case *sheet.Meta:
			continue
		case *sheet.Comment:
			if !open {
				start("", false)
			}
			comments = append(comments, it.Text)
			continue
		case *sheet.Blank:
			if len(comments) > 0 {
				comments = append(comments, "") // a paragraph ends here
			}
			continue
		}
		flush()
		switch it := it.(type) {
		case *sheet.Heading:
			start(strings.TrimSpace(it.Text), true)
		case *sheet.Cell:
			d.itemCell(it.Name.Name, &open, start)
		case *sheet.Action:
			d.itemCell(it.Cell.Name.Name, &open, start)
		case *sheet.FuncDef:
			d.itemCell(it.Name.Name, &open, start)
		case *sheet.Check:
			for _, name := range checkCells(it.Name.Name, d.s.Lookup) {
				d.itemCell(name, &open, start)
			}
		case *sheet.Table:
			if !open {
				start("", false)
			}
			d.table(d.s.Lookup(it.Name.Name), it)
		case *sheet.Use:
			if !open {
				start("", false)
			}
			sub++
			d.use(it, "", strconv.Itoa(sec)+"."+strconv.Itoa(sub))
		}
	}
	flush()
	if open {
		d.w("</section>\n")
	}
}

func (d *doc) itemCell(name string, open *bool, start func(string, bool)) {
	if !*open {
		start("", false)
	}
	if c := d.s.Lookup(name); c != nil {
		d.cell(c)
	}
}

// prose writes a run of comment lines: lines of text join into paragraphs;
// lines indented past the "# " (hand checks, small tables of numbers) keep
// their layout; an empty comment line or a blank line ends a paragraph.
func (d *doc) prose(lines []string) {
	var para []string
	var pre []string
	flushPara := func() {
		if len(para) > 0 {
			d.w("<p class=\"comment\">", esc(strings.Join(para, " ")), "</p>\n")
			para = nil
		}
	}
	flushPre := func() {
		if len(pre) > 0 {
			d.w("<pre class=\"comment\">", esc(strings.Join(pre, "\n")), "</pre>\n")
			pre = nil
		}
	}
	for _, l := range lines {
		t := strings.TrimRight(l, " \t")
		switch {
		case strings.TrimSpace(t) == "":
			flushPara()
			flushPre()
		case strings.HasPrefix(t, "  ") || strings.HasPrefix(t, "\t"):
			flushPara()
			pre = append(pre, strings.TrimPrefix(t, " "))
		default:
			flushPre()
			para = append(para, strings.TrimSpace(t))
		}
	}
	flushPara()
	flushPre()
}

// use writes a template use as a sub-section: where the template comes
// from, the inputs it replaces, then the template's cells under its own
// headings.
func (d *doc) use(u *sheet.Use, outer, no string) {
	prefix := outer + u.Name.Name + "."
	savedPrefix, savedReplaced := d.usePrefix, d.replaced
	d.usePrefix = prefix
	d.replaced = map[string]bool{}
	for _, o := range u.Overrides {
		d.replaced[prefix+o.Name.Name] = true
	}
	defer func() { d.usePrefix, d.replaced = savedPrefix, savedReplaced }()
	path := u.Path
	d.w("<section class=\"use\">\n<h3><span class=\"no\">", no, "</span>Template use <b>", esc(u.Name.Name), "</b> of <span class=\"file\">", esc(path), "</span></h3>\n")
	if desc, ref := u.Annot.Text(); desc != "" || ref != "" {
		d.w("<p class=\"usedesc\">", esc(desc))
		if ref != "" {
			d.w(" <span class=\"ref\">", esc(ref), "</span>")
		}
		d.w("</p>\n")
	}
	for _, f := range d.s.Files()[1:] {
		if filepath.Base(f) == filepath.Base(path) && strings.HasSuffix(filepath.ToSlash(f), strings.TrimPrefix(path, "./")) {
			d.w("<p class=\"hash\">SHA-256 ", Hash(d.src[f]), "</p>\n")
			break
		}
	}
	if len(u.Overrides) == 0 {
		d.w("<p>All inputs of the template as it is written.</p>\n")
	} else {
		d.w("<table class=\"overrides\">\n<caption>Inputs replaced in this use</caption>\n<thead><tr><th>Input</th><th>Replaced by</th><th>Value</th><th>Note</th></tr></thead>\n<tbody>\n")
		for _, o := range u.Overrides {
			c := d.s.Lookup(prefix + o.Name.Name)
			if c == nil {
				continue
			}
			d.w("<tr><td>")
			d.math(func(b *strings.Builder) { symbol(b, o.Name.Name) })
			d.w("</td><td>")
			t := &typesetter{d: d, scope: c.Scope()}
			if !c.Body().IsZero() {
				d.math(func(b *strings.Builder) { t.expr(b, c.Body(), 0) })
			}
			desc, _ := o.Annot.Text()
			d.w("</td><td class=\"num\">", esc(d.resultText(c)), "</td><td>", esc(desc), "</td></tr>\n")
		}
		d.w("</tbody></table>\n")
	}
	if f := d.templateFile(prefix); f != nil {
		d.templateItems(f, prefix, no)
		d.w("</section>\n")
		return
	}
	section := "\x00"
	for _, c := range d.prog.Cells {
		if !strings.HasPrefix(c.Name, prefix) {
			continue
		}
		if c.Section() != section {
			section = c.Section()
			h := strings.TrimPrefix(section, u.Name.Name+": ")
			if h != "" {
				d.w("<h4>", esc(h), "</h4>\n")
			}
		}
		if c.Kind == engine.Table {
			d.table(c, nil)
			continue
		}
		d.cell(c)
	}
	d.w("</section>\n")
}

// templateFile returns the parsed template whose cells a use brought in
// under prefix: the file their positions name, as the checked program
// keeps it (nil when none of its cells is found). A replaced input is
// placed at its override, in the using sheet, so it does not count.
func (d *doc) templateFile(prefix string) *sheet.File {
	for _, c := range d.prog.Cells {
		if strings.HasPrefix(c.Name, prefix) && !strings.Contains(c.Name[len(prefix):], ".") && !d.replaced[c.Name] {
			for _, f := range d.prog.Files {
				if f.Name == c.Pos().File {
					return f
				}
			}
			return nil
		}
	}
	return nil
}

// templateItems writes the items of template f used under prefix in its
// reading order, as sections does for the sheet: its headings, its
// comments as prose, its cells and tables as written, its own uses as
// sub-sections.
func (d *doc) templateItems(f *sheet.File, prefix, no string) {
	var comments []string
	flush := func() {
		if len(comments) > 0 {
			d.prose(comments)
			comments = comments[:0]
		}
	}
	sub := 0
	for _, it := range f.Items {
		switch it := it.(type) {
		case *sheet.Meta:
			continue
		case *sheet.Comment:
			comments = append(comments, it.Text)
			continue
		case *sheet.Blank:
			if len(comments) > 0 {
				comments = append(comments, "")
			}
			continue
		}
		flush()
		switch it := it.(type) {
		case *sheet.Heading:
			d.w("<h4>", esc(strings.TrimSpace(it.Text)), "</h4>\n")
		case *sheet.Cell:
			d.templateCell(prefix + it.Name.Name)
		case *sheet.FuncDef:
			d.templateCell(prefix + it.Name.Name)
		case *sheet.Check:
			for _, name := range checkCells(prefix+it.Name.Name, d.prog.Lookup) {
				d.templateCell(name)
			}
		case *sheet.Table:
			d.table(d.prog.Lookup(prefix+it.Name.Name), it)
		case *sheet.Use:
			sub++
			d.use(it, prefix, no+"."+strconv.Itoa(sub))
		}
	}
	flush()
}

func (d *doc) templateCell(name string) {
	if c := d.prog.Lookup(name); c != nil {
		d.cell(c)
	}
}

// math writes one MathML expression inline.
func (d *doc) math(f func(b *strings.Builder)) {
	var b strings.Builder
	b.WriteString("<math>")
	f(&b)
	b.WriteString("</math>")
	d.w(b.String())
}

func anchor(name string) string { return "c-" + esc(name) }

// checkCells names the check cells a check item made: itself, or for a
// range check (`lo <= x <= hi`) its two halves name_min and name_max.
func checkCells(name string, lookup func(string) *engine.Cell) []string {
	if lookup(name) != nil {
		return []string{name}
	}
	var out []string
	for _, n := range []string{name + "_min", name + "_max"} {
		if lookup(n) != nil {
			out = append(out, n)
		}
	}
	return out
}
