package units

import (
	"math"
	"slices"
	"testing"
)

// Preferred units are common practice in metric and US structural design
// offices; the expected lists are the brief of the unit system.
func TestPreferred(t *testing.T) {
	tests := []struct {
		dim  Dim
		sys  System
		want string
		ok   bool
	}{
		{dForce, Metric, "kN", true},
		{dStress, Metric, "MPa", true},
		{dLength, Metric, "mm", true},
		{dEnergy, Metric, "kN*m", true},
		{dLineLoad, Metric, "kN/m", true},
		{dimOf(2, 0, 0, 0, 0, 0, 0), Metric, "mm^2", true},
		{dimOf(4, 0, 0, 0, 0, 0, 0), Metric, "mm^4", true},
		{dWeightD, Metric, "kN/m^3", true},
		{dimOf(-3, 1, 0, 0, 0, 0, 0), Metric, "kg/m^3", true},
		{dimOf(0, 0, 0, 0, -1, 0, 0), Metric, "1/K", true},
		{dimOf(3, 1, -2, 0, 0, 0, 0), Metric, "kN*m^2", true},
		{None, Metric, "", true},
		{dForce, Neutral, "kN", true},
		{dForce, US, "kip", true},
		{dStress, US, "ksi", true},
		{dLength, US, "in", true},
		{dEnergy, US, "kip*ft", true},
		{dLineLoad, US, "klf", true},
		{dWeightD, US, "pcf", true},
		{dimOf(-3, 1, 0, 0, 0, 0, 0), US, "lb/ft^3", true},
		{dimOf(0, 0, 0, 0, -1, 0, 0), US, "1/degF", true},
		{dimOf(1, 1, 0, 0, 0, 0, 0), Metric, "kg*m", false},
		{dimOf(-1, 1, -2, 0, 0, 0, 0).Mul(dimOf(0, 0, 0, 1, 0, 0, 0)), US, "kg*m^-1*s^-2*A", false},
		{Dim{1, 0, 0, 0, 0, 0, 0}, Metric, "m^(1/2)", false},
		// Angles are read in degrees in both practices (common practice).
		{dAngle, Metric, "deg", true},
		{dAngle, US, "deg", true},
		{dAngle.Div(dLength), Metric, "m^-1*rad", false},
		{dForce.Mul(dLength).Div(dAngle), Metric, "kg*m^2*s^-2*rad^-1", false},
	}
	for _, tc := range tests {
		u, ok := Preferred(tc.dim, tc.sys)
		if u.Symbol != tc.want || ok != tc.ok || u.Dim != tc.dim {
			t.Errorf("Preferred(%v, %v) = %q %v (%v), want %q %v", tc.dim, tc.sys, u.Symbol, ok, u.Dim, tc.want, tc.ok)
		}
		if tc.want == "" {
			continue
		}
		back, err := Parse(u.Symbol)
		if err != nil || back.Dim != tc.dim || back.Factor != u.Factor {
			t.Errorf("Preferred symbol %q does not parse back: %+v %v", u.Symbol, back, err)
		}
	}
}

func TestDimOf(t *testing.T) {
	tests := []struct {
		in   string
		want Dim
		err  string
	}{
		{"stress", dStress, ""},
		{"Force per length", dLineLoad, ""},
		{"weight_density", dWeightD, ""},
		{"mass-density", dimOf(-3, 1, 0, 0, 0, 0, 0), ""},
		{"kN", dForce, ""},
		{"N/mm^2", dStress, ""},
		{"kip*ft", dEnergy, ""},
		{"angle", dAngle, ""},
		{"plane angle", dAngle, ""},
		{"deg", dAngle, ""},
		{"°", dAngle, ""},
		{"ratio", None, ""},
		{"stres", None, "unknown quantity or unit `stres`; did you mean `stress`?"},
		{"kn", None, "unknown unit `kn`; did you mean `kN`?"},
		{"nothing like it", None, "unknown quantity or unit `nothing like it`; quantities are named like `stress` or `force per length`; units like `kN` or `N/mm^2`"},
	}
	for _, tc := range tests {
		got, err := DimOf(tc.in)
		switch {
		case tc.err == "" && err != nil:
			t.Errorf("DimOf(%q): %v", tc.in, err)
		case tc.err != "" && (err == nil || err.Error() != tc.err):
			t.Errorf("DimOf(%q) error = %v, want %q", tc.in, err, tc.err)
		case tc.err == "" && got != tc.want:
			t.Errorf("DimOf(%q) = %v, want %v", tc.in, got, tc.want)
		}
	}
}

// TestQuantities: the listed quantity names are sorted, and DimOf accepts
// each one as QuantityDim gives it.
func TestQuantities(t *testing.T) {
	names := Quantities()
	if len(names) == 0 || !slices.IsSorted(names) {
		t.Fatalf("Quantities() = %q, want a sorted, non-empty list", names)
	}
	for _, n := range names {
		want, ok := QuantityDim(n)
		if got, err := DimOf(n); !ok || err != nil || got != want {
			t.Errorf("DimOf(%q) = %v, %v; QuantityDim gives %v, %v", n, got, err, want, ok)
		}
	}
	if !slices.Contains(names, "stress") {
		t.Errorf("Quantities() lacks stress: %q", names)
	}
}

func TestParseSystem(t *testing.T) {
	for in, want := range map[string]System{"metric": Metric, "us": US, "both": Neutral, "": Neutral} {
		if got, ok := ParseSystem(in); !ok || got != want {
			t.Errorf("ParseSystem(%q) = %v, %v", in, got, ok)
		}
	}
	if _, ok := ParseSystem("cgs"); ok {
		t.Error(`ParseSystem("cgs") accepted`)
	}
	if Metric.String() != "metric" || US.String() != "us" || Neutral.String() != "both" {
		t.Error("System names changed")
	}
}

// TestOverflowHasNoUnit: a value whose dimension overflowed is never shown
// in a unit with a finite factor.
func TestOverflowHasNoUnit(t *testing.T) {
	u, ok := Preferred(Overflow, Metric)
	if ok || u.Symbol != "?" || !math.IsNaN(u.Factor) {
		t.Errorf("Preferred(Overflow) = %+v, %v; want symbol ? and a NaN factor", u, ok)
	}
	if got := Format(1, u, 3); got != "NaN ?" {
		t.Errorf("Format(1, Overflow unit) = %q, want %q", got, "NaN ?")
	}
}
