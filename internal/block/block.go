// Package block hands out many small values, or slices of them, from
// shared blocks: one allocation per block rather than per value.
//
// A large sheet holds hundreds of thousands of cells, formulas and typed
// nodes that all live as long as the program does; allocating each on its
// own made loading a 100,000-cell sheet spend much of its time in the
// allocator and the garbage collector (BenchmarkLoadCheckEval100k in
// engine). A block never pins memory that would otherwise be freed only
// when its values share a lifetime, which is the case it is meant for.
//
// Each Block grows on its own: from Min values, doubling up to Max, so a
// small sheet stays small and a large one makes few blocks. A Block is
// used from one goroutine.
package block

// Block hands out values of type T. The zero Block grows from 16 values
// to 4096; set Min and Max before the first use to change that.
type Block[T any] struct {
	Min, Max int
	free     []T
	size     int // length of the last block made
}

// limits returns the smallest and the largest block length.
func (b *Block[T]) limits() (lo, hi int) {
	lo, hi = b.Min, b.Max
	if lo <= 0 {
		lo = 16
	}
	if hi < lo {
		hi = max(lo, 4096)
	}
	return lo, hi
}

// grow makes the next block, of at least need values.
func (b *Block[T]) grow(need int) {
	lo, hi := b.limits()
	b.size = min(max(2*b.size, lo), hi)
	b.free = make([]T, max(b.size, need))
}

// Reserve makes room for n more values in one block when the current one
// has less, for a caller that knows how many it will take. The growth of
// later blocks is unchanged.
func (b *Block[T]) Reserve(n int) {
	if n > len(b.free) {
		b.free = make([]T, n)
	}
}

// One returns a pointer to a new zero value.
func (b *Block[T]) One() *T {
	if len(b.free) == 0 {
		b.grow(1)
	}
	v := &b.free[0]
	b.free = b.free[1:]
	return v
}

// Take returns a slice of n zero values with no spare capacity, so an
// append to it copies rather than writing into the next slice handed out.
// A slice longer than a quarter of the largest block gets an allocation of
// its own, so a block is never mostly one slice.
func (b *Block[T]) Take(n int) []T {
	if n == 0 {
		return nil
	}
	if _, hi := b.limits(); n > hi/4 {
		return make([]T, n)
	}
	if n > len(b.free) {
		b.grow(n)
	}
	s := b.free[:n:n]
	b.free = b.free[n:]
	return s
}

// Copy returns a copy of src from the block (nil when src is empty), with
// no spare capacity.
func (b *Block[T]) Copy(src []T) []T {
	s := b.Take(len(src))
	copy(s, src)
	return s
}
