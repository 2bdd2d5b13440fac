package batch

import (
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"math"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/opc"
)

// Header returns the column titles of the output table: `case`, each input
// column in its unit, each picked cell in its display unit, then for each
// check its utilisation and verdict, and `problem` last.
func (o *Outcome) Header() []string {
	h := []string{"case"}
	for _, c := range o.Cases.Columns {
		h = append(h, title(c.Name, c.Unit))
	}
	for k, c := range o.Picks {
		h = append(h, title(c.Name, o.PickUnit(k)))
	}
	combos := o.Sheet.Combos() != nil
	if combos {
		h = append(h, "cells shown in")
	}
	for _, c := range o.Checks {
		h = append(h, c.Name+" util", c.Name+" verdict")
		if combos {
			h = append(h, c.Name+" governs in")
		}
	}
	return append(h, "problem")
}

func title(name string, u units.Unit) string {
	if u.Symbol == "" || u.Symbol == "1" {
		return name
	}
	return name + " [" + u.Symbol + "]"
}

// cell is one output field: a number (in its display unit) or a text.
type cell struct {
	num    float64 // si/factor
	si     float64
	factor float64 // of the unit num is in; 1 for plain numbers
	text   string
	isNum  bool
}

// formatted writes a number cell as the CSV and a too-large workbook entry
// carry it: never +Inf for a finite value (2.36e304 m² in mm² is 2.36e310).
func (c cell) formatted(sig int) string {
	return units.Format(c.si, units.Unit{Factor: c.factor}, sig)
}

// fields lays out row r like Header. Unknown numbers are empty.
func (o *Outcome) fields(r *Row, dst []cell) []cell {
	dst = append(dst[:0], number(float64(r.Case.N), 1))
	for j, c := range o.Cases.Columns {
		switch {
		case r.Case.Values == nil:
			if j < len(r.Case.Raw) {
				dst = append(dst, cell{text: r.Case.Raw[j]})
			} else {
				dst = append(dst, cell{})
			}
		default:
			if x, ok := r.Case.Values[j].(float64); ok {
				dst = append(dst, number(x, c.Unit.Factor))
			} else {
				dst = append(dst, cell{text: r.Case.Raw[j]})
			}
		}
	}
	for k, x := range r.Picks {
		dst = append(dst, number(x, o.PickUnit(k).Factor))
	}
	combos := o.Sheet.Combos() != nil
	if combos {
		dst = append(dst, cell{text: r.Shown})
	}
	for k, u := range r.Utils {
		dst = append(dst, number(u, 1), cell{text: r.Verdict(k)})
		if combos {
			g := ""
			if k < len(r.Governing) {
				g = r.Governing[k]
			}
			dst = append(dst, cell{text: g})
		}
	}
	problem := r.Problem
	if r.Case.Err != nil {
		problem = r.Case.Err.Summary
	}
	return append(dst, cell{text: problem})
}

// number is the cell of the SI value si shown in a unit of the given factor.
func number(si, factor float64) cell {
	if math.IsNaN(si) {
		return cell{}
	}
	return cell{num: si / factor, si: si, factor: factor, isNum: true}
}

// Inert makes a text field of CSV output safe to open in a spreadsheet
// program: a field that starts with `=`, `+`, `-`, `@`, a tab or a carriage
// return would be read there as a formula (a bad row's raw text such as
// `=HYPERLINK(...)` would become a live link, or worse), so it gets a
// leading single quote, which such programs show as text. A field that is a
// plain decimal number (`-12.5`, `+3e4`) is left alone: numbers stay
// numbers. Source: OWASP, "CSV Injection" (the characters and the quote
// prefix).
func Inert(s string) string {
	if s == "" {
		return s
	}
	switch s[0] {
	case '=', '+', '-', '@', '\t', '\r':
		if plainNumber(s) {
			return s
		}
		return "'" + s
	}
	return s
}

// plainNumber reports whether s is a decimal number with an optional sign
// and exponent, nothing else: digits, at most one point, then e or E with
// an optional sign and digits.
func plainNumber(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for ; i < len(s) && s[i] >= '0' && s[i] <= '9'; i++ {
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for ; i < len(s) && s[i] >= '0' && s[i] <= '9'; i++ {
			digits++
		}
	}
	if digits == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		exp := 0
		for ; i < len(s) && s[i] >= '0' && s[i] <= '9'; i++ {
			exp++
		}
		if exp == 0 {
			return false
		}
	}
	return i == len(s)
}

// WriteCSV writes the outcome as CSV, numbers with sig significant figures
// in plain or e-notation (units.FormatNumber), rows in case order. Every
// text field passes through Inert.
func (o *Outcome) WriteCSV(w io.Writer, sig int) error {
	cw := csv.NewWriter(w)
	hdr := o.Header()
	for i, h := range hdr {
		hdr[i] = Inert(h)
	}
	if err := cw.Write(hdr); err != nil {
		return err
	}
	var fs []cell
	var rec []string
	for i := range o.Rows {
		fs = o.fields(&o.Rows[i], fs)
		rec = rec[:0]
		for _, f := range fs {
			if f.isNum {
				rec = append(rec, f.formatted(sig))
			} else {
				rec = append(rec, Inert(f.text))
			}
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteXLSX writes the outcome as a workbook with one sheet, "cases":
// numbers stay numbers at full precision, so the engineer can sort and
// chart them. The file's properties carry no timestamp that changes from
// run to run beyond what the library writes.
func (o *Outcome) WriteXLSX(w io.Writer) error {
	return o.WriteXLSXContext(context.Background(), w)
}

// WriteXLSXContext is WriteXLSX that stops with ctx's error when ctx ends
// (an interrupted command), checked every few hundred rows: a workbook of
// many cases takes seconds to build.
func (o *Outcome) WriteXLSXContext(ctx context.Context, w io.Writer) error {
	f := excelize.NewFile()
	defer f.Close()
	const name = "cases"
	if err := f.SetSheetName("Sheet1", name); err != nil {
		return err
	}
	sw, err := f.NewStreamWriter(name)
	if err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	hdr := o.Header()
	row := make([]any, len(hdr))
	for i, h := range hdr {
		row[i] = excelize.Cell{StyleID: bold, Value: h}
	}
	if err := sw.SetRow("A1", row); err != nil {
		return err
	}
	var fs []cell
	for i := range o.Rows {
		if i%256 == 0 && ctx.Err() != nil {
			return ctx.Err()
		}
		fs = o.fields(&o.Rows[i], fs)
		row = row[:0]
		for _, c := range fs {
			switch {
			case c.isNum && math.IsInf(c.num, 0) && !math.IsInf(c.si, 0):
				row = append(row, c.formatted(15)) // beyond a spreadsheet number: text (15 figures, as a spreadsheet keeps), not +Inf
			case c.isNum:
				row = append(row, c.num)
			case c.text == "":
				row = append(row, nil)
			default:
				row = append(row, c.text)
			}
		}
		ref, err := excelize.CoordinatesToCellName(1, i+2)
		if err != nil {
			return err
		}
		if err := sw.SetRow(ref, row); err != nil {
			return err
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		return fmt.Errorf("writing the workbook: %w", err)
	}
	pkg, err := opc.Canonical(buf.Bytes()) // the same cases give the same bytes
	if err != nil {
		return fmt.Errorf("writing the workbook: %w", err)
	}
	if _, err := w.Write(pkg); err != nil {
		return fmt.Errorf("writing the workbook: %w", err)
	}
	return nil
}
