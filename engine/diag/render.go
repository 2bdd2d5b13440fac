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
	lines := map[string][]int{} // line starts of each file, made on first use
	for k, d := range l {
		if k == MaxShown {
			fmt.Fprintf(&b, "... and %d more problems not shown; correct the ones above and check again\n\n", len(l)-k)
			break
		}
		// Messages quote what the user wrote; a control character or a
		// direction control in it is shown as U+FFFD, never sent raw.
		b.WriteString(printable(d.Error()))
		b.WriteByte('\n')
		if d.Detail != "" {
			b.WriteString("    " + printable(d.Detail) + "\n")
		}
		if text, ok := src[d.Range.File()]; ok && d.Range.IsValid() {
			starts, made := lines[d.Range.File()]
			if !made {
				starts = lineStarts(text)
				lines[d.Range.File()] = starts
			}
			writeSnippet(&b, text, starts, d.Range.Start(), d.Range.End())
		}
		if d.Hint != "" {
			b.WriteString("    hint: " + printable(d.Hint) + "\n")
		}
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// MaxShown is the number of problems Render shows; it says how many more
// there are. A file with thousands of mistakes is rarely read past the
// first screens, and rendering stays linear in the size of the file.
const MaxShown = 100

// lineStarts returns the byte offset at which each line of text starts.
func lineStarts(text []byte) []int {
	starts := []int{0}
	for i, c := range text {
		if c == '\n' {
			starts = append(starts, i+1)
		}
	}
	return starts
}

// writeSnippet writes the line holding start with carets under the span
// (clipped to that line; at least one caret). A line that is empty or
// missing (a position at the end of the file) gets no snippet: there is
// nothing to point at. A long line is cut to a window around the span,
// with "…" where text was left out.
func writeSnippet(b *strings.Builder, text []byte, starts []int, start, end Pos) {
	line, ok := lineText(text, starts, start.Line)
	if !ok || line == "" {
		return
	}
	n := utf8.RuneCountInString(line)
	width := 1
	if end.Line == start.Line && end.Col > start.Col {
		width = end.Col - start.Col
	} else if end.Line > start.Line {
		width = n - start.Col + 1
	}
	if start.Col-1+width > n && n >= start.Col {
		width = n - start.Col + 1
	}
	width = max(width, 1)
	col := max(start.Col-1, 0) // runes before the caret
	if n > maxSnippet {
		rs := []rune(line)
		width = min(width, maxSnippet/2)
		from := max(0, min(col-maxSnippet/4, n-maxSnippet))
		to := min(n, from+maxSnippet)
		cut := string(rs[from:to])
		col -= from
		if from > 0 {
			cut = "…" + cut
			col++
		}
		if to < n {
			cut += "…"
		}
		line = cut
		width = max(1, min(width, utf8.RuneCountInString(cut)-col))
	}
	num := fmt.Sprintf("%4d | ", start.Line)
	b.WriteString(num + printable(line) + "\n")
	b.WriteString(strings.Repeat(" ", len(num)-2) + "| " + strings.Repeat(" ", col) + strings.Repeat("^", width) + "\n")
}

// maxSnippet is the most runes of a source line a snippet shows.
const maxSnippet = 120

// lineText returns line n (1-based) of text without its line break, and
// false when text has no such line.
func lineText(text []byte, starts []int, n int) (string, bool) {
	if n < 1 || n > len(starts) {
		return "", false
	}
	end := len(text)
	if n < len(starts) {
		end = starts[n] - 1 // before the line break
	}
	return strings.TrimSuffix(string(text[starts[n-1]:end]), "\r"), true
}

// printable makes a source line safe to print on a terminal: a tab becomes
// a space, and a control character or a byte that is not UTF-8 becomes
// U+FFFD, one rune for one rune, so the caret columns still line up.
func printable(line string) string {
	return strings.Map(func(r rune) rune {
		switch {
		case r == '\t':
			return ' '
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || bidiControls[r] != "":
			return utf8.RuneError
		}
		return r
	}, line)
}

// bidiControls are the Unicode characters that reorder displayed text
// (Unicode Standard Annex #9; the "Trojan Source" class of attacks, CVE-2021-42574).
// A sheet refuses them anywhere: a description, a reference or a comment
// that shows one thing and holds another misleads a checker.
var bidiControls = map[rune]string{
	'\u061C': "ARABIC LETTER MARK",
	'\u200E': "LEFT-TO-RIGHT MARK",
	'\u200F': "RIGHT-TO-LEFT MARK",
	'\u202A': "LEFT-TO-RIGHT EMBEDDING",
	'\u202B': "RIGHT-TO-LEFT EMBEDDING",
	'\u202C': "POP DIRECTIONAL FORMATTING",
	'\u202D': "LEFT-TO-RIGHT OVERRIDE",
	'\u202E': "RIGHT-TO-LEFT OVERRIDE",
	'\u2066': "LEFT-TO-RIGHT ISOLATE",
	'\u2067': "RIGHT-TO-LEFT ISOLATE",
	'\u2068': "FIRST STRONG ISOLATE",
	'\u2069': "POP DIRECTIONAL ISOLATE",
}

// BidiControl reports whether r reorders displayed text, and its name.
func BidiControl(r rune) (name string, ok bool) {
	name, ok = bidiControls[r]
	return name, ok
}
