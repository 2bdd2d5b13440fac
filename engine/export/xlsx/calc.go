package xlsxout

import (
	"math"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Columns of the Calculation tab.
const (
	colValue = "E"
	colNote  = "H"
)

// calcCols is the number of columns of the Calculation tab.
const calcCols = 8

var calcHeader = [calcCols]string{"Name", "Description", "Expression as written", "With values", "Value", "Unit", "Reference", "Note"}

// calcWidths fit A4 landscape at about 90 % (text of 11 points prints
// at about 10): the whole is 160 character widths.
var calcWidths = [calcCols]float64{17, 27, 24, 32, 12, 8, 20, 20}

// calcMono marks the columns shown in the monospaced expression font.
var calcMono = [calcCols]bool{2: true, 3: true}

// Notes written beside values.
const (
	noteInput     = ""
	noteTable     = "input table: see the Data tab"
	noteFunction  = "function: inlined in the formulas that call it"
	noteValueOnly = "Sheaf only: "
	notePartly    = "recomputes, but reads values from Sheaf: "
	// calcGuide is the one explanation of the colours and notes, in the
	// title row of the tab.
	calcGuide = "Amber: inputs, typed in the unit shown. Grey italic: values only Sheaf computes (the note says why); " +
		"after an edit upstream of one, it and what reads it are marked out of date until Sheaf runs again."
	noteLocked = "(locked: values only Sheaf computes depend on it; change it in the sheet and run Sheaf)"
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
	if err := x.staleColours(); err != nil {
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
	if err := sw.SetRow("A1", []any{x.text(title+": calculation", clsTitle), nil, nil, nil, x.text(calcGuide, clsText)},
		excelize.RowOpts{Height: rowHeight([]excelize.Cell{{Value: calcGuide}}, []float64{calcWidths[4] + calcWidths[5] + calcWidths[6] + calcWidths[7]}, nil)}); err != nil {
		return err
	}
	if err := sw.MergeCell("E1", "H1"); err != nil {
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
		case rowComment:
			cells[0] = x.text("", clsText)
			cells[1] = x.text(r.title, clsComment)
			for j := 2; j < calcCols; j++ {
				cells[j] = x.text("", clsText)
			}
			rr := strconv.Itoa(r.row)
			h := rowHeight(cells[1:2], []float64{commentWidth}, []bool{true})
			if err := sw.SetRow("A"+rr, row, excelize.RowOpts{Height: h}); err != nil {
				return err
			}
			if err := sw.MergeCell("B"+rr, "H"+rr); err != nil {
				return err
			}
			continue
		case rowCell:
			cells = x.cellRow(r.cr)
		case rowField:
			cells = x.fieldRow(r)
		}
		if err := sw.SetRow("A"+strconv.Itoa(r.row), row, excelize.RowOpts{Height: rowHeight(cells[:], calcWidths[:], calcMono[:])}); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// commentWidth is the width of the merged columns B:H a comment spans,
// less a margin.
const commentWidth = 140

// commentBlock is a paragraph of full-line comments of the sheet: the
// lines without their "#", and the offset of the first.
type commentBlock struct {
	off  int
	text string
}

// commentBlocks are the comments of the sheet file in reading order,
// consecutive lines joined into one block (a blank line or any other item
// ends a block). Comments of templates stay in the templates.
func (x *exporter) commentBlocks() []commentBlock {
	f := x.s.File()
	if f == nil {
		return nil
	}
	var out []commentBlock
	open := false
	for _, it := range f.Items {
		c, ok := it.(*sheet.Comment)
		if !ok {
			open = false
			continue
		}
		line := strings.TrimPrefix(c.Text, " ")
		if open {
			out[len(out)-1].text += "\n" + line
			continue
		}
		out = append(out, commentBlock{off: c.Range.Start().Offset, text: line})
		open = true
	}
	// A block of empty comment lines says nothing.
	kept := out[:0]
	for _, b := range out {
		if strings.TrimSpace(b.text) != "" {
			kept = append(kept, b)
		}
	}
	return kept
}

// staleColours marks each guarded value and its note by conditional
// formatting once an input it depends on has changed.
func (x *exporter) staleColours() error {
	id := -1
	for i := range x.rows {
		r := &x.rows[i]
		var keys []int32
		switch r.kind {
		case rowCell:
			keys = x.stale[r.cr.Cell.Index]
		case rowField:
			keys = x.stale[r.cell]
		}
		g := x.guardExpr(keys)
		if g == "" {
			continue
		}
		if id < 0 {
			var err error
			id, err = x.f.NewConditionalStyle(&staleStyle)
			if err != nil {
				return err
			}
		}
		rr := strconv.Itoa(r.row)
		for _, col := range []string{colValue, colNote} {
			if err := x.f.SetConditionalFormat(TabCalc, col+rr+":"+col+rr,
				[]excelize.ConditionalFormatOptions{{Type: "formula", Criteria: g, Format: &id}}); err != nil {
				return err
			}
		}
	}
	return nil
}

// cellRow writes one cell of the sheet: name, description, expression,
// hand calculation, value, unit, reference, note.
func (x *exporter) cellRow(cr *engine.CellResult) [calcCols]excelize.Cell {
	c := cr.Cell
	name, expr := c.Name, oneLine(c.Expr())
	var calc, unit, note string
	var value excelize.Cell
	switch {
	case c.Kind == engine.Function:
		ps := make([]string, len(c.Extra().Params))
		for i, p := range c.Extra().Params {
			ps[i] = p.Name
		}
		name += "(" + strings.Join(ps, ", ") + ")"
		value, note = x.text("function", clsText), noteFunction
		if c.HasUnit {
			unit = c.Unit().Pretty()
		}
	case c.Kind == engine.Check:
		ch := x.checkByCell(c)
		calc = x.checkCalc(c, ch)
		value, note = x.checkValue(ch)
		if note == VerdictUnknown {
			note = x.unassessedNote(c)
		}
	case !cr.Known:
		value = x.text("not computed", clsValueOnly)
		note = "not computed"
		for _, p := range x.r.Problems {
			if p.Range.Start().Line == c.Pos().Line && p.Range.Start().File == c.Pos().File {
				note += ": " + p.Summary
				break
			}
		}
		x.stats.ValueOnly++
	case c.Kind == engine.Table:
		value, note = x.text(cr.Text, clsText), noteTable
		if x.locked(c.Index) {
			note = "table on the Data tab, " + noteLocked
		} else {
			x.stats.Inputs++
		}
	default:
		value, note = x.valueCell(c, cr.Value, c.Kind == engine.Input, c.Body(), cr.Unit.Factor)
		if _, num := cr.Value.(float64); num && c.Kind == engine.Input {
			// As written and as typed: no digit hidden.
			value.StyleID = x.st.id(clsInput, generalFormat)
		}
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
				if x.opaque[c.Index] {
					note = noteValueOnly + "its fields follow"
					if !c.Body().IsZero() && c.Body().Str() != "" {
						note = noteValueOnly + "computed with `" + c.Body().Str() + "`; its fields follow"
					}
				}
			case *funcs.TableValue:
				note = "table: see the " + TabSamples + " tab"
			}
		}
	}
	if unit == "1" {
		unit = ""
	}
	if n := x.actionNote(c); n != "" && note == "" {
		note = n
	}
	return [calcCols]excelize.Cell{x.text(name, clsKey), x.text(c.Description(), clsText), x.text(expr, clsExpr), x.text(calc, clsExpr),
		value, x.text(unit, clsText), x.text(c.Reference(), clsText), x.guardedNote(x.stale[c.Index], note)}
}

// valueCell writes a number or a truth value: editable for an input, a
// live formula when the expression translates, else Sheaf's value marked.
func (x *exporter) valueCell(c *check.Cell, v funcs.Value, input bool, body check.Node, factor float64) (excelize.Cell, string) {
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
		if x.comboDep(r.cell) {
			body = check.Node{} // a field of a value of one combination: from Sheaf
		}
		if body.IsZero() && !r.plugin.IsZero() && !x.comboDep(r.cell) {
			value, note = x.pluginFieldCell(r)
		} else if body.IsZero() {
			x.stats.ValueOnly++
			fmtStr := ""
			if f, ok := v.(float64); ok {
				v = f / r.unit.Factor
				fmtStr = numFormat(f/r.unit.Factor, x.sig)
			}
			// The record's row says why; the grey says it here.
			value = excelize.Cell{StyleID: x.st.id(clsValueOnly, fmtStr), Value: v}
			if f, ok := r.val.(float64); ok {
				if s, over := x.beyondRange(f, r.unit.Factor); over {
					value, note = x.text(s, clsValueOnly), noteTooLarge
				}
			}
		} else {
			value, note = x.valueCell(nil, r.val, r.input, body, r.unit.Factor)
			if _, num := v.(float64); num && r.input {
				value.StyleID = x.st.id(clsInput, generalFormat)
			}
		}
		if _, ok := v.(float64); ok {
			unit = r.unit.Pretty()
		}
	case *funcs.RecordValue:
		value, note = x.text("record", clsText), "its fields follow"
	case *funcs.TableValue:
		value, note = x.text("table, "+plural.Count(v.Rows(), "row"), clsText), "table: see the "+TabSamples+" tab"
	case string:
		value = x.text(v, clsText)
	case []float64:
		value = x.text(x.listText(v, r.listUnit), clsText)
	default:
		value = x.text("list", clsText)
	}
	if unit == "1" {
		unit = ""
	}
	return [calcCols]excelize.Cell{x.text(r.path, clsKey), x.text(r.desc, clsText), x.text(r.expr, clsExpr), x.text("", clsExpr),
		value, x.text(unit, clsText), x.text("", clsText), x.guardedNote(x.stale[r.cell], note)}
}

