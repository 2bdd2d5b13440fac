package bar

import (
	"math/rand/v2"
	"testing"
)

// bigBar is the speed target of issue 4: 1,000 segments, 10,000 point loads.
func bigBar() *Bar {
	rng := rand.New(rand.NewPCG(11, 12))
	b := &Bar{}
	for range 1000 {
		b.Segments = append(b.Segments, Prismatic(0.01+0.02*rng.Float64(), (500+1000*rng.Float64())*mm2, 200*GPa))
	}
	lt := b.Length()
	for range 10000 {
		b.Points = append(b.Points, PointLoad{X: lt * rng.Float64(), P: (rng.Float64() - 0.5) * 10 * kN})
	}
	return b
}

// BenchmarkSolveFixedFixed solves the bar (reactions, N, u, extremes).
func BenchmarkSolveFixedFixed(b *testing.B) {
	bar := bigBar()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Solve(bar, fixed, fixed); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSolveBarSheet is the whole sheet call: solve plus the samples
// table (101 stations and both sides of all 11,000 jumps).
func BenchmarkSolveBarSheet(b *testing.B) {
	bv := barValue(bigBar())
	b.ReportAllocs()
	for b.Loop() {
		if _, err := tryCall("solve_bar", bv, "fixed", "fixed"); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkUserAreaFunction is a bar whose area is a user function, under a
// distributed load: the adaptive quadrature path.
func BenchmarkUserAreaFunction(b *testing.B) {
	area := &Fn{Name: "A", F: func(x float64) float64 { return 1e-3 * (1 + 0.5*x) }}
	bar := &Bar{Segments: []Segment{{L: 2, Shape: AreaFunc, AreaFn: area, E: 200 * GPa}}, B0: 5 * kN, B1: 5 * kN, Points: []PointLoad{{1, 10 * kN}}}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Solve(bar, fixed, fixed); err != nil {
			b.Fatal(err)
		}
	}
}
