package engine

import (
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
)

// Default limits. A sheet is written by a person; anything beyond these is
// a mistake or an attack, refused with a diagnostic.
const (
	DefaultMaxBytes     = sheet.DefaultMaxBytes
	DefaultMaxLines     = sheet.DefaultMaxLines
	DefaultMaxCells     = 200_000
	DefaultMaxEvalSteps = check.MaxEvalSteps
	DefaultMaxDepth     = formula.DefaultMaxDepth
	DefaultSigFigs      = 4
)

// Option adjusts Load and Compile.
type Option func(*config)

type config struct {
	maxBytes  int
	maxLines  int
	maxCells  int
	maxSteps  int
	maxDepth  int
	system    units.System
	hasSystem bool
	sigFigs   int
	loader    check.Loader
}

func newConfig(opts []Option) config {
	c := config{maxBytes: DefaultMaxBytes, maxLines: DefaultMaxLines, maxCells: DefaultMaxCells, maxDepth: DefaultMaxDepth, sigFigs: DefaultSigFigs}
	for _, o := range opts {
		if o != nil {
			o(&c)
		}
	}
	return c
}

// WithMaxBytes limits the size of the source (default 4 MiB).
func WithMaxBytes(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxBytes = n
		}
	}
}

// WithMaxLines limits the number of physical lines of the source (default
// 1,000,000). A source over the limit is refused before it is parsed.
func WithMaxLines(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxLines = n
		}
	}
}

// WithMaxCells limits the number of cells (default 200,000).
func WithMaxCells(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxCells = n
		}
	}
}

// WithMaxEvalSteps limits the work one evaluation of a cell may take,
// counted in typed nodes with every call of the sheet's functions expanded
// (default check.MaxEvalSteps, 10 million); a cell over it is refused at
// check time.
func WithMaxEvalSteps(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxSteps = n
		}
	}
}

// WithMaxDepth limits the nesting of an expression (default 64).
func WithMaxDepth(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxDepth = n
		}
	}
}

// WithSystem chooses the display units (metric or US customary) for cells
// without a written unit, overriding the sheet's `units:` header.
func WithSystem(s units.System) Option {
	return func(c *config) { c.system, c.hasSystem = s, true }
}

// WithSigFigs sets the significant figures of displayed values (default 4).
func WithSigFigs(n int) Option {
	return func(c *config) {
		if n > 0 && n <= 17 {
			c.sigFigs = n
		}
	}
}

// Loader reads the templates a sheet uses (see check.Loader): the files on
// disk by default (NewFileLoader), or, say, the files of a git revision.
type Loader = check.Loader

// NewFileLoader returns the loader of the templates of the sheet named
// name on disk, inside its project root (SPEC.md §2), reading files of at
// most maxBytes bytes (0: DefaultMaxBytes). It is the loader Load and
// Compile use when no WithLoader option is given.
func NewFileLoader(name string, maxBytes int) Loader { return check.NewFileLoader(name, maxBytes) }

// WithLoader reads the templates of the sheet through l instead of from the
// files beside it. l belongs to the one sheet it was made for.
func WithLoader(l Loader) Option {
	return func(c *config) { c.loader = l }
}

func (c config) checkOptions() check.Options {
	return check.Options{MaxCells: c.maxCells, MaxDepth: c.maxDepth, MaxBytes: c.maxBytes, MaxSteps: c.maxSteps, System: c.system, HasSystem: c.hasSystem, Loader: c.loader}
}
