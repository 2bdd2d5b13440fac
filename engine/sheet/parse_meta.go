package sheet

import (
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// metaKeys are the header keys, in their canonical order of mention.
var metaKeys = []string{"title", "project", "basis", "author", "checker", "date", "revision", "units", "combinations"}

func isMetaKey(k string) bool {
	for _, m := range metaKeys {
		if m == k {
			return true
		}
	}
	return false
}

// parseHeading reads a section heading.
//
//	heading = "##" text .
func (p *parser) parseHeading(i int) Item {
	ln := p.lines[i]
	a, b := trimSpan(p.text, ln.start+2, ln.end)
	return &Heading{Text: p.text[a:b], Range: p.rng(i, ln.start, ln.end)}
}

// parseComment reads a full-line comment; its text is kept as written
// (trailing spaces dropped).
//
//	comment = "#" text .
func (p *parser) parseComment(i int) Item {
	ln := p.lines[i]
	b := ln.end
	for b > ln.start+1 && (p.text[b-1] == ' ' || p.text[b-1] == '\t') {
		b--
	}
	return &Comment{Text: p.text[ln.start+1 : b], Range: p.rng(i, ln.start, ln.end)}
}

// parseMeta reads a header line; colon is the offset of its ":".
//
//	meta = key ":" text .
//	key  = "title" | "project" | "basis" | "author" | "checker" | "date" | "revision" | "units" .
//
// Header lines come before the first cell, check, table, use or heading;
// comments and blank lines may mix with them.
func (p *parser) parseMeta(i, keyEnd, colon int) Item {
	ln := p.lines[i]
	t := p.text
	key := t[ln.start:keyEnd]
	keyRange := p.rng(i, ln.start, keyEnd)
	known := isMetaKey(key)
	if !p.inHeader {
		if known {
			p.errAt(keyRange,
				"header lines such as `"+key+":` describe the whole sheet and come before its first cell or heading",
				"move the line to the top of the sheet",
				"header line `%s:` after the first item", key)
		} else {
			p.errAt(p.rng(i, colon, colon+1),
				"a cell is defined with `=`: `"+key+" = expression`; `name:` is used only by header lines and checks",
				"write `"+key+" = ...`, or `check "+key+": demand <= capacity` for a design check",
				"unexpected `:` after `%s`", key)
		}
		return nil
	}
	if !known {
		hint := "header keys are " + strings.Join(metaKeys, ", ") + "; to define a cell write `" + key + " = ...`"
		if s := diag.Nearest(key, metaKeys); s != "" {
			hint = "did you mean `" + s + ":`?"
		}
		p.errAt(keyRange, "expected one of the header keys "+strings.Join(metaKeys, ", "), hint,
			"unknown header key `%s`", key)
		return nil
	}
	a, b := trimSpan(t, colon+1, ln.end)
	value := t[a:b]
	if prev, dup := p.seenMeta[key]; dup {
		p.errAt(keyRange,
			"`"+key+":` is already given at line "+strconv.Itoa(prev.Start().Line),
			"keep one `"+key+":` line",
			"duplicate header key `%s`", key)
		return nil
	}
	if p.seenMeta == nil {
		p.seenMeta = map[string]diag.Range{}
	}
	p.seenMeta[key] = keyRange
	if value == "" {
		p.errAt(keyRange, "a header line gives a value after its key", "write e.g. `"+key+": ...` with text after the colon, or delete the line",
			"empty value for `%s:`", key)
		return nil
	}
	if key == "units" && value != "metric" && value != "us" {
		p.errAt(p.rng(i, a, b), "`units:` chooses the preferred display system: `metric` or `us`",
			"write `units: metric` or `units: us`",
			"unknown unit system `%s`", clip(value))
		return nil
	}
	return &Meta{Key: Ident{Name: key, Range: keyRange}, Value: value, Range: p.rng(i, ln.start, ln.end)}
}
