package section

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// arcSides is the number of sides of the polygon that stands for a full
// circle in the overlap test (a sector gets its share). The polygon is
// inscribed, with vertices at fixed angles, so two shapes that share a
// circular boundary (a core in its tube, a fillet in its hole) get the same
// polygon and touch exactly; an overlap along a curved edge thinner than the
// sagitta (R·(1 − cos(π/arcSides)), about 1.9e-5·R) is not seen.
const arcSides = 512

// overlapTol is the intersection area, relative to the smaller of the two
// areas, below which two shapes count as touching (rounding of the exact
// polygon clipping stays many orders below it).
const overlapTol = 1e-9

// piece is a polygon with the sign of its region.
type piece struct {
	sign           float64
	ring           *Ring
	y0, y1, z0, z1 float64
}

// pieces returns the regions of s as signed polygons: rings as they are,
// annuli and sectors as inscribed polygons.
func (s *Shape) pieces() []piece {
	var out []piece
	add := func(sign float64, r *Ring) {
		p := piece{sign: sign, ring: r}
		p.y0, p.y1, p.z0, p.z1 = r.bbox()
		out = append(out, p)
	}
	for _, r := range s.Regions {
		switch {
		case r.Ring != nil:
			add(r.Sign, r.Ring)
		case r.Sec != nil:
			sc := r.Sec
			n := max(2, int(math.Ceil(sc.Phi/(2*math.Pi)*arcSides)))
			ring := &Ring{Y: []float64{sc.Yc}, Z: []float64{sc.Zc}}
			for k := range n + 1 {
				sn, cs := math.Sincos(sc.Th0 + sc.Phi*float64(k)/float64(n))
				ring.Y = append(ring.Y, sc.Yc+sc.R*cs)
				ring.Z = append(ring.Z, sc.Zc+sc.R*sn)
			}
			add(r.Sign, ring)
		default:
			a := r.Ann
			add(r.Sign, circleRing(a.Yc, a.Zc, a.Rout))
			if a.Rin > 0 {
				add(-r.Sign, circleRing(a.Yc, a.Zc, a.Rin))
			}
		}
	}
	return out
}

func circleRing(yc, zc, r float64) *Ring {
	ring := &Ring{Y: make([]float64, arcSides), Z: make([]float64, arcSides)}
	for k := range arcSides {
		sn, cs := math.Sincos(2 * math.Pi * float64(k) / arcSides)
		ring.Y[k], ring.Z[k] = yc+r*cs, zc+r*sn
	}
	return ring
}

// IntersectionArea returns the area common to the material of a and b: the
// sum over their regions of sign_a·sign_b·area(region_a ∩ region_b), each
// region intersection computed exactly for polygons by clipping boundary
// against boundary (circles and arcs through their inscribed polygons, see
// arcSides). A and b touching along an edge gives zero.
func IntersectionArea(a, b *Shape) float64 {
	pa, pb := a.pieces(), b.pieces()
	y0, _, z0, _ := a.BBox()
	sum := 0.0
	for _, p := range pa {
		for _, q := range pb {
			if p.y1 <= q.y0 || q.y1 <= p.y0 || p.z1 <= q.z0 || q.z1 <= p.z0 {
				continue // the boxes are apart or only touch: no common area
			}
			sum += p.sign * q.sign * clipArea(p.ring, q.ring, y0, z0)
		}
	}
	return sum
}

// polyArea is the area of the material of s as the overlap test sees it
// (inscribed polygons for curves).
func (s *Shape) polyArea() float64 {
	a := 0.0
	for _, p := range s.pieces() {
		a += p.sign * p.ring.signedArea()
	}
	return a
}

// clipArea is the area of the intersection of two counter-clockwise simple
// polygons. By Green's theorem it is ½∮(y dz − z dy) over the boundary of
// P ∩ Q, which is made of the parts of P's edges inside Q and of Q's edges
// inside P; a stretch where both boundaries run together counts once when
// they run the same way (the material lies on the same side) and not at all
// when they run opposite ways (the shapes only touch there). Each edge is
// split where the other boundary meets it and each piece is classified at
// its midpoint. Coordinates are taken from (y0, z0).
func clipArea(p, q *Ring, y0, z0 float64) float64 {
	ey0, ey1, ez0, ez1 := p.bbox()
	fy0, fy1, fz0, fz1 := q.bbox()
	scale := math.Max(math.Max(ey1, fy1)-math.Min(ey0, fy0), math.Max(ez1, fz1)-math.Min(ez0, fz0))
	eps := 1e-12 * scale
	return (boundaryInside(p, q, true, y0, z0, eps) + boundaryInside(q, p, false, y0, z0, eps)) / 2
}

