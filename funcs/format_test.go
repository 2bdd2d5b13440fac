package funcs_test

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// TestMessageQuantities: values in messages are in the preferred metric
// unit at four significant figures, with no float64 noise; the dimensions
// Force and Stress are those of the unit catalogue.
func TestMessageQuantities(t *testing.T) {
	force, _ := units.QuantityDim("force")
	stress, _ := units.QuantityDim("stress")
	if funcs.Force != force || funcs.Stress != stress {
		t.Fatalf("Force %v, Stress %v; want %v, %v", funcs.Force, funcs.Stress, force, stress)
	}
	for _, c := range []struct {
		got, want string
	}{
		{funcs.Length(0.32389999999999997), "323.9 mm"},
		{funcs.Length(0.004), "4 mm"},
		{funcs.Quantity(-8798.000000000002, funcs.Force), "-8.798 kN"},
		{funcs.Quantity(210e9, funcs.Stress), "210000 MPa"},
	} {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
}
