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

// Integrate returns ∫ f dA over s to the relative tolerance tol (relative to
// ∫|f| dA, so fields whose integral cancels to zero also converge), with the
// achieved error estimate.
//
// Polygons: by Green's theorem ∫∫ f dA = ∮ F dz with F(y, z) = ∫_{y0}^{y}
// f(s, z) ds, each edge contributes the integral over the strip between the
// line y = y0 (the middle of the bounding box) and the edge; the strip is
// mapped to the unit square and integrated with an 8×8 Gauss–Legendre
// product rule, split into four cells where the rule and its refinement
// disagree by more than the cell's share of the tolerance (A. Sommariva and
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
	for _, p := range pieces {
		share := absTol * p.mag / scale
		var v, e float64
		var err error
		if p.reg.Ann != nil {
			v, e, err = q.annulus(p.reg.Ann, p.val, share)
		} else {
			v, e, err = q.adapt(p.reg.Ring, p.edge, p.y0, 0, 1, 0, 1, p.val, p.mag, share, 0)
		}
		if q.bad != nil {
			return Result{}, q.bad
		}
		if err != nil {
			return Result{}, err
		}
		res.Value += p.reg.Sign * v
		res.Err += e
	}
	res.Evals = q.evals
	if res.Err > absTol {
		return res, fmt.Errorf("section integral reached an estimated error of %.3g (relative %.3g), not the requested %g; the field may jump or be singular inside the section, or ask for a looser tolerance", res.Err, res.Err/scale, tol)
	}
	return res, nil
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

const maxDepth = 14

// adapt refines a strip cell into four until the children agree with the
// parent within tol; the error estimate is the sum of |children − parent|
// over the accepted cells (conservative: the children are more accurate).
func (q *integrator) adapt(r *Ring, e int, y0, t0, t1, u0, u1, whole, mag, tol float64, depth int) (float64, float64, error) {
	tm, um := (t0+t1)/2, (u0+u1)/2
	var v [4]float64
	var m [4]float64
	v[0], m[0] = q.strip(r, e, y0, t0, tm, u0, um)
	v[1], m[1] = q.strip(r, e, y0, tm, t1, u0, um)
	v[2], m[2] = q.strip(r, e, y0, t0, tm, um, u1)
	v[3], m[3] = q.strip(r, e, y0, tm, t1, um, u1)
	sum := v[0] + v[1] + v[2] + v[3]
	diff := math.Abs(sum - whole)
	// Rounding in the sums sets a floor below which refining cannot help.
	floor := 64 * 0x1p-52 * (m[0] + m[1] + m[2] + m[3])
	if diff <= tol || diff <= floor || q.bad != nil {
		return sum, diff, nil
	}
	if depth >= maxDepth || q.evals > maxEvals {
		return sum, diff, nil // Integrate reports the shortfall
	}
	total, errSum := 0.0, 0.0
	cells := [4][4]float64{{t0, tm, u0, um}, {tm, t1, u0, um}, {t0, tm, um, u1}, {tm, t1, um, u1}}
	for k, c := range cells {
		cv, ce, err := q.adapt(r, e, y0, c[0], c[1], c[2], c[3], v[k], m[k], tol/4, depth+1)
		if err != nil {
			return 0, 0, err
		}
		total += cv
		errSum += ce
	}
	return total, errSum, nil
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

const maxAnnulusLevel = 8

func (q *integrator) annulus(a *Annulus, prev, tol float64) (float64, float64, error) {
	for k := 1; ; k++ {
		v, m := q.annulusLevel(a, k)
		diff := math.Abs(v - prev)
		if diff <= tol || diff <= 64*0x1p-52*m || q.bad != nil || k == maxAnnulusLevel {
			return v, diff, nil
		}
		prev = v
	}
}

// ErrNoShape is returned when a section value carries no shape.
var ErrNoShape = errors.New("the value carries no section shape; build it with a section function such as rect or circle")
