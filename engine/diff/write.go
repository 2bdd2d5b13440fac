package diff

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// WriteText writes the report for a person: one section per kind of
// change, names aligned, "old → new" on each line.
func (r *Report) WriteText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "--- %s\n+++ %s\n", r.Old, r.New)
	if r.Empty() {
		b.WriteString("\nno changes\n")
		_, err := io.WriteString(w, b.String())
		return err
	}
	section(&b, "header", changeRows(r.Header, false))
	section(&b, "inputs changed", changeRows(r.Inputs, true))
	section(&b, "formulas changed", changeRows(r.Formulas, false))
	var rows [][]string
	for _, c := range r.Added {
		rows = append(rows, []string{"+ " + c.Name, cellText(c)})
	}
	section(&b, "cells added", rows)
	rows = nil
	for _, c := range r.Removed {
		rows = append(rows, []string{"- " + c.Name, cellText(c)})
	}
	section(&b, "cells removed", rows)
	section(&b, "results changed (relative tolerance "+units.FormatNumber(r.RelTol, 3)+")", changeRows(r.Results, true))
	rows = nil
	for _, c := range r.Checks {
		note := ""
		if c.FlippedToFail {
			note = "flipped to fail"
		}
		rows = append(rows, []string{c.Name, checkText(c.OldVerdict, c.OldUtil) + " → " + checkText(c.NewVerdict, c.NewUtil), note})
	}
	section(&b, "checks changed", rows)
	if r.Flipped > 0 {
		b.WriteString("\n" + plural.Count(r.Flipped, "design check") + " flipped to fail\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteJSON writes the report as indented JSON with a fixed key order;
// every list is present (empty rather than null) so scripts need no
// special case.
func (r *Report) WriteJSON(w io.Writer) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(r)
}

func cellText(c Cell) string {
	s := c.Kind
	if c.Expr != "" {
		u := ""
		if c.Unit != "" {
			u = " [" + c.Unit + "]"
		}
		s += u + " = " + oneLine(c.Expr)
	}
	return s + "  (" + c.Value + ")"
}

func changeRows(cs []Change, withRel bool) [][]string {
	var rows [][]string
	for _, c := range cs {
		note := ""
		if withRel && c.Rel != nil {
			note = "(" + signed(*c.Rel*100) + " %)"
		}
		rows = append(rows, []string{c.Name, oneLine(c.Old) + " → " + oneLine(c.New), note})
	}
	return rows
}

func signed(x float64) string {
	s := units.FormatNumber(x, 3)
	if x > 0 {
		return "+" + s
	}
	return s
}

// utilText writes a utilisation as a percentage with three figures.
func utilText(u *float64) string {
	if u == nil {
		return "-"
	}
	return units.FormatNumber(*u*100, 3) + " %"
}

// oneLine folds a multi-line formula onto one line.
func oneLine(s string) string { return normalise(s) }

// section writes a titled block of aligned rows; nothing when empty.
func section(b *strings.Builder, title string, rows [][]string) {
	if len(rows) == 0 {
		return
	}
	b.WriteString("\n" + title + "\n")
	var w []int
	for _, r := range rows {
		for i, s := range r {
			if i >= len(w) {
				w = append(w, 0)
			}
			w[i] = max(w[i], utf8.RuneCountInString(s))
		}
	}
	for _, r := range rows {
		var line strings.Builder
		line.WriteString("  ")
		for i, s := range r {
			if i > 0 {
				line.WriteString("  ")
			}
			line.WriteString(s)
			if i < len(r)-1 {
				line.WriteString(strings.Repeat(" ", w[i]-utf8.RuneCountInString(s)))
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " ") + "\n")
	}
}
