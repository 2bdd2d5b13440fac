//go:build unix

package main

import (
	"syscall"
	"testing"
)

// mkSpecial makes a named pipe (FIFO) at p.
func mkSpecial(t *testing.T, p string) {
	t.Helper()
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
}
