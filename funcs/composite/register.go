package composite

import (
	"errors"
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/section"
)

const family = "composite"

const srcComposite = "J. M. Gere and B. J. Goodno, Mechanics of Materials, §2.4 (composite bars) and §2.5 (thermal effects); S. P. Timoshenko, Strength of Materials, Part I, Ch. 1"

var errNotComposite = errors.New("expected a composite built with composite(parts)")

func num(v funcs.Value) float64 { f, _ := v.(float64); return f }

// material reads a material record into a part.
func material(v funcs.Value, p *Part) error {
	r, ok := v.(*funcs.RecordValue)
	if !ok {
		return fmt.Errorf("expected a material record such as {E: 210 GPa, alpha: 12e-6 1/K}, got %T", v)
	}
	p.E = r.Num("E", math.NaN())
	if !(p.E > 0) || math.IsInf(p.E, 0) {
		return fmt.Errorf("the material needs a positive modulus E, got %s", funcs.Quantity(p.E, funcs.Stress))
	}
	if a, ok := r.Get("alpha").(float64); ok {
		p.Alpha, p.HasAlpha = a, true
	}
	p.Fy = r.Num("f_y", 0)
	p.Fc = r.Num("f_c", 0)
	return nil
}

// prepared builds a part record, computing its properties about the origin
// (a composite prepares its parts again about its own reference point).
func prepared(p *Part) (funcs.Value, error) {
	if err := p.Prepare(0, 0); err != nil {
		return nil, err
	}
	return PartRecord(p), nil
}

