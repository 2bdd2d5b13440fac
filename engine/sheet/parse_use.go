package sheet

import (
	"strings"
)

// parseUse reads a template use on lines [i, j).
//
//	use      = "use" name "from" path [ annotation ] newline { override } .
//	path     = '"' { char } '"' .
//	override = indent cell .
//
// An override line starts a new cell; a line indented deeper than it (or
// inside open brackets) continues it.
func (p *parser) parseUse(i, j int) Item {
	ln := p.lines[i]
	t := p.text
	k := skipSpace(t, ln.start+len("use"), ln.end)
	id, ok := p.readName(i, k, "template")
	if id.Name == "" {
		return nil
	}
	u := &Use{Name: id, Range: p.span(ln.start, p.lines[j-1].end)}
	k = skipSpace(t, k+len(id.Name), ln.end)
	if e := identEnd(t, k, ln.end); t[k:e] != "from" {
		p.errAt(p.rng(i, k, max(e, min(k+1, ln.end))), "a use line names the template, then `from` and the file in double quotes",
			"write `use "+id.Name+" from \"hanger.sheaf\"`",
			"expected `from` after `use %s`", id.Name)
		return nil
	}
	k = skipSpace(t, k+len("from"), ln.end)
	if k >= ln.end || t[k] != '"' {
		p.errAt(p.rng(i, k, min(k+1, ln.end)), "the template's file is written in double quotes, relative to this sheet",
			"write `use "+id.Name+" from \"file.sheaf\"`",
			"expected a quoted file name after `from`")
		return nil
	}
	q := strings.IndexByte(t[k+1:ln.end], '"')
	if q < 0 {
		p.errAt(p.rng(i, k, ln.end), "the file name has no closing quote", "close it with `\"`", "unterminated file name")
		return nil
	}
	u.Path = t[k+1 : k+1+q]
	u.PathRange = p.rng(i, k+1, k+1+q)
	if u.Path == "" {
		p.errAt(p.rng(i, k, k+2), "a use line needs the template's file", "write e.g. `\"hanger.sheaf\"`", "empty file name")
		ok = false
	}
	k = skipSpace(t, k+2+q, ln.end)
	switch {
	case k >= ln.end:
	case k+1 < ln.end && t[k] == '-' && t[k+1] == '-':
		u.Annot = p.annot(i, k)
	default:
		p.errAt(p.rng(i, k, ln.end), "after the file name a use line may hold only `-- description @ reference`",
			"put each override on its own indented line below, e.g. `    P = 45 kN`",
			"unexpected `%s` after the file name", clip(t[k:ln.end]))
		ok = false
	}
	for li := i + 1; li < j; {
		l := p.lines[li]
		at := l.start + int(l.indent)
		e := p.extent(li, j, int(l.indent), headSplit(t, at, l.end))
		if identEnd(t, at, l.end) == at {
			p.errAt(p.rng(li, at, l.end), "a use block holds indented cells that replace inputs of the template",
				"write e.g. `    P = 45 kN`", "expected an override `name = expression`")
			ok = false
		} else if c, _ := p.parseDef(li, e, at, false).(*Cell); c != nil {
			u.Overrides = append(u.Overrides, c)
		} else {
			ok = false
		}
		li = e
	}
	if !ok {
		return nil
	}
	return u
}
