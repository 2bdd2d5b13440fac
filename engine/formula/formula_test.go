package formula

import (
	"math"
	"os"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// expr places text at line 3, column 15 (byte 40) of a file f.
func expr(text string) sheet.Expr {
	pre := strings.Repeat("x", 12) + "\n" + strings.Repeat("y", 12) + "\n" + strings.Repeat(" ", 14)
	return sheet.Expr{Text: text, Range: diag.NewSource("f", pre+text).Span(len(pre), len(pre)+len(text))}
}

// TestTrees: the grammar of SPEC.md §4, compared as printed trees.
func TestTrees(t *testing.T) {
	cases := []struct{ text, want string }{
		{"38 kN", "(unit 38 kN)"},
		{"38kN / A", "(/ (unit 38 kN) A)"},
		{"0.75 in", "(unit 0.75 in)"}, // `in` is a unit, not a word of the language
		{"0.75in * 2", "(* (unit 0.75 in) 2)"},
		{"2 * d_in", "(* 2 d_in)"},
		{"4.5 kN/m * L", "(* (unit 4.5 kN/m) L)"},
		{"12e-6 1/K * dT", "(* (unit 12e-6 1/K) dT)"},
		{"30 °", "(unit 30 °)"},
		{"a + b * c", "(+ a (* b c))"},
		{"a - b - c", "(- (- a b) c)"},
		{"a / b / c", "(/ (/ a b) c)"},
		{"-x^2", "(- (^ x 2))"},
		{"2^-1", "(^ 2 (- 1))"},
		{"a^b^c", "(^ a (^ b c))"},
		{"(a + b) * c", "(* (+ a b) c)"},
		{"x > 0 ? a : b", "(? (> x 0) a b)"},
		{"a ? b : c ? d : e", "(? a b (? c d e))"},
		{"a > 2 and b < 3 or not c == d", "(or (and (> a 2) (< b 3)) (not (== c d)))"},
		{"f(x2, 3)", "(call f x2 3)"},
		{"f()", "(call f)"},
		{"f(x, \"fixed\")", "(call f x \"fixed\")"},
		{"steel.f_y * 2", "(* (. steel f_y) 2)"},
		{"rod.bolt.A", "(. (. rod bolt) A)"},
		{"xs[0] + t.L[1]", "(+ (index xs 0) (index (. t L) 1))"},
		{"[1 m, 2 m]", "(list (unit 1 m) (unit 2 m))"},
		{"{E: 210 GPa, f_y: 355 MPa}", "(record E (unit 210 GPa) f_y (unit 355 MPa))"},
		{"{mode: \"fixed\"}", "(record mode \"fixed\")"},
		{"(5 %)", "(unit 5 %)"},
		{"2 and x", "(and 2 x)"}, // a word after a number is never a unit
		{"true", "true"},
		{"σ_Ed / 2", "(/ σ_Ed 2)"},
		{"1.5e3 + .5", "(+ 1.5e3 .5)"},
	}
	for _, c := range cases {
		f, errs := Parse(expr(c.text), Options{})
		if errs.HasErrors() || f == nil {
			t.Errorf("%q: %v", c.text, errs)
			continue
		}
		if got := f.String(); got != c.want {
			t.Errorf("%q:\n got %s\nwant %s", c.text, got, c.want)
		}
	}
}

func TestQuantities(t *testing.T) {
	cases := []struct {
		text  string
		quant []string  // texts of the quantity literals
		si    []float64 // Source: SI prefixes and units, BIPM SI Brochure (9th ed.); inch NIST SP 811 App. B (exact)
		refs  []string
	}{
		{"38 kN", []string{"38 kN"}, []float64{38000}, nil},
		{"0.75 in", []string{"0.75 in"}, []float64{0.75 * 0.0254}, nil},
		{"7850 kg/m^3", []string{"7850 kg/m^3"}, []float64{7850}, nil},
		{"a > 2 and b < 3", nil, nil, []string{"a", "b"}},
		{"f(x2, 3) + r.x", nil, nil, []string{"f", "x2", "r"}},
		{"{E: 210 GPa}", []string{"210 GPa"}, []float64{210e9}, nil},
	}
	for _, c := range cases {
		f, errs := Parse(expr(c.text), Options{})
		if errs.HasErrors() {
			t.Errorf("%q: %v", c.text, errs)
			continue
		}
		if len(f.Quantities()) != len(c.quant) {
			t.Errorf("%q: quantities %+v", c.text, f.Quantities())
			continue
		}
		for i := range f.Quantities() {
			q := &f.Quantities()[i]
			if f.QuantityText(q) != c.quant[i] || math.Abs(q.SI-c.si[i]) > 1e-15*math.Abs(c.si[i]) {
				t.Errorf("%q: quantity %d = %q %g", c.text, i, f.QuantityText(q), q.SI)
			}
		}
		var refs []string
		for r := range f.Refs() {
			refs = append(refs, f.Text(r))
		}
		if len(refs) != f.NumRefs() {
			t.Errorf("%q: %d refs, NumRefs %d", c.text, len(refs), f.NumRefs())
		}
		if strings.Join(refs, ",") != strings.Join(c.refs, ",") {
			t.Errorf("%q: refs %v, want %v", c.text, refs, c.refs)
		}
	}
}

// TestErrors reads testdata/errors.txt: one formula per line, then `###`
// and the start of the expected summary, then optionally `@col` of the
// caret (1-based within the formula).
func TestErrors(t *testing.T) {
	data, err := os.ReadFile("testdata/errors.txt")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for ln, line := range strings.Split(string(data), "\n") {
		if strings.TrimSpace(line) == "" || strings.HasPrefix(line, "//!") {
			continue
		}
		text, want, ok := strings.Cut(line, "###")
		if !ok {
			t.Fatalf("line %d: no ###", ln+1)
		}
		text = strings.TrimRight(text, " ")
		want = strings.TrimSpace(want)
		col := 0
		if i := strings.LastIndex(want, " @"); i >= 0 {
			for _, ch := range want[i+2:] {
				col = col*10 + int(ch-'0')
			}
			want = want[:i]
		}
		n++
		_, errs := Parse(sheet.Expr{Text: text, Range: diag.NewSource("f", text).Span(0, len(text))}, Options{})
		if !errs.HasErrors() {
			t.Errorf("line %d: %q parsed without error", ln+1, text)
			continue
		}
		d := errs[0]
		if !strings.HasPrefix(d.Summary, want) {
			t.Errorf("line %d: %q: got %q, want %q", ln+1, text, d.Summary, want)
		}
		if col > 0 && d.Range.Start().Col != col {
			t.Errorf("line %d: %q: caret at col %d, want %d", ln+1, text, d.Range.Start().Col, col)
		}
		if d.Hint == "" && d.Detail == "" {
			t.Errorf("line %d: %q: no detail and no hint", ln+1, text)
		}
	}
	if n < 20 {
		t.Fatalf("only %d cases", n)
	}
}

func TestDepthAndSize(t *testing.T) {
	deep := strings.Repeat("(", 70) + "1" + strings.Repeat(")", 70)
	if _, errs := Parse(expr(deep), Options{}); !errs.HasErrors() || errs[0].Summary != "expression nested too deeply" {
		t.Errorf("deep: %v", errs)
	}
	if _, errs := Parse(expr(deep), Options{MaxDepth: 100}); errs.HasErrors() {
		t.Errorf("deep with room: %v", errs)
	}
	long := strings.Repeat("1 + ", 6000) + "1"
	if _, errs := Parse(expr(long), Options{}); !errs.HasErrors() || errs[0].Summary != "the formula is too long" {
		t.Errorf("long: %v", errs)
	}
	// A formula of more than MaxText bytes is refused before it is read,
	// however few terms it has: its spans would not fit in a node.
	wide := "a" + strings.Repeat("b", MaxText) + " + 1"
	if _, errs := Parse(expr(wide), Options{}); !errs.HasErrors() || errs[0].Summary != "the formula is too long" || !strings.Contains(errs[0].Detail, "65,535 bytes") {
		t.Errorf("wide: %v", errs)
	}
	fits := "a" + strings.Repeat("b", MaxText-5) + " + 1"
	if f, errs := Parse(expr(fits), Options{}); errs.HasErrors() || int(f.Nodes[f.Root].To) != len(fits) {
		t.Errorf("%d bytes: %v", len(fits), errs)
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"38 kN / A", "f(x, \"a\") + r.x[0]", "{E: 1 GPa}", "a ? b : c", "0.75in", "-x^2^-y", "1..2", "x // y"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 4096 {
			return
		}
		fm, errs := Parse(expr(s), Options{})
		if fm == nil {
			if !errs.HasErrors() {
				t.Fatalf("%q: no formula and no error", s)
			}
			return
		}
		for i, nd := range fm.Nodes {
			if int(nd.To) > len(s) || nd.From > nd.To {
				t.Fatalf("%q: node %d span %d..%d", s, i, nd.From, nd.To)
			}
		}
		if fm.Root < 0 || int(fm.Root) >= len(fm.Nodes) {
			t.Fatalf("%q: root %d", s, fm.Root)
		}
		// The printed tree parses to itself when it holds no quantities
		// (the printer's (unit ...) form is not sheet syntax).
		_ = fm.String()
	})
}

