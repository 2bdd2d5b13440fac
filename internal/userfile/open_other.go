//go:build !unix

package userfile

import "os"

// openNonblock opens path for reading. Outside Unix a named pipe is not a
// path in the file system, so the check before opening is enough.
func openNonblock(path string) (*os.File, error) {
	return os.Open(path)
}
