package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"path/filepath"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// fmtOptions are the flags of `sheaf fmt`.
type fmtOptions struct {
	check bool
}

func newFmtCmd(a *app) *cobra.Command {
	o := &fmtOptions{}
	cmd := &cobra.Command{
		Use:   "fmt [--check] FILE...",
		Short: "Rewrite sheets in the canonical layout",
		Long: `Fmt rewrites each sheet in the one canonical layout: header values
aligned, the unit, = and -- columns of neighbouring cells aligned, one blank
line before each heading, table columns right-aligned, continuation lines
indented four spaces. Names, units, numbers, expressions and comments are
kept exactly as written; nothing is dropped. Formatting twice changes
nothing.

Each file is replaced whole (a temporary file renamed over it, keeping its
permissions), and only when its text changes and it still holds the text
that was formatted (a file edited meanwhile is left alone, with a message);
the names of the files rewritten are printed. A symbolic link stays a link:
the file it leads to is formatted. Only regular files are read. A file with syntax errors is left alone and its
errors are shown. With --check nothing is written: the files that are not
in canonical layout are listed. FILE - reads stdin and writes stdout.

Exit status here: 0 when done (with --check: every file is canonical), 1 with
--check when a file would change, 2 when a file cannot be read or has
syntax errors.`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runFmt(a, o, args)
		},
	}
	cmd.Flags().BoolVar(&o.check, "check", false, "list the files that would change and write nothing")
	return cmd
}

func runFmt(a *app, o *fmtOptions, files []string) error {
	broken, changed := 0, 0
	var firstErr error
	for _, path := range files {
		ch, err := fmtFile(a, o, path)
		if err != nil {
			broken++
			if firstErr == nil {
				firstErr = err
			}
			var rep *reportedError
			if !errors.As(err, &rep) {
				fmt.Fprintf(a.stderr, "sheaf: %v\n", err)
			}
			continue
		}
		if ch {
			changed++
		}
	}
	switch {
	case broken > 0:
		return &reportedError{firstErr, exitInput}
	case o.check && changed > 0:
		return &reportedError{fmt.Errorf("%d files are not in canonical layout", changed), exitChecks}
	}
	return nil
}

// fmtFile formats one file and reports whether it changed (or would).
func fmtFile(a *app, o *fmtOptions, path string) (bool, error) {
	if path == "-" {
		src, err := userfile.ReadAll(a.stdin, "stdin", sheet.DefaultMaxBytes)
		if err != nil {
			return false, &inputError{err}
		}
		out, err := formatReported(a, "stdin", src)
		if err != nil {
			return false, err
		}
		if o.check {
			if !bytes.Equal(out, src) {
				fmt.Fprintln(a.stdout, "stdin")
				return true, nil
			}
			return false, nil
		}
		_, err = a.stdout.Write(out)
		return false, err
	}
	// A symbolic link stays a link: the file it leads to is formatted.
	target := path
	if real, err := filepath.EvalSymlinks(path); err == nil {
		target = real
	}
	src, fi, err := userfile.ReadFileInfo(target, sheet.DefaultMaxBytes)
	if err != nil {
		if target != path {
			err = fmt.Errorf("%s (the file %s links to): %w", target, path, err)
		}
		return false, &inputError{err}
	}
	out, err := formatReported(a, path, src)
	if err != nil {
		return false, err
	}
	if bytes.Equal(out, src) {
		return false, nil
	}
	fmt.Fprintln(a.stdout, path)
	if o.check {
		return true, nil
	}
	// The file is replaced only if it still holds what was formatted: an
	// edit saved meanwhile (an editor, another fmt) is never lost.
	unchanged := func() error {
		if a.beforeReplace != nil {
			a.beforeReplace(target)
		}
		now, err := userfile.ReadFile(target, sheet.DefaultMaxBytes)
		if err == nil {
			err = userfile.Unchanged(target, fi)
		}
		if err != nil || !bytes.Equal(now, src) {
			return userErrorf("%s changed while it was being formatted, so it was left as it is; run sheaf fmt again", path)
		}
		return nil
	}
	write := func(w io.Writer) error { _, err := w.Write(out); return err }
	if err := atomicfile.WriteChecked(target, fi.Mode().Perm(), write, unchanged); err != nil {
		var ie *inputError
		if errors.As(err, &ie) {
			return false, err
		}
		return false, fmt.Errorf("cannot rewrite %s: %w", path, err)
	}
	return true, nil
}

// formatReported formats src, rendering its syntax errors to stderr.
func formatReported(a *app, name string, src []byte) ([]byte, error) {
	out, err := sheet.FormatSource(name, src)
	if err == nil {
		return out, nil
	}
	var list diag.List
	if errors.As(err, &list) {
		reportProblems(a.stderr, list, diag.Sources{name: src}, name, "; not formatted")
		return nil, &reportedError{err, exitInput}
	}
	return nil, &inputError{err}
}
