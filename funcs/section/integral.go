package section

import (
	"errors"
	"fmt"
	"math"
)

// Tolerance limits for Integrate.
const (
	MinTol     = 1e-14 // below this, rounding in double precision decides
	MaxTol     = 0.1
	DefaultTol = 1e-10
)

// maxEvals bounds the work of one integral, so a field with a jump or a
// singularity inside the shape ends with an error instead of running on.
const maxEvals = 4_000_000

// Field is a scalar field over the section plane; it returns NaN where it
// cannot be evaluated.
type Field func(y, z float64) float64

// Result is a section integral with its achieved error estimate (absolute,
// in the unit of the integral).
type Result struct {
	Value, Err float64
	Evals      int
}

// FieldError reports a point where the field had no finite value.
type FieldError struct{ Y, Z, V float64 }

// Error names the point and what the field must be.
func (e *FieldError) Error() string {
	return fmt.Sprintf("the field has no finite value at y = %.6g m, z = %.6g m (got %g); it must be defined and finite over the bounding box of the section", e.Y, e.Z, e.V)
}

// integrator carries the field and the bookkeeping of one integral.
type integrator struct {
	f     Field
	g     *rule // per-cell rule for polygon strips
	evals int
	bad   *FieldError
}

func (q *integrator) eval(y, z float64) float64 {
	q.evals++
	v := q.f(y, z)
	if (math.IsNaN(v) || math.IsInf(v, 0)) && q.bad == nil {
		q.bad = &FieldError{Y: y, Z: z, V: v}
	}
	return v
}

// Integrate returns ∫ f dA over s to the relative tolerance tol, with the
// achieved error estimate. The tolerance is relative to the magnitude of f
// over the quadrature cells (Σ|w·f·J|, about ∫|f| dA), so a field whose
// integral cancels to zero converges too.
//
// Polygons: by Green's theorem ∫∫ f dA = ∮ F dz with F(y, z) = ∫_{y0}^{y}
// f(s, z) ds, each edge contributes the integral over the strip between the
// line y = y0 (the middle of the bounding box) and the edge; the strip is
// mapped to the unit square and integrated with an 8×8 Gauss–Legendre
// product rule, split into four cells, worst first, until the rule and its
// refinement agree within the tolerance (A. Sommariva and
// M. Vianello, "Product Gauss cubature over polygons based on Green's
// integration formula", BIT Numer. Math. 47 (2007) 441–453, from memory).
// Polynomials of degree ≤ 14 are integrated exactly at the first level. The
// strips leave the shape where it is not convex, so f is evaluated over the
// bounding box of the shape.
//
// Annuli: polar coordinates, trapezoidal rule in angle (exact for
// trigonometric polynomials below the number of points, spectrally accurate
// for smooth periodic integrands; L. N. Trefethen and J. A. C. Weideman,
// SIAM Review 56 (2014) 385–458) and composite Gauss–Legendre in radius,
// both doubled until two levels agree.
func Integrate(s *Shape, f Field, tol float64) (Result, error) {
	if math.IsNaN(tol) || tol < MinTol || tol > MaxTol {
		return Result{}, fmt.Errorf("tolerance %g is out of range; give a relative tolerance between %g and %g", tol, MinTol, MaxTol)
	}
	q := &integrator{f: f, g: gaussRule(8)}
	// First pass: a coarse value and magnitude of every piece, to share the
	// tolerance among them in proportion to their size.
	type piece struct {
		reg          Region
		edge         int
		val, mag, y0 float64
	}
	var pieces []piece
	scale := 0.0
	for _, r := range s.Regions {
		if r.Ann != nil {
			v, m := q.annulusLevel(r.Ann, 0)
			pieces = append(pieces, piece{reg: r, val: v, mag: m})
			scale += m
			continue
		}
		if r.Sec != nil {
			v, m := q.sectorLevel(r.Sec, 0)
			pieces = append(pieces, piece{reg: r, val: v, mag: m})
			scale += m
			continue
		}
		y0, y1, _, _ := r.Ring.bbox()
		mid := (y0 + y1) / 2
		for e := range r.Ring.Y {
			v, m := q.strip(r.Ring, e, mid, 0, 1, 0, 1)
			pieces = append(pieces, piece{reg: r, edge: e, val: v, mag: m, y0: mid})
			scale += m
		}
	}
	if q.bad != nil {
		return Result{}, q.bad
	}
	res := Result{}
	if scale == 0 {
		res.Evals = q.evals
		return res, nil
	}
	absTol := tol * scale
	// Globally adaptive: every piece becomes a cell with a coarse value and a
	// refined one; the cell whose two values disagree most is split next,
	// until the sum of the disagreements is within the tolerance. Refining
	// the worst cell first also copes with a field that jumps inside the
	// section, where each level only halves the error.
	h := &cellHeap{}
	total, errSum := 0.0, 0.0
	push := func(c *cell) {
		total += c.sign * c.fine
		errSum += c.err
		if !c.final {
			h.push(c)
		}
	}
	for _, p := range pieces {
		if p.reg.Ann != nil {
			push(q.annulusCell(p.reg.Ann, p.reg.Sign, 0, p.val))
		} else if p.reg.Sec != nil {
			push(q.sectorCell(p.reg.Sec, p.reg.Sign, 0, p.val))
		} else {
			push(q.stripCell(p.reg.Ring, p.edge, p.y0, p.reg.Sign, 0, 1, 0, 1, p.val, p.mag, 0))
		}
	}
	for errSum > absTol && h.len() > 0 && q.evals < maxEvals && q.bad == nil {
		c := h.pop()
		total -= c.sign * c.fine
		errSum -= c.err
		for _, k := range q.split(c) {
			push(k)
		}
	}
	if q.bad != nil {
		return Result{}, q.bad
	}
	res.Value, res.Err, res.Evals = total, math.Max(errSum, 0), q.evals
	if res.Err > absTol {
		return res, fmt.Errorf("section integral reached an estimated error of %.3g (relative %.3g), not the requested %g; the field may jump or be singular inside the section, or ask for a looser tolerance", res.Err, res.Err/scale, tol)
	}
	return res, nil
}