// boundaryInside sums y dz − z dy over the parts of p's edges that lie in q
// (and, when shared is true, over the parts on q's boundary that run the
// same way).
func boundaryInside(p, q *Ring, shared bool, y0, z0, eps float64) float64 {
	n, m := len(p.Y), len(q.Y)
	// Bounding boxes of q's edges, widened by eps, let most pairs of edges
	// be skipped with four comparisons.
	boxes := make([][4]float64, m)
	for k := range m {
		l := (k + 1) % m
		boxes[k] = [4]float64{math.Min(q.Y[k], q.Y[l]) - eps, math.Max(q.Y[k], q.Y[l]) + eps, math.Min(q.Z[k], q.Z[l]) - eps, math.Max(q.Z[k], q.Z[l]) + eps}
	}
	sum := 0.0
	ts := make([]float64, 0, 8)
	near := make([]int, 0, 8) // q's edges whose boxes meet this edge's box
	for i := range n {
		j := (i + 1) % n
		ay, az := p.Y[i]-y0, p.Z[i]-z0
		ry, rz := p.Y[j]-p.Y[i], p.Z[j]-p.Z[i]
		rr := ry*ry + rz*rz
		if rr == 0 {
			continue
		}
		ey0, ey1 := math.Min(p.Y[i], p.Y[j]), math.Max(p.Y[i], p.Y[j])
		ez0, ez1 := math.Min(p.Z[i], p.Z[j]), math.Max(p.Z[i], p.Z[j])
		ts = append(ts[:0], 0, 1)
		near = near[:0]
		for k := range m {
			bx := &boxes[k]
			if bx[1] < ey0 || bx[0] > ey1 || bx[3] < ez0 || bx[2] > ez1 {
				continue
			}
			near = append(near, k)
			l := (k + 1) % m
			cy, cz := q.Y[k]-y0, q.Z[k]-z0
			sy, sz := q.Y[l]-q.Y[k], q.Z[l]-q.Z[k]
			den := ry*sz - rz*sy
			wy, wz := cy-ay, cz-az
			if math.Abs(den) > 1e-14*math.Sqrt(rr*(sy*sy+sz*sz)) {
				t := (wy*sz - wz*sy) / den
				u := (wy*rz - wz*ry) / den
				if t > 0 && t < 1 && u >= -1e-12 && u <= 1+1e-12 {
					ts = append(ts, t)
				}
				continue
			}
			// parallel: where q's edge lies on p's line, its ends split p's edge
			if math.Abs(wy*rz-wz*ry) <= eps*math.Sqrt(rr) {
				for _, t := range [2]float64{(wy*ry + wz*rz) / rr, ((wy+sy)*ry + (wz+sz)*rz) / rr} {
					if t > 0 && t < 1 {
						ts = append(ts, t)
					}
				}
			}
		}
		slices.Sort(ts)
		for k := 1; k < len(ts); k++ {
			t0, t1 := ts[k-1], ts[k]
			if t1-t0 <= 1e-15 {
				continue
			}
			tm := (t0 + t1) / 2
			my, mz := ay+tm*ry+y0, az+tm*rz+z0
			on, same := onBoundary(q, near, my, mz, ry, rz, eps)
			if on {
				if !(shared && same) {
					continue
				}
			} else if !q.contains(my, mz) {
				continue
			}
			py, pz := ay+t0*ry, az+t0*rz
			qy, qz := ay+t1*ry, az+t1*rz
			sum += py*qz - qy*pz
		}
	}
	return sum
}

// onBoundary reports whether (y, z), a point of an edge of the other ring,
// lies within eps of one of the edges near of r (those whose boxes meet that
// edge: no other can be that close), and whether that edge runs the same way
// as the direction (dy, dz).
func onBoundary(r *Ring, near []int, y, z, dy, dz, eps float64) (on, same bool) {
	n := len(r.Y)
	for _, k := range near {
		l := (k + 1) % n
		sy, sz := r.Y[l]-r.Y[k], r.Z[l]-r.Z[k]
		ss := sy*sy + sz*sz
		if ss == 0 {
			continue
		}
		wy, wz := y-r.Y[k], z-r.Z[k]
		t := math.Max(0, math.Min(1, (wy*sy+wz*sz)/ss))
		ey, ez := wy-t*sy, wz-t*sz
		if ey*ey+ez*ez <= eps*eps {
			return true, sy*dy+sz*dz > 0
		}
	}
	return false, false
}

