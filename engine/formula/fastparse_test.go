package formula

import (
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/expr-lang/expr/ast"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// The fast parser must build exactly expr-lang's tree: these tests compare
// the two parsers' trees node by node (type, operator, value, flags and
// location) and through ast.Node.String(). The reference is expr-lang's
// own parser (github.com/expr-lang/expr/parser, v1.17.8), run with the
// same configuration.

// dumpTree prints n with every field the sheet's layers read, including
// each node's location, so that two trees print the same only when they
// are the same.
func dumpTree(b *strings.Builder, n ast.Node) {
	if n == nil {
		b.WriteString("nil")
		return
	}
	loc := n.Location()
	fmt.Fprintf(b, "%T@%d-%d", n, loc.From, loc.To)
	switch n := n.(type) {
	case *ast.IdentifierNode:
		fmt.Fprintf(b, "(%s)", n.Value)
	case *ast.IntegerNode:
		fmt.Fprintf(b, "(%d)", n.Value)
	case *ast.FloatNode:
		b.WriteString("(" + strconv.FormatFloat(n.Value, 'g', -1, 64) + ")")
	case *ast.BoolNode:
		fmt.Fprintf(b, "(%t)", n.Value)
	case *ast.StringNode:
		fmt.Fprintf(b, "(%q)", n.Value)
	case *ast.UnaryNode:
		fmt.Fprintf(b, "(%s)", n.Operator)
	case *ast.BinaryNode:
		fmt.Fprintf(b, "(%s)", n.Operator)
	case *ast.MemberNode:
		fmt.Fprintf(b, "(opt=%t,method=%t)", n.Optional, n.Method)
	case *ast.BuiltinNode:
		fmt.Fprintf(b, "(%s,nil=%t)", n.Name, n.Arguments == nil)
	case *ast.CallNode:
		fmt.Fprintf(b, "(nil=%t)", n.Arguments == nil)
	case *ast.ArrayNode:
		fmt.Fprintf(b, "(nil=%t)", n.Nodes == nil)
	case *ast.MapNode:
		fmt.Fprintf(b, "(nil=%t)", n.Pairs == nil)
	case *ast.ConditionalNode:
		fmt.Fprintf(b, "(ternary=%t)", n.Ternary)
	case *ast.PointerNode:
		fmt.Fprintf(b, "(%s)", n.Name)
	case *ast.VariableDeclaratorNode:
		fmt.Fprintf(b, "(%s)", n.Name)
	}
	b.WriteString("[")
	for i, c := range children(n) {
		if i > 0 {
			b.WriteString(" ")
		}
		dumpTree(b, c)
	}
	b.WriteString("]")
}

func dump(n ast.Node) string {
	var b strings.Builder
	dumpTree(&b, n)
	return b.String()
}

// rewrite returns the text expr-lang parses for formula text: every
// quantity literal replaced by its synthetic name, as Parse does.
func rewrite(text string) string {
	lits, _, _ := scan(text)
	var b strings.Builder
	last := 0
	for i, l := range lits {
		b.WriteString(text[last:l.off])
		b.WriteString(SyntheticPrefix + strconv.Itoa(i))
		last = l.end
	}
	b.WriteString(text[last:])
	return b.String()
}

// differ compares the two parsers on text. It reports whether the fast
// path accepted the text, and a description of any difference.
func differ(text string, maxNodes uint) (accepted bool, diff string) {
	fast, _ := fastParse(text, maxNodes)
	if fast == nil {
		return false, ""
	}
	ref, err := exprParse(text, maxNodes)
	if err != nil {
		return true, fmt.Sprintf("fast path accepted %q, expr-lang reports %v", text, err)
	}
	if a, b := dump(fast), dump(ref); a != b {
		return true, fmt.Sprintf("%q:\n fast %s\n expr %s", text, a, b)
	}
	if a, b := fast.String(), ref.String(); a != b {
		return true, fmt.Sprintf("%q: String() fast %s, expr %s", text, a, b)
	}
	return true, ""
}

// corpus gathers every formula the repository holds: the expressions of
// every .sheaf file (example sheets, broken sheets, test sheets), the
// cases of the sheet parser's chunked test file, the fuzz seeds of the
// formula and sheet parsers, and the formulas of the generated benchmark
// sheet.
func corpus(t *testing.T) []string {
	t.Helper()
	root := filepath.Join("..", "..")
	var out []string
	addSheet := func(name string, src []byte) {
		f, _ := sheet.Parse(name, src, sheet.MaxBytes(64<<20))
		if f == nil {
			return
		}
		for _, it := range f.Items {
			switch it := it.(type) {
			case *sheet.Cell:
				out = append(out, it.Expr.Text)
			case *sheet.FuncDef:
				out = append(out, it.Body.Text)
			case *sheet.Check:
				out = append(out, it.Body.Text)
			case *sheet.Use:
				for _, c := range it.Overrides {
					out = append(out, c.Expr.Text)
				}
			}
		}
	}
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && strings.HasPrefix(d.Name(), ".") && path != root {
			return filepath.SkipDir
		}
		switch {
		case strings.HasSuffix(path, ".sheaf"), strings.HasSuffix(path, ".chunks"):
			src, err := os.ReadFile(path)
			if err != nil {
				return err
			}
			addSheet(path, src)
			if strings.HasSuffix(path, ".chunks") {
				for _, chunk := range strings.Split(string(src), "\n---") {
					addSheet(path, []byte(chunk))
				}
			}
		case strings.Contains(path, filepath.Join("testdata", "fuzz", "FuzzFormula")),
			strings.Contains(path, filepath.Join("testdata", "fuzz", "FuzzFastParser")):
			if !d.IsDir() {
				out = append(out, seedStrings(t, path)...)
			}
		case strings.Contains(path, filepath.Join("testdata", "fuzz", "FuzzParse")):
			if !d.IsDir() {
				for _, s := range seedStrings(t, path) {
					addSheet(path, []byte(s))
				}
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	// The generated benchmark sheet (engine/bench_test.go) repeats these
	// four shapes with other indices.
	for _, k := range []int{0, 7, 99} {
		out = append(out,
			fmt.Sprintf("P%d * 2 + 1 kN", k),
			fmt.Sprintf("c%d_0 * 0.5 + P%d / 4", k, k),
			fmt.Sprintf("(c%d_%d / A) * 100 mm^2 + P%d / 10", k, 9, k),
			fmt.Sprintf("(c%d_%d + c%d_%d) / 2 + P%d / 10", k, 12, k, 11, k))
	}
	return out
}

// seedStrings reads the string and []byte values of a fuzz corpus file.
func seedStrings(t *testing.T, path string) []string {
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, line := range strings.Split(string(src), "\n")[1:] {
		for _, pre := range []string{"string(", "[]byte("} {
			if rest, ok := strings.CutPrefix(line, pre); ok {
				if s, err := strconv.Unquote(strings.TrimSuffix(rest, ")")); err == nil {
					out = append(out, s)
				}
			}
		}
	}
	return out
}

// TestFastParseDifferential: for every formula of the corpus, as written
// and as rewritten for expr-lang, the fast parser either declines or
// builds expr-lang's tree exactly.
func TestFastParseDifferential(t *testing.T) {
	texts := corpus(t)
	if len(texts) < 200 {
		t.Fatalf("corpus has only %d formulas; the repository's sheets were not found", len(texts))
	}
	accepted := 0
	for _, text := range texts {
		for _, s := range []string{text, rewrite(text)} {
			ok, diff := differ(s, 10000)
			if diff != "" {
				t.Error(diff)
			}
			if ok {
				accepted++
			}
		}
	}
	// Most formulas of real sheets are in the subset; if this drops, the
	// fast path stopped covering them and loading slows down.
	if accepted < len(texts) {
		t.Errorf("fast path accepted %d of %d texts", accepted, 2*len(texts))
	}
	t.Logf("%d formulas, fast path accepted %d of %d texts", len(texts), accepted, 2*len(texts))
}

// TestFastParseCases covers the subset's edges, each case accepted or
// declined by the fast path, and in both cases equal to expr-lang when
// accepted.
func TestFastParseCases(t *testing.T) {
	cases := []struct {
		text   string
		accept bool
	}{
		// accepted: the subset
		{"a", true},
		{"a + b * c - d / e", true},
		{"a - b - c", true},   // left associative
		{"a ^ b ^ c", true},   // right associative
		{"a ** b ^ c", true},  // both power spellings
		{"-a ^ 2", true},      // unary binds looser than ^
		{"-a * 2", true},      // and tighter than *
		{"+a", true},          // unary plus kept in the tree
		{"!(a < b)", true},    // negation
		{"- - a", true},       // nested unary
		{"(a + b) * c", true}, // parentheses leave no node
		{"((a))", true},       // nested parentheses
		{"a < b", true},       // comparisons
		{"a <= b <= c", true}, // chained comparison: a <= b && b <= c
		{"a < b > c >= d", true},
		{"a == b != c", true},
		{"a < b and c > d or e == f", true},
		{"a && b || c", true},
		{"a ? b : c", true},                      // ternary, placed at the token after it
		{"(a ? b : c) + 1", true},                // ... here `)`
		{"a ? b ? c : d : e", true},              // nested
		{"a ? b : c ? d : e", true},              // chained
		{"a ?: b", true},                         // short form
		{"f()", true},                            // call without arguments
		{"f(a, b)", true},                        // with
		{"f(a, b,)", true},                       // trailing comma
		{"f(g(a), h(b, c))", true},               // nested calls
		{"sqrt(A_s) * 2 ^ 0.5", true},            // number kinds
		{"r.x", true},                            // member
		{"r.x.y", true},                          // chained members
		{"xs[0]", true},                          // index
		{"xs[i + 1][2]", true},                   // nested index
		{"t.L[2] * f(x).y", true},                // mixed postfix
		{"[1, 2, 3]", true},                      // list
		{"[a, b,]", true},                        // trailing comma
		{"[]", true},                             // empty list (the typer rejects it)
		{"[1, 2][0]", true},                      // index of a list literal
		{"{E: a, f_y: b}", true},                 // record
		{"{E: a}.E", true},                       // member of a record literal
		{"{1: a, \"k\": b, true: c}", true},      // number, string and name keys
		{"{}", true},                             // empty record
		{"f(\"fixed\")", true},                   // plain string argument
		{"f('pinned')", true},                    // single quotes
		{"sum(xs)", true},                        // closure built-in without predicate
		{"count(xs) + 1", true},                  //
		{"1_000 + 2.5e-3 + .5 + 1. + 7E2", true}, // number spellings
		{"007", true},                            // leading zeros
		{"true == false", true},                  // booleans
		{"σ_Ed / f_yd", true},                    // Greek names: locations count runes
		{"µ + ε\t*\nβ", true},                    // tabs and newlines are space
		{"$x + x$1", true},                       // expr-lang names may hold $
		{"a  +  b   ", true},                     // spaces, trailing
		{"__q0 * __q1 + x", true},                // synthetic names
		// declined: left to expr-lang
		{"", false},
		{"a +", false},
		{"(a", false},
		{"a)", false},
		{"f(", false},
		{"f(,a)", false},
		{"a b", false},
		{"a % b", false},
		{"1..3", false},
		{"a ?? b", false},
		{"a?.b", false},
		{"x | f()", false},
		{"a; b", false},
		{"let x = 1; x", false},
		{"if a { b } else { c }", false},
		{"not a", false},
		{"a in b", false},
		{"a not in b", false},
		{"map(xs, # * 2)", false},
		{"sum(xs, # > 0)", false},
		{"sum(xs,)", false},
		{"sum()", false},
		{"filter(xs, .a)", false},
		{"xs[1:2]", false},
		{"xs[:2]", false},
		{"r.f(x)", false},
		{"r.and", false},
		{"nil", false},
		{"0x1F", false},
		{"0b101", false},
		{"2x", false},
		{"1e", false},
		{"1e400", false},
		{"99999999999999999999", false},
		{"\"a\\nb\"", false},
		{"\"µ\"", false},
		{"`raw`", false},
		{"b\"bytes\"", false},
		{"a // comment", false},
		{"a /* c */ + b", false},
		{"a = b", false},
		{"a & b", false},
		{"a <* b", false},
		{"::f()", false},
		{"{(a): 1}", false},
		{"{a: 1,,}", false},
		{"2 .x", false},
		{".5.3", false},
		{"@", false},
	}
	for _, c := range cases {
		ok, diff := differ(c.text, 10000)
		if diff != "" {
			t.Error(diff)
		}
		if ok != c.accept {
			t.Errorf("%q: fast path accepted=%t, want %t", c.text, ok, c.accept)
		}
	}
}

// TestFastParseNodeLimit: the fast path declines beyond the node limit,
// so expr-lang reports it.
func TestFastParseNodeLimit(t *testing.T) {
	text := "a + b + c + d" // 7 nodes
	for _, limit := range []uint{3, 6, 7, 8} {
		ok, diff := differ(text, limit)
		if diff != "" {
			t.Error(diff)
		}
		if want := limit >= 7; ok != want {
			t.Errorf("limit %d: accepted=%t, want %t", limit, ok, want)
		}
	}
}

// FuzzFastParser: on any input the fast parser either declines or agrees
// with expr-lang exactly, both on the text and on its rewritten form.
func FuzzFastParser(f *testing.F) {
	for _, s := range []string{"a + b * c", "(c_1 + c_2) / 2 + P / 10", "a <= b <= c", "a ? b : c",
		"f(a, b,)[0].x", "{E: 1, 2: x}", "[1, 2,]", "-a ^ -b ** c", "sum(xs)", "σ + \"s\"", "1_0.5e+3"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		for _, s := range []string{text, rewrite(text)} {
			if _, diff := differ(s, 200); diff != "" {
				t.Fatal(diff)
			}
		}
	})
}
