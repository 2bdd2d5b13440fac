package main

import (
	"bytes"
	"io"
	"os"
	"path/filepath"
)

// writeAtomic writes a file by writing a temporary file in the same
// directory and renaming it over path, so a reader (or a crash) never sees
// half a file, and a failed write leaves the old file as it was. The new
// file gets mode perm.
func writeAtomic(path string, perm os.FileMode, write func(io.Writer) error) (err error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	tmp, err := os.CreateTemp(dir, "."+base+".*.tmp")
	if err != nil {
		return err
	}
	defer func() {
		if err != nil {
			_ = tmp.Close()
			_ = os.Remove(tmp.Name())
		}
	}()
	if err = write(tmp); err != nil {
		return err
	}
	if err = tmp.Sync(); err != nil {
		return err
	}
	if err = tmp.Chmod(perm); err != nil {
		return err
	}
	if err = tmp.Close(); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}

// writeFileAtomic is writeAtomic for bytes in hand.
func writeFileAtomic(path string, data []byte, perm os.FileMode) error {
	return writeAtomic(path, perm, func(w io.Writer) error {
		_, err := io.Copy(w, bytes.NewReader(data))
		return err
	})
}
