package section

import (
	"encoding/binary"
	"math"
	"testing"
)

// FuzzPolygon feeds arbitrary vertex lists to the polygon constructor, the
// properties and the integral: none may panic, and an accepted polygon has a
// positive area and finite properties.
func FuzzPolygon(f *testing.F) {
	seed := func(v ...float64) []byte {
		b := make([]byte, 8*len(v))
		for i, x := range v {
			binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
		}
		return b
	}
	f.Add(seed(0, 0, 1, 0, 1, 1, 0, 1))
	f.Add(seed(0, 0, 1, 1, 1, 0, 0, 1))
	f.Add(seed(0, 0, 0, 0, 0, 0))
	f.Add(seed(math.NaN(), 0, 1, 0, 1, 1))
	f.Fuzz(func(t *testing.T, data []byte) {
		n := len(data) / 16
		if n > 64 {
			n = 64
		}
		ys, zs := make([]float64, n), make([]float64, n)
		for i := range n {
			ys[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i:]))
			zs[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i+8:]))
		}
		s, err := Polygon(ys, zs)
		if err != nil {
			return
		}
		p := s.Props()
		if !(p.A > 0) {
			t.Fatalf("accepted polygon with area %g: %v %v", p.A, ys, zs)
		}
		_, _ = Integrate(s, func(y, z float64) float64 { return 1 + y*z }, 1e-8)
	})
}
