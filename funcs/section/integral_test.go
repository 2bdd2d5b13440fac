package section

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// TestIntegratePolynomialsExact: polynomial fields integrate to rounding; the
// moments ∫y² dA etc. must equal the closed forms of Props.
func TestIntegratePolynomialsExact(t *testing.T) {
	shapes := map[string]*Shape{
		"rect":            must(Rect(0.3, 0.5)),
		"angle":           must(Angle(0.15, 0.1, 0.012)),
		"i":               must(ISection(0.3, 0.15, 0.0071, 0.0107)),
		"chs":             must(CHS(0.2191, 0.01)),
		"circle placed":   must(Circle(0.04)).Transform(0.3, -0.2, 0),
		"rhs rotated":     must(RHS(0.2, 0.1, 0.01)).Transform(0.05, 0.02, 0.7),
		"plate with hole": must(Cut(must(Rect(0.4, 0.4)), must(Circle(0.1)).Transform(0.1, 0.05, 0))),
	}
	for name, s := range shapes {
		t.Run(name, func(t *testing.T) {
			p := s.Props()
			m := s.MomentsAbout(0, 0)
			// Source: definitions of area moments; closed forms from Green's theorem / exact circle formulas.
			cases := []struct {
				n    string
				f    Field
				want float64
			}{
				{"1", func(y, z float64) float64 { return 1 }, p.A},
				{"y", func(y, z float64) float64 { return y }, m.Sy},
				{"z²", func(y, z float64) float64 { return z * z }, m.Szz},
				{"yz", func(y, z float64) float64 { return y * z }, m.Syz},
				{"(z−z_c)²", func(y, z float64) float64 { return (z - p.Zc) * (z - p.Zc) }, p.Iy},
			}
			for _, c := range cases {
				r, err := Integrate(s, c.f, 1e-13)
				if err != nil {
					t.Fatal(err)
				}
				scale := math.Max(math.Abs(c.want), p.A*1e-2*1e-2)
				if math.Abs(r.Value-c.want) > 1e-12*scale {
					t.Errorf("∫%s dA = %.15g, want %.15g", c.n, r.Value, c.want)
				}
			}
		})
	}
}

// TestIntegrateSmooth compares with closed forms of smooth fields.
func TestIntegrateSmooth(t *testing.T) {
	R := 0.12
	a := 9.0
	cases := []struct {
		name string
		s    *Shape
		f    Field
		want float64
		src  string
	}{
		// Source: ∫_disc cos(a·y) dA = 2πR·J₁(aR)/a (Hankel transform of the disc;
		// Abramowitz & Stegun 9.1.21 / 11.1.1 via ∫₀^x t J₀(t) dt = x J₁(x)).
		{"cos over disc", must(Circle(2 * R)), func(y, z float64) float64 { return math.Cos(a * y) }, 2 * math.Pi * R * math.J1(a*R) / a, "A&S 11.1.1"},
		// Source: same for an annulus by difference of discs.
		{"cos over tube", must(CHS(2*R, 0.02)), func(y, z float64) float64 { return math.Cos(a * z) },
			2*math.Pi*R*math.J1(a*R)/a - 2*math.Pi*(R-0.02)*math.J1(a*(R-0.02))/a, "A&S 11.1.1"},
		// Source: separable integral ∫∫ e^{ky}·cos(kz) = (2 sinh(kb/2)/k)(2 sin(kh/2)/k).
		{"exp·cos over rect", must(Rect(0.3, 0.5)), func(y, z float64) float64 { return math.Exp(5*y) * math.Cos(5*z) },
			(2 * math.Sinh(5*0.15) / 5) * (2 * math.Sin(5*0.25) / 5), "calculus"},
		// Source: the same rectangle rotated by 90° and shifted: ∫ over the
		// moved shape of the moved field is invariant.
		{"exp·cos over rotated rect", must(Rect(0.3, 0.5)).Transform(1, 2, math.Pi/2), func(y, z float64) float64 {
			// back to the local frame: y = z' − 2, z = −(y' − 1)
			yl, zl := z-2, -(y - 1)
			return math.Exp(5*yl) * math.Cos(5*zl)
		}, (2 * math.Sinh(5*0.15) / 5) * (2 * math.Sin(5*0.25) / 5), "invariance"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r, err := Integrate(c.s, c.f, 1e-10)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(r.Value, c.want); e > 1e-10 {
				t.Errorf("got %.15g want %.15g (rel %g, %s)", r.Value, c.want, e, c.src)
			}
			if actual := math.Abs(r.Value - c.want); actual > 10*r.Err+1e-15*math.Abs(c.want) {
				t.Errorf("error estimate %g is below the actual error %g", r.Err, actual)
			}
		})
	}
}

// uniform integrates a ring with a fixed n-point rule on 2^k × 2^k cells per
// edge strip: the composite rule whose convergence order is known.
func uniform(r *Ring, f Field, n, k int) float64 {
	q := &integrator{f: f, g: gaussRule(n)}
	y0, y1, _, _ := r.bbox()
	mid := (y0 + y1) / 2
	cells := 1 << k
	h := 1 / float64(cells)
	sum := 0.0
	for e := range r.Y {
		for i := range cells {
			for j := range cells {
				v, _ := q.strip(r, e, mid, float64(i)*h, float64(i+1)*h, float64(j)*h, float64(j+1)*h)
				sum += v
			}
		}
	}
	return sum
}

