package xlsxout

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestTemplateTableUnits: a table written inside a template is exported in
// the units its header writes (cm here), not in the preferred unit of the
// system (mm), and its entries are the written numbers. A regression test:
// the Data tab once showed the template's lengths in mm under a header
// that the template does not have.
// Source: the template file testdata/templates/stepped.sheaf (its header
// says L [cm], its rows 120 and 80).
func TestTemplateTableUnits(t *testing.T) {
	s := load(t, "testdata/template-table.sheaf")
	r := s.NewState().Eval()
	f := build(t, s, r)
	rows, err := f.GetRows(TabData, raw)
	if err != nil {
		t.Fatal(err)
	}
	var head, first []string
	for i, row := range rows {
		if len(row) > 0 && row[0] == "L [cm]" {
			head, first = row, rows[i+1]
			break
		}
	}
	if head == nil {
		t.Fatalf("no header L [cm] on the Data tab:\n%q", rows)
	}
	if len(head) < 2 || head[1] != "A [mm²]" {
		t.Errorf("header %q, want L [cm] and A [mm²]", head)
	}
	if len(first) < 2 || first[0] != "120" || first[1] != "314" {
		t.Errorf("first row %q, want 120 and 314 as written", first)
	}
	// The live sum of the column reads the cm entries with the cm factor.
	if n := compareFormulas(t, f, s, r, "template table"); n == 0 {
		t.Error("no formula compared")
	}
	if c := r.Cell("rod.L_tot"); c == nil || c.Cell.Kind != engine.Derived {
		t.Fatal("rod.L_tot is not a derived cell of the sheet")
	}
}
