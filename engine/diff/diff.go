package diff

import (
	"math"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/export/text"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// DefaultRelTol is the relative change below which a result counts as
// unchanged: far below what a design reads, far above float noise.
const DefaultRelTol = 1e-6

// Options tune Compare.
type Options struct {
	// RelTol is the relative tolerance on results: a value changed when
	// |new-old| > RelTol·max(|old|,|new|). Zero or less means DefaultRelTol.
	RelTol float64
}

// Change is one value or text that differs. Old and New are texts (a
// header value, a formula, or a value as the listing shows it); a number
// also comes as numbers with their units: in SI (OldSI, NewSI in SIUnit)
// and in each version's display unit.
type Change struct {
	Name     string   `json:"name"`
	Kind     string   `json:"kind,omitempty"`
	Old      string   `json:"old"`
	New      string   `json:"new"`
	OldSI    *float64 `json:"old_si,omitempty"`
	NewSI    *float64 `json:"new_si,omitempty"`
	SIUnit   string   `json:"si_unit,omitempty"`
	OldValue *float64 `json:"old_value,omitempty"`
	OldUnit  string   `json:"old_unit,omitempty"`
	NewValue *float64 `json:"new_value,omitempty"`
	NewUnit  string   `json:"new_unit,omitempty"`
	// Rel is (new-old)/|old| for numbers with a non-zero old value.
	Rel *float64 `json:"rel,omitempty"`
}

// Cell is a cell present in one version only. Unit is the display unit as
// written ("" when none was), Value the text the listing shows; a number is
// also given as Number in NumberUnit (its display unit) and SI in SIUnit.
type Cell struct {
	Name       string   `json:"name"`
	Kind       string   `json:"kind"`
	Unit       string   `json:"unit,omitempty"`
	Expr       string   `json:"expr,omitempty"`
	Value      string   `json:"value"`
	Number     *float64 `json:"number,omitempty"`
	NumberUnit string   `json:"number_unit,omitempty"`
	SI         *float64 `json:"si,omitempty"`
	SIUnit     string   `json:"si_unit,omitempty"`
}

// CheckChange is a design check whose verdict or utilisation changed.
type CheckChange struct {
	Name       string   `json:"name"`
	OldUtil    *float64 `json:"old_util"` // nil when absent or not assessed
	NewUtil    *float64 `json:"new_util"`
	OldVerdict string   `json:"old_verdict"` // "pass", "fail", "not assessed" or "absent"
	NewVerdict string   `json:"new_verdict"`
	// FlippedToFail: it passed (or did not exist) and now fails or cannot
	// be assessed.
	FlippedToFail bool `json:"flipped_to_fail"`
}

// Schema is the version of the JSON of a report (its "schema" key; see
// schema/sheaf.schema.json).
const Schema = "sheaf.diff/1"

// Report is the difference between two results.
type Report struct {
	Schema   string        `json:"schema"`
	ExitCode int           `json:"exit_code"` // set by the command that writes it
	Old      string        `json:"old"`
	New      string        `json:"new"`
	RelTol   float64       `json:"rel_tol"`
	Header   []Change      `json:"header"`
	Inputs   []Change      `json:"inputs"`
	Formulas []Change      `json:"formulas"`
	Added    []Cell        `json:"added"`
	Removed  []Cell        `json:"removed"`
	Results  []Change      `json:"results"`
	Checks   []CheckChange `json:"checks"`
	Flipped  int           `json:"flipped_to_fail"`
}

// Empty reports whether nothing changed.
func (r *Report) Empty() bool {
	return len(r.Header)+len(r.Inputs)+len(r.Formulas)+len(r.Added)+len(r.Removed)+len(r.Results)+len(r.Checks) == 0
}

// Compare compares the results of the old version (named oldName in the
// report) with those of the new one.
func Compare(oldName string, old *engine.Results, newName string, cur *engine.Results, o Options) *Report {
	tol := o.RelTol
	if !(tol > 0) {
		tol = DefaultRelTol
	}
	r := &Report{Schema: Schema, Old: oldName, New: newName, RelTol: tol,
		Header: []Change{}, Inputs: []Change{}, Formulas: []Change{}, Added: []Cell{}, Removed: []Cell{}, Results: []Change{}, Checks: []CheckChange{}}
	r.header(old.Meta, cur.Meta)
	oldBy := make(map[string]*engine.CellResult, len(old.Cells))
	for i := range old.Cells {
		oldBy[old.Cells[i].Cell.Name] = &old.Cells[i]
	}
	newBy := make(map[string]bool, len(cur.Cells))
	for i := range cur.Cells {
		nc := &cur.Cells[i]
		newBy[nc.Cell.Name] = true
		oc := oldBy[nc.Cell.Name]
		switch {
		case oc == nil:
			r.Added = append(r.Added, cellOf(nc))
			if nc.Cell.Kind == engine.Check {
				r.check(nil, nc, tol)
			}
		default:
			r.compare(oc, nc, tol)
		}
	}
	for i := range old.Cells {
		if oc := &old.Cells[i]; !newBy[oc.Cell.Name] {
			r.Removed = append(r.Removed, cellOf(oc))
		}
	}
	for _, c := range r.Checks {
		if c.FlippedToFail {
			r.Flipped++
		}
	}
	return r
}

func (r *Report) header(a, b engine.Meta) {
	for _, kv := range [][3]string{{"title", a.Title, b.Title}, {"project", a.Project, b.Project}, {"basis", a.Basis, b.Basis},
		{"author", a.Author, b.Author}, {"checker", a.Checker, b.Checker}, {"date", a.Date, b.Date},
		{"revision", a.Revision, b.Revision}, {"units", a.Units, b.Units}} {
		if kv[1] != kv[2] {
			r.Header = append(r.Header, Change{Name: kv[0], Old: kv[1], New: kv[2]})
		}
	}
}

// compare adds what differs between the two versions of one cell.
func (r *Report) compare(oc, nc *engine.CellResult, tol float64) {
	ok, nk := oc.Cell.Kind, nc.Cell.Kind
	if ok == engine.Input && nk == engine.Input {
		if !sameValue(oc, nc, 0) {
			r.Inputs = append(r.Inputs, valueChange(oc, nc))
		}
		return
	}
	if ok == engine.Table && nk == engine.Table {
		if !sameValue(oc, nc, 0) {
			r.Inputs = append(r.Inputs, valueChange(oc, nc))
		}
		return
	}
	if ok != nk || normalise(formula(oc.Cell)) != normalise(formula(nc.Cell)) {
		r.Formulas = append(r.Formulas, Change{Name: nc.Cell.Name, Kind: nk.String(), Old: formula(oc.Cell), New: formula(nc.Cell)})
	}
	switch {
	case nk == engine.Check && ok == engine.Check:
		r.check(oc, nc, tol)
	case nk == engine.Function || nk == engine.Check:
	case !sameValue(oc, nc, tol):
		r.Results = append(r.Results, valueChange(oc, nc))
	}
}

// check adds a check change when the verdict flipped or the utilisation
// moved beyond the tolerance; oc is nil for a new check.
func (r *Report) check(oc, nc *engine.CellResult, tol float64) {
	cc := CheckChange{Name: nc.Cell.Name, OldVerdict: "absent", NewVerdict: verdict(nc), NewUtil: num(nc)}
	if oc != nil {
		cc.OldVerdict, cc.OldUtil = verdict(oc), num(oc)
	}
	cc.FlippedToFail = (cc.OldVerdict == "pass" || cc.OldVerdict == "absent") && cc.NewVerdict != "pass"
	if cc.OldVerdict == cc.NewVerdict && (oc == nil || sameValue(oc, nc, tol)) {
		return
	}
	if oc == nil && !cc.FlippedToFail {
		return // a new passing check is listed under added cells
	}
	r.Checks = append(r.Checks, cc)
}

func verdict(c *engine.CellResult) string {
	switch {
	case !c.Known:
		return "not assessed"
	case c.SI <= 1:
		return "pass"
	}
	return "fail"
}

// formula is the text that defines a cell: its expression, with the
// parameters for a function.
func formula(c *engine.Cell) string {
	if c.Kind != engine.Function {
		return c.Expr()
	}
	ps := make([]string, len(c.Extra().Params))
	for i, p := range c.Extra().Params {
		ps[i] = p.Name
		if p.Unit.Symbol != "" {
			ps[i] += " [" + p.Unit.Symbol + "]"
		}
	}
	return "(" + strings.Join(ps, ", ") + ") = " + c.Expr()
}

// normalise drops the spacing of a formula, so a reformatted sheet shows
// no formula changes.
func normalise(s string) string { return strings.Join(strings.Fields(s), " ") }

// sameValue compares two results: numbers within the relative tolerance
// (exactly when tol is 0), other values by their content.
func sameValue(a, b *engine.CellResult, tol float64) bool {
	if a.Known != b.Known {
		return false
	}
	if !a.Known {
		return true
	}
	x, ok1 := a.Value.(float64)
	y, ok2 := b.Value.(float64)
	if ok1 && ok2 {
		if a.Cell.Type != nil && b.Cell.Type != nil && a.Cell.Type.Dim != b.Cell.Type.Dim {
			return false
		}
		return x == y || math.Abs(x-y) <= tol*math.Max(math.Abs(x), math.Abs(y))
	}
	return sameContent(a.Value, b.Value)
}

func sameContent(a, b funcs.Value) bool {
	switch a := a.(type) {
	case []float64:
		b, ok := b.([]float64)
		return ok && slices.Equal(a, b)
	case *funcs.TableValue:
		b, ok := b.(*funcs.TableValue)
		if !ok || len(a.Cols) != len(b.Cols) {
			return false
		}
		for i := range a.Cols {
			if !slices.Equal(a.Cols[i], b.Cols[i]) {
				return false
			}
		}
		return a.Type.Accepts(b.Type) && b.Type.Accepts(a.Type)
	case *funcs.RecordValue:
		b, ok := b.(*funcs.RecordValue)
		if !ok || len(a.Fields) != len(b.Fields) {
			return false
		}
		for i := range a.Fields {
			if !sameContent(a.Fields[i], b.Fields[i]) {
				return false
			}
		}
		return a.Type.Accepts(b.Type) && b.Type.Accepts(a.Type)
	case []funcs.Value:
		b, ok := b.([]funcs.Value)
		if !ok || len(a) != len(b) {
			return false
		}
		for i := range a {
			if !sameContent(a[i], b[i]) {
				return false
			}
		}
		return true
	case *funcs.FuncValue:
		b, ok := b.(*funcs.FuncValue)
		return ok && a.Name == b.Name
	}
	return a == b
}

func valueChange(oc, nc *engine.CellResult) Change {
	c := Change{Name: nc.Cell.Name, Kind: nc.Cell.Kind.String(), Old: oc.Text, New: nc.Text, OldSI: num(oc), NewSI: num(nc)}
	if c.OldSI != nil {
		c.OldValue, c.OldUnit = display(*c.OldSI, oc.Unit)
		c.SIUnit = units.SISymbol(oc.Cell.Type.Dim)
	}
	if c.NewSI != nil {
		c.NewValue, c.NewUnit = display(*c.NewSI, nc.Unit)
		c.SIUnit = units.SISymbol(nc.Cell.Type.Dim)
	}
	if c.OldSI != nil && c.NewSI != nil && !sameDim(oc, nc) {
		c.SIUnit = "" // the two SI values are in different units: see each display unit
	}
	if c.OldSI != nil && c.NewSI != nil && *c.OldSI != 0 && sameDim(oc, nc) {
		rel := (*c.NewSI - *c.OldSI) / math.Abs(*c.OldSI)
		c.Rel = &rel
	}
	return c
}

func sameDim(a, b *engine.CellResult) bool {
	return a.Cell.Type != nil && b.Cell.Type != nil && a.Cell.Type.Dim == b.Cell.Type.Dim
}

// num is the SI value of a known number result, else nil.
func num(c *engine.CellResult) *float64 {
	if !c.Known {
		return nil
	}
	x, ok := c.Value.(float64)
	if !ok || math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return &x
}

func cellOf(c *engine.CellResult) Cell {
	out := Cell{Name: c.Cell.Name, Kind: c.Cell.Kind.String(), Expr: formula(c.Cell), Value: c.Text}
	if c.Cell.HasUnit {
		out.Unit = c.Cell.Unit().Symbol
	}
	if c.Cell.Kind == engine.Check {
		out.Value = checkText(verdict(c), num(c))
		return out
	}
	if x := num(c); x != nil && c.Cell.Type != nil {
		out.SI, out.SIUnit = x, units.SISymbol(c.Cell.Type.Dim)
		out.Number, out.NumberUnit = display(*x, c.Unit)
	}
	return out
}

// display is an SI value in display unit u, with the unit's symbol ("1"
// for a plain number).
func display(si float64, u units.Unit) (*float64, string) {
	f := u.Factor
	if f == 0 {
		f = 1
	}
	v := si / f
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil, ""
	}
	sym := u.Symbol
	if sym == "" {
		sym = "1"
	}
	return &v, sym
}

// checkText writes a utilisation and verdict as the run listing does:
// "38 % ok", "105 % FAILS", "not assessed".
func checkText(v string, util *float64) string {
	switch v {
	case "absent":
		return "absent"
	case "not assessed":
		return text.Unknown
	}
	w := text.Pass
	if v == "fail" {
		w = text.Fail
	}
	return utilText(util) + " " + w
}
