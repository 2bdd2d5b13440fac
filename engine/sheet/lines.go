package sheet

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// line is one physical line of the source: text[start:end] is its content
// without the line break ("\n" or "\r\n").
type line struct {
	start, end int
	indent     int32 // bytes of leading spaces and tabs
	blank      bool  // only spaces and tabs (or unreadable, see bad)
	bad        bool  // holds invalid UTF-8 or a control character
}

// splitLines cuts text into lines, starting at offset from (past a BOM). It
// reports invalid UTF-8 and control characters, one per line, and marks such
// lines blank so that they end the item above instead of corrupting it.
func (p *parser) splitLines(from int) {
	text := p.text
	p.lines = make([]line, 0, strings.Count(text[from:], "\n")+1)
	start := from
	for start < len(text) {
		end := len(text)
		if k := strings.IndexByte(text[start:], '\n'); k >= 0 {
			end = start + k
		}
		next := end + 1
		if end > start && text[end-1] == '\r' {
			end--
		}
		if len(p.lines) >= p.cfg.maxLines {
			p.errorf(start, start,
				fmt.Sprintf("a sheet may hold at most %d lines; the rest of the file is not read", p.cfg.maxLines),
				"split the calculation into sheets that use one another, or raise the limit (MaxLines)",
				"too many lines")
			break
		}
		ln := line{start: start, end: end}
		p.lines = append(p.lines, ln)
		p.scanLine(&p.lines[len(p.lines)-1])
		start = next
	}
}

// scanLine measures indentation and checks the line's characters.
func (p *parser) scanLine(ln *line) {
	text := p.text
	i := ln.start
	for i < ln.end && (text[i] == ' ' || text[i] == '\t') {
		i++
	}
	ln.indent = int32(i - ln.start)
	ln.blank = i == ln.end
	for j := i; j < ln.end; {
		c := text[j]
		if c >= 0x20 && c < 0x7f {
			j++
			continue
		}
		if c == '\t' {
			j++
			continue
		}
		r, size := utf8.DecodeRuneInString(text[j:ln.end])
		if r == utf8.RuneError && size <= 1 {
			p.errorf(j, j+1,
				fmt.Sprintf("byte 0x%02x does not start a UTF-8 character", c),
				"save the sheet as UTF-8 text",
				"invalid UTF-8")
			ln.bad, ln.blank = true, true
			return
		}
		if name, ok := diag.BidiControl(r); ok {
			p.errorf(j, j+size,
				fmt.Sprintf("U+%04X %s changes the order in which the text around it is shown, so a line can read differently from what Sheaf reads", r, name),
				"delete the character (it may have come from a copy and paste); write right-to-left text without direction controls",
				"direction control U+%04X in the sheet", r)
			ln.bad, ln.blank = true, true
			return
		}
		if unicode.IsControl(r) || r == '\uFEFF' {
			p.errorf(j, j+size,
				fmt.Sprintf("a sheet holds printable text, spaces, tabs and line breaks; U+%04X is none of these", r),
				"delete the character (it may have come from a copy and paste)",
				"unexpected control character U+%04X", r)
			ln.bad, ln.blank = true, true
			return
		}
		j += size
	}
}

// rng is the range of bytes [from, to) on line li (from is kept on the
// line).
func (p *parser) rng(li, from, to int) diag.Range {
	from = max(from, p.lines[li].start)
	return p.src.Span(from, max(to, from))
}

// span is the range of bytes [from, to) of the file.
func (p *parser) span(from, to int) diag.Range { return p.src.Span(from, to) }

// errorf records a syntax error over bytes [from, to).
func (p *parser) errorf(from, to int, detail, hint, format string, args ...any) {
	p.diags.Errorf(p.src.Span(from, to), detail, hint, format, args...)
}

// errAt records a syntax error over a range.
func (p *parser) errAt(r diag.Range, detail, hint, format string, args ...any) {
	p.diags.Errorf(r, detail, hint, format, args...)
}