// Cut returns outer with hole removed. The hole must lie inside the material
// of outer: the area it shares with outer must be its whole area (so it may
// not stick out, nor overlap an earlier hole); it may touch outer's boundary.
func Cut(outer, hole *Shape) (*Shape, error) {
	ah := hole.polyArea()
	common := IntersectionArea(hole, outer)
	if outside := ah - common; outside > overlapTol*ah {
		return nil, fmt.Errorf("%.6g mm² of the hole's %.6g mm² lie outside the material; a hole must lie inside the section and not overlap another hole", outside*1e6, ah*1e6)
	}
	out := &Shape{Regions: append([]Region(nil), outer.Regions...), Draw: combineDraw(outer, hole, -1)}
	for _, r := range hole.Regions {
		r.Sign = -r.Sign
		out.Regions = append(out.Regions, r)
	}
	return out, nil
}

// CutAll removes every hole in turn.
func CutAll(outer *Shape, holes []*Shape) (*Shape, error) {
	s := outer
	for i, h := range holes {
		var err error
		if s, err = Cut(s, h); err != nil {
			return nil, fmt.Errorf("hole %d: %w", i+1, err)
		}
	}
	return s, nil
}

// Overlap returns an error when a and b share material (an intersection
// area above overlapTol of the smaller area); touching along an edge or at
// a point is allowed.
func Overlap(a, b *Shape) error {
	common := IntersectionArea(a, b)
	small := math.Min(a.polyArea(), b.polyArea())
	if common > overlapTol*small {
		return fmt.Errorf("the shapes share %.6g mm² of material; parts must touch at most along an edge", common*1e6)
	}
	return nil
}

// Join returns the union of two shapes that do not overlap (built-up
// sections: a plate welded on a flange).
func Join(a, b *Shape) (*Shape, error) {
	if err := Overlap(a, b); err != nil {
		return nil, err
	}
	return &Shape{Regions: append(append([]Region(nil), a.Regions...), b.Regions...), Draw: combineDraw(a, b, 1)}, nil
}

// JoinAll joins shapes of which no two overlap.
func JoinAll(shapes []*Shape) (*Shape, error) {
	if len(shapes) == 0 {
		return nil, errors.New("join needs at least one section")
	}
	out := &Shape{}
	drawn := false
	for i, s := range shapes {
		for j := range i {
			if err := Overlap(shapes[j], s); err != nil {
				return nil, fmt.Errorf("sections %d and %d overlap: %w", j+1, i+1, err)
			}
		}
		out.Regions = append(out.Regions, s.Regions...)
		drawn = drawn || s.Draw != nil
	}
	if drawn {
		for _, s := range shapes {
			out.Draw = append(out.Draw, s.drawRegions()...)
		}
	}
	return out, nil
}

// BarsOnCircle is n solid round bars of diameter d with their centres
// equally spaced on a circle of diameter D about the origin, the first on
// the positive y axis (reinforcement of a round column, a ring of bolts).
// Neighbouring bars may touch but not overlap.
func BarsOnCircle(n int, d, D float64) (*Shape, error) {
	if n < 1 || n > 1000 {
		return nil, fmt.Errorf("the number of bars must be a whole number from 1 to 1000, got %d", n)
	}
	if err := positive("bar diameter d", d); err != nil {
		return nil, err
	}
	if !(D >= 0) || math.IsInf(D, 0) {
		return nil, fmt.Errorf("the circle diameter D must be a length ≥ 0, got %g m", D)
	}
	if n > 1 && D*math.Sin(math.Pi/float64(n)) < d*(1-1e-12) {
		return nil, fmt.Errorf("%d bars of %g mm do not fit on a circle of %g mm: neighbours %g mm apart (centre to centre) overlap", n, d*1e3, D*1e3, D*math.Sin(math.Pi/float64(n))*1e3)
	}
	s := &Shape{}
	for k := range n {
		sn, cs := math.Sincos(2 * math.Pi * float64(k) / float64(n))
		if k == 0 {
			sn, cs = 0, 1
		}
		s.Regions = append(s.Regions, Region{Sign: 1, Ann: &Annulus{Yc: D / 2 * cs, Zc: D / 2 * sn, Rout: d / 2}})
	}
	return s, nil
}
