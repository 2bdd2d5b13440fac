package engine_test

import (
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

func compile(t testing.TB, src string) *engine.Sheet {
	t.Helper()
	s, err := engine.Compile("t.sheaf", []byte(src), engine.WithMaxBytes(32<<20))
	if err != nil {
		var b strings.Builder
		if l, ok := err.(diag.List); ok {
			_ = diag.Render(&b, l, diag.Sources{"t.sheaf": []byte(src)})
		}
		t.Fatalf("compile: %v\n%s", err, b.String())
	}
	return s
}

// TestBuiltins checks each built-in against Go's math package or a closed
// form, in SI.
func TestBuiltins(t *testing.T) {
	cases := []struct {
		expr string
		want float64
	}{
		{"sqrt(2)", math.Sqrt(2)},               // Source: Go math.Sqrt
		{"sqrt(16 mm^2)", 0.004},                // closed form: 4 mm
		{"cbrt(27 m^3)", 3},                     // closed form
		{"abs(-3 kN)", 3000},                    // closed form
		{"min(3 m, 2 m, 5 m)", 2},               // closed form
		{"max([1 kN, 5 kN, 2 kN])", 5000},       // closed form
		{"min([4 mm, 2 mm])", 0.002},            // closed form
		{"pow(16 mm^2, 0.5)", 0.004},            // closed form
		{"pow(2, 10)", 1024},                    // closed form
		{"(3 m)^2", 9},                          // closed form
		{"exp(1)", math.E},                      // Source: Go math.E
		{"ln(10)", math.Ln10},                   // Source: Go math.Ln10
		{"log10(1000)", 3},                      // closed form
		{"sin(30 deg)", 0.5},                    // closed form sin 30° = 1/2
		{"cos(60 deg)", 0.5},                    // closed form
		{"tan(45 deg)", 1},                      // closed form
		{"asin(1)", math.Pi / 2},                // closed form
		{"acos(0.5)", math.Pi / 3},              // closed form
		{"atan(1)", math.Pi / 4},                // closed form
		{"atan2(1 m, 1 m)", math.Pi / 4},        // closed form
		{"sin(30 °)", 0.5},                      // closed form; ° is the degree
		{"sin(pi / 6 * 1 rad)", 0.5},            // closed form: π/6 rad = 30°
		{"cos(100 gon)", math.Cos(math.Pi / 2)}, // 100 gon = 90° (400 gon per turn)
		{"atan(1) / (1 deg)", 45},               // closed form: a number of degrees
		{"2 m * 30 deg / (1 rad)", math.Pi / 3}, // arc length r·θ, closed form
		{"180 deg", math.Pi},                    // SI Brochure (BIPM 2019) Table 8: 1° = (π/180) rad
		{"12 mrad", 0.012},                      // SI prefix on the radian
		{"hypot(3 m, 4 m)", 5},                  // closed form 3-4-5
		{"round(17 mm, 5 mm)", 0.015},           // closed form
		{"round(2.5)", 3},                       // Go math.Round: half away from zero
		{"floor(2.7)", 2},                       // closed form
		{"ceil(2.1)", 3},                        // closed form
		{"sum([1 kN, 2 kN, 3.5 kN])", 6500},     // closed form
		{"mean([1 m, 2 m, 6 m])", 3},            // closed form
		{"len([1, 2, 3])", 3},                   // closed form
		{"interp([0 m, 2 m, 4 m], [0 kN, 10 kN, 30 kN], 3 m)", 20000}, // linear: 10 + (3-2)/2·20 kN
		{"interp([0 m, 2 m], [1 kN, 3 kN], 2 m)", 3000},               // end point
		{"g_n * 1 kg", 9.80665},                                       // Source: NIST SP 811 (2008) App. B, standard gravity, exact
		{"pi", math.Pi},                                               // Source: Go math.Pi
		{"5 %", 0.05},                                                 // common practice: percent = 0.01
		{"3 > 2 ? 1 m : 2 m", 1},                                      // closed form
		{"-(2 m) + 5 m", 3},                                           // closed form
		{"38kN / (2 * 1 m)", 19000},                                   // closed form
	}
	for _, c := range cases {
		t.Run(c.expr, func(t *testing.T) {
			s := compile(t, "x = "+c.expr+"\n")
			r := s.Run(nil)
			cr := r.Cell("x")
			if !cr.Known {
				t.Fatalf("unknown: %v", r.Problems)
			}
			if d := math.Abs(cr.SI - c.want); d > 1e-12*math.Max(1, math.Abs(c.want)) {
				t.Errorf("got %.17g, want %.17g", cr.SI, c.want)
			}
		})
	}
}

// TestRuntimeFailures: a failing cell is reported once, at that cell, and
// its users are skipped silently.
func TestRuntimeFailures(t *testing.T) {
	cases := []struct {
		name, src, bad, msg string
	}{
		{"division", "a = 0 m\nb = 3 kN / a\nc = b * 2\n", "b", "division by zero"},
		{"sqrt", "a = -4 m^2\nb = sqrt(a)\nc = b * 2\n", "b", "square root of a negative number"},
		{"interp", "a = 5 m\nb = interp([0 m, 1 m], [0 kN, 1 kN], a)\nc = b * 2\n", "b", "outside the table"},
		{"ln", "a = 0\nb = ln(a)\nc = b * 2\n", "b", "logarithm"},
		{"index", "xs = [1 m]\ni = 3\nb = xs[i]\nc = b * 2\n", "b", "index 3 is out of range: the list has 1 element, numbered from 0 to 0"},
		{"capacity", "a = 0 kN\nd = 1 kN\ncheck b: d <= a\n", "b", "capacity must be a positive"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := compile(t, c.src)
			r := s.Run(nil)
			if len(r.Problems) != 1 {
				t.Fatalf("want one problem, got %v", r.Problems)
			}
			if !strings.Contains(r.Problems[0].Summary, c.msg) || r.Problems[0].Range.Start().Line != s.Lookup(c.bad).Pos().Line {
				t.Errorf("problem %v", r.Problems[0])
			}
			if r.Cell(c.bad).Known {
				t.Errorf("%s should be unknown", c.bad)
			}
			if cc := r.Cell("c"); cc != nil && cc.Known {
				t.Error("user of a failed cell should be unknown")
			}
		})
	}
}

