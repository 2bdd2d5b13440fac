package plastic

import (
	"fmt"
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/composite"
)

// lawOf returns the law of a part: the law it was given, else linear elastic
// with its modulus (nil for a graded part, which stays elastic with its field).
func lawOf(p *composite.Part) (Law, error) {
	if p.Law == nil {
		if p.EField != nil {
			return nil, nil
		}
		return Elastic{E: p.E}, nil
	}
	if r, ok := p.Law.(*funcs.RecordValue); ok {
		if l, ok := r.Payload.(Law); ok {
			return l, nil
		}
	}
	return nil, fmt.Errorf("the law of the part is not a stress–strain law; build it with law_epp, law_parabola_rect, law_elastic or law_user")
}

// Section is a composite prepared for strain compatibility.
type Section struct {
	C    *composite.Composite
	Laws []Law // nil entry: graded elastic part, N_i = EA_i·ε
}

// NewSection resolves the laws of the parts of c.
func NewSection(c *composite.Composite) (*Section, error) {
	s := &Section{C: c}
	for i, p := range c.Parts {
		l, err := lawOf(p)
		if err != nil {
			return nil, fmt.Errorf("parts[%d]: %w", i, err)
		}
		s.Laws = append(s.Laws, l)
	}
	return s, nil
}

// Limits returns the range of total strain every part's law covers under
// the temperature change dT.
func (s *Section) Limits(dT float64) (lo, hi float64) {
	lo, hi = math.Inf(-1), math.Inf(1)
	for i, l := range s.Laws {
		if l == nil {
			continue
		}
		a, b := l.Limits()
		th := s.C.Parts[i].Alpha * dT
		lo, hi = math.Max(lo, a+th), math.Min(hi, b+th)
	}
	return lo, hi
}

// Force returns N(ε) = Σ σ_i(ε − α_i·ΔT)·A_i for the uniform total strain eps.
func (s *Section) Force(eps, dT float64) (float64, error) {
	n := 0.0
	for i, l := range s.Laws {
		p := s.C.Parts[i]
		em := eps - p.Alpha*dT
		if l == nil {
			n += p.EA * em
			continue
		}
		lo, hi := l.Limits()
		if em < lo || em > hi {
			return math.NaN(), &StrainRangeError{Part: i, Eps: em, Lo: lo, Hi: hi, Kind: l.Kind()}
		}
		sig := l.Stress(em)
		if math.IsNaN(sig) || math.IsInf(sig, 0) {
			return math.NaN(), fmt.Errorf("the %s law of parts[%d] has no finite stress at strain %.6g", l.Kind(), i, em)
		}
		n += sig * p.A
	}
	return n, nil
}

// StrainRangeError reports a strain outside the range of a part's law.
type StrainRangeError struct {
	Part        int // index into the parts list, from 0 as in a sheet
	Eps, Lo, Hi float64
	Kind        string
}

// Error says which side of the range the strain left and what that means
// for the section.
func (e *StrainRangeError) Error() string {
	if e.Eps < e.Lo {
		return fmt.Sprintf("strain %.6g in parts[%d] is beyond the crushing strain %.6g of its %s law; the section has failed there", e.Eps, e.Part, e.Lo, e.Kind)
	}
	return fmt.Sprintf("strain %.6g in parts[%d] is beyond the limit %.6g of its %s law", e.Eps, e.Part, e.Hi, e.Kind)
}

// maxStrain bounds the search for a strain: 100 % is far beyond any
// structural material.
const maxStrain = 1.0

// StrainFor returns the uniform total strain at which the section carries
// N, found by Brent's method on N(ε) − N over a bracket grown from zero
// towards the sign of N and bounded by the strain limits of the laws.
func (s *Section) StrainFor(n, dT float64) (float64, error) {
	if math.IsNaN(n) || math.IsInf(n, 0) {
		return 0, fmt.Errorf("the axial force must be finite, got %g kN", n/1e3)
	}
	lo, hi := s.Limits(dT)
	// The free thermal strain gives N = 0 for elastic parts; start there.
	start := 0.0
	if lo > 0 || hi < 0 || start < lo || start > hi {
		start = math.Max(lo, math.Min(hi, 0))
	}
	f := func(e float64) float64 {
		v, err := s.Force(e, dT)
		if err != nil {
			return math.NaN()
		}
		return v - n
	}
	f0 := f(start)
	if math.IsNaN(f0) {
		_, err := s.Force(start, dT)
		return 0, err
	}
	if f0 == 0 {
		return start, nil
	}
	dir := 1.0 // N(ε) is non-decreasing: go up when short of N
	limit := math.Min(hi, maxStrain)
	if f0 > 0 {
		dir = -1
		limit = math.Max(lo, -maxStrain)
	}
	a := start
	step := 1e-4
	for {
		b := start + dir*step
		if (dir > 0 && b >= limit) || (dir < 0 && b <= limit) {
			b = limit
		}
		fb := f(b)
		if math.IsNaN(fb) {
			_, err := s.Force(b, dT)
			return 0, err
		}
		if (fb > 0) != (f0 > 0) || fb == 0 {
			x, _, err := brent(f, a, b, 1e-15, 200)
			if err != nil {
				return 0, fmt.Errorf("strain_for_force: %w", err)
			}
			return x, nil
		}
		if b == limit {
			nMax := fb + n
			what := "tension"
			if dir < 0 {
				what = "compression"
			}
			hint := "the section has no more resistance"
			if math.IsInf(lo, -1) && math.IsInf(hi, 1) && limit == dir*maxStrain {
				hint = fmt.Sprintf("it would need a strain beyond %g", dir*maxStrain)
			}
			return 0, fmt.Errorf("N = %.6g kN is beyond what the section carries in %s (%.6g kN at strain %.6g; %s)", n/1e3, what, nMax/1e3, b, hint)
		}
		a, f0 = b, fb
		step *= 2
	}
}

