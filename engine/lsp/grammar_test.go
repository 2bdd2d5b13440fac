package lsp

import (
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// The TextMate grammar of editors/vscode is tested here with Go's regexp,
// not with the Oniguruma engine editors run it with. That is faithful
// only for the part of the regex language both read alike, so the test
// first holds every pattern to that part: no look-around, no atomic or
// possessive groups, no \b \d \s \w \h \G \A \z \K (their meaning differs:
// Go's classes are ASCII, Oniguruma's may be Unicode; Go lacks the rest),
// and `^` only as the first character (a pattern is tried from a place
// inside the line, where Go's `^` would match and Oniguruma's does not).
// Then it tokenises every line of every bundled sheet and checks the
// scopes against the sheet reader's own view of the same lines.

const grammarPath = "../../editors/vscode/syntaxes/sheaf.tmLanguage.json"

type tmCapture struct {
	Name string `json:"name"`
}

type tmRule struct {
	Include       string               `json:"include"`
	Match         string               `json:"match"`
	Begin         string               `json:"begin"`
	End           string               `json:"end"`
	Name          string               `json:"name"`
	ContentName   string               `json:"contentName"`
	Captures      map[string]tmCapture `json:"captures"`
	BeginCaptures map[string]tmCapture `json:"beginCaptures"`
	EndCaptures   map[string]tmCapture `json:"endCaptures"`
	Patterns      []*tmRule            `json:"patterns"`

	match, begin, end *regexp.Regexp
	anchored          bool // the pattern starts with ^: it matches at the line's start only
}

type tmGrammar struct {
	ScopeName  string             `json:"scopeName"`
	Patterns   []*tmRule          `json:"patterns"`
	Repository map[string]*tmRule `json:"repository"`
}

// notShared lists constructs that Oniguruma and Go's regexp do not read
// alike.
var notShared = []string{`(?=`, `(?!`, `(?<=`, `(?<!`, `(?>`, `\b`, `\B`, `\d`, `\D`, `\s`, `\S`, `\w`, `\W`, `\h`, `\H`, `\G`, `\A`, `\z`, `\Z`, `\K`, `*+`, `++`, `?+`, `}+`}

func compileTM(t *testing.T, where, re string) (*regexp.Regexp, bool) {
	t.Helper()
	for _, bad := range notShared {
		if strings.Contains(re, bad) {
			t.Errorf("%s: %q uses %s, which Oniguruma and Go's regexp read differently or Go lacks", where, re, bad)
		}
	}
	inClass := false
	for j := 0; j < len(re); j++ {
		switch c := re[j]; {
		case c == '\\':
			j++ // an escaped character
		case inClass:
			inClass = c != ']' || re[j-1] == '['
		case c == '[':
			inClass = true
			if j+1 < len(re) && re[j+1] == '^' {
				j++ // a negated class
			}
		case c == '^' && j > 0:
			t.Errorf("%s: %q has ^ at %d; only a leading ^ is read alike", where, re, j)
		}
	}
	c, err := regexp.Compile(re)
	if err != nil {
		t.Errorf("%s: %q does not compile: %v", where, re, err)
		return nil, false
	}
	return c, strings.HasPrefix(re, "^")
}

func loadGrammar(t *testing.T) *tmGrammar {
	t.Helper()
	b, err := os.ReadFile(grammarPath)
	if err != nil {
		t.Fatal(err)
	}
	var g tmGrammar
	if err := json.Unmarshal(b, &g); err != nil {
		t.Fatalf("%s: %v", grammarPath, err)
	}
	if g.ScopeName != "source.sheaf" {
		t.Errorf("scopeName %q", g.ScopeName)
	}
	var prep func(where string, r *tmRule)
	prep = func(where string, r *tmRule) {
		if r.Match != "" {
			r.match, r.anchored = compileTM(t, where+".match", r.Match)
		}
		if r.Begin != "" {
			r.begin, r.anchored = compileTM(t, where+".begin", r.Begin)
			r.end, _ = compileTM(t, where+".end", r.End)
		}
		for _, s := range []string{r.Name, r.ContentName} {
			if s != "" && !strings.HasSuffix(s, ".sheaf") {
				t.Errorf("%s: scope %q is not one of ours (.sheaf)", where, s)
			}
		}
		for _, cs := range []map[string]tmCapture{r.Captures, r.BeginCaptures, r.EndCaptures} {
			for _, c := range cs {
				if !strings.HasSuffix(c.Name, ".sheaf") {
					t.Errorf("%s: scope %q is not one of ours (.sheaf)", where, c.Name)
				}
			}
		}
		if r.Include != "" && r.Include != "$self" && g.Repository[strings.TrimPrefix(r.Include, "#")] == nil {
			t.Errorf("%s: include %q names no rule", where, r.Include)
		}
		for i, p := range r.Patterns {
			prep(where+".patterns["+itoa(i)+"]", p)
		}
	}
	for i, p := range g.Patterns {
		prep("patterns["+itoa(i)+"]", p)
	}
	for name, r := range g.Repository {
		prep("repository."+name, r)
	}
	return &g
}

func itoa(i int) string { return strconv.Itoa(i) }

// flatten expands includes into the rules that match.
func (g *tmGrammar) flatten(rs []*tmRule, depth int) []*tmRule {
	var out []*tmRule
	for _, r := range rs {
		switch {
		case r.Include == "$self":
			if depth < 8 {
				out = append(out, g.flatten(g.Patterns, depth+1)...)
			}
		case r.Include != "":
			if inc := g.Repository[strings.TrimPrefix(r.Include, "#")]; inc != nil && depth < 8 {
				out = append(out, g.flatten([]*tmRule{inc}, depth+1)...)
			}
		case r.match == nil && r.begin == nil:
			out = append(out, g.flatten(r.Patterns, depth+1)...)
		default:
			out = append(out, r)
		}
	}
	return out
}

// tokenize returns the scopes of each byte of line, as a TextMate engine
// assigns them: at each place the pattern that matches earliest wins, the
// first listed among equals; a begin/end rule's end is tried first.
func (g *tmGrammar) tokenize(line string) [][]string {
	out := make([][]string, len(line))
	g.scan(line, 0, g.flatten(g.Patterns, 0), nil, []string{g.ScopeName}, out)
	return out
}

func find(re *regexp.Regexp, anchored bool, line string, pos int) []int {
	if re == nil || (anchored && pos > 0) {
		return nil
	}
	m := re.FindStringSubmatchIndex(line[pos:])
	if m == nil {
		return nil
	}
	for i := range m {
		if m[i] >= 0 {
			m[i] += pos
		}
	}
	return m
}

func paint(out [][]string, from, to int, scopes []string) {
	for i := from; i < to && i < len(out); i++ {
		out[i] = slices.Clone(scopes)
	}
}

func paintCaptures(out [][]string, m []int, caps map[string]tmCapture) {
	for k, c := range caps {
		i := 0
		for _, ch := range k {
			i = i*10 + int(ch-'0')
		}
		if 2*i+1 < len(m) && m[2*i] >= 0 {
			for j := m[2*i]; j < m[2*i+1]; j++ {
				out[j] = append(out[j], c.Name)
			}
		}
	}
}

func (g *tmGrammar) scan(line string, pos int, rules []*tmRule, end *tmRule, scopes []string, out [][]string) int {
	for pos <= len(line) {
		var em []int
		if end != nil {
			em = find(end.end, false, line, pos)
		}
		var best []int
		var br *tmRule
		for _, r := range rules {
			re := r.match
			if re == nil {
				re = r.begin
			}
			m := find(re, r.anchored, line, pos)
			if m != nil && (best == nil || m[0] < best[0]) {
				best, br = m, r
			}
		}
		if em != nil && (best == nil || em[0] <= best[0]) {
			paint(out, pos, em[1], scopes)
			paintCaptures(out, em, end.EndCaptures)
			return em[1]
		}
		if best == nil {
			paint(out, pos, len(line), scopes)
			return len(line)
		}
		paint(out, pos, best[0], scopes)
		inner := scopes
		if br.Name != "" {
			inner = append(slices.Clone(scopes), br.Name)
		}
		paint(out, best[0], best[1], inner)
		if br.match != nil {
			paintCaptures(out, best, br.Captures)
			pos = best[1]
		} else {
			paintCaptures(out, best, br.BeginCaptures)
			content := inner
			if br.ContentName != "" {
				content = append(slices.Clone(inner), br.ContentName)
			}
			pos = g.scan(line, best[1], g.flatten(br.Patterns, 0), br, content, out)
		}
		if best[1] == best[0] {
			pos++ // an empty match must not stall the scan
		}
		if pos >= len(line) {
			return pos
		}
	}
	return pos
}

// TestGrammar tokenises every line of the bundled sheets and checks that
// what the sheet reader calls a heading, comment, header key, name, unit,
// annotation or reference gets the scope for it, and that no byte of a
// formula is taken for a comment.
func TestGrammar(t *testing.T) {
	g := loadGrammar(t)
	paths, _ := filepath.Glob("../../sheets/*.sheaf")
	more, _ := filepath.Glob("../../testdata/sheets/*.sheaf")
	paths = append(paths, more...)
	if len(paths) < 5 {
		t.Fatalf("found %d sheets", len(paths))
	}
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		f, errs := sheet.Parse(p, src)
		if errs.HasErrors() {
			continue // a fixture of a broken sheet
		}
		lines := strings.Split(string(src), "\n")
		starts := make([]int, len(lines))
		for i := 1; i < len(lines); i++ {
			starts[i] = starts[i-1] + len(lines[i-1]) + 1
		}
		toks := make([][][]string, len(lines))
		for i, ln := range lines {
			toks[i] = g.tokenize(strings.TrimSuffix(ln, "\r"))
		}
		// has checks that every byte of r (one line) carries scope.
		has := func(what string, r diag.Range, scope string) {
			t.Helper()
			if !r.Start().IsValid() {
				return
			}
			li := r.Start().Line - 1
			from := r.Start().Offset - starts[li]
			to := r.End().Offset - starts[li]
			if r.End().Line != r.Start().Line {
				to = len(toks[li])
			}
			for b := from; b < to && b < len(toks[li]); b++ {
				if !slices.Contains(toks[li][b], scope) {
					t.Errorf("%s:%d: %s %q: byte %d has %v, want %s", p, li+1, what, lines[li][from:min(to, len(lines[li]))], b, toks[li][b], scope)
					return
				}
			}
		}
		notComment := func(r diag.Range) {
			t.Helper()
			for li := r.Start().Line - 1; li < r.End().Line && li < len(lines); li++ {
				from, to := 0, len(toks[li])
				if li == r.Start().Line-1 {
					from = r.Start().Offset - starts[li]
				}
				if li == r.End().Line-1 {
					to = r.End().Offset - starts[li]
				}
				for b := from; b < to && b < len(toks[li]); b++ {
					for _, s := range toks[li][b] {
						if strings.HasPrefix(s, "comment.") {
							t.Errorf("%s:%d: formula byte %d taken for a comment (%v)", p, li+1, b, toks[li][b])
							return
						}
					}
				}
			}
		}
		annot := func(a *sheet.Annot) {
			t.Helper()
			if a == nil || !a.Range.Start().IsValid() {
				return
			}
			has("annotation", a.Range, "comment.line.double-dash.sheaf")
			if a.Reference != "" {
				li := a.Range.Start().Line - 1
				ln := lines[li]
				i := strings.LastIndex(ln, a.Reference)
				r := a.Range.Src.Span(starts[li]+i, starts[li]+i+len(a.Reference))
				has("reference", r, "markup.underline.reference.sheaf")
			}
		}
		cell := func(c *sheet.Cell) {
			has("cell name", c.Name.Range, "variable.other.definition.sheaf")
			if c.Unit != nil {
				has("display unit", c.Unit.Range, "entity.name.type.unit.sheaf")
			}
			notComment(c.Expr.Range)
			annot(c.Annot)
		}
		for _, it := range f.Items {
			switch it := it.(type) {
			case *sheet.Heading:
				has("heading", it.Range, "markup.heading.sheaf")
			case *sheet.Comment:
				has("comment", it.Range, "comment.line.number-sign.sheaf")
			case *sheet.Meta:
				has("header key", it.Key.Range, "keyword.other.header.sheaf")
			case *sheet.Cell:
				cell(it)
			case *sheet.FuncDef:
				has("function name", it.Name.Range, "entity.name.function.definition.sheaf")
				for _, q := range it.Params {
					if q.Unit != nil {
						has("parameter unit", q.Unit.Range, "entity.name.type.unit.sheaf")
					}
				}
				if it.Unit != nil {
					has("result unit", it.Unit.Range, "entity.name.type.unit.sheaf")
				}
				notComment(it.Body.Range)
				annot(it.Annot)
			case *sheet.Check:
				has("check name", it.Name.Range, "entity.name.function.check.sheaf")
				if it.State.Name != "" {
					has("limit state", it.State.Range, "constant.language.limit-state.sheaf")
				}
				notComment(it.Body.Range)
				annot(it.Annot)
			case *sheet.Action:
				has("action kind", it.Kind.Range, "storage.modifier.action-kind.sheaf")
				cell(&it.Cell)
			case *sheet.Factor:
				has("factor key", it.KeyRange, "variable.parameter.factor.sheaf")
				annot(it.Annot)
			case *sheet.Table:
				has("table name", it.Name.Range, "entity.name.type.table.sheaf")
				for _, c := range it.Columns {
					if c.Unit != nil {
						has("column unit", c.Unit.Range, "entity.name.type.unit.sheaf")
					}
				}
				for _, row := range it.Rows {
					for _, l := range row {
						has("table entry", l.Range, "constant.numeric.sheaf")
					}
				}
				annot(it.Annot)
			case *sheet.Use:
				has("template name", it.Name.Range, "entity.name.namespace.sheaf")
				has("template path", it.PathRange, "string.quoted.double.path.sheaf")
				for _, o := range it.Overrides {
					cell(o)
				}
				annot(it.Annot)
			}
		}
	}
}

