package bar

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

// TestDiameterChange: the rod of REFERENCES.md C1 (P = 250 kN, d = 30 mm,
// E = 210 GPa, ν = 0.3, B1) shortens across by ν·σ/E·d.
// Source: Gere & Goodno, Mechanics of Materials, §1.6; REFERENCES.md C1, B1.
func TestDiameterChange(t *testing.T) {
	const P, d, E, nu = 250e3, 0.030, 210e9, 0.3
	sigma := P / (math.Pi * d * d / 4) // 353.677651 MPa (C1)
	if functest.RelErr(sigma, 353.677651e6) > 1e-8 {
		t.Fatalf("σ = %g", sigma)
	}
	eps := sigma / E
	v, err := functest.TryCall(t, "diameter_change", d, eps, nu)
	if err != nil {
		t.Fatal(err)
	}
	want := -nu * 353.677651e6 / E * d // −1.51576 µm·10 ≈ −0.0151576 mm
	if functest.RelErr(v.(float64), want) > 1e-8 {
		t.Errorf("Δd = %.9g m, want %.9g m", v, want)
	}
	for _, c := range []struct{ eps, nu float64 }{{1e-3, 0.6}, {1e-3, -1}, {math.NaN(), 0.3}} {
		if _, err := LateralStrain(c.eps, c.nu); err == nil {
			t.Errorf("ε = %g, ν = %g must be refused", c.eps, c.nu)
		}
	}
	if v, _ := LateralStrain(-2e-3, 0.2); v != 0.2*2e-3 {
		t.Errorf("compression: ε_lat = %g, want +0.0004", v)
	}
}
