package userfile

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
)

// NotRegularError is a path that names something other than a regular
// file: a folder, a named pipe, a device, a socket.
type NotRegularError struct {
	Path string
	Mode fs.FileMode
}

func (e *NotRegularError) Error() string {
	return fmt.Sprintf("%s is %s, not a regular file", e.Path, Describe(e.Mode))
}

// TooLargeError is a regular file above the size limit.
type TooLargeError struct {
	Path        string
	Size, Limit int64
}

func (e *TooLargeError) Error() string {
	return fmt.Sprintf("%s is too large: %d bytes, the limit is %d", e.Path, e.Size, e.Limit)
}

// Describe names the kind of file a mode stands for, with its article:
// "a folder", "a named pipe (FIFO)", "a device", ...
func Describe(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&fs.ModeCharDevice != 0:
		return "a character device"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeSymlink != 0:
		return "a symbolic link"
	case m.IsRegular():
		return "a regular file"
	}
	return "a special file"
}

// Check reports whether path names a regular file of at most limit bytes
// (following symbolic links), and returns its information. It opens
// nothing.
func Check(path string, limit int64) (fs.FileInfo, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	return fi, check(path, fi, limit)
}

func check(path string, fi fs.FileInfo, limit int64) error {
	if !fi.Mode().IsRegular() {
		return &NotRegularError{Path: path, Mode: fi.Mode()}
	}
	if limit >= 0 && fi.Size() > limit {
		return &TooLargeError{Path: path, Size: fi.Size(), Limit: limit}
	}
	return nil
}

// ReadFile reads the regular file at path, of at most limit bytes (a
// negative limit means none). The file is checked before it is opened,
// opened without blocking (a FIFO put in its place after the check does
// not hang the open), checked again once open, and read no further than
// the limit, so a file that grows while it is read is refused too.
func ReadFile(path string, limit int64) ([]byte, error) {
	data, _, err := ReadFileInfo(path, limit)
	return data, err
}

// ReadFileInfo is ReadFile that also returns the information of the file
// as opened, for a caller that later checks it is unchanged (Unchanged).
func ReadFileInfo(path string, limit int64) ([]byte, fs.FileInfo, error) {
	if _, err := Check(path, limit); err != nil {
		return nil, nil, err
	}
	f, err := openNonblock(path)
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, nil, err
	}
	if err := check(path, fi, limit); err != nil {
		return nil, nil, err
	}
	data, err := readLimited(f, path, fi.Size(), limit)
	return data, fi, err
}

// ReadAll reads r (standard input, say) named name, at most limit bytes.
func ReadAll(r io.Reader, name string, limit int64) ([]byte, error) {
	return readLimited(r, name, 0, limit)
}

func readLimited(r io.Reader, name string, size, limit int64) ([]byte, error) {
	if limit < 0 {
		return io.ReadAll(r)
	}
	buf := make([]byte, 0, min(size, limit)+1)
	lr := &io.LimitedReader{R: r, N: limit + 1}
	for {
		if len(buf) == cap(buf) {
			buf = append(buf, 0)[:len(buf)]
		}
		n, err := lr.Read(buf[len(buf):cap(buf)])
		buf = buf[:len(buf)+n]
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
	}
	if int64(len(buf)) > limit {
		return nil, &TooLargeError{Path: name, Size: int64(len(buf)), Limit: limit}
	}
	return buf, nil
}

// Same reports whether the paths a and b name one file (after following
// symbolic links). A path that does not exist is no file, so Same is
// false for it.
func Same(a, b string) bool {
	fa, err := os.Stat(a)
	if err != nil {
		return false
	}
	fb, err := os.Stat(b)
	if err != nil {
		return false
	}
	return os.SameFile(fa, fb)
}

// Unchanged reports whether the file at path is still the one described by
// before: the same file, with the same size and modification time. A
// writer that replaces a file it read calls it just before the replace, so
// that an edit made meanwhile is not lost.
func Unchanged(path string, before fs.FileInfo) error {
	now, err := os.Stat(path)
	if err != nil {
		return err
	}
	if !os.SameFile(now, before) || now.Size() != before.Size() || !now.ModTime().Equal(before.ModTime()) {
		return ErrChanged
	}
	return nil
}

// ErrChanged says a file changed between reading and writing it.
var ErrChanged = errors.New("the file changed while it was being processed")