// cell is a piece of the integral with a coarse and a refined value.
type cell struct {
	sign      float64
	ring      *Ring // strip cell of edge e, or nil for an annulus level
	edge      int
	y0        float64
	t0, t1    float64
	u0, u1    float64
	ann       *Annulus
	sec       *Sector
	level     int
	fine, err float64
	sub       [4]float64 // strip: values and magnitudes of the four children
	subMag    [4]float64
	final     bool // refining cannot help (rounding floor or depth limit)
}

const (
	maxDepth        = 20
	maxAnnulusLevel = 9
	roundFloor      = 64 * 0x1p-52
)

// stripCell evaluates the four children of a strip cell whose own value is
// coarse, and returns it with the refined value and its error estimate
// |refined − coarse| (conservative: the refined value is the more accurate).
func (q *integrator) stripCell(r *Ring, e int, y0, sign, t0, t1, u0, u1, coarse, mag float64, depth int) *cell {
	c := &cell{sign: sign, ring: r, edge: e, y0: y0, t0: t0, t1: t1, u0: u0, u1: u1, level: depth}
	tm, um := (t0+t1)/2, (u0+u1)/2
	c.sub[0], c.subMag[0] = q.strip(r, e, y0, t0, tm, u0, um)
	c.sub[1], c.subMag[1] = q.strip(r, e, y0, tm, t1, u0, um)
	c.sub[2], c.subMag[2] = q.strip(r, e, y0, t0, tm, um, u1)
	c.sub[3], c.subMag[3] = q.strip(r, e, y0, tm, t1, um, u1)
	c.fine = c.sub[0] + c.sub[1] + c.sub[2] + c.sub[3]
	c.err = math.Abs(c.fine - coarse)
	floor := roundFloor * (c.subMag[0] + c.subMag[1] + c.subMag[2] + c.subMag[3])
	c.final = c.err <= floor || depth >= maxDepth
	return c
}

func (q *integrator) annulusCell(a *Annulus, sign float64, k int, coarse float64) *cell {
	v, m := q.annulusLevel(a, k+1)
	c := &cell{sign: sign, ann: a, level: k + 1, fine: v, err: math.Abs(v - coarse)}
	c.final = c.err <= roundFloor*m || k+1 >= maxAnnulusLevel
	return c
}

