package units

import "testing"

// Typographic forms follow ISO 80000-1 (from memory: half-high dot for a
// product, superscript exponents); each must parse back to the same unit.
func TestPretty(t *testing.T) {
	tests := []struct{ in, want string }{
		{"kN", "kN"},
		{"kN*m", "kN·m"},
		{"N/mm^2", "N/mm²"},
		{"kip*in^2", "kip·in²"},
		{"kg*m^-1*s^-2", "kg·m⁻¹·s⁻²"},
		{"m^12", "m¹²"},
		{"MPa^(1/2)", "MPa^(1/2)"},
		{"m^(-3/2)", "m^(-3/2)"},
		{"1/K", "1/K"},
	}
	for _, tc := range tests {
		u, err := Parse(tc.in)
		if err != nil {
			t.Fatal(err)
		}
		got := u.Pretty()
		if got != tc.want {
			t.Errorf("Parse(%q).Pretty() = %q, want %q", tc.in, got, tc.want)
		}
		back, err := Parse(got)
		if err != nil || back.Symbol != u.Symbol || back.Factor != u.Factor {
			t.Errorf("Pretty form %q does not parse back to %q: %+v %v", got, u.Symbol, back, err)
		}
	}
	for _, u := range Catalogue() {
		back, err := Parse(u.Pretty())
		if err != nil || back.Symbol != u.Symbol {
			t.Errorf("catalogue %q: Pretty %q parses to %q, %v", u.Symbol, u.Pretty(), back.Symbol, err)
		}
	}
}
