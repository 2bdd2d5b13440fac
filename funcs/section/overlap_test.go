package section

import (
	"math"
	"math/rand/v2"
	"testing"
)

// shClip is the Sutherland–Hodgman clipping of a subject polygon by a convex
// clip polygon (I. E. Sutherland and G. W. Hodgman, Reentrant polygon
// clipping, Comm. ACM 17 (1974) 32–42). For a non-convex subject it may leave
// degenerate edges along the clip boundary, which carry no area, so the
// area of its output is the exact intersection area: an algorithm
// independent of clipArea's boundary classification.
func shClip(sy, sz, cy, cz []float64) (ys, zs []float64) {
	ys, zs = append([]float64(nil), sy...), append([]float64(nil), sz...)
	n := len(cy)
	for i := range n {
		j := (i + 1) % n
		ay, az, by, bz := cy[i], cz[i], cy[j], cz[j]
		side := func(y, z float64) float64 { return (by-ay)*(z-az) - (bz-az)*(y-ay) }
		var oy, oz []float64
		m := len(ys)
		for k := range m {
			py, pz := ys[k], zs[k]
			qy, qz := ys[(k+1)%m], zs[(k+1)%m]
			sp, sq := side(py, pz), side(qy, qz)
			if sp >= 0 {
				oy, oz = append(oy, py), append(oz, pz)
			}
			if (sp >= 0) != (sq >= 0) {
				t := sp / (sp - sq)
				oy, oz = append(oy, py+t*(qy-py)), append(oz, pz+t*(qz-pz))
			}
		}
		ys, zs = oy, oz
		if len(ys) == 0 {
			return nil, nil
		}
	}
	return ys, zs
}

func shoelace(ys, zs []float64) float64 {
	s := 0.0
	for i := range ys {
		j := (i + 1) % len(ys)
		s += ys[i]*zs[j] - ys[j]*zs[i]
	}
	return s / 2
}

// TestClipAreaRandom compares the intersection area of random non-convex
// (star-shaped) polygons and random convex polygons with Sutherland–Hodgman
// clipping. Source: Sutherland & Hodgman (1974); relative 1e-10.
func TestClipAreaRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 1))
	for trial := range 300 {
		n := 3 + rng.IntN(20)
		var py, pz []float64
		for k := range n {
			th := 2 * math.Pi * (float64(k) + 0.8*rng.Float64()) / float64(n)
			r := 0.2 + rng.Float64()
			py, pz = append(py, r*math.Cos(th)), append(pz, r*math.Sin(th))
		}
		m := 3 + rng.IntN(8)
		var ths []float64
		for range m {
			ths = append(ths, 2*math.Pi*rng.Float64())
		}
		sortFloats(ths)
		oy, oz, rc := rng.Float64()-0.5, rng.Float64()-0.5, 0.3+rng.Float64()
		var qy, qz []float64
		for _, th := range ths {
			qy, qz = append(qy, oy+rc*math.Cos(th)), append(qz, oz+rc*math.Sin(th))
		}
		p, err := Polygon(py, pz)
		if err != nil {
			continue
		}
		q, err := Polygon(qy, qz)
		if err != nil {
			continue
		}
		cy, cz := shClip(py, pz, qy, qz)
		want := 0.0
		if cy != nil {
			want = math.Abs(shoelace(cy, cz))
		}
		got := IntersectionArea(p, q)
		if math.Abs(got-want) > 1e-10*math.Max(1, want) {
			t.Errorf("trial %d: intersection area %.15g, Sutherland–Hodgman %.15g", trial, got, want)
		}
		if back := IntersectionArea(q, p); math.Abs(back-got) > 1e-12 {
			t.Errorf("trial %d: not symmetric: %.15g vs %.15g", trial, got, back)
		}
	}
}

func sortFloats(x []float64) {
	for i := 1; i < len(x); i++ {
		for j := i; j > 0 && x[j] < x[j-1]; j-- {
			x[j], x[j-1] = x[j-1], x[j]
		}
	}
}

// TestTouchingAndOverlap: shapes that share only boundary have no common
// area; shapes that share material do. Expected areas are plane geometry
// (common practice).
func TestTouchingAndOverlap(t *testing.T) {
	mm := 1e-3
	heb := must(RolledI(260*mm, 260*mm, 10*mm, 17.5*mm, 24*mm))
	block := must(Rect(450*mm, 450*mm))
	cases := []struct {
		name string
		a, b *Shape
		want float64
	}{
		{"I in its hole", heb, must(Cut(block, heb)), 0},
		{"I and itself (fillets through inscribed polygons)", heb, heb, heb.polyArea()},
		{"plate on a flange", heb, must(Rect(260*mm, 20*mm)).Transform(0, 140*mm, 0), 0},
		{"plate into a flange", heb, must(Rect(260*mm, 20*mm)).Transform(0, 125*mm, 0), 260 * 15 * mm * mm},
		{"core in its tube", must(CHS(219.1*mm, 10*mm)), must(Circle(199.1 * mm)), 0},
		{"plain I and half-width plate under the flange tip", must(ISection(300*mm, 150*mm, 7.1*mm, 10.7*mm)), must(Rect(20*mm, 20*mm)).Transform(65*mm, 129.3*mm-10*mm, 0), 0},
		{"side by side squares", must(Rect(1, 1)), must(Rect(1, 1)).Transform(1, 0.5, 0), 0},
		{"squares sharing a quarter", must(Rect(1, 1)), must(Rect(1, 1)).Transform(0.5, 0.5, 0), 0.25},
	}
	for _, c := range cases {
		got := IntersectionArea(c.a, c.b)
		if math.Abs(got-c.want) > 1e-6*math.Max(c.want, 1e-6) {
			t.Errorf("%s: common area %.12g, want %.12g", c.name, got, c.want)
		}
	}
	if _, err := Join(heb, must(Cut(block, heb))); err != nil {
		t.Errorf("an I and the block cut around it must join: %v", err)
	}
	if _, err := Join(heb, must(Rect(260*mm, 20*mm)).Transform(0, 125*mm, 0)); err == nil {
		t.Error("a plate sunk into the flange must be refused")
	}
	if _, err := Cut(must(Rect(100*mm, 100*mm)), must(Rect(60*mm, 60*mm)).Transform(30*mm, 0, 0)); err == nil {
		t.Error("a hole that sticks out must be refused")
	}
}

