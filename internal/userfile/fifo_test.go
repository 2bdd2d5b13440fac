//go:build unix

package userfile

import (
	"errors"
	"path/filepath"
	"syscall"
	"testing"
)

// TestFIFO: a named pipe that no one writes is refused at once, never
// opened for a blocking read.
func TestFIFO(t *testing.T) {
	p := filepath.Join(t.TempDir(), "pipe.sheaf")
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
	var err error
	within(t, func() { _, err = ReadFile(p, 1<<20) })
	var nr *NotRegularError
	if !errors.As(err, &nr) || err.Error() != p+" is a named pipe (FIFO), not a regular file" {
		t.Errorf("got %v", err)
	}
	within(t, func() {
		f, e := openNonblock(p)
		if e == nil {
			f.Close()
		}
		err = e
	})
	if err != nil {
		t.Errorf("a non-blocking open of a FIFO: %v", err)
	}
}
