package engine

import (
	"bytes"
	"errors"
	"fmt"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// Kind says what a cell is.
type Kind = check.Kind

// Cell kinds.
const (
	Input    = check.Input
	Derived  = check.Derived
	Check    = check.Check
	Function = check.Function
	Table    = check.Table
)

// Cell is one named item of a sheet (see check.Cell for the fields:
// Name, Kind, Section, Description, Reference, Expr, Unit, HasUnit, Type,
// Pos, Deps, Formula, ...).
type Cell = check.Cell

// Meta is the header of a sheet: title, project, basis, author, checker,
// date, revision, units.
type Meta = check.Meta

// Sheet is a loaded, checked and compiled sheet. It is immutable and safe
// for concurrent use.
type Sheet struct {
	name    string
	src     []byte
	prog    *check.Program
	mach    *eval.Machine
	combos  *Combos // nil when the sheet has no actions
	system  units.System
	sigFigs int
	cfg     config
}

// Load reads, checks and compiles the sheet at path, and the templates it
// uses (paths relative to it, inside its project root: see SPEC.md).
// Sheet errors come back as a diag.List (render it with diag.Render and
// ReadSources(list): the positions may lie in templates); I/O errors as
// they are.
func Load(path string, opts ...Option) (*Sheet, error) {
	cfg := newConfig(opts)
	src, err := userfile.ReadFile(path, int64(cfg.maxBytes))
	if err != nil {
		var tl *userfile.TooLargeError
		if errors.As(err, &tl) {
			return nil, tooLarge(path, tl.Size, int(tl.Limit))
		}
		return nil, err
	}
	return Compile(path, src, opts...)
}

// Compile checks and compiles the sheet source src named name (the name
// appears in positions). Sheet errors come back as a diag.List, sorted,
// one per line.
func Compile(name string, src []byte, opts ...Option) (*Sheet, error) {
	cfg := newConfig(opts)
	// The limits are checked before anything is parsed: a source over
	// them is refused at once, not checked first (loading stops at a
	// limit error).
	if len(src) > cfg.maxBytes {
		return nil, tooLarge(name, int64(len(src)), cfg.maxBytes)
	}
	if n := bytes.Count(src, []byte{'\n'}); n > cfg.maxLines || (n == cfg.maxLines && len(src) > 0 && src[len(src)-1] != '\n') {
		return nil, diag.List{{Range: diag.FileOnly(name).Whole(),
			Summary: fmt.Sprintf("sheet has too many lines: more than %d", cfg.maxLines),
			Detail:  "a sheet is written by a person; it was refused before parsing",
			Hint:    "split it into sheets that use one another, or raise the limit (sheaf: --max-lines N; Go: engine.WithMaxLines)"}}
	}
	f, errs := sheet.Parse(name, src, sheet.MaxBytes(cfg.maxBytes), sheet.MaxLines(cfg.maxLines))
	if f == nil {
		errs.Sort()
		return nil, errs
	}
	return compileFile(f, cfg)
}

// CompileFile checks and compiles a sheet its caller has parsed already
// (sheet.Parse with the same limits), and keeps f as the sheet's File. A
// language server parses every edit of a document once for its outline,
// completion and formatting, even when the edit breaks the sheet;
// CompileFile lets it check the same tree instead of parsing the text a
// second time. f must not be changed afterwards. Sheet errors come back as
// a diag.List, sorted, one per line, f's syntax problems among them.
func CompileFile(f *sheet.File, opts ...Option) (*Sheet, error) {
	return compileFile(f, newConfig(opts))
}

func compileFile(f *sheet.File, cfg config) (*Sheet, error) {
	errs := append(diag.List(nil), f.Syntax...)
	prog, cerrs := check.Sheet(f, cfg.checkOptions())
	errs = append(errs, cerrs...)
	var combos *Combos
	if !errs.HasErrors() {
		var xerrs diag.List
		combos, xerrs = setupCombos(prog)
		errs = append(errs, xerrs...)
	}
	errs.Sort()
	if errs.HasErrors() {
		return nil, errs
	}
	s := &Sheet{name: f.Name, src: f.Src, prog: prog, mach: eval.Compile(prog), combos: combos, sigFigs: cfg.sigFigs, cfg: cfg}
	s.system = prog.Meta.System
	if cfg.hasSystem && cfg.system != units.Neutral {
		s.system = cfg.system
	}
	return s, nil
}

// tooLarge is the error of a sheet over the size limit, found before it
// is read or parsed.
func tooLarge(name string, size int64, limit int) diag.List {
	return diag.List{{Range: diag.NewSource(name, "").Span(0, 0),
		Summary: fmt.Sprintf("sheet is too large: %d bytes, the limit is %d", size, limit),
		Detail:  "a sheet is written by a person; it was refused before parsing",
		Hint:    "split it into sheets that use one another, or raise the limit (sheaf: --max-bytes N; Go: engine.WithMaxBytes)"}}
}

// Name returns the name the sheet was loaded under.
func (s *Sheet) Name() string { return s.name }

// Source returns the text of the sheet.
func (s *Sheet) Source() []byte { return s.src }

// File returns the syntax tree the sheet was checked from (the program's
// first file; templates are in Program().Files).
func (s *Sheet) File() *sheet.File { return s.prog.File }

// Program returns the checked program (for exporters that walk the typed
// trees).
func (s *Sheet) Program() *check.Program { return s.prog }

// Meta returns the header.
func (s *Sheet) Meta() Meta { return s.prog.Meta }

// System returns the unit system used for display.
func (s *Sheet) System() units.System { return s.system }

// Cells returns every cell in reading order.
func (s *Sheet) Cells() []*Cell { return s.prog.Cells }

// Lookup returns the named cell, or nil.
func (s *Sheet) Lookup(name string) *Cell { return s.prog.Lookup(name) }

// Sources returns the text of every file the sheet was built from (the
// sheet and the templates it uses), for rendering diagnostics.
func (s *Sheet) Sources() diag.Sources {
	out := diag.Sources{s.name: s.src}
	for _, f := range s.prog.Files {
		out[f.Name] = f.Src
	}
	return out
}

// ReadSources reads every file named in the positions of l, for rendering
// the diagnostics of a sheet that failed to load: they may sit in the
// templates it uses. Files that cannot be read are left out (their
// messages then come without a snippet).
func ReadSources(l diag.List) diag.Sources {
	out := diag.Sources{}
	for _, d := range l {
		name := d.Range.Start().File
		if _, done := out[name]; done || name == "" {
			continue
		}
		if src, err := userfile.ReadFile(name, DefaultMaxBytes); err == nil {
			out[name] = src
		}
	}
	return out
}

// DisplayUnit returns the unit a cell's value is shown in: the written
// unit, else the preferred unit of the sheet's system, else SI.
func (s *Sheet) DisplayUnit(c *Cell) units.Unit {
	if c.HasUnit {
		return c.Unit()
	}
	if c.Type == nil {
		return units.Unit{Factor: 1}
	}
	d := c.Type.Dim
	if c.Kind == Check {
		d = units.None
	}
	u, _ := units.Preferred(d, s.system)
	if u.Factor == 0 {
		u.Factor = 1
	}
	return u
}

// Run evaluates the sheet with the given overrides (values in SI, as from
// ParseInput) and returns the results.
func (s *Sheet) Run(overrides map[string]any) *Results {
	st := s.NewState()
	var problems diag.List
	for name, v := range overrides {
		if err := st.Set(name, v); err != nil {
			problems.Add(&diag.Diagnostic{Summary: err.Error()})
		}
	}
	r := st.Eval()
	r.Problems = append(problems, r.Problems...)
	return r
}

// Node is a typed expression of the checked program.
type Node = check.Node

// OpCell is the Node operation that reads a cell.
const OpCell = check.OpCell
