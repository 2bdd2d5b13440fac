package report

import (
	"path/filepath"
	"strings"
	"time"

	"github.com/sheafcalc/sheaf/engine"
	unitsys "github.com/sheafcalc/sheaf/engine/units"
)

// page writes the whole document.
func (d *doc) page() {
	m := d.res.Meta
	title := m.Title
	if title == "" {
		title = "Calculation: " + filepath.Base(d.s.Name())
	}
	d.w("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n",
		"<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n",
		"<meta name=\"generator\" content=\"Sheaf ", esc(d.opt.Version), "\">\n",
		"<title>", esc(title), "</title>\n<style>\n")
	d.style(title)
	d.w("</style>\n</head>\n<body>\n")
	d.w("<main id=\"report\">\n")
	d.body(title)
	d.w("</main>\n")
	if d.opt.Live != "" {
		d.live()
	}
	d.w("</body>\n</html>\n")
}

// body writes the content of the page (what the live preview replaces).
func (d *doc) body(title string) {
	d.titleBlock(title)
	d.caution()
	d.problems()
	d.summary()
	d.combinations()
	d.sections()
	d.signOff()
	d.w("<p class=\"end\">End of calculation. ", esc(engine.Caution), "</p>\n")
}

var metaRows = []struct{ key, label string }{
	{"project", "Project"}, {"basis", "Basis"}, {"author", "Prepared by"}, {"checker", "Checker"},
	{"date", "Date"}, {"revision", "Revision"},
}

func (d *doc) titleBlock(title string) {
	m := d.res.Meta
	vals := map[string]string{"project": m.Project, "basis": m.Basis, "author": m.Author,
		"checker": m.Checker, "date": m.Date, "revision": m.Revision}
	d.w("<header class=\"titleblock\">\n<div class=\"kicker\">Design calculation</div>\n<h1>", esc(title), "</h1>\n<table class=\"meta\">\n")
	for _, r := range metaRows {
		v := vals[r.key]
		if v == "" {
			v = "—" // the header does not give it: say so rather than leave a gap
		}
		d.w("<tr><th>", r.label, "</th><td>", esc(v), "</td></tr>\n")
	}
	units := m.Units
	if units == "" {
		units = "metric (not written)"
	}
	if d.s.System() != m.System {
		// a display system chosen at the command line (--system) wins over the header's
		units += "; shown in " + map[bool]string{true: "US customary", false: "metric"}[d.s.System() == unitsys.US] + " units for this report"
	}
	d.w("<tr><th>Units</th><td>", esc(units), "</td></tr>\n")
	d.w("</table>\n<table class=\"files\">\n<tr><th>Computed by</th><td>Sheaf ", esc(d.opt.Version), "</td></tr>\n")
	if !d.opt.Stamp.IsZero() {
		d.w("<tr><th>Run at</th><td>", d.opt.Stamp.UTC().Format(time.RFC3339), "</td></tr>\n")
	}
	d.w("<tr><th>Sheet</th><td><span class=\"file\">", esc(filepath.ToSlash(d.s.Name())), "</span><br><span class=\"hash\">SHA-256 ", d.hash, "</span></td></tr>\n")
	for _, f := range d.s.Files()[1:] {
		d.w("<tr><th>Template</th><td><span class=\"file\">", esc(filepath.ToSlash(f)), "</span><br><span class=\"hash\">SHA-256 ", Hash(d.src[f]), "</span></td></tr>\n")
	}
	d.w("</table>\n</header>\n")
}

func (d *doc) caution() {
	d.w("<aside class=\"caution\"><strong>Caution.</strong> Sheaf computes; the engineer decides. ",
		esc(engine.Caution), " Values marked “from memory” or “own assumption” in the references must be confirmed before use.</aside>\n")
}

// problems lists the cells that could not be computed, at their lines.
func (d *doc) problems() {
	if len(d.res.Problems) == 0 {
		return
	}
	d.w("<section class=\"problems\"><h2 class=\"unnumbered\">Not computed</h2>\n<p>These cells failed when the sheet ran; every cell that uses them shows “not computed”. The results below are incomplete.</p>\n<ul>\n")
	for _, p := range d.res.Problems {
		d.w("<li><code>", esc(p.Error()), "</code></li>\n")
	}
	d.w("</ul></section>\n")
}

func (d *doc) signOff() {
	m := d.res.Meta
	who := func(s string) string {
		if s == "-" || s == "—" {
			return ""
		}
		return s
	}
	d.w("<section class=\"signoff\">\n<h2 class=\"unnumbered\">Sign-off</h2>\n<table>\n<thead><tr><th></th><th>Name</th><th>Signature</th><th>Date</th></tr></thead>\n<tbody>\n")
	for _, r := range [][2]string{{"Prepared", who(m.Author)}, {"Checked", who(m.Checker)}, {"Approved", ""}} {
		d.w("<tr><th>", r[0], "</th><td>", esc(r[1]), "</td><td></td><td></td></tr>\n")
	}
	d.w("</tbody></table>\n<p class=\"small\">The checker confirms the inputs, the references and the limits against the local code and the project documents; Sheaf confirms only that the arithmetic and the units are consistent.</p>\n</section>\n")
}

// cssString quotes s for a CSS content property.
func cssString(s string) string {
	s = strings.NewReplacer("\\", "\\\\", "\"", "\\\"", "\n", "\\a ", "<", "\\3c ").Replace(s)
	return "\"" + s + "\""
}
