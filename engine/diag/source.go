package diag

import (
	"strings"
	"sync"
	"unicode/utf8"
)

// Source is the text of one file (or of one value given outside a file,
// such as `--set d=0.75in`) under the name its positions show. Ranges
// point into it by byte offset; it turns an offset into line:col when a
// message is printed, from a table of line starts made on first use.
type Source struct {
	Name string
	Text string

	once   sync.Once
	starts []int32 // byte offset of each line's first byte (past a BOM on line 1)
}

// NewSource returns the source of text under name.
func NewSource(name, text string) *Source { return &Source{Name: name, Text: text} }

// FileOnly returns a source that names a file without its text, for a
// message about the file as a whole (it cannot be read, it is too large).
func FileOnly(name string) *Source { return &Source{Name: name} }

// Whole is the range naming the file as a whole.
func (s *Source) Whole() Range { return Range{Src: s, From: -1, To: -1} }

// Span returns the range [from, to) of s.
func (s *Source) Span(from, to int) Range {
	return Range{Src: s, From: int32(from), To: int32(to)}
}

func (s *Source) lines() []int32 {
	s.once.Do(func() {
		first := 0
		if strings.HasPrefix(s.Text, "\uFEFF") {
			first = len("\uFEFF")
		}
		s.starts = append(make([]int32, 0, strings.Count(s.Text, "\n")+1), int32(first))
		for i := 0; i < len(s.Text); i++ {
			if s.Text[i] == '\n' {
				s.starts = append(s.starts, int32(i+1))
			}
		}
	})
	return s.starts
}

// Pos returns the position of byte offset off: 1-based line, 1-based
// column in runes (a tab is one column), and the offset itself.
func (s *Source) Pos(off int) Pos {
	off = min(max(off, 0), len(s.Text))
	starts := s.lines()
	lo, hi := 0, len(starts) // the last line starting at or before off
	for hi-lo > 1 {
		m := int(uint(lo+hi) >> 1)
		if int(starts[m]) <= off {
			lo = m
		} else {
			hi = m
		}
	}
	start := int(starts[lo])
	col := 1
	if off > start {
		col += utf8.RuneCountInString(s.Text[start:off])
	}
	return Pos{File: s.Name, Line: lo + 1, Col: col, Offset: off}
}

// Offset returns the byte offset of line:col (1-based, col in runes), as
// a reader that counts lines and columns reports a place; a place past
// the end of its line or of the text is clamped to it.
func (s *Source) Offset(line, col int) int {
	starts := s.lines()
	if line < 1 {
		return 0
	}
	if line > len(starts) {
		return len(s.Text)
	}
	off := int(starts[line-1])
	end := len(s.Text)
	if line < len(starts) {
		end = int(starts[line]) - 1
	}
	for k := 1; k < col && off < end; k++ {
		_, size := utf8.DecodeRuneInString(s.Text[off:end])
		off += size
	}
	return off
}

// At returns the range [line:col, line:col+width) of s, for a reader
// that reports places by line and column.
func (s *Source) At(line, col, width int) Range {
	from := s.Offset(line, col)
	to := from
	for k := 0; k < width && to < len(s.Text) && s.Text[to] != '\n'; k++ {
		_, size := utf8.DecodeRuneInString(s.Text[to:])
		to += size
	}
	return Range{Src: s, From: int32(from), To: int32(to)}
}