// split refines a cell: a strip cell into its four children, an annulus into
// the next level.
func (q *integrator) split(c *cell) []*cell {
	if c.ann != nil {
		return []*cell{q.annulusCell(c.ann, c.sign, c.level, c.fine)}
	}
	if c.sec != nil {
		return []*cell{q.sectorCell(c.sec, c.sign, c.level, c.fine)}
	}
	tm, um := (c.t0+c.t1)/2, (c.u0+c.u1)/2
	boxes := [4][4]float64{{c.t0, tm, c.u0, um}, {tm, c.t1, c.u0, um}, {c.t0, tm, um, c.u1}, {tm, c.t1, um, c.u1}}
	out := make([]*cell, 4)
	for k, b := range boxes {
		out[k] = q.stripCell(c.ring, c.edge, c.y0, c.sign, b[0], b[1], b[2], b[3], c.sub[k], c.subMag[k], c.level+1)
	}
	return out
}

// cellHeap is a max-heap of cells by error estimate.
type cellHeap struct{ s []*cell }

func (h *cellHeap) len() int { return len(h.s) }

func (h *cellHeap) push(c *cell) {
	h.s = append(h.s, c)
	i := len(h.s) - 1
	for i > 0 {
		p := (i - 1) / 2
		if h.s[p].err >= h.s[i].err {
			break
		}
		h.s[p], h.s[i] = h.s[i], h.s[p]
		i = p
	}
}

func (h *cellHeap) pop() *cell {
	top := h.s[0]
	n := len(h.s) - 1
	h.s[0] = h.s[n]
	h.s = h.s[:n]
	i := 0
	for {
		l, r, m := 2*i+1, 2*i+2, i
		if l < n && h.s[l].err > h.s[m].err {
			m = l
		}
		if r < n && h.s[r].err > h.s[m].err {
			m = r
		}
		if m == i {
			return top
		}
		h.s[i], h.s[m] = h.s[m], h.s[i]
		i = m
	}
}

// strip integrates the Green strip of edge e over the cell [t0,t1]×[u0,u1] of
// the unit square: t runs along the edge, u from the line y = y0 to the edge.
// It returns the value and the magnitude Σ|w·f·J|.
func (q *integrator) strip(r *Ring, e int, y0, t0, t1, u0, u1 float64) (float64, float64) {
	n := len(r.Y)
	j := (e + 1) % n
	ya, za := r.Y[e], r.Z[e]
	dy, dz := r.Y[j]-ya, r.Z[j]-za
	if dz == 0 {
		return 0, 0 // horizontal edges add nothing to ∮ F dz
	}
	g := q.g
	ht, hu := t1-t0, u1-u0
	sum, mag := 0.0, 0.0
	for a, xt := range g.x {
		t := t0 + ht*xt
		ye := ya + t*dy
		z := za + t*dz
		span := ye - y0
		inner, innerMag := 0.0, 0.0
		for b, xu := range g.x {
			u := u0 + hu*xu
			v := q.eval(y0+u*span, z)
			inner += g.w[b] * v
			innerMag += g.w[b] * math.Abs(v)
		}
		jac := g.w[a] * span * dz
		sum += inner * jac
		mag += innerMag * math.Abs(jac)
	}
	area := ht * hu
	return sum * area, mag * area
}

// annulusLevel integrates over an annulus with 16·2^k points in angle and 2^k
// Gauss cells of 8 points in radius; it returns the value and magnitude.
func (q *integrator) annulusLevel(a *Annulus, k int) (float64, float64) {
	m := 16 << k
	cells := 1 << k
	g := q.g
	h := (a.Rout - a.Rin) / float64(cells)
	dth := 2 * math.Pi / float64(m)
	sum, mag := 0.0, 0.0
	for c := range cells {
		r0 := a.Rin + float64(c)*h
		for i, x := range g.x {
			r := r0 + h*x
			ring, ringMag := 0.0, 0.0
			for j := range m {
				s, co := math.Sincos(float64(j) * dth)
				v := q.eval(a.Yc+r*co, a.Zc+r*s)
				ring += v
				ringMag += math.Abs(v)
			}
			wr := g.w[i] * h * r * dth
			sum += ring * wr
			mag += ringMag * math.Abs(wr)
		}
	}
	return sum, mag
}

// ErrNoShape is returned when a section value carries no shape.
var ErrNoShape = errors.New("the value carries no section shape; build it with a section function such as rect or circle")
