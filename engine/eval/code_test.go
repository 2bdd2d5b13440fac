package eval

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/funcs"
)

// TestCodeMatchesClosures runs every formula both ways, as its code on the
// stack machine and as the tree of closures numOf compiles, over a sweep
// of inputs that includes zeros of both signs, infinities and NaN, and
// requires the same bits and the same failure (message and place). The
// closures are the reference: the operator tests of this package check
// them against Go's own arithmetic.
func TestCodeMatchesClosures(t *testing.T) {
	deep := "x"
	for range maxDepth + 2 {
		deep = "(y - " + deep + ")"
	}
	long := "x" + strings.Repeat(" + y", 3000)
	cases := []struct {
		expr string
		call bool // the code is one call of a closure
	}{
		{"x + y", false}, {"x - y", false}, {"x * y", false}, {"x / y", false},
		{"y / x", false}, {"x + 2", false}, {"x - 2", false}, {"x * 2", false},
		{"x / 2", false}, {"2 - x", false}, {"2 / x", false}, {"-x", false},
		{"-(x - y) * z", false}, {"(x + y) / (x - y)", false}, {"(x / y) / (y / x)", false},
		{"x ^ 2", false}, {"x ^ 3", false}, {"x ^ y", false}, {"x ^ 0.5", false},
		{"(x + y) / 2 + z / 10", false}, {"x * (y + z * (x - y))", false},
		{"1 / (x - x)", false}, {"(1 / y) + (1 / x)", false}, {"(x / y) ^ (y / x)", false},
		{"-0 + x", false}, {"x * -0", false},
		{"sqrt(x) + y", false}, {"x > y ? x : y", true}, {"min(x, y) * 2", false},
		{"abs(x) / y", false}, {deep, true}, {long, false},
	}
	var src strings.Builder
	src.WriteString("x = 1\ny = 1\nz = 3\n")
	for k, c := range cases {
		fmt.Fprintf(&src, "c%d = %s\n", k, c.expr)
	}
	f, errs := sheet.Parse("t.sheaf", []byte(src.String()))
	if errs.HasErrors() {
		t.Fatal(errs)
	}
	p, errs := check.Sheet(f, check.Options{})
	if errs.HasErrors() {
		t.Fatal(errs)
	}
	m := Compile(p)
	for k, c := range cases {
		cell := p.Lookup(fmt.Sprintf("c%d", k))
		code := m.codeOf(cell.Index)
		if len(code) == 0 {
			t.Fatalf("%s: no code", c.expr)
		}
		if call := len(code) == 1 && code[0].op() == opCall; call != c.call {
			t.Errorf("%s: code is one call: %v, want %v", c.expr, call, c.call)
		}
		sameBothWays(t, m, cell, c.expr)
	}
}

// sweepXY are the inputs a formula of x and y is run on both ways.
var sweepXY = []float64{0, math.Copysign(0, -1), 1, -2.5, 3, 1e300, -1e-300, math.Inf(1), math.Inf(-1), math.NaN()}

// sameBothWays runs cell, a formula of x, y and z (the first three cells
// of m's program), as code and as closures over sweepXY, and reports any
// difference in bits or in failure.
func sameBothWays(t *testing.T, m *Machine, cell *check.Cell, expr string) {
	t.Helper()
	code, ref := m.codeOf(cell.Index), m.numOf(cell.Body())
	for _, x := range sweepXY {
		for _, y := range sweepXY {
			var a, b Frame
			for _, fr := range []*Frame{&a, &b} {
				fr.Num = make([]float64, len(m.P.Cells))
				fr.Num[0], fr.Num[1], fr.Num[2] = x, y, 3
			}
			got, want := m.exec(&a, code), ref(&b)
			if math.Float64bits(got) != math.Float64bits(want) && !(math.IsNaN(got) && math.IsNaN(want)) {
				t.Errorf("%s at x=%g y=%g: code gives %g, closures %g", expr, x, y, got, want)
			}
			if (a.Fail == nil) != (b.Fail == nil) {
				t.Fatalf("%s at x=%g y=%g: code fails %v, closures %v", expr, x, y, a.Fail, b.Fail)
			}
			if a.Fail != nil && (a.Fail.Msg != b.Fail.Msg || a.Fail.Node.Range() != b.Fail.Node.Range()) {
				t.Errorf("%s at x=%g y=%g: code fails with %q at %v, closures with %q at %v", expr, x, y,
					a.Fail.Msg, a.Fail.Node.Range().Start(), b.Fail.Msg, b.Fail.Node.Range().Start())
			}
		}
	}
}

// FuzzCodeMatchesClosures compiles a formula of x, y and z that checks
// and runs it both ways: any formula the checker accepts as a number
// must give the same bits and the same failure.
func FuzzCodeMatchesClosures(f *testing.F) {
	for _, s := range []string{"x + y", "(x + y) / 2 + z / 10", "x ^ y - 2 / x", "-(x * y) / (y - x)",
		"sqrt(x) + min(x, y) * 2", "x > y ? x / y : y ^ 3", "1 / (x - x) + y"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, expr string) {
		if strings.ContainsAny(expr, "\n\r#") {
			return // one line of formula
		}
		src := "x = 1\ny = 1\nz = 3\nc = " + expr + "\n"
		sf, errs := sheet.Parse("t.sheaf", []byte(src))
		if sf == nil || errs.HasErrors() {
			return
		}
		p, errs := check.Sheet(sf, check.Options{})
		if errs.HasErrors() {
			return
		}
		cell := p.Lookup("c")
		if cell == nil || cell.Type == nil || cell.Body().IsZero() || cell.Body().Type().Kind != funcs.Number || len(p.Cells) != 4 {
			return
		}
		sameBothWays(t, Compile(p), cell, expr)
	})
}