func init() {
	funcs.Register(&funcs.Def{
		Name: "part", Family: family,
		Params: []funcs.Param{
			{Name: "s", Type: section.ParamType, Doc: "the shape of the part, placed in the common section axes"},
			{Name: "material", Type: MaterialParam, Doc: "record with E [Pa] and optionally alpha [1/K], f_y, f_c [Pa]"},
			{Name: "law", Type: LawParam, Optional: true, Doc: "stress–strain law for strain compatibility (law_epp, law_parabola_rect, …); default linear elastic with the material's E"},
		},
		Result: PartType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := section.ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			p := &Part{Shape: s}
			if err := material(a[1], p); err != nil {
				return nil, err
			}
			if len(a) > 2 && a[2] != nil {
				p.Law = a[2]
			}
			return prepared(p)
		},
		Summary: "one material region of a composite: a section, a material and optionally a law",
		Doc: "A part of a composite section: the shape s (in the common axes of the composite; use place to " +
			"position it) made of one material with uniform modulus E. The material record needs E; alpha is " +
			"needed when a temperature change is applied; f_y and f_c are carried for the laws. The optional " +
			"law sets the stress–strain relation used by section_force, strain_for_force and squash_load.",
		Formula: "EA_i = E_i·A_i",
		Source:  srcComposite,
	})
	funcs.Register(&funcs.Def{
		Name: "part_graded", Family: family,
		Params: []funcs.Param{
			{Name: "s", Type: section.ParamType, Doc: "the shape of the part"},
			{Name: "E", Type: funcs.FuncOf(funcs.Num(Stress), funcs.Num(L), funcs.Num(L)), Doc: "modulus field E(y [m], z [m]) in Pa, positive over the part"},
			{Name: "alpha", Type: funcs.Num(PerK), Optional: true, Doc: "coefficient of thermal expansion, 1/K; needed for a temperature change"},
		},
		Result: PartType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := section.ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			f, err := section.ToField(a[1])
			if err != nil {
				return nil, err
			}
			p := &Part{Shape: s, EField: f}
			if len(a) > 2 && a[2] != nil {
				p.Alpha, p.HasAlpha = num(a[2]), true
			}
			return prepared(p)
		},
		Summary: "a part whose modulus varies over the section as E(y, z)",
		Doc: fmt.Sprintf("A part of a composite whose modulus is a field E(y, z) written in the sheet (a graded "+
			"or damaged material, a temperature-dependent modulus over a fire-exposed section). EA = ∫E dA and "+
			"the moments ∫E·y dA, ∫E·y² dA, … are section integrals to a relative tolerance of %g (exact for "+
			"polynomial fields). The part is linear elastic; its stress varies over it, and composite_axial "+
			"reports its mean stress N_i/A_i.", GradedTol),
		Formula: "EA_i = ∫ E(y, z) dA",
		Source:  "mechanics of materials, modulus-weighted (transformed) section: Gere & Goodno §6.2 (composite beams); integrals as section_integral",
	})
	funcs.Register(&funcs.Def{
		Name: "composite", Family: family,
		Params: []funcs.Param{
			{Name: "parts", Type: funcs.ListOf(PartParam), Doc: "the parts, e.g. [part(tube, steel), part(core, concrete)]; they must not overlap"},
		},
		Result: Type,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			list, ok := a[0].([]funcs.Value)
			if !ok {
				return nil, fmt.Errorf("expected a list of parts, got %T", a[0])
			}
			parts := make([]*Part, 0, len(list))
			for i, v := range list {
				r, ok := v.(*funcs.RecordValue)
				var p *Part
				if ok {
					p, ok = r.Payload.(*Part)
				}
				if !ok {
					return nil, fmt.Errorf("element %d of the list is not a part; build it with part(section, material)", i+1)
				}
				cp := *p // parts are values: a composite owns its copies
				parts = append(parts, &cp)
			}
			c, err := New(parts)
			if err != nil {
				return nil, err
			}
			return Record(c), nil
		},
		Summary: "a section of several parts: EA, modulus-weighted centroid and EI about it",
		Doc: "Combines parts (which must not overlap; a concrete core is the hole of the tube, e.g. circle(d − 2t) " +
			"inside chs(d, t)) into a composite section. EA = Σ∫E dA; the modulus-weighted centroid y_E = Σ∫E·y dA/EA " +
			"(likewise z_E) is where an axial force gives a uniform strain; EI_y, EI_z and EI_yz are about it.",
		Formula: "EA = Σ∫E dA; z_E = Σ∫E·z dA / EA; EI_y = Σ∫E·(z − z_E)² dA",
		Source:  srcComposite + "; modulus-weighted section as in EN 1994-1-1 §6.7.3.3 (effective flexural stiffness, from memory)",
	})
	funcs.Register(&funcs.Def{
		Name: "transformed_area", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: Param, Doc: "the composite"},
			{Name: "E_ref", Type: funcs.Num(Stress), Doc: "reference modulus, Pa; > 0"},
		},
		Result: funcs.Num(section.L2),
		Call: func(a []funcs.Value) (funcs.Value, error) {
			c, err := Of(a[0])
			if err != nil {
				return nil, err
			}
			e := num(a[1])
			if !(e > 0) || math.IsInf(e, 0) {
				return nil, fmt.Errorf("the reference modulus E_ref must be positive, got %s", funcs.Quantity(e, funcs.Stress))
			}
			return c.EA / e, nil
		},
		Spreadsheet: &funcs.Spreadsheet{Formula: "({c.EA})/({E_ref})", Valid: "{E_ref}>0"},
		Summary:     "area of the equivalent section in the reference material, EA/E_ref",
		Doc: "The transformed (equivalent) area: each part's area scaled by its modular ratio n_i = E_i/E_ref, " +
			"so that the transformed section in the reference material has the composite's axial rigidity.",
		Formula: "A_tr = Σ (E_i/E_ref)·A_i = EA/E_ref",
		Source:  "Gere & Goodno, Mechanics of Materials, §6.3 (transformed-section method)",
	})
	funcs.Register(&funcs.Def{
		Name: "composite_axial", Family: family,
		Params: []funcs.Param{
			{Name: "c", Type: Param, Doc: "the composite"},
			{Name: "N", Type: funcs.Num(Force), Doc: "axial force at the modulus-weighted centroid, N; tension positive"},
			{Name: "dT", Type: funcs.Num(units.Base(units.Temperature)), Optional: true, Doc: "uniform temperature change, K; default 0; needs alpha in every part"},
		},
		Result: AxialType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			c, err := Of(a[0])
			if err != nil {
				return nil, err
			}
			dT := 0.0
			if len(a) > 2 && a[2] != nil {
				dT = num(a[2])
			}
			r, err := c.Response(num(a[1]), dT)
			if err != nil {
				return nil, err
			}
			return &funcs.RecordValue{Type: AxialType, Fields: []funcs.Value{r.Eps, r.EpsThermal, r.N, r.Sigma, r.SigmaTh}, Payload: r}, nil
		},
		Summary: "elastic response to N and ΔT: uniform strain, force and stress of each part",
		Doc: "Plane sections stay plane, so the strain ε is uniform: ε = (N + ΔT·Σα_i·EA_i)/EA. Each part carries " +
			"N_i = EA_i·(ε − α_i·ΔT), with mean stress N_i/A_i (the exact stress E_i(ε − α_iΔT) for a uniform " +
			"part). sigma_thermal is the share of ΔT alone: self-equilibrated, ΣN_i = 0. Lists are in part order " +
			"(index from 0 in the sheet: r.N_parts[0]). Tension and lengthening positive. Linear elastic: use " +
			"section_force for strains beyond yield.",
		Formula: "ε = (N + ΔT·Σα_i·E_i·A_i)/Σ E_i·A_i; N_i = E_i·A_i·(ε − α_i·ΔT); σ_i = N_i/A_i",
		Source:  srcComposite,
	})
	funcs.Register(&funcs.Def{
		Name: "concrete_ecm", Family: family,
		Params: []funcs.Param{
			{Name: "f_ck", Type: funcs.Num(Stress), Doc: "characteristic cylinder strength, Pa; EN 1992-1-1 Table 3.1 covers 12 to 90 MPa"},
		},
		Result: funcs.Num(Stress),
		Call: func(a []funcs.Value) (funcs.Value, error) {
			e, err := EcmEN1992(num(a[0]))
			if err != nil {
				return nil, err
			}
			return e, nil
		},
		Spreadsheet: &funcs.Spreadsheet{Formula: "22E9*((({f_ck})/1E6+8)/10)^0.3", Valid: "AND({f_ck}>0,({f_ck})/1E6<=200)"},
		Summary:     "secant modulus of concrete E_cm = 22·(f_cm/10)^0.3 GPa, f_cm = f_ck + 8 MPa",
		Doc: "Secant modulus of elasticity of normal-weight concrete with quartzite aggregates from the mean " +
			"strength f_cm = f_ck + 8 MPa. The formula is evaluated, not the rounded table values. For limestone or " +
			"sandstone aggregates the code reduces it (×0.9, ×0.7; basalt ×1.2): apply that factor in the sheet.",
		Formula: "E_cm = 22·((f_ck + 8 MPa)/10 MPa)^0.3 GPa",
		Source:  "EN 1992-1-1:2004 Table 3.1 and §3.1.3(2)",
	})
}
