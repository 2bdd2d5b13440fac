package sheet

import (
	"strings"
)

// reserved are words that cannot name a cell, a parameter, a table, a
// column or a template: the item keywords, the built-in constants and
// literals, and the word operators of the expression syntax.
var reserved = map[string]bool{
	"check": true, "table": true, "use": true, "from": true, "action": true, "factor": true,
	"pi": true, "g_n": true, "true": true, "false": true,
	"and": true, "or": true, "not": true, "in": true, "nil": true, "let": true,
	"matches": true, "contains": true, "startsWith": true, "endsWith": true,
	"if": true, "else": true,
}

// readName reads a name at offset at on line li and checks it is not reserved.
// what says what the name is for ("cell", "check", ...).
//
//	name = letter { letter | digit | "_" } .
func (p *parser) readName(li, at int, what string) (Ident, bool) {
	ln := p.lines[li]
	e := identEnd(p.text, at, ln.end)
	if e == at {
		stop := at
		for stop < ln.end && p.text[stop] != ' ' && p.text[stop] != '\t' {
			stop++
		}
		if stop == at {
			stop = min(at+1, ln.end)
		}
		found := "the end of the line"
		if at < ln.end {
			found = "`" + clip(p.text[at:stop]) + "`"
		}
		p.errAt(p.rng(li, at, stop),
			"a "+what+" name starts with a letter or `_` and holds letters, digits and `_`",
			"e.g. `N_Ed`, `sigma`, `A_s2`",
			"expected a %s name, found %s", what, found)
		return Ident{}, false
	}
	id := Ident{Name: p.text[at:e], Range: p.rng(li, at, e)}
	if reserved[id.Name] {
		p.errAt(id.Range,
			"`"+id.Name+"` is a reserved word of the sheet language and cannot name a "+what,
			"choose another name, e.g. `"+id.Name+"_1`",
			"reserved word `%s` used as a %s name", id.Name, what)
		return id, false
	}
	return id, true
}

// unit reads "[ unit ]" at offset at (which holds "[") on line li and
// returns it with the offset after "]".
//
//	unit-spec = "[" unit-text "]" .
func (p *parser) unit(li, at int) (*UnitSpec, int, bool) {
	u, k, ok := p.unitValue(li, at)
	if !ok {
		return nil, k, false
	}
	return &u, k, true
}

// unitValue is unit without the allocation, for the unit of a cell, which
// is stored beside the cell.
func (p *parser) unitValue(li, at int) (UnitSpec, int, bool) {
	ln := p.lines[li]
	close := strings.IndexByte(p.text[at:ln.end], ']')
	if close < 0 {
		p.errAt(p.rng(li, at, at+1),
			"a unit is written in square brackets, e.g. `[kN]` or `[kN/m^2]`",
			"close the unit with `]`",
			"unclosed `[` in a unit")
		return UnitSpec{}, ln.end, false
	}
	close += at
	a, b := trimSpan(p.text, at+1, close)
	if a == b {
		p.errAt(p.rng(li, at, close+1),
			"the brackets after a name hold its display unit",
			"write a unit such as `[mm]`, or leave the brackets out for a plain number",
			"empty unit `[]`")
		return UnitSpec{}, close + 1, false
	}
	return UnitSpec{Text: p.text[a:b], Range: p.rng(li, a, b)}, close + 1, true
}

// parseDef reads a cell or (when funcs is true) a user function on lines
// [i, j), whose name starts at offset at.
//
//	cell    = name [ unit-spec ] "=" expression [ annotation ] .
//	funcdef = name "(" param { "," param } ")" [ unit-spec ] "=" expression [ annotation ] .
//	param   = name [ unit-spec ] .
func (p *parser) parseDef(i, j, at int, funcs bool) Item {
	ln := p.lines[i]
	t := p.text
	id, ok := p.readName(i, at, "cell")
	if id.Name == "" {
		return nil
	}
	k := skipSpace(t, at+len(id.Name), ln.end)
	var params []Param
	isFunc := false
	if k < ln.end && t[k] == '(' {
		if !funcs {
			p.errAt(p.rng(i, k, k+1),
				"a use block replaces the template's input cells; functions are defined in the template itself",
				"write `"+id.Name+" = value`",
				"function definition inside a use block")
			return nil
		}
		isFunc = true
		var pok bool
		params, k, pok = p.params(i, k)
		ok = ok && pok
		if !pok {
			return nil
		}
		k = skipSpace(t, k, ln.end)
	}
	var u UnitSpec
	hasUnit := false
	if k < ln.end && t[k] == '[' {
		var uok bool
		u, k, uok = p.unitValue(i, k)
		if !uok {
			return nil
		}
		hasUnit = true
		k = skipSpace(t, k, ln.end)
	}
	if !p.expectEquals(i, k, id) {
		return nil
	}
	body, annot, bok := p.body(i, j, k+1)
	if !ok || !bok {
		return nil
	}
	r := p.span(at, p.lines[j-1].end)
	if isFunc {
		fd := &FuncDef{Def: Def{Name: id, Annot: annot, Range: r}, Params: params, Body: body}
		if hasUnit {
			fu := u
			fd.Unit = &fu
		}
		return fd
	}
	a := p.newCell()
	a.c = Cell{Def: Def{Name: id, Annot: annot, Range: r}, Expr: body}
	if hasUnit {
		a.u = u
		a.c.Unit = &a.u
	}
	return &a.c
}

