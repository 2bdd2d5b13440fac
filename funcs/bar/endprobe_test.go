package bar

import (
	"strings"
	"testing"
)

// TestUserFunctionVanishesAtEnd: an area or modulus function that is zero
// at an end of the bar is reported with its name and the position, not as a
// quadrature that failed (Gauss–Legendre never samples the ends).
func TestUserFunctionVanishesAtEnd(t *testing.T) {
	const L, E = 0.95, 210 * GPa
	// Solid circle tapering linearly from 60 mm to nothing at x = L.
	cone := &Fn{Name: "A_x", F: func(x float64) float64 {
		d := 0.060 * (1 - x/L)
		return 3.141592653589793 * d * d / 4
	}}
	// Modulus that drops to zero at the start.
	soft := &Fn{Name: "E_x", F: func(x float64) float64 { return E * x / L }}
	cases := []struct {
		name string
		seg  Segment
		want []string
	}{
		{"area zero at the end", Segment{L: L, Shape: AreaFunc, AreaFn: cone, E: E},
			[]string{"area function A_x", "at x = 950 mm", "must be positive"}},
		{"modulus zero at the start", Segment{L: L, Shape: Constant, A1: 1e-3, A2: 1e-3, EFn: soft},
			[]string{"modulus function E_x", "at x = 0 m", "must be positive"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b := &Bar{Segments: []Segment{c.seg}, Points: []PointLoad{{L, -100 * kN}}}
			_, err := Solve(b, fixed, free)
			if err == nil {
				t.Fatal("no error for a vanishing area or modulus")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q lacks %q", err, w)
				}
			}
		})
	}
}
