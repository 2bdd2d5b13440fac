package funcs

import (
	"cmp"
	"fmt"
	"slices"
	"sync"
)

// Param is one parameter of a function.
type Param struct {
	Name     string
	Type     *Type
	Optional bool   // may be omitted (only trailing parameters)
	Doc      string // meaning, unit and valid range
}

// Def describes one function: its signature apart from its body, so that the
// checker never runs code to learn units.
type Def struct {
	Name   string // snake_case, unique across families
	Family string // the registering package, e.g. "section"
	Params []Param
	Result *Type

	// Validate, when set, replaces the plain Params/Result rule: it gets the
	// argument types (already checked against Params where a Param is given,
	// Any otherwise) and returns the result type or an error that says what
	// was expected. Use it where the result depends on the arguments. When
	// the result type does not depend on them, set Result too: listings
	// show it.
	Validate func(args []*Type) (*Type, error)

	// Call computes the result from SI values. Omitted optional arguments
	// arrive as nil. An error is reported at the calling cell.
	Call func(args []Value) (Value, error)

	// Spreadsheet, when set, is the function as a spreadsheet formula, for
	// the workbook exporter (a value it can recompute instead of a value
	// only Sheaf computes). The checker and the evaluator never read it.
	Spreadsheet *Spreadsheet

	Summary string // one line for `sheaf funcs`
	Doc     string // what it computes, arguments with units and ranges, special cases
	Formula string // the formula in plain text, e.g. "δ = P·L/(E·A)"
	Source  string // published source: work, edition, equation or clause
}

var (
	mu   sync.RWMutex
	defs = map[string]*Def{}
)

// Register adds a function. It panics on a duplicate or malformed definition:
// that is a programming error in a family, found by any test that links it.
func Register(d *Def) {
	if d.Name == "" || d.Call == nil || (d.Result == nil && d.Validate == nil) {
		panic(fmt.Sprintf("funcs: incomplete definition %q", d.Name))
	}
	if d.Source == "" || d.Doc == "" {
		panic(fmt.Sprintf("funcs: %s needs a Doc and a Source", d.Name))
	}
	if err := d.Spreadsheet.check(d); err != nil {
		panic(fmt.Sprintf("funcs: %s: spreadsheet form: %v", d.Name, err))
	}
	mu.Lock()
	defer mu.Unlock()
	if _, dup := defs[d.Name]; dup {
		panic("funcs: duplicate function " + d.Name)
	}
	defs[d.Name] = d
}

// Lookup returns the named function.
func Lookup(name string) (*Def, bool) {
	mu.RLock()
	defer mu.RUnlock()
	d, ok := defs[name]
	return d, ok
}

// All returns every registered function sorted by family, then name.
func All() []*Def {
	mu.RLock()
	out := make([]*Def, 0, len(defs))
	for _, d := range defs {
		out = append(out, d)
	}
	mu.RUnlock()
	slices.SortFunc(out, func(a, b *Def) int {
		if c := cmp.Compare(a.Family, b.Family); c != 0 {
			return c
		}
		return cmp.Compare(a.Name, b.Name)
	})
	return out
}

// MinArgs returns the number of required parameters.
func (d *Def) MinArgs() int {
	n := 0
	for _, p := range d.Params {
		if !p.Optional {
			n++
		}
	}
	return n
}
