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

// Region is one signed piece of a shape: exactly one of Ring, Ann and Sec is
// set. Sign is +1 for material and −1 for a hole cut out of earlier regions.
type Region struct {
	Sign float64
	Ring *Ring
	Ann  *Annulus
	Sec  *Sector
}

// Shape is a cross-section as a signed sum of regions. Its density (the sum
// of the signs of the regions containing a point) is 0 or 1 everywhere: the
// constructors and Cut keep it so.
type Shape struct {
	Regions []Region
	// Core is the void of a hollow section (the inside of a tube), kept by
	// the tube constructors so that a fill can be made with CoreOf; nil
	// for other shapes.
	Core *Shape
	// Draw, when set, is what a drawing shows instead of Regions: the same
	// material with its arcs as polylines and no construction edges (a
	// rolled profile's fillets are squares less quarter circles in Regions,
	// which would draw as boxes). Properties never read it.
	Draw []Region
}

// MaxCoordinate bounds a vertex's distance from the origin, in metres: far
// beyond any cross-section, and far below where the fourth powers of the
// second moments overflow float64 (coordinates near 1e155 gave a NaN area).
const MaxCoordinate = 1e6

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
		if math.Abs(y) > MaxCoordinate || math.Abs(z) > MaxCoordinate {
			return nil, fmt.Errorf("vertex %d of the polygon lies %s from the origin; a section's coordinates stay within %s of it", i+1, funcs.Length(max(math.Abs(y), math.Abs(z))), funcs.Length(MaxCoordinate))
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
		if (r.Ring != nil && r.Ring.contains(y, z)) || (r.Ann != nil && r.Ann.contains(y, z)) || (r.Sec != nil && r.Sec.contains(y, z)) {
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
	moveAll := func(regs []Region) []Region {
		out := make([]Region, len(regs))
		for k, r := range regs {
			nr := Region{Sign: r.Sign}
			if r.Ring != nil {
				ring := &Ring{Y: make([]float64, len(r.Ring.Y)), Z: make([]float64, len(r.Ring.Z))}
				for i := range r.Ring.Y {
					ring.Y[i], ring.Z[i] = move(r.Ring.Y[i], r.Ring.Z[i])
				}
				nr.Ring = ring
			} else if r.Sec != nil {
				c := *r.Sec
				c.Yc, c.Zc = move(c.Yc, c.Zc)
				c.Th0 += rot
				nr.Sec = &c
			} else {
				a := *r.Ann
				a.Yc, a.Zc = move(a.Yc, a.Zc)
				nr.Ann = &a
			}
			out[k] = nr
		}
		return out
	}
	out := &Shape{Regions: moveAll(s.Regions)}
	if s.Draw != nil {
		out.Draw = moveAll(s.Draw)
	}
	if s.Core != nil {
		out.Core = s.Core.Transform(dy, dz, rot)
	}
	return out
}

// drawRegions is what a drawing of s shows.
func (s *Shape) drawRegions() []Region {
	if s.Draw != nil {
		return s.Draw
	}
	return s.Regions
}

// combineDraw is the drawing of the regions of a followed by those of b
// with their signs multiplied by sign, or nil when neither has a drawing of
// its own.
func combineDraw(a, b *Shape, sign float64) []Region {
	if a.Draw == nil && b.Draw == nil {
		return nil
	}
	out := append([]Region(nil), a.drawRegions()...)
	for _, r := range b.drawRegions() {
		r.Sign *= sign
		out = append(out, r)
	}
	return out
}

// appendArc appends the points of the arc of radius r about (yc, zc) from
// angle t0 to t1 (either way), both ends included, n segments.
func appendArc(ys, zs []float64, yc, zc, r, t0, t1 float64, n int) ([]float64, []float64) {
	for k := range n + 1 {
		sn, cs := math.Sincos(t0 + (t1-t0)*float64(k)/float64(n))
		ys, zs = append(ys, yc+r*cs), append(zs, zc+r*sn)
	}
	return ys, zs
}
