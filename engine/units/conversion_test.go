package units

import (
	"math"
	"testing"
)

// Conversion factors checked against published definitions. exact rows use
// the defining value and a tolerance of a few ulps (the factor is a product
// of exact decimals in binary floating point); printed rows compare with the
// rounded figure SP 811 prints, at relative 1e-6.
func TestConversions(t *testing.T) {
	const exact, printed = 1e-14, 1e-6
	tests := []struct {
		name     string
		from, to string
		want     float64 // 1 from = want to
		tol      float64
	}{
		// Source: 1959 international yard and pound agreement; NIST SP 811 (2008), App. B.8 (A1).
		{"A1 inch", "in", "m", 0.0254, exact},
		// Source: 1959 agreement; NIST SP 811 (2008), App. B.8 (A2).
		{"A2 foot", "ft", "m", 0.3048, exact},
		// Source: 1959 agreement; NIST SP 811 (2008), App. B.8.
		{"yard", "yd", "m", 0.9144, exact},
		// Source: NIST SP 811 (2008), App. B.8, mile (international) 1.609 344 E+03 m (exact).
		{"mile", "mi", "m", 1609.344, exact},
		// Source: 1959 agreement; NIST SP 811 (2008), App. B.8 (A3).
		{"A3 pound mass", "lb", "kg", 0.45359237, exact},
		// Source: NIST SP 811 (2008), App. B.8 (A5): lbf = lb·g_n, exact.
		{"A5 pound force", "lbf", "N", 4.4482216152605, exact},
		// Source: NIST SP 811 (2008), App. B.8, prints 4.448 222 E+00 N.
		{"A5 printed", "lbf", "N", 4.448222, printed},
		// Source: NIST SP 811 (2008), App. B.8 (A6): kip = 1000 lbf.
		{"A6 kip", "kip", "kN", 4.4482216152605, exact},
		// Source: NIST SP 811 (2008), App. B.8 (A7), prints 6.894 757 E+03 Pa.
		{"A7 psi", "psi", "Pa", 6894.757293168361, exact},
		{"A7 psi printed", "psi", "Pa", 6894.757, printed},
		// Source: NIST SP 811 (2008), App. B.8 (A8).
		{"A8 ksi", "ksi", "MPa", 6.894757293168361, exact},
		// Source: NIST SP 811 (2008), App. B.8 (A9), prints 1.601 846 E+01 kg/m³.
		{"A9 mass density lb/ft3", "lb/ft^3", "kg/m^3", 16.01846337396014, exact},
		{"A9 printed", "lb/ft^3", "kg/m^3", 16.01846, printed},
		// Source: NIST SP 811 (2008), App. B.8 (A10): kip/ft from lbf and ft.
		{"A10 kip per foot", "kip/ft", "kN/m", 14.59390293720636, exact},
		{"A10 klf", "klf", "kN/m", 14.59390293720636, exact},
		// Source: NIST SP 811 (2008), App. B.8, pound-force per foot 1.459 390 E+01 N/m.
		{"plf", "plf", "N/m", 14.59390, printed},
		// Source: NIST SP 811 (2008), App. B.8 (A11).
		{"A11 kip foot", "kip*ft", "kN*m", 1.3558179483314004, exact},
		{"A11 kip·ft spelling", "kip·ft", "kN·m", 1.3558179483314004, exact},
		// Source: NIST SP 811 (2008), App. B.8, pound-force foot 1.355 818 E+00 N·m.
		{"lbf·ft printed", "lbf*ft", "N*m", 1.355818, printed},
		// Source: NIST SP 811 (2008), App. B.8, pound-force inch 1.129 848 E-01 N·m.
		{"lbf·in printed", "lbf*in", "N*m", 0.1129848, printed},
		// Source: NIST SP 811 (2008), App. B.8 (A12): temperature interval 1 °F = 5/9 K.
		{"A12 degF interval", "degF", "K", 5.0 / 9.0, exact},
		// Source: NIST SP 811 (2008), §4.2.1.1: an interval of 1 °C equals 1 K (from memory).
		{"degC interval", "degC", "K", 1, exact},
		{"°C spelling", "°C", "K", 1, exact},
		// Source: derived from A12: a coefficient per °F is 9/5 of one per K.
		{"expansion per degF", "1/degF", "1/K", 1.8, exact},
		// Source: NIST SP 811 (2008), App. B.8, square inch 6.4516 E-04 m² (exact).
		{"square inch", "in^2", "m^2", 6.4516e-4, exact},
		{"square inch digit suffix", "in2", "mm2", 645.16, exact},
		// Source: NIST SP 811 (2008), App. B.8, square foot 9.290 304 E-02 m² (exact).
		{"square foot", "ft^2", "m^2", 0.09290304, exact},
		// Source: NIST SP 811 (2008), App. B.8, cubic inch 1.638 706 4 E-05 m³ (exact).
		{"cubic inch", "in³", "m³", 1.6387064e-5, exact},
		// Source: NIST SP 811 (2008), App. B.8, cubic foot 2.831 685 E-02 m³.
		{"cubic foot", "ft^3", "m^3", 0.02831685, printed},
		// Source: NIST SP 811 (2008), App. B.8, inch to the fourth power 4.162 314 E-07 m⁴.
		{"inch^4", "in^4", "m^4", 4.162314e-7, printed},
		{"inch^4 in mm^4", "in^4", "mm^4", 416231.4256, exact},
		// Source: NIST SP 811 (2008), App. B.8, pound-force per square foot 4.788 026 E+01 Pa.
		{"psf", "psf", "Pa", 47.88026, printed},
		{"psf in kN/m2", "psf", "kN/m^2", 0.04788025898033584, exact},
		// Source: derived from A5 and A2: lbf/ft³ = 4.4482216152605 N / 0.028316846592 m³.
		{"pcf weight density", "pcf", "kN/m^3", 0.157087463846246, exact},
		// Source: NIST SP 811 (2008), App. B.8: standard gravity relates A9 and the weight density.
		{"pcf is lb/ft3 times g_n", "pcf", "lb*m/ft^3/s^2", 9.80665, exact},
		// Source: NIST SP 811 (2008), App. B.8, kip per square inch 6.894 757 E+06 Pa.
		{"ksi printed", "ksi", "N/mm^2", 6.894757, printed},
		// Source: NIST SP 811 (2008), App. B.8, foot per second squared 3.048 E-01 m/s² (exact).
		{"ft/s2", "ft/s^2", "m/s^2", 0.3048, exact},
		// Source: SI Brochure (BIPM 2019) Table 8 / NIST SP 811 (2008) Table 6: t = 1000 kg.
		{"tonne", "t", "kg", 1000, exact},
		{"tonne per cubic metre", "t/m^3", "kg/m^3", 1000, exact},
		// Source: SI Brochure (BIPM 2019) Table 8: min = 60 s, h = 3600 s.
		{"minute", "min", "s", 60, exact},
		{"hour", "h", "min", 60, exact},
		// Source: SI Brochure (BIPM 2019) Table 8: 1° = (π/180) rad.
		{"degree", "deg", "rad", math.Pi / 180, exact},
		{"degree sign", "°", "rad", math.Pi / 180, exact},
		{"radian in degrees", "rad", "deg", 180 / math.Pi, exact},
		{"milliradian", "mrad", "rad", 1e-3, exact},
		// Source: NIST SP 811 (2008), App. B.8, degree (°) 1.745 329 E-02 rad.
		{"degree printed", "deg", "rad", 1.745329e-2, printed},
		// Source: 400 gon make a full turn (ISO 80000-3, from memory): 1 gon = (π/200) rad = 0.9°.
		{"gon", "gon", "rad", math.Pi / 200, exact},
		{"gon in degrees", "gon", "deg", 0.9, exact},
		// Source: NIST SP 811 (2008), App. B.8, gon 1.570 796 E-02 rad (from memory).
		{"gon printed", "gon", "rad", 1.570796e-2, printed},
		// Source: SI Brochure (BIPM 2019) §2.3.4 and Table 7: 1 Pa = 1 N/m², prefixes.
		{"N/mm2 is MPa", "N/mm²", "MPa", 1, exact},
		{"GPa in MPa", "GPa", "MPa", 1000, exact},
		{"kN/m2 is kPa", "kN/m^2", "kPa", 1, exact},
		{"kN/m3 in N/mm3", "kN/m^3", "N/mm^3", 1e-6, exact},
		{"micrometre", "um", "mm", 1e-3, exact},
		{"decanewton", "daN", "N", 10, exact},
		{"kN·m in N·mm", "kN*m", "N*mm", 1e6, exact},
		// Source: ISO 80000-1:2009 §3.8 (from memory): % = 0.01, ‰ = 0.001.
		{"percent", "%", "1", 0.01, exact},
		{"per mille", "‰", "%", 0.1, exact},
		{"per mille word", "permille", "1", 0.001, exact},
		// Source: common practice: microstrain is 1e-6 (µm/m).
		{"microstrain", "µε", "1", 1e-6, exact},
		{"microstrain ascii", "ue", "um/m", 1, exact},
		// Source: derived: √MPa = 1000 √Pa, as in empirical concrete formulas.
		{"root MPa", "MPa^(1/2)", "Pa^0.5", 1000, exact},
	}
	if len(tests) < 30 {
		t.Fatalf("only %d conversion checks", len(tests))
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			from, err := Parse(tc.from)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tc.from, err)
			}
			to, err := Parse(tc.to)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tc.to, err)
			}
			got, err := Convert(1, from, to)
			if err != nil {
				t.Fatal(err)
			}
			if rel := math.Abs(got-tc.want) / math.Abs(tc.want); rel > tc.tol {
				t.Errorf("1 %s = %.17g %s, want %.17g (relative error %.2g > %.0g)", tc.from, got, tc.to, tc.want, rel, tc.tol)
			}
		})
	}
}

func TestConvertDimensionMismatch(t *testing.T) {
	kN, _ := Lookup("kN")
	MPa, _ := Lookup("MPa")
	_, err := Convert(1, kN, MPa)
	want := "cannot convert `kN` (L·M·T^-2) to `MPa` (L^-1·M·T^-2)"
	if err == nil || err.Error() != want {
		t.Fatalf("Convert(kN -> MPa) error = %v, want %q", err, want)
	}
}
