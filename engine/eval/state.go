package eval

import (
	"iter"
	"math"
	"math/bits"
	"slices"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/funcs"
)

// State holds the values of one evaluation of a Machine. A State is not
// safe for concurrent use; Clone gives each worker its own.
type State struct {
	M     *Machine
	F     Frame
	known []bool // Known reads it, SetKnown writes it from outside
	// allKnown is set while every cell is known and nothing but the
	// state's own evaluation has written known since: an incremental Eval
	// then needs no look at the dependencies of a cell (see Eval).
	allKnown bool
	Demand   []float64          // check cells: demand in SI
	Capacity []float64          // check cells: capacity in SI
	problems []*diag.Diagnostic // nil until the first problem; Problem reads it
	over     []bool             // overridden inputs
	// over starts as the machine's shared empty slice (most
	// states never write either) and are copied on the first write.
	ownOver bool
	dirty   []int
	// stale has one bit per position of Program.Order: the cells an
	// incremental Eval must run. Reading the bits in order gives them in
	// evaluation order without a sort; Eval leaves every bit clear.
	stale []uint64
	done  bool
	last  []int
	// lastShared is set while last is Program.Order itself, which must
	// not be appended to.
	lastShared bool
}

// NewState returns a state with every input at its written value, not yet
// evaluated.
func (m *Machine) NewState() *State {
	n := len(m.P.Cells)
	s := &State{
		M:     m,
		F:     Frame{Num: make([]float64, n), Stack: make([]float64, 0, 16)},
		known: make([]bool, n),
		over:  m.noOver,
	}
	// A sheet of numbers and no checks (the large generated ones) needs
	// neither general values nor check sides: a fresh state is then a
	// third of the memory, and on a large sheet memory is time.
	if m.needVal {
		s.F.Val = make([]funcs.Value, n)
	}
	if m.hasCheck {
		s.Demand = make([]float64, n)
		s.Capacity = make([]float64, n)
	}
	return s
}

// Clone copies the state. Values are shared where they are immutable
// (records, lists, tables), so a clone costs a few slice copies.
func (s *State) Clone() *State {
	c := &State{
		M:        s.M,
		F:        Frame{Num: slices.Clone(s.F.Num), Val: slices.Clone(s.F.Val), Stack: make([]float64, 0, 16), Pins: slices.Clone(s.F.Pins)},
		known:    slices.Clone(s.known),
		allKnown: s.allKnown,
		Demand:   slices.Clone(s.Demand),
		Capacity: slices.Clone(s.Capacity),
		over:     s.over,
		// Own lists are copied; the machine's shared empty ones are not.
		problems: slices.Clone(s.problems),
		ownOver:  s.ownOver,
		dirty:    slices.Clone(s.dirty),
		done:     s.done,
		last:     slices.Clone(s.last),
	}
	if c.ownOver {
		c.over = slices.Clone(s.over)
	}
	return c
}

// Set overrides cell i with v (already checked against its type) and marks
// it stale.
func (s *State) Set(i int, v funcs.Value) {
	if x, ok := v.(float64); ok {
		s.F.Num[i] = x
		if s.F.Val != nil {
			s.F.Val[i] = nil
		}
	} else {
		if s.F.Val == nil {
			s.F.Val = make([]funcs.Value, len(s.F.Num))
		}
		s.F.Val[i] = v
	}
	s.ownOverrides()
	s.over[i] = true
	s.dirty = append(s.dirty, i)
}

// Reset returns cell i to its written expression and marks it stale.
func (s *State) Reset(i int) {
	s.ownOverrides()
	s.over[i] = false
	s.dirty = append(s.dirty, i)
}

// Touch marks cell i stale, to be run again by the next Eval (its
// Frame.Pins changed).
func (s *State) Touch(i int) { s.dirty = append(s.dirty, i) }

// Overridden reports whether cell i holds a value set with Set.
func (s *State) Overridden(i int) bool { return s.over[i] }

