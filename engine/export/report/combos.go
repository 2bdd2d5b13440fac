package report

import (
	"math"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/combine"
)

// A sheet with actions: its cells hold the values of several combinations
// (each check its governing one, each action its characteristic value, each
// cell that depends on actions the combination the listing names beside
// it). The report says which wherever a value is shown:
//
//   - the summary names each check's governing combination in words;
//   - the section "Actions and combinations" lists the actions with their
//     kinds and characteristic values, every combination with the
//     expression it follows and each check's utilisation in it, and the
//     factors with their sources ("(from memory)" where they are);
//   - in the body, an action is marked as its characteristic value, a cell
//     that depends on actions names its combination, and its formula with
//     the values put in writes each action as its factor times its
//     characteristic value (1.35 · 7.425 kN), so that no design formula
//     shows a characteristic value as if it were the design one.

// comboIndex is the index into Combos.All of the combination named name,
// -1 when none.
func comboIndex(cs *engine.ComboSummary, name string) int {
	for m, c := range cs.All {
		if c.Name == name {
			return m
		}
	}
	return -1
}

// cellCombo is the combination whose values cell i shows: -1 for a cell
// that does not depend on actions, an action (its characteristic value) or
// a sheet without actions. A check shows its governing combination.
func (d *doc) cellCombo(i int) int {
	cs := d.res.Combos
	if cs == nil || i < 0 || i >= len(cs.CellIn) {
		return -1
	}
	if c := d.prog.Cells[i]; c.Kind == engine.Check {
		for _, ch := range d.res.Checks {
			if ch.Cell == c && ch.Combo != nil {
				return comboIndex(cs, ch.Combo.Governing)
			}
		}
		return -1
	}
	return cs.CellIn[i]
}

// actionOf is the index into Combos.Actions of action cell i, -1 when i is
// not an action.
func (d *doc) actionOf(i int) int {
	cs := d.res.Combos
	if cs == nil {
		return -1
	}
	for a, c := range cs.Cells {
		if c.Index == i {
			return a
		}
	}
	return -1
}

// comboNote is the note beside a value of a sheet with actions: the
// combination it is in, or that it is an action's characteristic value.
func (d *doc) comboNote(c *engine.Cell) {
	cs := d.res.Combos
	if cs == nil {
		return
	}
	if a := d.actionOf(c.Index); a >= 0 {
		d.w("<span class=\"kindnote\">characteristic value; ", esc(cs.Cells[a].Extra().Action.Kind.Text()), " action</span>")
		return
	}
	if m := d.cellCombo(c.Index); m >= 0 && c.Kind != engine.Check {
		d.w("<span class=\"kindnote combo\">in ", esc(cs.All[m].Name), ": ", esc(cs.Text(m)), "</span>")
	}
}

// checkCombo is the line under a check that depends on actions: its
// governing combination in words and how many were evaluated.
func (d *doc) checkCombo(ch *engine.CheckResult) string {
	o := ch.Combo
	if o == nil || d.res.Combos == nil {
		return ""
	}
	s := "governs " + o.Governing + ": " + o.Text + ", " + o.Clause + "; " +
		strconv.Itoa(o.Evaluated) + " " + d.res.Combos.Rules.StateLabel(o.State) + " combinations evaluated"
	if o.Failing > 0 {
		s += ", " + strconv.Itoa(o.Failing) + " fail or cannot be assessed"
	}
	return s
}

