package formula

// Arena hands out the slices of many formulas from shared blocks. Parsing
// a formula on its own allocates five small slices; a sheet of 100,000
// cells parsed so spends much of its time in the allocator and the
// garbage collector (BenchmarkLoadCheckEval100k, engine/bench_test.go).
// With an Arena the parser works in slices it reuses and copies each
// result into a block at its exact length, so a formula takes no spare
// capacity and no allocation of its own. The slices have no spare
// capacity: an append by a caller copies, never writes into the next
// formula. An Arena is used from one goroutine; its formulas live as long
// as any of them is reachable.
type Arena struct {
	scratch Formula // the slices the parser appends to, reused
	nodes   []Node
	args    []int32
	nums    []float64
	quants  []Quantity
	refs    []int32
	block   int // length of the next block: grows so small programs stay small
}

const maxArenaBlock = 4096

func (a *Arena) grow() int {
	a.block = min(max(2*a.block, 32), maxArenaBlock)
	return a.block
}

// keep copies the parsed slices of f (held in the scratch slices) into
// the arena's blocks.
func (a *Arena) keep(f *Formula) {
	f.Nodes = take(a, &a.nodes, f.Nodes)
	f.Args = take(a, &a.args, f.Args)
	f.Nums = take(a, &a.nums, f.Nums)
	f.Quantities = take(a, &a.quants, f.Quantities)
	f.Refs = take(a, &a.refs, f.Refs)
}

// take returns a copy of src cut from the block (nil when src is empty).
func take[T any](a *Arena, block *[]T, src []T) []T {
	n := len(src)
	if n == 0 {
		return nil
	}
	if n > len(*block) {
		if n > maxArenaBlock/4 {
			return append([]T(nil), src...)
		}
		*block = make([]T, max(a.grow(), n))
	}
	out := (*block)[:n:n]
	*block = (*block)[n:]
	copy(out, src)
	return out
}
