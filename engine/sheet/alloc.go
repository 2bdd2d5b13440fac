package sheet

import (
	"runtime"
	"sync"
	"unsafe"
)

// cellUnit holds a cell and its display unit: one allocation for both, as
// a long sheet is mostly cells.
type cellUnit struct {
	c Cell
	u UnitSpec
}

// cellBlock is the number of cells a prefetched block holds.
const cellBlock = 128

// minPrefetchLines is the number of lines from which Parse has a helper
// make the cells' memory ahead.
const minPrefetchLines = 2000

// cellPrefetch makes blocks of cells on another goroutine while a large
// sheet is parsed. Parsing runs line by line on one goroutine, and the
// first write to fresh memory is much of what a cell costs on a machine
// slow to hand out memory (a 100,000-cell sheet takes ~50 MB of cells); the
// helper takes those first writes on another core. The cells of a block
// are freed together, which suits a syntax tree that is dropped as a whole.
type cellPrefetch struct {
	blocks chan []cellUnit
	stop   chan struct{}
	wg     sync.WaitGroup
}

// startPrefetch starts the helper for a sheet of many lines when there is
// a core to spare; stopPrefetch must follow.
func (p *parser) startPrefetch() {
	if len(p.lines) < minPrefetchLines || runtime.GOMAXPROCS(0) < 2 {
		return
	}
	pf := &cellPrefetch{blocks: make(chan []cellUnit, 4), stop: make(chan struct{})}
	pf.wg.Add(1)
	go func() {
		defer pf.wg.Done()
		for {
			b := make([]cellUnit, cellBlock)
			step := max(1, 4096/int(unsafe.Sizeof(cellUnit{})))
			for i := 0; i < len(b); i += step {
				b[i].c.Range.Start.Line = 0 // the first write to the page
			}
			select {
			case pf.blocks <- b:
			case <-pf.stop:
				return
			}
		}
	}()
	p.pre = pf
}

// stopPrefetch stops the helper; the blocks it made ahead are dropped.
func (p *parser) stopPrefetch() {
	if p.pre == nil {
		return
	}
	close(p.pre.stop)
	p.pre.wg.Wait()
	p.pre = nil
	p.cells = nil
}

// newCell returns a zero cell with room for its unit.
func (p *parser) newCell() *cellUnit {
	if p.pre == nil {
		return &cellUnit{}
	}
	if len(p.cells) == 0 {
		// When the helper is behind, make a block here: the two
		// goroutines then write fresh memory side by side rather than one
		// waiting for the other.
		select {
		case p.cells = <-p.pre.blocks:
		default:
			p.cells = make([]cellUnit, cellBlock)
		}
	}
	a := &p.cells[0]
	p.cells = p.cells[1:]
	return a
}
