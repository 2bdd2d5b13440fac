package xlsxout

import (
	"math"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Columns of the Calculation tab.
const (
	colValue = "E"
)

// calcCols is the number of columns of the Calculation tab.
const calcCols = 8

var calcHeader = [calcCols]string{"Name", "Description", "Expression as written", "With values", "Value", "Unit", "Reference", "Note"}
var calcWidths = [calcCols]float64{16, 34, 30, 46, 13, 9, 26, 30}

// calcMono marks the columns shown in the monospaced expression font.
var calcMono = [calcCols]bool{2: true, 3: true}

// Notes written beside values.
const (
	noteInput     = "input: edit in the unit shown"
	noteTable     = "input table: see the Data tab"
	noteFunction  = "function: inlined in the formulas that call it"
	noteValueOnly = "value from Sheaf, not recomputed here: "
	notePartly    = "recomputes, but inputs reach it only through values from Sheaf: "
)

// text returns a string cell. Strings are always written as strings, so a
// description starting with = + - @ is never read as a formula.
func (x *exporter) text(s string, c class) excelize.Cell {
	return excelize.Cell{StyleID: x.st.id(c, ""), Value: s}
}

func (x *exporter) number(v float64, c class, sig int) excelize.Cell {
	return excelize.Cell{StyleID: x.st.id(c, numFormat(v, sig)), Value: v}
}

// noteTooLarge explains a value written as text because it is finite in SI
// but beyond the range of a spreadsheet number in its display unit.
const noteTooLarge = "too large for a spreadsheet number in this unit: written as text"

// beyondRange reports whether the finite SI value si overflows when divided
// by the display unit's factor; text is then the value in that unit as
// Sheaf writes it ("2.36e310"), so the cell never shows +Inf for a finite
// value.
func (x *exporter) beyondRange(si, factor float64) (text string, over bool) {
	if math.IsInf(si, 0) || math.IsNaN(si) || !math.IsInf(si/factor, 0) {
		return "", false
	}
	return units.Format(si, units.Unit{Factor: factor}, x.sig), true
}

func (x *exporter) writeCalc() error {
	if _, err := x.f.NewSheet(TabCalc); err != nil {
		return err
	}
	// Print setup and protection go on before streaming: the stream
	// writer keeps what the tab had, but drops what is set after it.
	if err := x.finishTab(TabCalc, true); err != nil {
		return err
	}
	sw, err := x.f.NewStreamWriter(TabCalc)
	if err != nil {
		return err
	}
	for i, w := range calcWidths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 2, TopLeftCell: "A3", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	title := x.s.Meta().Title
	if title == "" {
		title = x.s.Name()
	}
	if err := sw.SetRow("A1", []any{x.text(title+": calculation", clsTitle)}); err != nil {
		return err
	}
	head := make([]any, len(calcHeader))
	for i, h := range calcHeader {
		head[i] = x.text(h, clsHeader)
	}
	if err := sw.SetRow("A2", head); err != nil {
		return err
	}
	// One row of cells, reused: SetRow writes them out before it returns.
	var cells [calcCols]excelize.Cell
	row := make([]any, calcCols)
	for i := range cells {
		row[i] = &cells[i]
	}
	for i := range x.rows {
		r := &x.rows[i]
		switch r.kind {
		case rowHeading:
			cells[0] = x.text(r.title, clsHeading)
			for j := 1; j < calcCols; j++ {
				cells[j] = x.text("", clsHeading)
			}
		case rowCell:
			cells = x.cellRow(r.cr)
		case rowField:
			cells = x.fieldRow(r)
		}
		if err := sw.SetRow("A"+strconv.Itoa(r.row), row, excelize.RowOpts{Height: rowHeight(cells[:], calcWidths[:], calcMono[:])}); err != nil {
			return err
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	return nil
}

// cellRow writes one cell of the sheet: name, description, expression,
// hand calculation, value, unit, reference, note.
func (x *exporter) cellRow(cr *engine.CellResult) [calcCols]excelize.Cell {
	c := cr.Cell
	name, expr := c.Name, oneLine(c.Expr)
	var calc, unit, note string
	var value excelize.Cell
	switch {
	case c.Kind == engine.Function:
		ps := make([]string, len(c.Params))
		for i, p := range c.Params {
			ps[i] = p.Name
		}
		name += "(" + strings.Join(ps, ", ") + ")"
		value, note = x.text("function", clsText), noteFunction
		if c.HasUnit {
			unit = c.Unit.Pretty()
		}
	case c.Kind == engine.Check:
		ch := x.checkByCell(c)
		calc = x.checkCalc(c, ch)
		value, note = x.checkValue(ch)
	case !cr.Known:
		value = x.text("not computed", clsValueOnly)
		note = "not computed"
		for _, p := range x.r.Problems {
			if p.Range.Start.Line == c.Pos.Line && p.Range.Start.File == c.Pos.File {
				note += ": " + p.Summary
				break
			}
		}
		x.stats.ValueOnly++
	case c.Kind == engine.Table:
		value, note = x.text(cr.Text, clsText), noteTable
		x.stats.Inputs++
	default:
		value, note = x.valueCell(c, cr.Value, c.Kind == engine.Input, c.Body, cr.Unit.Factor)
		if reads := x.reads[c.Index]; len(reads) > 0 && note == "" {
			note = notePartly + strings.Join(reads, ", ")
		}
		if v, ok := cr.Value.(float64); ok {
			unit = cr.Unit.Pretty()
			calc = x.handCalc(c, expr, x.format(v, cr.Unit))
		} else if _, ok := cr.Value.(bool); !ok {
			value = x.text(cr.Text, clsText)
			switch cr.Value.(type) {
			case *funcs.RecordValue:
				note = "record: its fields follow"
			case *funcs.TableValue:
				note = "table: see the Data tab"
			}
		}
	}
	if unit == "1" {
		unit = ""
	}
	return [calcCols]excelize.Cell{x.text(name, clsKey), x.text(c.Description, clsText), x.text(expr, clsExpr), x.text(calc, clsExpr),
		value, x.text(unit, clsText), x.text(c.Reference, clsText), x.text(note, clsText)}
}

// valueCell writes a number or a truth value: editable for an input, a
// live formula when the expression translates, else Sheaf's value marked.
func (x *exporter) valueCell(c *check.Cell, v funcs.Value, input bool, body *check.Node, factor float64) (excelize.Cell, string) {
	if factor == 0 {
		factor = 1
	}
	num, isNum := v.(float64)
	if isNum {
		if s, over := x.beyondRange(num, factor); over {
			x.stats.ValueOnly++
			return x.text(s, clsValueOnly), noteTooLarge
		}
		num /= factor
	}
	if input {
		x.stats.Inputs++
		if isNum {
			return x.number(num, clsInput, x.sig), noteInput
		}
		return excelize.Cell{StyleID: x.st.id(clsInput, ""), Value: v}, noteInput
	}
	if !isNum {
		if _, ok := v.(bool); !ok {
			return x.text("", clsText), ""
		}
	}
	var f string
	var err error
	if t, ok := x.formula(indexOf(c)); ok && c != nil {
		f, err = t.f, t.err
	} else {
		f, err = x.tr.cellFormula(body, factor)
	}
	cell := excelize.Cell{Value: v}
	if isNum {
		cell.Value = num
	}
	fmtStr := ""
	if isNum {
		fmtStr = numFormat(num, x.sig)
	}
	if err != nil {
		x.stats.ValueOnly++
		cell.StyleID = x.st.id(clsValueOnly, fmtStr)
		return cell, noteValueOnly + err.Error()
	}
	x.stats.Live++
	cell.Formula = f
	cell.StyleID = x.st.id(clsDerived, fmtStr)
	return cell, ""
}

// fieldRow writes one field of a record.
func (x *exporter) fieldRow(r *calcRow) [calcCols]excelize.Cell {
	var value excelize.Cell
	var note, unit string
	switch v := r.val.(type) {
	case float64, bool:
		body := r.formul
		if body == nil {
			x.stats.ValueOnly++
			fmtStr := ""
			if f, ok := v.(float64); ok {
				v = f / r.unit.Factor
				fmtStr = numFormat(f/r.unit.Factor, x.sig)
			}
			value = excelize.Cell{StyleID: x.st.id(clsValueOnly, fmtStr), Value: v}
			note = noteValueOnly + "a field of a result only Sheaf computes"
			if f, ok := r.val.(float64); ok {
				if s, over := x.beyondRange(f, r.unit.Factor); over {
					value, note = x.text(s, clsValueOnly), noteTooLarge
				}
			}
		} else {
			value, note = x.valueCell(nil, r.val, r.input, body, r.unit.Factor)
		}
		if _, ok := v.(float64); ok {
			unit = r.unit.Pretty()
		}
	case *funcs.RecordValue:
		value, note = x.text("record", clsText), "its fields follow"
	case *funcs.TableValue:
		value, note = x.text("table, "+plural.Count(v.Rows(), "row"), clsText), "table: see the Data tab"
	case string:
		value = x.text(v, clsText)
	default:
		value = x.text("list", clsText)
	}
	if unit == "1" {
		unit = ""
	}
	return [calcCols]excelize.Cell{x.text(r.path, clsKey), x.text(r.desc, clsText), x.text(r.expr, clsExpr), x.text("", clsExpr),
		value, x.text(unit, clsText), x.text("", clsText), x.text(note, clsText)}
}

func (x *exporter) checkByCell(c *check.Cell) *checkRow {
	for _, ch := range x.checks {
		if ch.cell == c {
			return ch
		}
	}
	return &checkRow{cell: c}
}

// Verdict words.
const (
	VerdictPass    = "passes"
	VerdictFail    = "FAILS"
	VerdictUnknown = "not assessed"
)

// checkValue writes the utilisation of a check and its live verdict.
func (x *exporter) checkValue(ch *checkRow) (excelize.Cell, string) {
	if !ch.known {
		x.stats.ValueOnly++
		return x.text(VerdictUnknown, clsFail), VerdictUnknown
	}
	t, _ := x.formula(ch.cell.Index)
	f, err := t.f, t.err
	cell := excelize.Cell{Value: ch.util, StyleID: x.st.id(clsDerived, "0.000")}
	if err != nil {
		x.stats.ValueOnly++
		cell.StyleID = x.st.id(clsValueOnly, "0.000")
		return cell, noteValueOnly + err.Error()
	}
	x.stats.Live++
	cell.Formula = f
	if reads := x.reads[ch.cell.Index]; len(reads) > 0 {
		return cell, notePartly + strings.Join(reads, ", ")
	}
	return cell, "utilisation (demand / capacity)"
}

// verdictFormula is the live verdict of a check named n.
func verdictFormula(n string) string {
	return "IF(" + n + "<=1,\"" + VerdictPass + "\",\"" + VerdictFail + "\")"
}

func indexOf(c *check.Cell) int {
	if c == nil {
		return -1
	}
	return c.Index
}
