// Package parallel splits a loop over [0, n) into contiguous chunks, one per
// core, for the phases of the engine that work on every cell of a sheet
// independently (checking formulas, compiling cells). Each chunk writes only
// its own indices, so results do not depend on the schedule.
package parallel

import (
	"runtime"
	"sync"
)

// maxWorkers caps the goroutines: past a handful of cores the chunks get too
// small for the start-up cost to pay.
const maxWorkers = 8

// Chunks runs work over [0, n) in contiguous chunks, one per core, when n
// is at least minN and there is more than one core; otherwise it calls
// work(0, n) in the calling goroutine. It returns when every chunk is done.
func Chunks(n, minN int, work func(lo, hi int)) {
	workers := min(runtime.GOMAXPROCS(0), maxWorkers)
	if n < minN || workers < 2 {
		work(0, n)
		return
	}
	var wg sync.WaitGroup
	chunk := (n + workers - 1) / workers
	for lo := 0; lo < n; lo += chunk {
		wg.Add(1)
		go func(lo, hi int) {
			defer wg.Done()
			work(lo, hi)
		}(lo, min(lo+chunk, n))
	}
	wg.Wait()
}
