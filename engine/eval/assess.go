package eval

import (
	"math"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Assess says why check c cannot be assessed with demand d and capacity
// cp (SI), or returns nil when its utilisation d / cp means what it says.
//
// A utilisation is the share of the capacity the demand uses up, so both
// must be of one sense: a capacity is positive, and a demand of the other
// sign (compression in a check written for tension) would give a negative
// utilisation that passes whatever its size. Such a check is not assessed,
// with the reason, never passed (DESIGN.md, Trust).
func Assess(c *check.Cell, d, cp float64) *diag.Diagnostic {
	r := c.Formula.Source.Range
	switch {
	case cp < 0 && d <= 0 && isFinite(cp) && isFinite(d):
		// Both sides negative: a check written in the sign convention
		// (compression negative) rather than on magnitudes.
		return &diag.Diagnostic{Range: r,
			Summary: "check `" + c.Name + "` cannot be assessed: the capacity is negative",
			Detail:  "utilisation is demand / capacity, both positive; here both sides are negative, as compression is in the sign convention",
			Hint:    "write the check on magnitudes, e.g. `check buckling: -N_Ed <= -N_c` or with the resistance as a positive number"}
	case !(cp > 0) || math.IsInf(cp, 0):
		return &diag.Diagnostic{Range: r,
			Summary: "check `" + c.Name + "` cannot be assessed: the capacity must be a positive finite number",
			Detail:  "utilisation is demand / capacity; with these inputs the capacity is not positive",
			Hint:    "check the inputs of the capacity side"}
	case !isFinite(d):
		return &diag.Diagnostic{Range: r,
			Summary: "check `" + c.Name + "` cannot be assessed: the demand is not a finite number",
			Detail:  "utilisation is demand / capacity; with these inputs the demand overflowed or is NaN",
			Hint:    "check the inputs of the demand side"}
	case d < 0:
		is, written := OppositeSense(c)
		return &diag.Diagnostic{Range: r,
			Summary: "check `" + c.Name + "` not assessed: demand is " + is + "; this check is written for " + written,
			Detail: "the demand `" + c.Extra().Demand.Text() + "` is negative and the capacity positive: the utilisation " +
				"would be negative and pass whatever the size of the demand",
			Hint: "if the member can take both senses, check each with its own resistance (e.g. `check buckling: -N_Ed <= N_bRd`); " +
				"if the other sense is harmless, say so: `max(N_Ed, 0 kN) <= N_Rd`"}
	}
	return nil
}

var (
	forceDim, _  = units.QuantityDim("force")
	stressDim, _ = units.QuantityDim("stress")
)

// OppositeSense names the sense of a negative demand of check c and the
// sense the check is written for. Forces and stresses are positive in
// tension (the sign convention of funcs/bar and of SPEC.md's examples), so
// a negative `N_Ed` is compression in a check written for tension, and a
// negative `-N_Ed` tension in one written for compression. Other
// quantities are just negative where a positive demand is expected.
func OppositeSense(c *check.Cell) (is, writtenFor string) {
	dem := c.Extra().Demand
	if dem.IsZero() || dem.Type() == nil || (dem.Type().Dim != forceDim && dem.Type().Dim != stressDim) {
		return "negative", "a positive demand"
	}
	if dem.Op() == check.OpNeg {
		return "tension", "compression"
	}
	return "compression", "tension"
}

// Governing returns the term that governs the capacity of check cell i
// when the capacity is a min(...) or max(...) of several terms, written in
// the check or in the cell the check names (`N_Rd = min(N_plRd, N_bRd)`),
// and nil otherwise or when the check has no value. The terms are
// evaluated again on the current values; the first of equal terms wins.
func (s *State) Governing(i int) check.Node {
	c := s.M.P.Cells[i]
	if c.Kind != check.Check || !s.known[i] || c.Extra().Capacity.IsZero() {
		return check.Node{}
	}
	n := c.Extra().Capacity
	if n.Op() == check.OpCell {
		if k := int(n.Index()); k >= 0 && k < len(s.M.P.Cells) && !s.M.P.Cells[k].Body().IsZero() && s.known[k] {
			n = s.M.P.Cells[k].Body()
		}
	}
	if n.Op() != check.OpBuiltin || (n.Builtin() != check.BMin && n.Builtin() != check.BMax) || n.NArg() < 2 {
		return check.Node{}
	}
	best, bestV := -1, 0.0
	f := &s.F
	// The frame may still hold the failure of another cell: keep it
	// apart while the terms are evaluated.
	saved := f.Fail
	f.Fail = nil
	defer func() { f.Fail = saved }()
	for k, a := range n.Args() {
		if a.Type() == nil || a.Type().Kind != funcs.Number {
			return check.Node{}
		}
		v := s.M.numOf(a)(f)
		if f.Fail != nil || math.IsNaN(v) {
			return check.Node{}
		}
		if best < 0 || (n.Builtin() == check.BMin && v < bestV) || (n.Builtin() == check.BMax && v > bestV) {
			best, bestV = k, v
		}
	}
	return n.Arg(best)
}

// Uncomputed returns the number of cells with a problem that are not
// checks refused by Assess: the cells that could not be computed. It costs
// nothing while no cell has had a problem.
func (s *State) Uncomputed() int {
	n := 0
	for i, p := range s.problems {
		if p != nil && !s.Unassessed(i) {
			n++
		}
	}
	return n
}
