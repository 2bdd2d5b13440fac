package section

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

var relErr = functest.RelErr

// must unwraps a constructor in tests; a failure there is a broken test.
func must(s *Shape, err error) *Shape {
	if err != nil {
		panic(err)
	}
	return s
}

func TestProps(t *testing.T) {
	mm := 1e-3
	mm2, mm4 := mm*mm, mm*mm*mm*mm
	d4 := func(d float64) float64 { return math.Pi * d * d * d * d / 64 }
	cases := []struct {
		name           string
		shape          func() (*Shape, error)
		a, iy, iz, iyz float64
		yc, zc         float64
		src            string
	}{
		// Source: Gere & Goodno, Mechanics of Materials, App. E case 1: A = bh, I = bh³/12.
		{"rect 300x500", func() (*Shape, error) { return Rect(300*mm, 500*mm) }, 150000 * mm2, 300 * 500 * 500 * 500 / 12.0 * mm4, 500 * 300 * 300 * 300 / 12.0 * mm4, 0, 0, 0, "App. E"},
		// Source: Gere & Goodno, App. E case 9: I = πd⁴/64.
		{"circle 40", func() (*Shape, error) { return Circle(40 * mm) }, math.Pi * 400 * mm2, d4(40) * mm4, d4(40) * mm4, 0, 0, 0, "App. E"},
		// Source: REFERENCES.md C9 (Gere & Goodno / Timoshenko): CHS 168.3×8, I = 1.29727118e7 mm⁴.
		{"chs 168.3x8", func() (*Shape, error) { return CHS(168.3*mm, 8*mm) }, math.Pi * (168.3*168.3 - 152.3*152.3) / 4 * mm2, 1.29727118e7 * mm4, 1.29727118e7 * mm4, 0, 0, 0, "C9"},
		// Source: REFERENCES.md C11: CHS 219.1×10, A_a = π(219.1² − 199.1²)/4.
		{"chs 219.1x10", func() (*Shape, error) { return CHS(219.1*mm, 10*mm) }, math.Pi * (219.1*219.1 - 199.1*199.1) / 4 * mm2, (d4(219.1) - d4(199.1)) * mm4, (d4(219.1) - d4(199.1)) * mm4, 0, 0, 0, "C11"},
		// Source: Gere & Goodno, App. E: hollow rectangle as difference of two rectangles.
		{"rhs 200x100x10", func() (*Shape, error) { return RHS(200*mm, 100*mm, 10*mm) }, (200*100 - 180*80) * mm2, (200*100*100*100 - 180*80*80*80) / 12.0 * mm4, (100*200*200*200 - 80*180*180*180) / 12.0 * mm4, 0, 0, 0, "App. E"},
		// Source: plate formula for an I section (common practice): A = 2bt_f + (h−2t_f)t_w,
		// I_y = (bh³ − (b − t_w)(h − 2t_f)³)/12, I_z = (2t_f b³ + (h − 2t_f)t_w³)/12.
		{"i 300x150x7.1x10.7", func() (*Shape, error) { return ISection(300*mm, 150*mm, 7.1*mm, 10.7*mm) },
			(2*150*10.7 + (300-21.4)*7.1) * mm2,
			(150*300*300*300 - (150-7.1)*278.6*278.6*278.6) / 12 * mm4,
			(2*10.7*150*150*150 + 278.6*7.1*7.1*7.1) / 12 * mm4, 0, 0, 0, "common practice"},
		// Source: equal angle from two rectangles (common practice): legs 100, t 10.
		// A = 1900; centroid e = (100·10·5 + 90·10·55)/1900 = 28.6842105 mm;
		// I = Σ(I_own + A·d²); I_yz from the parallel-axis terms of the two rectangles.
		{"angle 100x100x10", func() (*Shape, error) { return Angle(100*mm, 100*mm, 10*mm) }, 1900 * mm2,
			angleI(), angleI(), angleIyz(), 28.684210526315788 * mm, 28.684210526315788 * mm, "common practice"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := must(c.shape()).Props()
			for _, chk := range []struct {
				n         string
				got, want float64
			}{{"A", p.A, c.a}, {"I_y", p.Iy, c.iy}, {"I_z", p.Iz, c.iz}, {"y_c", p.Yc, c.yc}, {"z_c", p.Zc, c.zc}} {
				tol := 1e-12
				if c.src == "C9" && chk.n[0] == 'I' {
					tol = 1e-8 // published to 9 figures
				}
				if chk.want == 0 {
					if math.Abs(chk.got) > 1e-15 {
						t.Errorf("%s = %g, want 0 (%s)", chk.n, chk.got, c.src)
					}
				} else if relErr(chk.got, chk.want) > tol {
					t.Errorf("%s = %.12g, want %.12g (%s)", chk.n, chk.got, chk.want, c.src)
				}
			}
			if math.Abs(p.Iyz-c.iyz) > 1e-12*math.Max(p.Iy, 1e-30) {
				t.Errorf("I_yz = %g, want %g", p.Iyz, c.iyz)
			}
			if relErr(p.IRy, math.Sqrt(p.Iy/p.A)) > 1e-14 {
				t.Errorf("i_y = %g", p.IRy)
			}
		})
	}
}

