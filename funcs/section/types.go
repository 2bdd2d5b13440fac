package section

import (
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Dimensions used by the family.
var (
	L  = units.Base(units.Length)
	L2 = L.Mul(L)
	L4 = L2.Mul(L2)
	// Rot is the dimension of a rotation: a plane angle, which Sheaf keeps
	// apart from plain numbers.
	Rot = units.Base(units.Angle)
)

// Type is the record type "section": the properties of a shape, with the
// shape itself (*Shape) as Payload for section integrals and composites.
var Type = funcs.RecordOf("section",
	funcs.Field{Name: "A", Type: funcs.Num(L2), Doc: "area, m²"},
	funcs.Field{Name: "y_c", Type: funcs.Num(L), Doc: "centroid, horizontal coordinate, m"},
	funcs.Field{Name: "z_c", Type: funcs.Num(L), Doc: "centroid, vertical coordinate, m"},
	funcs.Field{Name: "I_y", Type: funcs.Num(L4), Doc: "second moment ∫(z − z_c)² dA about the centroidal axis parallel to y, m⁴"},
	funcs.Field{Name: "I_z", Type: funcs.Num(L4), Doc: "second moment ∫(y − y_c)² dA about the centroidal axis parallel to z, m⁴"},
	funcs.Field{Name: "I_yz", Type: funcs.Num(L4), Doc: "product moment ∫(y − y_c)(z − z_c) dA, m⁴"},
	funcs.Field{Name: "I_1", Type: funcs.Num(L4), Doc: "major principal second moment, m⁴"},
	funcs.Field{Name: "I_2", Type: funcs.Num(L4), Doc: "minor principal second moment, m⁴"},
	funcs.Field{Name: "i_y", Type: funcs.Num(L), Doc: "radius of gyration √(I_y/A), m"},
	funcs.Field{Name: "i_z", Type: funcs.Num(L), Doc: "radius of gyration √(I_z/A), m"},
	funcs.Field{Name: "i_min", Type: funcs.Num(L), Doc: "least radius of gyration √(I_2/A), m (governs flexural buckling)"},
)

// ParamType accepts any value of record type "section".
var ParamType = funcs.RecordOf("section")

// Record wraps a shape as a section value.
func Record(s *Shape) *funcs.RecordValue {
	p := s.Props()
	return &funcs.RecordValue{
		Type:    Type,
		Fields:  []funcs.Value{p.A, p.Yc, p.Zc, p.Iy, p.Iz, p.Iyz, p.I1, p.I2, p.IRy, p.IRz, p.IMin},
		Payload: s,
	}
}

// ShapeOf returns the shape behind a section value.
func ShapeOf(v funcs.Value) (*Shape, error) {
	if r, ok := v.(*funcs.RecordValue); ok {
		if s, ok := r.Payload.(*Shape); ok {
			return s, nil
		}
	}
	return nil, ErrNoShape
}
