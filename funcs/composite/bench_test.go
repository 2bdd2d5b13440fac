package composite

import (
	"testing"

	"github.com/sheafcalc/sheaf/funcs/section"
)

// BenchmarkGradedComposite: a tube with a graded core (six section integrals).
func BenchmarkGradedComposite(b *testing.B) {
	tube, _ := section.CHS(0.2191, 0.01)
	core, _ := section.Circle(0.1991)
	b.ReportAllocs()
	for b.Loop() {
		_, err := New([]*Part{
			{Shape: tube, E: 210e9},
			{Shape: core, EField: func(y, z float64) float64 { return 33e9 * (1 - 0.5*(y*y+z*z)/0.01) }},
		})
		if err != nil {
			b.Fatal(err)
		}
	}
}
