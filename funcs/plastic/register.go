package plastic

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/composite"
)

const family = "plastic"

// LawType is the record type "law"; the Go law is its Payload.
var LawType = funcs.RecordOf("law",
	funcs.Field{Name: "kind", Type: funcs.StringType, Doc: "which law"},
	funcs.Field{Name: "E0", Type: funcs.Num(composite.Stress), Doc: "initial tangent modulus, Pa"},
)

// CurveType is the table type "n_eps_curve" (the workbook exporter charts
// every table of this name).
var CurveType = &funcs.Type{Kind: funcs.Table, Name: "n_eps_curve", Fields: []funcs.Field{
	{Name: "eps", Type: funcs.Num(units.None), Doc: "uniform strain, tension positive"},
	{Name: "N", Type: funcs.Num(composite.Force), Doc: "axial force, tension positive, N"},
}}

func lawRecord(l Law) *funcs.RecordValue {
	return &funcs.RecordValue{Type: LawType, Fields: []funcs.Value{l.Kind(), l.E0()}, Payload: l}
}

func num(v funcs.Value) float64 { f, _ := v.(float64); return f }

func optNum(a []funcs.Value, i int, def float64) float64 {
	if i < len(a) && a[i] != nil {
		return num(a[i])
	}
	return def
}

func sectionOf(v funcs.Value) (*Section, error) {
	c, err := composite.Of(v)
	if err != nil {
		return nil, err
	}
	return NewSection(c)
}

var (
	stress = funcs.Num(composite.Stress)
	strain = funcs.Num(units.None)
	force  = funcs.Num(composite.Force)
	kelvin = funcs.Num(units.Base(units.Temperature))
)

const srcCompat = "strain compatibility with plane sections: EN 1994-1-1:2004 §6.7.2(1) and EN 1992-1-1:2004 §6.1(2) (from memory); R. P. Brent, Algorithms for Minimization without Derivatives (1973), Ch. 4"

