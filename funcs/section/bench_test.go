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

// BenchmarkOverlapEncasedI: the exact overlap test of an HEB 260 with root
// radii against the 450 mm block cut around it (the check every composite
// makes for each pair of parts). The shapes only touch: the common area
// must come out zero (relative 1e-12 of the profile's area).
func BenchmarkOverlapEncasedI(b *testing.B) {
	heb := must(RolledI(0.26, 0.26, 0.010, 0.0175, 0.024))
	block := must(Cut(must(Rect(0.45, 0.45)), heb))
	b.ReportAllocs()
	var a float64
	for b.Loop() {
		a = IntersectionArea(heb, block)
	}
	if math.Abs(a) > 1e-12*heb.Props().A {
		b.Fatalf("common area %g m², want 0", a)
	}
}

// BenchmarkOverlapTubeCore: a CHS and its core, two 512-gons per circle.
func BenchmarkOverlapTubeCore(b *testing.B) {
	tube := must(CHS(0.2191, 0.010))
	core := must(CoreOf(tube))
	b.ReportAllocs()
	var a float64
	for b.Loop() {
		a = IntersectionArea(tube, core)
	}
	if math.Abs(a) > 1e-12*tube.Props().A {
		b.Fatalf("common area %g m², want 0", a)
	}
}
