package funcs

import (
	"strings"

	"github.com/sheafcalc/sheaf/engine/units"
)

// Kind is the shape of a static type.
type Kind uint8

const (
	// Invalid is the zero Kind, which no well-formed type has: a Type left
	// unset shows as "invalid" rather than passing for a number.
	Invalid Kind = iota
	Number       // float64 in SI units, with a dimension
	Bool         // result of a comparison
	String       // text (labels, modes such as "fixed")
	Record       // named fields; user records, materials, sections, results
	List         // homogeneous list; a list of numbers is []float64 at run time
	Table        // numeric columns with units; *TableValue at run time
	Func         // a function value: a user function passed to a plugin
	Any          // accepts anything; for validators that inspect the argument
)

var kindNames = [...]string{"invalid", "number", "bool", "text", "record", "list", "table", "function", "any"}

// String names the kind in messages and listings ("number", "record").
func (k Kind) String() string { return kindNames[k] }

// Type is a static type. Types are built once and shared; treat them as
// immutable.
type Type struct {
	Kind Kind
	Dim  units.Dim // Number: the dimension

	// Record, Table: Name is the nominal type name ("section", "material",
	// "bar_result"); empty for anonymous records written in a sheet.
	Name string
	// Record: the fields, in declaration order. Table: the columns (each a
	// Number field). A parameter type lists the fields it requires; Optional
	// fields may be absent.
	Fields []Field

	Elem *Type // List: element type

	Params []*Type // Func: parameter types (numbers)
	Result *Type   // Func: result type
}

// Field is a member of a record or a column of a table.
type Field struct {
	Name     string
	Type     *Type
	Optional bool   // in a parameter type: may be missing from the argument
	Doc      string // what the field means, with its unit
}

// Constructors for common types.
var (
	BoolType   = &Type{Kind: Bool}
	StringType = &Type{Kind: String}
	AnyType    = &Type{Kind: Any}
)

// Num returns the number type of dimension d.
func Num(d units.Dim) *Type { return &Type{Kind: Number, Dim: d} }

// ListOf returns the list type with element t.
func ListOf(t *Type) *Type { return &Type{Kind: List, Elem: t} }

// FuncOf returns the function type taking params and returning result.
func FuncOf(result *Type, params ...*Type) *Type {
	return &Type{Kind: Func, Params: params, Result: result}
}

// RecordOf returns a record type with the given name and fields.
func RecordOf(name string, fields ...Field) *Type {
	return &Type{Kind: Record, Name: name, Fields: fields}
}

// Field returns the index of the named field, or -1.
func (t *Type) Field(name string) int {
	for i, f := range t.Fields {
		if f.Name == name {
			return i
		}
	}
	return -1
}

// String renders the type for messages and `sheaf funcs`, with dimensions in
// base notation; the registry's users may render dimensions as units instead.
func (t *Type) String() string {
	if t == nil {
		return "nothing"
	}
	switch t.Kind {
	case Number:
		if t.Dim.IsNone() {
			return "number"
		}
		return "number[" + t.Dim.String() + "]"
	case List:
		return "list of " + t.Elem.String()
	case Record, Table:
		if t.Name != "" {
			return t.Name
		}
		var b strings.Builder
		b.WriteString(t.Kind.String() + "{")
		for i, f := range t.Fields {
			if i > 0 {
				b.WriteString(", ")
			}
			b.WriteString(f.Name + ": " + f.Type.String())
		}
		b.WriteString("}")
		return b.String()
	case Func:
		var b strings.Builder
		b.WriteString("fn(")
		for i, p := range t.Params {
			if i > 0 {
				b.WriteString(", ")
			}
			b.WriteString(p.String())
		}
		b.WriteString(") " + t.Result.String())
		return b.String()
	}
	return t.Kind.String()
}

// Accepts reports whether a value of type arg may be passed where a value of
// type t (a parameter type) is expected. Records match by name when t has a
// name and no fields, else structurally: every required field of t must be in
// arg with an accepted type. Numbers match by dimension.
func (t *Type) Accepts(arg *Type) bool {
	if t == nil || arg == nil {
		return false
	}
	if t.Kind == Any {
		return true
	}
	if t.Kind != arg.Kind {
		return false
	}
	switch t.Kind {
	case Number:
		return t.Dim == arg.Dim
	case List:
		return t.Elem.Accepts(arg.Elem)
	case Record, Table:
		if t.Name != "" && len(t.Fields) == 0 {
			return t.Name == arg.Name
		}
		for _, f := range t.Fields {
			i := arg.Field(f.Name)
			if i < 0 {
				if f.Optional {
					continue
				}
				return false
			}
			if !f.Type.Accepts(arg.Fields[i].Type) {
				return false
			}
		}
		return true
	case Func:
		if len(t.Params) != len(arg.Params) || !t.Result.Accepts(arg.Result) {
			return false
		}
		for i, p := range t.Params {
			if !arg.Params[i].Accepts(p) {
				return false
			}
		}
		return true
	}
	return true
}
