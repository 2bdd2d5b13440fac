package plastic

import (
	"fmt"
	"math"
)

// Law is a uniaxial stress–strain relation σ(ε), non-decreasing in ε.
type Law interface {
	// Stress returns σ for the mechanical strain eps; NaN when the law
	// cannot be evaluated there.
	Stress(eps float64) float64
	// Limits is the range of strain the law covers (±Inf when unlimited).
	Limits() (lo, hi float64)
	// Squash is the magnitude of the compressive plateau stress, with coef
	// applied to concrete laws; ok is false for a law without a plateau.
	Squash(coef float64) (float64, bool)
	// Kind names the law for messages and the record.
	Kind() string
	// E0 is the initial tangent modulus.
	E0() float64
}

// Elastic is σ = E·ε.
type Elastic struct{ E float64 }

// Stress is E·ε.
func (l Elastic) Stress(eps float64) float64 { return l.E * eps }

// Limits: an elastic law covers every strain.
func (l Elastic) Limits() (float64, float64) { return math.Inf(-1), math.Inf(1) }

// Squash: an elastic law has no plateau.
func (l Elastic) Squash(float64) (float64, bool) { return 0, false }

// Kind is "elastic".
func (l Elastic) Kind() string { return "elastic" }

// E0 is E.
func (l Elastic) E0() float64 { return l.E }

// EPP is elastic–perfectly plastic and symmetric: σ = E·ε clipped to ±f_y.
// Source: EN 1993-1-5:2006 Annex C.6, Fig. C.2 (a), elastic–plastic model
// without strain hardening (from memory); common practice.
type EPP struct{ E, Fy float64 }

// Stress is E·ε clipped to ±f_y.
func (l EPP) Stress(eps float64) float64 { return math.Max(-l.Fy, math.Min(l.Fy, l.E*eps)) }

// Limits: without strain hardening or rupture the law covers every strain.
func (l EPP) Limits() (float64, float64) { return math.Inf(-1), math.Inf(1) }

// Squash is the plateau f_y (coef applies to concrete only).
func (l EPP) Squash(float64) (float64, bool) { return l.Fy, true }

// Kind is "elastic-perfectly plastic".
func (l EPP) Kind() string { return "elastic-perfectly plastic" }

// E0 is E.
func (l EPP) E0() float64 { return l.E }

// ParabolaRect is the parabola–rectangle law for concrete in compression,
// with compression negative:
//
//	σ = −f_cd·[1 − (1 − |ε|/ε_c2)^n]   for −ε_c2 ≤ ε ≤ 0
//	σ = −f_cd                          for −ε_cu2 ≤ ε < −ε_c2
//	σ = 0                              for ε > 0 (no tensile strength)
//
// Strains beyond −ε_cu2 (crushing) are outside the law. Source:
// EN 1992-1-1:2004 §3.1.7(1), Eq. (3.17) and (3.18), Fig. 3.3.
type ParabolaRect struct{ Fcd, EpsC2, EpsCu2, N float64 }

// Stress is the law above; NaN beyond the crushing strain −ε_cu2.
func (l ParabolaRect) Stress(eps float64) float64 {
	switch {
	case eps >= 0:
		return 0
	case eps >= -l.EpsC2:
		return -l.Fcd * (1 - math.Pow(1+eps/l.EpsC2, l.N))
	case eps >= -l.EpsCu2:
		return -l.Fcd
	}
	return math.NaN()
}

// Limits runs from the crushing strain −ε_cu2 up; tension carries no
// stress but is not outside the law.
func (l ParabolaRect) Limits() (float64, float64) { return -l.EpsCu2, math.Inf(1) }

// Squash is coef·f_cd, the plateau with the coefficient the section
// applies to concrete.
func (l ParabolaRect) Squash(coef float64) (float64, bool) { return coef * l.Fcd, true }

// Kind is "parabola-rectangle".
func (l ParabolaRect) Kind() string { return "parabola-rectangle" }

// E0 is the slope at ε = 0, n·f_cd/ε_c2 (derivative of Eq. (3.17)).
func (l ParabolaRect) E0() float64 { return l.N * l.Fcd / l.EpsC2 }

// User is a law σ(ε) written in the sheet. It must be non-decreasing for
// strain_for_force to find a unique strain.
type User struct {
	F      func(eps float64) float64
	Lo, Hi float64
	Name   string
}

// Stress calls the sheet's function.
func (l User) Stress(eps float64) float64 { return l.F(eps) }

// Limits is the range the sheet gave.
func (l User) Limits() (float64, float64) { return l.Lo, l.Hi }

// Squash: a user law declares no plateau.
func (l User) Squash(float64) (float64, bool) { return 0, false }

// Kind names the sheet's function.
func (l User) Kind() string { return "user law " + l.Name }

// E0 is the slope at ε = 0 by a central difference with a step of 1e-7
// (a strain far below yield for any structural material).
func (l User) E0() float64 {
	h := 1e-7
	return (l.F(h) - l.F(-h)) / (2 * h)
}

func finitePos(name string, v float64) error {
	if !(v > 0) || math.IsInf(v, 0) {
		return fmt.Errorf("%s must be positive and finite, got %g", name, v)
	}
	return nil
}

// NewEPP checks the parameters of an elastic–perfectly plastic law.
func NewEPP(e, fy float64) (EPP, error) {
	if err := finitePos("the modulus E (Pa)", e); err != nil {
		return EPP{}, err
	}
	if err := finitePos("the yield strength f_y (Pa)", fy); err != nil {
		return EPP{}, err
	}
	return EPP{E: e, Fy: fy}, nil
}

// NewParabolaRect checks the parameters of the concrete law: f_cd > 0,
// 0 < ε_c2 ≤ ε_cu2 < 0.1, 0 < n ≤ 10 (EN 1992-1-1 Table 3.1 gives n from 1.4
// to 2 and strains of a few per mille; check the unit when they look large).
func NewParabolaRect(fcd, epsC2, epsCu2, n float64) (ParabolaRect, error) {
	if err := finitePos("the design strength f_cd (Pa)", fcd); err != nil {
		return ParabolaRect{}, err
	}
	if err := finitePos("the strain ε_c2 at peak stress (a positive magnitude, e.g. 2 ‰)", epsC2); err != nil {
		return ParabolaRect{}, err
	}
	if !(epsCu2 >= epsC2) || epsCu2 >= 0.1 {
		return ParabolaRect{}, fmt.Errorf("the crushing strain ε_cu2 = %g must be at least ε_c2 = %g and below 0.1 (give magnitudes, e.g. 3.5 ‰)", epsCu2, epsC2)
	}
	if !(n > 0) || n > 10 {
		return ParabolaRect{}, fmt.Errorf("the exponent n = %g must be between 0 and 10 (EN 1992-1-1 Table 3.1 gives 1.4 to 2)", n)
	}
	return ParabolaRect{Fcd: fcd, EpsC2: epsC2, EpsCu2: epsCu2, N: n}, nil
}
