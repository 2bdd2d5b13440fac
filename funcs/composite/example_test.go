package composite_test

import (
	"fmt"

	"github.com/sheafcalc/sheaf/funcs/composite"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// A steel tube around an aluminium rod under 150 kN tension and 30 K of heating.
func ExampleComposite_Response() {
	rod, _ := section.Circle(0.030)
	tube, _ := section.CHS(0.050, 0.008)
	c, err := composite.New([]*composite.Part{
		{Shape: rod, E: 70e9, Alpha: 23e-6, HasAlpha: true},
		{Shape: tube, E: 210e9, Alpha: 12e-6, HasAlpha: true},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	r, _ := c.Response(150e3, 30)
	fmt.Printf("eps = %.4g; N = %.2f kN, %.2f kN\n", r.Eps, r.N[0]/1e3, r.N[1]/1e3)
	// Source: closed form ε = (N + ΣE_iA_iα_iΔT)/ΣE_iA_i, N_i = E_iA_i(ε - α_iΔT)
	// (REFERENCES C8a, C8b).

	// Output: eps = 0.0009734; N = 14.02 kN, 135.98 kN
}
