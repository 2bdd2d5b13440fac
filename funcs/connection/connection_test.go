package connection

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

// TestTensionResistance: an M20 8.8 bolt, A_s = 245 mm² (ISO 898-1),
// F_t,Rd = 0.9·800·245/1.25 = 141.12 kN.
// Source: EN 1993-1-8:2005 Table 3.4 (from memory); the arithmetic by hand.
func TestTensionResistance(t *testing.T) {
	v, err := functest.TryCall(t, "bolt_tension_resistance", 800e6, 245e-6, 1.25)
	if err != nil || functest.RelErr(v.(float64), 141.12e3) > 1e-12 {
		t.Errorf("F_t,Rd = %v (%v), want 141.12 kN", v, err)
	}
	v, err = functest.TryCall(t, "bolt_tension_resistance", 800e6, 245e-6, 1.25, 0.63)
	if err != nil || functest.RelErr(v.(float64), 0.63*800*245/1.25) > 1e-12 {
		t.Errorf("countersunk: %v (%v)", v, err)
	}
	for _, bad := range [][4]float64{{800e6, 245e-6, 0.8, 0.9}, {800e6, 245e-6, 1.25, 1.2}, {math.NaN(), 245e-6, 1.25, 0.9}} {
		if _, err := TensionResistance(bad[0], bad[1], bad[2], bad[3]); err == nil {
			t.Errorf("%v must be refused", bad)
		}
	}
}
