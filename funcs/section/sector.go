package section

import (
	"fmt"
	"math"
)

// Sector is a circular sector: the points at distance ≤ R from (Yc, Zc)
// whose polar angle lies in [Th0, Th0 + Phi], 0 < Phi ≤ 2π. Quarter sectors
// round the corners of hollow sections and, as holes cut from a square, form
// the root fillets of rolled I sections, so that those shapes keep their
// exact circular boundary.
type Sector struct {
	Yc, Zc, R, Th0, Phi float64
}

// momentsSector is exact, from polar integration about the centre:
// A = R²φ/2, ∫y dA = R³(sin θ1 − sin θ0)/3, ∫z dA = R³(cos θ0 − cos θ1)/3,
// ∫y² dA = R⁴/4·[φ/2 + (sin 2θ1 − sin 2θ0)/4], ∫z² dA = R⁴/4·[φ/2 − (…)/4],
// ∫yz dA = R⁴/8·(sin²θ1 − sin²θ0), then moved by the parallel-axis rules.
func momentsSector(s *Sector, y0, z0 float64) Moments {
	t0, t1 := s.Th0, s.Th0+s.Phi
	s0, c0 := math.Sincos(t0)
	s1, c1 := math.Sincos(t1)
	r2 := s.R * s.R
	r3, r4 := r2*s.R, r2*r2
	a := r2 * s.Phi / 2
	sy := r3 * (s1 - s0) / 3
	sz := r3 * (c0 - c1) / 3
	d2 := (2*s1*c1 - 2*s0*c0) / 4 // (sin 2θ1 − sin 2θ0)/4
	syy := r4 / 4 * (s.Phi/2 + d2)
	szz := r4 / 4 * (s.Phi/2 - d2)
	syz := r4 / 8 * (s1*s1 - s0*s0)
	cy, cz := s.Yc-y0, s.Zc-z0
	return Moments{
		A: a, Sy: sy + a*cy, Sz: sz + a*cz,
		Syy: syy + 2*cy*sy + a*cy*cy,
		Szz: szz + 2*cz*sz + a*cz*cz,
		Syz: syz + cy*sz + cz*sy + a*cy*cz,
	}
}

func (s *Sector) contains(y, z float64) bool {
	dy, dz := y-s.Yc, z-s.Zc
	if math.Hypot(dy, dz) > s.R {
		return false
	}
	th := math.Atan2(dz, dy) - s.Th0
	th -= 2 * math.Pi * math.Floor(th/(2*math.Pi))
	return th <= s.Phi
}

func (s *Sector) bbox() (y0, y1, z0, z1 float64) {
	y0, y1, z0, z1 = s.Yc, s.Yc, s.Zc, s.Zc
	add := func(th float64) {
		sn, cs := math.Sincos(th)
		y, z := s.Yc+s.R*cs, s.Zc+s.R*sn
		y0, y1 = math.Min(y0, y), math.Max(y1, y)
		z0, z1 = math.Min(z0, z), math.Max(z1, z)
	}
	add(s.Th0)
	add(s.Th0 + s.Phi)
	// the extreme points of the circle that the arc passes
	for k := math.Ceil(s.Th0 / (math.Pi / 2)); k*math.Pi/2 <= s.Th0+s.Phi; k++ {
		add(k * math.Pi / 2)
	}
	return
}

// sectorLevel integrates over a sector in polar coordinates with 2^k
// Gauss cells of 8 points in angle and in radius (the integrand is smooth
// but not periodic in angle, so the trapezoidal rule of the annulus would
// not converge fast); it returns the value and magnitude.
func (q *integrator) sectorLevel(s *Sector, k int) (float64, float64) {
	cells := 1 << k
	g := q.g
	hr := s.R / float64(cells)
	ht := s.Phi / float64(cells)
	sum, mag := 0.0, 0.0
	for cr := range cells {
		r0 := float64(cr) * hr
		for i, xr := range g.x {
			r := r0 + hr*xr
			for ct := range cells {
				t0 := s.Th0 + float64(ct)*ht
				for j, xt := range g.x {
					sn, cs := math.Sincos(t0 + ht*xt)
					v := q.eval(s.Yc+r*cs, s.Zc+r*sn)
					w := g.w[i] * hr * r * g.w[j] * ht
					sum += v * w
					mag += math.Abs(v * w)
				}
			}
		}
	}
	return sum, mag
}

