package xlsxout

import (
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
)

// TestNumFormat: the number format shows sig significant figures, fixed
// below 1e9 and from 1e-4, scientific outside, at most 10 decimals.
// Source: ECMA-376 Part 1 (5th ed.) 18.8.31 numFmts, format codes "0.00"
// and "0.00E+00" (from memory); significant figures: common practice.
func TestNumFormat(t *testing.T) {
	cases := []struct {
		x    float64
		sig  int
		want string
	}{
		{121.3, 3, "0"},        // 3 figures: 121
		{12.13, 3, "0.0"},      // 12.1
		{0.9, 3, "0.000"},      // 0.900
		{1, 4, "0.000"},        // 1.000
		{-0.0123, 3, "0.0000"}, // 0.0123
		{1e-4, 3, "0.000000"},  // 0.000100
		{9.9e-5, 3, "0.00E+00"},
		{2e9, 4, "0.000E+00"},
		{999e6, 3, "0"},
		{123456, 3, "0"},
		{1e-4, 20, "0.0000000000"}, // at most 10 decimals
		{3e12, 1, "0.E+00"},        // one figure keeps the point
		{3e12, 16, "0." + strings.Repeat("0", 15) + "E+00"},
		{3e12, 20, "0." + strings.Repeat("0", 19) + "E+00"}, // beyond the prepared formats
		{0, 3, "0"},
		{math.NaN(), 3, "0"},
		{math.Inf(-1), 3, "0"},
	}
	for _, c := range cases {
		if got := numFormat(c.x, c.sig); got != c.want {
			t.Errorf("numFormat(%g, %d) = %q, want %q", c.x, c.sig, got, c.want)
		}
	}
}

// TestOneLine: the fast path agrees with splitting at every space
// strings.Fields knows (the reference) and joining with one space.
func TestOneLine(t *testing.T) {
	cases := []string{
		"", "a", "N_Ed / A_s", " a", "a ", "a  b", "a\tb", "a\nb", "a\r\n  b", "a\vb", "a\fb",
		"σ = N / A", "a\u00a0b", "a\u0085b", "a\u2003b", "(16 mm)^2", "   ", "\n", "x -- y",
	}
	for _, s := range cases {
		want := strings.Join(strings.Fields(s), " ")
		if got := oneLine(s); got != want {
			t.Errorf("oneLine(%q) = %q, want %q", s, got, want)
		}
	}
}

// TestWithoutSIUnit: a field's description loses the SI unit it names
// when the value beside it is shown in another unit.
// Source: the field descriptions of funcs/section (types.go).
func TestWithoutSIUnit(t *testing.T) {
	mm2 := units.Unit{Factor: 1e-6, Symbol: "mm^2"}
	for _, c := range []struct{ doc, want string }{
		{"area, m²", "area"},
		{"least radius of gyration √(I_2/A), m (governs flexural buckling)", "least radius of gyration √(I_2/A) (governs flexural buckling)"},
		{"axial force [N]", "axial force"},
		{"number of segments", "number of segments"},
		{"a mass, kg", "a mass, kg"},
	} {
		if got := withoutSIUnit(c.doc, mm2); got != c.want {
			t.Errorf("withoutSIUnit(%q) = %q, want %q", c.doc, got, c.want)
		}
	}
	if got := withoutSIUnit("area, m²", units.Unit{Factor: 1}); got != "area, m²" {
		t.Errorf("in SI the unit stays: %q", got)
	}
}
