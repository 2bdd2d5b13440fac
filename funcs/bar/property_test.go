package bar

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Property tests on random bars (seeded, so failures reproduce). The
// properties are those of linear elastic bars (common practice): statics,
// compatibility, symmetry and superposition.

// randomBar returns a bar of 1–6 segments of mixed shapes with point loads,
// a linear distributed load and self-weight.
func randomBar(rng *rand.Rand) *Bar {
	n := 1 + rng.IntN(6)
	b := &Bar{}
	for range n {
		L := 0.2 + 3*rng.Float64()
		E := (70 + 140*rng.Float64()) * GPa
		a1 := (200 + 3000*rng.Float64()) * mm2
		a2 := (200 + 3000*rng.Float64()) * mm2
		switch rng.IntN(3) {
		case 0:
			b.Segments = append(b.Segments, Prismatic(L, a1, E))
		case 1:
			b.Segments = append(b.Segments, TaperedArea(L, a1, a2, E))
		default:
			b.Segments = append(b.Segments, TaperedDiameter(L, math.Sqrt(4*a1/math.Pi), math.Sqrt(4*a2/math.Pi), E))
		}
	}
	lt := b.Length()
	for range rng.IntN(5) {
		b.Points = append(b.Points, PointLoad{X: lt * rng.Float64(), P: (rng.Float64() - 0.5) * 200 * kN})
	}
	b.B0 = (rng.Float64() - 0.5) * 20 * kN
	b.B1 = (rng.Float64() - 0.5) * 20 * kN
	b.Gamma = 77 * kN * rng.Float64()
	return b
}

// totalLoad returns ΣP + ∫b dx, with ∫γA dx from the segment volumes in
// closed form (frustum volume for a diameter taper).
func totalLoad(b *Bar) float64 {
	s := 0.0
	for _, p := range b.Points {
		s += p.P
	}
	lt := b.Length()
	s += (b.B0 + b.B1) / 2 * lt
	for _, g := range b.Segments {
		var vol float64
		switch g.Shape {
		case Constant:
			vol = g.A1 * g.L
		case TaperArea:
			vol = (g.A1 + g.A2) / 2 * g.L
		case TaperDiameter:
			vol = math.Pi * g.L / 12 * (g.D1*g.D1 + g.D1*g.D2 + g.D2*g.D2)
		}
		s += b.Gamma * vol
	}
	return s
}

func loadScale(b *Bar) float64 {
	s := math.Abs(b.B0)*b.Length() + math.Abs(b.B1)*b.Length() + math.Abs(totalLoad(b))
	for _, p := range b.Points {
		s += math.Abs(p.P)
	}
	return s
}

var supportPairs = []struct {
	name   string
	s0, s1 Support
}{
	{"fixed-fixed", fixed, fixed},
	{"fixed-free", fixed, free},
	{"free-fixed", free, fixed},
	{"spring-fixed", Support{Kind: Spring, K: 5e7}, fixed},
	{"spring-spring", Support{Kind: Spring, K: 2e8}, Support{Kind: Spring, K: 3e7}},
	{"fixed-spring", fixed, Support{Kind: Spring, K: 1e9}},
}

func TestEquilibrium(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range 200 {
		b := randomBar(rng)
		sp := supportPairs[i%len(supportPairs)]
		r := mustSolve(t, b, sp.s0, sp.s1)
		sum := r.RStart + r.REnd + totalLoad(b)
		if math.Abs(sum) > 1e-11*loadScale(b) {
			t.Errorf("bar %d (%s): R_start + R_end + loads = %g N, want 0", i, sp.name, sum)
		}
		// The end force equals N just before the end (no load at x = L here
		// unless a random point fell on it, which has probability zero).
		nEnd, _ := r.N(r.Length)
		if math.Abs(nEnd-r.REnd) > 1e-11*loadScale(b) {
			t.Errorf("bar %d: N(L) = %g, R_end = %g", i, nEnd, r.REnd)
		}
		// Springs obey R = −k·u.
		if sp.s0.Kind == Spring {
			near(t, "start spring", r.RStart, -sp.s0.K*r.UStart, 1e-9)
		}
	}
}

func TestCompatibilityFixedFixed(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for i := range 200 {
		b := randomBar(rng)
		for k := range b.Segments {
			b.Segments[k].Alpha, b.Segments[k].DT = 12e-6, 60*(rng.Float64()-0.3)
		}
		r := mustSolve(t, b, fixed, fixed)
		uScale := r.UMax + 1e-12
		if math.Abs(r.Elongation) > 1e-11*uScale || r.UStart != 0 {
			t.Errorf("bar %d: fixed–fixed elongation %g m (u_max %g), want 0", i, r.Elongation, r.UMax)
		}
		uL, _ := r.U(r.Length)
		if math.Abs(uL) > 1e-11*uScale {
			t.Errorf("bar %d: u(L) = %g, want 0", i, uL)
		}
	}
}

