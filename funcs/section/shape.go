package section

import (
	"errors"
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

// MaxVertices bounds the vertices of one polygon ring: the self-intersection
// check is quadratic, and no drawn section needs more.
const MaxVertices = 2000

// Ring is a simple polygon, counter-clockwise, not closed (the last vertex
// joins the first).
type Ring struct {
	Y, Z []float64
}

// Annulus is a circular ring (a disc when Rin is zero) centred at (Yc, Zc).
type Annulus struct {
	Yc, Zc, Rin, Rout float64
}

// Region is one signed piece of a shape: exactly one of Ring and Ann is set.
// Sign is +1 for material and −1 for a hole cut out of earlier regions.
type Region struct {
	Sign float64
	Ring *Ring
	Ann  *Annulus
}

// Shape is a cross-section as a signed sum of regions. Its density (the sum
// of the signs of the regions containing a point) is 0 or 1 everywhere: the
// constructors and Cut keep it so.
type Shape struct {
	Regions []Region
}

// NewRing checks and normalises a polygon: at least three distinct vertices,
// finite coordinates, no self-intersection, non-zero area. A closing vertex
// equal to the first and repeated consecutive vertices are dropped; a
// clockwise ring is reversed.
func NewRing(ys, zs []float64) (*Ring, error) {
	if len(ys) != len(zs) {
		return nil, fmt.Errorf("polygon has %d y coordinates but %d z coordinates; give one y and one z per vertex", len(ys), len(zs))
	}
	if len(ys) > MaxVertices+1 {
		return nil, fmt.Errorf("polygon has %d vertices; at most %d are allowed", len(ys), MaxVertices)
	}
	r := &Ring{}
	for i := range ys {
		y, z := ys[i], zs[i]
		if math.IsNaN(y) || math.IsInf(y, 0) || math.IsNaN(z) || math.IsInf(z, 0) {
			return nil, fmt.Errorf("vertex %d of the polygon is not a finite point (y = %g, z = %g)", i+1, y, z)
		}
		n := len(r.Y)
		if n > 0 && r.Y[n-1] == y && r.Z[n-1] == z {
			continue
		}
		r.Y = append(r.Y, y)
		r.Z = append(r.Z, z)
	}
	for n := len(r.Y); n > 1 && r.Y[n-1] == r.Y[0] && r.Z[n-1] == r.Z[0]; n = len(r.Y) {
		r.Y, r.Z = r.Y[:n-1], r.Z[:n-1]
	}
	if len(r.Y) < 3 {
		return nil, errors.New("polygon needs at least 3 distinct vertices")
	}
	a := r.signedArea()
	ext := r.extent()
	if !(math.Abs(a) > 1e-10*ext*ext) {
		return nil, errors.New("polygon has no area (its vertices lie on one line, or it is a sliver thinner than 1e-10 of its length)")
	}
	if i, j, ok := r.selfIntersection(); ok {
		return nil, fmt.Errorf("polygon edges %d and %d cross; give the vertices in order around the boundary", i+1, j+1)
	}
	if a < 0 {
		r.reverse()
	}
	return r, nil
}

// signedArea is positive for a counter-clockwise ring. Coordinates are
// taken from the first vertex, so that a small polygon far from the origin
// keeps its digits.
func (r *Ring) signedArea() float64 {
	n := len(r.Y)
	y0, z0 := r.Y[0], r.Z[0]
	s := 0.0
	for i := range n {
		j := (i + 1) % n
		s += (r.Y[i]-y0)*(r.Z[j]-z0) - (r.Y[j]-y0)*(r.Z[i]-z0)
	}
	return s / 2
}

// extent is the larger side of the bounding box.
func (r *Ring) extent() float64 {
	y0, y1, z0, z1 := r.bbox()
	return math.Max(y1-y0, z1-z0)
}

func (r *Ring) bbox() (y0, y1, z0, z1 float64) {
	y0, y1, z0, z1 = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for i := range r.Y {
		y0, y1 = math.Min(y0, r.Y[i]), math.Max(y1, r.Y[i])
		z0, z1 = math.Min(z0, r.Z[i]), math.Max(z1, r.Z[i])
	}
	return
}

func (r *Ring) reverse() {
	for i, j := 0, len(r.Y)-1; i < j; i, j = i+1, j-1 {
		r.Y[i], r.Y[j] = r.Y[j], r.Y[i]
		r.Z[i], r.Z[j] = r.Z[j], r.Z[i]
	}
}

// selfIntersection finds two non-adjacent edges that touch or cross.
func (r *Ring) selfIntersection() (int, int, bool) {
	n := len(r.Y)
	for i := range n {
		ai, bi := i, (i+1)%n
		for j := i + 1; j < n; j++ {
			aj, bj := j, (j+1)%n
			if bi == aj || bj == ai {
				continue // adjacent edges share a vertex
			}
			if segmentsTouch(r.Y[ai], r.Z[ai], r.Y[bi], r.Z[bi], r.Y[aj], r.Z[aj], r.Y[bj], r.Z[bj]) {
				return i, j, true
			}
		}
	}
	return 0, 0, false
}

func orient(ay, az, by, bz, cy, cz float64) float64 {
	return (by-ay)*(cz-az) - (bz-az)*(cy-ay)
}

func onSegment(ay, az, by, bz, py, pz float64) bool {
	return math.Min(ay, by) <= py && py <= math.Max(ay, by) && math.Min(az, bz) <= pz && pz <= math.Max(az, bz)
}

func segmentsTouch(ay, az, by, bz, cy, cz, dy, dz float64) bool {
	d1 := orient(cy, cz, dy, dz, ay, az)
	d2 := orient(cy, cz, dy, dz, by, bz)
	d3 := orient(ay, az, by, bz, cy, cz)
	d4 := orient(ay, az, by, bz, dy, dz)
	if ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0)) {
		return true
	}
	return (d1 == 0 && onSegment(cy, cz, dy, dz, ay, az)) ||
		(d2 == 0 && onSegment(cy, cz, dy, dz, by, bz)) ||
		(d3 == 0 && onSegment(ay, az, by, bz, cy, cz)) ||
		(d4 == 0 && onSegment(ay, az, by, bz, dy, dz))
}