func (x *exporter) checkByCell(c *check.Cell) *checkRow {
	for _, ch := range x.checks {
		if ch.cell == c {
			return ch
		}
	}
	return &checkRow{cell: c}
}

// utilFormat shows a utilisation as a percentage, as Sheaf's listings do
// (the value stays the ratio, which the formulas use).
const utilFormat = "0.0%"

// listText writes a list of SI numbers in unit u: "[12, 16, 20] mm".
func (x *exporter) listText(v []float64, u units.Unit) string {
	if u.Factor == 0 {
		u.Factor = 1
	}
	parts := make([]string, len(v))
	for i, e := range v {
		parts[i] = units.FormatNumber(e/u.Factor, x.sig)
	}
	s := "[" + strings.Join(parts, ", ") + "]"
	if p := u.Pretty(); p != "" && p != "1" {
		s += " " + p
	}
	return s
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
	cell := excelize.Cell{Value: ch.util, StyleID: x.st.id(clsDerived, utilFormat)}
	if err != nil {
		x.stats.ValueOnly++
		cell.StyleID = x.st.id(clsValueOnly, utilFormat)
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
// A utilisation that is an error (an interpolation outside its table
// after an edit) is not assessed, as in Sheaf.
func verdictFormula(n string) string {
	return "IF(ISERROR(" + n + ")," + quoted(VerdictUnknown) + ",IF(" + n + "<=1," + quoted(VerdictPass) + "," + quoted(VerdictFail) + "))"
}

func indexOf(c *check.Cell) int {
	if c == nil {
		return -1
	}
	return c.Index
}