// TestSpecGrammar: every rule of the grammar in SPEC.md §4 is quoted, as
// written, above the parse function that reads it (whitespace aside), so
// the spec and the parser cannot drift apart unseen.
func TestSpecGrammar(t *testing.T) {
	spec, err := os.ReadFile("../../SPEC.md")
	if err != nil {
		t.Fatal(err)
	}
	sec := string(spec)
	sec = sec[strings.Index(sec, "## 4. Expressions"):]
	sec = sec[strings.Index(sec, "```ebnf")+len("```ebnf") : strings.Index(sec, "\n```\n")]
	var src strings.Builder
	for _, name := range []string{"parse.go", "lex.go"} {
		b, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		for _, line := range strings.Split(string(b), "\n") {
			if c, ok := strings.CutPrefix(strings.TrimSpace(line), "//"); ok {
				src.WriteString(c + " ")
			}
		}
	}
	quoted := strings.Join(strings.Fields(src.String()), " ")
	rules := 0
	for _, rule := range joinContinued(sec) {
		if strings.Contains(rule, "(see §3)") || strings.HasPrefix(rule, "string ") {
			continue // read by the lexer's token rules, quoted in prose
		}
		rules++
		if !strings.Contains(quoted, strings.Join(strings.Fields(rule), " ")) {
			t.Errorf("no parse function quotes the rule\n%s", rule)
		}
	}
	if rules < 15 {
		t.Fatalf("only %d rules read from SPEC.md", rules)
	}
}

