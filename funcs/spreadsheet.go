package funcs

import (
	"errors"
	"fmt"
	"strings"
)

// Spreadsheet is a function written as a spreadsheet formula (the
// formula language of Office Open XML, ECMA-376 Part 1 §18.17, which
// other spreadsheet programs read too), over its arguments in SI; its
// value is the result in SI. Placeholders in braces stand for arguments:
//
//	{E}         the number argument E
//	{K=1}       the optional argument K, or 1 when the call omits it
//	{curve.chi} the column chi of the table argument curve, as a range
//	{curve.lambda:increasing} a condition: TRUE when the column increases
//	            strictly from row to row (for Valid)
//	{name}      the text argument name, as a text expression
//	{c.EA}      the number field EA of the record argument c
//	{c#fixed}   the term fixed that Terms computes from the record
//	            argument c, as a number
//
// Write each placeholder in brackets where an operator could bind into it
// ("({E})*({I})"): an argument may arrive as an expression.
type Spreadsheet struct {
	// Formula is the result of a number function.
	Formula string
	// Valid, when set, is a condition over the same placeholders that
	// holds exactly where Call returns a value (the ranges its Doc gives);
	// elsewhere the exported formula is an error, as the call is.
	Valid string
	// Fields are the formulas of the numeric fields of a record result,
	// by field name (the fields not listed only Sheaf computes).
	Fields map[string]string
	// Terms, when set, are the numbers the forms take from one record
	// argument that its fields do not carry.
	Terms *Terms
}

// Terms are numbers Go computes from the value of one record argument,
// named {param#name} in the forms: what a formula needs of an argument
// whose fields do not carry it (the plateau sums of the laws of a
// composite's parts). The workbook writes them as numbers: the result
// follows its other arguments live, and the record argument through
// Sheaf's run only, so it is out of date (guarded) once an input of that
// argument changes.
type Terms struct {
	Param string   // the record parameter
	Names []string // the terms, in the order Of returns them
	// Of computes the terms from the argument's value. It fails exactly
	// where Call fails whatever the other arguments are.
	Of func(v Value) ([]float64, error)
}

// Placeholder is one {…} of a spreadsheet form.
type Placeholder struct {
	Param   int    // index into Def.Params
	Column  string // a column of a table argument, or ""
	Field   string // a number field of a record argument, or ""
	Term    int    // with Field "": index into Terms.Names, or -1
	Default string // the value when an optional argument is omitted, or ""
	// Increasing: the placeholder is the condition that Column increases
	// strictly down the table.
	Increasing bool
}

// ExpandSpreadsheet writes form with every placeholder replaced by what
// arg returns for it. It fails when arg fails, or when a placeholder is
// malformed (Register refuses those).
func (d *Def) ExpandSpreadsheet(form string, arg func(Placeholder) (string, error)) (string, error) {
	var b strings.Builder
	for {
		i := strings.IndexByte(form, '{')
		if i < 0 {
			if strings.IndexByte(form, '}') >= 0 {
				return "", errors.New("a } without its {")
			}
			b.WriteString(form)
			return b.String(), nil
		}
		j := strings.IndexByte(form[i:], '}')
		if j < 0 {
			return "", errors.New("a { without its }")
		}
		p, err := d.placeholder(form[i+1 : i+j])
		if err != nil {
			return "", err
		}
		s, err := arg(p)
		if err != nil {
			return "", err
		}
		b.WriteString(form[:i])
		b.WriteString(s)
		form = form[i+j+1:]
	}
}