// Eval evaluates every stale cell: all of them the first time, then only
// the cells downstream of inputs set since. It returns the indices of the
// cells evaluated, in evaluation order, that of Program.Order (valid until
// the next Eval; read only: after the first Eval it is the program's Order
// itself).
func (s *State) Eval() []int {
	p := s.M.P
	if !s.done {
		s.done = true
		s.dirty = s.dirty[:0]
		// The order itself is the list of cells evaluated: shared, not
		// copied (a copy is most of a megabyte on a large sheet).
		s.last, s.lastShared = p.Order[:len(p.Order):len(p.Order)], true
		s.full()
		return s.last
	}
	if s.lastShared {
		s.last, s.lastShared = nil, false
	}
	s.last = s.last[:0]
	if len(s.dirty) == 0 {
		return s.last
	}
	m, f := s.M, &s.F
	if s.stale == nil {
		s.stale = make([]uint64, (len(p.Order)+63)/64)
	}
	stale, pos := s.stale, m.topoPos
	mark := func(i int) bool {
		k := pos[i]
		w, b := k>>6, uint64(1)<<(k&63)
		if stale[w]&b != 0 {
			return false
		}
		stale[w] |= b
		return true
	}
	// The cells downstream of the dirty ones, breadth first, in s.last
	// as a work list.
	for _, i := range s.dirty {
		if mark(i) {
			s.last = append(s.last, i)
		}
	}
	s.dirty = s.dirty[:0]
	for k := 0; k < len(s.last); k++ {
		for _, u := range p.Users(s.last[k]) {
			if u := int(u); mark(u) {
				s.last = append(s.last, u)
			}
		}
	}
	// They run in the order of the bits, Program.Order, and are listed
	// again in s.last as they run. While every cell was known before and
	// every cell run so far is known, the dependencies of the next are
	// known: each is either not stale, so known as before, or stale and
	// run before it. Then (trust) a cell is not looked at any further.
	trust := s.allKnown
	defer func() { s.allKnown = trust }()
	n := len(s.last)
	s.last = s.last[:0]
	for w, word := range stale {
		for word != 0 {
			i := p.Order[w<<6+bits.TrailingZeros64(word)]
			word &= word - 1
			s.last = append(s.last, i)
			if c := m.codeOf(i); len(c) > 0 && !s.over[i] && (trust || s.depsKnown(i)) {
				f.Fail, f.Args = nil, nil
				if v := m.exec(f, c); f.Fail == nil && v-v == 0 { // v-v is NaN for NaN and ±Inf
					s.setProblem(i, nil)
					f.Num[i], s.known[i] = v, true
					continue
				}
			}
			s.run(i) // the general path, which also reports a failure
			trust = trust && s.known[i]
		}
		stale[w] = 0
		if len(s.last) == n {
			break
		}
	}
	return s.last
}

// full evaluates every cell in Program.Order, on a state not yet
// evaluated (so no cell is known and none has a problem yet). While every
// cell so far is known, the dependencies of the next one are known too
// (they come before it in the order), so a Number cell needs no look at
// them: it runs its body and stores the value. The first cell left
// unknown switches to run, which checks the dependencies of each cell.
func (s *State) full() {
	f := &s.F
	num, known, over := f.Num, s.known, s.over
	m := s.M
	order := m.P.Order
	for k, i := range order {
		code := m.codeOf(i)
		if len(code) == 0 || over[i] {
			s.run(i)
			if !known[i] {
				s.rest(order[k+1:])
				return
			}
			continue
		}
		v := m.exec(f, code)
		if f.Fail != nil || v-v != 0 { // v-v is NaN for NaN and ±Inf
			s.numDone(m.P.Cells[i], v)
			s.rest(order[k+1:])
			return
		}
		num[i] = v
		known[i] = true
	}
	s.allKnown = true // the loop ran to its end: every cell is known
}

// rest evaluates the remaining cells of a full evaluation with run.
func (s *State) rest(order []int) {
	for _, i := range order {
		s.run(i)
	}
}

// numDone stores v, the value of Number cell c just computed, or reports
// why c has none.
func (s *State) numDone(c *check.Cell, v float64) {
	f := &s.F
	i := c.Index
	if f.Fail != nil {
		s.failed(c, f.Fail)
		return
	}
	if !isFinite(v) {
		s.setProblem(i, &diag.Diagnostic{Range: c.Formula.Source.Range,
			Summary: "`" + c.Name + "` is not a finite number with these inputs",
			Detail:  "the formula overflowed or produced NaN; cells that use it are skipped",
			Hint:    "check the inputs and the formula"})
		return
	}
	f.Num[i] = v
	s.known[i] = true
}

