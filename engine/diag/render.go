package diag

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// Sources gives the text of each file named in positions, for snippets.
type Sources map[string][]byte

// Render writes each diagnostic as
//
//	file:line:col: summary
//	    detail
//	   12 | sigma [MPa] = N / A + L
//	      |                     ^
//	    hint: did you mean `A_s`?
//
// followed by a blank line. Files missing from src get no snippet.
func Render(w io.Writer, l List, src Sources) error {
	var b strings.Builder
	for _, d := range l {
		b.WriteString(d.Error())
		b.WriteByte('\n')
		if d.Detail != "" {
			b.WriteString("    " + d.Detail + "\n")
		}
		if text, ok := src[d.Range.Start.File]; ok && d.Range.Start.IsValid() {
			writeSnippet(&b, text, d.Range)
		}
		if d.Hint != "" {
			b.WriteString("    hint: " + d.Hint + "\n")
		}
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// writeSnippet writes the line holding r.Start with carets under the span
// (clipped to that line; at least one caret). A line that is empty or
// missing (a position at the end of the file) gets no snippet: there is
// nothing to point at.
func writeSnippet(b *strings.Builder, text []byte, r Range) {
	line, ok := lineText(text, r.Start.Line)
	if !ok || line == "" {
		return
	}
	n := utf8.RuneCountInString(line)
	width := 1
	if r.End.Line == r.Start.Line && r.End.Col > r.Start.Col {
		width = r.End.Col - r.Start.Col
	} else if r.End.Line > r.Start.Line {
		width = n - r.Start.Col + 1
	}
	if r.Start.Col-1+width > n && n >= r.Start.Col {
		width = n - r.Start.Col + 1
	}
	width = max(width, 1)
	num := fmt.Sprintf("%4d | ", r.Start.Line)
	b.WriteString(num + printable(line) + "\n")
	b.WriteString(strings.Repeat(" ", len(num)-2) + "| " + strings.Repeat(" ", max(r.Start.Col-1, 0)) + strings.Repeat("^", width) + "\n")
}

// lineText returns line n (1-based) of text without its line break, and
// false when text has no such line.
func lineText(text []byte, n int) (string, bool) {
	s := string(text)
	for i := 1; i < n; i++ {
		j := strings.IndexByte(s, '\n')
		if j < 0 {
			return "", false
		}
		s = s[j+1:]
	}
	if j := strings.IndexByte(s, '\n'); j >= 0 {
		s = s[:j]
	}
	return strings.TrimSuffix(s, "\r"), true
}

// printable makes a source line safe to print on a terminal: a tab becomes
// a space, and a control character or a byte that is not UTF-8 becomes
// U+FFFD, one rune for one rune, so the caret columns still line up.
func printable(line string) string {
	return strings.Map(func(r rune) rune {
		switch {
		case r == '\t':
			return ' '
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0):
			return utf8.RuneError
		}
		return r
	}, line)
}
