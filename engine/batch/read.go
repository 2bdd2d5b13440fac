package batch

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Column is one column of a case table: the input it sets and the unit its
// values are written in.
type Column struct {
	Name    string
	Cell    *engine.Cell
	Unit    units.Unit // header unit if written, else the cell's display unit
	HasUnit bool       // the header wrote a unit: bare numbers are in it
	Pos     diag.Pos   // of the header field
}

// Case is one data row.
type Case struct {
	N      int           // case number, 1-based, in file order (bad rows too)
	Line   int           // line of the row in the file
	Raw    []string      // the fields as written
	Values []funcs.Value // SI values, one per column; nil when the row is bad
	Err    *diag.Diagnostic
}

// Cases is a case table read against a sheet.
type Cases struct {
	File    string
	Src     []byte
	Columns []Column
	Cases   []Case
	// Sep is the field separator: ',' or, detected from the table, ';'
	// (the form spreadsheets write in locales with a decimal comma).
	// DecimalComma is set with ';': a comma in a number is its decimal
	// mark (`12,5` is 12.5).
	Sep          rune
	DecimalComma bool

	text *diag.Source // the table without its byte order mark, which positions point into
}

// detectSep returns ';' when the table's first row that is not a comment
// or blank holds a semicolon and no comma, or holds neither and a later
// row holds a semicolon; ',' otherwise (RFC 4180).
func detectSep(src []byte) rune {
	first := true
	for _, ln := range strings.Split(string(src), "\n") {
		t := strings.TrimSpace(ln)
		if t == "" || strings.HasPrefix(t, "#") {
			continue
		}
		semi, comma := strings.Contains(t, ";"), strings.Contains(t, ",")
		if first {
			first = false
			switch {
			case semi && !comma:
				return ';'
			case semi || comma:
				return ','
			}
			continue // a one-column header: the rows tell
		}
		if semi {
			return ';'
		}
		if comma {
			return ','
		}
	}
	return ','
}

// Bad returns the problems of the rows that could not be read, in file
// order.
func (c *Cases) Bad() diag.List {
	var l diag.List
	for i := range c.Cases {
		if e := c.Cases[i].Err; e != nil {
			l = append(l, e)
		}
	}
	return l
}

// Read reads a case table from src for sheet s. An error in the header (an
// unknown or repeated column, a unit that does not fit) is returned as a
// diag.List: it would spoil every row. A bad row is kept with its Err set.
//
// The table is CSV (RFC 4180): a header row, then one row per case. Lines
// starting with `#` are comments; blank lines are skipped; spaces after a
// comma are ignored.
func Read(file string, src []byte, s *engine.Sheet) (*Cases, error) {
	// A spreadsheet's "CSV UTF-8" starts with a byte order mark: it is not
	// part of the first column's name.
	body := bytes.TrimPrefix(src, []byte("\uFEFF"))
	r := csv.NewReader(bytes.NewReader(body))
	r.Comment = '#'
	r.FieldsPerRecord = -1
	r.TrimLeadingSpace = true
	r.ReuseRecord = false
	out := &Cases{File: file, Src: src, Sep: detectSep(src)}
	text := diag.NewSource(file, string(body))
	out.text = text
	if out.Sep == ';' {
		r.Comma, out.DecimalComma = ';', true
	}
	header, err := r.Read()
	if err == io.EOF {
		return nil, diag.List{{Range: text.Span(0, 0),
			Summary: "the case table is empty", Detail: "a case table starts with a header row naming inputs of the sheet",
			Hint: "write a header such as `P [kN], d [mm]` and one row per case"}}
	}
	if err != nil {
		return nil, diag.List{csvProblem(text, err)}
	}
	var errs diag.List
	seen := map[string]bool{}
	for i, h := range header {
		pos := fieldAt(text, r, i)
		c, d := readHeader(s, h, pos)
		if d != nil {
			errs = append(errs, d)
			continue
		}
		if seen[c.Name] {
			errs = append(errs, &diag.Diagnostic{Range: rangeOf(pos, h), Summary: fmt.Sprintf("column `%s` appears twice", c.Name),
				Detail: "each input can have one column", Hint: "drop or rename one of them"})
			continue
		}
		seen[c.Name] = true
		out.Columns = append(out.Columns, c)
	}
	if len(errs) > 0 {
		errs.Sort()
		return nil, errs
	}
	for n := 1; ; n++ {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		cs := Case{N: n}
		if err != nil {
			var pe *csv.ParseError
			if !errors.As(err, &pe) {
				return nil, err
			}
			cs.Line = pe.Line
			cs.Err = csvProblem(text, err)
			out.Cases = append(out.Cases, cs)
			continue
		}
		cs.Line, _ = r.FieldPos(0)
		cs.Raw = rec
		out.readRow(s, r, &cs)
		out.Cases = append(out.Cases, cs)
	}
	return out, nil
}