// expectEquals checks that offset k on line i holds the defining "=" and
// explains the usual slips when it does not.
func (p *parser) expectEquals(i, k int, id Ident) bool {
	ln := p.lines[i]
	t := p.text
	rest := t[k:ln.end]
	switch {
	case strings.HasPrefix(rest, "=="):
		p.errAt(p.rng(i, k, k+2), "a cell is defined with a single `=`", "write `"+id.Name+" = ...`; comparisons belong in a check: `check name: a <= b`",
			"`==` after `%s`", id.Name)
	case strings.HasPrefix(rest, "="):
		return true
	case strings.HasPrefix(rest, ":="):
		p.errAt(p.rng(i, k, k+2), "a cell is defined with `=`", "write `=` instead of `:=`",
			"`:=` is not a definition")
	case rest == "" || strings.HasPrefix(rest, "--"):
		p.errAt(p.rng(i, int(id.Range.From), k), "a cell gives its value after `=`: `"+id.Name+" = expression`",
			"give the cell a value, e.g. `"+id.Name+" = 38 kN`",
			"missing `=` after `%s`", id.Name)
	default:
		stop := k
		for stop < ln.end && t[stop] != ' ' && t[stop] != '\t' && t[stop] != '=' {
			stop++
		}
		stop = max(stop, k+1)
		hint := "write `" + id.Name + " = expression`"
		if eq := strings.IndexByte(rest, '='); eq > 0 && identEnd(t, k, ln.end) > k {
			hint = "write the display unit in brackets: `" + id.Name + " [" + trimText(t[k:k+eq]) + "] = ...`"
		}
		p.errAt(p.rng(i, k, stop), "expected `=` or a `[unit]` after the name `"+id.Name+"`", hint,
			"unexpected `%s` after `%s`", clip(t[k:stop]), id.Name)
	}
	return false
}

// params reads a parameter list at offset at (which holds "(").
func (p *parser) params(i, at int) ([]Param, int, bool) {
	ln := p.lines[i]
	t := p.text
	var params []Param
	k := skipSpace(t, at+1, ln.end)
	if k < ln.end && t[k] == ')' {
		p.errAt(p.rng(i, at, k+1), "a function takes at least one parameter",
			"for a value without parameters write a cell: `name = expression`",
			"function without parameters")
		return nil, k + 1, false
	}
	seen := map[string]bool{}
	for {
		id, ok := p.readName(i, k, "parameter")
		if !ok {
			return nil, k, false
		}
		if seen[id.Name] {
			p.errAt(id.Range, "each parameter of a function needs its own name", "rename one of them",
				"duplicate parameter `%s`", id.Name)
			return nil, k, false
		}
		seen[id.Name] = true
		prm := Param{Name: id}
		k = skipSpace(t, k+len(id.Name), ln.end)
		if k < ln.end && t[k] == '[' {
			var uok bool
			prm.Unit, k, uok = p.unit(i, k)
			if !uok {
				return nil, k, false
			}
			k = skipSpace(t, k, ln.end)
		}
		params = append(params, prm)
		if k < ln.end && t[k] == ',' {
			k = skipSpace(t, k+1, ln.end)
			continue
		}
		if k < ln.end && t[k] == ')' {
			return params, k + 1, true
		}
		if k >= ln.end {
			p.errAt(p.rng(i, at, at+1), "the parameter list of a function is closed on its first line",
				"close the list with `)`: `f(a [m], b [m]) = ...`", "unclosed `(` in a parameter list")
		} else {
			p.errAt(p.rng(i, k, k+1), "parameters are `name [unit]`, separated by commas, in one pair of parentheses",
				"e.g. `stress(N [kN], A [mm^2]) [MPa] = N / A`",
				"expected `,` or `)` in the parameter list, found `%s`", clip(t[k:k+1]))
		}
		return nil, k, false
	}
}

