package parallel

import (
	"sync/atomic"
	"testing"
)

// TestChunksCoverEveryIndexOnce: every index is visited exactly once,
// whether the loop runs in chunks or inline.
func TestChunksCoverEveryIndexOnce(t *testing.T) {
	for _, tt := range []struct{ n, minN int }{{0, 1}, {1, 1}, {7, 100}, {1000, 1}, {1001, 10}} {
		seen := make([]int32, tt.n)
		Chunks(tt.n, tt.minN, func(lo, hi int) {
			for i := lo; i < hi; i++ {
				atomic.AddInt32(&seen[i], 1)
			}
		})
		for i, s := range seen {
			if s != 1 {
				t.Fatalf("n=%d minN=%d: index %d visited %d times", tt.n, tt.minN, i, s)
			}
		}
	}
}