// readRow converts the fields of one row, setting cs.Err on the first bad
// one.
func (c *Cases) readRow(s *engine.Sheet, r *csv.Reader, cs *Case) {
	if len(cs.Raw) != len(c.Columns) {
		cs.Err = &diag.Diagnostic{Range: fieldAt(c.text, r, 0),
			Summary: fmt.Sprintf("case %d has %s, the header has %s", cs.N, plural.Count(len(cs.Raw), "value"), plural.Count(len(c.Columns), "column")),
			Detail:  "this row was skipped; the other rows were evaluated",
			Hint:    "give one value per column, separated by " + c.sepName()}
		return
	}
	vals := make([]funcs.Value, len(c.Columns))
	for i, text := range cs.Raw {
		v, err := c.value(s, &c.Columns[i], text)
		if err != nil {
			cs.Err = &diag.Diagnostic{Range: rangeOf(fieldAt(c.text, r, i), text),
				Summary: fmt.Sprintf("case %d, column `%s`: %v", cs.N, c.Columns[i].Name, err),
				Detail:  "this row was skipped; the other rows were evaluated",
				Hint:    "write a number, with its unit unless the header gives one: `45 kN`, `45kN`, or `45` under `P [kN]`"}
			return
		}
		vals[i] = v
	}
	cs.Values = vals
}

// sepName names the separator for hints.
func (c *Cases) sepName() string {
	if c.Sep == ';' {
		return "semicolons"
	}
	return "commas"
}

// value reads one field: with a decimal comma, `12,5 kN` is 12.5 kN; a
// field with both a comma and a point is refused, since either could be
// the thousands separator (`1.250,5` or `1,250.5`) and a guess could be
// off by a thousand.
func (c *Cases) value(s *engine.Sheet, col *Column, text string) (funcs.Value, error) {
	if c.DecimalComma && strings.Contains(text, ",") {
		if strings.Contains(text, ".") {
			return nil, fmt.Errorf("%q has both a comma and a point; in a table separated by semicolons the comma is the decimal mark: write it without thousands separators, e.g. `1250,5`", text)
		}
		text = strings.ReplaceAll(text, ",", ".")
	}
	return Value(s, col, text)
}

