package stability

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if e := math.Abs(got-want) / math.Abs(want); !(e <= tol) {
		t.Errorf("%s = %.12g, want %.12g (relative error %.3g)", what, got, want, e)
	}
}

var call = functest.TryCall

// C9: Euler load of a CHS 168.3×8, L = 6 m, E = 210 GPa; I = π(D⁴−d⁴)/64.
// Source: REFERENCES.md C9; Timoshenko & Gere, Theory of Elastic Stability §2.1.
func TestC9Euler(t *testing.T) {
	const D, tw, E, L = 168.3e-3, 8e-3, 210e9, 6.0
	d := D - 2*tw
	I := math.Pi * (math.Pow(D, 4) - math.Pow(d, 4)) / 64
	near(t, "I", I, 1.29727118e7*1e-12, 1e-8)
	cases := []struct {
		K, want float64
	}{{1, 746.873947e3}, {2, 186.718487e3}}
	for _, c := range cases {
		n, err := EulerLoad(E, I, L, c.K)
		if err != nil {
			t.Fatal(err)
		}
		near(t, fmt.Sprintf("N_cr K=%g", c.K), n, c.want, 1e-8)
		v, err := call(t, "euler_load", E, I, L, c.K)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "euler_load", v.(float64), c.want, 1e-8)
	}
	// K omitted means 1.
	v, err := call(t, "euler_load", E, I, L)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "euler_load K omitted", v.(float64), 746.873947e3, 1e-8)

	// σ_cr = π²E/λ² with λ = KL/i equals N_cr/A (same theory, other route).
	A := math.Pi * (D*D - d*d) / 4
	i, _ := RadiusOfGyration(I, A)
	lam, _ := Slenderness(1, L, i)
	s, _ := EulerStress(E, lam)
	near(t, "σ_cr·A", s*A, 746.873947e3, 1e-8)

	// λ̄ = λ/λ₁ with λ₁ = π√(E/f_y).
	// Source: EN 1993-1-1 §6.3.1.3(1), Eq. (6.50) (from memory).
	const fy = 355e6
	lb, _ := RelativeSlenderness(A, fy, 746.873947e3)
	near(t, "λ̄ = λ/λ₁", lb, lam/(math.Pi*math.Sqrt(E/fy)), 1e-8)
}

func TestArgumentErrors(t *testing.T) {
	cases := []struct {
		name string
		args []funcs.Value
		want string
	}{
		{"euler_load", []funcs.Value{210e9, 1e-6, 0.0, 1.0}, "L = 0 must be a positive number"},
		{"euler_load", []funcs.Value{210e9, math.NaN(), 3.0, 1.0}, "I = NaN"},
		{"euler_load", []funcs.Value{210e9, 1e-6, 3.0, -1.0}, "K = -1"},
		{"slenderness", []funcs.Value{1.0, 3.0, 0.0}, "i = 0"},
		{"radius_of_gyration", []funcs.Value{1e-6, -1e-3}, "A = -0.001"},
		{"relative_slenderness", []funcs.Value{1e-3, 355e6, 0.0}, "N_cr = 0"},
		{"euler_stress", []funcs.Value{210e9, 0.0}, "lambda = 0"},
		{"euler_load", []funcs.Value{"x", 1e-6, 3.0, 1.0}, "E = NaN"},
	}
	for _, c := range cases {
		_, err := call(t, c.name, c.args...)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s%v: err = %v, want %q", c.name, c.args, err, c.want)
		}
	}
}

// curveTable builds a table value of a buckling curve.
func curveValue(l, c []float64) *funcs.TableValue {
	return &funcs.TableValue{Type: curveTable, Cols: [][]float64{l, c}}
}

