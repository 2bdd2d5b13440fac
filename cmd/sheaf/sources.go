package main

import (
	"fmt"
	"io"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/plural"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// reportProblems renders the diagnostics of the file name, with their
// snippets from srcs, and closes with their count ("2 problems in
// hanger.sheaf") and then after (e.g. "; not formatted").
func reportProblems(w io.Writer, list diag.List, srcs diag.Sources, name, after string) {
	_ = diag.Render(w, list, srcs)
	fmt.Fprintf(w, "%s in %s%s\n", plural.Count(len(list), "problem"), name, after)
}

// sourcesFor gives the text of every file the diagnostics name, so that a
// problem inside a template gets its snippet too. The sheet compiled from
// memory (name, src) wins over its copy on disk, which may have changed since.
func sourcesFor(list diag.List, name string, src []byte) diag.Sources {
	srcs := engine.ReadSources(list)
	srcs[name] = src
	return srcs
}

// readUserFile reads a sheet or table a user named: a regular file of at
// most limit bytes (internal/userfile), never a FIFO or a device. Its
// errors are input errors.
func readUserFile(path string, limit int64) ([]byte, error) {
	src, err := userfile.ReadFile(path, limit)
	if err != nil {
		return nil, &inputError{err}
	}
	return src, nil
}
