package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"path/filepath"
	"syscall"
	"time"

	"github.com/fsnotify/fsnotify"
	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/diff"
	"github.com/sheafcalc/sheaf/engine/export/report"
	"github.com/sheafcalc/sheaf/engine/export/text"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// watchOptions are the flags of `sheaf watch`.
type watchOptions struct {
	interval time.Duration
	rtol     float64
	sheet    sheetFlags
	serve    string // --serve: address of the live preview ("" for none)
}

func newWatchCmd(a *app) *cobra.Command {
	o := &watchOptions{}
	cmd := &cobra.Command{
		Use:   "watch FILE",
		Short: "Re-evaluate a sheet each time it is saved and show what changed",
		Long: `Watch evaluates the sheet, prints its results, then waits. Each time the
sheet (or a sheet it uses) is saved, it is checked and evaluated again and
the changes since the last good run are printed as by sheaf diff: inputs,
formulas, results and checks. A sheet saved with errors shows its
diagnostics; watching goes on until the next save fixes them.

Saves that come close together (an editor writing a file in several steps)
are taken as one after --interval of quiet (100 ms by default); the file is
then read until two reads 10 ms apart agree, an empty file is taken for a
save still under way, and a file that does not load is read once more after
another interval before its problems are shown, so a half-written file is
never reported as a change. A save that changes only the values of inputs
is recomputed through the engine's incremental evaluation, without
compiling the sheet again. Ctrl-C stops watching.

Exit status here: 0 when stopped with Ctrl-C, 2 when the file cannot be watched.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			ctx := cmd.Context()
			if ctx == nil {
				ctx = context.Background()
			}
			ctx, stop := signal.NotifyContext(ctx, os.Interrupt, syscall.SIGTERM)
			defer stop()
			return runWatch(ctx, a, o, args[0], nil)
		},
	}
	f := cmd.Flags()
	f.DurationVar(&o.interval, "interval", 100*time.Millisecond, "quiet time after a save before re-evaluating")
	f.Float64Var(&o.rtol, "rtol", diff.DefaultRelTol, "relative tolerance below which a result counts as unchanged")
	o.sheet.add(cmd, true)
	f.StringVar(&o.serve, "serve", "", "serve the report on ADDR (default "+DefaultServe+", loopback only) and update the open page on every save")
	f.Lookup("serve").NoOptDefVal = DefaultServe
	return cmd
}

// watcher re-runs one sheet.
type watcher struct {
	a      *app
	o      *watchOptions
	path   string
	opts   []engine.Option
	last   *engine.Results   // of the last good run
	src    []byte            // source of the last attempt
	used   map[string][]byte // sources of the templates the last good run used
	runs   int
	fs     *fsnotify.Watcher
	dirs   map[string]bool
	names  map[string]bool // absolute paths of the files that trigger a run
	loaded bool            // the last attempt loaded the sheet
	// The compiled sheet of the last good full run, the source it was
	// compiled from and the State that follows the saves that changed
	// only input values since (see incremental); over names the inputs
	// the State has set.
	sheet  *engine.Sheet
	base   []byte
	st     *engine.State
	over   map[string]bool
	byLine map[int]*engine.Cell // one-line inputs of sheet by line, built on first need
	// settle is the gap between the two reads that must agree before a
	// save is taken (readStable); retried counts the re-reads of a
	// source that did not compile, which may be a save still under way.
	settle   time.Duration
	retried  bool
	compiles int // full compiles, for tests and benchmarks
	// onRun, when set (--serve), hears the outcome of every run.
	onRun func(s *engine.Sheet, res *engine.Results, err error, src diag.Sources)
}

// settleTime is the gap between the two reads of a saved file that must
// agree (at most 10 ms, a quarter of the quiet time for a short one).
func settleTime(interval time.Duration) time.Duration {
	return min(interval/4, 10*time.Millisecond)
}

// runWatch watches path until ctx ends. ready, when not nil, is called
// once the first run is printed and the watch is in place (for tests).
func runWatch(ctx context.Context, a *app, o *watchOptions, path string, ready func()) error {
	if o.interval <= 0 {
		return userErrorf("--interval %s: give a positive duration, e.g. 100ms", o.interval)
	}
	if !(o.rtol >= 0) || o.rtol >= 1 {
		return userErrorf("--rtol %g: give a relative tolerance from 0 to below 1, e.g. 1e-6", o.rtol)
	}
	w := &watcher{a: a, o: o, path: path, dirs: map[string]bool{}, names: map[string]bool{}, settle: settleTime(o.interval)}
	opts, err := o.sheet.options()
	if err != nil {
		return err
	}
	w.opts = opts
	if _, err := userfile.Check(path, engine.DefaultMaxBytes); err != nil {
		return &inputError{err}
	}
	fw, err := fsnotify.NewWatcher()
	if err != nil {
		return fmt.Errorf("cannot watch files: %w", err)
	}
	defer fw.Close()
	w.fs = fw
	if o.serve != "" {
		p, err := startPreview(ctx, o.serve, report.A4)
		if err != nil {
			return err
		}
		w.onRun = p.update
		fmt.Fprintf(a.stdout, "serving the report at %s\n", p.url)
	}
	files := w.run()
	if err := w.follow(files); err != nil {
		return &inputError{err}
	}
	fmt.Fprintf(a.stdout, "watching %s; Ctrl-C stops\n", path)
	if ready != nil {
		ready()
	}
	timer := time.NewTimer(time.Hour)
	timer.Stop()
	for {
		select {
		case <-ctx.Done():
			return nil
		case ev, ok := <-fw.Events:
			if !ok {
				return nil
			}
			if w.names[clean(ev.Name)] && ev.Op&(fsnotify.Write|fsnotify.Create|fsnotify.Rename|fsnotify.Remove) != 0 {
				timer.Reset(o.interval)
			}
		case err, ok := <-fw.Errors:
			if !ok {
				return nil
			}
			fmt.Fprintf(a.stderr, "sheaf: watching: %v\n", err)
		case <-timer.C:
			files := w.run()
			if err := w.follow(files); err != nil {
				fmt.Fprintf(a.stderr, "sheaf: watching: %v\n", err)
			}
		}
	}
}

// follow watches the directories of files: editors often save by writing a
// new file and renaming it over the old one, which a watch on the file
// itself would lose.
func (w *watcher) follow(files []string) error {
	for _, f := range files {
		abs := clean(f)
		w.names[abs] = true
		dir := filepath.Dir(abs)
		if w.dirs[dir] {
			continue
		}
		if err := w.fs.Add(dir); err != nil {
			return fmt.Errorf("cannot watch %s: %w", dir, err)
		}
		w.dirs[dir] = true
	}
	return nil
}

func clean(p string) string {
	if abs, err := filepath.Abs(p); err == nil {
		return abs
	}
	return filepath.Clean(p)
}

// run loads and evaluates the sheet and prints the outcome: the whole
// listing the first time, then the changes since the last good run. It
// returns the files to watch.
func (w *watcher) run() []string {
	files := []string{w.path}
	src, err := w.readStable()
	if err != nil {
		fmt.Fprintf(w.a.stderr, "sheaf: %v; waiting for the file to come back\n", err)
		w.src = nil
		return files
	}
	if w.last != nil && len(bytes.TrimSpace(src)) == 0 {
		// Truncated by an editor that writes in place, not yet written:
		// diffing it would list every cell as removed.
		fmt.Fprintf(w.a.stderr, "sheaf: %s is empty; waiting for the save to finish\n", w.path)
		return append(files, w.usedFiles()...)
	}
	if w.src != nil && bytes.Equal(src, w.src) && w.loaded && w.usedUnchanged() {
		return append(files, w.usedFiles()...) // saved without a change
	}
	if before, after, ok := w.incremental(src); ok {
		w.src = src
		w.runs++
		w.loaded = true
		fmt.Fprintf(w.a.stdout, "\n== run %d of %s ==\n", w.runs, w.path)
		r := diff.Compare("last good run", before, fmt.Sprintf("run %d", w.runs), after, diff.Options{RelTol: w.o.rtol})
		_ = r.WriteText(w.a.stdout)
		if w.onRun != nil {
			w.onRun(w.sheet, w.last, nil, nil) // after holds only the cells recomputed; w.last is whole
		}
		if len(w.last.Problems) > 0 {
			_ = diag.Render(w.a.stderr, w.last.Problems, diag.Sources{w.path: src})
		}
		return append(files, w.usedFiles()...)
	}
	w.compiles++
	s, err := engine.Compile(w.path, src, w.opts...)
	if err != nil && !w.retried {
		// Maybe a save still under way: look again after another quiet
		// interval before reporting the file as broken.
		w.retried = true
		time.Sleep(w.o.interval)
		if again, rerr := w.readStable(); rerr == nil && !bytes.Equal(again, src) {
			return w.run()
		}
	}
	w.retried = false
	w.src = src
	w.runs++
	w.loaded = err == nil
	if err != nil {
		var list diag.List
		if errors.As(err, &list) {
			reportProblems(w.a.stderr, list, sourcesFor(list, w.path, src), w.path, "; fix and save to re-run")
		} else {
			fmt.Fprintf(w.a.stderr, "sheaf: %v\n", err)
		}
		if w.onRun != nil {
			var list diag.List
			errors.As(err, &list)
			w.onRun(nil, nil, err, sourcesFor(list, w.path, src))
		}
		return files
	}
	w.sheet, w.base, w.st, w.over, w.byLine = s, src, s.NewState(), map[string]bool{}, nil
	res := w.st.Eval()
	if w.onRun != nil {
		w.onRun(s, res, nil, nil)
	}
	w.print(res)
	if len(res.Problems) > 0 {
		_ = diag.Render(w.a.stderr, res.Problems, s.Sources())
	}
	w.last = res
	w.used = map[string][]byte{}
	for _, f := range s.Files()[1:] {
		w.used[f], _ = userfile.ReadFile(f, engine.DefaultMaxBytes)
	}
	return s.Files()
}

// print writes the outcome of a run: the whole listing the first time,
// then the changes since the last good run.
func (w *watcher) print(res *engine.Results) {
	if w.last == nil {
		_ = text.Write(w.a.stdout, res, engine.DefaultSigFigs)
		return
	}
	fmt.Fprintf(w.a.stdout, "\n== run %d of %s ==\n", w.runs, w.path)
	r := diff.Compare("last good run", w.last, fmt.Sprintf("run %d", w.runs), res, diff.Options{RelTol: w.o.rtol})
	_ = r.WriteText(w.a.stdout)
}

// usedUnchanged reports whether every template of the last good run still
// reads as it did: a save of a template re-runs the sheet even though the
// sheet's own text is the same.
func (w *watcher) usedUnchanged() bool {
	for f, src := range w.used {
		now, err := userfile.ReadFile(f, engine.DefaultMaxBytes)
		if err != nil || !bytes.Equal(now, src) {
			return false
		}
	}
	return true
}

func (w *watcher) usedFiles() []string {
	out := make([]string, 0, len(w.used))
	for f := range w.used {
		out = append(out, f)
	}
	return out
}