// combinations writes the section of the actions, the combinations and
// the factors of a sheet with actions.
func (d *doc) combinations() {
	cs := d.res.Combos
	if cs == nil {
		return
	}
	d.w("<section class=\"combos\">\n<h2 class=\"unnumbered\">Actions and combinations</h2>\n")
	d.w("<p>Combined by <b>", esc(cs.Rules.Name), "</b>: ", esc(cs.Rules.Title), ". Each variable action takes its turn as the leading one; ",
		"every cell that depends on an action was computed in every combination of the limit states its checks belong to.</p>\n")
	d.w("<table class=\"actions\">\n<thead><tr><th>Action</th><th>Kind</th><th>Characteristic value</th><th>Description</th></tr></thead>\n<tbody>\n")
	for _, c := range cs.Cells {
		cr := &d.res.Cells[c.Index]
		val := "not computed"
		if x, ok := cr.Value.(float64); ok && cr.Known {
			val = d.formatSI(x, cr.Unit)
		}
		d.w("<tr><td><a href=\"#", anchor(c.Name), "\">")
		d.math(func(b *strings.Builder) { symbol(b, c.Name) })
		d.w("</a></td><td>", esc(c.Extra().Action.Kind.Text()), "</td><td class=\"num\">", esc(val), "</td><td>", esc(c.Description()), "</td></tr>\n")
	}
	d.w("</tbody></table>\n")
	var supOnly []string
	for _, a := range cs.Actions {
		if a.Class == combine.Permanent && !a.Favourable {
			supOnly = append(supOnly, a.Name)
		}
	}
	if len(supOnly) > 0 && cs.Rules.TakesFavourable() {
		d.w("<p class=\"small\">Taken unfavourable only: ", esc(strings.Join(supOnly, ", ")),
			". A permanent action that can relieve a check (uplift, overturning) is written <code>permanent favourable</code>.</p>\n")
	}
	var checks []engine.CheckResult
	for _, ch := range d.res.Checks {
		if ch.Combo != nil {
			checks = append(checks, ch)
		}
	}
	d.w("<table class=\"combinations\">\n<thead><tr><th>Combination</th><th>Limit state</th><th>Follows</th><th>In words</th>")
	for _, ch := range checks {
		d.w("<th class=\"num\">", strings.ReplaceAll(esc(ch.Cell.Name), ".", ".<wbr>"), "</th>") // access.<wbr>tension wraps after the use's name
	}
	d.w("</tr></thead>\n<tbody>\n")
	for m, c := range cs.All {
		d.w("<tr><td>", esc(c.Name), "</td><td>", esc(cs.Rules.StateLabel(c.State)), "</td><td class=\"clause\">", esc(c.Clause), "</td><td class=\"words\">", wordsHTML(cs.Text(m)), "</td>")
		for _, ch := range checks {
			u := ch.Combo.Utils[m]
			switch {
			case ch.Combo.State != c.State:
				d.w("<td></td>")
			case math.IsNaN(u):
				d.w("<td class=\"num unknown\">not assessed</td>")
			case u < 0:
				d.w("<td class=\"num fail\">reversed</td>")
			default:
				cls := "num"
				if ch.Combo.Governing == c.Name {
					cls += " governs"
				}
				d.w("<td class=\"", cls, "\">", esc(pct(u)))
				if ch.Combo.Governing == c.Name {
					d.w(" <span class=\"gov\">governs</span>")
				}
				d.w("</td>")
			}
		}
		d.w("</tr>\n")
	}
	d.w("</tbody></table>\n")
	if fs := cs.UsedFactors(); len(fs) > 0 {
		d.w("<table class=\"factors\">\n<thead><tr><th>Factor</th><th class=\"num\">Value</th><th>Source</th></tr></thead>\n<tbody>\n")
		for _, f := range fs {
			src := f.SourceText()
			if f.Replaced {
				src = "replaced by " + src + "; built-in " + combine.FormatFactor(f.Builtin)
			}
			d.w("<tr><td>", esc(f.Symbol), "</td><td class=\"num\">", esc(combine.FormatFactor(f.Value)), "</td><td>", esc(src), "</td></tr>\n")
		}
		d.w("</tbody></table>\n")
	} else {
		d.w("<p class=\"small\">The factors are those of each combination as the clause in the column “Follows” writes them.</p>\n")
	}
	d.w("<p class=\"small\">An action is shown at its characteristic value. A cell that depends on actions shows its value in the combination ",
		"named beside it: the governing one of the check it feeds (if several, of the most utilised, the ultimate limit state first); ",
		"its formula with the values put in writes each action as its factor in that combination times its characteristic value.</p>\n")
	d.w("</section>\n")
}

// wordsHTML writes a combination in words so that a long one (the
// qualified actions of two template uses) wraps between its terms, never
// inside "1.35 access.g_k": the table of combinations then fits the page
// with a column per check.
func wordsHTML(text string) string {
	terms := strings.Split(text, " + ")
	for k, t := range terms {
		if k < len(terms)-1 {
			t += " +" // the sign stays at the end of its line
		}
		terms[k] = "<span class=\"term\">" + esc(t) + "</span>"
	}
	return strings.Join(terms, " ")
}
