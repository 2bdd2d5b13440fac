package funcs

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
)

// TestSpreadsheetCheck: Register refuses a spreadsheet form whose
// placeholders name no parameter, a missing column, an optional argument
// without its default, or fields of a result that is not a record.
// Source: the placeholder rules written on Spreadsheet (common practice
// for templates: every name is checked when it is declared, not used).
func TestSpreadsheetCheck(t *testing.T) {
	num := Num(units.None)
	table := &Type{Kind: Table, Fields: []Field{{Name: "x", Type: num}}}
	def := &Def{Name: "f", Params: []Param{{Name: "a", Type: num}, {Name: "tb", Type: table}, {Name: "k", Type: num, Optional: true}}, Result: num}
	rec := &Def{Name: "r", Params: def.Params, Result: RecordOf("r", Field{Name: "A", Type: num})}
	// A record parameter that lists its fields, one that only names an
	// unregistered record type, and a text parameter.
	sec := RecordOf("", Field{Name: "A", Type: num}, Field{Name: "kind", Type: StringType})
	terms := &Terms{Param: "s", Names: []string{"fixed", "scaled"}, Of: func(Value) ([]float64, error) { return []float64{1, 2}, nil }}
	rdef := &Def{Name: "g", Params: []Param{{Name: "s", Type: sec}, {Name: "u", Type: RecordOf("no_such_record")}, {Name: "mode", Type: StringType}}, Result: num}
	cases := []struct {
		name string
		d    *Def
		f    *Spreadsheet
		err  string // "" for none
	}{
		{"good", def, &Spreadsheet{Formula: "({a})*({k=1})+MAX({tb.x})", Valid: "AND({a}>0,{tb.x:increasing})"}, ""},
		{"fields", rec, &Spreadsheet{Fields: map[string]string{"A": "{a}^2"}}, ""},
		{"unknown parameter", def, &Spreadsheet{Formula: "{b}"}, `no parameter "b"`},
		{"unknown column", def, &Spreadsheet{Formula: "MAX({tb.y})"}, `no column "y"`},
		{"table as a number", def, &Spreadsheet{Formula: "{tb}"}, "not a number"},
		{"optional without default", def, &Spreadsheet{Formula: "{k}"}, "needs a default"},
		{"default on a required one", def, &Spreadsheet{Formula: "{a=2}"}, "a default is for an optional parameter"},
		{"unclosed", def, &Spreadsheet{Formula: "{a"}, "without its }"},
		{"stray close", def, &Spreadsheet{Formula: "a}"}, "without its {"},
		{"fields of a number", def, &Spreadsheet{Fields: map[string]string{"A": "{a}"}}, "record result"},
		{"unknown field", rec, &Spreadsheet{Fields: map[string]string{"B": "{a}"}}, `no number field "B"`},
		{"formula of a record", rec, &Spreadsheet{Formula: "{a}"}, "a record result has Fields"},
		{"empty", def, &Spreadsheet{}, "neither"},
		{"record field and text", rdef, &Spreadsheet{Formula: `({s.A})*IF(TRIM({mode})="x",1,2)`}, ""},
		{"text field", rdef, &Spreadsheet{Formula: "{s.kind}"}, `no number field "kind"`},
		{"missing field", rdef, &Spreadsheet{Formula: "{s.B}"}, `no number field "B"`},
		{"unregistered record", rdef, &Spreadsheet{Formula: "{u.A}"}, `no number field "A"`},
		{"record as a number", rdef, &Spreadsheet{Formula: "{s}"}, "not a number"},
		{"terms", rdef, &Spreadsheet{Formula: "{s#fixed}+2*{s#scaled}", Terms: terms}, ""},
		{"unknown term", rdef, &Spreadsheet{Formula: "{s#other}", Terms: terms}, `no term "other"`},
		{"term without Terms", rdef, &Spreadsheet{Formula: "{s#fixed}"}, "a term is"},
		{"term of another parameter", rdef, &Spreadsheet{Formula: "{u#fixed}", Terms: terms}, "a term is"},
		{"terms of a text", rdef, &Spreadsheet{Formula: "{s.A}", Terms: &Terms{Param: "mode", Names: []string{"x"}, Of: terms.Of}}, "Terms name a record parameter"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			d := *c.d // as Register checks it: the form is the Def's
			d.Spreadsheet = c.f
			err := c.f.check(&d)
			switch {
			case c.err == "" && err != nil:
				t.Fatalf("unexpected error %v", err)
			case c.err != "" && (err == nil || !strings.Contains(err.Error(), c.err)):
				t.Fatalf("error %v, want one containing %q", err, c.err)
			}
		})
	}
}
