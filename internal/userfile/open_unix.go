//go:build unix

package userfile

import (
	"os"
	"syscall"
)

// openNonblock opens path for reading with O_NONBLOCK, so that opening a
// FIFO that no one writes returns at once instead of waiting for a writer.
// For a regular file the flag changes nothing.
func openNonblock(path string) (*os.File, error) {
	return os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
}