// readHeader reads one header field `name [unit]` or `name`.
func readHeader(s *engine.Sheet, h string, pos diag.Range) (Column, *diag.Diagnostic) {
	text := strings.TrimSpace(h)
	name, unit, hasUnit := text, "", false
	if i := strings.IndexByte(text, '['); i >= 0 {
		if !strings.HasSuffix(text, "]") {
			return Column{}, &diag.Diagnostic{Range: rangeOf(pos, h), Summary: fmt.Sprintf("column header %q has an unclosed `[`", text),
				Hint: "write the unit in square brackets after the name, e.g. `P [kN]`"}
		}
		name, unit, hasUnit = strings.TrimSpace(text[:i]), strings.TrimSpace(text[i+1:len(text)-1]), true
	}
	if name == "" {
		return Column{}, &diag.Diagnostic{Range: rangeOf(pos, h), Summary: "a column header has no name",
			Hint: "each header field names an input of the sheet, e.g. `P [kN]`"}
	}
	cell := s.Lookup(name)
	if cell == nil || cell.Kind != engine.Input {
		d := &diag.Diagnostic{Range: rangeOf(pos, h), Summary: fmt.Sprintf("column `%s` is not an input of the sheet", name),
			Detail: "every column of a case table sets an input (a cell whose value is given, not computed)"}
		switch {
		case cell != nil:
			d.Detail = fmt.Sprintf("`%s` is a %s cell; only inputs can be set", name, cell.Kind)
		default:
			if n := diag.Nearest(name, inputNames(s)); n != "" {
				d.Hint = fmt.Sprintf("did you mean `%s`?", n)
			}
		}
		return Column{}, d
	}
	col := Column{Name: name, Cell: cell, Unit: s.DisplayUnit(cell), Pos: pos.Start()}
	if hasUnit {
		u, err := units.Parse(unit)
		if err != nil {
			return Column{}, &diag.Diagnostic{Range: rangeOf(pos, h), Summary: fmt.Sprintf("column `%s`: %v", name, err),
				Hint: "units are written as in `kN`, `N/mm^2`, `kN/m`"}
		}
		if cell.Type == nil || cell.Type.Kind != funcs.Number {
			return Column{}, &diag.Diagnostic{Range: rangeOf(pos, h), Summary: fmt.Sprintf("column `%s` has a unit, but `%s` is not a number", name, name),
				Hint: "drop the unit from the header"}
		}
		if u.Dim != cell.Type.Dim {
			return Column{}, &diag.Diagnostic{Range: rangeOf(pos, h),
				Summary: fmt.Sprintf("column `%s [%s]`: the unit does not fit `%s`, which is %s", name, unit, name, describe(s, cell)),
				Hint:    fmt.Sprintf("write `%s [%s]`", name, s.DisplayUnit(cell).Symbol)}
		}
		col.Unit, col.HasUnit = u, true
	}
	return col, nil
}

func inputNames(s *engine.Sheet) []string {
	var names []string
	for _, c := range s.Cells() {
		if c.Kind == engine.Input {
			names = append(names, c.Name)
		}
	}
	return names
}

// describe says what a number cell holds: "a force (kN)", "a plain number".
func describe(s *engine.Sheet, c *engine.Cell) string {
	if c.Type == nil || c.Type.Kind != funcs.Number {
		return "not a number"
	}
	if c.Type.Dim.IsNone() {
		return "a plain number"
	}
	u := s.DisplayUnit(c)
	if u.Quantity != "" {
		return article(u.Quantity) + " " + u.Quantity + " (" + u.Symbol + ")"
	}
	return "a quantity in " + u.Symbol
}

// rangeOf is the range of field text starting at pos (on one line).
func rangeOf(pos diag.Range, text string) diag.Range {
	return pos.Sub(0, max(len(text), 1))
}

// fieldAt is the place where field i of the record r read last starts.
func fieldAt(src *diag.Source, r *csv.Reader, i int) diag.Range {
	line, col := r.FieldPos(i)
	return byteAt(src, line, col)
}

// byteAt is the place at line:col of src, col a 1-based byte index as the
// CSV reader counts it.
func byteAt(src *diag.Source, line, col int) diag.Range {
	off := min(src.Offset(line, 1)+max(col, 1)-1, len(src.Text))
	return src.Span(off, off)
}

func csvProblem(src *diag.Source, err error) *diag.Diagnostic {
	d := &diag.Diagnostic{Summary: "cannot read the case table: " + err.Error(), Detail: "this row was skipped; the other rows were evaluated",
		Hint: "a field that holds a comma or a quote is written in double quotes, with quotes doubled"}
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		d.Range = byteAt(src, pe.Line, pe.Column)
		d.Summary = "cannot read the case table: " + pe.Err.Error()
	}
	return d
}