// chiFormula is the buckling curve formula of EN 1993-1-1 §6.3.1.2,
// Eq. (6.49), with imperfection factor a (0.21 for curve a, Table 6.1; both
// from memory). The test only uses it to make a smooth table to interpolate.
func chiFormula(lb, a float64) float64 {
	phi := 0.5 * (1 + a*(lb-0.2) + lb*lb)
	return math.Min(1, 1/(phi+math.Sqrt(phi*phi-lb*lb)))
}

func TestBucklingFactor(t *testing.T) {
	var l, c []float64
	for k := 0; k <= 30; k++ {
		lb := 0.1 * float64(k)
		l = append(l, lb)
		c = append(c, chiFormula(lb, 0.21))
	}
	tab := curveValue(l, c)
	// Tabulated rows are returned exactly.
	for k := range l {
		v, err := call(t, "buckling_factor", tab, l[k])
		if err != nil || v.(float64) != c[k] {
			t.Errorf("row %d: χ = %v, %v; want %v", k, v, err, c[k])
		}
	}
	// Between rows, linear interpolation of a smooth curve with spacing h
	// errs by at most h²/8·max|χ''| (common practice); χ'' < 2 here.
	for lb := 0.05; lb < 2.96; lb += 0.1 {
		v, err := call(t, "buckling_factor", tab, lb)
		if err != nil {
			t.Fatal(err)
		}
		if e := math.Abs(v.(float64) - chiFormula(lb, 0.21)); e > 0.1*0.1/8*2 {
			t.Errorf("λ̄ = %g: interpolation error %g", lb, e)
		}
	}
	// A linear curve is interpolated exactly.
	lin := curveValue([]float64{0.2, 1.2}, []float64{1, 0.5})
	v, _ := call(t, "buckling_factor", lin, 0.7)
	near(t, "linear", v.(float64), 0.75, 1e-15)

	bad := []struct {
		name string
		tab  *funcs.TableValue
		lb   float64
		want string
	}{
		{"above the range", tab, 3.2, "outside the curve's range 0 … 3"},
		{"below the range", lin, 0.1, "outside the curve's range"},
		{"NaN", lin, math.NaN(), "outside"},
		{"unsorted", curveValue([]float64{0.2, 0.1}, []float64{1, 0.9}), 0.15, "does not increase"},
		{"percent", curveValue([]float64{0.2, 1}, []float64{100, 66}), 0.5, "not a percentage"},
		{"one row", curveValue([]float64{0.2}, []float64{1}), 0.2, "at least two rows"},
	}
	for _, b := range bad {
		_, err := call(t, "buckling_factor", b.tab, b.lb)
		if err == nil || !strings.Contains(err.Error(), b.want) {
			t.Errorf("%s: err = %v, want %q", b.name, err, b.want)
		}
	}
}

func ExampleEulerLoad() {
	// A CHS 168.3×8 strut, 6 m between pins, steel.
	D, d := 0.1683, 0.1523
	I := math.Pi * (math.Pow(D, 4) - math.Pow(d, 4)) / 64
	n, _ := EulerLoad(210e9, I, 6, 1)
	fmt.Printf("N_cr = %.1f kN\n", n/1e3)
	// Source: REFERENCES C9, P_cr = π²EI/L² = 746.873947 kN.

	// Output: N_cr = 746.9 kN
}

func ExampleCurve_At() {
	c, _ := NewCurve([]float64{0.2, 0.6, 1.0}, []float64{1.0, 0.84, 0.60})
	chi, _ := c.At(0.8)
	fmt.Printf("chi = %.2f\n", chi)
	// Source: closed form, linear interpolation 0.84 + (0.60 - 0.84)·(0.8 - 0.6)/(1.0 - 0.6).

	// Output: chi = 0.72
}