// parseCheck reads a design check on lines [i, j).
//
//	check = "check" name [ "in" limit-state ] ":" expression [ annotation ] .
func (p *parser) parseCheck(i, j int) Item {
	ln := p.lines[i]
	t := p.text
	k := skipSpace(t, ln.start+len("check"), ln.end)
	id, ok := p.readName(i, k, "check")
	if id.Name == "" {
		return nil
	}
	k = skipSpace(t, k+len(id.Name), ln.end)
	state, k, sok := p.checkState(i, k)
	if !sok {
		return nil
	}
	if k >= ln.end || t[k] != ':' {
		found := "the end of the line"
		if k < ln.end {
			found = "`" + clip(t[k:k+1]) + "`"
		}
		p.errAt(p.rng(i, k, min(k+1, ln.end)), "a check names itself, then a colon, then the comparison",
			"write `check "+id.Name+": demand <= capacity`",
			"expected `:` after `check %s`, found %s", id.Name, found)
		return nil
	}
	body, annot, bok := p.body(i, j, k+1)
	if !ok || !bok {
		return nil
	}
	return &Check{Def: Def{Name: id, Annot: annot, Range: p.span(ln.start, p.lines[j-1].end)}, State: state, Body: body}
}

// body reads an expression that starts at offset from on line i and runs
// over lines [i, j), and the annotation that ends it.
//
//	expression = text up to an annotation, brackets balanced, strings closed .
//	annotation = "--" [ description ] [ " @ " reference ] .
func (p *parser) body(i, j, from int) (Expr, *Annot, bool) {
	t := p.text
	annotAt, annotLine := -1, -1
	var found lineScan
	if j == i+1 && p.first.line == i && p.first.from == from {
		found = p.first // extent scanned this line from here already
		if found.annot >= 0 {
			annotAt, annotLine = found.annot, i
		}
	} else {
		sc := p.scanner()
		for li := i; li < j; li++ {
			s := p.lines[li].start
			if li == i {
				s = from
			}
			if a := sc.scan(t, s, p.lines[li].end); a >= 0 {
				annotAt, annotLine = a, li
				break
			}
		}
		found = sc.result(i, from, annotAt)
		p.keepScanner(&sc)
	}
	if found.unclosed > 0 {
		o := found.unclosed - 1
		oli := p.lineOf(o, i, j)
		p.errAt(p.rng(oli, o, p.lines[oli].end), "a string starts and ends on one line; this one has no closing quote",
			"close the string with `"+t[o:o+1]+"` on the same line",
			"unterminated string")
		return Expr{}, nil, false
	}
	if found.open >= 0 {
		o := found.open
		oli := p.lineOf(o, i, j)
		closer := map[byte]string{'(': ")", '[': "]", '{': "}"}[t[o]]
		p.errAt(p.rng(oli, o, o+1), "every bracket opened in an expression must be closed; a blank line or the end of the file ended this one",
			"close it with `"+closer+"`",
			"unclosed `%c`", t[o])
		return Expr{}, nil, false
	}
	end := p.lines[j-1].end
	if annotLine >= 0 {
		end = annotAt
		if annotLine < j-1 {
			l := p.lines[annotLine+1]
			p.errAt(p.rng(annotLine+1, l.start+int(l.indent), l.end),
				"the annotation `-- description @ reference` ends an item; nothing of the expression may follow it",
				"move the annotation to the end of the expression's last line",
				"expression continues after its annotation")
			return Expr{}, nil, false
		}
	}
	a, b := trimSpan(t, from, end)
	if a == b {
		at := min(from, p.lines[i].end)
		p.errAt(p.rng(i, max(at-1, p.lines[i].start), at), "a value or formula must follow `=` (or the colon of a check)",
			"write e.g. `P = 38 kN` or `sigma [MPa] = N / A`",
			"empty expression")
		return Expr{}, nil, false
	}
	e := Expr{Text: t[a:b], Range: p.span(a, b)}
	var an *Annot
	if annotLine >= 0 {
		an = p.annot(annotLine, annotAt)
	}
	return e, an, true
}

// lineOf returns the index of the line in [i, j) that holds offset off.
func (p *parser) lineOf(off, i, j int) int {
	for li := i; li < j; li++ {
		if off <= p.lines[li].end {
			return li
		}
	}
	return j - 1
}

// annot reads the annotation that starts with "--" at offset at on line li.
// The description and the reference are split at the first "@" that stands
// alone (spaces or tabs, or the ends of the annotation, on both sides), so
// that an address such as `a@b` stays in the description.
func (p *parser) annot(li, at int) *Annot {
	ln := p.lines[li]
	raw := p.text[at+2 : ln.end]
	desc, ref := trimText(raw), ""
	for k := 0; k < len(raw); k++ {
		if raw[k] == '@' && (k == 0 || raw[k-1] == ' ' || raw[k-1] == '\t') &&
			(k+1 == len(raw) || raw[k+1] == ' ' || raw[k+1] == '\t') {
			desc, ref = trimText(raw[:k]), trimText(raw[k+1:])
			break
		}
	}
	a := p.annots.One()
	*a = Annot{Description: desc, Reference: ref, Range: p.rng(li, at, ln.end)}
	return a
}