// angleI is I_y of the 100×100×10 angle about its centroid from two
// rectangles: the horizontal leg 100×10 and the vertical leg 10×90.
func angleI() float64 {
	mm4 := 1e-12
	e := 28.684210526315788
	i1 := 100*1000/12.0 + 1000*(5-e)*(5-e)
	i2 := 10*90*90*90/12.0 + 900*(55-e)*(55-e)
	return (i1 + i2) * mm4
}

func angleIyz() float64 {
	mm4 := 1e-12
	e := 28.684210526315788
	// horizontal leg centroid (50, 5), vertical leg (5, 55)
	return (1000*(50-e)*(5-e) + 900*(5-e)*(55-e)) * mm4
}

func TestShapeErrors(t *testing.T) {
	cases := []struct {
		name string
		f    func() (*Shape, error)
	}{
		{"negative diameter", func() (*Shape, error) { return Circle(-1) }},
		{"NaN diameter", func() (*Shape, error) { return Circle(math.NaN()) }},
		{"thick tube", func() (*Shape, error) { return CHS(0.1, 0.06) }},
		{"rhs without hole", func() (*Shape, error) { return RHS(0.1, 0.2, 0.05) }},
		{"web wider than flange", func() (*Shape, error) { return ISection(0.3, 0.1, 0.1, 0.01) }},
		{"flanges too thick", func() (*Shape, error) { return ISection(0.3, 0.1, 0.01, 0.15) }},
		{"angle too thick", func() (*Shape, error) { return Angle(0.1, 0.1, 0.1) }},
		{"two vertices", func() (*Shape, error) { return Polygon([]float64{0, 1}, []float64{0, 1}) }},
		{"collinear", func() (*Shape, error) { return Polygon([]float64{0, 1, 2}, []float64{0, 1, 2}) }},
		{"bow tie", func() (*Shape, error) { return Polygon([]float64{0, 1, 1, 0}, []float64{0, 1, 0, 1}) }},
		{"count mismatch", func() (*Shape, error) { return Polygon([]float64{0, 1, 1}, []float64{0, 1}) }},
		{"infinite vertex", func() (*Shape, error) { return Polygon([]float64{0, 1, math.Inf(1)}, []float64{0, 0, 1}) }},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if _, err := c.f(); err == nil {
				t.Fatal("no error")
			} else if msg := err.Error(); msg == "" || msg[0] < 'a' || msg[0] > 'z' {
				t.Errorf("error should start lower case: %q", msg)
			}
		})
	}
}

func TestPolygonNormalises(t *testing.T) {
	// Clockwise with a closing vertex and a repeated vertex: same square.
	s := must(Polygon([]float64{0, 0, 0, 1, 1, 0}, []float64{0, 1, 1, 1, 0, 0}))
	p := s.Props()
	// Source: unit square, A = 1, centroid (0.5, 0.5), I = 1/12 (Gere & Goodno App. E).
	if relErr(p.A, 1) > 1e-15 || relErr(p.Yc, 0.5) > 1e-15 || relErr(p.Iy, 1.0/12) > 1e-14 {
		t.Fatalf("props %+v", p)
	}
}