// contains reports whether (y, z) is strictly inside the ring (ray casting;
// points on the boundary may go either way).
func (r *Ring) contains(y, z float64) bool {
	in := false
	n := len(r.Y)
	for i, j := 0, n-1; i < n; j, i = i, i+1 {
		if (r.Z[i] > z) != (r.Z[j] > z) {
			yc := r.Y[j] + (z-r.Z[j])*(r.Y[i]-r.Y[j])/(r.Z[i]-r.Z[j])
			if y < yc {
				in = !in
			}
		}
	}
	return in
}

func (a *Annulus) contains(y, z float64) bool {
	d := math.Hypot(y-a.Yc, z-a.Zc)
	return d >= a.Rin && d <= a.Rout
}

// Density returns the sum of the signs of the regions containing (y, z):
// 1 inside the material, 0 outside or in a hole.
func (s *Shape) Density(y, z float64) float64 {
	d := 0.0
	for _, r := range s.Regions {
		if (r.Ring != nil && r.Ring.contains(y, z)) || (r.Ann != nil && r.Ann.contains(y, z)) {
			d += r.Sign
		}
	}
	return d
}

// Transform returns the shape rotated by rot radians counter-clockwise (from
// y towards z) about the origin, then moved by (dy, dz).
func (s *Shape) Transform(dy, dz, rot float64) *Shape {
	sin, cos := math.Sincos(rot)
	if rot == 0 {
		sin, cos = 0, 1
	}
	move := func(y, z float64) (float64, float64) {
		return cos*y - sin*z + dy, sin*y + cos*z + dz
	}
	out := &Shape{Regions: make([]Region, len(s.Regions))}
	for k, r := range s.Regions {
		nr := Region{Sign: r.Sign}
		if r.Ring != nil {
			ring := &Ring{Y: make([]float64, len(r.Ring.Y)), Z: make([]float64, len(r.Ring.Z))}
			for i := range r.Ring.Y {
				ring.Y[i], ring.Z[i] = move(r.Ring.Y[i], r.Ring.Z[i])
			}
			nr.Ring = ring
		} else {
			a := *r.Ann
			a.Yc, a.Zc = move(a.Yc, a.Zc)
			nr.Ann = &a
		}
		out.Regions[k] = nr
	}
	return out
}

