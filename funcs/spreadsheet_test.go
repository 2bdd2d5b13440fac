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
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := c.f.check(c.d)
			switch {
			case c.err == "" && err != nil:
				t.Fatalf("unexpected error %v", err)
			case c.err != "" && (err == nil || !strings.Contains(err.Error(), c.err)):
				t.Fatalf("error %v, want one containing %q", err, c.err)
			}
		})
	}
}
