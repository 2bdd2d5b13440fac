package section

import (
	"math"
	"testing"
)

// BenchmarkIntegrateCircleSmooth: a smooth field over a circle to 1e-10
// relative (target: under 200 µs).
func BenchmarkIntegrateCircleSmooth(b *testing.B) {
	s := must(Circle(0.3))
	f := func(y, z float64) float64 { return 30e9 * (1 + 0.2*math.Sin(4*y)*math.Exp(z)) }
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Integrate(s, f, 1e-10); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkIntegrateISection: a smooth field over an I shape (12 edges).
func BenchmarkIntegrateISection(b *testing.B) {
	s := must(ISection(0.3, 0.15, 0.0071, 0.0107))
	f := func(y, z float64) float64 { return math.Exp(3*z) * math.Cos(y) }
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Integrate(s, f, 1e-10); err != nil {
			b.Fatal(err)
		}
	}
}