func TestCutAndJoin(t *testing.T) {
	// A 400×400 plate with a 100 mm circular hole at (100, 0) mm.
	plate := must(Rect(0.4, 0.4))
	hole := must(Circle(0.1)).Transform(0.1, 0, 0)
	s := must(Cut(plate, hole))
	p := s.Props()
	ah := math.Pi * 0.05 * 0.05
	// Source: composite areas with holes, parallel-axis theorem (Gere & Goodno §12.5).
	wantA := 0.16 - ah
	wantYc := -ah * 0.1 / wantA
	wantIz := 0.4*0.4*0.4*0.4/12 - (math.Pi*math.Pow(0.1, 4)/64 + ah*0.01) - wantA*wantYc*wantYc
	if relErr(p.A, wantA) > 1e-14 || relErr(p.Yc, wantYc) > 1e-12 || relErr(p.Iz, wantIz) > 1e-12 {
		t.Errorf("got A %g yc %g Iz %g, want %g %g %g", p.A, p.Yc, p.Iz, wantA, wantYc, wantIz)
	}
	if _, err := Cut(plate, must(Circle(0.1)).Transform(0.19, 0, 0)); err == nil {
		t.Error("a hole sticking out was accepted")
	}
	if _, err := Cut(s, must(Circle(0.1)).Transform(0.12, 0, 0)); err == nil {
		t.Error("overlapping holes were accepted")
	}
	a := must(Rect(0.2, 0.1)).Transform(0, 0.05, 0)
	b := must(Rect(0.2, 0.1)).Transform(0, -0.05, 0)
	j := must(Join(a, b)).Props()
	if relErr(j.Iy, 0.2*0.2*0.2*0.2/12) > 1e-12 {
		t.Errorf("joined I_y %g", j.Iy)
	}
	if _, err := Join(a, a); err == nil {
		t.Error("overlapping join accepted")
	}
}

// TestPlacement: rotation keeps area and principal moments, moves the
// centroid with the shape, and rotates I_y, I_z, I_yz as a tensor
// (Gere & Goodno §12.8, transformation equations).
func TestPlacement(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	base := must(Angle(0.15, 0.09, 0.012))
	p0 := base.Props()
	for range 50 {
		th := rng.Float64() * 2 * math.Pi
		dy, dz := rng.Float64()-0.5, rng.Float64()-0.5
		p := base.Transform(dy, dz, th).Props()
		c, s := math.Cos(th), math.Sin(th)
		wantYc := c*p0.Yc - s*p0.Zc + dy
		wantZc := s*p0.Yc + c*p0.Zc + dz
		// Tensor rotation with I_z = ∫y², I_y = ∫z², I_yz = ∫yz.
		wantIz := c*c*p0.Iz + s*s*p0.Iy - 2*s*c*p0.Iyz
		wantIy := s*s*p0.Iz + c*c*p0.Iy + 2*s*c*p0.Iyz
		if relErr(p.A, p0.A) > 1e-13 || relErr(p.I1, p0.I1) > 1e-11 || relErr(p.I2, p0.I2) > 1e-11 ||
			math.Abs(p.Yc-wantYc) > 1e-14 || math.Abs(p.Zc-wantZc) > 1e-14 ||
			math.Abs(p.Iz-wantIz) > 1e-11*p0.I1 || math.Abs(p.Iy-wantIy) > 1e-11*p0.I1 {
			t.Fatalf("rotation %g: got %+v", th, p)
		}
	}
}

// TestRingRefusesFarCoordinates: a vertex far beyond any cross-section is
// refused before its powers overflow (a fuzzed polygon near 1e155 m had a
// NaN area).
func TestRingRefusesFarCoordinates(t *testing.T) {
	for _, far := range []float64{1e155, -2e6, 1e300} {
		if _, err := NewRing([]float64{0, far, 0}, []float64{0, 0, 1}); err == nil {
			t.Errorf("a vertex at %g m was accepted", far)
		}
	}
	if _, err := NewRing([]float64{0, 0.3, 0}, []float64{0, 0, 0.5}); err != nil {
		t.Errorf("an ordinary triangle: %v", err)
	}
}
