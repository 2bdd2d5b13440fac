package engine

import (
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
)

// CompileFile checks and compiles a sheet its caller has parsed already
// (sheet.Parse with sheet.MaxBytes of the same limit), and keeps f as the
// sheet's File. A language server parses every edit of a document once for
// its outline, completion and formatting, even when the edit breaks the
// sheet; CompileFile lets it check the same tree instead of parsing the
// text a second time. f must not be changed afterwards. Sheet errors come
// back as a diag.List, sorted, one per line: f's syntax problems first
// among them.
func CompileFile(f *sheet.File, opts ...Option) (*Sheet, error) {
	cfg := newConfig(opts)
	errs := append(diag.List(nil), f.Syntax...)
	opt := cfg.checkOptions()
	opt.DropItems = true // the program keeps no copy of the items; f has them
	opt.DropTrees = true
	prog, cerrs := check.Sheet(f, opt)
	errs = append(errs, cerrs...)
	errs.Sort()
	if errs.HasErrors() {
		return nil, errs
	}
	s := &Sheet{name: f.Name, src: f.Src, prog: prog, mach: eval.Compile(prog), sigFigs: cfg.sigFigs, cfg: cfg}
	s.file = func() *sheet.File { return f }
	s.system = prog.Meta.System
	if cfg.hasSystem && cfg.system != units.Neutral {
		s.system = cfg.system
	}
	return s, nil
}
