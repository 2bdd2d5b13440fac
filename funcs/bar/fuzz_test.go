package bar

import (
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

// FuzzBarInput drives the segment and load input path through the registered
// sheet functions with arbitrary numbers: it must never panic, and every
// failure must be an error with a message. Seeds live in
// testdata/fuzz/FuzzBarInput.
func FuzzBarInput(f *testing.F) {
	f.Add(uint8(0), 1.5, 1.0, 1200e-6, 600e-6, 200e9, 0.7, 40e3, 0.0, 0.0, 0.0, 0.0, uint8(1), uint8(0), 0.0, 0.0)
	f.Add(uint8(2), 2.0, 0.5, 0.04, 0.02, 210e9, 2.0, 50e3, 1e3, -1e3, 77e3, 40.0, uint8(1), uint8(3), 1e-3, 0.0)
	f.Fuzz(func(t *testing.T, shape uint8, l1, l2, p1, p2, e, x, p, b0, b1, gamma, dT float64, s0, s1 uint8, gap, k float64) {
		var cols []string
		var data [][]float64
		switch shape % 4 {
		case 0:
			cols, data = []string{"L", "A", "E"}, [][]float64{{l1, l2}, {p1, p2}, {e, e}}
		case 1:
			cols, data = []string{"L", "d", "E"}, [][]float64{{l1, l2}, {p1, p2}, {e, e}}
		case 2:
			cols, data = []string{"L", "d1", "d2", "E"}, [][]float64{{l1, l2}, {p1, p2}, {p2, p1}, {e, e}}
		default:
			cols, data = []string{"L", "A1", "A2", "E", "dT", "alpha"}, [][]float64{{l1, l2}, {p1, p2}, {p2, p1}, {e, e}, {dT, -dT}, {12e-6, 12e-6}}
		}
		support := func(s uint8) funcs.Value {
			switch s % 4 {
			case 0:
				return "free"
			case 1:
				return "fixed"
			case 2:
				v, err := tryCall("spring_support", k)
				if err != nil {
					return "fixed"
				}
				return v
			}
			v, err := tryCall("gap_support", gap, k)
			if err != nil {
				return "free"
			}
			return v
		}
		check := func(v funcs.Value, err error) (funcs.Value, bool) {
			if err != nil {
				if err.Error() == "" {
					t.Fatal("empty error message")
				}
				return nil, false
			}
			return v, true
		}
		bv, ok := check(tryCall("bar", table(cols, data...)))
		if !ok {
			return
		}
		if bv, ok = check(tryCall("with_point_load", bv, x, p)); !ok {
			return
		}
		if bv, ok = check(tryCall("with_line_load", bv, b0, b1)); !ok {
			return
		}
		if bv, ok = check(tryCall("with_self_weight", bv, gamma)); !ok {
			return
		}
		res, ok := check(tryCall("solve_bar", bv, support(s0), support(s1)))
		if !ok {
			return
		}
		for _, q := range []string{"bar_N", "bar_sigma", "bar_u"} {
			check(tryCall(q, res, x))
		}
	})
}
