package lsp

import (
	"os"
	"path/filepath"
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

// TestFastPathSequence: edits one after another, fast and not, on a sheet
// with template overrides; after each the values are those of checking
// the text afresh.
func TestFastPathSequence(t *testing.T) {
	b, err := os.ReadFile("../../sheets/walkway-pair.sheaf")
	if err != nil {
		t.Fatal(err)
	}
	abs, _ := filepath.Abs("../../sheets/walkway-pair.sheaf")
	uri := pathToURI(abs)
	src := string(b)
	steps := []struct {
		from, to string
		fast     bool
	}{
		{"= 16 mm ", "= 12 mm ", true},                        // a template override
		{"= 3.6 m ", "= 4.2 m ", true},                        // an input the overrides read
		{"= 12 mm ", "= 20 mm ", true},                        // again, on a line edited before
		{"F_node [kN] = 35 kN", "F_node [kN] = 3.5 kN", true}, // a check now fails
		{"dz_lim [mm] = 1 mm", "dz_lim [mm] = 2 * 1 mm", false},
		{"= 20 mm ", "= 12 mm ", true},
	}
	d := newDocument(uri, 1, src)
	for i, st := range steps {
		next := strings.Replace(src, st.from, st.to, 1)
		if next == src {
			t.Fatalf("step %d: %q not found", i, st.from)
		}
		src = next
		if fast := d.setText(i+2, src); fast != st.fast {
			t.Errorf("step %d: fast %v, want %v", i, fast, st.fast)
		}
		fresh := newDocument(uri, i+2, src)
		if fresh.sheet == nil || d.sheet == nil {
			t.Fatalf("step %d: does not check", i)
		}
		for _, c := range fresh.sheet.Cells() {
			if c.Kind == engine.Function {
				continue
			}
			got, _ := d.valueText(d.sheet.Lookup(c.Name))
			want, _ := fresh.valueText(c)
			if got != want {
				t.Errorf("step %d: %s: %q, afresh %q", i, c.Name, got, want)
			}
		}
		d.ensure()
		if d.lines.src != src || string(d.file.Src) != src {
			t.Fatalf("step %d: the document lost the text", i)
		}
	}
}
