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
		{dAngle, "A"},
		{dLength.Mul(dAngle), "L·A"},
		{Overflow, "overflow"},
	}
	for _, tc := range tests {
		if got := tc.d.String(); got != tc.want {
			t.Errorf("%v.String() = %q, want %q", [8]int8(tc.d), got, tc.want)
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

// Angle is a dimension of its own (DESIGN.md: "angle kept apart, like
// temperature intervals"); dividing by an angle unit gives a plain number.
func TestAngleDim(t *testing.T) {
	rad, err := Parse("rad")
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		got  Dim
		want Dim
	}{
		{"rad is an angle", rad.Dim, dAngle},
		{"an angle is not a plain number", dAngle.Div(None), dAngle},
		{"angle / (1 rad) is a plain number", dAngle.Div(rad.Dim), None},
		{"arc length r·θ/(1 rad) is a length", dLength.Mul(dAngle).Div(rad.Dim), dLength},
		{"curvature is angle per length", dAngle.Div(dLength), Dim{-2, 0, 0, 0, 0, 0, 0, 2}},
	}
	for _, tc := range tests {
		if tc.got != tc.want {
			t.Errorf("%s: got %v, want %v", tc.name, tc.got, tc.want)
		}
	}
	if dAngle.IsNone() {
		t.Error("an angle must not be dimensionless")
	}
}

// TestDimOverflow: exponents are checked, never wrapped (issue 15): with
// x = 1/m, p = x^32 is m^-32; p·p (m^-64) is beyond the range of a Dim,
// and a further product stays Overflow instead of wrapping to a plain
// number.
func TestDimOverflow(t *testing.T) {
	inv := dLength.Inv()
	p, ok := inv.Pow(32, 1)
	if !ok || p != dimOf(-32, 0, 0, 0, 0, 0, 0) {
		t.Fatalf("(1/m)^32 = %v, %v; want L^-32", p, ok)
	}
	m63, _ := dLength.Pow(63, 1)
	m32, _ := dLength.Pow(32, 1)
	tests := []struct {
		name  string
		got   Dim
		valid bool
	}{
		{"m^-32 · m^-32", p.Mul(p), false},
		{"(m^-32)^4 by products", p.Mul(p).Mul(p.Mul(p)), false},
		{"m^-32 / m^32", p.Div(m32), false},
		{"m^63 · m^-1 stays in range", m63.Mul(dLength.Inv()), true},
		{"m^63 is the largest whole exponent", m63, true},
		{"m^63 · m", m63.Mul(dLength), false},
		{"1/(m^63) in range", m63.Inv(), true},
		{"Overflow times a plain number", Overflow.Mul(None), false},
		{"a length times Overflow", dLength.Mul(Overflow), false},
		{"Overflow / m^63 stays Overflow", Overflow.Div(m63), false},
		{"inverse of Overflow", Overflow.Inv(), false},
	}
	for _, tc := range tests {
		if tc.got.Valid() != tc.valid {
			t.Errorf("%s = %v: Valid() = %v, want %v", tc.name, tc.got, tc.got.Valid(), tc.valid)
		}
		if !tc.valid && tc.got != Overflow {
			t.Errorf("%s = %v, want Overflow", tc.name, tc.got)
		}
	}
	if _, ok := m63.Pow(2, 1); ok {
		t.Error("(m^63)^2 must not be representable")
	}
	if _, ok := Overflow.Pow(1, 1); ok {
		t.Error("Pow of Overflow must fail")
	}
	if _, ok := Overflow.Sqrt(); ok {
		t.Error("Sqrt of Overflow must fail")
	}
}
