package sheet

import (
	"fmt"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/block"
)

// parser holds the state of one Parse call.
type parser struct {
	name     string
	src      *diag.Source
	cfg      config
	text     string
	bom      int
	lines    []line
	diags    diag.List
	file     *File
	inHeader bool
	seenMeta map[string]diag.Range
	// cells hands out the cells of the sheet (see alloc.go).
	cells block.Block[cellUnit]
	// annots hands out the annotations.
	annots block.Block[Annot]
	// open is the bracket stack the scanners of all items share, so
	// that a sheet grows one, not one per line that opens a bracket.
	open []int
	// first is what extent's scanner found on the first line of the last
	// item it measured (see lineScan).
	first lineScan
}

// lineScan is what a fresh bracketScanner finds on line `line` from offset
// from to the line's end. It depends on nothing else, so body, reading an
// item of one line from the same offset, takes it from extent instead of
// scanning the line a second time.
type lineScan struct {
	line, from int
	annot      int // offset of the "--" that starts an annotation, or -1
	unclosed   int // as bracketScanner.unclosed
	open       int // offset of the outermost bracket left open, or -1
}

// result is what sc found, as a lineScan of line li from from.
func (sc *bracketScanner) result(li, from, annot int) lineScan {
	open := -1
	if len(sc.open) > 0 {
		open = sc.open[0]
	}
	return lineScan{line: li, from: from, annot: annot, unclosed: sc.unclosed, open: open}
}

// scanner returns a bracketScanner on the parser's bracket stack.
func (p *parser) scanner() bracketScanner { return bracketScanner{open: p.open[:0]} }

// keepScanner keeps the stack sc grew for the next item.
func (p *parser) keepScanner(sc *bracketScanner) { p.open = sc.open[:0] }

// Parse reads a whole sheet.
//
//	sheet = { line } .
//	line  = item-start { continuation } | blank .
//
// It reports every syntax problem it finds (sorted, one per line) and always
// returns a *File holding the items it could read, so that later phases can
// go on and report their own problems too. It never panics on any input.
// A UTF-8 byte order mark and CRLF line breaks are accepted.
func Parse(name string, src []byte, opts ...Option) (*File, diag.List) {
	p := &parser{first: lineScan{line: -1}, name: name, cfg: newConfig(opts), file: &File{Name: name, Src: src}, inHeader: true,
		cells: block.Block[cellUnit]{Min: 8, Max: 256}, annots: block.Block[Annot]{Min: 8, Max: 256}}
	if len(src) > p.cfg.maxBytes {
		p.src = diag.NewSource(name, "")
		p.file.Source = p.src
		p.errorf(0, 0,
			fmt.Sprintf("the file is %d bytes; a sheet may be at most %d bytes", len(src), p.cfg.maxBytes),
			"split the calculation into sheets that use one another, or raise the limit (MaxBytes)",
			"sheet too large")
		p.file.Syntax = p.diags
		return p.file, p.diags
	}
	p.text = string(src)
	p.src = diag.NewSource(name, p.text)
	p.file.Source = p.src
	if strings.HasPrefix(p.text, "\uFEFF") {
		p.bom = len("\uFEFF")
	}
	p.splitLines(p.bom)
	p.file.Items = make([]Item, 0, len(p.lines))
	p.parseItems()
	p.diags.Sort()
	p.file.Syntax = p.diags
	return p.file, p.diags
}

func (p *parser) add(it Item) {
	if it != nil {
		p.file.Items = append(p.file.Items, it)
	}
}

// parseItems walks the lines, one item at a time.
//
//	item-start   = a line that starts in column 1 .
//	continuation = an indented line, or any line while ( [ { are open .
//	blank        = a line of spaces and tabs only .
func (p *parser) parseItems() {
	for i := 0; i < len(p.lines); {
		ln := p.lines[i]
		if ln.blank {
			if !ln.bad {
				p.add(&Blank{Range: p.rng(i, ln.start, ln.end)})
			}
			i++
			continue
		}
		if ln.indent > 0 {
			j := p.extent(i, len(p.lines), 0, -1)
			for j < len(p.lines) && !p.lines[j].blank && p.lines[j].indent > 0 {
				j++
			}
			at := ln.start + int(ln.indent)
			p.errAt(p.rng(i, at, ln.end),
				"an indented line continues the item above it, and there is none here",
				"start the line in column 1, or join it to the item it belongs to",
				"indented line with nothing to continue")
			i = j
			continue
		}
		i = p.parseItem(i)
	}
}

// extent returns the end (exclusive) of the item starting at line i: the
// lines after it that are indented deeper than base, or that follow while a
// bracket is open, up to limit. A blank line always ends an item. track is
// the offset on line i from which brackets count, or -1.
func (p *parser) extent(i, limit, base, track int) int {
	sc := p.scanner()
	defer p.keepScanner(&sc)
	if track >= 0 {
		a := sc.scan(p.text, track, p.lines[i].end)
		p.first = sc.result(i, track, a)
	}
	j := i + 1
	for j < limit {
		l := p.lines[j]
		if l.blank || int(l.indent) <= base && len(sc.open) == 0 {
			break
		}
		if track >= 0 {
			sc.scan(p.text, l.start, l.end)
		}
		j++
	}
	return j
}

