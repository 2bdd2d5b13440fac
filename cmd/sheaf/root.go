package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"runtime/debug"
	"slices"
	"strings"
	"sync/atomic"
	"syscall"
	"time"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/batch"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/diff"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Exit codes scripts can rely on (the table in exitTable, README and every
// command's help).
const (
	exitOK       = 0 // every design check passed and every cell was computed
	exitChecks   = 1 // a design check failed or cannot be assessed (or a diff flipped a check to fail)
	exitInput    = 2 // the input is wrong: sheet errors, a cell that could not be computed, bad flags, arguments or files, an unknown command
	exitInternal = 3 // a fault in Sheaf itself
)

// exitTable closes the help of every command: one table for all of them.
// Each command adds what its codes mean for it above it.
const exitTable = `
Exit status (the same for every command):
  0  every design check passes and every cell was computed
  1  a design check fails or cannot be assessed
  2  the input is wrong: a sheet error, a cell that could not be computed
     (unless --draft), a bad flag, argument or file, an unknown command
  3  a fault of Sheaf itself (please report it with the sheet)
When both 1 and 2 apply, the status is 2.`

// draftUsage is the help of the --draft flag of the commands that evaluate.
const draftUsage = "accept a draft: cells that cannot be computed are still reported, but exit 0 (or 1 for checks) instead of 2"

// resultsError is the error of an evaluation that ran: exit 2 when a cell
// could not be computed (unless draft), else 1 when a check fails or is
// not assessed, else nil. It writes the reason for a non-zero status to
// stderr, so that a CI log says why it stopped.
func resultsError(a *app, res *engine.Results, draft bool) error {
	err := resultsErrorQuiet(res, draft)
	if exitCode(err) == exitInput {
		fmt.Fprintf(a.stderr, "sheaf: %v\n", err)
	}
	return err
}

// resultsErrorQuiet is resultsError without the line on stderr.
func resultsErrorQuiet(res *engine.Results, draft bool) error {
	if n := res.Uncomputed(); n > 0 && !draft {
		err := fmt.Errorf("%s could not be computed: the calculation is not complete (--draft accepts it)", plural.Count(n, "cell"))
		return &reportedError{err, exitInput}
	}
	if n := res.Failed(); n > 0 {
		return &reportedError{&checksFailedError{n}, exitChecks}
	}
	return nil
}

// jsonFailure writes, for a command run with --json, the JSON document of
// an error that came before any results (a sheet that does not load, a bad
// --set, flag or file) on stdout, so that a JSON consumer always gets a
// document; the exit status stays what the error gives. Errors whose
// output was already written pass through.
func jsonFailure(a *app, schema, path string, err error) error {
	var rep *reportedError
	if err == nil || errors.As(err, &rep) {
		return err
	}
	code := exitCode(err)
	var problems []jsonout.Problem
	var se *sheetError
	if errors.As(err, &se) {
		for _, d := range se.list {
			problems = append(problems, jsonout.NewProblem(jsonout.KindSheet, d))
		}
	} else {
		kind := jsonout.KindInput
		if code == exitInternal {
			kind = "internal"
		}
		problems = append(problems, jsonout.Problem{Kind: kind, Severity: "error", File: path, Pos: path, Message: err.Error()})
	}
	if werr := jsonout.Encode(a.stdout, jsonout.Failure(schema, code, problems)); werr != nil {
		return werr
	}
	fmt.Fprintf(a.stderr, "sheaf: %v (the JSON on stdout has the details)\n", err)
	return &reportedError{err, code}
}

// inputArgs makes the argument check of a command an input error (exit 2)
// that says what the command takes.
func inputArgs(a *app, cmd *cobra.Command) {
	check := cmd.Args
	if check == nil {
		return
	}
	cmd.Args = func(c *cobra.Command, args []string) error {
		if err := check(c, args); err != nil {
			var in *inputError
			if errors.As(err, &in) {
				return jsonEarly(a, c, err)
			}
			return jsonEarly(a, c, userErrorf("%s: %v; usage: %s", c.Name(), err, c.UseLine()))
		}
		return nil
	}
}

// unknownCommand refuses the first argument of a command that takes none
// but subcommands (sheaf, sheaf completion) as an unknown command (exit 2),
// with the nearest one as a hint.
func unknownCommand(c *cobra.Command, args []string) error {
	if len(args) == 0 {
		return nil
	}
	msg := fmt.Sprintf("unknown command %q", args[0])
	if c.HasParent() {
		msg = fmt.Sprintf("unknown command %q for %q", args[0], c.CommandPath())
	}
	var names []string
	for _, sub := range c.Commands() {
		names = append(names, sub.Name())
	}
	if sug := diag.Nearest(args[0], names); sug != "" {
		msg += fmt.Sprintf("; did you mean %q?", sug)
	}
	return userErrorf("%s; see %s --help for the commands", msg, c.CommandPath())
}

// jsonSchemas names the JSON document of each command that has --json.
var jsonSchemas = map[string]string{
	"run": jsonout.Schema, "check": checkSchema, "diff": diff.Schema, "batch": batch.Schema, "funcs": funcsSchema,
}

// jsonEarly turns an error found before a command runs (a bad flag or a
// wrong number of arguments) into the JSON failure document on stdout
// when the command line asks for --json, so that even then a JSON
// consumer gets a document. The command line is read as written: the
// flags may not have been parsed up to --json when the error came.
func jsonEarly(a *app, c *cobra.Command, err error) error {
	schema, ok := jsonSchemas[c.Name()]
	if !ok || !slices.ContainsFunc(a.args, func(s string) bool { return s == "--json" || s == "--json=true" }) {
		return err
	}
	return jsonFailure(a, schema, "", err)
}

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
	args          []string // the command line, for errors found before a command runs (jsonEarly)
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
	bi, ok := debug.ReadBuildInfo()
	if ok && bi.Main.Version != "" && bi.Main.Version != "(devel)" {
		return bi.Main.Version
	}
	// A build from a checkout names its commit, so that a workbook or a
	// listing can be traced to the code that computed it.
	rev, modified := "", false
	if ok {
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				rev = s.Value
			case "vcs.modified":
				modified = s.Value == "true"
			}
		}
	}
	if len(rev) > 12 {
		rev = rev[:12]
	}
	switch {
	case rev == "":
		return "devel"
	case modified:
		return "devel (commit " + rev + ", with uncommitted changes)"
	}
	return "devel (commit " + rev + ")"
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
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return jsonEarly(a, c, &inputError{err})
	})
	// With no command, sheaf prints its help; a word that is no command is
	// wrong input (exit 2), with the nearest command as a hint.
	root.Args = unknownCommand
	root.RunE = func(c *cobra.Command, _ []string) error { return c.Help() }
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
		newLspCmd(a),
	)
	// cobra adds help and completion when it runs; adding them now gives
	// them the exit table too.
	root.InitDefaultHelpCmd()
	root.InitDefaultCompletionCmd()
	for _, c := range root.Commands() {
		switch c.Name() {
		case "completion": // `sheaf completion tcsh`: an unknown shell
			c.Args = unknownCommand
			c.RunE = func(c *cobra.Command, _ []string) error { return c.Help() }
		case "help": // `sheaf help frob`: an unknown topic
			show := c.Run
			c.Run = nil
			c.RunE = func(c *cobra.Command, args []string) error {
				if found, _, err := root.Find(args); err != nil || (len(args) > 0 && found == root) {
					return unknownCommand(root, args)
				}
				show(c, args)
				return nil
			}
		}
	}
	for _, c := range root.Commands() {
		inputArgs(a, c)
		if c.ValidArgsFunction == nil && !slices.Contains([]string{"units", "funcs", "help", "completion"}, c.Name()) {
			c.ValidArgsFunction = completeSheets
		}
		if c.Long != "" && !strings.Contains(c.Long, exitTable) {
			c.Long += "\n" + exitTable
		}
	}
	root.Long += "\n" + exitTable
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

	a := &app{stdin: stdin, stdout: stdout, stderr: stderr, args: args}
	code = execute(ctx, newRootCmd(a), args, stderr)
	if in := caught.Load(); in != nil && code != exitOK {
		fmt.Fprintln(stderr, in.message())
		return in.code()
	}
	return code
}

// execute runs root with args and returns the exit code: the errors of
// the commands map to codes in exitCode, and a panic (a fault of Sheaf) is
// exit 3 with the stack on stderr.
func execute(ctx context.Context, root *cobra.Command, args []string, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "sheaf: internal error: %v\n%s\nplease report this with the sheet that caused it\n", r, debug.Stack())
			code = exitInternal
		}
	}()
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if err != nil && ctx.Err() != nil {
		return exitInput // interrupted: Main says so with the signal's code
	}
	if err != nil {
		var (
			rep *reportedError
			se  *sheetError
		)
		switch {
		case errors.As(err, &rep):
		case errors.As(err, &se):
			se.render(stderr)
		default:
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
