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
}

// Placeholder is one {…} of a spreadsheet form.
type Placeholder struct {
	Param   int    // index into Def.Params
	Column  string // a column of a table argument, or ""
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
	p := Placeholder{Param: -1}
	s, incr := strings.CutSuffix(s, ":increasing")
	p.Increasing = incr
	name, def, hasDef := strings.Cut(s, "=")
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
	if hasCol {
		if q.Type == nil || q.Type.Kind != Table || q.Type.Field(col) < 0 {
			return p, fmt.Errorf("{%s}: %s has no column %q", s, name, col)
		}
		p.Column = col
	} else if incr {
		return p, fmt.Errorf("{%s:increasing}: name a column of a table", s)
	} else if q.Type == nil || q.Type.Kind != Number {
		return p, fmt.Errorf("{%s}: %s is not a number; name a column of a table", s, name)
	}
	return p, nil
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
	return nil
}