// joinContinued returns the rules of an EBNF block, a rule's continuation
// lines (starting with spaces) joined to it.
func joinContinued(block string) []string {
	var out []string
	for _, line := range strings.Split(block, "\n") {
		switch {
		case strings.TrimSpace(line) == "":
		case strings.HasPrefix(line, " ") && len(out) > 0:
			out[len(out)-1] += " " + strings.TrimSpace(line)
		default:
			out = append(out, strings.TrimSpace(line))
		}
	}
	return out
}

// TestRange: with Options.Range the whole expression may lie between two
// limits; both comparisons point the same way.
func TestRange(t *testing.T) {
	for _, c := range []struct{ text, want string }{
		{"0.2 <= r <= 0.9", "(range <= <= 0.2 r 0.9)"},
		{"1 >= s / L > 0.5", "(range >= > 1 (/ s L) 0.5)"},
	} {
		f, errs := Parse(expr(c.text), Options{Range: true})
		if errs.HasErrors() {
			t.Fatalf("%q: %v", c.text, errs)
		}
		if got := f.String(); got != c.want {
			t.Errorf("%q: got %s, want %s", c.text, got, c.want)
		}
	}
	if _, errs := Parse(expr("1 <= a >= 0"), Options{Range: true}); !errs.HasErrors() {
		t.Error("a range pointing two ways parsed")
	}
	if _, errs := Parse(expr("0.2 <= r <= 0.9"), Options{}); !errs.HasErrors() {
		t.Error("a chained comparison parsed without Options.Range")
	}
}

// TestSpans: brackets have no node; the span of a node runs from its first
// token to its last, so a node that encloses brackets takes them in and a
// bracketed expression's own span leaves them out. The spans are listed in
// node order (children before their parent).
func TestSpans(t *testing.T) {
	cases := []struct{ text, want string }{
		{"(a + b) * c", "a|b|a + b|c|(a + b) * c"},
		{"2 ^ (3 m)", "2|3 m|2 ^ (3 m)"},
		{"((a))", "a"},
		{"(a) + (b)", "a|b|(a) + (b)"},
		{"-(x)", "x|-(x)"},
		{"(x) > 0 ? (a) : b", "x|0|(x) > 0|a|b|(x) > 0 ? (a) : b"},
		{"f((a), b)[0]", "f|a|b|f((a), b)|0|f((a), b)[0]"},
		{"(r).E", "r|E|(r).E"},
		{"[(1 m)]", "1 m|[(1 m)]"},
	}
	for _, c := range cases {
		f, errs := Parse(expr(c.text), Options{})
		if errs.HasErrors() || f == nil {
			t.Errorf("%q: %v", c.text, errs)
			continue
		}
		texts := make([]string, len(f.Nodes))
		for i := range f.Nodes {
			texts[i] = f.Text(int32(i))
		}
		if got := strings.Join(texts, "|"); got != c.want {
			t.Errorf("%q:\n got %s\nwant %s", c.text, got, c.want)
		}
	}
}

// TestNotes: a name node keeps the two words its reader notes, starting at
// -1, and a node of another kind refuses a note (its words are children).
func TestNotes(t *testing.T) {
	f, errs := Parse(expr("f(x) + r.E"), Options{})
	if errs.HasErrors() || f == nil {
		t.Fatal(errs)
	}
	for i := range f.Nodes {
		n := int32(i)
		if f.Nodes[n].Kind != KName {
			continue
		}
		if a, b := f.Note(n); a != -1 || b != -1 {
			t.Fatalf("%s: note %d %d before any was written", f.Text(n), a, b)
		}
		f.SetNote(n, 3, n+10)
		if a, b := f.Note(n); a != 3 || b != n+10 {
			t.Fatalf("%s: note %d %d, want 3 %d", f.Text(n), a, b, n+10)
		}
	}
	if got := f.String(); got != "(+ (call f x) (. r E))" {
		t.Fatalf("notes changed the tree: %s", got)
	}
	defer func() {
		if recover() == nil {
			t.Fatal("SetNote of the root (a binary node) did not panic")
		}
	}()
	f.SetNote(f.Root, 1, 1)
}
