package composite

import (
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// Dimensions used by the family.
var (
	L      = units.Base(units.Length)
	Force  = units.Base(units.Mass).Mul(L).Div(units.Base(units.Time).Mul(units.Base(units.Time)))
	Stress = Force.Div(section.L2)
	PerK   = units.Base(units.Temperature).Inv()
	EI     = Force.Mul(section.L2)
)

// MaterialParam is the structural type a material must match: a record
// with a modulus E and optionally alpha, f_y and f_c, written in the sheet
// as {E: 210 GPa, alpha: 12e-6 1/K, f_y: 355 MPa}.
var MaterialParam = funcs.RecordOf("",
	funcs.Field{Name: "E", Type: funcs.Num(Stress), Doc: "modulus of elasticity, Pa"},
	funcs.Field{Name: "alpha", Type: funcs.Num(PerK), Optional: true, Doc: "coefficient of thermal expansion, 1/K"},
	funcs.Field{Name: "f_y", Type: funcs.Num(Stress), Optional: true, Doc: "yield strength, Pa"},
	funcs.Field{Name: "f_c", Type: funcs.Num(Stress), Optional: true, Doc: "compressive strength, Pa"},
)

// LawParam accepts a stress–strain law built by the plastic family.
var LawParam = funcs.RecordOf("law")

// PartType is the record type "part".
var PartType = funcs.RecordOf("part",
	funcs.Field{Name: "A", Type: funcs.Num(section.L2), Doc: "area of the part, m²"},
	funcs.Field{Name: "EA", Type: funcs.Num(Force), Doc: "axial rigidity ∫E dA of the part, N"},
	funcs.Field{Name: "E_mean", Type: funcs.Num(Stress), Doc: "area-weighted mean modulus EA/A, Pa"},
	funcs.Field{Name: "alpha", Type: funcs.Num(PerK), Doc: "coefficient of thermal expansion, 1/K (0 when not given)"},
)

// PartParam accepts a part value.
var PartParam = funcs.RecordOf("part")

// Type is the record type "composite".
var Type = funcs.RecordOf("composite",
	funcs.Field{Name: "A", Type: funcs.Num(section.L2), Doc: "total area, m²"},
	funcs.Field{Name: "EA", Type: funcs.Num(Force), Doc: "axial rigidity Σ∫E dA, N"},
	funcs.Field{Name: "y_E", Type: funcs.Num(L), Doc: "modulus-weighted centroid, horizontal, m"},
	funcs.Field{Name: "z_E", Type: funcs.Num(L), Doc: "modulus-weighted centroid, vertical, m"},
	funcs.Field{Name: "EI_y", Type: funcs.Num(EI), Doc: "flexural rigidity ∫E(z − z_E)² dA, N·m²"},
	funcs.Field{Name: "EI_z", Type: funcs.Num(EI), Doc: "flexural rigidity ∫E(y − y_E)² dA, N·m²"},
	funcs.Field{Name: "EI_yz", Type: funcs.Num(EI), Doc: "product ∫E(y − y_E)(z − z_E) dA, N·m²"},
	funcs.Field{Name: "n_parts", Type: funcs.Num(units.None), Doc: "number of parts"},
)

// Param accepts a composite value.
var Param = funcs.RecordOf("composite")

// AxialType is the record type "axial_response".
var AxialType = funcs.RecordOf("axial_response",
	funcs.Field{Name: "eps", Type: funcs.Num(units.None), Doc: "uniform total strain (elongation per length), tension positive"},
	funcs.Field{Name: "eps_thermal", Type: funcs.Num(units.None), Doc: "free thermal strain of the composite ΣαEA·ΔT/EA"},
	funcs.Field{Name: "N_parts", Type: funcs.ListOf(funcs.Num(Force)), Doc: "force in each part, in part order, N"},
	funcs.Field{Name: "sigma_parts", Type: funcs.ListOf(funcs.Num(Stress)), Doc: "mean stress N_i/A_i of each part, Pa"},
	funcs.Field{Name: "sigma_thermal", Type: funcs.ListOf(funcs.Num(Stress)), Doc: "self-equilibrated thermal stress of each part (share of ΔT at N = 0), Pa"},
)

// PartRecord wraps a prepared part.
func PartRecord(p *Part) *funcs.RecordValue {
	return &funcs.RecordValue{Type: PartType, Fields: []funcs.Value{p.A, p.EA, p.EA / p.A, p.Alpha}, Payload: p}
}

// Record wraps a composite.
func Record(c *Composite) *funcs.RecordValue {
	return &funcs.RecordValue{Type: Type, Fields: []funcs.Value{
		c.A, c.EA, c.YE, c.ZE, c.EIy, c.EIz, c.EIyz, float64(len(c.Parts)),
	}, Payload: c}
}

// Of returns the composite behind a composite value.
func Of(v funcs.Value) (*Composite, error) {
	if r, ok := v.(*funcs.RecordValue); ok {
		if c, ok := r.Payload.(*Composite); ok {
			return c, nil
		}
	}
	return nil, errNotComposite
}