// TestChiCurves: χ recomputed from the 6.3.1.2 formula, written out here
// step by step, at λ̄ = 0.2, 0.5, 1.0, 1.5, 2.0 for each curve, and the
// classic anchor values χ(1.0) of curve a = 0.6656 and of curve c = 0.5399
// that the tables print (rounded to 4 places).
// Source: EN 1993-1-1:2005 §6.3.1.2 Eq. (6.49), Table 6.1; REFERENCES.md D1
// (from memory).
func TestChiCurves(t *testing.T) {
	alphas := map[string]float64{"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}
	for curve, al := range alphas {
		for _, l := range []float64{0.2, 0.5, 1.0, 1.5, 2.0} {
			phi := 0.5 * (1 + al*(l-0.2) + l*l)
			want := 1 / (phi + math.Sqrt(phi*phi-l*l))
			if want > 1 {
				want = 1
			}
			got, err := Chi(l, curve)
			if err != nil {
				t.Fatal(err)
			}
			near(t, fmt.Sprintf("χ(%g, %s)", l, curve), got, want, 1e-14)
			v, err := call(t, "buckling_reduction", l, curve)
			if err != nil || v.(float64) != got {
				t.Errorf("registered buckling_reduction(%g, %s) = %v, %v", l, curve, v, err)
			}
		}
	}
	for _, c := range []struct {
		curve string
		want  float64
	}{{"a", 0.6656}, {"c", 0.5399}} {
		got, _ := Chi(1.0, c.curve)
		if math.Abs(got-c.want) > 0.00005 {
			t.Errorf("χ(1.0, %s) = %.5f, table %.4f", c.curve, got, c.want)
		}
	}
	if got, _ := Chi(0.2, "d"); got != 1 {
		t.Errorf("χ(0.2) = %g, want exactly 1", got)
	}
	if _, err := Chi(1, "e"); err == nil || !strings.Contains(err.Error(), "a0, a, b, c, d") {
		t.Errorf("curve e must be refused with the list, got %v", err)
	}
}

// TestLambdaBar: (L_cr/i)/λ_1 equals √(A·f_y/N_cr) for the same column.
// Source: EN 1993-1-1 Eqs. (6.49)/(6.50), algebra (from memory).
func TestLambdaBar(t *testing.T) {
	const A, I, L, E, fy = 6569.1e-6, 3.598e-5, 4.2, 210e9, 355e6
	i := math.Sqrt(I / A)
	ncr := math.Pi * math.Pi * E * I / (L * L)
	got, err := LambdaBar(L, i, fy, E)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "λ̄", got, math.Sqrt(A*fy/ncr), 1e-13)
}

// TestFcrE3 at L_c/r = 40, 80, 120, 200 for F_y = 50 ksi, E = 29000 ksi,
// against Eqs. E3-2/E3-3 written out; the limit 4.71√(E/F_y) = 113.4 puts
// 120 and 200 on the elastic branch.
// Source: AISC 360-16 §E3 (REFERENCES.md D2, from memory); ksi per NIST SP 811.
func TestFcrE3(t *testing.T) {
	const ksi = 6.894757293168361e6
	fy, e := 50*ksi, 29000*ksi
	for _, kl := range []float64{40, 80, 120, 200} {
		fe := math.Pi * math.Pi * e / (kl * kl)
		want := 0.877 * fe
		if fy/fe <= 2.25 {
			want = math.Pow(0.658, fy/fe) * fy
		}
		if (kl <= 113) != (fy/fe <= 2.25) {
			t.Errorf("L_c/r = %g on the wrong branch", kl)
		}
		got, err := FcrE3(fy, e, kl)
		if err != nil {
			t.Fatal(err)
		}
		near(t, fmt.Sprintf("F_cr(%g)", kl), got, want, 1e-14)
	}
	// A rounded anchor: φ_c·F_cr = 40.0 ksi at L_c/r = 40 for F_y = 50 ksi
	// (AISC Manual Table 4-14, from memory).
	if got, _ := FcrE3(fy, e, 40); math.Abs(0.9*got/ksi-40.0) > 0.05 {
		t.Errorf("φF_cr(40) = %.2f ksi, the table gives 40.0", 0.9*got/ksi)
	}
}