// mirror returns the bar reflected about its mid-length.
func mirror(b *Bar) *Bar {
	m := &Bar{B0: b.B1, B1: b.B0, Gamma: b.Gamma}
	for i := len(b.Segments) - 1; i >= 0; i-- {
		s := b.Segments[i]
		s.A1, s.A2, s.D1, s.D2 = s.A2, s.A1, s.D2, s.D1
		m.Segments = append(m.Segments, s)
	}
	lt := b.Length()
	for _, p := range b.Points {
		m.Points = append(m.Points, PointLoad{X: lt - p.X, P: p.P})
	}
	return m
}

func TestSymmetry(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for i := range 100 {
		half := randomBar(rng)
		// A symmetric bar: half followed by its mirror image, with loads
		// mirrored in position and kept in direction (a symmetric load
		// pattern along the axis, e.g. self-weight of a bar laid on its
		// side or a load in +x on both halves).
		m := mirror(half)
		lh := half.Length()
		b := &Bar{Segments: append(append([]Segment{}, half.Segments...), m.Segments...), Gamma: half.Gamma}
		b.B0, b.B1 = half.B0, half.B0 // uniform: symmetric
		for _, p := range half.Points {
			b.Points = append(b.Points, p, PointLoad{X: 2*lh - p.X, P: p.P})
		}
		r := mustSolve(t, b, fixed, fixed)
		if math.Abs(r.RStart-r.REnd) > 1e-10*loadScale(b) {
			t.Errorf("bar %d: R_start %g ≠ R_end %g for a symmetric bar", i, r.RStart, r.REnd)
		}
		// u is antisymmetric about mid-length... under a load in one
		// direction u is symmetric: u(x) = u(L − x).
		for _, f := range []float64{0.1, 0.37, 0.49} {
			u1, _ := r.U(f * 2 * lh)
			u2, _ := r.U((1 - f) * 2 * lh)
			if math.Abs(u1-u2) > 1e-9*(r.UMax+1e-15) {
				t.Errorf("bar %d: u(%g L) = %g, u(%g L) = %g", i, f, u1, 1-f, u2)
			}
		}
	}
}

func TestSuperposition(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for i := range 100 {
		b1 := randomBar(rng)
		b2 := b1.Clone()
		b2.Points = nil
		for range 3 {
			b2.Points = append(b2.Points, PointLoad{X: b1.Length() * rng.Float64(), P: (rng.Float64() - 0.5) * 100 * kN})
		}
		b2.B0, b2.B1, b2.Gamma = -b1.B1, 3*b1.B0, 0
		both := b1.Clone()
		both.Points = append(both.Points, b2.Points...)
		both.B0 += b2.B0
		both.B1 += b2.B1
		sp := supportPairs[i%len(supportPairs)]
		r1 := mustSolve(t, b1, sp.s0, sp.s1)
		r2 := mustSolve(t, b2, sp.s0, sp.s1)
		r12 := mustSolve(t, both, sp.s0, sp.s1)
		sc := loadScale(b1) + loadScale(b2)
		if d := r12.RStart - r1.RStart - r2.RStart; math.Abs(d) > 1e-10*sc {
			t.Errorf("bar %d (%s): R_start does not superpose (%g)", i, sp.name, d)
		}
		us := r1.UMax + r2.UMax + 1e-15
		for _, f := range []float64{0.2, 0.5, 0.9} {
			x := f * b1.Length()
			u1, _ := r1.U(x)
			u2, _ := r2.U(x)
			u12, _ := r12.U(x)
			if math.Abs(u12-u1-u2) > 1e-9*us {
				t.Errorf("bar %d (%s): u(%g) does not superpose: %g vs %g", i, sp.name, x, u12, u1+u2)
			}
		}
	}
}

// TestDisplacementIsIntegralOfStrain checks u(x) against an independent
// integration of N/(EA) from the solved N(x), by a fine composite Simpson
// rule on each segment (common practice: a check that does not share the
// solver's quadrature).
func TestDisplacementIsIntegralOfStrain(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for j := range 30 {
		b := randomBar(rng)
		b.Points = nil // keep N smooth inside segments for Simpson
		r := mustSolve(t, b, fixed, free)
		// Without point loads piece i is segment i.
		u, x0 := r.UStart, 0.0
		for i, s := range b.Segments {
			const m = 2000
			h := s.L / m
			sum := 0.0
			for k := 0; k <= m; k++ {
				x := x0 + s.L*float64(k)/m
				n, _ := r.nIn(i, x)
				f := n / (s.E * r.v.area(i, x))
				w := 2.0
				switch {
				case k == 0 || k == m:
					w = 1
				case k%2 == 1:
					w = 4
				}
				sum += w * f
			}
			u += sum * h / 3
			x0 += s.L
		}
		if math.Abs(u-r.UEnd) > 1e-9*(r.UMax+1e-15) {
			t.Errorf("bar %d: Simpson u(L) = %.12g, solver %.12g", j, u, r.UEnd)
		}
	}
}
