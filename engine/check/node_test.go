package check

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"

	// The bundled sheets call plugin functions.
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/catalogue"
	_ "github.com/sheafcalc/sheaf/funcs/composite"
	_ "github.com/sheafcalc/sheaf/funcs/connection"
	_ "github.com/sheafcalc/sheaf/funcs/plastic"
	_ "github.com/sheafcalc/sheaf/funcs/section"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)

// TestNodeCount: the count of typed nodes kept while typing, which the
// evaluation budget uses for a formula without calls of the sheet's
// functions, equals the nodes reached from the formula's roots, for every
// cell of every bundled sheet and of the templates they use; and every
// argument is a typed slot of its own formula.
func TestNodeCount(t *testing.T) {
	paths, err := filepath.Glob("../../sheets/*.sheaf")
	if err != nil || len(paths) == 0 {
		t.Fatalf("no bundled sheets: %v", err)
	}
	var walk func(n Node) int32
	walk = func(n Node) int32 {
		k := int32(1)
		for i := range n.NArg() {
			a := n.Arg(i)
			if a.src != n.src || a.Type() == nil {
				t.Errorf("%s: argument %d of `%s` is not a typed node of its formula", n.Range().Start(), i, n.Text())
				return k
			}
			k += walk(a)
		}
		return k
	}
	cells := 0
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		f, errs := sheet.Parse(p, src)
		if errs.HasErrors() {
			t.Fatalf("%s: %v", p, errs)
		}
		prog, errs := Sheet(f, Options{})
		if errs.HasErrors() {
			t.Fatalf("%s: %v", p, errs)
		}
		for _, c := range prog.Cells {
			if c.Type == nil {
				continue
			}
			roots := [][]Node{{c.Body()}, {c.Extra().Demand, c.Extra().Capacity}}
			for _, e := range c.Extra().Entries {
				roots = append(roots, []Node{e.Node})
			}
			for _, rs := range roots {
				if rs[0].IsZero() {
					continue
				}
				var n int32
				for _, r := range rs {
					n += walk(r)
				}
				if got := rs[0].src.count(); got != n {
					t.Errorf("%s: cell %s counts %d typed nodes, %d reached", p, c.Name, got, n)
				}
				cells++
			}
		}
	}
	if cells < 100 {
		t.Errorf("only %d formulas compared", cells)
	}
}
