package bar

import (
	"fmt"
	"math"
	"sort"

	"github.com/sheafcalc/sheaf/funcs"
)

// find returns the piece that holds x, taking the piece to the right at a
// joint or point load (so N(x) is N(x+)), and the last piece at the end.
func (r *Result) find(x float64) int {
	ps := r.pieces
	i := sort.Search(len(ps), func(i int) bool { return ps[i].c > x })
	if i == len(ps) {
		i--
	}
	return i
}

func (r *Result) nIn(i int, x float64) (float64, error) {
	p := &r.pieces[i]
	li, err := r.v.loadInt(p.seg, p.a, x)
	return -r.r0 + p.na - li, err
}

func (r *Result) sigmaIn(i int, x float64) (float64, error) {
	n, err := r.nIn(i, x)
	if err != nil {
		return 0, err
	}
	a := r.v.area(r.pieces[i].seg, x)
	if r.v.fail != nil {
		return 0, r.v.fail
	}
	return n / a, nil
}

func (r *Result) uIn(i int, x float64) (float64, error) {
	p := &r.pieces[i]
	if x == p.a {
		return r.u0 - r.r0*p.f + p.g, nil
	}
	if x == p.c {
		return r.u0 - r.r0*(p.f+p.df) + p.g + p.dg, nil
	}
	fl, err := r.v.flex(p.seg, p.a, x)
	if err != nil {
		return 0, err
	}
	gl, err := r.v.gpart(p.seg, p.a, p.na, x)
	if err != nil {
		return 0, err
	}
	return r.u0 - r.r0*(p.f+fl) + p.g + gl, nil
}

// at checks x and returns its piece.
func (r *Result) at(x float64) (int, float64, error) {
	tol := 1e-12 * r.Length
	if !finite(x) || x < -tol || x > r.Length+tol {
		return 0, 0, fmt.Errorf("x = %s lies outside the bar (0 … %s); hint: positions are measured from the start of the bar", funcs.Length(x), funcs.Length(r.Length))
	}
	x = min(max(x, 0), r.Length)
	return r.find(x), x, nil
}

// N returns the axial force at x [m] (tension positive). At a point load or
// joint it returns the value just after x; at the end of the bar the value
// just before it.
func (r *Result) N(x float64) (float64, error) {
	i, x, err := r.at(x)
	if err != nil {
		return 0, err
	}
	return r.nIn(i, x)
}

// Sigma returns the axial stress N/A at x [m], with the same side rule as N.
func (r *Result) Sigma(x float64) (float64, error) {
	i, x, err := r.at(x)
	if err != nil {
		return 0, err
	}
	return r.sigmaIn(i, x)
}

// U returns the displacement at x [m] (continuous along the bar).
func (r *Result) U(x float64) (float64, error) {
	i, x, err := r.at(x)
	if err != nil {
		return 0, err
	}
	return r.uIn(i, x)
}

// extreme keeps the largest |value| seen and its first position.
type extreme struct{ v, x float64 }

func (e *extreme) see(x, v float64) {
	if math.Abs(v) > e.v*(1+1e-12) {
		e.v, e.x = math.Abs(v), x
	}
}

// refineIn samples |f| inside (a, c) and polishes the largest sample by
// golden-section search on its bracket; used where the quantity is not
// monotone between the ends of a piece (distributed loads, varying area).
func refineIn(e *extreme, f func(float64) (float64, error), a, c float64) error {
	const m = 16
	best, bk := -1.0, 1
	for k := 1; k < m; k++ {
		x := a + (c-a)*float64(k)/m
		y, err := f(x)
		if err != nil {
			return err
		}
		e.see(x, y)
		if math.Abs(y) > best {
			best, bk = math.Abs(y), k
		}
	}
	lo, hi := a+(c-a)*float64(bk-1)/m, a+(c-a)*float64(bk+1)/m
	const gr = 0.6180339887498949
	x1, x2 := hi-gr*(hi-lo), lo+gr*(hi-lo)
	y1, err := f(x1)
	if err != nil {
		return err
	}
	y2, err := f(x2)
	if err != nil {
		return err
	}
	for it := 0; it < 80 && hi-lo > 1e-10*(c-a); it++ {
		if math.Abs(y1) >= math.Abs(y2) {
			hi, x2, y2 = x2, x1, y1
			x1 = hi - gr*(hi-lo)
			if y1, err = f(x1); err != nil {
				return err
			}
		} else {
			lo, x1, y1 = x1, x2, y2
			x2 = lo + gr*(hi-lo)
			if y2, err = f(x2); err != nil {
				return err
			}
		}
	}
	e.see(x1, y1)
	e.see(x2, y2)
	return nil
}

