package bar_test

import (
	"fmt"

	"github.com/sheafcalc/sheaf/funcs/bar"
)

// A steel hanger of two parts held at the top (x measured downward) with a
// 30 kN sign bracket at mid-height and a 12 kN lamp at the bottom.
func ExampleSolve() {
	b := &bar.Bar{
		Segments: []bar.Segment{
			bar.Prismatic(2.0, 804e-6, 205e9), // M36-ish rod, 2 m
			bar.Prismatic(1.5, 314e-6, 205e9), // M20-ish rod, 1.5 m
		},
		Points: []bar.PointLoad{{X: 2.0, P: 30e3}, {X: 3.5, P: 12e3}},
	}
	r, err := bar.Solve(b, bar.Support{Kind: bar.Fixed}, bar.Support{Kind: bar.Free})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("R_start = %.1f kN\n", r.RStart/1e3)
	fmt.Printf("elongation = %.3f mm\n", r.Elongation*1e3)
	fmt.Printf("sigma_max = %.1f MPa at x = %.2f m\n", r.SigmaMax/1e6, r.XSigmaMax)
	// Source: closed form, statics R = -(30 + 12) kN, δ = Σ N_i L_i/(E A_i),
	// σ = N/A (REFERENCES C1, C5).

	// Output:
	// R_start = -42.0 kN
	// elongation = 0.789 mm
	// sigma_max = 52.2 MPa at x = 0.00 m
}

// A pipe between an anchor and a stop 3 mm away, heated by 60 K: the free
// growth of 4.32 mm closes the gap.
func ExampleSolve_gap() {
	s := bar.Prismatic(6.0, 2.1e-3, 200e9)
	s.Alpha, s.DT = 12e-6, 60
	r, _ := bar.Solve(&bar.Bar{Segments: []bar.Segment{s}},
		bar.Support{Kind: bar.Fixed}, bar.Support{Kind: bar.Gap, Gap: 3e-3})
	n, _ := r.N(3)
	fmt.Printf("gap closed: %v, N = %.1f kN\n", r.GapClosedEnd, n/1e3)
	// Source: closed form N = -(α ΔT L - gap) E A / L (REFERENCES C7 with a gap).

	// Output: gap closed: true, N = -92.4 kN
}

func ExampleTaperedElongation() {
	// A turned steel pin tapering from 40 to 20 mm over 2 m, 50 kN.
	fmt.Printf("%.4f mm\n", bar.TaperedElongation(50e3, 2, 210e9, 0.04, 0.02)*1e3)
	// Source: REFERENCES C2, δ = 4PL/(π E d1 d2) = 0.757880681 mm.

	// Output: 0.7579 mm
}
