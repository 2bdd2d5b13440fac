package xlsxout

import (
	"bytes"
	"io"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
	"github.com/sheafcalc/sheaf/internal/opc"
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
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		return stats, err
	}
	pkg, err := opc.Canonical(buf.Bytes())
	if err != nil {
		return stats, err
	}
	return stats, writeAtomic(path, func(w io.Writer) error {
		_, err := w.Write(pkg)
		return err
	})
}

// writeAtomic writes the workbook file whole or not at all, readable by
// everyone as a workbook handed to a client is (see package atomicfile).
func writeAtomic(path string, write func(io.Writer) error) error {
	return atomicfile.Write(path, 0o644, write)
}
