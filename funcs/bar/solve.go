package bar

import (
	"fmt"
	"math"
	"slices"

	"github.com/sheafcalc/sheaf/funcs"
)

// piece is a stretch of one segment between joints and point loads, where
// N₀ (the axial force with the start reaction taken as zero) is smooth.
type piece struct {
	a, c   float64
	seg    int
	na, nc float64 // N₀ at a+ and at c−
	f, g   float64 // ∫₀ᵃ dx/(EA) and ∫₀ᵃ (N₀/(EA) + αΔT) dx
	df, dg float64 // the same integrals over the piece
}

// newSolver checks the bar and prepares the positions of the segments.
func newSolver(b *Bar) (*solver, error) {
	if len(b.Segments) == 0 {
		return nil, fmt.Errorf("the bar has no segments; hint: give a segment table with at least one row")
	}
	v := &solver{segs: b.Segments, x0: make([]float64, len(b.Segments)),
		b0: b.B0, b1: b.B1, gamma: b.Gamma, fns: b.LoadFns, patches: b.Patches}
	for i := range b.Segments {
		s := &b.Segments[i]
		v.x0[i] = v.lt
		if err := checkSegment(i, s); err != nil {
			return nil, err
		}
		v.lt += s.L
	}
	if !finite(v.lt) {
		return nil, fmt.Errorf("the bar length %g m is not finite", v.lt)
	}
	for _, q := range []struct {
		name string
		v    float64
		unit string
	}{{"distributed load at the start", b.B0, "N/m"}, {"distributed load at the end", b.B1, "N/m"}, {"weight density", b.Gamma, "N/m³"}} {
		if !finite(q.v) {
			return nil, fmt.Errorf("the %s is %g %s; it must be a finite number", q.name, q.v, q.unit)
		}
	}
	for _, f := range b.LoadFns {
		if f.F == nil {
			return nil, fmt.Errorf("the distributed load function %s has no body", f.Name)
		}
	}
	tol := 1e-12 * v.lt
	for k, p := range b.Patches {
		if !finite(p.X0) || !finite(p.X1) || !finite(p.B0) || !finite(p.B1) {
			return nil, fmt.Errorf("line load %d over part of the bar: x0 = %g m, x1 = %g m, b0 = %g N/m, b1 = %g N/m must be finite numbers", k+1, p.X0, p.X1, p.B0, p.B1)
		}
		if p.X0 < -tol || p.X1 > v.lt+tol || !(p.X1 > p.X0) {
			return nil, fmt.Errorf("line load %d covers x = %g … %g m; it must lie on the bar (0 … %g m) with x0 < x1", k+1, p.X0, p.X1, v.lt)
		}
	}
	for k, x := range b.Breaks {
		if !finite(x) || x < -tol || x > v.lt+tol {
			return nil, fmt.Errorf("step position %d at x = %g m lies outside the bar (0 … %g m)", k+1, x, v.lt)
		}
	}
	v.hasDist = b.B0 != 0 || b.B1 != 0 || b.Gamma != 0 || len(b.LoadFns) > 0 || len(b.Patches) > 0
	// Gauss–Legendre never evaluates the ends of a segment, so an area or
	// modulus function that reaches zero there would only show as a
	// quadrature that does not converge. Probing the ends names the function
	// and the position instead.
	for i := range v.segs {
		if s := &v.segs[i]; s.AreaFn != nil || s.EFn != nil {
			for _, x := range []float64{v.x0[i], v.x0[i] + s.L} {
				v.area(i, x)
				v.modulus(i, x)
			}
		}
		if v.fail != nil {
			return nil, v.fail
		}
	}
	return v, nil
}

// checkSegment validates one segment; i is 0-based, messages count rows from 1.
func checkSegment(i int, s *Segment) error {
	row := i + 1
	pos := func(name string, val float64, unit string) error {
		if !finite(val) || val <= 0 {
			return fmt.Errorf("segment %d: %s = %g %s must be a positive number", row, name, val, unit)
		}
		return nil
	}
	if err := pos("L", s.L, "m"); err != nil {
		return err
	}
	switch s.Shape {
	case Constant:
		if err := pos("A", s.A1, "m²"); err != nil {
			return err
		}
	case TaperArea:
		if err := pos("A1", s.A1, "m²"); err != nil {
			return err
		}
		if err := pos("A2", s.A2, "m²"); err != nil {
			return err
		}
	case TaperDiameter:
		if err := pos("d1", s.D1, "m"); err != nil {
			return err
		}
		if err := pos("d2", s.D2, "m"); err != nil {
			return err
		}
	case AreaFunc:
		if s.AreaFn == nil || s.AreaFn.F == nil {
			return fmt.Errorf("segment %d: the area function is missing", row)
		}
	default:
		return fmt.Errorf("segment %d: unknown area shape %d", row, s.Shape)
	}
	if s.EFn == nil {
		if err := pos("E", s.E, "Pa"); err != nil {
			return err
		}
	} else if s.EFn.F == nil {
		return fmt.Errorf("segment %d: the modulus function is missing", row)
	}
	if !finite(s.Alpha) || !finite(s.DT) {
		return fmt.Errorf("segment %d: alpha = %g 1/K and dT = %g K must be finite numbers", row, s.Alpha, s.DT)
	}
	return nil
}

