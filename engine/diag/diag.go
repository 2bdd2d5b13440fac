package diag

import (
	"cmp"
	"fmt"
	"slices"
	"strings"
)

// Pos is a place in a source file. Line and Col are 1-based; Col counts runes.
// Offset is the 0-based byte offset. The zero Pos means "no position".
type Pos struct {
	File   string
	Line   int
	Col    int
	Offset int
}

// IsValid reports whether p names a place in a file.
func (p Pos) IsValid() bool { return p.Line > 0 }

// String renders file:line:col (or what of it is known).
func (p Pos) String() string {
	switch {
	case !p.IsValid() && p.File == "":
		return "-"
	case !p.IsValid():
		return p.File
	case p.File == "":
		return fmt.Sprintf("%d:%d", p.Line, p.Col)
	}
	return fmt.Sprintf("%s:%d:%d", p.File, p.Line, p.Col)
}

// Compare orders positions by file, then line, then column (the offset
// is not consulted: positions built from line and column alone compare
// too).
func (p Pos) Compare(q Pos) int {
	if c := cmp.Compare(p.File, q.File); c != 0 {
		return c
	}
	if c := cmp.Compare(p.Line, q.Line); c != 0 {
		return c
	}
	return cmp.Compare(p.Col, q.Col)
}

// Range is a span of source text: the bytes [From, To) of Src. It is
// kept small (a sheet holds several per cell) and turned into line:col
// only when a message or an editor needs it. The zero Range means "no
// position"; a Range whose From is negative names a file as a whole.
type Range struct {
	Src      *Source
	From, To int32
}

// Start returns the position of the first byte of the span.
func (r Range) Start() Pos { return r.at(r.From) }

// End returns the position just past the span.
func (r Range) End() Pos { return r.at(r.To) }

// at is the position of offset off of r's source (the file alone for a
// range naming the file as a whole).
func (r Range) at(off int32) Pos {
	if r.Src == nil {
		return Pos{}
	}
	if r.From < 0 {
		return Pos{File: r.Src.Name}
	}
	return r.Src.Pos(int(off))
}

// IsValid reports whether r names a place in a file.
func (r Range) IsValid() bool { return r.Src != nil && r.From >= 0 }

// File is the name of the file r is in ("" when none).
func (r Range) File() string {
	if r.Src == nil {
		return ""
	}
	return r.Src.Name
}

// Sub returns the span [from, to) counted from the start of r, as a
// parser finds a token inside the text r spans.
func (r Range) Sub(from, to int) Range {
	if !r.IsValid() {
		return r
	}
	return Range{Src: r.Src, From: r.From + int32(from), To: r.From + int32(to)}
}

// Compare orders ranges by the position of their start.
func (r Range) Compare(s Range) int { return r.Start().Compare(s.Start()) }

// Severity grades a diagnostic.
type Severity uint8

const (
	Error   Severity = iota // the sheet cannot be evaluated as written
	Warning                 // worth a look; evaluation goes on
)

// String returns "error" or "warning".
func (s Severity) String() string {
	if s == Warning {
		return "warning"
	}
	return "error"
}

// Diagnostic is one problem found in a sheet: where, what, why and what to do.
type Diagnostic struct {
	Severity Severity
	Range    Range
	Summary  string // one line, lower case, no trailing period
	Detail   string // a sentence or two saying what was expected
	Hint     string // optional: what to try, e.g. "did you mean `f_yd`?"
}

// Error renders the diagnostic as file:line:col: summary, with "warning: "
// before the summary of a warning (an error needs no label: it is the
// usual case, and the exit code says it).
func (d *Diagnostic) Error() string {
	if d.Severity == Warning {
		return d.Range.Start().String() + ": warning: " + d.Summary
	}
	return d.Range.Start().String() + ": " + d.Summary
}

// List is a set of diagnostics. It implements error so that a whole file's
// problems travel as one value.
type List []*Diagnostic

// Add appends a diagnostic.
func (l *List) Add(d *Diagnostic) { *l = append(*l, d) }

// Errorf appends an error diagnostic at r.
func (l *List) Errorf(r Range, detail, hint, format string, args ...any) {
	l.Add(&Diagnostic{Range: r, Summary: fmt.Sprintf(format, args...), Detail: detail, Hint: hint})
}

// HasErrors reports whether any diagnostic is an error.
func (l List) HasErrors() bool {
	for _, d := range l {
		if d.Severity == Error {
			return true
		}
	}
	return false
}

// Sort orders the list by position, then summary, and keeps only the first
// diagnostic on each line, as go/scanner.ErrorList.RemoveMultiples does: one
// mistake, one message.
func (l *List) Sort() {
	slices.SortStableFunc(*l, func(a, b *Diagnostic) int {
		if c := a.Range.Start().Compare(b.Range.Start()); c != 0 {
			return c
		}
		return cmp.Compare(a.Summary, b.Summary)
	})
	out := (*l)[:0]
	var last Pos
	for i, d := range *l {
		p := d.Range.Start()
		if i > 0 && p.File == last.File && p.Line == last.Line && p.IsValid() {
			continue
		}
		out = append(out, d)
		last = p
	}
	*l = out
}

// Err returns the list as an error, or nil if it holds no errors.
func (l List) Err() error {
	if !l.HasErrors() {
		return nil
	}
	return l
}

// Error renders every diagnostic on its own line.
func (l List) Error() string {
	var b strings.Builder
	for i, d := range l {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(d.Error())
	}
	return b.String()
}
