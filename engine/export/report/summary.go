package report

import (
	"math"
	"strconv"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/units"
)

// Verdict words, as the text listing writes them.
const (
	Pass    = "ok"
	Fail    = "FAILS"
	Unknown = "not assessed"
)

func verdict(c engine.CheckResult) (word, class string) {
	switch {
	case !c.Known:
		return Unknown, "unknown"
	case c.Pass:
		return Pass, "pass"
	}
	return Fail, "fail"
}

// governing is the index of the check with the highest utilisation, or -1;
// a check that could not be assessed governs, since nothing shows it holds.
func governing(checks []engine.CheckResult) int {
	g, best := -1, math.Inf(-1)
	for i, c := range checks {
		u := c.Util
		if !c.Known || math.IsNaN(u) {
			u = math.Inf(1)
		}
		if u > best {
			g, best = i, u
		}
	}
	return g
}

func (d *doc) summary() {
	checks := d.res.Checks
	d.w("<section class=\"summary\">\n<h2 class=\"unnumbered\">Summary of design checks</h2>\n")
	if len(checks) == 0 {
		d.w("<p>This sheet has no design checks.</p>\n</section>\n")
		return
	}
	g := governing(checks)
	failed := d.res.Failed()
	switch {
	case failed == 0:
		d.w("<p class=\"verdict pass\">All ", strconv.Itoa(len(checks)), " design checks are ok. Governing: <b>",
			esc(checks[g].Cell.Name), "</b> at ", pct(checks[g].Util), ".</p>\n")
	default:
		d.w("<p class=\"verdict fail\">", strconv.Itoa(failed), " of ", strconv.Itoa(len(checks)),
			" design checks FAIL or could not be assessed. Governing: <b>", esc(checks[g].Cell.Name), "</b>.</p>\n")
	}
	d.w("<table class=\"checks\">\n<thead><tr><th>Check</th><th>Demand</th><th></th><th>Capacity</th><th>Utilisation</th><th>Verdict</th><th>Reference</th></tr></thead>\n<tbody>\n")
	for i, c := range checks {
		word, class := verdict(c)
		row := class
		if i == g {
			row += " governing"
		}
		dem, capa := "—", "—"
		if c.Known {
			dem, capa = d.formatSI(c.Demand, c.Unit), d.formatSI(c.Capacity, c.Unit)
		}
		op := "≤" // the table reads demand ≤ capacity, however the check is written
		d.w("<tr class=\"", row, "\"><td><a href=\"#", anchor(c.Cell.Name), "\">", esc(c.Cell.Name), "</a>")
		if i == g {
			d.w(" <span class=\"gov\">governing</span>")
		}
		if c.Cell.Description() != "" {
			d.w("<div class=\"desc\">", esc(c.Cell.Description()), "</div>")
		}
		if line := d.checkCombo(&checks[i]); line != "" {
			d.w("<div class=\"combo\">", esc(line), "</div>")
		}
		d.w("</td><td class=\"num\">", esc(dem), "</td><td>", op, "</td><td class=\"num\">", esc(capa), "</td><td class=\"util\">")
		d.utilBar(c)
		d.w("</td><td class=\"v ", class, "\">", word, "</td><td class=\"ref\">", esc(c.Cell.Reference()), "</td></tr>\n")
	}
	d.w("</tbody></table>\n</section>\n")
}

// pct writes a utilisation as a percentage with three significant figures.
func pct(u float64) string {
	if math.IsNaN(u) {
		return "—"
	}
	return units.FormatNumber(u*100, 3) + " %"
}

// utilBar draws the utilisation as a bar on a scale to 100 % with room to
// 150 %; beyond that the bar ends in an arrow. The number is printed
// beside it, so the verdict never rests on a colour.
func (d *doc) utilBar(c engine.CheckResult) {
	const w, h, full = 90.0, 10.0, 60.0 // full: the length of 100 %
	_, class := verdict(c)
	s := newSVG(w, h, "bar "+class)
	s.rect(0, 1, full*1.5, h-2, "track")
	if c.Known && !math.IsNaN(c.Util) {
		u := math.Max(c.Util, 0)
		l := math.Min(u, 1.5) * full
		s.rect(0, 1, l, h-2, "fill")
		if u > 1.5 {
			s.path("M"+f1(l)+" 0 L"+f1(l+4)+" "+f1(h/2)+" L"+f1(l)+" "+f1(h)+"Z", "fill")
		}
	}
	s.line(full, 0, full, h, "limit")
	d.w("<span class=\"utilbar\">", s.String(), "<span class=\"pct\">", pct(c.Util), "</span></span>")
}