// TestConvergenceOrder: the composite n-point Gauss–Legendre rule has error
// O(h^{2n}) (Davis & Rabinowitz, Methods of Numerical Integration, 2nd ed.,
// §2.7); halving h divides the error by about 2^{2n}.
func TestConvergenceOrder(t *testing.T) {
	tri := &Ring{Y: []float64{0, 1, 0.2}, Z: []float64{0, 0.3, 1}}
	f := func(y, z float64) float64 { return math.Exp(y) * math.Cos(2*z) }
	exact, err := Integrate(&Shape{Regions: []Region{{Sign: 1, Ring: tri}}}, f, 1e-14)
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range []int{1, 2, 3} {
		var errs []float64
		for k := 1; k <= 4; k++ {
			errs = append(errs, math.Abs(uniform(tri, f, n, k)-exact.Value))
		}
		for i := 1; i < len(errs); i++ {
			order := math.Log2(errs[i-1] / errs[i])
			if math.Abs(order-float64(2*n)) > 0.35 {
				t.Errorf("n = %d: observed order %.2f between levels %d and %d, want %d (errors %v)", n, order, i, i+1, 2*n, errs)
			}
		}
	}
}

// TestAnnulusSpectral: the polar rule converges faster than any power: each
// level gains many digits on an analytic field (Trefethen & Weideman 2014).
func TestAnnulusSpectral(t *testing.T) {
	a := &Annulus{Rout: 1}
	f := func(y, z float64) float64 { return math.Cos(6 * y) }
	exact := 2 * math.Pi * math.J1(6) / 6 // A&S 11.1.1
	q := &integrator{f: f, g: gaussRule(8)}
	e0, _ := q.annulusLevel(a, 0)
	e1, _ := q.annulusLevel(a, 1)
	err0, err1 := math.Abs(e0-exact), math.Abs(e1-exact)
	if !(err1 < 1e-13 && err0 > 1e3*err1) {
		t.Errorf("level errors %g, %g: not spectral", err0, err1)
	}
}

// starPolygon is a random polygon star-shaped about the origin.
func starPolygon(rng *rand.Rand, n int) *Ring {
	th := make([]float64, n)
	for i := range th {
		th[i] = 2 * math.Pi * (float64(i) + 0.8*rng.Float64()) / float64(n)
	}
	r := &Ring{}
	for _, a := range th {
		rad := 0.2 + rng.Float64()
		r.Y = append(r.Y, rad*math.Cos(a))
		r.Z = append(r.Z, rad*math.Sin(a))
	}
	return r
}

// triangleFan integrates over a star polygon by a fan of triangles from the
// origin with the collapsed (Duffy) Gauss product rule on each triangle,
// exact for polynomials of degree ≤ 2n − 2 (Stroud, Approximate Calculation
// of Multiple Integrals, 1971, §2.7, from memory).
func triangleFan(r *Ring, f Field, n int) float64 {
	g := gaussRule(n)
	sum := 0.0
	m := len(r.Y)
	for i := range m {
		j := (i + 1) % m
		y1, z1, y2, z2 := r.Y[i], r.Z[i], r.Y[j], r.Z[j]
		twoA := y1*z2 - y2*z1
		for a, u := range g.x {
			for b, v := range g.x {
				y := u*y1 + u*v*(y2-y1)
				z := u*z1 + u*v*(z2-z1)
				sum += g.w[a] * g.w[b] * u * twoA * f(y, z)
			}
		}
	}
	return sum
}

// TestGreenVersusTriangles: property test on random star polygons, Green's
// edge integral against an independent triangle quadrature, for polynomials.
func TestGreenVersusTriangles(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	f := func(y, z float64) float64 { return 1 - 2*y + y*y*y*z - 3*y*z*z + z*z*z*z*z + y*y*y*y*y*y }
	for k := range 40 {
		r := starPolygon(rng, 3+k%12)
		if _, err := NewRing(r.Y, r.Z); err != nil {
			continue
		}
		s := &Shape{Regions: []Region{{Sign: 1, Ring: r}}}
		got, err := Integrate(s, f, 1e-13)
		if err != nil {
			t.Fatal(err)
		}
		want := triangleFan(r, f, 8)
		if math.Abs(got.Value-want) > 1e-12*(1+math.Abs(want)) {
			t.Errorf("polygon %d: Green %.15g, triangles %.15g", k, got.Value, want)
		}
	}
}

func TestIntegrateErrors(t *testing.T) {
	s := must(Rect(1, 1))
	one := func(y, z float64) float64 { return 1 }
	for _, tol := range []float64{0, 1e-16, 0.5, math.NaN()} {
		if _, err := Integrate(s, one, tol); err == nil {
			t.Errorf("tolerance %g accepted", tol)
		}
	}
	nan := func(y, z float64) float64 {
		if y > 0.2 {
			return math.NaN()
		}
		return 1
	}
	var fe *FieldError
	if _, err := Integrate(s, nan, 1e-10); !errors.As(err, &fe) {
		t.Errorf("a failing field gave %v", err)
	}
	// A field with a jump inside the section cannot meet a tight tolerance.
	jump := func(y, z float64) float64 {
		if y+0.3*z > 0.1234 {
			return 1
		}
		return 0
	}
	if _, err := Integrate(s, jump, 1e-13); err == nil {
		t.Error("a discontinuous field met 1e-13")
	}
	// ...but a loose tolerance is reachable.
	r, err := Integrate(s, jump, 1e-3)
	if err != nil {
		t.Fatal(err)
	}
	// Source: area of the part of the unit square right of the line y + 0.3z = 0.1234 (geometry).
	want := 0.5 - 0.1234
	if math.Abs(r.Value-want) > 2e-3 {
		t.Errorf("jump integral %g, want %g", r.Value, want)
	}
}