// SquashLoad returns Σ A_i·f_i, the plastic resistance in compression with
// every part on its compressive plateau; coef multiplies the plateau of
// concrete laws. Source: EN 1994-1-1:2004 §6.7.3.2(1), Eq. (6.30):
// N_pl,Rd = A_a·f_yd + 0.85·A_c·f_cd + A_s·f_sd, with 1.0 in place of 0.85
// for concrete-filled tubes (§6.7.3.2(1), from memory).
func (s *Section) SquashLoad(coef float64) (float64, error) {
	if !(coef > 0) || coef > 1.5 {
		return 0, fmt.Errorf("the concrete coefficient must be between 0 and 1.5, got %g", coef)
	}
	n := 0.0
	for i := range s.Laws {
		f, err := s.plateau(i, coef)
		if err != nil {
			return 0, err
		}
		n += f * s.C.Parts[i].A
	}
	return n, nil
}

// plateau is the compressive plateau stress of part i at the concrete
// coefficient coef, or why it has none.
func (s *Section) plateau(i int, coef float64) (float64, error) {
	l := s.Laws[i]
	if l == nil {
		return 0, fmt.Errorf("parts[%d] is a graded elastic part without a plateau; the squash load needs a plastic law in every part", i)
	}
	f, ok := l.Squash(coef)
	if !ok {
		return 0, fmt.Errorf("parts[%d] has %s %s law without a compressive plateau; give it law_epp or law_parabola_rect, or use strain_for_force", i, article(l.Kind()), l.Kind())
	}
	return f, nil
}

// SquashTerms splits the squash load as fixed + coef·scaled: Σ A_i·f_i of
// the parts whose plateau the concrete coefficient leaves alone (f_y), and
// of those it multiplies (f_cd). Every law's plateau is linear in coef (f_y,
// or coef·f_cd), so Squash(0) is the fixed share and Squash(1) − Squash(0)
// the scaled one. It fails where SquashLoad fails for every coefficient.
func (s *Section) SquashTerms() (fixed, scaled float64, err error) {
	for i := range s.Laws {
		f0, err := s.plateau(i, 0)
		if err != nil {
			return 0, 0, err
		}
		f1, _ := s.plateau(i, 1)
		fixed += f0 * s.C.Parts[i].A
		scaled += (f1 - f0) * s.C.Parts[i].A
	}
	return fixed, scaled, nil
}

// MaxCurvePoints bounds the rows of an N–ε curve.
const MaxCurvePoints = 10000

// Curve samples N(ε) at n equally spaced strains from lo to hi.
func (s *Section) Curve(lo, hi float64, n int) (eps, force []float64, err error) {
	if n < 2 || n > MaxCurvePoints {
		return nil, nil, fmt.Errorf("the curve needs between 2 and %d points, got %d", MaxCurvePoints, n)
	}
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil, nil, fmt.Errorf("the strain range must run from a smaller to a larger finite strain, got %g to %g", lo, hi)
	}
	eps = make([]float64, n)
	force = make([]float64, n)
	for i := range n {
		e := lo + (hi-lo)*float64(i)/float64(n-1)
		v, err := s.Force(e, 0)
		if err != nil {
			return nil, nil, err
		}
		eps[i], force[i] = e, v
	}
	return eps, force, nil
}

// article is "an" before a vowel sound, else "a" ("an elastic law", "a
// parabola–rectangle law").
func article(word string) string {
	if word != "" && strings.ContainsRune("aeiouAEIOU", rune(word[0])) {
		return "an"
	}
	return "a"
}
