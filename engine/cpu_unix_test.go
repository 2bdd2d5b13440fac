//go:build unix

package engine_test

import (
	"syscall"
	"time"
)

// processCPU is the CPU time the process has used, user and system, on
// all threads: the garbage collector's work on the other core counts.
func processCPU() time.Duration {
	var u syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &u) != nil {
		return 0
	}
	return time.Duration(u.Utime.Nano() + u.Stime.Nano())
}
