package lsp

import (
	"net/url"
	"path/filepath"
	"sort"
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// text indexes the lines of a source for converting between the engine's
// positions (1-based line, column in runes, byte offset) and the
// protocol's (0-based line, character in UTF-16 code units): `σ` is two
// bytes, one rune and one UTF-16 unit; `𝜎` is four bytes, one rune and two
// units. Line breaks are "\n" or "\r\n"; the "\r" belongs to no line.
type text struct {
	src    string
	starts []int // byte offset of each line's start
}

func newText(src string) *text {
	t := &text{src: src, starts: []int{0}}
	for i := 0; i < len(src); i++ {
		if src[i] == '\n' {
			t.starts = append(t.starts, i+1)
		}
	}
	return t
}

// lineCount returns the number of lines (a final line break opens an
// empty last line).
func (t *text) lineCount() int { return len(t.starts) }

// line returns the text of 0-based line i without its line break.
func (t *text) line(i int) string {
	if i < 0 || i >= len(t.starts) {
		return ""
	}
	end := len(t.src)
	if i+1 < len(t.starts) {
		end = t.starts[i+1] - 1
	}
	s := t.src[t.starts[i]:end]
	return strings.TrimSuffix(s, "\r")
}

// utf16Len counts the UTF-16 code units of s.
func utf16Len(s string) int {
	n := 0
	for _, r := range s {
		if r >= 0x10000 {
			n += 2
		} else {
			n++
		}
	}
	return n
}

// position returns the protocol position of byte offset off.
func (t *text) position(off int) position {
	off = max(0, min(off, len(t.src)))
	i := sort.Search(len(t.starts), func(i int) bool { return t.starts[i] > off }) - 1
	ln := t.line(i)
	col := min(off-t.starts[i], len(ln))
	for col > 0 && col < len(ln) && !utf8.RuneStart(ln[col]) {
		col--
	}
	return position{Line: i, Character: utf16Len(ln[:col])}
}

// offset returns the byte offset of protocol position p, clamped to the
// document and to the end of p's line.
func (t *text) offset(p position) int {
	if p.Line < 0 {
		return 0
	}
	if p.Line >= len(t.starts) {
		return len(t.src)
	}
	ln := t.line(p.Line)
	units, i := 0, 0
	for i < len(ln) && units < p.Character {
		r, size := utf8.DecodeRuneInString(ln[i:])
		if r >= 0x10000 {
			units += 2
		} else {
			units++
		}
		i += size
	}
	return t.starts[p.Line] + i
}

// runeCol returns the 1-based rune column of protocol position p, as the
// engine's positions count.
func (t *text) runeCol(p position) int {
	off := t.offset(p)
	start := t.starts[min(max(p.Line, 0), len(t.starts)-1)]
	return utf8.RuneCountInString(t.src[start:off]) + 1
}

// fromDiag returns the protocol position of an engine position. It goes
// by line and rune column, as the user reads them in messages, not by
// byte offset: after an edit that changed only values, the lines of the
// old analysis still match the document (see document.go).
func (t *text) fromDiag(p diag.Pos) position {
	if !p.IsValid() {
		return position{}
	}
	li := p.Line - 1
	if li >= len(t.starts) {
		return t.position(len(t.src))
	}
	ln := t.line(li)
	if li == 0 {
		ln = strings.TrimPrefix(ln, "\uFEFF")
	}
	i, col := 0, 1
	for i < len(ln) && col < p.Col {
		_, size := utf8.DecodeRuneInString(ln[i:])
		i += size
		col++
	}
	return position{Line: li, Character: utf16Len(ln[:i])}
}

// rangeOf converts an engine range.
func (t *text) rangeOf(r diag.Range) lspRange {
	s := t.fromDiag(r.Start())
	e := s
	if r.End().IsValid() {
		e = t.fromDiag(r.End())
	}
	return lspRange{Start: s, End: e}
}

// lineEnd returns the position at the end of 0-based line i.
func (t *text) lineEnd(i int) position {
	return position{Line: i, Character: utf16Len(t.line(i))}
}

// uriToPath turns a file URI into a path; other URIs are kept as names.
func uriToPath(uri string) string {
	u, err := url.Parse(uri)
	if err != nil || u.Scheme != "file" {
		return uri
	}
	p := u.Path
	if len(p) >= 3 && p[0] == '/' && p[2] == ':' { // file:///C:/dir on Windows
		p = p[1:]
	}
	return filepath.FromSlash(p)
}

// pathToURI turns a path into a file URI.
func pathToURI(path string) string {
	if strings.Contains(path, "://") {
		return path
	}
	if abs, err := filepath.Abs(path); err == nil {
		path = abs
	}
	p := filepath.ToSlash(path)
	if !strings.HasPrefix(p, "/") {
		p = "/" + p
	}
	return (&url.URL{Scheme: "file", Path: p}).String()
}