// TestRolledShapes: areas with root and corner radii against the closed
// forms A = 2bt_f + (h − 2t_f)t_w + (4 − π)r² and A = bh − (b−2t)(h−2t) −
// (4 − π)(r_o² − r_i²) (plane geometry, common practice), and second
// moments of the exact arcs against the section integral of z² and y².
func TestRolledShapes(t *testing.T) {
	mm := 1e-3
	h, b, tw, tf, r := 260*mm, 260*mm, 10*mm, 17.5*mm, 24*mm
	s := must(RolledI(h, b, tw, tf, r))
	p := s.Props()
	if want := 2*b*tf + (h-2*tf)*tw + (4-math.Pi)*r*r; relErr(p.A, want) > 1e-14 {
		t.Errorf("HEB 260 A = %.15g, want %.15g", p.A, want)
	}
	for _, f := range []struct {
		name string
		f    Field
		want float64
	}{{"z²", func(y, z float64) float64 { return z * z }, p.Iy}, {"y²", func(y, z float64) float64 { return y * y }, p.Iz}, {"1", func(y, z float64) float64 { return 1 }, p.A}} {
		res, err := Integrate(s, f.f, 1e-12)
		if err != nil || relErr(res.Value, f.want) > 1e-10 {
			t.Errorf("∫%s dA = %.15g (%v), closed form %.15g", f.name, res.Value, err, f.want)
		}
	}
	rr := must(RoundedRHS(200*mm, 100*mm, 8*mm, 12*mm, 8*mm))
	if want := 200*100*mm*mm - 184*84*mm*mm - (4-math.Pi)*(144-64)*mm*mm; relErr(rr.Props().A, want) > 1e-13 {
		t.Errorf("RHS A = %.15g, want %.15g", rr.Props().A, want)
	}
	core := must(CoreOf(rr))
	if want := 184*84*mm*mm - (4-math.Pi)*64*mm*mm; relErr(core.Props().A, want) > 1e-13 {
		t.Errorf("RHS core A = %.15g, want %.15g", core.Props().A, want)
	}
	if err := Overlap(rr, core); err != nil {
		t.Errorf("a tube and its core must touch only: %v", err)
	}
	bars := must(BarsOnCircle(8, 20*mm, 200*mm))
	bp := bars.Props()
	ab := math.Pi * 100 * mm * mm
	// Σ z_k² over 8 bars on radius R is 4R² (half of n·R²).
	if want := 8*math.Pi*math.Pow(20*mm, 4)/64 + ab*4*0.01; relErr(bp.Iy, want) > 1e-12 || relErr(bp.A, 8*ab) > 1e-14 {
		t.Errorf("8 bars: A = %g, I_y = %g, want %g, %g", bp.A, bp.Iy, 8*ab, want)
	}
	if _, err := BarsOnCircle(8, 80*mm, 200*mm); err == nil {
		t.Error("8 bars of 80 mm on a 200 mm circle overlap and must be refused")
	}
}

// TestDrawOutlines: the drawing of a rolled profile, a rounded tube, its
// core and a block cut around a profile covers the same area as the exact
// regions, within what 16 chords per quarter arc change (relative 5e-4), and
// draws one outline for the profile instead of its construction pieces.
// Source: plane geometry (common practice).
func TestDrawOutlines(t *testing.T) {
	heb := must(RolledI(0.26, 0.26, 0.010, 0.0175, 0.024))
	rhs := must(RoundedRHS(0.2, 0.1, 0.008, 0.012, 0.008))
	block := must(Cut(must(Rect(0.45, 0.45)), heb.Transform(0, 0.03, 0)))
	for name, s := range map[string]*Shape{"HEB 260": heb, "RHS": rhs, "RHS core": must(CoreOf(rhs)), "block": block} {
		a := 0.0
		for _, r := range s.Outline() {
			if len(r.Y) == 0 {
				a += r.Sign * math.Pi * r.R * r.R
				continue
			}
			a += r.Sign * shoelace(r.Y, r.Z)
		}
		if relErr(a, s.Props().A) > 5e-4 {
			t.Errorf("%s: drawn area %.9g, exact %.9g", name, a, s.Props().A)
		}
	}
	if n := len(heb.Outline()); n != 1 {
		t.Errorf("the profile draws as %d regions, want one outline", n)
	}
}
