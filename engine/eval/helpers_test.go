package eval_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// compile reads, checks and compiles src as the evaluator receives it from
// the engine; any syntax or checking error fails the test with the
// rendered messages.
func compile(t testing.TB, src string) *eval.Machine {
	t.Helper()
	f, errs := sheet.Parse("t.sheaf", []byte(src))
	if f != nil {
		p, cerrs := check.Sheet(f, check.Options{})
		errs = append(errs, cerrs...)
		if !errs.HasErrors() {
			return eval.Compile(p)
		}
	}
	var b strings.Builder
	_ = diag.Render(&b, errs, diag.Sources{"t.sheaf": []byte(src)})
	t.Fatalf("the test sheet does not check:\n%s", b.String())
	return nil
}

// cell returns the named cell of m's program.
func cell(t testing.TB, m *eval.Machine, name string) *check.Cell {
	t.Helper()
	c := m.P.Lookup(name)
	if c == nil {
		t.Fatalf("no cell %q", name)
	}
	return c
}

// finite reports whether x is neither NaN nor infinite: the evaluator
// gives a cell a value exactly when Go's arithmetic gives a finite one.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// within reports whether got equals want to a relative tolerance rel
// (bit-equal when rel is 0). Results smaller than the smallest normal
// number get an absolute tolerance of one subnormal step, since rounding
// twice there (as math.Pow does) may differ in the last bit.
func within(got, want, rel float64) bool {
	if got == want {
		return true
	}
	if rel == 0 {
		return false
	}
	if math.Abs(want) < 0x1p-1022 {
		return math.Abs(got-want) <= 0x1p-1074
	}
	return math.Abs(got-want) <= rel*math.Abs(want)
}

// line returns the 1-based number of the line of src that starts with
// prefix, and the 1-based column (in runes) of needle in it.
func line(t testing.TB, src, prefix, needle string) (int, int) {
	t.Helper()
	for i, l := range strings.Split(src, "\n") {
		if strings.HasPrefix(l, prefix) {
			k := strings.Index(l, needle)
			if k < 0 {
				t.Fatalf("%q not on the line %q", needle, l)
			}
			return i + 1, len([]rune(l[:k])) + 1
		}
	}
	t.Fatalf("no line starts with %q", prefix)
	return 0, 0
}