// TestGrammarLine checks single lines whose scopes are known by eye.
func TestGrammarLine(t *testing.T) {
	g := loadGrammar(t)
	tests := []struct {
		line, text, scope string
	}{
		{"σ_Ed [MPa] = N_Ed / A_σ  -- stress", "σ_Ed", "variable.other.definition.sheaf"},
		{"σ_Ed [MPa] = N_Ed / A_σ  -- stress", "MPa", "entity.name.type.unit.sheaf"},
		{"σ_Ed [MPa] = N_Ed / A_σ  -- stress", "A_σ", "variable.other.sheaf"},
		{"θ = 30 °", "30", "constant.numeric.sheaf"},
		{"combinations: EN 1990 6.10", "combinations", "keyword.other.header.sheaf"},
		{"action imposed B Q [kN] = 5 kN  -- crowd", "imposed B", "storage.modifier.action-kind.sheaf"},
		{"action imposed B Q [kN] = 5 kN  -- crowd", "Q", "variable.other.definition.sheaf"},
		{"action imposed B Q [kN] = 5 kN  -- crowd", "kN", "entity.name.type.unit.sheaf"},
		{"action permanent favourable G = 4 kN", "G", "variable.other.definition.sheaf"},
		{"factor psi_0 imposed B = 0.7  -- annex", "psi_0 imposed B", "variable.parameter.factor.sheaf"},
		{"factor psi_0 imposed B = 0.7  -- annex", "0.7", "constant.numeric.sheaf"},
		{"check sag in quasi-permanent: d <= 6 mm", "quasi-permanent", "constant.language.limit-state.sheaf"},
		{"check sag in quasi-permanent: d <= 6 mm", "sag", "entity.name.function.check.sheaf"},
		{"θ = 30 °", "°", "entity.name.type.unit.sheaf"},
		{"a = 12e-6 1/K", "1/K", "entity.name.type.unit.sheaf"},
		{"a = 38kN", "kN", "entity.name.type.unit.sheaf"},
		{"b = c0_5 * 2", "c0_5", "variable.other.sheaf"},
		{"x [mm] = sqrt(A) -- root @ EN 1993-1-1 6.2", "sqrt", "support.function.builtin.sheaf"},
		{"x [mm] = sqrt(A) -- root @ EN 1993-1-1 6.2", "EN 1993-1-1 6.2", "markup.underline.reference.sheaf"},
		{"mail = 1 -- ask a@b.example", "a@b.example", "comment.line.double-dash.sheaf"},
		{"check tension: N <= F  -- rod", "tension", "entity.name.function.check.sheaf"},
		{"r = rod.sigma * pi", "pi", "constant.language.sheaf"},
		{"s = \"fixed\"", "\"fixed\"", "string.quoted.double.sheaf"},
	}
	for _, tt := range tests {
		toks := g.tokenize(tt.line)
		i := strings.Index(tt.line, tt.text)
		for b := i; b < i+len(tt.text); b++ {
			if !slices.Contains(toks[b], tt.scope) {
				t.Errorf("%q: %q byte %d has %v, want %s", tt.line, tt.text, b, toks[b], tt.scope)
				break
			}
		}
		if strings.Contains(tt.text, "@") && slices.Contains(toks[i], "markup.underline.reference.sheaf") {
			t.Errorf("%q: an @ inside a word split the annotation", tt.line)
		}
	}
}

