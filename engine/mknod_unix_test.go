//go:build linux

package engine_test

import "syscall"

// mknodZero makes a character device like /dev/zero (major 1, minor 5 on
// Linux) at p.
func mknodZero(p string) error {
	return syscall.Mknod(p, syscall.S_IFCHR|0o644, 1<<8|5)
}
