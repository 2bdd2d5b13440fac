package check

import (
	"runtime"
	"sync"
	"unsafe"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// arena hands out the typed nodes of a program from blocks, and shares one
// number type per dimension. A sheet of 100,000 cells types about a million
// nodes: one allocation per node (and one per argument list) made checking
// a large sheet slow, mostly by the memory it took up fresh. The program
// keeps every node for its whole life, so a block never pins memory that
// would otherwise be freed. An arena belongs to one checker and is used
// from one goroutine.
type arena struct {
	nodes []Node
	args  []*Node
	block int // size of the next block; grows so small programs stay small
	nums  map[units.Dim]*funcs.Type
	pre   *prefetch // nil unless typing a large sheet
}

const maxBlock = 1024

func (a *arena) grow() int {
	a.block = min(max(2*a.block, 16), maxBlock)
	return a.block
}

// node returns a new node holding a copy of args.
func (a *arena) node() *Node {
	if len(a.nodes) == 0 {
		if a.pre != nil {
			a.nodes = a.pre.nodeBlock()
		} else {
			a.nodes = make([]Node, a.grow())
		}
	}
	n := &a.nodes[0]
	a.nodes = a.nodes[1:]
	return n
}

// argList returns a copy of args with no spare capacity, so an append by
// a later phase cannot write into the next node's arguments.
func (a *arena) argList(args []*Node) []*Node {
	k := len(args)
	if k == 0 {
		return nil
	}
	if k > maxBlock/4 {
		return append([]*Node(nil), args...)
	}
	if len(a.args) < k {
		if a.pre != nil {
			a.args = a.pre.argBlock()
		} else {
			a.args = make([]*Node, max(a.grow(), k))
		}
	}
	out := a.args[:k:k]
	a.args = a.args[k:]
	copy(out, args)
	return out
}

// num returns the number type of dimension d, shared by every node of that
// dimension (types are never modified once made).
func (a *arena) num(d units.Dim) *funcs.Type {
	if d == units.None {
		return numNone
	}
	if t, ok := a.nums[d]; ok {
		return t
	}
	if a.nums == nil {
		a.nums = map[units.Dim]*funcs.Type{}
	}
	t := funcs.Num(d)
	a.nums[d] = t
	return t
}

// prefetch makes the arena's blocks on another goroutine while the checker
// types a large sheet. Typing runs in dependency order on one goroutine,
// and the first write to a fresh block is most of what a node costs on a
// machine slow to hand out memory (a 100,000-cell sheet types about 70 MB
// of nodes); the helper takes those first writes on another core.
type prefetch struct {
	nodes chan []Node
	args  chan []*Node
	stop  chan struct{}
	wg    sync.WaitGroup
}

// minPrefetch is the number of cells from which typing prefetches blocks.
const minPrefetch = 2000

// startPrefetch starts the helper when cells cells are to be typed and
// there is a core to spare; stopPrefetch must follow.
func (a *arena) startPrefetch(cells int) {
	if cells < minPrefetch || runtime.GOMAXPROCS(0) < 2 {
		return
	}
	p := &prefetch{nodes: make(chan []Node, 4), args: make(chan []*Node, 4), stop: make(chan struct{})}
	p.wg.Add(1)
	go func() {
		defer p.wg.Done()
		nb, ab := touchedNodes(), touchedArgs()
		for {
			select {
			case p.nodes <- nb:
				nb = touchedNodes()
			case p.args <- ab:
				ab = touchedArgs()
			case <-p.stop:
				return
			}
		}
	}()
	a.pre = p
}

// nodeBlock returns a block the helper made, or makes one when the helper
// is behind: the two goroutines then write fresh memory side by side
// rather than one waiting for the other.
func (p *prefetch) nodeBlock() []Node {
	select {
	case b := <-p.nodes:
		return b
	default:
		return make([]Node, maxBlock)
	}
}

// argBlock is nodeBlock for argument lists.
func (p *prefetch) argBlock() []*Node {
	select {
	case b := <-p.args:
		return b
	default:
		return make([]*Node, maxBlock)
	}
}

// stopPrefetch stops the helper; the blocks it made ahead are dropped.
func (a *arena) stopPrefetch() {
	if a.pre == nil {
		return
	}
	close(a.pre.stop)
	a.pre.wg.Wait()
	a.pre = nil
}

// pageBytes is the page size the first writes are spaced by (a smaller
// real page only means more of the block is left to the checker).
const pageBytes = 4096

// touchedNodes returns a block of nodes with a write on each page.
func touchedNodes() []Node {
	b := make([]Node, maxBlock)
	step := max(1, pageBytes/int(unsafe.Sizeof(Node{})))
	for i := 0; i < len(b); i += step {
		b[i].Index = 0
	}
	return b
}

// touchedArgs returns a block of argument slots with a write on each page.
func touchedArgs() []*Node {
	b := make([]*Node, maxBlock)
	step := pageBytes / int(unsafe.Sizeof((*Node)(nil)))
	for i := 0; i < len(b); i += step {
		b[i] = nil
	}
	return b
}
