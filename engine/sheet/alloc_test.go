package sheet

import (
	"reflect"
	"runtime"
	"testing"
)

// TestPrefetchSameTree: a sheet long enough for the cells to come from the
// helper's blocks parses to the same tree and problems as on one core,
// where each cell is allocated on its own.
func TestPrefetchSameTree(t *testing.T) {
	src := append(generatedSheet(3000), "bad [kN = 1\nx = 2 kN -- @\n"...)
	f1, d1 := Parse("big.sheaf", src)
	prev := runtime.GOMAXPROCS(1)
	f2, d2 := Parse("big.sheaf", src)
	runtime.GOMAXPROCS(prev)
	if len(f1.Items) < minPrefetchLines {
		t.Fatalf("only %d items: the helper never ran", len(f1.Items))
	}
	if !reflect.DeepEqual(f1.Items, f2.Items) {
		t.Error("items differ between the prefetched and the plain parse")
	}
	if !reflect.DeepEqual(d1, d2) || len(d1) == 0 {
		t.Errorf("problems differ or are missing:\n%v\n%v", d1, d2)
	}
}
