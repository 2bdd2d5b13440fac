package main

import (
	"errors"
	"fmt"
	"io"
	"maps"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// sheetFlags are the flags of every command that loads a sheet: the
// display system and the limits on what is read.
type sheetFlags struct {
	system   string
	maxBytes int
	maxLines int
	maxCells int
	maxSteps int
	json     bool // problems go to stdout as JSON (commands with --json)
}

// add registers the flags on cmd; withSystem adds --system.
func (f *sheetFlags) add(cmd *cobra.Command, withSystem bool) {
	fl := cmd.Flags()
	if withSystem {
		fl.StringVar(&f.system, "system", "", "display units for cells without a written unit: metric or us")
		_ = cmd.RegisterFlagCompletionFunc("system", completeSystem)
	}
	fl.IntVar(&f.maxBytes, "max-bytes", engine.DefaultMaxBytes, "refuse a sheet larger than this many bytes, before reading it")
	fl.IntVar(&f.maxLines, "max-lines", engine.DefaultMaxLines, "refuse a sheet of more lines than this, before parsing it")
	fl.IntVar(&f.maxCells, "max-cells", engine.DefaultMaxCells, "refuse a sheet of more cells than this, its templates' cells included, before building them")
	fl.IntVar(&f.maxSteps, "max-eval-steps", engine.DefaultMaxEvalSteps, "refuse a cell whose one evaluation takes more steps than this, counting every call of the sheet's functions, before anything runs")
}

// options turns the flags into engine options.
func (f *sheetFlags) options() ([]engine.Option, error) {
	if f.maxBytes < 0 {
		return nil, userErrorf("--max-bytes %d: give a positive number of bytes", f.maxBytes)
	}
	if f.maxLines < 0 {
		return nil, userErrorf("--max-lines %d: give a positive number of lines", f.maxLines)
	}
	if f.maxCells < 0 {
		return nil, userErrorf("--max-cells %d: give a positive number of cells", f.maxCells)
	}
	if f.maxSteps < 0 {
		return nil, userErrorf("--max-eval-steps %d: give a positive number of steps", f.maxSteps)
	}
	if f.maxBytes == 0 {
		f.maxBytes = engine.DefaultMaxBytes
	}
	if f.maxLines == 0 {
		f.maxLines = engine.DefaultMaxLines
	}
	// 0 keeps the default: WithMaxCells and WithMaxEvalSteps ignore a limit that is not positive.
	opts := []engine.Option{engine.WithMaxBytes(f.maxBytes), engine.WithMaxLines(f.maxLines),
		engine.WithMaxCells(f.maxCells), engine.WithMaxEvalSteps(f.maxSteps)}
	if f.system != "" {
		s, ok := units.ParseSystem(f.system)
		if !ok || s == units.Neutral {
			return nil, userErrorf("--system %s: unknown unit system; use metric or us", f.system)
		}
		opts = append(opts, engine.WithSystem(s))
	}
	return opts, nil
}

// stdinName is the name of a sheet read from standard input (FILE -) in
// messages; its templates are found from the working directory.
const stdinName = "stdin"

// readStdin reads a sheet from r, at most limit bytes: one more is a
// limit error, given before the rest is read.
func readStdin(r io.Reader, limit int) ([]byte, error) {
	src, err := io.ReadAll(io.LimitReader(r, int64(limit)+1))
	if err != nil {
		return nil, &inputError{fmt.Errorf("cannot read the sheet from stdin: %w", err)}
	}
	return src, nil
}

// loadSheet loads the sheet at path (- for stdin) as the flags say. Sheet
// errors are rendered on stderr, or with f.json written as the JSON of
// the problems on stdout; both exit 2.
func loadSheet(a *app, path string, f *sheetFlags) (*engine.Sheet, error) {
	opts, err := f.options()
	if err != nil {
		return nil, err
	}
	var s *engine.Sheet
	var src []byte
	name := path
	if path == "-" {
		name = stdinName
		if src, err = readStdin(a.stdin, f.maxBytes); err != nil {
			return nil, err
		}
		if len(src) > f.maxBytes {
			// Only the limit and one byte were read: the size is unknown.
			return nil, userErrorf("the sheet on stdin is larger than the limit of %d bytes; nothing of it was read; split it into sheets that use one another, or raise the limit with --max-bytes", f.maxBytes)
		}
		s, err = engine.Compile(name, src, opts...)
	} else {
		s, err = engine.Load(path, opts...)
	}
	if err != nil {
		var list diag.List
		if errors.As(err, &list) {
			return nil, &sheetError{list: list, name: name, src: src}
		}
		return nil, &inputError{err}
	}
	return s, nil
}

// sheetError is a sheet that did not load: its diagnostics, rendered once
// by reportError (on stderr, or as JSON on stdout).
type sheetError struct {
	list diag.List
	name string
	src  []byte       // the source when it did not come from a file
	srcs diag.Sources // other files that did not come from disk (a git revision's)
	more []*sheetError
}

func (e *sheetError) Error() string {
	return plural.Count(len(e.list), "problem") + " in " + e.name
}
func (e *sheetError) Unwrap() error { return e.list }

// join adds the problems of another sheet (diff of two broken versions).
func (e *sheetError) join(f *sheetError) *sheetError {
	return &sheetError{list: append(slices.Clone(e.list), f.list...), name: e.name + " and " + f.name, more: []*sheetError{e, f}}
}

// render writes the diagnostics with their snippets and the count.
func (e *sheetError) render(w io.Writer) {
	if len(e.more) > 0 {
		for _, m := range e.more {
			m.render(w)
		}
		return
	}
	srcs := engine.ReadSources(e.list)
	maps.Copy(srcs, e.srcs)
	if e.src != nil {
		srcs[e.name] = e.src
	}
	reportProblems(w, e.list, srcs, e.name, "")
}

// completeSystem completes --system.
func completeSystem(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
	return []string{"metric\tSI units (kN, mm, MPa)", "us\tUS customary units (kip, in, ksi)"}, cobra.ShellCompDirectiveNoFileComp
}

// completeSheets completes file arguments with .sheaf files (and folders).
func completeSheets(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
	return []string{"sheaf"}, cobra.ShellCompDirectiveFilterFileExt
}

// setUsage is the help of the --set flag of run and export.
const setUsage = "replace an input: name=value with a unit, e.g. P=45kN, a record's field steel.f_y=460MPa or a template's input rod.d=20mm (repeatable)"

// applySets replaces the inputs of st as the --set flags (name=value) say.
func applySets(st *engine.State, sets []string) error {
	for _, kv := range sets {
		name, val, ok := strings.Cut(kv, "=")
		name, val = strings.TrimSpace(name), strings.TrimSpace(val)
		if !ok || name == "" || val == "" {
			return userErrorf("--set %q: expected name=value, e.g. --set P=45kN", kv)
		}
		if err := st.SetText(name, val); err != nil {
			return userErrorf("--set %s: %v", kv, err)
		}
	}
	return nil
}

// loadState loads the sheet (see loadSheet) and returns it with a new
// state whose inputs are replaced as the --set flags say.
func loadState(a *app, path string, f *sheetFlags, sets []string) (*engine.Sheet, *engine.State, error) {
	s, err := loadSheet(a, path, f)
	if err != nil {
		return nil, nil, err
	}
	st := s.NewState()
	if err := applySets(st, sets); err != nil {
		return nil, nil, err
	}
	return s, st, nil
}

// completeInputs completes --set with the input names of the sheet named
// in the arguments (and the fields of its record inputs), followed by =.
func completeInputs(cmd *cobra.Command, args []string, prefix string) ([]string, cobra.ShellCompDirective) {
	if len(args) == 0 || args[0] == "-" {
		return nil, cobra.ShellCompDirectiveNoFileComp
	}
	s, err := engine.Load(args[0])
	if err != nil {
		return nil, cobra.ShellCompDirectiveNoFileComp
	}
	var out []string
	for _, c := range s.Cells() {
		if c.Kind != engine.Input && c.Kind != engine.Table {
			continue
		}
		out = append(out, c.Name+"=\t"+c.Description())
		if c.Type != nil && c.Type.Kind == funcs.Record {
			for _, f := range c.Type.Fields {
				out = append(out, c.Name+"."+f.Name+"=")
			}
		}
	}
	kept := out[:0]
	for _, o := range out {
		if strings.HasPrefix(o, prefix) {
			kept = append(kept, o)
		}
	}
	return kept, cobra.ShellCompDirectiveNoSpace | cobra.ShellCompDirectiveNoFileComp
}
