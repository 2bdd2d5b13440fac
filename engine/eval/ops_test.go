package eval_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/eval"
)

// sweep are the values every operator and built-in is run on: zeros of
// both signs, small and large magnitudes, the extremes of float64, and
// the infinities and NaN that an override can bring in.
var sweep = []float64{
	0, math.Copysign(0, -1), 1, -1, 2, 0.5, -2.5, 3, 7.25, math.Pi / 2,
	1e-300, 1e300, -1e300, math.MaxFloat64, math.SmallestNonzeroFloat64,
	math.Inf(1), math.Inf(-1), math.NaN(),
}

// b2f is a comparison's truth as the 1 or 0 a test cell selects with `? 1 : 0`.
func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

// numCase is a cell of plain numbers over the inputs x and y and the Go
// expression it must equal. rel is the relative tolerance: 0 where the
// evaluator performs the same IEEE 754 operations as the Go expression
// and so must agree to the bit.
type numCase struct {
	name, expr string
	want       func(x, y float64) float64
	rel        float64
}

// runSweep compiles one sheet holding every case over the inputs x and y,
// sets each pair of sweep values in turn (recomputing incrementally), and
// checks every cell: where the Go expression is finite, the cell is known
// and equal to it; where it is NaN or infinite, the cell is unknown and its
// problem is reported on the cell's line of the sheet.
func runSweep(t *testing.T, extra string, cases []numCase) {
	t.Helper()
	var src strings.Builder
	src.WriteString("x = 1\ny = 1\n" + extra)
	for _, c := range cases {
		fmt.Fprintf(&src, "%s = %s\n", c.name, c.expr)
	}
	m := compile(t, src.String())
	st := m.NewState()
	ix, iy := cell(t, m, "x").Index, cell(t, m, "y").Index
	for _, x := range sweep {
		for _, y := range sweep {
			st.Set(ix, x)
			st.Set(iy, y)
			st.Eval()
			for _, c := range cases {
				checkCell(t, st, cell(t, m, c.name), c.want(x, y), c.rel, fmt.Sprintf("%s with x=%g y=%g", c.expr, x, y))
			}
		}
	}
}

// checkCell checks one cell's outcome against want (see runSweep).
func checkCell(t *testing.T, st *eval.State, cc *check.Cell, want, rel float64, what string) {
	t.Helper()
	i := cc.Index
	if finite(want) {
		if !st.Known(i) {
			t.Errorf("%s: unknown (%v), want %.17g", what, st.Problem(i), want)
		} else if got := st.F.Num[i]; !within(got, want, rel) {
			t.Errorf("%s = %.17g, want %.17g", what, got, want)
		}
		if st.Problem(i) != nil {
			t.Errorf("%s: problem %v on a finite result", what, st.Problem(i))
		}
		return
	}
	if st.Known(i) {
		t.Errorf("%s = %.17g, want a failure (Go gives %g)", what, st.F.Num[i], want)
		return
	}
	p := st.Problem(i)
	if p == nil {
		t.Errorf("%s: unknown without a problem", what)
		return
	}
	if p.Range.Start().File != "t.sheaf" || p.Range.Start().Line != cc.Pos().Line || !strings.Contains(p.Summary, "`"+cc.Name+"`") {
		t.Errorf("%s: problem %v, want one naming `%s` on line %d", what, p, cc.Name, cc.Pos().Line)
	}
}

