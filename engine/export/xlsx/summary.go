package xlsxout

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// summaryWidths fit A4 portrait at about 90 %: 104 character widths.
var summaryWidths = []float64{14, 29, 10, 10, 6, 10, 12, 13}

// summaryWide is the width of the whole summary, in character widths.
const summaryWide = 104

// Guide lines on the summary tab: how to read and re-use the workbook.
var guide = []string{
	"Pale amber cells on the Calculation and Data tabs are inputs: type a new value in the unit shown and the results recompute.",
	"Values are stored in the unit beside them; the formulas convert to SI and back.",
	"Grey italic values were computed by Sheaf with functions the workbook does not have; they do not recompute. " +
		"When an input they depend on changes, they and every value that reads them are marked OUT OF DATE, the checks that depend on them read \"" +
		VerdictRerun + "\", and the line under the title names the changed inputs: run Sheaf again for those. The " + TabRun +
		" tab lists the inputs as Sheaf computed with them.",
	"Tables that values only Sheaf computes depend on are locked: change them in the sheet and run Sheaf.",
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
	if len(x.checks) > 0 {
		// Set before streaming, as the print setup.
		if err := x.verdictColours(tab, fmt.Sprintf("G%d:G%d", summaryFirstCheck, summaryFirstCheck+len(x.checks)-1)); err != nil {
			return err
		}
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
	var merges [][2]string
	// put writes a row as tall as its wrapped text needs.
	put := func(cells ...any) error {
		ref, _ := excelize.CoordinatesToCellName(1, row)
		row++
		var cs []excelize.Cell
		for _, c := range cells {
			if c, ok := c.(excelize.Cell); ok {
				cs = append(cs, c)
			}
		}
		return sw.SetRow(ref, cells, excelize.RowOpts{Height: rowHeight(cs, summaryWidths, nil)})
	}
	// putWide writes one text across the tab (merged A:H).
	putWide := func(c excelize.Cell) error {
		ref, _ := excelize.CoordinatesToCellName(1, row)
		end, _ := excelize.CoordinatesToCellName(len(summaryWidths), row)
		merges = append(merges, [2]string{ref, end})
		row++
		return sw.SetRow(ref, []any{c}, excelize.RowOpts{Height: rowHeight([]excelize.Cell{c}, []float64{summaryWide - 2}, nil)})
	}
	m := x.s.Meta()
	title := m.Title
	if title == "" {
		title = "Calculation sheet " + x.s.Name()
	}
	if err := put(x.text(title, clsTitle)); err != nil {
		return err
	}
	// Row 2: the banner that names the inputs changed since Sheaf ran
	// (empty while there are none, or nothing depends on Sheaf alone).
	if f := x.bannerFormula(); f != "" {
		if err := sw.SetRow("A2", []any{excelize.Cell{StyleID: x.st.id(clsBanner, ""), Formula: f, Value: ""}},
			excelize.RowOpts{Height: 2 * lineHeight}); err != nil {
			return err
		}
		merges = append(merges, [2]string{"A2", "H2"})
	}
	row++
	for _, kv := range [][2]string{{"Project", m.Project}, {"Basis", m.Basis}, {"Author", m.Author}, {"Checker", m.Checker},
		{"Date", m.Date}, {"Revision", m.Revision}, {"Sheet file", x.s.Name()}} {
		v := kv[1]
		if v == "" {
			v = "(not given)"
		}
		// The value spans B:F; a placeholder gets a warning in G:H.
		ref, _ := excelize.CoordinatesToCellName(2, row)
		end, _ := excelize.CoordinatesToCellName(6, row)
		merges = append(merges, [2]string{ref, end})
		warn := x.text("", clsText)
		if kv[0] != "Sheet file" && isPlaceholder(v) {
			warn = x.text(placeholderWarning, clsFail)
		}
		width := summaryWidths[1] + summaryWidths[2] + summaryWidths[3] + summaryWidths[4] + summaryWidths[5]
		rowRef, _ := excelize.CoordinatesToCellName(1, row)
		ends, _ := excelize.CoordinatesToCellName(7, row)
		endw, _ := excelize.CoordinatesToCellName(8, row)
		merges = append(merges, [2]string{ends, endw})
		h := rowHeight([]excelize.Cell{{Value: v}, warn}, []float64{width, summaryWidths[6] + summaryWidths[7]}, nil)
		row++
		if err := sw.SetRow(rowRef, []any{x.text(kv[0], clsKey), x.text(v, clsText), nil, nil, nil, nil, warn}, excelize.RowOpts{Height: h}); err != nil {
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
		if x.anyFlag != "" {
			f = fmt.Sprintf("IF(COUNTIF(%s,\"%s\")>0,COUNTIF(%s,\"%s\")&\" of %d design checks out of date: %s\",%s)",
				rng, VerdictRerun, rng, VerdictRerun, n, VerdictRerun, f)
		}
		cached := fmt.Sprintf("%d of %d design checks pass", pass, n)
		if err := put(x.text("Overall", clsKey), excelize.Cell{StyleID: x.st.id(clsKey, ""), Formula: f, Value: cached}); err != nil {
			return err
		}
	}
	row++
	if err := put(x.text("Caution", clsHeading)); err != nil {
		return err
	}
	if err := putWide(x.text(Caution, clsCaution)); err != nil {
		return err
	}
	row++
	if err := x.writeRecord(put, putWide); err != nil {
		return err
	}
	row++
	if err := put(x.text("Reading this workbook", clsHeading)); err != nil {
		return err
	}
	for _, g := range x.guideLines() {
		if err := putWide(x.text(g, clsText)); err != nil {
			return err
		}
	}
	for _, m := range merges {
		if err := sw.MergeCell(m[0], m[1]); err != nil {
			return err
		}
	}
	if first != summaryFirstCheck {
		return fmt.Errorf("internal error: the checks start in row %d of the summary, not %d", first, summaryFirstCheck)
	}
	return sw.Flush()
}

// summaryFirstCheck is the row of the first check on the summary: title,
// banner, seven header lines, a blank row, the heading and the column
// headers come before it.
const summaryFirstCheck = 13

// verdictColours colours the verdicts of rng by conditional formatting,
// so that a verdict that changes after an edit takes its colour with it.
func (x *exporter) verdictColours(tab, rng string) error {
	var opts []excelize.ConditionalFormatOptions
	for _, v := range []struct {
		word string
		st   excelize.Style
	}{
		{VerdictPass, excelize.Style{Font: &excelize.Font{Bold: true, Color: colPass}}},
		{VerdictFail, excelize.Style{Font: &excelize.Font{Bold: true, Color: colFail}, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillFail}}}},
		{VerdictRerun, excelize.Style{Font: &excelize.Font{Bold: true, Color: colStale}, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillStale}}}},
	} {
		id, err := x.f.NewConditionalStyle(&v.st)
		if err != nil {
			return err
		}
		opts = append(opts, excelize.ConditionalFormatOptions{Type: "cell", Criteria: "==", Value: quoted(v.word), Format: &id})
	}
	if err := x.f.SetConditionalFormat(tab, rng, opts); err != nil {
		return err
	}
	// Demand, capacity and utilisation of a check that depends on a value
	// only Sheaf computes are marked once an input upstream has changed.
	id := -1
	for k, ch := range x.checks {
		g := x.guardExpr(x.stale[ch.cell.Index])
		if g == "" {
			continue
		}
		if id < 0 {
			var err error
			if id, err = x.f.NewConditionalStyle(&staleStyle); err != nil {
				return err
			}
		}
		r := strconv.Itoa(summaryFirstCheck + k)
		if err := x.f.SetConditionalFormat(tab, "C"+r+":F"+r, []excelize.ConditionalFormatOptions{{Type: "formula", Criteria: g, Format: &id}}); err != nil {
			return err
		}
	}
	return nil
}

