package xlsxout

import (
	"fmt"

	"github.com/xuri/excelize/v2"
)

var summaryWidths = []float64{18, 40, 13, 13, 9, 12, 13, 30}

// Guide lines on the summary tab: how to read and re-use the workbook.
var guide = []string{
	"Pale amber cells on the Calculation and Data tabs are inputs: type a new value in the unit shown and the results recompute.",
	"Values are stored in the unit beside them; the formulas convert to SI and back.",
	"Grey italic values were computed by Sheaf with functions the workbook does not have; they do not recompute.",
	"The 'With values' column shows Sheaf's values at export; after a change, read the Value column.",
	"Every value has a name (Formulas > Name Manager): the sheet's cell names, fields as record.field, table columns as table.column.",
}

func (x *exporter) writeSummary() error {
	const tab = TabSummary
	if err := x.f.SetSheetName("Sheet1", tab); err != nil {
		return err
	}
	// Print setup and protection go on before streaming: the stream
	// writer keeps what the tab had, but drops what is set after it.
	if err := x.finishTab(tab, false); err != nil {
		return err
	}
	sw, err := x.f.NewStreamWriter(tab)
	if err != nil {
		return err
	}
	for i, w := range summaryWidths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	row := 1
	put := func(cells ...any) error {
		ref, _ := excelize.CoordinatesToCellName(1, row)
		row++
		return sw.SetRow(ref, cells)
	}
	m := x.s.Meta()
	title := m.Title
	if title == "" {
		title = "Calculation sheet " + x.s.Name()
	}
	var merges [][2]string
	if err := put(x.text(title, clsTitle)); err != nil {
		return err
	}
	row++
	for _, kv := range [][2]string{{"Project", m.Project}, {"Basis", m.Basis}, {"Author", m.Author}, {"Checker", m.Checker},
		{"Date", m.Date}, {"Revision", m.Revision}, {"Sheet file", x.s.Name()}} {
		v := kv[1]
		if v == "" {
			v = "(not given)"
		}
		if err := put(x.text(kv[0], clsKey), x.text(v, clsText)); err != nil {
			return err
		}
	}
	row++
	if err := put(x.text("Design checks", clsHeading)); err != nil {
		return err
	}
	head := []string{"Check", "Description", "Demand", "Capacity", "Unit", "Utilisation", "Verdict", "Reference"}
	hs := make([]any, len(head))
	for i, h := range head {
		hs[i] = x.text(h, clsHeader)
	}
	if err := put(hs...); err != nil {
		return err
	}
	first := row
	for _, ch := range x.checks {
		if err := put(x.checkSummary(ch)...); err != nil {
			return err
		}
	}
	if len(x.checks) == 0 {
		if err := put(x.text("The sheet has no design checks.", clsText)); err != nil {
			return err
		}
	} else {
		pass := 0
		for _, ch := range x.checks {
			if ch.known && ch.pass {
				pass++
			}
		}
		rng := fmt.Sprintf("G%d:G%d", first, row-1)
		n := len(x.checks)
		f := fmt.Sprintf("COUNTIF(%s,\"%s\")&\" of %d design checks pass\"", rng, VerdictPass, n)
		cached := fmt.Sprintf("%d of %d design checks pass", pass, n)
		if err := put(x.text("Overall", clsKey), excelize.Cell{StyleID: x.st.id(clsKey, ""), Formula: f, Value: cached}); err != nil {
			return err
		}
	}
	row++
	if err := put(x.text("Caution", clsHeading)); err != nil {
		return err
	}
	ref, _ := excelize.CoordinatesToCellName(1, row)
	if err := sw.SetRow(ref, []any{x.text(Caution, clsCaution)}, excelize.RowOpts{Height: 32}); err != nil {
		return err
	}
	end, _ := excelize.CoordinatesToCellName(8, row)
	merges = append(merges, [2]string{ref, end})
	row += 2
	if err := put(x.text("Reading this workbook", clsHeading)); err != nil {
		return err
	}
	for _, g := range guide {
		ref, _ := excelize.CoordinatesToCellName(1, row)
		end, _ := excelize.CoordinatesToCellName(8, row)
		merges = append(merges, [2]string{ref, end})
		if err := put(x.text(g, clsText)); err != nil {
			return err
		}
	}
	for _, m := range merges {
		if err := sw.MergeCell(m[0], m[1]); err != nil {
			return err
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	return nil
}

// checkSummary is a row of the checks table: the demand and capacity are
// live formulas in the check's unit, the utilisation reads the check's
// named cell, the verdict follows it.
func (x *exporter) checkSummary(ch *checkRow) []any {
	c := ch.cell
	name := x.tr.refs[c.Name].name
	side := func(n *nodeAlias, si float64) any {
		v := si / ch.unit.Factor
		if !ch.known {
			return x.text("", clsText)
		}
		if s, over := x.beyondRange(si, ch.unit.Factor); over {
			return x.text(s, clsValueOnly) // never +Inf for a finite side
		}
		f, err := x.tr.cellFormula(n, ch.unit.Factor)
		if err != nil {
			return x.number(v, clsValueOnly, x.sig)
		}
		cell := x.number(v, clsDerived, x.sig)
		cell.Formula = f
		return cell
	}
	unit := ch.unit.Pretty()
	if unit == "1" {
		unit = ""
	}
	var util, verdict any
	if ch.known {
		util = excelize.Cell{StyleID: x.st.id(clsDerived, "0.000"), Formula: name, Value: ch.util}
		cls, word := clsPass, VerdictPass
		if !ch.pass {
			cls, word = clsFail, VerdictFail
		}
		verdict = excelize.Cell{StyleID: x.st.id(cls, ""), Formula: verdictFormula(name), Value: word}
	} else {
		util = x.text("", clsText)
		verdict = x.text(VerdictUnknown, clsFail)
	}
	return []any{x.text(c.Name, clsKey), x.text(c.Description, clsText), side(c.Demand, ch.demand), side(c.Capacity, ch.capacity),
		x.text(unit, clsText), util, verdict, x.text(c.Reference, clsText)}
}
