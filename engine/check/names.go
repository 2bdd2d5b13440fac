package check

import "hash/maphash"

// nameIndex finds a cell of the program by its name. It is a table of cell
// indices, probed linearly from the name's hash and kept at most half full;
// the names themselves are read from the cells. A Go map from name to index
// held a string header and an int per cell, and the spare room of its
// groups, about 35 bytes per cell of the 100,000-cell benchmark; the table
// holds 8 to 16 (4 bytes a slot).
type nameIndex struct {
	seed  maphash.Seed
	slots []int32 // a cell index plus one; 0 is an empty slot
	n     int     // names held
}

// reserve makes room for n names in all without growing.
func (x *nameIndex) reserve(cells []*Cell, n int) {
	if 2*n > len(x.slots) {
		x.rehash(cells, n)
	}
}

// find returns the index of the cell named name.
func (x *nameIndex) find(cells []*Cell, name string) (int, bool) {
	if x.n == 0 {
		return 0, false
	}
	mask := len(x.slots) - 1
	for k := x.hash(name) & mask; ; k = (k + 1) & mask {
		s := x.slots[k]
		if s == 0 {
			return 0, false
		}
		if cells[s-1].Name == name {
			return int(s - 1), true
		}
	}
}

// add records cell i under its name, which the index does not hold yet.
func (x *nameIndex) add(cells []*Cell, i int) {
	if 2*(x.n+1) > len(x.slots) {
		x.rehash(cells, x.n+1)
	}
	x.put(cells[i].Name, i)
	x.n++
}

func (x *nameIndex) put(name string, i int) {
	mask := len(x.slots) - 1
	k := x.hash(name) & mask
	for x.slots[k] != 0 {
		k = (k + 1) & mask
	}
	x.slots[k] = int32(i + 1)
}

// rehash makes a table for at least n names, twice as many slots rounded
// up to a power of two, and puts the names held back in it.
func (x *nameIndex) rehash(cells []*Cell, n int) {
	if len(x.slots) == 0 {
		x.seed = maphash.MakeSeed()
	}
	size := 16
	for size < 2*n {
		size *= 2
	}
	old := x.slots
	x.slots = make([]int32, size)
	for _, s := range old {
		if s != 0 {
			x.put(cells[s-1].Name, int(s-1))
		}
	}
}

func (x *nameIndex) hash(name string) int { return int(maphash.String(x.seed, name)) }
