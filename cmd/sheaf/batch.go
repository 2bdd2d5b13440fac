package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"time"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"github.com/sheafcalc/sheaf/engine/batch"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
	"github.com/sheafcalc/sheaf/internal/plural"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// batchOptions are the flags of `sheaf batch`.
type batchOptions struct {
	out     string
	pick    string
	noPick  bool
	workers int
	sig     int
	json    bool
	draft   bool
	sheet   sheetFlags
}

func newBatchCmd(a *app) *cobra.Command {
	o := &batchOptions{}
	cmd := &cobra.Command{
		Use:   "batch SHEET CASES.csv",
		Short: "Evaluate a sheet once per row of a case table",
		Long: `Batch evaluates the sheet for every row of a CSV case table. The header
names inputs of the sheet, with the unit of the column in brackets:

    P [kN], d [mm], L
    30, 20, 4.2 m
    45, 16, 4200 mm

A bare number is in the column's unit; a value may also carry its own unit
(45 kN, 45kN), which is converted after its dimension is checked. Lines
starting with # are comments. Use - for the table to read it from stdin.

A table exported by a spreadsheet in a locale with a decimal comma is read
as it is: when its header row holds semicolons and no comma (or, for a
one-column header, a row holds a semicolon), fields are separated by ';' and
a comma in a number is its decimal mark (12,5 is 12.5); a note on stderr
says so. A number with both a comma and a point is refused there rather
than guessed.

The output has one row per case, in the order of the table: the case number,
the inputs in their column units, the picked cells in their display units,
and each design check's utilisation and verdict. Without --pick the picked
cells are the derived cells the checks compare (their demand and capacity
cells), or every derived number of a sheet without checks; --pick a,b,c
names others, --pick "" none. The output goes to
stdout as CSV (--json: one JSON document, schema/sheaf.schema.json), or
with --out to a .csv or .xlsx file, written whole or not at all. A summary of the checks goes to stderr.

A row that cannot be read is reported with its line and skipped; the other
rows still run. Rows are shared among --workers goroutines (default: all
cores); each recomputes only what its row changed, and the output does not
depend on the number of workers.

Exit status here: 0 when every check passes in every case, 1 when a check fails
or cannot be assessed in some case, 2 when a row is bad, a case has a cell
that could not be computed (not with --draft), every row is bad, or the
sheet or the table has errors (2 wins over 1).`,
		Args:              cobra.ExactArgs(2),
		ValidArgsFunction: completeSheets,
		RunE: func(cmd *cobra.Command, args []string) error {
			o.noPick = cmd.Flags().Changed("pick")
			err := runBatch(cmd.Context(), a, o, args[0], args[1])
			if o.json {
				return jsonFailure(a, batch.Schema, args[0], err)
			}
			return err
		},
	}
	f := cmd.Flags()
	f.StringVarP(&o.out, "out", "o", "", "write the results to a .csv or .xlsx file instead of stdout")
	f.StringVar(&o.pick, "pick", "", "cells to output, comma-separated (default: the cells the checks compare)")
	f.IntVar(&o.workers, "workers", 0, "goroutines evaluating cases (default: the number of cores)")
	f.IntVar(&o.sig, "sig", 6, "significant figures of numbers in CSV output")
	f.BoolVar(&o.json, "json", false, "print the results as JSON on stdout")
	f.BoolVar(&o.draft, "draft", false, "accept cases with cells that cannot be computed (exit 0 or 1 instead of 2)")
	o.sheet.add(cmd, true)
	return cmd
}

