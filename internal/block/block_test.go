package block

import "testing"

// TestBlock: values come zeroed and distinct; a slice has no spare
// capacity, so appending to it never writes into the next one; blocks grow
// from Min to Max, and a long slice gets an allocation of its own.
func TestBlock(t *testing.T) {
	var b Block[int]
	x, y := b.One(), b.One()
	if x == y || *x != 0 || *y != 0 {
		t.Fatalf("One gave %p and %p", x, y)
	}
	s := b.Take(3)
	next := b.Take(2)
	if len(s) != 3 || cap(s) != 3 {
		t.Fatalf("Take(3): len %d cap %d", len(s), cap(s))
	}
	_ = append(s, 7)
	if next[0] != 0 {
		t.Fatalf("an append to one slice wrote into the next")
	}
	if c := b.Copy([]int{4, 5}); c[0] != 4 || c[1] != 5 || cap(c) != 2 {
		t.Fatalf("Copy gave %v (cap %d)", c, cap(c))
	}
	if b.Copy(nil) != nil || b.Take(0) != nil {
		t.Fatalf("an empty slice is nil")
	}

	sized := Block[int]{Min: 4, Max: 16}
	var lens []int
	for range 40 {
		sized.One()
		if len(sized.free) == sized.size-1 {
			lens = append(lens, sized.size)
		}
	}
	want := []int{4, 8, 16, 16}
	if len(lens) != len(want) {
		t.Fatalf("block lengths %v, want %v", lens, want)
	}
	for i := range want {
		if lens[i] != want[i] {
			t.Fatalf("block lengths %v, want %v", lens, want)
		}
	}
	free := len(sized.free)
	if long := sized.Take(5); len(long) != 5 || len(sized.free) != free {
		t.Fatalf("a slice longer than a quarter of the largest block came from the block")
	}

	var r Block[int]
	r.Reserve(100)
	if len(r.free) != 100 {
		t.Fatalf("Reserve(100) made a block of %d", len(r.free))
	}
	for range 100 {
		r.One()
	}
	r.One()
	if r.size != 16 || len(r.free) != 15 {
		t.Fatalf("after a reserve the next block is %d long, want 16 (growth unchanged)", r.size)
	}
}
