package lsp

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestFastPath: an edit of input values only takes the fast path, and the
// values it gives are those of checking the new text from scratch; any
// other edit is checked whole.
func TestFastPath(t *testing.T) {
	tests := []struct {
		name, from, to string
		fast           bool
	}{
		{"value", "250 kN ", "125 kN ", true},
		{"value and unit", "250 kN ", "0.2 MN ", true},
		{"two values", "4.2 m ", "5.0 m ", true},
		{"number to formula", "250 kN ", "2 * f_y * 1 mm^2", false},
		{"unit of the wrong kind", "250 kN ", "250 mm ", false},
		{"display unit", "P    [kN]", "P    [MN]", false},
		{"derived cell", "P / A_σ ", "P / A_σ / 2", false},
		{"new line", "θ  ", "\nθ  ", false},
		{"description", "pull in the rod", "pull in the tie", false},
		{"comment", "## Rod", "## Rods", false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := newDocument(rodURI, 1, rodSheet)
			if d.sheet == nil {
				t.Fatal(d.errs)
			}
			src := strings.Replace(rodSheet, tt.from, tt.to, 1)
			if src == rodSheet {
				t.Fatalf("%q is not in the sheet", tt.from)
			}
			if fast := d.setText(2, src); fast != tt.fast {
				t.Fatalf("fast path %v, want %v", fast, tt.fast)
			}
			fresh := newDocument(rodURI, 2, src)
			if (fresh.sheet == nil) != (d.sheet == nil) {
				t.Fatalf("checks: incremental %v, fresh %v", d.sheet != nil, fresh.sheet != nil)
			}
			if d.sheet == nil {
				return
			}
			for _, c := range fresh.sheet.Cells() {
				if c.Kind == engine.Function {
					continue
				}
				got, _ := d.valueText(d.sheet.Lookup(c.Name))
				want, _ := fresh.valueText(c)
				if got != want {
					t.Errorf("%s: %q after the edit, %q checked afresh", c.Name, got, want)
				}
			}
		})
	}
}