const chain = `P [kN] = 10 kN
Q [kN] = 5 kN
a [kN] = P * 2
b [kN] = a + 1 kN
c [kN] = Q * 3
d [kN] = b + c
e [kN] = c / 2
check ok: d <= 100 kN
`

// TestIncremental proves that Eval recomputes exactly the cells downstream
// of a changed input, in dependency order.
func TestIncremental(t *testing.T) {
	s := compile(t, chain)
	st := s.NewState()
	st.Eval()
	if got := st.LastEvaluated(); len(got) != 8 {
		t.Fatalf("first Eval ran %v", got)
	}
	st.Eval()
	if got := st.LastEvaluated(); len(got) != 0 {
		t.Errorf("nothing changed but Eval ran %v", got)
	}
	if err := st.Set("P", 20000.0); err != nil {
		t.Fatal(err)
	}
	r := st.Eval()
	if got, want := st.LastEvaluated(), []string{"P", "a", "b", "d", "ok"}; !slices.Equal(got, want) {
		t.Errorf("ran %v, want %v", got, want)
	}
	// d = 2·20 + 1 + 3·5 = 56 kN
	if d := r.Cell("d").SI; d != 56000 {
		t.Errorf("d = %g", d)
	}
	_ = st.Set("Q", 1000.0)
	st.Eval()
	// Any topological order will do: Q first, c before d and e, d before ok.
	got := st.LastEvaluated()
	sorted := slices.Sorted(slices.Values(got))
	if want := []string{"Q", "c", "d", "e", "ok"}; !slices.Equal(sorted, want) || got[0] != "Q" || got[1] != "c" ||
		slices.Index(got, "d") > slices.Index(got, "ok") {
		t.Errorf("ran %v, want Q, c, then d, e and ok in dependency order", got)
	}
	cl := st.Clone()
	_ = cl.Set("P", 0.0)
	cl.Eval()
	if v, _ := st.Value("a"); v.(float64) != 40000 {
		t.Error("a clone changed its original")
	}
	if v, _ := cl.Value("a"); v.(float64) != 0 {
		t.Error("the clone did not recompute")
	}
}

