package text

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Caution is printed at the end of every listing.
const Caution = engine.Caution

// Verdict words for a check.
const (
	Pass    = "ok"
	Fail    = "FAILS"
	Unknown = "not assessed"
)

// Write writes the listing of r.
func Write(w io.Writer, r *engine.Results, sigFigs int) error {
	var b strings.Builder
	title(&b, r.Meta)
	nameW, valW := 0, 0
	for _, c := range r.Cells {
		if c.Cell.Kind == engine.Check {
			continue
		}
		nameW = max(nameW, utf8.RuneCountInString(c.Cell.Name))
		valW = max(valW, utf8.RuneCountInString(c.Text))
	}
	comboW := 0 // room for " (ULS 2)" after values that depend on actions
	for _, c := range r.Cells {
		if m := cellCombo(r, c.Cell); m != "" {
			comboW = max(comboW, utf8.RuneCountInString(m)+3)
		}
	}
	section := "\x00"
	for _, c := range r.Cells {
		if c.Cell.Kind == engine.Check {
			continue
		}
		if c.Cell.Section() != section {
			section = c.Cell.Section()
			if section != "" {
				b.WriteString("\n" + section + "\n" + strings.Repeat("-", utf8.RuneCountInString(section)) + "\n")
			} else {
				b.WriteString("\n")
			}
		}
		val, w := c.Text, valW
		if r.Combos != nil {
			w += comboW
			if m := cellCombo(r, c.Cell); m != "" {
				val += " (" + m + ")"
			}
		}
		line := "  " + pad(c.Cell.Name, nameW) + "  " + pad(val, w)
		line += annotation(c.Cell.Description(), c.Cell.Reference())
		b.WriteString(strings.TrimRight(line, " ") + "\n")
	}
	if len(r.Checks) > 0 {
		writeChecks(&b, r, sigFigs)
	}
	if r.Combos != nil {
		writeCombos(&b, r)
	}
	if r.Uncomputed() > 0 {
		b.WriteString("\nNot computed\n------------\n")
		for _, p := range r.Problems {
			if !assessment(r, p) {
				b.WriteString("  " + p.Error() + "\n")
			}
		}
	}
	b.WriteString("\n" + summary(r) + "\n\n" + Caution + "\n")
	_, err := io.WriteString(w, b.String())
	return err
}

func title(b *strings.Builder, m engine.Meta) {
	t := m.Title
	if t == "" {
		t = "Calculation sheet"
	}
	b.WriteString(t + "\n" + strings.Repeat("=", utf8.RuneCountInString(t)) + "\n")
	for _, kv := range [][2]string{{"project", m.Project}, {"basis", m.Basis}, {"author", m.Author},
		{"checker", m.Checker}, {"date", m.Date}, {"revision", m.Revision}} {
		if kv[1] != "" {
			fmt.Fprintf(b, "%-9s %s\n", kv[0]+":", kv[1])
		}
	}
}

func annotation(desc, ref string) string {
	s := ""
	if desc != "" {
		s += "  " + desc
	}
	if ref != "" {
		s += "  [" + ref + "]"
	}
	return s
}

func writeChecks(b *strings.Builder, r *engine.Results, sig int) {
	b.WriteString("\nDesign checks\n-------------\n")
	type row struct{ name, dem, cap, util, verdict, note, combo string }
	var rows []row
	var w [5]int
	for _, c := range r.Checks {
		rw := row{name: c.Cell.Name, verdict: Unknown, dem: "-", cap: "-", util: "-"}
		if c.Known || c.Problem != nil {
			rw.dem = units.Format(c.Demand, c.Unit, sig)
			rw.cap = units.Format(c.Capacity, c.Unit, sig)
		}
		if c.Known {
			rw.util = units.FormatNumber(c.Util*100, 3) + " %"
			rw.verdict = Pass
			if !c.Pass {
				rw.verdict = Fail
			}
		}
		rw.note = annotation(c.Cell.Description(), c.Cell.Reference())
		if c.Governing != "" {
			rw.note = "  governed by " + c.Governing + rw.note
		}
		if c.Problem != nil {
			rw.note = "  " + Reason(c) + rw.note
		}
		rw.combo = checkCombo(r, c)
		for i, s := range []string{rw.name, rw.dem, rw.cap, rw.util, rw.verdict} {
			w[i] = max(w[i], utf8.RuneCountInString(s))
		}
		rows = append(rows, rw)
	}
	for _, rw := range rows {
		line := "  " + pad(rw.name, w[0]) + "  " + padLeft(rw.dem, w[1]) + " of " + padLeft(rw.cap, w[2]) +
			"  " + padLeft(rw.util, w[3]) + "  " + pad(rw.verdict, w[4]) + rw.note
		b.WriteString(strings.TrimRight(line, " ") + "\n")
		if rw.combo != "" {
			b.WriteString("    " + rw.combo + "\n")
		}
	}
}

// Reason is why check c is not assessed, e.g. "demand is compression;
// this check is written for tension" (its problem's summary without the
// leading "check `name` not assessed: ").
func Reason(c engine.CheckResult) string {
	if c.Problem == nil {
		return ""
	}
	_, after, ok := strings.Cut(c.Problem.Summary, ": ")
	if !ok {
		return c.Problem.Summary
	}
	return after
}

// assessment reports whether p is the reason a check of r is not
// assessed (shown in the check's row, not under "Not computed").
func assessment(r *engine.Results, p *diag.Diagnostic) bool {
	for _, c := range r.Checks {
		if c.Problem == p {
			return true
		}
	}
	return false
}

func summary(r *engine.Results) string {
	s := checksSummary(r)
	if n := r.Uncomputed(); n > 0 {
		s = plural.Count(n, "cell") + " could not be computed (see above): the calculation is not complete.\n" + s
	}
	return s
}

func checksSummary(r *engine.Results) string {
	n, failed := len(r.Checks), r.Failed()
	switch {
	case n == 0:
		return "No design checks in this sheet."
	case failed == 0:
		if n == 1 {
			return "The design check is ok."
		}
		return fmt.Sprintf("All %d design checks are ok.", n)
	case n == 1:
		return "The design check FAILS or could not be assessed."
	}
	return fmt.Sprintf("%d of %d design checks FAIL or could not be assessed.", failed, n)
}

func pad(s string, w int) string {
	return s + strings.Repeat(" ", max(0, w-utf8.RuneCountInString(s)))
}

func padLeft(s string, w int) string {
	return strings.Repeat(" ", max(0, w-utf8.RuneCountInString(s))) + s
}
