package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"runtime/debug"
	"sync/atomic"
	"syscall"
	"time"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
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
	// beforeReplace, when not nil, is called by fmt just before it checks
	// that a file is unchanged and replaces it (tests edit the file there).
	beforeReplace func(path string)
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
		newReportCmd(a),
		newBatchCmd(a),
		newDiffCmd(a),
		newFmtCmd(a),
		newWatchCmd(a),
		newNewCmd(a),
	)
	return root
}

// Main runs the command line and returns the process exit code.
//
// SIGINT and SIGTERM stop the command: the temporary files of the writes
// under way are removed at once (atomicfile.Abort), so the files they were
// to replace stay as they were, and the command's context is cancelled. A
// command that then ends with an error (it was interrupted) exits with
// 128 + the signal number, as a shell reports it, after a message saying
// what was kept; one that ends cleanly (watch stops on Ctrl-C) exits as
// usual. A command that does not end within a grace period is ended.
func Main(args []string, stdin io.Reader, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "sheaf: internal error: %v\n%s\nplease report this with the sheet that caused it\n", r, debug.Stack())
			code = exitInternal
		}
	}()
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	defer signal.Stop(sigs)
	done := make(chan struct{})
	defer close(done)
	var caught atomic.Pointer[interrupt]
	go func() {
		select {
		case sig := <-sigs:
			in := &interrupt{sig: sig, removed: atomicfile.Abort()}
			caught.Store(in)
			cancel()
			select {
			case <-done:
			case <-time.After(interruptGrace):
				fmt.Fprintln(stderr, in.message())
				os.Exit(in.code())
			}
		case <-done:
		}
	}()

	a := &app{stdin: stdin, stdout: stdout, stderr: stderr}
	root := newRootCmd(a)
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if in := caught.Load(); in != nil && err != nil {
		fmt.Fprintln(stderr, in.message())
		return in.code()
	}
	if err != nil {
		var rep *reportedError
		if !errors.As(err, &rep) {
			fmt.Fprintf(stderr, "sheaf: %v\n", err)
		}
	}
	return exitCode(err)
}

// interruptGrace is how long an interrupted command may take to stop on
// its own before Main ends the process.
const interruptGrace = 2 * time.Second

// interrupt is a SIGINT or SIGTERM that stopped a command.
type interrupt struct {
	sig     os.Signal
	removed int // temporary files removed
}

func (in *interrupt) message() string {
	name := "SIGINT"
	if in.sig == syscall.SIGTERM {
		name = "SIGTERM"
	}
	return fmt.Sprintf("sheaf: stopped by %s: no file was left half-written (%s removed); files not yet replaced are as they were", name, plural.Count(in.removed, "temporary file"))
}

// code is the exit status a shell gives a process the signal ended: 130
// for SIGINT, 143 for SIGTERM.
func (in *interrupt) code() int {
	if s, ok := in.sig.(syscall.Signal); ok {
		return 128 + int(s)
	}
	return 128 + int(syscall.SIGINT)
}