// build splits the bar into pieces and integrates N₀, ∫dx/(EA) and
// ∫(N₀/(EA) + αΔT)dx piece by piece. It returns the pieces, the load at the
// end of the bar, and the sum of |loads| (a scale for equilibrium tests).
func (v *solver) build(points []PointLoad) (ps []piece, pEnd, scale, f, g float64, err error) {
	tol := 1e-12 * v.lt
	pts := slices.Clone(points)
	for k, p := range pts {
		if !finite(p.X) || !finite(p.P) {
			return nil, 0, 0, 0, 0, fmt.Errorf("point load %d: x = %s, P = %s must be finite numbers", k+1, funcs.Length(p.X), funcs.Quantity(p.P, funcs.Force))
		}
		if p.X < -tol || p.X > v.lt+tol {
			return nil, 0, 0, 0, 0, fmt.Errorf("point load %d at x = %s lies outside the bar (0 … %s); hint: positions are measured from the start of the bar", k+1, funcs.Length(p.X), funcs.Length(v.lt))
		}
		pts[k].X = min(max(p.X, 0), v.lt)
		scale += math.Abs(p.P)
	}
	slices.SortStableFunc(pts, func(p, q PointLoad) int {
		switch {
		case p.X < q.X:
			return -1
		case p.X > q.X:
			return 1
		}
		return 0
	})
	ps = make([]piece, 0, len(v.segs)+len(pts))
	n0 := 0.0
	k := 0
	for k < len(pts) && pts[k].X <= tol {
		n0 -= pts[k].P
		k++
	}
	last := len(v.segs) - 1
	for i := range v.segs {
		a, end := v.x0[i], v.x0[i]+v.segs[i].L
		if i == last {
			end = v.lt
		}
		for {
			c := end
			if k < len(pts) && pts[k].X < end-tol {
				c = pts[k].X
			}
			p := piece{a: a, c: c, seg: i, na: n0, f: f, g: g}
			li, err := v.loadInt(i, a, c)
			if err != nil {
				return nil, 0, 0, 0, 0, err
			}
			scale += math.Abs(li)
			p.nc = n0 - li
			fl, err := v.flex(i, a, c)
			if err != nil {
				return nil, 0, 0, 0, 0, err
			}
			gl, err := v.gpart(i, a, n0, c)
			if err != nil {
				return nil, 0, 0, 0, 0, err
			}
			p.df, p.dg = fl, gl
			f, g, n0 = f+fl, g+gl, p.nc
			ps = append(ps, p)
			if c == end {
				if i == last {
					for ; k < len(pts); k++ {
						pEnd += pts[k].P
					}
				} else {
					for k < len(pts) && pts[k].X <= end+tol {
						n0 -= pts[k].P
						k++
					}
				}
				break
			}
			for k < len(pts) && pts[k].X <= c+tol {
				n0 -= pts[k].P
				k++
			}
			a = c
		}
	}
	return ps, pEnd, scale, f, g, nil
}

// withBreaks returns the point loads of b with a load of zero at every step
// position and at both ends of every patch, so that build ends a piece
// there: the loads are smooth within each piece, and quadrature never spans
// a jump.
func withBreaks(b *Bar) []PointLoad {
	if len(b.Breaks) == 0 && len(b.Patches) == 0 {
		return b.Points
	}
	pts := slices.Clone(b.Points)
	for _, x := range b.Breaks {
		pts = append(pts, PointLoad{X: x})
	}
	for _, p := range b.Patches {
		pts = append(pts, PointLoad{X: p.X0}, PointLoad{X: p.X1})
	}
	return pts
}

// Result is a solved bar. Forces in N, lengths and displacements in m,
// stresses in Pa; see the package comment for the signs.
type Result struct {
	RStart, REnd   float64 // support reactions on the bar (positive in +x)
	UStart, UEnd   float64 // displacements of the ends
	Elongation     float64 // UEnd − UStart
	NMax, XNMax    float64 // max |N| and where (first occurrence)
	SigmaMax       float64 // max |σ|
	XSigmaMax      float64
	UMax, XUMax    float64 // max |u| and where
	GapClosedStart bool
	GapClosedEnd   bool
	Length         float64

	v      *solver
	layout funcs.BarLayout // what a drawing shows of the bar (see Layout)
	pieces []piece
	r0, u0 float64
	pEnd   float64
}

