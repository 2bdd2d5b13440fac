package report

import (
	"strings"
)

// greek maps the names of Greek letters, as engineers spell them in ASCII
// names, to the letters (common practice: sigma_Ed is σ with Ed below).
var greek = map[string]string{
	"alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "eps": "ε",
	"zeta": "ζ", "eta": "η", "theta": "θ", "iota": "ι", "kappa": "κ", "lambda": "λ",
	"mu": "μ", "nu": "ν", "xi": "ξ", "pi": "π", "rho": "ρ", "sigma": "σ", "tau": "τ",
	"upsilon": "υ", "phi": "φ", "chi": "χ", "psi": "ψ", "omega": "ω",
	"Gamma": "Γ", "Delta": "Δ", "Theta": "Θ", "Lambda": "Λ", "Xi": "Ξ", "Pi": "Π",
	"Sigma": "Σ", "Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
}

// accents are suffixes that put a mark over the symbol: lambda_bar is λ̄.
var accents = map[string]string{"bar": "¯", "hat": "^", "tilde": "~", "dot": "˙"}

// letter returns the Greek letter a name part spells, or the part itself.
func letter(p string) string {
	if g, ok := greek[p]; ok {
		return g
	}
	return p
}

// symbol writes a cell, parameter or field name as MathML: the part
// before the first "_" is the base (a Greek letter when it spells one),
// the rest the subscript, its parts joined by commas (x_sigma_max is x
// with σ,max below). A qualified name (access.N_Ed) keeps its prefix as
// upright text before the symbol.
func symbol(b *strings.Builder, name string) {
	if i := strings.LastIndexByte(name, '.'); i >= 0 {
		b.WriteString("<mrow><mtext>")
		b.WriteString(esc(name[:i+1]))
		b.WriteString("</mtext>")
		symbol(b, name[i+1:])
		b.WriteString("</mrow>")
		return
	}
	parts := strings.Split(name, "_")
	base := parts[0]
	subs := parts[1:]
	accent := ""
	if n := len(subs); n > 0 {
		if a, ok := accents[subs[n-1]]; ok {
			accent, subs = a, subs[:n-1]
		}
	}
	if base == "" || (len([]rune(base)) > 2 && greek[base] == "") {
		// a word (point_loads, share_g): subscripts would make it read as
		// a symbol it is not, so it stays as written
		ident(b, name)
		return
	}
	var sub []string
	for _, s := range subs {
		if s != "" {
			sub = append(sub, letter(s))
		}
	}
	if len(sub) > 0 {
		b.WriteString("<msub>")
	}
	if accent != "" {
		b.WriteString("<mover accent=\"true\">")
	}
	ident(b, letter(base))
	if accent != "" {
		b.WriteString("<mo>" + accent + "</mo></mover>")
	}
	if len(sub) > 0 {
		b.WriteString("<mrow>")
		ident(b, strings.Join(sub, ","))
		b.WriteString("</mrow></msub>")
	}
}

// ident writes one identifier: a single letter in italics (the MathML
// default), a word upright, as ISO 80000-2 sets descriptive subscripts.
func ident(b *strings.Builder, s string) {
	if len([]rune(s)) == 1 {
		b.WriteString("<mi>" + esc(s) + "</mi>")
		return
	}
	b.WriteString("<mi mathvariant=\"normal\">" + esc(s) + "</mi>")
}

// plainSymbol is the name as text for places that are not MathML (the
// summary table, SVG labels): σ_Ed for sigma_Ed.
func plainSymbol(name string) string {
	prefix := ""
	if i := strings.LastIndexByte(name, '.'); i >= 0 {
		prefix, name = name[:i+1], name[i+1:]
	}
	parts := strings.Split(name, "_")
	for i, p := range parts {
		parts[i] = letter(p)
	}
	return prefix + strings.Join(parts, "_")
}

// esc escapes text for HTML and MathML content and attribute values.
func esc(s string) string {
	if !strings.ContainsAny(s, "<>&\"'") {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		switch r {
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '&':
			b.WriteString("&amp;")
		case '"':
			b.WriteString("&#34;")
		case '\'':
			b.WriteString("&#39;")
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}
