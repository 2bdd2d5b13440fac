package bar

import (
	"math"
	"strings"
	"testing"
	"unicode"

	"github.com/sheafcalc/sheaf/funcs"
)

// Every mistake a user can make in the bar input gives a clear, lower-case
// message that says what was expected (STYLE.md, "Errors a user sees").
func TestInputErrors(t *testing.T) {
	good := call(t, "bar_uniform", 2.0, 1e-3, 200*GPa)
	nanFn := &funcs.FuncValue{Name: "A_bad", Call: func(x ...float64) float64 {
		if x[0] > 1 {
			return math.NaN()
		}
		return 1e-3
	}}
	negFn := &funcs.FuncValue{Name: "E_neg", Call: func(x ...float64) float64 { return -1 }}
	cases := []struct {
		name string
		fn   string
		args []funcs.Value
		want string
	}{
		{"no area column", "bar", []funcs.Value{table([]string{"L", "E"}, []float64{1}, []float64{2e11})}, "gives no area"},
		{"two area columns", "bar", []funcs.Value{table([]string{"L", "A", "d", "E"}, []float64{1}, []float64{1e-3}, []float64{0.03}, []float64{2e11})}, "gives the area twice"},
		{"half a taper", "bar", []funcs.Value{table([]string{"L", "d1", "E"}, []float64{1}, []float64{0.03}, []float64{2e11})}, "not all of d1, d2"},
		{"unknown column", "bar", []funcs.Value{table([]string{"L", "A", "E", "Ar"}, []float64{1}, []float64{1e-3}, []float64{2e11}, []float64{1})}, `unknown column "Ar"`},
		{"dT without alpha", "bar", []funcs.Value{table([]string{"L", "A", "E", "dT"}, []float64{1}, []float64{1e-3}, []float64{2e11}, []float64{1})}, "dT and alpha"},
		{"negative length", "bar", []funcs.Value{table([]string{"L", "A", "E"}, []float64{1, -2}, []float64{1e-3, 1e-3}, []float64{2e11, 2e11})}, "segment 2: L = -2 m must be a positive number"},
		{"zero modulus", "bar_uniform", []funcs.Value{1.0, 1e-3, 0.0}, "E = 0 Pa"},
		{"empty table", "bar", []funcs.Value{table([]string{"L", "A", "E"}, []float64{}, []float64{}, []float64{})}, "has no rows"},
		{"load outside", "solve_bar", []funcs.Value{call(t, "with_point_load", good, 2.5, 1e3), "fixed", "free"}, "point load 1 at x = 2500 mm lies outside the bar (0 … 2000 mm)"},
		{"unknown support", "solve_bar", []funcs.Value{good, "pinned", "free"}, `unknown support "pinned" at the start`},
		{"not held", "solve_bar", []funcs.Value{call(t, "with_point_load", good, 1.0, 1e3), "free", "free"}, "not held along its axis"},
		{"NaN area", "solve_bar", []funcs.Value{call(t, "bar_fn", 2.0, nanFn, 2e11), "fixed", "free"}, "area function A_bad gave no finite value"},
		{"negative modulus", "solve_bar", []funcs.Value{call(t, "bar_fn", 2.0, 1e-3, negFn), "fixed", "free"}, "modulus function E_neg gave -1"},
		{"bad spring", "spring_support", []funcs.Value{-5.0}, "must be a positive number"},
		{"bad gap", "gap_support", []funcs.Value{-1e-3}, "zero or positive"},
		{"query outside", "bar_N", []funcs.Value{call(t, "solve_bar", good, "fixed", "free"), 3.0}, "x = 3000 mm lies outside the bar (0 … 2000 mm)"},
		{"not a bar", "solve_bar", []funcs.Value{"rod", "fixed", "free"}, "expected a bar"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := tryCall(c.fn, c.args...)
			if err == nil {
				t.Fatalf("no error, want %q", c.want)
			}
			msg := err.Error()
			if !strings.Contains(msg, c.want) {
				t.Errorf("error %q, want it to contain %q", msg, c.want)
			}
			if r := []rune(msg)[0]; unicode.IsUpper(r) {
				t.Errorf("error %q starts with a capital", msg)
			}
		})
	}
}

// The static rules (Validate) catch table and support mistakes before any
// evaluation.
func TestValidate(t *testing.T) {
	d, _ := funcs.Lookup("bar")
	if _, err := d.Validate([]*funcs.Type{table([]string{"L", "E", "A"}).Type}); err != nil {
		t.Errorf("L, E, A: %v", err)
	}
	if _, err := d.Validate([]*funcs.Type{table([]string{"L", "E"}).Type}); err == nil {
		t.Error("L, E: no error")
	}
	s, _ := funcs.Lookup("solve_bar")
	if _, err := s.Validate([]*funcs.Type{barType, funcs.StringType, supportType}); err != nil {
		t.Errorf("string and support: %v", err)
	}
	if _, err := s.Validate([]*funcs.Type{barType, numLength, funcs.StringType}); err == nil {
		t.Error("a number as support: no error")
	}
	// bar_fn takes functions of x: the area function must give an area.
	f, _ := funcs.Lookup("bar_fn")
	if !f.Params[1].Type.Accepts(areaFnType) || f.Params[1].Type.Accepts(stressFn) {
		t.Error("bar_fn area parameter: wrong function signature accepted")
	}
	// Dimension signature of a parameter: a table with A in m² is accepted,
	// one whose L column is a force is not.
	if segmentTable.Accepts(&funcs.Type{Kind: funcs.Table, Fields: []funcs.Field{{Name: "L", Type: numForce}, {Name: "E", Type: numStress}, {Name: "A", Type: numArea}}}) {
		t.Error("segment table with L in newtons accepted")
	}
}