// TestOperators checks every operator of the language against the same
// operation in Go, over every pair of sweep values.
//
// Source: the Go specification's arithmetic operators and comparisons
// (IEEE 754 binary64), and Go's math.Pow, for the expected values.
func TestOperators(t *testing.T) {
	runSweep(t, "cmp = x < y\n", []numCase{
		{"add", "x + y", func(x, y float64) float64 { return x + y }, 0},
		{"sub", "x - y", func(x, y float64) float64 { return x - y }, 0},
		{"mul", "x * y", func(x, y float64) float64 { return x * y }, 0},
		{"mul_const", "x * 2.5", func(x, y float64) float64 { return x * 2.5 }, 0},
		{"div", "x / y", func(x, y float64) float64 { return x / y }, 0},
		{"power", "x ^ y", math.Pow, 0},
		// x^2 and x^3 multiply instead of calling math.Pow: equal up to
		// the rounding of one product.
		{"square", "x ^ 2", func(x, y float64) float64 { return math.Pow(x, 2) }, 1e-15},
		{"cube", "x ^ 3", func(x, y float64) float64 { return math.Pow(x, 3) }, 1e-15},
		{"pow_right", "2 ^ x ^ 2", func(x, y float64) float64 { return math.Pow(2, math.Pow(x, 2)) }, 1e-12},
		{"neg", "-x", func(x, y float64) float64 { return -x }, 0},
		{"plus", "+x", func(x, y float64) float64 { return x }, 0},
		{"neg_neg", "-(-x)", func(x, y float64) float64 { return x }, 0},
		{"precedence", "x + y * 2 ^ 2 / 4 - 1", func(x, y float64) float64 { return x + y*4/4 - 1 }, 0},
		{"parens", "(x + y) * (x - y)", func(x, y float64) float64 { return (x + y) * (x - y) }, 0},
		{"lt", "x < y ? 1 : 0", func(x, y float64) float64 { return b2f(x < y) }, 0},
		{"le", "x <= y ? 1 : 0", func(x, y float64) float64 { return b2f(x <= y) }, 0},
		{"gt", "x > y ? 1 : 0", func(x, y float64) float64 { return b2f(x > y) }, 0},
		{"ge", "x >= y ? 1 : 0", func(x, y float64) float64 { return b2f(x >= y) }, 0},
		{"eq", "x == y ? 1 : 0", func(x, y float64) float64 { return b2f(x == y) }, 0},
		{"ne", "x != y ? 1 : 0", func(x, y float64) float64 { return b2f(x != y) }, 0},
		{"and_word", "x < y and y < 2 ? 1 : 0", func(x, y float64) float64 { return b2f(x < y && y < 2) }, 0},
		{"or_word", "x < y or y < 0 ? 1 : 0", func(x, y float64) float64 { return b2f(x < y || y < 0) }, 0},
		{"not_word", "not (x < y) ? 1 : 0", func(x, y float64) float64 { return b2f(!(x < y)) }, 0},
		{"cond", "x > y ? x - y : y - x", func(x, y float64) float64 {
			if x > y {
				return x - y
			}
			return y - x
		}, 0},
		{"cond_nested", "x > 0 ? (y > 0 ? 1 : 2) : 3", func(x, y float64) float64 {
			switch {
			case x > 0 && y > 0:
				return 1
			case x > 0:
				return 2
			}
			return 3
		}, 0},
		{"bool_cell", "cmp ? x : y", func(x, y float64) float64 {
			if x < y {
				return x
			}
			return y
		}, 0},
		{"const_pi", "x * pi", func(x, y float64) float64 { return x * math.Pi }, 0}, // Source: Go math.Pi
	})
}

