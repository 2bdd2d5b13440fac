package report

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Paper sizes the print style knows.
const (
	A4     = "a4"
	Letter = "letter"
)

// Options tune a report.
type Options struct {
	// Paper is A4 (the default when empty) or Letter.
	Paper string
	// Version is the Sheaf version printed in the title block; when empty,
	// BuildVersion gives it.
	Version string
	// Stamp, when not zero, prints the time of the run in the title block;
	// without it the same sheet gives the same bytes.
	Stamp time.Time
	// SigFigs is the number of significant figures (engine.DefaultSigFigs
	// when zero).
	SigFigs int
	// Live, when not empty, is the URL of a stream of server-sent events
	// that replace the page's content (the live preview of sheaf watch).
	Live string
}

// doc is one report being written.
type doc struct {
	s    *engine.Sheet
	res  *engine.Results
	prog *check.Program
	src  diag.Sources
	opt  Options
	sig  int
	hash string // SHA-256 of the sheet, hex
	fig  int    // figures numbered so far
	b    strings.Builder
	// use is the prefix of the template use being written ("access."):
	// its cells, overrides included, show their names without it.
	usePrefix string
	replaced  map[string]bool // the inputs the use being written replaces, by full name
}

// Write writes the report of sheet s with results r to w.
func Write(w io.Writer, s *engine.Sheet, r *engine.Results, o Options) error {
	_, err := io.WriteString(w, Render(s, r, o))
	return err
}

// Render returns the report of sheet s with results r as HTML.
func Render(s *engine.Sheet, r *engine.Results, o Options) string {
	if o.Paper == "" {
		o.Paper = A4
	}
	if o.Version == "" {
		o.Version = BuildVersion()
	}
	d := &doc{s: s, res: r, prog: s.Program(), src: s.Sources(), opt: o, sig: o.SigFigs}
	if d.sig <= 0 {
		d.sig = engine.DefaultSigFigs
	}
	d.hash = Hash(s.Source())
	d.b.Grow(64 << 10)
	d.page()
	return d.b.String()
}

// Hash is the SHA-256 of a file's bytes in hex, as the title block prints it.
func Hash(src []byte) string {
	h := sha256.Sum256(src)
	return hex.EncodeToString(h[:])
}

// ValidPaper reports whether p names a paper size the report knows.
func ValidPaper(p string) bool { return p == A4 || p == Letter || p == "" }

func (d *doc) w(s ...string) {
	for _, x := range s {
		d.b.WriteString(x)
	}
}

func (d *doc) wf(format string, args ...any) { fmt.Fprintf(&d.b, format, args...) }

// text is the source text a node was typed from (its span in the file).
func (d *doc) text(n check.Node) string {
	r := n.Range()
	src := d.src[r.Start().File]
	if src == nil || r.Start().Offset < 0 || r.End().Offset > len(src) || r.Start().Offset >= r.End().Offset {
		return ""
	}
	return string(src[r.Start().Offset:r.End().Offset])
}

func (d *doc) cellName(i int) string {
	if i < 0 || i >= len(d.prog.Cells) {
		return "?"
	}
	return d.prog.Cells[i].Name
}

// unitFor is the unit a number of dimension dim is shown in when no cell
// names one: the preferred unit of the sheet's system, else SI.
func (d *doc) unitFor(dim units.Dim) units.Unit {
	u, _ := units.Preferred(dim, d.s.System())
	if u.Factor == 0 {
		u.Factor = 1
	}
	return u
}

// eval returns the value a cell, a field of a record, a column of a table
// or an element of a list at a constant index stands for.
func (d *doc) eval(n check.Node) (funcs.Value, bool) {
	switch n.Op() {
	case check.OpCell:
		cr := &d.res.Cells[n.Index()]
		return cr.Value, cr.Known
	case check.OpField:
		v, ok := d.eval(n.Arg(0))
		if !ok {
			return nil, false
		}
		if r, ok := v.(*funcs.RecordValue); ok && int(n.Index()) < len(r.Fields) {
			return r.Fields[n.Index()], true
		}
	case check.OpColumn:
		v, ok := d.eval(n.Arg(0))
		if !ok {
			return nil, false
		}
		if t, ok := v.(*funcs.TableValue); ok && int(n.Index()) < len(t.Cols) {
			return t.Cols[n.Index()], true
		}
	case check.OpIndex:
		if n.Arg(1).Op() != check.OpConst {
			return nil, false
		}
		v, ok := d.eval(n.Arg(0))
		if !ok {
			return nil, false
		}
		i := int(n.Arg(1).Num())
		if float64(i) != n.Arg(1).Num() || i < 0 {
			return nil, false
		}
		switch l := v.(type) {
		case []float64:
			if i < len(l) {
				return l[i], true
			}
		case []funcs.Value:
			if i < len(l) {
				return l[i], true
			}
		}
	}
	return nil, false
}

// formatSI writes a number in unit u as plain text ("111.5 MPa").
func (d *doc) formatSI(si float64, u units.Unit) string {
	s := units.FormatNumber(si/u.Factor, d.sig)
	if p := u.Pretty(); p != "" && p != "1" {
		s += " " + p
	}
	return strings.Replace(s, "-", "−", 1)
}
