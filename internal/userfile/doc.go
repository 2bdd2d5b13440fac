// Package userfile reads a file a user named — a sheet, a template, a case
// table — safely: only a regular file is read, its size is checked before
// a byte is read and again while reading, and a named pipe (FIFO) or a
// device is refused without blocking on its open. Every command of Sheaf
// reads its users' files through ReadFile, so a FIFO, /dev/zero or a huge
// sparse file gives a clear error rather than a hang or an out-of-memory
// crash. Same tells whether two paths are one file, so that no command
// writes over a file it reads. Standard library only.
package userfile
