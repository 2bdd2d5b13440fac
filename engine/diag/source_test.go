package diag

import "testing"

// TestSourcePos checks the conversion of byte offsets to line:col that
// every message goes through: columns count runes (a tab is one), a byte
// order mark is not a column, CRLF ends a line like LF.
func TestSourcePos(t *testing.T) {
	const text = "\uFEFFab\n\tσ_Ed = 1\r\nx\n"
	s := NewSource("s.sheaf", text)
	cases := []struct {
		name      string
		off       int
		line, col int
	}{
		{"inside the byte order mark", 1, 1, 1},
		{"first byte after the mark", 3, 1, 1},
		{"second column", 4, 1, 2},
		{"the line break", 5, 1, 3},
		{"after a tab", 7, 2, 2},
		{"after a two-byte rune", 9, 2, 3},
		{"the CR of a CRLF", 16, 2, 10},
		{"the next line", 18, 3, 1},
		{"the end of the text", len(text), 4, 1},
		{"past the end is the end", len(text) + 5, 4, 1},
		{"before the start is the start", -3, 1, 1},
	}
	for _, c := range cases {
		p := s.Pos(c.off)
		if p.Line != c.line || p.Col != c.col || p.File != "s.sheaf" {
			t.Errorf("%s: offset %d is %s, want %d:%d", c.name, c.off, p, c.line, c.col)
		}
		if c.off >= 3 && c.off <= len(text) {
			if back := s.Offset(p.Line, p.Col); back != c.off {
				t.Errorf("%s: Offset(%d, %d) = %d, want %d", c.name, p.Line, p.Col, back, c.off)
			}
		}
	}
}

func TestRangeForms(t *testing.T) {
	s := NewSource("f", "x = 12 kN\n")
	r := s.Span(4, 9)
	cases := []struct {
		name       string
		r          Range
		start, end string
		valid      bool
	}{
		{"a span", r, "f:1:5", "f:1:10", true},
		{"a part of a span", r.Sub(3, 5), "f:1:8", "f:1:10", true},
		{"the file as a whole", s.Whole(), "f", "f", false},
		{"no position", Range{}, "-", "-", false},
		{"a part of no position", Range{}.Sub(1, 2), "-", "-", false},
	}
	for _, c := range cases {
		if got := c.r.Start().String(); got != c.start {
			t.Errorf("%s: start %s, want %s", c.name, got, c.start)
		}
		if got := c.r.End().String(); got != c.end {
			t.Errorf("%s: end %s, want %s", c.name, got, c.end)
		}
		if c.r.IsValid() != c.valid {
			t.Errorf("%s: IsValid %v, want %v", c.name, c.r.IsValid(), c.valid)
		}
	}
}
