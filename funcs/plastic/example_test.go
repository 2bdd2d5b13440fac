package plastic_test

import (
	"fmt"

	"github.com/sheafcalc/sheaf/funcs/composite"
	"github.com/sheafcalc/sheaf/funcs/plastic"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// A 300 mm square concrete column with a 20 mm steel plate through it.
func ExampleSection_StrainFor() {
	conc, _ := section.Rect(0.3, 0.3)
	plate, _ := section.Rect(0.02, 0.2)
	body, _ := section.Cut(conc, plate)
	c, _ := composite.New([]*composite.Part{
		{Shape: body, E: 33e9, Law: nil},
		{Shape: plate, E: 210e9},
	})
	s, _ := plastic.NewSection(c)
	s.Laws[0] = plastic.ParabolaRect{Fcd: 17e6, EpsC2: 0.002, EpsCu2: 0.0035, N: 2}
	s.Laws[1] = plastic.EPP{E: 210e9, Fy: 275e6}
	nPl, _ := s.SquashLoad(1)
	eps, _ := s.StrainFor(-1200e3, 0)
	fmt.Printf("N_pl = %.1f kN; eps(−1200 kN) = %.4f ‰\n", nPl/1e3, eps*1e3)
	// Source: closed form N_pl = A_c f_cd + A_s f_y; the strain is the root of
	// A_c f_cd (1 - (1 - ε/ε_c2)²) + A_s E_s ε = 1200 kN (EN 1992-1-1 §3.1.7 parabola).

	// Output: N_pl = 2562.0 kN; eps(−1200 kN) = -0.5735 ‰
}
