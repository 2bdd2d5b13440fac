package main

import (
	"regexp"
	"strings"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// The docs of the functions are written in SI ("outside diameter, m",
// "reaction ... [N]"), while the listing shows each parameter in the
// preferred metric unit of its dimension ("d [mm]"). docText makes the
// text agree with the signature: every unit in brackets is written in the
// unit the signature shows for its dimension, and the unit of the
// parameter itself, already shown beside its name, is not repeated.

var bracketUnit = regexp.MustCompile(`\[([^\[\]]+)\]`)

// docText is the doc of a parameter, field or function of type t (nil for
// a function's own description) as the listing prints it.
func docText(doc string, t *funcs.Type) string {
	doc = bracketUnit.ReplaceAllStringFunc(doc, func(m string) string {
		u, err := units.Parse(strings.TrimSpace(m[1 : len(m)-1]))
		if err != nil || u.Dim.IsNone() {
			return m
		}
		return unitText(u.Dim)
	})
	if t != nil && t.Kind == funcs.List && t.Elem != nil {
		t = t.Elem // "coordinates of the vertices, m": the unit of each
	}
	if t == nil || t.Kind != funcs.Number || t.Dim.IsNone() {
		return doc
	}
	own := unitText(t.Dim)
	// "… +x positive [kN]" after the rewrite above: the signature has it.
	doc = strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(doc), own))
	// "outside diameter, m; > 0": drop the piece that is only a unit of
	// the parameter's dimension ("outside diameter; > 0").
	parts := splitDoc(doc)
	var kept []segment
	for _, p := range parts {
		// "…, m (same count as ys)": the unit goes, the remark stays.
		if word, rest, ok := strings.Cut(p.text, " ("); ok && len(kept) > 0 {
			if u, err := units.Parse(word); err == nil && u.Dim == t.Dim {
				kept[len(kept)-1].text += " (" + rest
				kept[len(kept)-1].sep = p.sep
				continue
			}
		}
		if u, err := units.Parse(p.text); err == nil && p.text != "" && u.Dim == t.Dim {
			if len(kept) > 0 && p.sep == ";" {
				kept[len(kept)-1].sep = ";"
			}
			continue
		}
		kept = append(kept, p)
	}
	var b strings.Builder
	for i, p := range kept {
		b.WriteString(p.text)
		if i < len(kept)-1 {
			sep := p.sep
			if sep == "" {
				sep = ","
			}
			b.WriteString(sep + " ")
		}
	}
	return b.String()
}

// segment is a piece of a doc and the separator (",", ";" or "") after it.
type segment struct{ text, sep string }

// splitDoc cuts s at each ", " and "; ".
func splitDoc(s string) []segment {
	var out []segment
	start := 0
	for i := 0; i+1 < len(s); i++ {
		if (s[i] == ',' || s[i] == ';') && s[i+1] == ' ' {
			out = append(out, segment{text: strings.TrimSpace(s[start:i]), sep: string(s[i])})
			start = i + 2
		}
	}
	return append(out, segment{text: strings.TrimSpace(s[start:])})
}
