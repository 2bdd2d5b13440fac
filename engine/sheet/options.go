package sheet

// Limits on what Parse accepts. A sheet is written by a person, so anything
// far beyond these is a mistake or an attack; refusing it with a diagnostic
// keeps a service that parses uploaded sheets from running out of memory.
const (
	DefaultMaxBytes = 4 << 20   // 4 MiB of source
	DefaultMaxLines = 1_000_000 // physical lines
)

// Option adjusts Parse.
type Option func(*config)

type config struct {
	maxBytes int
	maxLines int
}

func newConfig(opts []Option) config {
	c := config{maxBytes: DefaultMaxBytes, maxLines: DefaultMaxLines}
	for _, o := range opts {
		if o != nil {
			o(&c)
		}
	}
	return c
}

// MaxBytes sets the largest source Parse reads (default DefaultMaxBytes).
// A larger source gives one diagnostic and an empty file. n <= 0 means the
// default.
func MaxBytes(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxBytes = n
		}
	}
}

// MaxLines sets the largest number of physical lines Parse reads (default
// DefaultMaxLines). Lines past the limit are reported once and not read.
// n <= 0 means the default.
func MaxLines(n int) Option {
	return func(c *config) {
		if n > 0 {
			c.maxLines = n
		}
	}
}