// TestBuiltins checks every built-in function of one or two numbers against
// Go's math package over every pair of sweep values. A domain error (a
// square root of a negative number, ln of zero, asin of 2) gives NaN or an
// infinity in Go and a failure reported at the cell in Sheaf.
//
// Source: Go's math package (Sqrt, Cbrt, Abs, Exp, Log, Log10, Sin, Cos,
// Tan, Asin, Acos, Atan, Atan2, Hypot, Floor, Ceil, Round, Min, Max, Pow).
func TestBuiltins(t *testing.T) {
	one := func(g func(float64) float64) func(x, y float64) float64 {
		return func(x, y float64) float64 { return g(x) }
	}
	runSweep(t, "", []numCase{
		{"f_sqrt", "sqrt(x)", one(math.Sqrt), 0},
		{"f_cbrt", "cbrt(x)", one(math.Cbrt), 0},
		{"f_abs", "abs(x)", one(math.Abs), 0},
		{"f_exp", "exp(x)", one(math.Exp), 0},
		{"f_ln", "ln(x)", one(math.Log), 0},
		{"f_log10", "log10(x)", one(math.Log10), 0},
		{"f_sin", "sin(x * 1 rad)", one(math.Sin), 0},
		{"f_cos", "cos(x * 1 rad)", one(math.Cos), 0},
		{"f_tan", "tan(x * 1 rad)", one(math.Tan), 0},
		{"f_asin", "asin(x)", one(math.Asin), 0},
		{"f_acos", "acos(x)", one(math.Acos), 0},
		{"f_atan", "atan(x)", one(math.Atan), 0},
		{"f_floor", "floor(x)", one(math.Floor), 0},
		{"f_ceil", "ceil(x)", one(math.Ceil), 0},
		{"f_round", "round(x)", one(math.Round), 0},
		{"f_atan2", "atan2(y, x)", func(x, y float64) float64 { return math.Atan2(y, x) }, 0},
		{"f_hypot", "hypot(x, y)", math.Hypot, 0},
		// Three or more arguments fold pairwise from the left.
		{"f_hypot3", "hypot(x, y, 2)", func(x, y float64) float64 { return math.Hypot(math.Hypot(x, y), 2) }, 0},
		{"f_min", "min(x, y)", math.Min, 0},
		{"f_max", "max(x, y)", math.Max, 0},
		{"f_min3", "min(x, y, 0.5)", func(x, y float64) float64 { return math.Min(math.Min(x, y), 0.5) }, 0},
		{"f_max3", "max(x, y, 0.5)", func(x, y float64) float64 { return math.Max(math.Max(x, y), 0.5) }, 0},
		{"f_pow_half", "pow(x, 0.5)", func(x, y float64) float64 { return math.Pow(x, 0.5) }, 0},
		{"f_pow_two", "pow(x, 2)", func(x, y float64) float64 { return math.Pow(x, 2) }, 1e-15},
		// round to a step: the nearest multiple of a positive step; a step
		// that is not positive is refused.
		{"f_round_step", "round(x, y)", func(x, y float64) float64 {
			if !(y > 0) {
				return math.NaN()
			}
			return math.Round(x/y) * y
		}, 0},
	})
}

// TestListBuiltins checks sum, mean, min, max, len and indexing of a list
// cell against loops written here, on lists that include the empty list
// (sum 0, the others fail), NaN and an overflowing sum.
//
// Closed forms: sum = x0 + x1 + ... (left to right), mean = sum / n,
// min/max by math.Min/math.Max from the left, len = n; an index must be a
// whole number from 0 to n-1.
func TestListBuiltins(t *testing.T) {
	fold := func(xs []float64, g func(a, b float64) float64) float64 {
		if len(xs) == 0 {
			return math.NaN()
		}
		r := xs[0]
		for _, x := range xs[1:] {
			r = g(r, x)
		}
		return r
	}
	add := func(a, b float64) float64 { return a + b }
	cases := []struct {
		name, expr string
		want       func(xs []float64, i float64) float64
	}{
		{"l_sum", "sum(xs)", func(xs []float64, _ float64) float64 {
			if len(xs) == 0 {
				return 0
			}
			return fold(xs, add)
		}},
		{"l_mean", "mean(xs)", func(xs []float64, _ float64) float64 { return fold(xs, add) / float64(len(xs)) }},
		{"l_min", "min(xs)", func(xs []float64, _ float64) float64 { return fold(xs, math.Min) }},
		{"l_max", "max(xs)", func(xs []float64, _ float64) float64 { return fold(xs, math.Max) }},
		{"l_len", "len(xs)", func(xs []float64, _ float64) float64 { return float64(len(xs)) }},
		{"l_index", "xs[i]", func(xs []float64, i float64) float64 {
			if k := int(i); float64(k) == i && k >= 0 && k < len(xs) {
				return xs[k]
			}
			return math.NaN()
		}},
	}
	var src strings.Builder
	src.WriteString("xs = [1, 2]\ni = 0\n")
	for _, c := range cases {
		fmt.Fprintf(&src, "%s = %s\n", c.name, c.expr)
	}
	m := compile(t, src.String())
	st := m.NewState()
	lists := [][]float64{
		{}, {4}, {3, -1, 2}, {-0.5, -0.25}, {1e308, 1e308}, {2, math.NaN(), 1}, {math.Inf(1), 1},
	}
	for _, xs := range lists {
		for _, i := range []float64{0, 1, 2, -1, 0.5, 3, math.NaN()} {
			st.Set(cell(t, m, "xs").Index, xs)
			st.Set(cell(t, m, "i").Index, i)
			st.Eval()
			for _, c := range cases {
				checkCell(t, st, cell(t, m, c.name), c.want(xs, i), 0, fmt.Sprintf("%s with xs=%v i=%g", c.expr, xs, i))
			}
		}
	}
}

