package check

import "testing"

// TestStandInCell: a cell of the checker's own, with no item behind it,
// answers every question about its item with the zero value.
func TestStandInCell(t *testing.T) {
	c := &Cell{Name: "x"}
	if c.Range().Src != nil || c.NameRange().Src != nil || c.Expr() != "" || c.Description() != "" || c.Reference() != "" || c.Section() != "" || c.Scope() != "" || !c.Body().IsZero() {
		t.Fatalf("stand-in cell: range %v, name range %v, expr %q, description %q, reference %q, section %q, scope %q",
			c.Range(), c.NameRange(), c.Expr(), c.Description(), c.Reference(), c.Section(), c.Scope())
	}
	c.setAnnot("d", "r")
	if c.Description() != "d" || c.Reference() != "r" {
		t.Fatalf("after setAnnot: %q, %q", c.Description(), c.Reference())
	}
}
