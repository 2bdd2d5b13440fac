package funcs

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
)

// Dimensions from the SI definitions of the derived units.
// Source: BIPM, The International System of Units (SI Brochure), 9th ed.
// (2019), Table 4: newton = kg·m·s⁻², pascal = N/m² = kg·m⁻¹·s⁻².
var (
	dimL      = units.Base(units.Length)
	dimArea   = dimL.Mul(dimL)
	dimForce  = units.Base(units.Mass).Mul(dimL).Div(units.Base(units.Time)).Div(units.Base(units.Time))
	dimStress = dimForce.Div(dimArea)

	length = Num(dimL)
	area   = Num(dimArea)
	force  = Num(dimForce)
	stress = Num(dimStress)
	plain  = Num(units.None)
)

func TestAccepts(t *testing.T) {
	material := RecordOf("material",
		Field{Name: "E", Type: stress},
		Field{Name: "f_y", Type: stress},
		Field{Name: "alpha", Type: Num(units.Base(units.Temperature).Inv()), Optional: true})
	// A parameter that takes any record with E (structural).
	needsE := RecordOf("", Field{Name: "E", Type: stress})
	// A parameter that takes a "section" by name only (nominal).
	section := &Type{Kind: Record, Name: "section"}
	cases := []struct {
		name  string
		param *Type
		arg   *Type
		want  bool
	}{
		// Numbers match by dimension.
		{"same dimension", stress, Num(dimStress), true},
		{"other dimension", stress, force, false},
		{"a plain number is not a length", length, plain, false},
		{"a length is not a plain number", plain, length, false},
		{"plain numbers", plain, Num(units.None), true},
		{"stress is force over area", stress, Num(dimForce.Div(dimArea)), true},

		// Kinds.
		{"number against bool", plain, BoolType, false},
		{"bool", BoolType, BoolType, true},
		{"text", StringType, StringType, true},
		{"text against number", StringType, plain, false},
		{"any takes a number", AnyType, force, true},
		{"any takes a record", AnyType, material, true},
		{"a number does not take any", plain, AnyType, false},
		{"nil argument", plain, nil, false},
		{"nil parameter", nil, plain, false},

		// Lists match by element.
		{"list of lengths", ListOf(length), ListOf(Num(dimL)), true},
		{"list of forces for lengths", ListOf(length), ListOf(force), false},
		{"list against number", ListOf(length), length, false},
		{"list of lists", ListOf(ListOf(length)), ListOf(ListOf(length)), true},
		{"list of records, structurally", ListOf(needsE), ListOf(material), true},

		// Records: structural when the parameter lists fields.
		{"a record with the field", needsE, material, true},
		{"an anonymous record with the field", needsE, RecordOf("", Field{Name: "E", Type: stress}, Field{Name: "nu", Type: plain}), true},
		{"a record without the field", needsE, RecordOf("", Field{Name: "f_y", Type: stress}), false},
		{"a field of the wrong dimension", needsE, RecordOf("", Field{Name: "E", Type: force}), false},
		{"names do not matter when fields are listed", needsE, RecordOf("steel", Field{Name: "E", Type: stress}), true},
		{"an optional field may be missing", material, RecordOf("", Field{Name: "E", Type: stress}, Field{Name: "f_y", Type: stress}), true},
		{"an optional field present must fit", material, RecordOf("",
			Field{Name: "E", Type: stress}, Field{Name: "f_y", Type: stress}, Field{Name: "alpha", Type: length}), false},
		{"a required field is still required", material, RecordOf("", Field{Name: "E", Type: stress}), false},
		{"a record is not a table", needsE, &Type{Kind: Table, Fields: []Field{{Name: "E", Type: stress}}}, false},

		// Records: nominal when the parameter has a name and no fields.
		{"same name", section, RecordOf("section", Field{Name: "A", Type: area}), true},
		{"other name", section, RecordOf("material", Field{Name: "A", Type: area}), false},
		{"anonymous record for a named parameter", section, RecordOf("", Field{Name: "A", Type: area}), false},

		// Tables follow the record rules on their columns.
		{"table with the column", &Type{Kind: Table, Fields: []Field{{Name: "L", Type: length}}},
			&Type{Kind: Table, Fields: []Field{{Name: "L", Type: length}, {Name: "A", Type: area}}}, true},
		{"table with the column in other units", &Type{Kind: Table, Fields: []Field{{Name: "L", Type: length}}},
			&Type{Kind: Table, Fields: []Field{{Name: "L", Type: force}}}, false},

		// Functions: same arity, result accepted, parameters accepted the
		// other way round (the plugin passes its values to the function).
		{"same signature", FuncOf(area, length), FuncOf(Num(dimArea), Num(dimL)), true},
		{"wrong result", FuncOf(area, length), FuncOf(force, length), false},
		{"wrong parameter", FuncOf(area, length), FuncOf(area, force), false},
		{"wrong arity", FuncOf(area, length), FuncOf(area, length, length), false},
		{"no parameters", FuncOf(force), FuncOf(force), true},
		{"a function is not a number", FuncOf(area, length), area, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := c.param.Accepts(c.arg); got != c.want {
				t.Errorf("%v.Accepts(%v) = %v, want %v", c.param, c.arg, got, c.want)
			}
		})
	}
}

func TestTypeString(t *testing.T) {
	cases := []struct {
		ty   *Type
		want string
	}{
		{nil, "nothing"},
		{plain, "number"},
		{length, "number[L]"},
		{BoolType, "bool"},
		{StringType, "text"},
		{AnyType, "any"},
		{ListOf(length), "list of number[L]"},
		{RecordOf("section"), "section"},
		{RecordOf("", Field{Name: "E", Type: plain}, Field{Name: "L", Type: length}), "record{E: number, L: number[L]}"},
		{&Type{Kind: Table, Fields: []Field{{Name: "L", Type: length}}}, "table{L: number[L]}"},
		{FuncOf(plain, length, length), "fn(number[L], number[L]) number"},
	}
	for _, c := range cases {
		if got := c.ty.String(); got != c.want {
			t.Errorf("String() = %q, want %q", got, c.want)
		}
	}
}

func TestField(t *testing.T) {
	r := RecordOf("", Field{Name: "E", Type: stress}, Field{Name: "f_y", Type: stress})
	if r.Field("f_y") != 1 || r.Field("E") != 0 || r.Field("e") != -1 || r.Field("") != -1 {
		t.Errorf("Field: f_y=%d E=%d e=%d", r.Field("f_y"), r.Field("E"), r.Field("e"))
	}
}
