package check

import (
	"fmt"
	"reflect"
	"runtime"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestLargeSheetSameProgram: a sheet large enough to be collected and
// resolved in parallel chunks, and typed with the helper making node
// blocks, gives the same program and problems as on one core, where all of
// it runs on one goroutine.
func TestLargeSheetSameProgram(t *testing.T) {
	var b strings.Builder
	b.WriteString("A [mm^2] = 314 mm^2\nP [kN] = 40 kN\n")
	for i := 0; i < 3000; i++ {
		switch {
		case i == 0:
			b.WriteString("c0 [kN] = P * 2\n")
		case i%500 == 7:
			fmt.Fprintf(&b, "c%d [kN] = c%d + nope\n", i, i-1) // unknown name
		case i%10 == 0:
			fmt.Fprintf(&b, "c%d [kN] = (c%d / A) * 100 mm^2 + P / 10\n", i, i-1)
		default:
			fmt.Fprintf(&b, "c%d [kN] = max(c%d, P) / 2 + P / 10\n", i, i-1)
		}
	}
	b.WriteString("check ok: c2999 <= 1000 kN\nf(x [m]) [m] = 2 * x\n")
	src := []byte(b.String())
	run := func() (*Program, []string) {
		f, _ := sheet.Parse("big.sheaf", src)
		p, errs := Sheet(f, Options{DropItems: true, DropTrees: true})
		var got []string
		for _, d := range errs {
			got = append(got, d.Range.Start.String()+": "+d.Summary)
		}
		return p, got
	}
	p1, e1 := run()
	prev := runtime.GOMAXPROCS(1)
	p2, e2 := run()
	runtime.GOMAXPROCS(prev)
	if len(p1.Cells) < minPrefetch {
		t.Fatalf("only %d cells: the helper never ran", len(p1.Cells))
	}
	if !reflect.DeepEqual(e1, e2) || len(e1) == 0 {
		t.Fatalf("problems differ or are missing:\n%v\n%v", e1, e2)
	}
	if !reflect.DeepEqual(p1.Order, p2.Order) || !reflect.DeepEqual(p1.Users, p2.Users) || !reflect.DeepEqual(p1.ByName, p2.ByName) {
		t.Fatal("order, users or names differ")
	}
	for i, c1 := range p1.Cells {
		if !reflect.DeepEqual(c1, p2.Cells[i]) {
			t.Fatalf("cell %s differs", c1.Name)
		}
		if c1.Formula != nil && (c1.Formula.Tree != nil || c1.Formula.Refs != nil) {
			t.Fatalf("cell %s keeps its syntax tree", c1.Name)
		}
	}
	if p1.File.Items != nil {
		t.Fatal("the program keeps the items")
	}
}
