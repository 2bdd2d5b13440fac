package check

import (
	"slices"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestOrder: Program.Order holds every cell once; each cell comes
// after the cells it uses (read from the names each cell depends on,
// Program.DepNames, not from the evaluator's edges), unless it lies on a
// cycle; and cells keep reading order wherever their dependencies allow
// (a cell's dependencies are placed in their order of first use).
func TestOrder(t *testing.T) {
	cases := []struct {
		name string
		src  string
		want []string // the order, by name
	}{
		{"top down is reading order",
			"a = 1\nb = a + 1\nc = 2\nd = c + b\n",
			[]string{"a", "b", "c", "d"}},
		{"a cell used before it is written",
			"d = c + b\nc = b * 2\nb = a + 1\na = 3\ne = 5\n",
			[]string{"a", "b", "c", "d", "e"}},
		{"a function written after its caller", // dependencies in order of first use
			"y = f(x)\nx = 2\nf(z) = z * k\nk = 3\n",
			[]string{"k", "f", "x", "y"}},
		{"a table whose entries follow a cell",
			"n = sum(t.q)\ntable t\n    L [m]  q\n    1      (w)\n    2      3\nw = 4\n",
			[]string{"w", "t", "n"}},
		{"a cycle beside independent cells",
			"a = b + 1\nb = a + 1\nc = 2\nd = c * 2\n",
			[]string{"b", "a", "c", "d"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			f, errs := sheet.Parse("t.sheaf", []byte(c.src))
			if errs.HasErrors() {
				t.Fatalf("the sheet does not parse: %v", errs)
			}
			// A cycle is an error, but the program still has an order
			// (its cells are never typed): the errors are not fatal.
			p, _ := Sheet(f, Options{})
			var got []string
			at := map[string]int{}
			for k, i := range p.Order {
				name := p.Cells[i].Name
				got = append(got, name)
				at[name] = k
			}
			if !slices.Equal(got, c.want) {
				t.Fatalf("order %v, want %v", got, c.want)
			}
			for _, cell := range p.Cells {
				for _, d := range p.DepNames(cell) {
					if at[d] > at[cell.Name] && cell.Type != nil {
						t.Errorf("%s runs before %s, which it uses", cell.Name, d)
					}
				}
			}
		})
	}
}
