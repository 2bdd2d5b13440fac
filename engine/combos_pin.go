package engine

import (
	"math"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
)

// A pin is one call in_combination(X, "SLS-c 2") (SPEC.md §5a): the value
// of cell X in one named combination, which a later formula uses in every
// combination. The checker types the call; the engine, which knows the
// combinations, resolves the label and computes the value before the
// combinations are evaluated.
type pin struct {
	node  check.Node
	cell  int // the cell whose formula holds the call
	of    int // the cell X
	combo int // index into Combos.All
}

// findPins returns the in_combination calls of the sheet, in reading
// order, and refuses one in a user function's body (a function has no
// cell of its own to hold the value).
func findPins(prog *check.Program, errs *diag.List) []pin {
	if !prog.InCombination {
		return nil
	}
	var out []pin
	var walk func(c *check.Cell, n check.Node)
	walk = func(c *check.Cell, n check.Node) {
		if n.IsZero() {
			return
		}
		if n.Op() == check.OpBuiltin && n.Builtin() == check.BInCombo && n.NArg() == 2 {
			if c.Kind == Function {
				errs.Errorf(n.Range(), "a function has no cell of its own to hold the value of one combination",
					"compute `"+n.Text()+"` in a cell and pass that cell to the function", "in_combination in the function `%s`", c.Name)
				return
			}
			out = append(out, pin{node: n, cell: c.Index, of: int(n.Arg(0).Index()), combo: -1})
			return
		}
		for _, a := range n.Args() {
			walk(c, a)
		}
	}
	for _, c := range prog.Cells {
		xc := c.Extra()
		walk(c, c.Body())
		walk(c, xc.Demand)
		walk(c, xc.Capacity)
		for _, e := range xc.Entries {
			walk(c, e.Node)
		}
	}
	return out
}

// resolvePins finds the combination each pin names: by its label ("SLS-c
// 2") or by its words ("1.0 G + 1.0 Q", spaces as one). A label that names
// none is refused with the nearest one; a pinned cell that does not depend
// on an action is refused (it is the same in every combination, and the
// call suggests the writer thinks otherwise).
func (cs *Combos) resolvePins(prog *check.Program, pins []pin, errs *diag.List) {
	var labels []string
	for m := range cs.All {
		labels = append(labels, cs.All[m].Name, cs.Text(m))
	}
	norm := func(s string) string { return strings.Join(strings.Fields(s), " ") }
	for k := range pins {
		p := &pins[k]
		x := prog.Cells[p.of]
		at := p.node.Arg(1).Range()
		if !cs.Depends[p.of] {
			errs.Errorf(p.node.Arg(0).Range(), "`"+x.Name+"` does not depend on an action, so it is the same in every combination",
				"write `"+x.Name+"` alone", "`%s` has no combination to choose", x.Name)
			continue
		}
		want := norm(p.node.Arg(1).Str())
		for m := range cs.All {
			if norm(cs.All[m].Name) == want || norm(cs.Text(m)) == want {
				p.combo = m
				break
			}
		}
		if p.combo < 0 {
			hint := "`sheaf run --combinations` lists the combinations of the sheet"
			if n := diag.Nearest(want, labels); n != "" {
				hint = "did you mean `" + n + "`?"
			}
			// "ULS 7" of five: say which numbers there are.
			if sp := strings.LastIndexByte(want, ' '); sp > 0 {
				prefix := want[:sp+1]
				var same []string
				for _, c := range cs.All {
					if strings.HasPrefix(c.Name, prefix) {
						same = append(same, c.Name)
					}
				}
				if len(same) > 0 {
					hint = "the sheet's combinations of that kind are " + same[0] + " to " + same[len(same)-1] + "; `sheaf run --combinations` lists them"
				}
			}
			errs.Errorf(at, "in_combination names a combination by its label as the listing shows it (\"ULS 2\", \"SLS-c 1\") or in its words (\"1.35 G + 1.5 Q\")",
				hint, "no combination `%s`", want)
		}
	}
	// Evaluate the pins in dependency order of the cells they pin, so that
	// a pinned cell that itself reads a pin finds it set.
	pos := make([]int, len(prog.Cells))
	for k, i := range prog.Order {
		pos[i] = k
	}
	slices.SortStableFunc(pins, func(a, b pin) int { return pos[a.of] - pos[b.of] })
	cs.pins = pins
	// A cell whose formula pins one combination shows its name.
	cs.pinIn = make([]int, len(prog.Cells))
	for i := range cs.pinIn {
		cs.pinIn[i] = -1
	}
	for _, p := range pins {
		switch cs.pinIn[p.cell] {
		case -1:
			cs.pinIn[p.cell] = p.combo
		case p.combo:
		default:
			cs.pinIn[p.cell] = -2 // several: none named
		}
	}
}

// direct marks, per cell, whether an action reaches it other than through
// an in_combination call: such a cell takes another value in each
// combination. A cell reached only through pins depends on the
// characteristic values (dep) but is the same in every combination.
func direct(prog *check.Program, dep []bool, pins []pin) []bool {
	d := make([]bool, len(prog.Cells))
	if len(pins) == 0 {
		copy(d, dep)
		return d
	}
	inPin := map[int]map[int]bool{} // per cell: the cells it reads inside its pins only
	for _, p := range pins {
		if inPin[p.cell] == nil {
			inPin[p.cell] = map[int]bool{}
		}
		inPin[p.cell][p.of] = true
	}
	for cell, m := range inPin {
		c := prog.Cells[cell]
		var walk func(n check.Node)
		walk = func(n check.Node) {
			if n.IsZero() || n.Op() == check.OpBuiltin && n.Builtin() == check.BInCombo {
				return
			}
			if n.Op() == check.OpCell {
				delete(m, int(n.Index())) // also read outside a pin
			}
			for _, a := range n.Args() {
				walk(a)
			}
		}
		xc := c.Extra()
		walk(c.Body())
		walk(xc.Demand)
		walk(xc.Capacity)
		for _, e := range xc.Entries {
			walk(e.Node)
		}
	}
	for _, i := range prog.Order {
		c := prog.Cells[i]
		if c.Extra().Action != nil {
			d[i] = true
			continue
		}
		for _, j := range prog.Deps(i) {
			if d[j] && !inPin[i][int(j)] {
				d[i] = true
				break
			}
		}
	}
	return d
}

// evalPins sets the value of every pin in base: the pinned cell evaluated
// on a clone of base with the actions at their factors in the pin's
// combination. The cells that hold the calls are run again.
func (cs *Combos) evalPins(base *eval.State) {
	if len(cs.pins) == 0 {
		return
	}
	m := base.M
	if len(base.F.Pins) != len(m.Pins) {
		base.F.Pins = make([]float64, len(m.Pins))
		for k := range base.F.Pins {
			base.F.Pins[k] = math.NaN()
		}
	}
	for _, p := range cs.pins {
		k := slices.Index(m.Pins, p.node)
		if k < 0 {
			continue
		}
		w := base.Clone()
		f := cs.All[p.combo].Factors
		for a, c := range cs.Cells {
			if base.Known(c.Index) {
				w.Set(c.Index, f[a]*base.F.Num[c.Index])
			}
		}
		w.Eval()
		v := math.NaN()
		if w.Known(p.of) {
			v = w.F.Num[p.of]
		}
		if base.F.Pins[k] != v || math.IsNaN(v) {
			base.F.Pins[k] = v
			base.Touch(p.cell)
			base.Eval()
		}
	}
}
