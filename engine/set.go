package engine

import (
	"fmt"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/eval"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/funcs"
)

// SetText replaces an input with a value written as on a command line:
// `P` with "45 kN", a template's input `rod.d` with "20 mm", or one field
// of a record input, `steel.f_y` with "460 MPa" (the other fields keep
// their values). The value's dimension is checked against the input's or
// the field's.
func (st *State) SetText(name, text string) error {
	s := st.sheet
	if c := s.Lookup(name); c != nil || !strings.Contains(name, ".") {
		v, err := s.ParseInput(name, text)
		if err != nil {
			return err
		}
		return st.Set(name, v)
	}
	// The longest prefix that names a cell is the record; the rest is
	// the field (a template's record `rod.steel.f_y` has the cell
	// `rod.steel`).
	i := strings.LastIndex(name, ".")
	rec, field := name[:i], name[i+1:]
	c := s.Lookup(rec)
	if c == nil {
		_, err := s.settable(name)
		return err
	}
	if c.Type == nil || c.Type.Kind != funcs.Record {
		return fmt.Errorf("`%s` is %s, not a record: it has no field `%s`", rec, s.describe(c), field)
	}
	if _, err := s.settable(rec); err != nil {
		return err
	}
	k := c.Type.Field(field)
	if k < 0 {
		var names []string
		for _, f := range c.Type.Fields {
			names = append(names, f.Name)
		}
		msg := fmt.Sprintf("the record `%s` has no field `%s`; its fields are %s", rec, field, strings.Join(names, ", "))
		if n := diag.Nearest(field, names); n != "" {
			msg += fmt.Sprintf("; did you mean `%s.%s`?", rec, n)
		}
		return fmt.Errorf("%s", msg)
	}
	st.Recompute()
	cur, ok := st.Value(rec)
	r, isRec := cur.(*funcs.RecordValue)
	if !ok || !isRec {
		return fmt.Errorf("`%s` has no value to change a field of", rec)
	}
	if r.Payload != nil {
		// A payload is computed from the fields; changing one field
		// would leave it stale (a wrong answer with no warning).
		return fmt.Errorf("a field of `%s` cannot be set alone: the record is built by a function; set the inputs of that function", rec)
	}
	ft := c.Type.Fields[k].Type
	v, t, err := s.parseValue(name, text)
	if err != nil {
		return err
	}
	want := &Cell{Name: name, Type: ft, Kind: Input}
	if ft.Kind == funcs.Number && (t.Kind != funcs.Number || t.Dim != ft.Dim) {
		return fmt.Errorf("`%s` must be %s, but %q is not", name, s.describe(want), text)
	}
	if !fits(ft, v) {
		return fmt.Errorf("a value for `%s` must be %s, got %s", name, s.describe(want), describeFound(v))
	}
	nr := &funcs.RecordValue{Type: r.Type, Fields: slices.Clone(r.Fields)}
	nr.Fields[k] = v
	return st.Set(rec, nr)
}

// parseValue reads text as a value of its own (no cell names), in SI,
// with its static type.
func (s *Sheet) parseValue(label, text string) (funcs.Value, *funcs.Type, error) {
	e := sheet.Expr{Text: text, Range: diag.NewSource("--set "+label, text).Span(0, len(text))}
	f, errs := formula.Parse(e, formula.Options{MaxDepth: s.cfg.maxDepth})
	if errs.HasErrors() {
		return nil, nil, fmt.Errorf("cannot read %q for `%s`: %s", text, label, errs[0].Summary)
	}
	n, errs := s.prog.TypeValue(f, s.system)
	if errs.HasErrors() || n.IsZero() {
		msg := "not a value"
		if len(errs) > 0 {
			msg = errs[0].Summary
		}
		return nil, nil, fmt.Errorf("cannot read %q for `%s`: %s", text, label, msg)
	}
	v, fail := eval.Value(n)
	if fail != nil {
		return nil, nil, fmt.Errorf("cannot compute %q for `%s`: %s", text, label, fail.Msg)
	}
	return v, n.Type(), nil
}
