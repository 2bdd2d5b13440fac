package engine

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/funcs"
)

// State is one set of values of a sheet. It keeps the values between
// evaluations: Set marks an input stale and Eval recomputes only the cells
// downstream of it. A State is not safe for concurrent use: Clone it for
// each worker.
type State struct {
	sheet *Sheet
	st    *eval.State
	// cmb holds the outcome of the combinations of a sheet with actions
	// (nil otherwise); st is then the base state the inputs are set on.
	cmb *comboState
}

// NewState returns a state with all inputs at their written values, not
// yet evaluated.
func (s *Sheet) NewState() *State {
	return &State{sheet: s, st: s.mach.NewState()}
}

// Sheet returns the sheet the state evaluates.
func (st *State) Sheet() *Sheet { return st.sheet }

// Set overrides the input name with v (SI: a float64 for a number, as
// ParseInput returns). Only inputs can be set, and v must fit the input's
// type (a number of the same dimension, a record with the same fields...).
func (st *State) Set(name string, v funcs.Value) error {
	c, err := st.sheet.settable(name)
	if err != nil {
		return err
	}
	if x, ok := v.(int); ok {
		v = float64(x)
	}
	if !fits(c.Type, v) {
		return fmt.Errorf("a value for `%s` must be %s, got %s", name, st.sheet.describe(c), describeFound(v))
	}
	st.st.Set(c.Index, v)
	return nil
}

// Reset returns an input to its written value.
func (st *State) Reset(name string) error {
	c, err := st.sheet.settable(name)
	if err != nil {
		return err
	}
	st.st.Reset(c.Index)
	return nil
}

// fits reports whether run-time value v fits static type t.
func fits(t *funcs.Type, v funcs.Value) bool {
	switch t.Kind {
	case funcs.Number:
		_, ok := v.(float64)
		return ok
	case funcs.Bool:
		_, ok := v.(bool)
		return ok
	case funcs.String:
		_, ok := v.(string)
		return ok
	case funcs.Record:
		r, ok := v.(*funcs.RecordValue)
		return ok && r.Type != nil && t.Accepts(r.Type) && r.Type.Accepts(t)
	case funcs.Table:
		r, ok := v.(*funcs.TableValue)
		return ok && r.Type != nil && t.Accepts(r.Type)
	case funcs.List:
		if t.Elem.Kind == funcs.Number {
			_, ok := v.([]float64)
			return ok
		}
		_, ok := v.([]funcs.Value)
		return ok
	}
	return false
}

// Eval evaluates what is stale (everything the first time) and returns
// the results of every cell.
func (st *State) Eval() *Results {
	st.Recompute()
	return st.Results()
}

// Recompute evaluates what is stale without building Results; for callers
// that read a few values with Value.
func (st *State) Recompute() {
	if st.sheet.combos != nil {
		st.recomputeCombos()
		return
	}
	st.st.Eval()
}

// Value returns the current SI value of a cell and whether it is known.
func (st *State) Value(name string) (funcs.Value, bool) {
	c := st.sheet.Lookup(name)
	if c == nil || !st.read().Known(c.Index) {
		return nil, false
	}
	return st.value(c), true
}

func (st *State) value(c *Cell) funcs.Value {
	e := st.read()
	if c.Type != nil && (c.Type.Kind == funcs.Number || c.Kind == Check) {
		return e.F.Num[c.Index]
	}
	return e.F.Val[c.Index]
}

// LastEvaluated returns the names of the cells the last Eval computed, in
// the order it computed them.
func (st *State) LastEvaluated() []string {
	var out []string
	for _, i := range st.lastIdx() {
		out = append(out, st.sheet.prog.Cells[i].Name)
	}
	return out
}

func (st *State) lastIdx() []int { return st.st.Last() }

// Clone returns an independent copy of the state (values, overrides and
// staleness), for batch workers.
func (st *State) Clone() *State {
	return &State{sheet: st.sheet, st: st.st.Clone(), cmb: st.cmb.clone()}
}

// settable returns the input cell name or an error saying why it cannot be
// set.
func (s *Sheet) settable(name string) (*Cell, error) {
	c := s.Lookup(name)
	if c == nil {
		var names []string
		for _, c := range s.prog.Cells {
			if c.Kind == Input {
				names = append(names, c.Name)
			}
		}
		msg := fmt.Sprintf("the sheet has no cell `%s`", name)
		if n := diag.Nearest(name, names); n != "" {
			msg += fmt.Sprintf("; did you mean `%s`?", n)
		}
		return nil, errors.New(msg)
	}
	switch c.Kind {
	case Input, Table:
		return c, nil
	case Check:
		return nil, fmt.Errorf("`%s` is a design check; only inputs can be set", name)
	case Function:
		return nil, fmt.Errorf("`%s` is a function; only inputs can be set", name)
	}
	deps := s.prog.DepNames(c)
	if len(deps) > 3 {
		deps = append(slices.Clone(deps[:3]), "...")
	}
	return nil, fmt.Errorf("`%s` is computed from %s; only inputs can be set", name, strings.Join(deps, ", "))
}

