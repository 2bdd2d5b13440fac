package main

import (
	"bytes"
	"strings"
	"time"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// A save that changes only the values of inputs (`P [kN] = 30 kN` becomes
// `P [kN] = 45 kN`) does not need the sheet compiled again: the watcher
// keeps the compiled sheet and a State, sets the edited inputs and lets the
// engine recompute what lies downstream of them. Anything else (a formula,
// a name, a unit, a comment, a line added or removed, a template saved)
// compiles the sheet whole.

// inputEdits returns the inputs whose value text differs between base (the
// source s was compiled from) and src, as name -> new expression text, or
// false when src differs from base in anything else. byLine maps lines to
// the one-line inputs of s (oneLineInputs), built on first need.
func inputEdits(s *engine.Sheet, byLine *map[int]*engine.Cell, base, src []byte) (map[string]string, bool) {
	edits := map[string]string{}
	off, noff := 0, 0
	for line := 1; off < len(base) || noff < len(src); line++ {
		if off >= len(base) || noff >= len(src) {
			return nil, false // a line added or removed
		}
		ol, nl := nextLine(base[off:]), nextLine(src[noff:])
		lineStart := off
		off += len(ol)
		noff += len(nl)
		if bytes.Equal(ol, nl) {
			continue
		}
		if *byLine == nil {
			*byLine = oneLineInputs(s)
		}
		c := (*byLine)[line]
		if c == nil {
			return nil, false
		}
		expr, ok := editedValue(c, ol, nl, lineStart)
		if !ok {
			return nil, false
		}
		edits[c.Name] = expr
	}
	return edits, true
}

// nextLine is b up to and including its first newline (all of b without).
func nextLine(b []byte) []byte {
	if i := bytes.IndexByte(b, '\n'); i >= 0 {
		return b[:i+1]
	}
	return b
}

// editedValue returns the new value text of input c, whose line was ol
// (starting at byte lineStart of the compiled source) and is now nl, or
// false when more than the value changed.
func editedValue(c *engine.Cell, ol, nl []byte, lineStart int) (string, bool) {
	from := c.Formula.Source.Range.Start().Offset - lineStart
	to := from + len(c.Formula.Source.Text)
	if from < 0 || to > len(ol) {
		return "", false
	}
	prefix := string(ol[:from])
	suffix := strings.TrimSpace(string(ol[to:]))
	line := strings.TrimRight(string(nl), "\r\n")
	if !strings.HasPrefix(line, prefix) {
		return "", false
	}
	rest := strings.TrimSpace(line[len(prefix):])
	if !strings.HasSuffix(rest, suffix) {
		return "", false
	}
	expr := strings.TrimSpace(rest[:len(rest)-len(suffix)])
	// The description and reference must be what they were, and the new
	// value must not start a comment of its own.
	if expr == "" || strings.Contains(expr, "--") || strings.Contains(expr, "#") {
		return "", false
	}
	return expr, true
}

// oneLineInputs maps each line of the sheet that holds a whole input cell
// of the sheet itself (not of a template) to the cell.
func oneLineInputs(s *engine.Sheet) map[int]*engine.Cell {
	m := map[int]*engine.Cell{}
	for _, c := range s.Cells() {
		r := c.Range()
		if c.Kind != engine.Input || c.Scope() != "" || r.Start().File != s.Name() || r.Start().Line != r.End().Line || c.Formula == nil {
			continue
		}
		m[r.Start().Line] = c
	}
	return m
}

// incremental evaluates src through the kept State when it differs from
// the compiled source only in input values; false means compile it whole.
// It brings w.last up to date in place and returns the results of the
// cells it recomputed (the only ones that can differ), before and after.
func (w *watcher) incremental(src []byte) (before, after *engine.Results, ok bool) {
	if w.sheet == nil || w.st == nil || w.last == nil || !w.usedUnchanged() {
		return nil, nil, false
	}
	edits, ok := inputEdits(w.sheet, &w.byLine, w.base, src)
	if !ok {
		return nil, nil, false
	}
	for name := range w.over {
		if _, still := edits[name]; !still {
			if err := w.st.Reset(name); err != nil {
				w.st = nil
				return nil, nil, false
			}
		}
	}
	w.over = map[string]bool{}
	for name, text := range edits {
		if err := w.st.SetText(name, text); err != nil {
			// Not a value of the input's dimension, or not a value at
			// all: the full compile reports it with its place.
			w.st = nil
			return nil, nil, false
		}
		w.over[name] = true
	}
	w.st.Recompute()
	redo := w.st.Recomputed()
	before = subset(w.last, redo)
	w.st.Update(w.last, redo)
	return before, subset(w.last, redo), true
}

// subset is the results of the cells at idx only, for comparing two runs
// of one compiled sheet where only those cells were recomputed.
func subset(r *engine.Results, idx []int) *engine.Results {
	out := &engine.Results{Meta: r.Meta}
	for _, i := range idx {
		c := r.Cells[i]
		out.Cells = append(out.Cells, c)
		if c.Cell.Kind == engine.Check {
			for _, ch := range r.Checks {
				if ch.Cell == c.Cell {
					out.Checks = append(out.Checks, ch)
				}
			}
		}
	}
	return out
}

// readStable reads the file until two reads settle apart agree, so that a
// file caught while an editor is still writing it is not taken for a
// save. It gives up after about a second and returns the last read.
func (w *watcher) readStable() ([]byte, error) {
	src, err := userfile.ReadFile(w.path, engine.DefaultMaxBytes)
	if err != nil || w.settle <= 0 {
		return src, err
	}
	for range 100 {
		time.Sleep(w.settle)
		again, err := userfile.ReadFile(w.path, engine.DefaultMaxBytes)
		if err != nil {
			return nil, err
		}
		if bytes.Equal(again, src) {
			return src, nil
		}
		src = again
	}
	return src, nil
}