func (q *integrator) sectorCell(s *Sector, sign float64, k int, coarse float64) *cell {
	v, m := q.sectorLevel(s, k+1)
	c := &cell{sign: sign, sec: s, level: k + 1, fine: v, err: math.Abs(v - coarse)}
	c.final = c.err <= roundFloor*m || k+1 >= maxSectorLevel
	return c
}

// maxSectorLevel bounds the refinement of a sector: level k costs 64·4^k
// evaluations.
const maxSectorLevel = 7

// quadrant returns the quarter sector of radius r centred at (yc, zc) that
// starts at the angle q·π/2.
func quadrant(yc, zc, r float64, q int) Region {
	return Region{Sign: 1, Sec: &Sector{Yc: yc, Zc: zc, R: r, Th0: float64(q) * math.Pi / 2, Phi: math.Pi / 2}}
}

// RolledI is a doubly symmetric I or H section of depth h, flange width b,
// web thickness t_w and flange thickness t_f with four root fillets of
// radius r between web and flanges, as hot-rolled profiles are drawn in
// EN 10365 and the steel tables (toe radii of parallel flanges are zero).
// The fillets are exact: each is the r × r square in the corner less a
// quarter circle, so A = 2·b·t_f + (h − 2t_f)·t_w + (4 − π)·r².
func RolledI(h, b, tw, tf, r float64) (*Shape, error) {
	s, err := ISection(h, b, tw, tf)
	if err != nil || r == 0 {
		return s, err
	}
	if !(r > 0) || math.IsInf(r, 0) {
		return nil, fmt.Errorf("root radius r must be a length ≥ 0, got %g m", r)
	}
	if tw/2+r > b/2 {
		return nil, fmt.Errorf("root radius r = %g m does not fit beside the web: t_w/2 + r exceeds b/2 = %g m", r, b/2)
	}
	if 2*(tf+r) >= h {
		return nil, fmt.Errorf("root radius r = %g m does not fit in the web depth h − 2t_f = %g m", r, h-2*tf)
	}
	y1, y2, y3 := b/2, tw/2, tw/2+r
	z1, z2, z3 := h/2, h/2-tf, h/2-tf-r
	ring := &Ring{
		Y: []float64{-y1, y1, y1, y3, y3, y2, y2, y3, y3, y1, y1, -y1, -y1, -y3, -y3, -y2, -y2, -y3, -y3, -y1},
		Z: []float64{-z1, -z1, -z2, -z2, -z3, -z3, z3, z3, z2, z2, z1, z1, z2, z2, z3, z3, -z3, -z3, -z2, -z2},
	}
	hole := func(yc, zc float64, q int) Region {
		g := quadrant(yc, zc, r, q)
		g.Sign = -1
		return g
	}
	// The drawing: one outline with the fillets as arcs.
	const n = 16
	var dy, dz []float64
	add := func(y, z float64) { dy, dz = append(dy, y), append(dz, z) }
	add(-y1, -z1)
	add(y1, -z1)
	add(y1, -z2)
	dy, dz = appendArc(dy, dz, y3, -z3, r, 3*math.Pi/2, math.Pi, n)
	dy, dz = appendArc(dy, dz, y3, z3, r, math.Pi, math.Pi/2, n)
	add(y1, z2)
	add(y1, z1)
	add(-y1, z1)
	add(-y1, z2)
	dy, dz = appendArc(dy, dz, -y3, z3, r, math.Pi/2, 0, n)
	dy, dz = appendArc(dy, dz, -y3, -z3, r, 0, -math.Pi/2, n)
	add(-y1, -z2)
	return &Shape{Regions: []Region{
		{Sign: 1, Ring: ring},
		hole(y3, -z3, 2), hole(y3, z3, 1), hole(-y3, z3, 0), hole(-y3, -z3, 3),
	}, Draw: []Region{{Sign: 1, Ring: &Ring{Y: dy, Z: dz}}}}, nil
}

