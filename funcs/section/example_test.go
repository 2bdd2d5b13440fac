package section_test

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs/section"
)

// A 219.1 × 10 mm tube: exact area and second moment.
func ExampleCHS() {
	s, err := section.CHS(0.2191, 0.010)
	if err != nil {
		fmt.Println(err)
		return
	}
	p := s.Props()
	fmt.Printf("A = %.1f mm², I = %.4g mm⁴\n", p.A*1e6, p.Iy*1e12)
	// Source: closed form A = π(D² - d²)/4, I = π(D⁴ - d⁴)/64.

	// Output: A = 6569.1 mm², I = 3.598e+07 mm⁴
}

// ∫ E dA of a modulus that grows linearly over the height of a rectangle.
func ExampleIntegrate() {
	s, _ := section.Rect(0.3, 0.5)
	e := func(y, z float64) float64 { return 30e9 * (1 + (z+0.25)/0.5) }
	r, err := section.Integrate(s, e, 1e-10)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("EA = %.4g N\n", r.Value)
	// Source: REFERENCES C12, EA = 6.75e9 N.

	// Output: EA = 6.75e+09 N
}

// An HEB 260 with its 24 mm root radii as exact arcs, and the concrete block
// of 450 × 450 mm cast around it: the block is the rectangle with the
// profile cut out, and the two only touch.
func ExampleRolledI() {
	heb, err := section.RolledI(0.260, 0.260, 0.010, 0.0175, 0.024)
	if err != nil {
		fmt.Println(err)
		return
	}
	block, _ := section.Rect(0.45, 0.45)
	conc, err := section.Cut(block, heb)
	if err != nil {
		fmt.Println(err)
		return
	}
	a := heb.Props().A
	common := section.IntersectionArea(heb, conc)
	fmt.Printf("A = %.0f mm², concrete %.0f mm², touching only: %v\n", a*1e6, conc.Props().A*1e6, math.Abs(common) <= 1e-9*a)
	// Source: A = 2·b·t_f + (h − 2t_f)·t_w + (4 − π)·r² = 11844.45 mm²
	// (REFERENCES D10: about 11840); 450² − 11844.45 = 190655.55 mm².

	// Output: A = 11844 mm², concrete 190656 mm², touching only: true
}
