package xlsxout

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/sheafcalc/sheaf/engine"
)

// WriteFile builds the workbook and writes it to path. The bytes go to a
// temporary file in the same directory, which is renamed over path only
// once it is complete: an existing workbook is never left half-written.
func WriteFile(path string, s *engine.Sheet, r *engine.Results, opt Options) (Stats, error) {
	f, stats, err := Build(s, r, opt)
	if err != nil {
		return stats, err
	}
	defer f.Close()
	return stats, writeAtomic(path, func(w io.Writer) error {
		_, err := f.WriteTo(w)
		return err
	})
}

// writeAtomic writes through write to a temporary file beside path and
// renames it to path on success; on failure it removes the temporary file
// and leaves path as it was.
func writeAtomic(path string, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("cannot write in %s: %w", dir, err)
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
	if err = tmp.Close(); err != nil {
		return err
	}
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}