// run evaluates cell i.
func (s *State) run(i int) {
	c := s.M.P.Cells[i]
	s.setProblem(i, nil)
	s.known[i] = false
	if c.Type == nil {
		return
	}
	for _, j := range s.M.P.Deps(i) {
		if !s.known[j] {
			return // skipped: the failing cell reported it
		}
	}
	f := &s.F
	f.Fail = nil
	f.Args = nil
	switch c.Kind {
	case check.Function:
		s.known[i] = true
		return
	case check.Table:
		if !s.over[i] && s.M.valAt(i) == nil { // a table of numbers as written
			f.Val[i] = c.Extra().Table
			s.known[i] = true
			return
		}
		// A table with entries that follow cells takes the general path.
	case check.Check:
		d := s.M.demand[i](f)
		cp := s.M.capacity[i](f)
		if f.Fail != nil {
			s.Demand[i], s.Capacity[i] = nan, nan // not computed (see Unassessed)
			s.failed(c, f.Fail)
			return
		}
		s.Demand[i], s.Capacity[i] = d, cp
		if p := Assess(c, d, cp); p != nil {
			s.setProblem(i, p)
			return
		}
		f.Num[i] = d / cp
		s.known[i] = true
		return
	}
	if s.over[i] {
		s.known[i] = true
		return
	}
	if sp := s.M.codeOf(i); len(sp) > 0 {
		s.numDone(c, s.M.exec(f, sp))
		return
	}
	if fn := s.M.valAt(i); fn != nil {
		v := fn(f)
		if f.Fail != nil {
			s.failed(c, f.Fail)
			return
		}
		f.Val[i] = v
		s.known[i] = true
	}
}

// Unassessed reports whether cell i is a design check whose two sides were
// computed but which cannot be assessed (Assess refused them): a verdict
// that is missing, not a cell that failed to compute.
func (s *State) Unassessed(i int) bool {
	c := s.M.P.Cells[i]
	if c.Kind != check.Check || s.known[i] || s.Problem(i) == nil || s.Demand == nil {
		return false
	}
	return !math.IsNaN(s.Demand[i]) && !math.IsNaN(s.Capacity[i])
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func (s *State) failed(c *check.Cell, fl *Failure) {
	r := c.Formula.Source.Range
	detail := "`" + c.Name + "` has no value; cells that use it are skipped"
	if !fl.Node.IsZero() {
		if nr := fl.Node.Range(); nr.Start().IsValid() {
			if fl.Func == "" {
				r = nr
			} else {
				// The message stays on the cell's line: a function that
				// fails for several cells would otherwise put all their
				// messages on its own line, where one per line survives.
				detail = "it fails inside `" + fl.Func + "`, at " + nr.Start().String() + "; " + detail
			}
		}
	}
	s.setProblem(c.Index, &diag.Diagnostic{Range: r, Summary: "`" + c.Name + "` cannot be computed: " + fl.Msg, Detail: detail, Hint: fl.Hint})
}

// Last returns the indices of the cells the last Eval computed, in the
// order of Program.Order.
func (s *State) Last() []int { return s.last }

// setProblem records d (nil: none) as the problem of cell i. A state has
// no problem list until its first problem: a fresh state of a large sheet
// then costs a slice less, and clearing a problem it never had writes
// nothing.
func (s *State) setProblem(i int, d *diag.Diagnostic) {
	if s.problems == nil {
		if d == nil {
			return
		}
		s.problems = make([]*diag.Diagnostic, len(s.F.Num))
	}
	s.problems[i] = d
}

// Known reports whether cell i has a value.
func (s *State) Known(i int) bool { return s.known[i] }

// SetKnown records whether cell i has a value, for a caller that puts
// together a state from others (as SetProblem). The next Eval then looks
// at the dependencies of every cell it runs.
func (s *State) SetKnown(i int, v bool) {
	s.known[i] = v
	s.allKnown = false
}

// Problem returns the problem of cell i, nil when it has none.
func (s *State) Problem(i int) *diag.Diagnostic {
	if s.problems == nil {
		return nil
	}
	return s.problems[i]
}

// Problems yields the cells that have a problem, with it, in the order of
// Program.Cells.
func (s *State) Problems() iter.Seq2[int, *diag.Diagnostic] {
	return func(yield func(int, *diag.Diagnostic) bool) {
		for i, p := range s.problems {
			if p != nil && !yield(i, p) {
				return
			}
		}
	}
}

// SetProblem records d (nil: none) as the problem of cell i, for a caller
// that puts together a state from others: the engine shows each check of a
// sheet with actions at its governing combination, with the reason it is
// not assessed there.
func (s *State) SetProblem(i int, d *diag.Diagnostic) { s.setProblem(i, d) }

// ownOverrides gives the state its own list of overrides before it
// writes one (it starts with the machine's shared empty list).
func (s *State) ownOverrides() {
	if !s.ownOver {
		s.over, s.ownOver = slices.Clone(s.over), true
	}
}

// depsKnown reports whether every dependency of cell i has a value.
func (s *State) depsKnown(i int) bool {
	known := s.known
	for _, j := range s.M.P.Deps(i) {
		if !known[j] {
			return false
		}
	}
	return true
}