func (d *Def) placeholder(s string) (Placeholder, error) {
	p := Placeholder{Param: -1, Term: -1}
	s, incr := strings.CutSuffix(s, ":increasing")
	p.Increasing = incr
	name, def, hasDef := strings.Cut(s, "=")
	name, term, hasTerm := strings.Cut(name, "#")
	name, col, hasCol := strings.Cut(name, ".")
	for i, q := range d.Params {
		if q.Name == name {
			p.Param = i
		}
	}
	if p.Param < 0 {
		return p, fmt.Errorf("{%s}: no parameter %q", s, name)
	}
	q := d.Params[p.Param]
	if hasDef {
		if !q.Optional || def == "" {
			return p, fmt.Errorf("{%s}: a default is for an optional parameter", s)
		}
		p.Default = def
	} else if q.Optional {
		return p, fmt.Errorf("{%s}: the optional parameter needs a default, {%s=…}", s, name)
	}
	switch {
	case hasTerm:
		tm := d.Spreadsheet.terms()
		if tm == nil || tm.Param != name || hasCol || incr || hasDef {
			return p, fmt.Errorf("{%s}: a term is {param#name} of the parameter Terms names", s)
		}
		for i, n := range tm.Names {
			if n == term {
				p.Term = i
			}
		}
		if p.Term < 0 {
			return p, fmt.Errorf("{%s}: Terms has no term %q", s, term)
		}
	case hasCol && q.Type != nil && q.Type.Kind == Record:
		rec := recordFields(q.Type)
		i := -1
		if rec != nil {
			i = rec.Field(col)
		}
		if i < 0 || rec.Fields[i].Type == nil || rec.Fields[i].Type.Kind != Number || incr {
			return p, fmt.Errorf("{%s}: the record %s has no number field %q", s, name, col)
		}
		p.Field = col
	case hasCol:
		if q.Type == nil || q.Type.Kind != Table || q.Type.Field(col) < 0 {
			return p, fmt.Errorf("{%s}: %s has no column %q", s, name, col)
		}
		p.Column = col
	case incr:
		return p, fmt.Errorf("{%s:increasing}: name a column of a table", s)
	case q.Type != nil && q.Type.Kind == String:
		// a text argument, as a text expression
	case q.Type == nil || q.Type.Kind != Number:
		return p, fmt.Errorf("{%s}: %s is not a number; name a column of a table or a field of a record", s, name)
	}
	return p, nil
}

func (f *Spreadsheet) terms() *Terms {
	if f == nil {
		return nil
	}
	return f.Terms
}

// recordFields is the record type t with its fields: t itself, or, for
// a parameter type that names a record without listing its fields, the
// result type of that name of a function registered before.
func recordFields(t *Type) *Type {
	if len(t.Fields) > 0 || t.Name == "" {
		return t
	}
	mu.RLock()
	defer mu.RUnlock()
	for _, d := range defs {
		if r := d.Result; r != nil && r.Kind == Record && r.Name == t.Name && len(r.Fields) > 0 {
			return r
		}
	}
	return nil
}

// check reports a malformed form: a placeholder that names no parameter
// or column, a field the result does not have.
func (f *Spreadsheet) check(d *Def) error {
	if f == nil {
		return nil
	}
	nop := func(Placeholder) (string, error) { return "", nil }
	for _, s := range []string{f.Formula, f.Valid} {
		if _, err := d.ExpandSpreadsheet(s, nop); err != nil {
			return err
		}
	}
	if f.Formula != "" && (d.Result == nil || d.Result.Kind != Number) {
		return errors.New("a Formula is for a number result; a record result has Fields")
	}
	for name, s := range f.Fields {
		if d.Result == nil || d.Result.Kind != Record {
			return errors.New("Fields are for a record result")
		}
		if i := d.Result.Field(name); i < 0 || d.Result.Fields[i].Type.Kind != Number {
			return fmt.Errorf("the result has no number field %q", name)
		}
		if _, err := d.ExpandSpreadsheet(s, nop); err != nil {
			return fmt.Errorf("field %s: %w", name, err)
		}
	}
	if f.Formula == "" && len(f.Fields) == 0 {
		return errors.New("neither a Formula nor Fields")
	}
	if tm := f.Terms; tm != nil {
		i := -1
		for j, q := range d.Params {
			if q.Name == tm.Param {
				i = j
			}
		}
		if i < 0 || d.Params[i].Type == nil || d.Params[i].Type.Kind != Record || tm.Of == nil || len(tm.Names) == 0 {
			return errors.New("Terms name a record parameter, their names and Of")
		}
	}
	return nil
}
