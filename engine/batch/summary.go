package batch

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// CheckSummary counts how one design check fared over the cases.
type CheckSummary struct {
	Name      string
	Failed    int     // cases where the utilisation exceeds 1
	Unknown   int     // cases where the check could not be assessed
	Worst     float64 // highest utilisation over the cases; NaN if none known
	WorstCase int     // its case number (the first, on a tie); 0 if none
	WorstLine int     // its line in the case table
}

// Summary is the tally of a batch run.
type Summary struct {
	Cases int // rows in the table
	Bad   int // rows that could not be read
	// Uncomputed counts the cases with a cell that could not be computed.
	Uncomputed int
	Checks     []CheckSummary
}

// Failing reports whether any case failed a check or could not assess one.
func (s *Summary) Failing() bool {
	for _, c := range s.Checks {
		if c.Failed > 0 || c.Unknown > 0 {
			return true
		}
	}
	return false
}

// Summarize tallies the outcome, in case order, so the result does not
// depend on the order the workers finished in.
func (o *Outcome) Summarize() *Summary {
	s := &Summary{Cases: len(o.Rows), Checks: make([]CheckSummary, len(o.Checks))}
	for k, c := range o.Checks {
		s.Checks[k] = CheckSummary{Name: c.Name, Worst: math.NaN()}
	}
	for i := range o.Rows {
		r := &o.Rows[i]
		if r.Case.Err != nil {
			s.Bad++
			continue
		}
		if r.Uncomputed {
			s.Uncomputed++
		}
		for k, u := range r.Utils {
			cs := &s.Checks[k]
			switch {
			case math.IsNaN(u):
				cs.Unknown++
				continue
			case u > 1:
				cs.Failed++
			}
			if math.IsNaN(cs.Worst) || u > cs.Worst {
				cs.Worst, cs.WorstCase, cs.WorstLine = u, r.Case.N, r.Case.Line
			}
		}
	}
	return s
}

// Write writes the summary for a person: one line per check, failing
// checks first marked, then the count of bad rows. file names the case
// table in positions.
func (s *Summary) Write(w io.Writer, file string) error {
	var b strings.Builder
	good := s.Cases - s.Bad
	if good == 0 {
		// Nothing was evaluated: no check line may read as "ok".
		if s.Cases == 0 {
			b.WriteString("no case evaluated: the table has a header but no rows\n")
		} else {
			rows := fmt.Sprintf("all %d rows of %s are bad", s.Cases, file)
			if s.Cases == 1 {
				rows = fmt.Sprintf("the only row of %s is bad", file)
			}
			fmt.Fprintf(&b, "no case evaluated: %s (see above); no check was assessed\n", rows)
		}
		_, err := io.WriteString(w, b.String())
		return err
	}
	b.WriteString(plural.Count(good, "case") + " evaluated")
	if s.Bad > 0 {
		b.WriteString(", " + plural.Count(s.Bad, "bad row") + " skipped")
	}
	if s.Uncomputed > 0 {
		b.WriteString(", " + plural.Count(s.Uncomputed, "case") + " with cells that could not be computed")
	}
	b.WriteString("\n")
	width := 0
	for _, c := range s.Checks {
		width = max(width, len([]rune(c.Name)))
	}
	for _, c := range s.Checks {
		mark := "ok  "
		if c.Failed > 0 || c.Unknown > 0 {
			mark = "FAIL"
		}
		fmt.Fprintf(&b, "  %s check %-*s  fails in %d of %d", mark, width, c.Name, c.Failed, good)
		if c.Unknown > 0 {
			fmt.Fprintf(&b, ", not assessed in %d", c.Unknown)
		}
		if !math.IsNaN(c.Worst) {
			fmt.Fprintf(&b, "; worst utilisation %s in case %d (%s:%d)", units.FormatNumber(c.Worst, 4), c.WorstCase, file, c.WorstLine)
		}
		b.WriteString("\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}