// extremes fills NMax, SigmaMax and UMax with their positions.
func (r *Result) extremes() error {
	var en, es, eu extreme
	en.v, es.v, eu.v = -1, -1, -1
	v := r.v
	for i := range r.pieces {
		p := &r.pieces[i]
		s := &v.segs[p.seg]
		nA, nC := -r.r0+p.na, -r.r0+p.nc
		en.see(p.a, nA)
		en.see(p.c, nC)
		aA, aC := v.area(p.seg, p.a), v.area(p.seg, p.c)
		if v.fail != nil {
			return v.fail
		}
		es.see(p.a, nA/aA)
		es.see(p.c, nC/aC)
		uA, _ := r.uIn(i, p.a)
		uC, _ := r.uIn(i, p.c)
		eu.see(p.a, uA)
		eu.see(p.c, uC)
		if v.hasDist {
			if err := refineIn(&en, func(x float64) (float64, error) { return r.nIn(i, x) }, p.a, p.c); err != nil {
				return err
			}
		}
		if v.hasDist || !s.uniformA() {
			if err := refineIn(&es, func(x float64) (float64, error) { return r.sigmaIn(i, x) }, p.a, p.c); err != nil {
				return err
			}
		}
		if v.hasDist || !s.uniformEA() {
			if err := refineIn(&eu, func(x float64) (float64, error) { return r.uIn(i, x) }, p.a, p.c); err != nil {
				return err
			}
		}
	}
	r.NMax, r.XNMax = en.v, en.x
	r.SigmaMax, r.XSigmaMax = es.v, es.x
	r.UMax, r.XUMax = eu.v, eu.x
	return nil
}

// Samples are the values along the bar for plots.
type Samples struct {
	X, N, Sigma, U []float64
}

// SampleCount is the number of evenly spaced stations in Samples, besides
// the two sides of every joint and point load.
const SampleCount = 101

// Samples returns N, σ and u at SampleCount evenly spaced stations and on
// both sides of every joint and point load, in order of x, so that a plot
// shows each jump as a vertical step.
func (r *Result) Samples() (*Samples, error) {
	n := SampleCount + 2*len(r.pieces)
	s := &Samples{X: make([]float64, 0, n), N: make([]float64, 0, n),
		Sigma: make([]float64, 0, n), U: make([]float64, 0, n)}
	h := r.Length / (SampleCount - 1)
	tol := 1e-9 * h
	add := func(i int, x float64) error {
		nv, err := r.nIn(i, x)
		if err != nil {
			return err
		}
		sv, err := r.sigmaIn(i, x)
		if err != nil {
			return err
		}
		uv, err := r.uIn(i, x)
		if err != nil {
			return err
		}
		s.X, s.N, s.Sigma, s.U = append(s.X, x), append(s.N, nv), append(s.Sigma, sv), append(s.U, uv)
		return nil
	}
	for i := range r.pieces {
		p := &r.pieces[i]
		if err := add(i, p.a); err != nil {
			return nil, err
		}
		for k := int(math.Floor(p.a/h)) + 1; float64(k)*h < p.c-tol; k++ {
			if x := float64(k) * h; x > p.a+tol {
				if err := add(i, x); err != nil {
					return nil, err
				}
			}
		}
		if err := add(i, p.c); err != nil {
			return nil, err
		}
	}
	return s, nil
}
