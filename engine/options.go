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
	DefaultMaxBytes = sheet.DefaultMaxBytes
	DefaultMaxLines = sheet.DefaultMaxLines
	DefaultMaxCells = 200_000
	DefaultMaxDepth = formula.DefaultMaxDepth
	DefaultSigFigs  = 4
)

// Option adjusts Load and Compile.
type Option func(*config)

type config struct {
	maxBytes  int
	maxLines  int
	maxCells  int
	maxDepth  int
	system    units.System
	hasSystem bool
	sigFigs   int
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

func (c config) checkOptions() check.Options {
	return check.Options{MaxCells: c.maxCells, MaxDepth: c.maxDepth, MaxBytes: c.maxBytes, System: c.system, HasSystem: c.hasSystem}
}