func TestParseInput(t *testing.T) {
	s := compile(t, chain+"r = 0.3\nm = {E: 210 GPa}\n")
	ok := []struct {
		name, text string
		want       float64
	}{
		// Source: SI prefixes, BIPM SI Brochure (9th ed.); 1 % = 0.01.
		{"P", "45 kN", 45000}, {"P", "45kN", 45000}, {"P", "0.045 MN", 45000}, {"r", "0.5", 0.5}, {"r", "50 %", 0.5},
	}
	for _, c := range ok {
		v, err := s.ParseInput(c.name, c.text)
		if err != nil || math.Abs(v.(float64)-c.want) > 1e-9 {
			t.Errorf("%s=%s: %v %v", c.name, c.text, v, err)
		}
	}
	bad := []struct{ name, text, msg string }{
		{"P", "45 mm", "must be a force (kN)"},
		{"P", "45", "write the unit"},
		{"a", "3 kN", "`a` is computed from P; only inputs can be set"},
		{"ok", "1", "design check"},
		{"PP", "3 kN", "did you mean `P`?"},
		{"P", "45 kn", "unknown unit"},
		{"P", "Q", "cannot refer to the cell"},
	}
	for _, c := range bad {
		_, err := s.ParseInput(c.name, c.text)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s=%s: %v, want %q", c.name, c.text, err, c.msg)
		}
	}
	v, err := s.ParseInput("m", "{E: 200 GPa}")
	if err != nil {
		t.Fatal(err)
	}
	if rv := v.(*funcs.RecordValue); rv.Num("E", 0) != 200e9 {
		t.Errorf("record %v", rv)
	}
}

func init() {
	// A test plugin that integrates a function by Simpson's rule, to prove
	// that user functions reach plugins as function values.
	funcs.Register(&funcs.Def{
		Name: "test_integrate", Family: "test",
		Params: []funcs.Param{
			{Name: "f", Type: funcs.FuncOf(funcs.Num(units.None), funcs.Num(units.None))},
			{Name: "a", Type: funcs.Num(units.None)}, {Name: "b", Type: funcs.Num(units.None)},
		},
		Result: funcs.Num(units.None),
		Call: func(args []funcs.Value) (funcs.Value, error) {
			f := args[0].(*funcs.FuncValue)
			a, b := args[1].(float64), args[2].(float64)
			const n = 100
			h := (b - a) / n
			buf := make([]float64, 1)
			sum := 0.0
			for i := 0; i <= n; i++ {
				w := 2.0
				if i == 0 || i == n {
					w = 1
				} else if i%2 == 1 {
					w = 4
				}
				buf[0] = a + float64(i)*h
				sum += w * f.Call(buf...)
			}
			return sum * h / 3, nil
		},
		Doc: "test only", Source: "Simpson's rule (common practice)",
	})
}

func TestUserFunctionAsValue(t *testing.T) {
	s := compile(t, "k = 3\nsq(x) = k * x^2\nI = test_integrate(sq, 0, 1)\n")
	r := s.Run(nil)
	// ∫0..1 3x² dx = 1; Simpson's rule is exact for cubics.
	if got := r.Cell("I").SI; math.Abs(got-1) > 1e-12 {
		t.Errorf("I = %g (%v)", got, r.Problems)
	}
}