// scopesByUnit returns the scopes of each UTF-16 unit of line, joined by
// spaces, as vscode-textmate reports its tokens.
func scopesByUnit(g *tmGrammar, line string) []string {
	toks := g.tokenize(line)
	var row []string
	for i, r := range line {
		s := strings.Join(toks[i], " ")
		row = append(row, s)
		if r >= 0x10000 {
			row = append(row, s) // two UTF-16 units
		}
	}
	return row
}

// TestGrammarTokens checks the UTF-16 view of the scopes on a line with a
// character outside the Basic Multilingual Plane, and writes the scopes of
// every bundled sheet to $SHEAF_TM_DUMP when it is set, for
// editors/vscode/test/compare.js to compare with Oniguruma's (.ci/run).
func TestGrammarTokens(t *testing.T) {
	g := loadGrammar(t)
	line := "σ [MPa] = 1 MPa -- 𝜎 here"
	row := scopesByUnit(g, line)
	if len(row) != len(utf16Of(line)) {
		t.Fatalf("%d units, want %d", len(row), len(utf16Of(line)))
	}
	if last := row[len(row)-1]; !strings.Contains(last, "comment.line.double-dash.sheaf") {
		t.Errorf("last unit scoped %q", last)
	}
	out := os.Getenv("SHEAF_TM_DUMP")
	if out == "" {
		return
	}
	paths, _ := filepath.Glob("../../sheets/*.sheaf")
	dump := map[string][][]string{}
	for _, p := range paths {
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		for _, ln := range strings.Split(string(b), "\n") {
			dump[filepath.Base(p)] = append(dump[filepath.Base(p)], scopesByUnit(g, ln))
		}
	}
	b, _ := json.Marshal(dump)
	if err := os.WriteFile(out, b, 0o644); err != nil {
		t.Fatal(err)
	}
}
