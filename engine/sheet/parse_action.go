package sheet

import (
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// Action is "action kind name [unit] = expression -- description @ reference":
// a load or other action with its characteristic value. Cell holds the name,
// unit, expression and annotation as for a cell (its Range starts at the
// name); Range is the whole item.
type Action struct {
	Kind  ActionKind
	Cell  Cell
	Range diag.Range
}

// ActionKind is the kind of an action as written: its class and, for an
// imposed action, the category of use; for a snow action whether the site
// is high; for a permanent action whether a favourable part is considered.
type ActionKind struct {
	Class      string // "permanent", "imposed", "snow", "wind", "thermal", "accidental"
	Category   string // imposed: "A" … "H", or "" when not written; otherwise ""
	High       bool   // snow: a site above 1000 m (EN 1990 Table A1.1)
	Favourable bool   // permanent: also taken with its favourable factor
	Range      diag.Range
}

// Text writes the kind as the sheet writes it: "imposed B", "permanent favourable".
func (k ActionKind) Text() string {
	s := k.Class
	if k.Category != "" {
		s += " " + k.Category
	}
	if k.High {
		s += " high"
	}
	if k.Favourable {
		s += " favourable"
	}
	return s
}

// Factor is "factor key = number -- description @ reference": a partial or
// combination factor of the sheet's combination rules replaced, for a
// national annex or a client's brief. Key is the words before "=", joined
// by single spaces.
type Factor struct {
	Key      string
	KeyRange diag.Range
	Value    Literal
	Annot    *Annot // nil when none is written
	Range    diag.Range
}

// Span returns the range of the action, continuation lines included.
func (a *Action) Span() diag.Range { return a.Range }

// Span returns the range of the factor line.
func (f *Factor) Span() diag.Range { return f.Range }

// actionClasses are the first words of an action's kind.
var actionClasses = []string{"permanent", "imposed", "snow", "wind", "thermal", "accidental"}

// LimitStates are the words a check may name after `in`.
var LimitStates = []string{"uls", "equ", "characteristic", "frequent", "quasi-permanent", "accidental"}

// parseAction reads an action on lines [i, j).
//
//	action   = "action" kind name [ unit-spec ] "=" expression [ annotation ] .
//	kind     = "permanent" [ "favourable" ] | "imposed" [ category ] | "snow" [ "high" ]
//	         | "wind" | "thermal" | "accidental" .
//	category = "A" | "B" | "C" | "D" | "E" | "F" | "G" | "H" .
func (p *parser) parseAction(i, j int) Item {
	ln := p.lines[i]
	t := p.text
	k := skipSpace(t, ln.start+len("action"), ln.end)
	// The words up to `[` or `=`: all but the last are the kind, the last
	// is the name.
	type word struct{ from, to int }
	var words []word
	for k < ln.end {
		e := identEnd(t, k, ln.end)
		if e == k {
			break
		}
		words = append(words, word{k, e})
		k = skipSpace(t, e, ln.end)
	}
	if len(words) < 2 {
		at := k
		if len(words) == 1 {
			at = words[0].from
		}
		p.errAt(p.rng(i, at, max(min(at+1, ln.end), k)),
			"an action gives its kind, then its name: `action permanent G [kN] = 12 kN`",
			"kinds are `permanent`, `permanent favourable`, `imposed`, `imposed A` … `imposed H`, `snow`, `snow high`, `wind`, `thermal`, `accidental`",
			"expected the kind and the name of the action")
		return nil
	}
	nameAt := words[len(words)-1].from
	if k < ln.end && t[k] == '(' {
		p.errAt(p.rng(i, k, k+1), "an action is a value, not a function",
			"write `action "+t[words[0].from:words[len(words)-1].to]+" = value`",
			"`(` after the name of an action")
		return nil
	}
	kind, kok := p.actionKind(i, t, words[0].from, nameAt)
	it := p.parseDef(i, j, nameAt, false)
	c, ok := it.(*Cell)
	if !ok || !kok {
		return nil
	}
	return &Action{Kind: kind, Cell: *c, Range: p.span(ln.start, int(c.Range.To))}
}

// actionKind reads the kind words in [from, to) of line i.
func (p *parser) actionKind(i int, t string, from, to int) (ActionKind, bool) {
	a, b := trimSpan(t, from, to)
	k := ActionKind{Range: p.rng(i, a, b)}
	ws := strings.Fields(t[a:b])
	bad := func(w, detail, hint string) (ActionKind, bool) {
		at := a + strings.Index(t[a:b], w)
		p.errAt(p.rng(i, at, at+len(w)), detail, hint, "unexpected `%s` in the kind of an action", clip(w))
		return k, false
	}
	k.Class = ws[0]
	rest := ws[1:]
	switch k.Class {
	case "permanent":
		if len(rest) > 0 && rest[0] == "favourable" {
			k.Favourable, rest = true, rest[1:]
		}
	case "imposed":
		if len(rest) > 0 && len(rest[0]) == 1 && rest[0][0] >= 'A' && rest[0][0] <= 'Z' {
			if rest[0][0] > 'H' {
				return bad(rest[0], "an imposed action's category of use is A to H (EN 1990 Table A1.1): `imposed B` for offices, `imposed H` for roofs",
					"write e.g. `action imposed B Q [kN] = 6 kN`")
			}
			k.Category, rest = rest[0], rest[1:]
		}
	case "snow":
		if len(rest) > 0 && rest[0] == "high" {
			k.High, rest = true, rest[1:]
		}
	case "wind", "thermal", "accidental":
	default:
		hint := "kinds are permanent, imposed A … H, snow, wind, thermal, accidental"
		if s := diag.Nearest(k.Class, actionClasses); s != "" {
			hint = "did you mean `" + s + "`?"
		}
		return bad(k.Class, "an action's kind starts with one of "+strings.Join(actionClasses, ", "), hint)
	}
	if len(rest) > 0 {
		hint := "the kind is one of `permanent`, `permanent favourable`, `imposed B`, `snow`, `snow high`, `wind`, `thermal`, `accidental`; the name follows it"
		return bad(rest[0], "after `"+k.Class+"` the next word is the action's name, and only one name is written", hint)
	}
	return k, true
}

// parseFactor reads a factor line i.
//
//	factor = "factor" key "=" number [ annotation ] .
//	key    = word { word } .
func (p *parser) parseFactor(i int) Item {
	ln := p.lines[i]
	t := p.text
	k := skipSpace(t, ln.start+len("factor"), ln.end)
	eq := strings.IndexByte(t[k:ln.end], '=')
	if eq < 0 {
		p.errAt(p.rng(i, k, ln.end), "a factor line names the factor, then `=` and its value",
			"write e.g. `factor psi_0 snow = 0.6 -- @ national annex`", "missing `=` in a factor line")
		return nil
	}
	a, b := trimSpan(t, k, k+eq)
	if a == b {
		p.errAt(p.rng(i, k, k+eq+1), "a factor line names the factor before `=`",
			"write e.g. `factor gamma_Q = 1.5`", "factor without a name")
		return nil
	}
	f := &Factor{Key: strings.Join(strings.Fields(t[a:b]), " "), KeyRange: p.rng(i, a, b), Range: p.rng(i, ln.start, ln.end)}
	v := skipSpace(t, k+eq+1, ln.end)
	end := ln.end
	if an := strings.Index(t[v:ln.end], "--"); an >= 0 {
		end = v + an
		f.Annot = p.annot(i, end)
	}
	va, vb := trimSpan(t, v, end)
	if va == vb || !isNumber(t[va:vb]) || strings.HasPrefix(t[va:vb], "+") {
		found := "nothing"
		if va < vb {
			found = "`" + clip(t[va:vb]) + "`"
		}
		p.errAt(p.rng(i, va, max(vb, min(va+1, ln.end))), "a factor is a plain number such as `1.35` or `0.7`",
			"write the number itself; a factor is not a formula", "expected a number after `factor %s =`, found %s", f.Key, found)
		return nil
	}
	f.Value = Literal{Text: t[va:vb], Range: p.rng(i, va, vb)}
	return f
}

// checkState reads the limit state of a check, "in word", at offset k on
// line i, and returns it with the offset after it. A check that writes none
// belongs to the default one (Name "").
//
//	check = "check" name [ "in" limit-state ] ":" expression [ annotation ] .
func (p *parser) checkState(i, k int) (Ident, int, bool) {
	ln := p.lines[i]
	t := p.text
	if e := identEnd(t, k, ln.end); t[k:e] != "in" {
		return Ident{}, k, true
	}
	s := skipSpace(t, k+2, ln.end)
	e := s
	for e < ln.end && t[e] != ':' && t[e] != ' ' && t[e] != '\t' {
		e++
	}
	w := t[s:e]
	for _, ls := range LimitStates {
		if w == ls {
			return Ident{Name: w, Range: p.rng(i, s, e)}, skipSpace(t, e, ln.end), true
		}
	}
	hint := "write one of " + strings.Join(LimitStates, ", ")
	if n := diag.Nearest(w, LimitStates); n != "" {
		hint = "did you mean `" + n + "`?"
	}
	found := "nothing"
	if w != "" {
		found = "`" + clip(w) + "`"
	}
	p.errAt(p.rng(i, s, max(e, min(s+1, ln.end))),
		"`in` after a check's name names the limit state whose combinations it is checked in",
		hint, "expected a limit state after `in`, found %s", found)
	return Ident{}, e, false
}