// TestAngleDimensions: angles are their own kind of quantity (SPEC.md §3,
// Angles): the dimension each expression is checked to have, as `sheaf run`
// shows it, and the plain-number traps the checker refuses.
func TestAngleDimensions(t *testing.T) {
	ok := []struct{ expr, shown string }{
		{"35 deg", "35 deg"},
		{"0.6 rad", "34.38 deg"},
		{"atan(1)", "45 deg"},
		{"acos(0.5)", "60 deg"},
		{"atan2(3 kN, 4 kN)", "36.87 deg"},
		{"sin(30 deg) + 1", "1.5"},
		{"30 deg / (1 rad)", "0.5236"},
		{"(10 deg + 0.1 rad) / 2", "7.865 deg"},
		{"max(10 deg, 0.2 rad)", "11.46 deg"},
	}
	for _, c := range ok {
		t.Run(c.expr, func(t *testing.T) {
			s := compile(t, "x = "+c.expr+"\n")
			if got := s.Run(nil).Cell("x").Text; got != c.shown {
				t.Errorf("x = %s shows %q, want %q", c.expr, got, c.shown)
			}
		})
	}
	bad := []struct{ src, msg string }{
		{"x [deg] = 35\n", "display unit deg is an angle but the expression is a plain number"},
		{"x [rad] = 0.6\n", "display unit rad is an angle but the expression is a plain number"},
		{"x = sin(0.5)\n", "sin needs an angle, got a plain number"},
		{"x = cos(pi)\n", "cos needs an angle, got a plain number"},
		{"x = tan(2 m)\n", "tan needs an angle, got length (mm)"},
		{"x = asin(30 deg)\n", "asin needs a plain number, got angle (deg)"},
		{"x = 30 deg + 1\n", "cannot add angle (deg) and a plain number"},
		{"x [mm] = 2 m * 30 deg\n", "display unit mm is a length but the expression is a quantity in m*rad"},
		{"x = exp(1 rad)\n", "exp needs a plain number, got angle (deg)"},
	}
	for _, c := range bad {
		t.Run(c.src, func(t *testing.T) {
			_, err := engine.Compile("t.sheaf", []byte(c.src))
			l, isList := err.(diag.List)
			if !isList || len(l) != 1 || !strings.Contains(l[0].Summary, c.msg) {
				t.Errorf("%q: got %v, want one problem with %q", c.src, err, c.msg)
			}
		})
	}
}

// TestTableEntriesFromCells: table entries written as expressions of the
// sheet's cells follow those cells, in a fresh run and in an incremental
// recompute after an input changes.
func TestTableEntriesFromCells(t *testing.T) {
	src := "b_p [mm] = 400 mm\nA_p [mm^2] = b_p^2\nE_c [GPa] = 30 GPa\n" +
		"table layers\n    L [m]  A [mm^2]     EA [MN]\n    3      (A_p)        (E_c * A_p)\n    8      (A_p * 0.9)  (E_c * A_p * 0.9)\n" +
		"EA_sum [MN] = sum(layers.EA)\nL_sum [m] = sum(layers.L)\n"
	s := compile(t, src)
	st := s.NewState()
	// Source: EA of a square section, E·b² (common practice), summed over the rows.
	for _, b := range []float64{0.4, 0.5} {
		if b != 0.4 {
			if err := st.Set("b_p", b); err != nil {
				t.Fatal(err)
			}
		}
		r := st.Eval()
		want := 30e9 * b * b * (1 + 0.9)
		if got := num(t, r, "EA_sum"); !near(got, want, 1e-12) {
			t.Errorf("b_p = %g m: EA_sum = %g, want %g", b, got, want)
		}
		if got := num(t, r, "L_sum"); !near(got, 11, 1e-12) {
			t.Errorf("L_sum = %g, want 11", got)
		}
	}
}

// TestRangeCheck: a check between two limits is two checks, one per limit,
// each demand over capacity; written either way round.
func TestRangeCheck(t *testing.T) {
	src := "r = 0.45\ncheck spacing: 0.2 <= r <= 0.9\ncheck down: 1 >= r >= 0.5\n"
	res := compile(t, src).Run(nil)
	// Source: utilisation = demand / capacity (common practice); a lower
	// limit lo reads lo / x, an upper limit hi reads x / hi.
	want := map[string]struct {
		util float64
		pass bool
	}{
		"spacing_min": {0.2 / 0.45, true}, "spacing_max": {0.45 / 0.9, true},
		"down_min": {0.5 / 0.45, false}, "down_max": {0.45 / 1, true},
	}
	if len(res.Checks) != len(want) {
		t.Fatalf("%d checks, want %d", len(res.Checks), len(want))
	}
	for _, ch := range res.Checks {
		w, ok := want[ch.Cell.Name]
		if !ok {
			t.Errorf("unexpected check %s", ch.Cell.Name)
			continue
		}
		if !near(ch.Util, w.util, 1e-12) || ch.Pass != w.pass {
			t.Errorf("%s: utilisation %g pass %v, want %g %v", ch.Cell.Name, ch.Util, ch.Pass, w.util, w.pass)
		}
	}
}
