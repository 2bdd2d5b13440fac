package check

import (
	"fmt"
	"math"
)

// MaxEvalSteps is the default bound (Options.MaxSteps) on the work one
// evaluation of a cell may take, counted
// in typed nodes with every call of a user function expanded. Functions
// that call the one before them twice, thirty times over, are a few lines
// of text and a billion steps: they are refused before anything runs.
const MaxEvalSteps = 10_000_000

// budget reports every cell whose evaluation would take more than
// MaxEvalSteps steps, at the first such cell of a chain of calls only (one
// mistake, one message).
func (c *checker) budget() {
	p := c.prog
	limit := float64(MaxEvalSteps)
	if c.opt.MaxSteps > 0 {
		limit = float64(c.opt.MaxSteps)
	}
	cost := make([]float64, len(p.Cells)) // steps of one evaluation; +Inf: over budget, reported
	var walk func(n Node) float64
	walk = func(n Node) float64 {
		s := 1.0
		for k := range n.NArg() {
			s += walk(n.Arg(k))
		}
		if n.Op() == OpUser || n.Op() == OpFuncRef {
			s += cost[n.Index()]
		}
		return s
	}
	// steps counts the typed nodes of one formula reached from its roots.
	// A formula that calls no function of the sheet takes a step per node:
	// its count, kept while typing, saves a walk over every node of a
	// large sheet.
	steps := func(roots ...Node) float64 {
		if roots[0].IsZero() {
			return 0
		}
		if !roots[0].src.calls() {
			return float64(roots[0].src.count())
		}
		s := 0.0
		for _, r := range roots {
			s += walk(r)
		}
		return s
	}
	for _, i := range p.Order {
		cell := p.Cells[i]
		if cell.Type == nil {
			continue
		}
		s := steps(cell.Body()) + steps(cell.Extra().Demand, cell.Extra().Capacity) // a check's two sides are one formula
		for _, e := range cell.Extra().Entries {
			s += steps(e.Node)
		}
		if math.IsInf(s, 1) {
			cost[i] = s // a callee was reported
			continue
		}
		cost[i] = s
		if s > limit {
			cost[i] = math.Inf(1)
			c.errs.Errorf(cell.Formula.Source.Range, fmt.Sprintf("one evaluation of `%s` takes about %.3g steps, counting every call of the sheet's functions it makes; the limit is %.0f", cell.Name, s, limit),
				"a function that calls another twice doubles the work at every level: compute the inner value once in a cell of its own and call with it (or raise the limit, --max-eval-steps)",
				"`%s` is too costly to evaluate", cell.Name)
		}
	}
}