// checkSummary is a row of the checks table: the demand and capacity are
// live formulas in the check's unit, the utilisation reads the check's
// named cell, the verdict follows it.
func (x *exporter) checkSummary(ch *checkRow) []any {
	c := ch.cell
	name := x.tr.refs[c.Name].name
	side := func(n nodeAlias, si float64) any {
		v := si / ch.unit.Factor
		if !ch.known {
			return x.text("", clsText)
		}
		if s, over := x.beyondRange(si, ch.unit.Factor); over {
			return x.text(s, clsValueOnly) // never +Inf for a finite side
		}
		if x.comboDep(c.Index) && x.readsActions(n) {
			return x.number(v, clsValueOnly, x.sig) // of the governing combination
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
		util = excelize.Cell{StyleID: x.st.id(clsDerived, utilFormat), Formula: name, Value: ch.util}
		cls, word := clsVerdict, VerdictPass
		if !ch.pass {
			word = VerdictFail
		}
		f := verdictFormula(name)
		if g := x.guardExpr(x.stale[c.Index]); g != "" {
			f = "IF(" + g + "," + quoted(VerdictRerun) + "," + f + ")"
		}
		verdict = excelize.Cell{StyleID: x.st.id(cls, ""), Formula: f, Value: word}
	} else {
		util = x.text("", clsText)
		v := x.text(VerdictUnknown, clsFail)
		if g := x.guardExpr(x.stale[c.Index]); g != "" {
			v.Formula = "IF(" + g + "," + quoted(VerdictRerun) + "," + quoted(VerdictUnknown) + ")"
		}
		verdict = v
	}
	desc := c.Description()
	if line := x.governsLine(c); line != "" {
		desc = strings.TrimSpace(desc + "\n" + line)
	}
	return []any{x.text(c.Name, clsKey), x.text(desc, clsText), side(c.Extra().Demand, ch.demand), side(c.Extra().Capacity, ch.capacity),
		x.text(unit, clsText), util, verdict, x.text(c.Reference(), clsText)}
}

// placeholderWarning stands beside a header field that is a placeholder.
const placeholderWarning = "placeholder: fill in"

// isPlaceholder reports whether a header field holds no real value yet:
// empty, a dash, or a word that stands for one.
func isPlaceholder(v string) bool {
	switch strings.ToLower(strings.Trim(strings.TrimSpace(v), ".…")) {
	case "", "-", "–", "—", "?", "??", "(not given)", "tbd", "tba", "n/a", "x", "xx", "xxx", "todo", "none", "name", "date":
		return true
	}
	return false
}

// writeRecord writes the record of the calculation: who made it with
// what, the SHA-256 of each file it was computed from, and the sign-off.
func (x *exporter) writeRecord(put func(...any) error, putWide func(excelize.Cell) error) error {
	if err := put(x.text("Record", clsHeading)); err != nil {
		return err
	}
	if err := put(x.text("Computed by", clsKey), x.text(x.gen, clsText)); err != nil {
		return err
	}
	for i, f := range x.files() {
		what := "Template"
		if i == 0 {
			what = "Sheet"
		}
		if err := put(x.text(what, clsKey), x.text(f.name, clsText)); err != nil {
			return err
		}
		if err := put(x.text("SHA-256", clsKey), x.text(f.sha, clsMono)); err != nil {
			return err
		}
	}
	if err := putWide(x.text("The SHA-256 identifies the exact text of each file: recompute it (sha256sum) to confirm that a sheet is the one these results came from.", clsText)); err != nil {
		return err
	}
	head := []string{"Sign-off", "Name", "", "Signature", "", "", "Date", ""}
	hs := make([]any, len(head))
	for i, h := range head {
		hs[i] = x.text(h, clsHeader)
	}
	if err := put(hs...); err != nil {
		return err
	}
	m := x.s.Meta()
	for _, r := range [][2]string{{"Prepared by", m.Author}, {"Checked by", m.Checker}, {"Approved by", ""}} {
		name := r[1]
		if isPlaceholder(name) {
			name = ""
		}
		if err := put(x.text(r[0], clsKey), x.text(name, clsSign), x.text("", clsSign), x.text("", clsSign), x.text("", clsSign),
			x.text("", clsSign), x.text("", clsSign), x.text("", clsSign)); err != nil {
			return err
		}
	}
	return nil
}

// sourceFile is a file the calculation was computed from.
type sourceFile struct{ name, sha string }

// files lists the sheet and its templates with the SHA-256 of their text.
func (x *exporter) files() []sourceFile {
	out := []sourceFile{{filepath.ToSlash(x.s.Name()), sha(x.s.Source())}}
	dir := filepath.Dir(x.s.Name())
	for _, f := range x.s.Program().Files {
		if f == nil || f.Name == x.s.Name() {
			continue
		}
		name := f.Name
		if rel, err := filepath.Rel(dir, f.Name); err == nil {
			name = rel
		}
		out = append(out, sourceFile{filepath.ToSlash(name), sha(f.Src)})
	}
	return out
}

func sha(b []byte) string {
	h := sha256.Sum256(b)
	return hex.EncodeToString(h[:])
}
