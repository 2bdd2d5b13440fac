package section

import "math"

// Moments are the area moments of a shape about a reference point (y0, z0):
// A = ∫dA, Sy = ∫y dA, Sz = ∫z dA, Syy = ∫y² dA, Szz = ∫z² dA, Syz = ∫yz dA,
// with y and z measured from the reference point.
type Moments struct {
	A, Sy, Sz, Syy, Szz, Syz float64
}

func (m *Moments) add(o Moments, sign float64) {
	m.A += sign * o.A
	m.Sy += sign * o.Sy
	m.Sz += sign * o.Sz
	m.Syy += sign * o.Syy
	m.Szz += sign * o.Szz
	m.Syz += sign * o.Syz
}

// momentsRing uses the closed forms of Green's theorem over the edges of a
// counter-clockwise polygon (common practice; e.g. C. Steger, "On the
// calculation of arbitrary moments of polygons", TU München FGBV-96-05, 1996,
// from memory).
func momentsRing(r *Ring, y0, z0 float64) Moments {
	var m Moments
	n := len(r.Y)
	for i := range n {
		j := (i + 1) % n
		yi, zi := r.Y[i]-y0, r.Z[i]-z0
		yj, zj := r.Y[j]-y0, r.Z[j]-z0
		c := yi*zj - yj*zi
		m.A += c
		m.Sy += (yi + yj) * c
		m.Sz += (zi + zj) * c
		m.Syy += (yi*yi + yi*yj + yj*yj) * c
		m.Szz += (zi*zi + zi*zj + zj*zj) * c
		m.Syz += (yi*zj + 2*yi*zi + 2*yj*zj + yj*zi) * c
	}
	m.A /= 2
	m.Sy /= 6
	m.Sz /= 6
	m.Syy /= 12
	m.Szz /= 12
	m.Syz /= 24
	return m
}

// momentsAnnulus is exact: A = π(R² − r²), I = π(R⁴ − r⁴)/4 about the centre,
// moved by the parallel-axis theorem.
func momentsAnnulus(a *Annulus, y0, z0 float64) Moments {
	ro2, ri2 := a.Rout*a.Rout, a.Rin*a.Rin
	area := math.Pi * (ro2 - ri2)
	ic := math.Pi * (ro2*ro2 - ri2*ri2) / 4
	yc, zc := a.Yc-y0, a.Zc-z0
	return Moments{
		A: area, Sy: area * yc, Sz: area * zc,
		Syy: ic + area*yc*yc, Szz: ic + area*zc*zc, Syz: area * yc * zc,
	}
}

// MomentsAbout returns the area moments of s about (y0, z0).
func (s *Shape) MomentsAbout(y0, z0 float64) Moments {
	var m Moments
	for _, r := range s.Regions {
		if r.Ring != nil {
			m.add(momentsRing(r.Ring, y0, z0), r.Sign)
		} else if r.Sec != nil {
			m.add(momentsSector(r.Sec, y0, z0), r.Sign)
		} else {
			m.add(momentsAnnulus(r.Ann, y0, z0), r.Sign)
		}
	}
	return m
}

// Ref returns a reference point near the shape (the middle of the bounding
// box of its material regions), about which moments lose little to rounding.
func (s *Shape) Ref() (float64, float64) {
	y0, y1, z0, z1 := s.BBox()
	return (y0 + y1) / 2, (z0 + z1) / 2
}

// BBox returns the bounding box of the shape.
func (s *Shape) BBox() (y0, y1, z0, z1 float64) {
	y0, y1, z0, z1 = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, r := range s.Regions {
		var a0, a1, b0, b1 float64
		if r.Ring != nil {
			a0, a1, b0, b1 = r.Ring.bbox()
		} else if r.Sec != nil {
			a0, a1, b0, b1 = r.Sec.bbox()
		} else {
			a0, a1 = r.Ann.Yc-r.Ann.Rout, r.Ann.Yc+r.Ann.Rout
			b0, b1 = r.Ann.Zc-r.Ann.Rout, r.Ann.Zc+r.Ann.Rout
		}
		y0, y1 = math.Min(y0, a0), math.Max(y1, a1)
		z0, z1 = math.Min(z0, b0), math.Max(z1, b1)
	}
	return
}

// Props are the geometric properties of a section. Second moments are about
// axes through the centroid parallel to y and z; I1 ≥ I2 are the principal
// values.
type Props struct {
	A, Yc, Zc      float64 // m², m, m
	Iy, Iz, Iyz    float64 // m⁴
	I1, I2         float64 // m⁴
	IRy, IRz, IMin float64 // radii of gyration √(I/A), m
}

// Props computes the properties of s.
func (s *Shape) Props() Props {
	y0, z0 := s.Ref()
	m := s.MomentsAbout(y0, z0)
	p := propsFrom(m, y0, z0)
	// A centroid that rounding alone moved off an axis of a symmetric shape
	// (the arcs of a rolled profile sum to 1e-18 m, not 0) is put back on
	// it: an offset below 1e-13 of the shape's size is no information, and
	// printed as 3.4e-15 mm it reads as one.
	a0, a1, b0, b1 := s.BBox()
	size := math.Max(a1-a0, b1-b0)
	if math.Abs(p.Yc) < 1e-13*size {
		p.Yc = 0
	}
	if math.Abs(p.Zc) < 1e-13*size {
		p.Zc = 0
	}
	if math.Abs(p.Iyz) < 1e-13*math.Sqrt(math.Abs(p.Iy*p.Iz)) {
		p.Iyz = 0
	}
	return p
}

func propsFrom(m Moments, y0, z0 float64) Props {
	p := Props{A: m.A}
	cy, cz := m.Sy/m.A, m.Sz/m.A
	p.Yc, p.Zc = y0+cy, z0+cz
	p.Iy = m.Szz - m.A*cz*cz
	p.Iz = m.Syy - m.A*cy*cy
	p.Iyz = m.Syz - m.A*cy*cz
	mid := (p.Iy + p.Iz) / 2
	rad := math.Hypot((p.Iy-p.Iz)/2, p.Iyz)
	p.I1, p.I2 = mid+rad, mid-rad
	p.IRy = math.Sqrt(p.Iy / p.A)
	p.IRz = math.Sqrt(p.Iz / p.A)
	p.IMin = math.Sqrt(math.Max(p.I2, 0) / p.A)
	return p
}