// TestInterp checks the linear interpolation against the closed form
// y = y_k + (x - x_k)·(y_{k+1} - y_k)/(x_{k+1} - x_k) on the segment
// [x_k, x_{k+1}] that holds x (common practice), and its refusals.
func TestInterp(t *testing.T) {
	closed := func(xs, ys []float64, x float64) float64 {
		for k := 0; k+1 < len(xs); k++ {
			if x >= xs[k] && x <= xs[k+1] {
				return ys[k] + (x-xs[k])*(ys[k+1]-ys[k])/(xs[k+1]-xs[k])
			}
		}
		return ys[0] // one point: x equals it
	}
	ok := []struct {
		xs, ys []float64
		x      float64
	}{
		{[]float64{0, 2, 4}, []float64{0, 10, 30}, 3},
		{[]float64{0, 2, 4}, []float64{0, 10, 30}, 0},
		{[]float64{0, 2, 4}, []float64{0, 10, 30}, 4},
		{[]float64{0, 2, 4}, []float64{0, 10, 30}, 2},
		{[]float64{-1, 0.5, 7}, []float64{3, -2, 5}, 0.1},
		{[]float64{1e-3, 2e-3}, []float64{210e9, 200e9}, 1.25e-3},
		{[]float64{5}, []float64{8}, 5},
	}
	for _, c := range ok {
		got, msg := eval.Interp(c.xs, c.ys, c.x)
		if want := closed(c.xs, c.ys, c.x); msg != "" || !within(got, want, 1e-14) {
			t.Errorf("Interp(%v, %v, %g) = %g %q, want %g", c.xs, c.ys, c.x, got, msg, want)
		}
	}
	bad := []struct {
		xs, ys []float64
		x      float64
		msg    string
	}{
		{[]float64{0, 1}, []float64{0, 1}, 1.5, "outside the table"},
		{[]float64{0, 1}, []float64{0, 1}, -0.1, "outside the table"},
		{[]float64{0, 1}, []float64{0, 1}, math.NaN(), "outside the table"},
		{[]float64{0, 1}, []float64{0, 1}, math.Inf(1), "outside the table"},
		{[]float64{0, 1, 1}, []float64{0, 1, 2}, 0.5, "increasing order (entry 2"},
		{[]float64{2, 1}, []float64{0, 1}, 1.5, "increasing order (entry 1"},
		{[]float64{0, math.NaN()}, []float64{0, 1}, 0.5, "increasing order"},
		{[]float64{0, 1}, []float64{0}, 0.5, "equal length (2 and 1)"},
		{nil, nil, 0, "at least one point"},
	}
	for _, c := range bad {
		if _, msg := eval.Interp(c.xs, c.ys, c.x); !strings.Contains(msg, c.msg) {
			t.Errorf("Interp(%v, %v, %g): %q, want %q", c.xs, c.ys, c.x, msg, c.msg)
		}
	}
}
