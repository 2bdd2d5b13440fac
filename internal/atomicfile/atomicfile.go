package atomicfile

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sync"
	"sync/atomic"
)

// ErrAborted is the error of a Write that Abort stopped.
var ErrAborted = errors.New("interrupted: the file was not written")

// The temporary files being written, so that Abort can remove them when
// the process is told to stop.
var (
	mu      sync.Mutex
	live    = map[string]bool{}
	aborted bool
	stopped atomic.Bool // aborted, read without the lock by abortWriter
)

// Write writes the file at path through write and gives it mode perm. On
// any error, including one returned by write, the temporary file is
// removed and path is left untouched. When path is a symbolic link, the
// file it leads to is written and the link stays.
func Write(path string, perm os.FileMode, write func(io.Writer) error) error {
	return WriteChecked(path, perm, write, nil)
}

// WriteChecked is Write that calls ready, when not nil, once the new text
// is safely on disk and just before it replaces path; an error from ready
// leaves path untouched. A command that rewrites a file it read (fmt) uses
// it to make sure no one changed the file meanwhile.
func WriteChecked(path string, perm os.FileMode, write func(io.Writer) error, ready func() error) (err error) {
	// A symbolic link stays a link: the file it leads to is replaced. Only
	// a regular file is replaced; a folder, a device or a pipe is refused.
	if real, err := filepath.EvalSymlinks(path); err == nil {
		path = real
	}
	if fi, err := os.Stat(path); err == nil && !fi.Mode().IsRegular() {
		what := "not a regular file"
		if fi.IsDir() {
			what = "a folder"
		}
		return fmt.Errorf("%s is %s; only a regular file is replaced", path, what)
	}
	dir := filepath.Dir(path)
	mu.Lock()
	if aborted {
		mu.Unlock()
		return ErrAborted
	}
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		mu.Unlock()
		return fmt.Errorf("cannot write in %s: %w", dir, err)
	}
	name := tmp.Name()
	live[name] = true
	mu.Unlock()
	defer func() {
		mu.Lock()
		delete(live, name)
		mu.Unlock()
		if err != nil {
			_ = tmp.Close()
			_ = os.Remove(name)
		}
	}()
	if err = write(abortWriter{tmp}); err != nil {
		return err
	}
	if err = tmp.Sync(); err != nil {
		return err
	}
	// CreateTemp makes the file 0600; the target gets the mode asked for.
	if err = tmp.Chmod(perm); err != nil {
		return err
	}
	if err = tmp.Close(); err != nil {
		return err
	}
	if ready != nil {
		if err = ready(); err != nil {
			return err
		}
	}
	mu.Lock()
	defer mu.Unlock()
	if aborted {
		return ErrAborted
	}
	return os.Rename(name, path)
}

// abortWriter fails every write once Abort was called, so that a long
// write stops soon after an interrupt.
type abortWriter struct{ f *os.File }

func (w abortWriter) Write(p []byte) (int, error) {
	if stopped.Load() {
		return 0, ErrAborted
	}
	return w.f.Write(p)
}

// WriteFile is Write for bytes in hand, in the manner of os.WriteFile.
func WriteFile(path string, data []byte, perm os.FileMode) error {
	return Write(path, perm, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// Abort removes every temporary file being written and makes every Write
// still running fail with ErrAborted instead of replacing its target, now
// and from now on. A command calls it when it is interrupted (SIGINT,
// SIGTERM): the targets stay as they were, and no temporary file is left
// behind. It returns the number of files removed.
func Abort() int {
	mu.Lock()
	defer mu.Unlock()
	aborted = true
	stopped.Store(true)
	n := 0
	for name := range live {
		if os.Remove(name) == nil {
			n++
		}
		delete(live, name)
	}
	return n
}