// describeFound says what a run-time value is, for a message that names
// what was found: "a number", "a record with fields E, f_y", "a list of 3".
func describeFound(v funcs.Value) string {
	switch v := v.(type) {
	case float64:
		return "a number"
	case bool:
		return "a yes/no value"
	case string:
		return "text"
	case []float64, []funcs.Value:
		return describeValue(v, DefaultSigFigs)
	case *funcs.RecordValue:
		if v.Type == nil {
			return "a record"
		}
		names := make([]string, len(v.Type.Fields))
		for i, f := range v.Type.Fields {
			names[i] = f.Name
		}
		return "a record with fields " + strings.Join(names, ", ")
	case *funcs.TableValue:
		if v.Type == nil {
			return "a table"
		}
		names := make([]string, len(v.Type.Fields))
		for i, f := range v.Type.Fields {
			names[i] = f.Name
		}
		return "a table with columns " + strings.Join(names, ", ")
	case nil:
		return "nothing"
	}
	return fmt.Sprintf("a %T", v)
}

// describe says what a value for input c must be, e.g. "a force (kN)".
func (s *Sheet) describe(c *Cell) string {
	if c.Type.Kind == funcs.Number {
		if c.Type.Dim.IsNone() {
			return "a plain number"
		}
		u := s.DisplayUnit(c)
		if u.Quantity != "" {
			a := "a "
			if strings.ContainsRune("aeiou", rune(u.Quantity[0])) {
				a = "an " // an angle, an area load
			}
			return a + u.Quantity + " (" + u.Symbol + ")"
		}
		return "a quantity in " + u.Symbol
	}
	return "a " + c.Type.Kind.String()
}

// ParseInput reads a value for the input name as written on a command line
// ("45 kN", "45kN", "24 mm", "0.3", "{E: 200 GPa, f_y: 355 MPa}") and
// checks it against the input's dimension. The value is in SI.
func (s *Sheet) ParseInput(name, text string) (funcs.Value, error) {
	c, err := s.settable(name)
	if err != nil {
		return nil, err
	}
	e := sheet.Expr{Text: text, Range: diag.NewSource("--set "+name, text).Span(0, len(text))}
	f, errs := formula.Parse(e, formula.Options{MaxDepth: s.cfg.maxDepth})
	if errs.HasErrors() {
		return nil, fmt.Errorf("cannot read %q for `%s`: %s", text, name, errs[0].Summary)
	}
	n, errs := s.prog.TypeValue(f, s.system)
	if errs.HasErrors() || n.IsZero() {
		msg := "not a value"
		if len(errs) > 0 {
			msg = errs[0].Summary
		}
		return nil, fmt.Errorf("cannot read %q for `%s`: %s", text, name, msg)
	}
	if c.HasUnit && c.Unit().Dim.IsNone() && c.Unit().Factor != 1 && len(f.Quantities()) == 0 && f.NumRefs() == 0 {
		// As in the sheet: `--set share=5` for a cell shown in % would be
		// 500 %; the unit is written, not guessed.
		return nil, fmt.Errorf("`%s` is shown in %s and a plain number is a fraction of one: write the unit, e.g. %s %s", name, c.Unit().Symbol, strings.TrimSpace(text), c.Unit().Symbol)
	}
	if c.Type.Kind == funcs.Number && n.Type().Kind == funcs.Number && n.Type().Dim != c.Type.Dim {
		got := "a plain number"
		if !n.Type().Dim.IsNone() {
			got = "of another dimension"
			if q := f.Quantities(); len(q) == 1 && q[0].Unit().Quantity != "" {
				got = "a " + q[0].Unit().Quantity
			}
		}
		hint := ""
		if n.Type().Dim.IsNone() {
			hint = fmt.Sprintf("; write the unit, e.g. %s %s", text, s.DisplayUnit(c).Symbol)
		}
		return nil, fmt.Errorf("`%s` must be %s, but %q is %s%s", name, s.describe(c), text, got, hint)
	}
	v, fail := eval.Value(n)
	if fail != nil {
		return nil, fmt.Errorf("cannot compute %q for `%s`: %s", text, name, fail.Msg)
	}
	if !fits(c.Type, v) {
		return nil, fmt.Errorf("a value for `%s` must be %s, got %s", name, s.describe(c), describeFound(v))
	}
	return v, nil
}