// roundedRing is the outline of the b × h rectangle with corners of radius
// rho as a polygon, for drawings.
func roundedRing(b, h, rho float64) *Ring {
	if rho == 0 {
		return rectRing(-b/2, -h/2, b/2, h/2)
	}
	const n = 16
	y2, z2 := b/2-rho, h/2-rho
	var ys, zs []float64
	ys, zs = appendArc(ys, zs, y2, -z2, rho, -math.Pi/2, 0, n)
	ys, zs = appendArc(ys, zs, y2, z2, rho, 0, math.Pi/2, n)
	ys, zs = appendArc(ys, zs, -y2, z2, rho, math.Pi/2, math.Pi, n)
	ys, zs = appendArc(ys, zs, -y2, -z2, rho, math.Pi, 3*math.Pi/2, n)
	return &Ring{Y: ys, Z: zs}
}

// roundedRect is the b × h rectangle centred at the origin with corners
// rounded to radius rho (0 ≤ 2·rho < min(b, h)), as regions of the sign.
func roundedRect(b, h, rho, sign float64) []Region {
	if rho == 0 {
		return []Region{{Sign: sign, Ring: rectRing(-b/2, -h/2, b/2, h/2)}}
	}
	y1, y2 := b/2, b/2-rho
	z1, z2 := h/2, h/2-rho
	ring := &Ring{
		Y: []float64{-y2, y2, y2, y1, y1, y2, y2, -y2, -y2, -y1, -y1, -y2},
		Z: []float64{-z1, -z1, -z2, -z2, z2, z2, z1, z1, z2, z2, -z2, -z2},
	}
	out := []Region{{Sign: sign, Ring: ring},
		quadrant(y2, -z2, rho, 3), quadrant(y2, z2, rho, 0), quadrant(-y2, z2, rho, 1), quadrant(-y2, -z2, rho, 2)}
	for i := 1; i < len(out); i++ {
		out[i].Sign = sign
	}
	return out
}

// RoundedRHS is a rectangular hollow section b wide and h high with wall t
// and corner radii r_o outside and r_i inside (hot-finished tubes are drawn
// with r_o = 1.5t and r_i = t for calculation, EN 10210-2; AISC gives
// r_o = 2t for HSS), centred at the origin. The core (the void) is kept,
// so a concrete fill can be made with core(s).
func RoundedRHS(b, h, t, ro, ri float64) (*Shape, error) {
	if _, err := RHS(b, h, t); err != nil {
		return nil, err
	}
	if !(ro >= 0) || !(ri >= 0) || math.IsInf(ro, 0) || math.IsInf(ri, 0) {
		return nil, fmt.Errorf("corner radii must be lengths ≥ 0, got r_o = %g m, r_i = %g m", ro, ri)
	}
	if 2*ro >= math.Min(b, h) || 2*ri >= math.Min(b, h)-2*t {
		return nil, fmt.Errorf("corner radii r_o = %g m, r_i = %g m do not fit a %g m × %g m tube of wall %g m", ro, ri, b, h, t)
	}
	s := &Shape{Regions: append(roundedRect(b, h, ro, 1), roundedRect(b-2*t, h-2*t, ri, -1)...),
		Draw: []Region{{Sign: 1, Ring: roundedRing(b, h, ro)}, {Sign: -1, Ring: roundedRing(b-2*t, h-2*t, ri)}}}
	s.Core = &Shape{Regions: roundedRect(b-2*t, h-2*t, ri, 1), Draw: []Region{{Sign: 1, Ring: roundedRing(b-2*t, h-2*t, ri)}}}
	return s, nil
}

// CoreOf returns the void of a hollow section (a tube from CHS, RHS or a
// catalogue), the shape a concrete fill takes.
func CoreOf(s *Shape) (*Shape, error) {
	if s.Core == nil {
		return nil, fmt.Errorf("the section has no core; core() takes a hollow section made by chs, rhs or section(\"…\") of a tube")
	}
	return s.Core, nil
}
