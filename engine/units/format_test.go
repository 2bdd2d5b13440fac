package units

import (
	"math"
	"testing"
)

// Rounding to significant figures follows the usual rule of round half to
// even on the binary value (strconv); the expected strings are common
// practice for engineering output.
func TestFormatNumber(t *testing.T) {
	tests := []struct {
		x    float64
		sig  int
		want string
	}{
		{121.4, 3, "121"},
		{0.757880681, 3, "0.758"},
		{7.07355303, 3, "7.07"},
		{353.677651, 4, "353.7"},
		{2.5, 3, "2.5"},         // trailing zeros dropped
		{99.96, 3, "100"},       // rounding carries into a new digit
		{1234567, 3, "1230000"}, // plain below 1e9
		{-0.0042, 2, "-0.0042"},
		{0.0001, 3, "0.0001"}, // smallest plain magnitude
		{0.00009, 3, "9e-5"},  // e-notation below 1e-4
		{2.0e9, 3, "2e9"},     // e-notation from 1e9
		{1.2345e10, 3, "1.23e10"},
		{-6.75e-12, 3, "-6.75e-12"},
		{1, 0, "1"},                         // sig below 1 is 1
		{math.Pi, 40, "3.1415926535897931"}, // sig above 17 is 17
		{0, 3, "0"},
		{math.Copysign(0, -1), 3, "0"},
		{math.NaN(), 3, "NaN"},
		{math.Inf(1), 3, "+Inf"},
		{math.Inf(-1), 3, "-Inf"},
		{999999999.6, 3, "1e9"},
	}
	for _, tc := range tests {
		if got := FormatNumber(tc.x, tc.sig); got != tc.want {
			t.Errorf("FormatNumber(%v, %d) = %q, want %q", tc.x, tc.sig, got, tc.want)
		}
	}
}

// TestFormat formats closed-form results from the check-value list in
// the units an engineer reads them in.
func TestFormat(t *testing.T) {
	unit := func(s string) Unit {
		u, err := Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	tests := []struct {
		si   float64
		unit string
		sig  int
		want string
	}{
		// Source: Gere & Goodno, Mechanics of Materials, δ = PL/(EA) (REFERENCES C1):
		// P = 250 kN, L = 4.2 m, d = 30 mm, E = 210 GPa.
		{250e3 * 4.2 / (210e9 * math.Pi * 0.015 * 0.015), "mm", 4, "7.074 mm"},
		{250e3 / (math.Pi * 0.015 * 0.015), "MPa", 3, "354 MPa"},
		// Source: tapered bar δ = 4PL/(π E d1 d2) (REFERENCES C2).
		{4 * 50e3 * 2 / (math.Pi * 210e9 * 0.040 * 0.020), "mm", 3, "0.758 mm"},
		// Source: NIST SP 811 (2008), App. B.8: 1 kip = 4.4482216152605 kN.
		{4448.2216152605, "kip", 3, "1 kip"},
		{4448.2216152605, "kN", 5, "4.4482 kN"},
		{0.05, "%", 3, "5 %"},
		{1e-3, "‰", 3, "1 ‰"},
		{0.5, "", 3, "0.5"},
		{0.5, "1", 3, "0.5"},
		// Source: SI Brochure (BIPM 2019) Table 8: 1° = (π/180) rad, so
		// π/6 rad is 30° and the atan(1) of a 1:1 slope is 45°.
		{math.Pi / 6, "deg", 4, "30 deg"},
		{math.Atan(1), "deg", 4, "45 deg"},
		{0.6, "rad", 3, "0.6 rad"},
		// A finite value stays finite in a smaller unit (issue 15): 2.36e304 m²
		// is 2.36e310 mm², beyond float64 but not infinite.
		{2.36e304, "mm^2", 3, "2.36e310 mm^2"},
		{-1.7e308, "mm", 4, "-1.7e311 mm"},
		{math.MaxFloat64, "µm", 10, "1.797693135e314 µm"},
		// A tiny one neither collapses to 0 nor loses its digits as a
		// subnormal: 5e-320 m is 5e-323 km; 1.234e-300 Pa is 1.234e-309 GPa.
		{5e-320, "km", 3, "5e-323 km"},
		{1.234e-300, "GPa", 4, "1.234e-309 GPa"},
		{math.SmallestNonzeroFloat64, "Pa", 3, "4.94e-324 Pa"},
		{math.Inf(1), "mm", 3, "+Inf mm"},
		{math.NaN(), "mm", 3, "NaN mm"},
	}
	for _, tc := range tests {
		u := Unit{Factor: 1}
		if tc.unit != "" {
			u = unit(tc.unit)
		}
		if got := Format(tc.si, u, tc.sig); got != tc.want {
			t.Errorf("Format(%g, %q, %d) = %q, want %q", tc.si, tc.unit, tc.sig, got, tc.want)
		}
	}
}