// Solve solves the bar held by the given supports at its start (x = 0) and
// end (x = L). A bar free at both ends is accepted only when its loads are
// in equilibrium; its start is then taken as not moving (u(0) = 0).
func Solve(b *Bar, start, end Support) (*Result, error) {
	if err := checkSupport("start", start); err != nil {
		return nil, err
	}
	if err := checkSupport("end", end); err != nil {
		return nil, err
	}
	v, err := newSolver(b)
	if err != nil {
		return nil, err
	}
	ps, pEnd, scale, fTot, gTot, err := v.build(withBreaks(b))
	if err != nil {
		return nil, err
	}
	nTot := ps[len(ps)-1].nc - pEnd // R_L when R₀ = 0
	res := &Result{v: v, pieces: ps, pEnd: pEnd, Length: v.lt, layout: layoutOf(b, start, end)}
	if err := res.solveEnds(start, end, fTot, gTot, nTot, scale); err != nil {
		return nil, err
	}
	res.UEnd = res.u0 - res.r0*fTot + gTot
	res.Elongation = res.UEnd - res.UStart
	if err := res.extremes(); err != nil {
		return nil, err
	}
	return res, nil
}

func checkSupport(which string, s Support) error {
	switch s.Kind {
	case Free, Fixed:
		return nil
	case Spring:
		if !finite(s.K) || s.K <= 0 {
			return fmt.Errorf("the spring at the %s has stiffness %g N/m; it must be a positive number", which, s.K)
		}
		return nil
	case Gap:
		if !finite(s.Gap) || s.Gap < 0 {
			return fmt.Errorf("the gap at the %s is %s; it must be zero or positive (the clearance to the stop)", which, funcs.Length(s.Gap))
		}
		if !finite(s.K) || s.K < 0 {
			return fmt.Errorf("the stop behind the gap at the %s has stiffness %g N/m; give a positive number, or 0 for a rigid stop", which, s.K)
		}
		return nil
	}
	return fmt.Errorf("unknown support kind %d at the %s", s.Kind, which)
}

// row is one end condition a·u + b·R = c.
type row struct{ a, b, c float64 }

// condition returns the end condition for a support; sign is −1 at the start
// (a stop lies in −x) and +1 at the end.
func condition(s Support, closed bool, sign float64) row {
	switch {
	case s.Kind == Fixed:
		return row{1, 0, 0}
	case s.Kind == Spring:
		return row{s.K, 1, 0}
	case s.Kind == Gap && closed && s.K == 0:
		return row{1, 0, sign * s.Gap}
	case s.Kind == Gap && closed:
		return row{s.K, 1, sign * s.K * s.Gap}
	}
	return row{0, 1, 0}
}

// solveEnds finds u(0) and R₀ from the two end conditions, trying the open
// and closed states of each gap and keeping the consistent one: an open gap
// must not be overrun, a closed stop must push (never pull) on the bar.
func (r *Result) solveEnds(start, end Support, fTot, gTot, nTot, scale float64) error {
	type state struct{ s, e bool }
	states := []state{{false, false}}
	if start.Kind == Gap {
		states = append(states, state{true, false})
	}
	if end.Kind == Gap {
		for _, st := range slices.Clone(states) {
			states = append(states, state{st.s, true})
		}
	}
	ftol := 1e-9 * scale
	utol := 1e-9 * (math.Abs(gTot) + math.Abs(fTot*scale) + start.Gap + end.Gap)
	singular := false
	for _, st := range states {
		c0 := condition(start, st.s, -1)
		cl := condition(end, st.e, +1)
		// u_L = u0 − R0·F + G and R_L = −R0 + nTot substituted in the end row.
		m21, m22 := cl.a, -cl.a*fTot-cl.b
		rhs2 := cl.c - cl.a*gTot - cl.b*nTot
		var u0, r0 float64
		det := c0.a*m22 - c0.b*m21
		if sc := math.Abs(c0.a*m22) + math.Abs(c0.b*m21); sc == 0 || math.Abs(det) <= 1e-12*sc {
			if c0.a != 0 || m21 != 0 || math.Abs(nTot) > math.Max(ftol, 1e-300) {
				singular = true
				continue
			}
			// Free at both ends under loads in equilibrium: take u(0) = 0.
			u0, r0 = 0, 0
		} else {
			u0 = (c0.c*m22 - c0.b*rhs2) / det
			r0 = (c0.a*rhs2 - c0.c*m21) / det
		}
		rl := -r0 + nTot
		ul := u0 - r0*fTot + gTot
		ok := true
		if start.Kind == Gap {
			if st.s {
				ok = ok && r0 >= -ftol
			} else {
				ok = ok && u0 >= -start.Gap-utol
			}
		}
		if end.Kind == Gap {
			if st.e {
				ok = ok && rl <= ftol
			} else {
				ok = ok && ul <= end.Gap+utol
			}
		}
		if !ok {
			continue
		}
		r.u0, r.r0 = u0, r0
		r.UStart, r.RStart, r.REnd = u0, r0, rl
		r.GapClosedStart, r.GapClosedEnd = st.s, st.e
		return nil
	}
	if singular {
		return fmt.Errorf("the bar is not held along its axis (start %s, end %s) and its loads do not balance (net %s); hint: fix one end, or give an end a spring or a stop", start, end, funcs.Quantity(-nTot, funcs.Force))
	}
	return fmt.Errorf("no consistent state of the gaps was found (start %s, end %s); hint: check the clearances and stop stiffnesses", start, end)
}
