package eval_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/check"
)

// TestFailureAtNode: a run-time failure is reported at the cell that
// failed, with the span of the operation that failed (the divisor, the
// call, the index) where the cell's own formula holds it; the cells that
// use it are unknown and report nothing.
func TestFailureAtNode(t *testing.T) {
	cases := []struct {
		name   string
		src    string
		cell   string // the failing cell; "use_it = <cell> * 2" is added
		needle string // the text the problem starts at, on the cell's line
		msg    string
	}{
		{"division", "den = 0\nb = 3 / den\n", "b", "den", "division by zero"},
		{"division by a sum", "den = 1\nb = 3 / (den - 1)\n", "b", "den - 1", "division by zero"},
		{"sqrt", "neg = -4\nb = 1 + sqrt(neg)\n", "b", "sqrt(neg)", "square root of a negative number"},
		{"ln", "z = 0\nb = ln(z) + 1\n", "b", "ln(z)", "logarithm of a number that is not positive"},
		{"log10", "z = -1\nb = log10(z)\n", "b", "log10(z)", "logarithm of a number that is not positive"},
		{"asin", "z = 2\nb = asin(z)\n", "b", "asin(z)", "asin of a number outside -1 to 1"},
		{"acos", "z = -1.5\nb = acos(z)\n", "b", "acos(z)", "acos of a number outside -1 to 1"},
		{"fractional power", "neg = -8\nb = 2 * (neg ^ 0.5)\n", "b", "neg ^ 0.5", "a negative number to a fractional power"},
		{"round step", "step = 0\nb = round(7, step)\n", "b", "step)", "round needs a positive step"},
		{"index", "xs = [1, 2]\nk = 2\nb = xs[k] + 1\n", "b", "xs[k]", "index 2 is out of range: the list has 2 elements, numbered from 0 to 1"},
		{"fractional index", "xs = [1, 2]\nk = 0.5\nb = xs[k]\n", "b", "xs[k]", "index 0.5 is not a whole number: the list has 2 elements"},
		{"record index", "rs = [{a: 1}, {a: 2}]\nk = 3\nb = rs[k].a\n", "b", "rs[k]", "index 3 is out of range: the list has 2 elements"},
		{"interp", "x = 5\nb = interp([0, 1], [0, 1], x)\n", "b", "interp(", "outside the table"},
		{"overflow", "big = 1e300\nb = big * big\n", "b", "big * big", "is not a finite number"},
		{"exp overflow", "x = 1000\nb = exp(x)\n", "b", "exp(x)", "is not a finite number"},
		{"capacity zero", "cap = 0\ndem = 1\ncheck b: dem <= cap\n", "b", "dem <= cap", "capacity must be a positive finite number"},
		{"capacity negative", "cap = -1\ndem = 1\ncheck b: cap >= dem\n", "b", "cap >= dem", "capacity must be a positive finite number"},
		{"demand infinite", "cap = 1\ndem = 1e300 * 1e300\ncheck b: dem <= cap\n", "dem", "1e300", "is not a finite number"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			src := c.src + "use_it = " + c.cell + " * 2\n"
			if strings.HasPrefix(c.name, "capacity") {
				src = c.src + "use_it = 1\n"
			}
			m := compile(t, src)
			st := m.NewState()
			st.Eval()
			bad := cell(t, m, c.cell)
			if st.Known(bad.Index) {
				t.Fatalf("%s is known: %g", c.cell, st.F.Num[bad.Index])
			}
			p := st.Problem(bad.Index)
			if p == nil {
				t.Fatalf("%s failed without a problem", c.cell)
			}
			prefix := c.cell + " "
			if bad.Kind == check.Check {
				prefix = "check " + c.cell
			}
			ln, col := line(t, src, prefix, c.needle)
			if s := p.Range.Start(); s.File != "t.sheaf" || s.Line != ln || s.Col != col {
				t.Errorf("problem at %v, want t.sheaf:%d:%d", s, ln, col)
			}
			if !strings.Contains(p.Summary, c.msg) || !strings.Contains(p.Summary, "`"+c.cell+"`") {
				t.Errorf("summary %q, want %q about `%s`", p.Summary, c.msg, c.cell)
			}
			for _, other := range m.P.Cells {
				if other != bad && st.Problem(other.Index) != nil {
					t.Errorf("%s reported too: %v", other.Name, st.Problem(other.Index))
				}
			}
			if u := cell(t, m, "use_it"); bad.Kind != check.Check && st.Known(u.Index) {
				t.Error("a user of the failed cell has a value")
			}
		})
	}
}

// TestFailureInFunction: a failure inside a user function is reported at
// each calling cell's own line, so that two cells failing in one function
// give two messages (one per line) rather than one message at the
// function that hides the other; the detail says where in the function.
func TestFailureInFunction(t *testing.T) {
	src := "zero = 0\ninv(z) = 1 / z\nb = inv(zero)\nc = inv(zero) + 1\n"
	m := compile(t, src)
	st := m.NewState()
	st.Eval()
	for _, name := range []string{"b", "c"} {
		c := cell(t, m, name)
		p := st.Problem(c.Index)
		if p == nil || st.Known(c.Index) {
			t.Fatalf("%s: known=%v problem=%v", name, st.Known(c.Index), p)
		}
		if p.Range.Start().Line != c.Pos().Line || !strings.Contains(p.Summary, "division by zero") {
			t.Errorf("%s: problem %v, want division by zero on line %d", name, p, c.Pos().Line)
		}
		if !strings.Contains(p.Detail, "t.sheaf:2:14") || !strings.Contains(p.Detail, "`inv`") {
			t.Errorf("%s: detail %q should name `inv` and the divisor at t.sheaf:2:14", name, p.Detail)
		}
	}
}

// TestCheckOutcomes: a check's utilisation is demand / capacity; it cannot
// be assessed when the capacity is not a positive finite number, the
// demand is not finite, or the demand is negative (of the other sense than
// the capacity: a negative utilisation would pass by accident). Definition
// of utilisation: SPEC.md section 5.
func TestCheckOutcomes(t *testing.T) {
	m := compile(t, "dem = 1\ncap = 1\ncheck u: dem <= cap\ncheck v: cap >= dem\n")
	st := m.NewState()
	u, v := cell(t, m, "u").Index, cell(t, m, "v").Index
	values := []float64{0, 1, -1, 0.25, 1e-300, 1e300, math.Inf(1), math.Inf(-1), math.NaN()}
	for _, d := range values {
		for _, cp := range values {
			st.Set(cell(t, m, "dem").Index, d)
			st.Set(cell(t, m, "cap").Index, cp)
			st.Eval()
			want := d / cp
			assessable := cp > 0 && !math.IsInf(cp, 0) && finite(d) && d >= 0
			for _, i := range []int{u, v} {
				if st.Known(i) != assessable {
					t.Errorf("dem=%g cap=%g: known=%v, want %v (%v)", d, cp, st.Known(i), assessable, st.Problem(i))
					continue
				}
				if !assessable {
					if p := st.Problem(i); p == nil || !strings.Contains(p.Summary, "assessed") {
						t.Errorf("dem=%g cap=%g: problem %v", d, cp, p)
					}
					continue
				}
				if st.F.Num[i] != want || st.Demand[i] != d || st.Capacity[i] != cp {
					t.Errorf("dem=%g cap=%g: util %g demand %g capacity %g, want util %g", d, cp, st.F.Num[i], st.Demand[i], st.Capacity[i], want)
				}
			}
		}
	}
}