func runBatch(ctx context.Context, a *app, o *batchOptions, sheetPath, casesPath string) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if o.workers < 0 {
		return userErrorf("--workers %d: give a positive number, or leave it out to use every core", o.workers)
	}
	if o.sig < 1 || o.sig > 17 {
		return userErrorf("--sig %d: give 1 to 17 significant figures", o.sig)
	}
	format := ""
	if o.out != "" {
		switch strings.ToLower(filepath.Ext(o.out)) {
		case ".csv":
			format = "csv"
		case ".xlsx":
			format = "xlsx"
		default:
			return userErrorf("--out %s: the file must end in .csv or .xlsx", o.out)
		}
	}
	s, err := loadSheet(a, sheetPath, &o.sheet)
	if err != nil {
		return err
	}
	if o.json && o.out != "" {
		return userErrorf("--json and --out: choose one; --json writes to stdout")
	}
	if sheetPath == "-" && casesPath == "-" {
		return userErrorf("the sheet and the case table cannot both come from stdin (-)")
	}
	if o.out != "" {
		// Nothing lost: the results never replace the case table, the
		// sheet or a template the sheet uses.
		for _, in := range append([]string{casesPath}, s.Files()...) {
			if in != "-" && userfile.Same(o.out, in) {
				return userErrorf("--out %s would overwrite %s, which this batch reads; choose another name", o.out, in)
			}
		}
	}
	var src []byte
	if casesPath == "-" {
		src, err = userfile.ReadAll(a.stdin, "stdin", maxCaseBytes)
		casesPath = "stdin"
	} else {
		src, err = userfile.ReadFile(casesPath, maxCaseBytes)
	}
	if err != nil {
		return &inputError{fmt.Errorf("cannot read the case table: %w", err)}
	}
	cs, err := batch.Read(casesPath, src, s)
	if err != nil {
		var list diag.List
		if errors.As(err, &list) {
			_ = diag.Render(a.stderr, list, diag.Sources{casesPath: src})
			return &reportedError{err, exitInput}
		}
		return err
	}
	opts := batch.Options{Workers: o.workers}
	if o.noPick {
		opts.Pick = []string{}
		for _, n := range strings.Split(o.pick, ",") {
			if n = strings.TrimSpace(n); n != "" {
				opts.Pick = append(opts.Pick, n)
			}
		}
	}
	stop := startProgress(a.stderr, len(cs.Cases), &opts)
	out, err := batch.Run(ctx, s, cs, opts)
	stop()
	if err != nil {
		if ctx.Err() != nil {
			return err
		}
		return &inputError{err}
	}
	if cs.DecimalComma {
		fmt.Fprintf(a.stderr, "note: %s is read as separated by semicolons, with a decimal comma (12,5 is 12.5)\n", casesPath)
	}
	bad := cs.Bad()
	sum := out.Summarize()
	var status error
	switch {
	case sum.Cases > 0 && len(bad) == sum.Cases:
		status = &reportedError{fmt.Errorf("every row of %s is bad: nothing was evaluated", casesPath), exitInput}
	case len(bad) > 0:
		status = &reportedError{fmt.Errorf("%d bad rows", len(bad)), exitInput}
	case sum.Uncomputed > 0 && !o.draft:
		status = &reportedError{fmt.Errorf("%s with cells that could not be computed (--draft accepts them)", plural.Count(sum.Uncomputed, "case")), exitInput}
	case sum.Failing():
		status = &reportedError{errors.New("design checks fail"), exitChecks}
	}
	if o.json {
		format = "json"
	}
	switch format {
	case "json":
		err = out.WriteJSON(a.stdout, s.Name(), exitCode(status))
	case "":
		err = out.WriteCSV(a.stdout, o.sig)
	case "csv":
		err = atomicfile.Write(o.out, 0o644, func(w io.Writer) error { return out.WriteCSV(w, o.sig) })
	case "xlsx":
		err = atomicfile.Write(o.out, 0o644, func(w io.Writer) error { return out.WriteXLSXContext(ctx, w) })
	}
	if err != nil {
		return fmt.Errorf("writing the results: %w", err)
	}
	if len(bad) > 0 {
		_ = diag.Render(a.stderr, bad, diag.Sources{casesPath: src})
	}
	if err := sum.Write(a.stderr, casesPath); err != nil {
		return err
	}
	if sum.Uncomputed > 0 && !o.draft {
		fmt.Fprintf(a.stderr, "sheaf: %v\n", status)
	}
	return status
}

// maxCaseBytes limits the size of a case table: about a million rows of a
// few columns. The table is read whole before its first row runs.
const maxCaseBytes = 64 << 20

// progressDelay is how long a batch runs before a progress bar appears: a
// run that ends sooner is not worth a bar.
const progressDelay = 500 * time.Millisecond

// startProgress shows a progress bar on w when w is a terminal and the run
// lasts longer than progressDelay; it returns the function that ends it.
// Elsewhere (a pipe, a file, a test) it does nothing.
func startProgress(w io.Writer, total int, o *batch.Options) (stop func()) {
	f, ok := w.(*os.File)
	if !ok || !term.IsTerminal(int(f.Fd())) || total == 0 {
		return func() {}
	}
	var done atomic.Int64
	o.Progress = func(n int) { done.Add(int64(n)) }
	quit := make(chan struct{})
	finished := make(chan struct{})
	go func() {
		defer close(finished)
		select {
		case <-quit:
			return
		case <-time.After(progressDelay):
		}
		bar := progressbar.NewOptions(total, progressbar.OptionSetWriter(w), progressbar.OptionSetDescription("cases"),
			progressbar.OptionShowCount(), progressbar.OptionThrottle(100*time.Millisecond), progressbar.OptionClearOnFinish())
		t := time.NewTicker(100 * time.Millisecond)
		defer t.Stop()
		for {
			select {
			case <-quit:
				_ = bar.Set(int(done.Load()))
				_ = bar.Finish()
				return
			case <-t.C:
				_ = bar.Set(int(done.Load()))
			}
		}
	}()
	return func() {
		close(quit)
		<-finished
	}
}
