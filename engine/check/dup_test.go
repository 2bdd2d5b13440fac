package check

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestDuplicatesPointAtFirst defines names twice and three times, before
// and after one another: each later definition is reported at its own
// line with the line of the first, and the name keeps naming the first
// cell. Source: SPEC.md §2 (the checker refuses duplicate names).
func TestDuplicatesPointAtFirst(t *testing.T) {
	src := "a = 1\nb = 2\na = 3\nc = 4\nb = 5\na = 6\nd = a + b\n"
	f, errs := sheet.Parse("t.sheaf", []byte(src))
	if errs.HasErrors() {
		t.Fatal(errs)
	}
	p, errs := Sheet(f, Options{})
	want := []struct{ line, first string }{{"t.sheaf:3:1", "t.sheaf:1:1"}, {"t.sheaf:5:1", "t.sheaf:2:1"}, {"t.sheaf:6:1", "t.sheaf:1:1"}}
	var got []string
	for _, e := range errs {
		if strings.Contains(e.Summary, "defined twice") {
			got = append(got, e.Range.Start().String()+" "+e.Detail)
		}
	}
	if len(got) != len(want) {
		t.Fatalf("got %d duplicate errors, want %d: %q", len(got), len(want), got)
	}
	for k, w := range want {
		if !strings.HasPrefix(got[k], w.line+" ") || !strings.Contains(got[k], "first defined at "+w.first) {
			t.Errorf("error %d = %q, want at %s pointing at %s", k, got[k], w.line, w.first)
		}
	}
	for name, line := range map[string]int{"a": 1, "b": 2, "c": 4, "d": 7} {
		if c := p.Lookup(name); c == nil || c.Pos().Line != line {
			t.Errorf("%s names %v, want the cell of line %d", name, c, line)
		}
	}
}
