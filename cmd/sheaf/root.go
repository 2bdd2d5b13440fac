package main

import (
	"errors"
	"fmt"
	"io"
	"runtime/debug"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Exit codes scripts can rely on.
const (
	exitOK       = 0 // everything ran and every design check passed
	exitChecks   = 1 // a design check failed (or a diff flipped a check to fail)
	exitInput    = 2 // the input is wrong: sheet errors, bad flags, bad files
	exitInternal = 3 // a fault in Sheaf itself
)

// version is set at build time with -ldflags "-X main.version=..."; otherwise
// the module version from the build info is used.
var version = ""

// app carries what every command shares: the injected streams.
type app struct {
	stdin  io.Reader
	stdout io.Writer
	stderr io.Writer
}

// checksFailedError reports that evaluation succeeded but design checks failed.
type checksFailedError struct{ n int }

func (e *checksFailedError) Error() string { return plural.Count(e.n, "design check") + " failed" }

// inputError is a problem with what the user gave: flags, files, sheets.
// A diag.List is also an input error; it is rendered with snippets before.
type inputError struct{ err error }

func (e *inputError) Error() string { return e.err.Error() }
func (e *inputError) Unwrap() error { return e.err }

// userErrorf builds an inputError.
func userErrorf(format string, args ...any) error {
	return &inputError{fmt.Errorf(format, args...)}
}

// reportedError marks an error whose details were already written to stderr
// (for example rendered diagnostics); only its exit code matters.
type reportedError struct {
	err  error
	code int
}

func (e *reportedError) Error() string { return e.err.Error() }
func (e *reportedError) Unwrap() error { return e.err }

// exitCode is the one place where typed errors map to exit codes.
func exitCode(err error) int {
	var (
		rep    *reportedError
		checks *checksFailedError
		input  *inputError
		list   diag.List
	)
	switch {
	case err == nil:
		return exitOK
	case errors.As(err, &rep):
		return rep.code
	case errors.As(err, &checks):
		return exitChecks
	case errors.As(err, &input), errors.As(err, &list):
		return exitInput
	}
	return exitInternal
}

func versionString() string {
	if version != "" {
		return version
	}
	if bi, ok := debug.ReadBuildInfo(); ok && bi.Main.Version != "" && bi.Main.Version != "(devel)" {
		return bi.Main.Version
	}
	return "devel"
}

// newRootCmd builds the command tree around injected streams.
func newRootCmd(a *app) *cobra.Command {
	root := &cobra.Command{
		Use:   "sheaf",
		Short: "Check, evaluate and export calculation sheets for axially loaded members",
		Long: `Sheaf reads a calculation sheet of named cells with units, checks every
dimension before anything runs, evaluates the cells in dependency order, runs
the design checks and writes results as text, JSON or a client workbook.

Results must be checked by a qualified engineer; limits, factors and load
combinations come from the local code and licensed practice.`,
		Version:       versionString(),
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetIn(a.stdin)
	root.SetOut(a.stdout)
	root.SetErr(a.stderr)
	root.SetFlagErrorFunc(func(_ *cobra.Command, err error) error {
		return &inputError{err}
	})
	root.AddCommand(
		newUnitsCmd(a),
		newRunCmd(a),
		newCheckCmd(a),
		newFuncsCmd(a),
		newExportCmd(a),
		newBatchCmd(a),
		newDiffCmd(a),
		newFmtCmd(a),
		newWatchCmd(a),
		newNewCmd(a),
		newLspCmd(a),
	)
	return root
}

// Main runs the command line and returns the process exit code.
func Main(args []string, stdin io.Reader, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "sheaf: internal error: %v\n%s\nplease report this with the sheet that caused it\n", r, debug.Stack())
			code = exitInternal
		}
	}()
	a := &app{stdin: stdin, stdout: stdout, stderr: stderr}
	root := newRootCmd(a)
	root.SetArgs(args)
	err := root.Execute()
	if err != nil {
		var rep *reportedError
		if !errors.As(err, &rep) {
			fmt.Fprintf(stderr, "sheaf: %v\n", err)
		}
	}
	return exitCode(err)
}
