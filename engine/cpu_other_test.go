//go:build !unix

package engine_test

import "time"

// processCPU is not measured here; the benchmarks then report no CPU time.
func processCPU() time.Duration { return 0 }