// parseItem reads the item that starts at line i and returns the line after it.
//
//	item = heading | comment | meta | cell | funcdef | check | table | use .
func (p *parser) parseItem(i int) int {
	ln := p.lines[i]
	t := p.text
	start, end := ln.start, ln.end
	switch {
	case strings.HasPrefix(t[start:end], "##"):
		p.endHeader()
		p.add(p.parseHeading(i))
		return p.singleLine(i, "a heading")
	case t[start] == '#':
		p.add(p.parseComment(i))
		return p.singleLine(i, "a comment")
	case t[start] == '=':
		p.endHeader()
		j := p.extent(i, len(p.lines), 0, start+1)
		p.errAt(p.rng(i, start, start+1),
			"a cell starts with its name: `name = expression`",
			"name the value, e.g. `P = 38 kN`; formulas do not start with `=`",
			"line starts with `=`")
		return j
	}
	nameEnd := identEnd(t, start, end)
	if nameEnd == start {
		p.endHeader()
		j := p.extent(i, len(p.lines), 0, headSplit(t, start, end))
		p.unexpected(i, start)
		return j
	}
	word := t[start:nameEnd]
	next := skipSpace(t, nameEnd, end)
	var c byte
	if next < end {
		c = t[next]
	}
	if keyword(word) && c != '=' && c != '[' && c != '(' {
		p.endHeader()
		switch word {
		case "check":
			j := p.extent(i, len(p.lines), 0, headSplit(t, start, end))
			p.add(p.parseCheck(i, j))
			return j
		case "table":
			j := p.extent(i, len(p.lines), 0, -1)
			p.add(p.parseTable(i, j))
			return j
		case "action":
			j := p.extent(i, len(p.lines), 0, headSplit(t, start, end))
			p.add(p.parseAction(i, j))
			return j
		case "factor":
			p.add(p.parseFactor(i))
			return p.singleLine(i, "a factor line")
		default:
			j := p.extent(i, len(p.lines), 0, -1)
			p.add(p.parseUse(i, j))
			return j
		}
	}
	if c == ':' && !strings.HasPrefix(t[next:end], ":=") {
		p.add(p.parseMeta(i, nameEnd, next))
		return p.singleLine(i, "a header line")
	}
	p.endHeader()
	j := p.extent(i, len(p.lines), 0, headSplit(t, start, end))
	p.add(p.parseDef(i, j, start, true))
	return j
}

// keyword reports whether word starts a check, table, use, action or
// factor item.
func keyword(word string) bool {
	switch word {
	case "check", "table", "use", "action", "factor":
		return true
	}
	return false
}

// endHeader notes that the header (meta lines) is over.
func (p *parser) endHeader() { p.inHeader = false }

// singleLine reports indented lines under a one-line item (they would be
// silently dropped otherwise) and returns the line after them.
func (p *parser) singleLine(i int, what string) int {
	j := p.extent(i, len(p.lines), 0, -1)
	if j > i+1 {
		l := p.lines[i+1]
		p.errAt(p.rng(i+1, l.start+int(l.indent), l.end),
			what+" is one line; an indented line below it has nothing to continue",
			"start the line in column 1 (begin it with `#` if it is a comment)",
			"indented line after %s", what)
	}
	return j
}

// unexpected reports a line that fits no rule, with a hint for common slips.
func (p *parser) unexpected(i, at int) {
	ln := p.lines[i]
	t := p.text
	stop := at
	for stop < ln.end && t[stop] != ' ' && t[stop] != '\t' {
		stop++
	}
	if stop == at {
		stop = at + 1
	}
	hint := "a cell is `name = expression`; names start with a letter or `_`"
	if c := t[at]; '0' <= c && c <= '9' {
		hint = "names cannot start with a digit; write e.g. `n_" + t[at:identEndLoose(t, at, ln.end)] + "`"
	}
	p.errAt(p.rng(i, at, stop), expectedItem, hint, "unexpected `%s`", clip(t[at:stop]))
}

// expectedItem lists what may start a line.
const expectedItem = "expected `name = expression`, `name [unit] = expression`, `check name: ...`, " +
	"`table name`, `use name from \"file\"`, `action kind name = value`, `factor key = number`, " +
	"a `#` comment or a `## heading`"

// identEndLoose is identEnd that accepts a leading digit (for hints).
func identEndLoose(t string, i, end int) int {
	j := i
	for j < end && ('0' <= t[j] && t[j] <= '9') {
		j++
	}
	return identEnd(t, j, end)
}

// clip shortens s for a summary line.
func clip(s string) string {
	if len(s) <= 24 {
		return s
	}
	n := 0
	for i := range s {
		if n == 20 {
			return s[:i] + "..."
		}
		n++
	}
	return s
}
