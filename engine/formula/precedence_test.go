package formula

import (
	"flag"
	"os"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite testdata/precedence.golden from the current parser")

// TestPrecedence: every way of joining a few names with the binary
// operators, the words and the signs parses to the tree (or the first
// error) recorded in testdata/precedence.golden, with and without
// Options.Range. The golden was recorded from the recursive-descent parser
// that read one rule per function, before precedence climbing replaced it,
// so the two read every one of these formulas alike.
func TestPrecedence(t *testing.T) {
	ops := []string{"or", "and", "<", "==", "+", "-", "*", "/", "^"}
	prefixes := []string{"", "not ", "-"} // a unary plus reads as a minus does
	var formulas []string
	// Two and three operands, each with any prefix; four without.
	for _, p1 := range prefixes {
		for _, o1 := range ops {
			for _, p2 := range prefixes {
				formulas = append(formulas, p1+"a "+o1+" "+p2+"b")
				for _, o2 := range ops {
					for _, p3 := range prefixes {
						formulas = append(formulas, p1+"a "+o1+" "+p2+"b "+o2+" "+p3+"c")
					}
				}
			}
		}
	}
	for _, o1 := range ops {
		for _, o2 := range ops {
			for _, o3 := range ops {
				formulas = append(formulas, "a "+o1+" b "+o2+" c "+o3+" d")
			}
		}
	}
	// Comparisons in a row, the case a range check reads.
	for _, o1 := range []string{"<", "<=", ">", ">=", "=="} {
		for _, o2 := range []string{"<", "<=", ">", ">=", "!="} {
			formulas = append(formulas, "a "+o1+" b "+o2+" c", "a and b "+o1+" c "+o2+" d", "-a "+o1+" +b + c "+o2+" d ^ e")
		}
	}
	read := func(s string, opt Options) string {
		f, errs := Parse(expr(s), opt)
		if len(errs) > 0 {
			return "error " + errs[0].Range.Start().String() + " " + errs[0].Summary
		}
		return f.String()
	}
	var got strings.Builder
	for _, s := range formulas {
		got.WriteString(s + "\t" + read(s, Options{}) + "\t" + read(s, Options{Range: true}) + "\n")
	}
	const golden = "testdata/precedence.golden"
	if *update {
		if err := os.WriteFile(golden, []byte(got.String()), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatal(err)
	}
	gotLines, wantLines := strings.Split(got.String(), "\n"), strings.Split(string(want), "\n")
	if len(gotLines) != len(wantLines) {
		t.Fatalf("%d formulas, the golden has %d", len(gotLines), len(wantLines))
	}
	bad := 0
	for i := range gotLines {
		if gotLines[i] != wantLines[i] {
			if bad++; bad <= 10 {
				t.Errorf("got  %s\nwant %s", gotLines[i], wantLines[i])
			}
		}
	}
	if bad > 0 {
		t.Errorf("%d of %d formulas differ", bad, len(formulas))
	}
}
