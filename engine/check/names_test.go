package check

import (
	"fmt"
	"testing"
)

// TestNameIndex: the table finds what a Go map from name to index finds,
// for every name held and for names it does not hold, as it grows from
// empty and after a reservation.
func TestNameIndex(t *testing.T) {
	tests := []struct {
		name    string
		reserve int
		count   int
	}{
		{"empty", 0, 0},
		{"one", 0, 1},
		{"grows from empty", 0, 5000},
		{"reserved", 5000, 5000},
		{"reserved too few", 10, 3000},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var x nameIndex
			x.reserve(nil, tt.reserve)
			var cells []*Cell
			want := map[string]int{}
			for i := range tt.count {
				name := fmt.Sprintf("c%d_%d", i%7, i)
				switch i % 3 {
				case 1:
					name = "rod." + name
				case 2:
					name = "σ_" + name
				}
				cells = append(cells, &Cell{Name: name})
				x.add(cells, i)
				want[name] = i
			}
			for name, i := range want {
				if got, ok := x.find(cells, name); !ok || got != i {
					t.Fatalf("find(%q) = %d, %v; want %d", name, got, ok, i)
				}
			}
			for _, name := range []string{"", "c0", "rod.", "c1_1x", "nope"} {
				if _, inMap := want[name]; inMap {
					continue
				}
				if got, ok := x.find(cells, name); ok {
					t.Fatalf("find(%q) = %d, want none", name, got)
				}
			}
			if 2*x.n > len(x.slots) && x.n > 0 {
				t.Fatalf("%d names in %d slots: more than half full", x.n, len(x.slots))
			}
		})
	}
}
