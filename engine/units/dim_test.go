package units

import "testing"

// Dimensions of the mechanical quantities follow from their SI definitions
// (SI Brochure, BIPM 2019, Table 4): common practice.
func TestDimArithmetic(t *testing.T) {
	L, M, T := Base(Length), Base(Mass), Base(Time)
	force := M.Mul(L).Div(T).Div(T)
	tests := []struct {
		name string
		got  Dim
		want Dim
	}{
		{"force = M·L·T^-2", force, dForce},
		{"stress = force/area", force.Div(L.Mul(L)), dStress},
		{"moment = force·length", force.Mul(L), dEnergy},
		{"inverse of inverse", force.Inv().Inv(), force},
		{"weight density = stress/length", dStress.Div(L), dWeightD},
		{"dimensionless strain", L.Div(L), None},
	}
	for _, tc := range tests {
		if tc.got != tc.want {
			t.Errorf("%s: got %v, want %v", tc.name, tc.got, tc.want)
		}
	}
}

func TestDimPowAndSqrt(t *testing.T) {
	tests := []struct {
		name     string
		d        Dim
		num, den int
		want     Dim
		ok       bool
	}{
		{"area squared", dimOf(2, 0, 0, 0, 0, 0, 0), 2, 1, dimOf(4, 0, 0, 0, 0, 0, 0), true},
		{"sqrt of stress is exact", dStress, 1, 2, Dim{-1, 1, -2, 0, 0, 0, 0}, true},
		{"sqrt of sqrt of length fails", Dim{1, 0, 0, 0, 0, 0, 0}, 1, 2, Dim{}, false},
		{"cube root of volume", dimOf(3, 0, 0, 0, 0, 0, 0), 1, 3, dLength, true},
		{"zero denominator", dLength, 1, 0, Dim{}, false},
		{"overflow", dimOf(60, 0, 0, 0, 0, 0, 0), 3, 1, Dim{}, false},
		{"negative power", dForce, -1, 1, dForce.Inv(), true},
	}
	for _, tc := range tests {
		got, ok := tc.d.Pow(tc.num, tc.den)
		if ok != tc.ok || (ok && got != tc.want) {
			t.Errorf("%s: Pow(%d, %d) = %v, %v; want %v, %v", tc.name, tc.num, tc.den, got, ok, tc.want, tc.ok)
		}
	}
	if s, ok := dStress.Sqrt(); !ok || s.Mul(s) != dStress {
		t.Errorf("Sqrt(stress)² = %v, want %v", s.Mul(s), dStress)
	}
}

func TestDimString(t *testing.T) {
	tests := []struct {
		d    Dim
		want string
	}{
		{None, "1"},
		{dForce, "L·M·T^-2"},
		{dStress, "L^-1·M·T^-2"},
		{Dim{-1, 1, -2, 0, 0, 0, 0}, "L^(-1/2)·M^(1/2)·T^-1"},
		{dimOf(0, 0, 0, 0, -1, 0, 0), "Θ^-1"},
	}
	for _, tc := range tests {
		if got := tc.d.String(); got != tc.want {
			t.Errorf("%v.String() = %q, want %q", [7]int8(tc.d), got, tc.want)
		}
	}
}

func TestDimExp(t *testing.T) {
	h := Dim{-1, 1, -2, 0, 0, 0, 0}
	if n, half := h.Exp(Length); n != -1 || !half {
		t.Errorf("Exp(Length) of √stress = %d, %v; want -1 halves", n, half)
	}
	if n, half := h.Exp(Time); n != -1 || half {
		t.Errorf("Exp(Time) of √stress = %d, %v; want -1 whole", n, half)
	}
}