// boundarySamples lists points just inside the boundary of the region (moved
// a hair towards its centre), used to test that a hole lies in the material.
func (r Region) boundarySamples() [][2]float64 {
	var pts [][2]float64
	if r.Ring != nil {
		m := momentsRing(r.Ring, 0, 0)
		cy, cz := m.Sy/m.A, m.Sz/m.A
		n := len(r.Ring.Y)
		for i := range n {
			j := (i + 1) % n
			for _, t := range [...]float64{0, 0.5} {
				y := r.Ring.Y[i] + t*(r.Ring.Y[j]-r.Ring.Y[i])
				z := r.Ring.Z[i] + t*(r.Ring.Z[j]-r.Ring.Z[i])
				pts = append(pts, [2]float64{y + 1e-9*(cy-y), z + 1e-9*(cz-z)})
			}
		}
		return pts
	}
	a := r.Ann
	for k := range 64 {
		s, c := math.Sincos(2 * math.Pi * float64(k) / 64)
		ro := a.Rout * (1 - 1e-9)
		pts = append(pts, [2]float64{a.Yc + ro*c, a.Zc + ro*s})
		if a.Rin > 0 {
			ri := a.Rin * (1 + 1e-9)
			pts = append(pts, [2]float64{a.Yc + ri*c, a.Zc + ri*s})
		}
	}
	return pts
}

// Cut returns outer with hole removed. Every region of hole must lie inside
// the material of outer (holes may not overlap each other or stick out).
func Cut(outer, hole *Shape) (*Shape, error) {
	for _, r := range hole.Regions {
		if r.Sign < 0 {
			continue
		}
		for _, p := range r.boundarySamples() {
			if outer.Density(p[0], p[1]) < 0.5 {
				return nil, fmt.Errorf("the hole reaches outside the material at y = %.6g m, z = %.6g m; a hole must lie inside the section and not overlap another hole", p[0], p[1])
			}
		}
	}
	out := &Shape{Regions: append([]Region(nil), outer.Regions...)}
	for _, r := range hole.Regions {
		r.Sign = -r.Sign
		out.Regions = append(out.Regions, r)
	}
	return out, nil
}

// Join returns the union of two shapes that do not overlap (built-up
// sections: a plate welded on a flange).
func Join(a, b *Shape) (*Shape, error) {
	for _, r := range b.Regions {
		if r.Sign < 0 {
			continue
		}
		for _, p := range r.boundarySamples() {
			if a.Density(p[0], p[1]) > 0.5 {
				return nil, fmt.Errorf("the shapes overlap at y = %s, z = %s; joined parts must touch at most along an edge", funcs.Length(p[0]), funcs.Length(p[1]))
			}
		}
	}
	for _, r := range a.Regions {
		if r.Sign < 0 {
			continue
		}
		for _, p := range r.boundarySamples() {
			if b.Density(p[0], p[1]) > 0.5 {
				return nil, fmt.Errorf("the shapes overlap at y = %s, z = %s; joined parts must touch at most along an edge", funcs.Length(p[0]), funcs.Length(p[1]))
			}
		}
	}
	return &Shape{Regions: append(append([]Region(nil), a.Regions...), b.Regions...)}, nil
}
