package text

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/combine"
	"github.com/sheafcalc/sheaf/engine/units"
)

// cellCombo is the combination whose value cell c of r shows, "" when it
// does not depend on actions (or is an action, shown at its characteristic
// value).
func cellCombo(r *engine.Results, c *engine.Cell) string {
	if r.Combos == nil || c.Index >= len(r.Combos.CellIn) || r.Combos.CellIn[c.Index] < 0 {
		return ""
	}
	return r.Combos.All[r.Combos.CellIn[c.Index]].Name
}

// checkCombo is the line under a check that depends on actions: its
// governing combination and how many were evaluated.
func checkCombo(r *engine.Results, ch engine.CheckResult) string {
	o := ch.Combo
	if o == nil {
		return ""
	}
	s := "governs " + o.Governing + ": " + o.Text + ", " + o.Clause + "; " +
		fmt.Sprintf("%d %s combinations evaluated", o.Evaluated, r.Combos.Rules.StateLabel(o.State))
	if o.Failing > 0 {
		s += fmt.Sprintf(", %d fail or cannot be assessed", o.Failing)
	}
	return s
}

// writeCombos writes how the actions were combined: the rules, the
// factors with their sources, and which combination the marked cells show.
func writeCombos(b *strings.Builder, r *engine.Results) {
	cs := r.Combos
	b.WriteString("\nCombinations\n------------\n")
	b.WriteString("  rules    " + cs.Rules.Name + ": " + cs.Rules.Title + "\n")
	var acts []string
	for i, a := range cs.Actions {
		acts = append(acts, a.Name+" ("+cs.Cells[i].Extra().Action.Kind.Text()+")")
	}
	b.WriteString("  actions  " + strings.Join(acts, ", ") + "\n")
	var supOnly []string
	for _, a := range cs.Actions {
		if a.Class == combine.Permanent && !a.Favourable {
			supOnly = append(supOnly, a.Name)
		}
	}
	if len(supOnly) > 0 && cs.Rules.TakesFavourable() {
		b.WriteString("  note     taken unfavourable only: " + strings.Join(supOnly, ", ") +
			"; write `permanent favourable` for one that can relieve a check (uplift, overturning)\n")
	}
	if fs := cs.UsedFactors(); len(fs) > 0 {
		b.WriteString("  factors\n")
		w := 0
		for _, f := range fs {
			w = max(w, utf8.RuneCountInString(f.Symbol))
		}
		for _, f := range fs {
			src := f.SourceText()
			if f.Replaced {
				src = "replaced by " + src + "; built-in " + combine.FormatFactor(f.Builtin)
			}
			b.WriteString("    " + pad(f.Symbol, w) + "  " + padLeft(combine.FormatFactor(f.Value), 5) + "  " + src + "\n")
		}
	} else {
		b.WriteString("  factors  as written in each combination of the rules (`sheaf run --combinations` names the clause of each)\n")
	}
	counts := map[string]int{}
	var order []string
	for _, c := range cs.All {
		if counts[c.State] == 0 {
			order = append(order, c.State)
		}
		counts[c.State]++
	}
	var parts []string
	for _, st := range order {
		parts = append(parts, fmt.Sprintf("%d %s", counts[st], cs.Rules.StateLabel(st)))
	}
	b.WriteString("  evaluated " + strings.Join(parts, ", ") + " (`sheaf run --combinations` lists them)\n")
	b.WriteString("  actions show their characteristic values; a cell that depends on them shows its value in the combination\n" +
		"  named beside it: the governing one of the check it feeds (if several, of the most utilised, uls first)\n")
	seen := map[int]bool{}
	for _, m := range cs.CellIn {
		if m >= 0 && !seen[m] {
			seen[m] = true
		}
	}
	for m := range cs.All {
		if seen[m] {
			b.WriteString("    " + cs.All[m].Name + " = " + cs.Text(m) + "\n")
		}
	}
}

// WriteCombinations writes the table of every combination of r: its name,
// limit state, the expression it follows, the combination in words, and the
// utilisation of each check of its limit state.
func WriteCombinations(w io.Writer, r *engine.Results) error {
	cs := r.Combos
	var b strings.Builder
	if cs == nil {
		b.WriteString("The sheet has no actions, so no combinations.\n")
		_, err := io.WriteString(w, b.String())
		return err
	}
	b.WriteString("Combinations of " + cs.Rules.Name + " (" + cs.Rules.Title + ")\n\n")
	type row []string
	head := row{"name", "limit state", "follows", "combination"}
	var checks []engine.CheckResult
	for _, ch := range r.Checks {
		if ch.Combo != nil {
			checks = append(checks, ch)
			head = append(head, ch.Cell.Name)
		}
	}
	rows := []row{head}
	for m, c := range cs.All {
		rw := row{c.Name, cs.Rules.StateLabel(c.State), c.Clause, cs.Text(m)}
		for _, ch := range checks {
			cell := ""
			if ch.Combo.State == c.State {
				u := ch.Combo.Utils[m]
				switch {
				case u != u: // NaN
					cell = "not assessed"
				case u < 0:
					cell = "reversed"
				default:
					cell = units.FormatNumber(u*100, 3) + " %"
				}
				if ch.Combo.Governing == c.Name {
					cell += " <"
				}
			}
			rw = append(rw, cell)
		}
		rows = append(rows, rw)
	}
	wd := make([]int, len(head))
	for _, rw := range rows {
		for i, s := range rw {
			wd[i] = max(wd[i], utf8.RuneCountInString(s))
		}
	}
	for _, rw := range rows {
		line := " "
		for i, s := range rw {
			if i >= 4 {
				line += " " + padLeft(s, wd[i])
			} else {
				line += " " + pad(s, wd[i])
			}
		}
		b.WriteString(strings.TrimRight(line, " ") + "\n")
	}
	b.WriteString("\n< marks the governing combination of each check.\n")
	if fs := cs.UsedFactors(); len(fs) > 0 {
		b.WriteString("\nFactors\n")
		for _, f := range fs {
			b.WriteString("  " + f.Symbol + " = " + combine.FormatFactor(f.Value) + "  " + f.SourceText() + "\n")
		}
	}
	b.WriteString("\n" + Caution + "\n")
	_, err := io.WriteString(w, b.String())
	return err
}