func init() {
	funcs.Register(&funcs.Def{
		Name: "law_elastic", Family: family,
		Params: []funcs.Param{{Name: "E", Type: stress, Doc: "modulus, Pa; > 0"}},
		Result: LawType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			e := num(a[0])
			if err := finitePos("the modulus E (Pa)", e); err != nil {
				return nil, err
			}
			return lawRecord(Elastic{E: e}), nil
		},
		Summary: "linear elastic law σ = E·ε (no limit)",
		Doc:     "Linear elastic in tension and compression without limit; the default for a part given no law.",
		Formula: "σ = E·ε",
		Source:  "Hooke's law; Gere & Goodno, Mechanics of Materials, §1.5",
	})
	funcs.Register(&funcs.Def{
		Name: "law_epp", Family: family,
		Params: []funcs.Param{
			{Name: "E", Type: stress, Doc: "modulus, Pa; > 0"},
			{Name: "f_y", Type: stress, Doc: "yield (design) strength, Pa; > 0, the same in tension and compression"},
		},
		Result: LawType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			l, err := NewEPP(num(a[0]), num(a[1]))
			if err != nil {
				return nil, err
			}
			return lawRecord(l), nil
		},
		Summary: "elastic–perfectly plastic law, symmetric: σ = E·ε clipped to ±f_y",
		Doc: "Elastic up to the yield strain f_y/E, then a plateau at ±f_y without hardening or strain limit. " +
			"Give the design strength f_yd = f_y/γ_M from the local code when the result is a resistance.",
		Formula: "σ = max(−f_y, min(f_y, E·ε))",
		Source:  "EN 1993-1-5:2006 Annex C.6 Fig. C.2 (a), elastic–plastic without hardening (from memory); common practice",
	})
	funcs.Register(&funcs.Def{
		Name: "law_parabola_rect", Family: family,
		Params: []funcs.Param{
			{Name: "f_cd", Type: stress, Doc: "design compressive strength, Pa; > 0 (include α_cc as the local code sets it)"},
			{Name: "eps_c2", Type: strain, Doc: "strain at the peak stress, a positive magnitude (EN 1992-1-1 Table 3.1: 2.0 ‰ up to C50)"},
			{Name: "eps_cu2", Type: strain, Doc: "crushing strain, a positive magnitude ≥ eps_c2 (3.5 ‰ up to C50)"},
			{Name: "n", Type: strain, Doc: "exponent of the parabola, 0 < n ≤ 10 (2.0 up to C50)"},
		},
		Result: LawType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			l, err := NewParabolaRect(num(a[0]), num(a[1]), num(a[2]), num(a[3]))
			if err != nil {
				return nil, err
			}
			return lawRecord(l), nil
		},
		Summary: "parabola–rectangle law for concrete (compression negative, no tension)",
		Doc: "Concrete in compression, compression negative: a parabola of degree n from zero to −f_cd at −eps_c2, " +
			"then a plateau to the crushing strain −eps_cu2. No tensile strength (σ = 0 for ε > 0). Strains beyond " +
			"−eps_cu2 are outside the law: section_force reports them as crushing. Give the strains as positive " +
			"magnitudes, e.g. 2 ‰ and 3.5 ‰, with values from the local code.",
		Formula: "σ = −f_cd·(1 − (1 − |ε|/ε_c2)^n) for |ε| ≤ ε_c2; σ = −f_cd for ε_c2 < |ε| ≤ ε_cu2",
		Source:  "EN 1992-1-1:2004 §3.1.7(1), Eq. (3.17), (3.18), Fig. 3.3 and Table 3.1",
	})
	funcs.Register(&funcs.Def{
		Name: "law_user", Family: family,
		Params: []funcs.Param{
			{Name: "sigma", Type: funcs.FuncOf(stress, strain), Doc: "σ(ε) in Pa as a sheet function of the strain; non-decreasing"},
			{Name: "eps_min", Type: strain, Optional: true, Doc: "smallest strain the law covers (default unlimited)"},
			{Name: "eps_max", Type: strain, Optional: true, Doc: "largest strain the law covers (default unlimited)"},
		},
		Result: LawType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			fv, ok := a[0].(*funcs.FuncValue)
			if !ok || fv == nil || fv.Call == nil {
				return nil, fmt.Errorf("expected a function σ(ε) written in the sheet, got %T", a[0])
			}
			l := User{F: func(e float64) float64 { return fv.Call(e) }, Name: fv.Name,
				Lo: optNum(a, 1, math.Inf(-1)), Hi: optNum(a, 2, math.Inf(1))}
			if !(l.Lo < l.Hi) {
				return nil, fmt.Errorf("eps_min = %g must be below eps_max = %g", l.Lo, l.Hi)
			}
			if l.Lo > 0 || l.Hi < 0 {
				return nil, fmt.Errorf("the strain range %g to %g must include zero", l.Lo, l.Hi)
			}
			return lawRecord(l), nil
		},
		Summary: "a stress–strain law σ(ε) written in the sheet",
		Doc: "Any uniaxial law written as a sheet function of the strain (tension positive). It must be " +
			"non-decreasing, so that strain_for_force finds one strain; it has no plateau, so squash_load " +
			"refuses it. A function that fails for a strain is an error at that strain.",
		Formula: "σ = sigma(ε)",
		Source:  "common practice",
	})
	funcs.Register(&funcs.Def{
		Name: "section_force", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: composite.Param, Doc: "the composite"},
			{Name: "eps", Type: strain, Doc: "uniform total strain, tension positive"},
			{Name: "dT", Type: kelvin, Optional: true, Doc: "temperature change, K; the mechanical strain of part i is ε − α_i·ΔT"},
		},
		Result: force,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := sectionOf(a[0])
			if err != nil {
				return nil, err
			}
			return s.Force(num(a[1]), optNum(a, 2, 0))
		},
		Summary: "axial force N(ε) of a composite under a uniform strain",
		Doc: "Sums the stress of each part's law at its mechanical strain over its area. Parts without a law are " +
			"linear elastic; graded parts carry EA_i·ε. A strain beyond a law's range (concrete crushing) is an error.",
		Formula: "N(ε) = Σ σ_i(ε − α_i·ΔT)·A_i",
		Source:  srcCompat,
	})
	funcs.Register(&funcs.Def{
		Name: "strain_for_force", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: composite.Param, Doc: "the composite"},
			{Name: "N", Type: force, Doc: "axial force, N; tension positive"},
			{Name: "dT", Type: kelvin, Optional: true, Doc: "temperature change, K; default 0"},
		},
		Result: strain,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := sectionOf(a[0])
			if err != nil {
				return nil, err
			}
			return s.StrainFor(num(a[1]), optNum(a, 2, 0))
		},
		Summary: "uniform strain at which the composite carries N (inverse of section_force)",
		Doc: "Solves N(ε) = N by Brent's method on a bracket grown from zero strain towards the sign of N, within " +
			"the strain limits of the laws (concrete crushing) and |ε| ≤ 1. On a plateau the strain is not unique; " +
			"any strain on it is returned. A force beyond what the section can carry (beyond the squash load in " +
			"compression) is an error that names the largest force reached.",
		Formula: "find ε with Σ σ_i(ε − α_i·ΔT)·A_i = N",
		Source:  srcCompat,
	})
	funcs.Register(&funcs.Def{
		Name: "squash_load", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: composite.Param, Doc: "the composite; every part needs a law with a plateau"},
			{Name: "coef", Type: strain, Optional: true, Doc: "coefficient on the concrete plateau f_cd, 0 to 1.5; default 1 (take it from the local code, e.g. 0.85 for encased sections)"},
		},
		Result: force,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := sectionOf(a[0])
			if err != nil {
				return nil, err
			}
			return s.SquashLoad(optNum(a, 1, 1))
		},
		// Source: EN 1994-1-1:2004 §6.7.3.2(1), Eq. (6.30) (from memory):
		// N_pl = Σ A_a·f_yd + coef·Σ A_c·f_cd, the sums from Sheaf's
		// composite (its parts and laws are no fields of the record).
		Spreadsheet: &funcs.Spreadsheet{
			Formula: "{c#fixed}+({coef=1})*{c#scaled}",
			Valid:   "AND({coef=1}>0,{coef=1}<=1.5)",
			Terms: &funcs.Terms{Param: "c", Names: []string{"fixed", "scaled"}, Of: func(v funcs.Value) ([]float64, error) {
				s, err := sectionOf(v)
				if err != nil {
					return nil, err
				}
				fixed, scaled, err := s.SquashTerms()
				return []float64{fixed, scaled}, err
			}},
		},
		Summary: "plastic resistance in compression Σ A_i·f_i (a positive force)",
		Doc: "Every part on its compressive plateau: steel at f_y, concrete at coef·f_cd. The result is a positive " +
			"resistance (compare it with the magnitude of the compressive force). Parts with an elastic or user law " +
			"have no plateau and make it an error.",
		Formula: "N_pl = Σ A_a·f_y + coef·A_c·f_cd",
		Source:  "EN 1994-1-1:2004 §6.7.3.2(1), Eq. (6.30); coefficient 1.0 for concrete-filled tubes (from memory)",
	})
	funcs.Register(&funcs.Def{
		Name: "n_eps_curve", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: composite.Param, Doc: "the composite"},
			{Name: "eps_min", Type: strain, Doc: "first strain (e.g. −3.5 ‰)"},
			{Name: "eps_max", Type: strain, Doc: "last strain, > eps_min"},
			{Name: "n", Type: strain, Doc: fmt.Sprintf("number of points, 2 to %d", MaxCurvePoints)},
		},
		Result: CurveType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := sectionOf(a[0])
			if err != nil {
				return nil, err
			}
			n := num(a[3])
			if n != math.Trunc(n) {
				return nil, fmt.Errorf("the number of points must be a whole number, got %g", n)
			}
			if n < 2 || n > MaxCurvePoints {
				return nil, fmt.Errorf("the curve needs between 2 and %d points, got %g", MaxCurvePoints, n)
			}
			e, f, err := s.Curve(num(a[1]), num(a[2]), int(n))
			if err != nil {
				return nil, err
			}
			return &funcs.TableValue{Type: CurveType, Cols: [][]float64{e, f}}, nil
		},
		Summary: "table of N(ε) at n equal strain steps, for plots (columns eps, N)",
		Doc: "Samples section_force at n strains equally spaced from eps_min to eps_max (no temperature change). " +
			"The table's type is n_eps_curve, which the workbook export draws as a chart.",
		Formula: "eps_k = eps_min + k·(eps_max − eps_min)/(n − 1); N_k = N(eps_k)",
		Source:  srcCompat,
	})
}
