package check

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

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

// TestTooManyTypes: a sheet that builds more distinct types than a slot can
// tell apart is refused at the node that passes the limit, not typed with a
// wrong type. The limit is lowered for the test: a real sheet would need
// 16.7 million lists or records.
func TestTooManyTypes(t *testing.T) {
	saved := maxTypes
	defer func() { maxTypes = saved }()
	src := "a = [1 m, 2 m]\nb = {x: 1 m}\nc = [a, a]\nd = {y: b, z: c}\n"
	f, perrs := sheet.Parse("t.sheaf", []byte(src))
	if perrs.HasErrors() {
		t.Fatal(perrs)
	}
	if _, errs := Sheet(f, Options{}); errs.HasErrors() {
		t.Fatalf("with the real limit: %v", errs)
	}
	maxTypes = 4
	f, _ = sheet.Parse("t.sheaf", []byte(src))
	_, errs := Sheet(f, Options{})
	found := false
	for _, d := range errs {
		if d.Summary == "the sheet has too many kinds of value" {
			found = true
		}
	}
	if !found {
		t.Fatalf("no refusal past %d types: %v", maxTypes, errs)
	}
}
