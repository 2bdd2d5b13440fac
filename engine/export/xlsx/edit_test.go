package xlsxout

import (
	"bytes"
	"fmt"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/funcs"
)

// An edit is one input of a workbook raised by 10 %: in the workbook (in
// its display unit) and in Sheaf (in SI), as `sheaf run --set` does it.
type edit struct {
	what string // q_k, steel.E, curve_a.chi[3]
	tab  string // the tab and cell typed in
	cell string
	val  float64             // the new value in the workbook
	set  func(*engine.State) // the same change in Sheaf
	// results, when set, gives Sheaf's results of the change instead of
	// set (a factor of the combination rules is a line of the sheet).
	results func() *engine.Results
}

// result is Sheaf's results of sheet s after edit e.
func (e edit) result(s *engine.Sheet) *engine.Results {
	if e.results != nil {
		return e.results()
	}
	st := s.NewState()
	e.set(st)
	return st.Eval()
}

// editsOf lists every edit of the workbook of x: each numeric input cell,
// each numeric field of an input record written in the sheet, each entry
// of a table the workbook leaves editable. Zero values are skipped (10 %
// of nothing is no change).
func editsOf(t *testing.T, x *exporter) []edit {
	t.Helper()
	var out []edit
	for _, r := range x.rows {
		switch r.kind {
		case rowCell:
			c := r.cr.Cell
			v, ok := r.cr.Value.(float64)
			if c.Kind != engine.Input || !ok || v == 0 {
				continue
			}
			name := c.Name
			out = append(out, edit{what: name, tab: TabCalc, cell: colValue + strconv.Itoa(r.row), val: r.cr.Display * 1.1,
				set: func(st *engine.State) {
					if err := st.Set(name, v*1.1); err != nil {
						t.Fatal(err)
					}
				}})
		case rowField:
			v, ok := r.val.(float64)
			if !r.input || r.formul.IsZero() || !ok || v == 0 {
				continue
			}
			c := x.r.Cells[r.cell].Cell
			rec, ok := x.r.Cells[r.cell].Value.(*funcs.RecordValue)
			field := strings.TrimPrefix(r.path, c.Name+".")
			fi := -1
			if ok {
				fi = rec.Type.Field(field)
			}
			if fi < 0 {
				continue // a field of a nested record
			}
			name := c.Name
			out = append(out, edit{what: r.path, tab: TabCalc, cell: colValue + strconv.Itoa(r.row), val: v / r.unit.Factor * 1.1,
				set: func(st *engine.State) {
					changed := &funcs.RecordValue{Type: rec.Type, Fields: append([]funcs.Value(nil), rec.Fields...)}
					changed.Fields[fi] = v * 1.1
					if err := st.Set(name, changed); err != nil {
						t.Fatal(err)
					}
				}})
		}
	}
	out = append(out, factorEdits(t, x)...)
	for _, b := range x.tables {
		if !b.input || x.locked(b.cell) {
			continue
		}
		name := x.r.Cells[b.cell].Cell.Name
		for j, col := range b.t.Cols {
			c, _ := excelize.ColumnNumberToName(j + 1)
			for i, v := range col {
				if v == 0 {
					continue
				}
				out = append(out, edit{what: fmt.Sprintf("%s.%s[%d]", name, b.t.Type.Fields[j].Name, i), tab: TabData,
					cell: c + strconv.Itoa(b.firstDataRow()+i), val: v / b.units[j].Factor * 1.1,
					set: func(st *engine.State) {
						cols := make([][]float64, len(b.t.Cols))
						for k := range cols {
							cols[k] = append([]float64(nil), b.t.Cols[k]...)
						}
						cols[j][i] = v * 1.1
						if err := st.Set(name, &funcs.TableValue{Type: b.t.Type, Cols: cols}); err != nil {
							t.Fatal(err)
						}
					}})
			}
		}
	}
	return out
}

// A tally counts the values and verdicts of a workbook after its edits.
type tally struct {
	edits, live, guarded, wrong int
	lenient                     bool // see judge
}

// expected is what a value row of the Calculation tab must show after an
// edit: Sheaf's value in the display unit of the row.
func expectedRow(r *calcRow, res *engine.Results) (any, bool) {
	switch r.kind {
	case rowCell:
		cr := res.Cell(r.cr.Cell.Name)
		if cr == nil || !cr.Known || r.cr.Cell.Kind == engine.Function || r.cr.Cell.Kind == engine.Table {
			return nil, false
		}
		switch v := cr.Value.(type) {
		case bool:
			return v, true
		case float64:
			if cr.Cell.Kind == engine.Check {
				return cr.SI, true
			}
			return cr.Display, true
		}
	case rowField:
		cr := res.Cell(res.Cells[r.cell].Cell.Name)
		if cr == nil || !cr.Known {
			return nil, false
		}
		v := fieldValue(cr.Value, strings.Split(strings.TrimPrefix(r.path, cr.Cell.Name+"."), "."))
		switch v := v.(type) {
		case bool:
			return v, true
		case float64:
			return v / r.unit.Factor, true
		}
	}
	return nil, false
}

func fieldValue(v funcs.Value, path []string) funcs.Value {
	for _, p := range path {
		rec, ok := v.(*funcs.RecordValue)
		if !ok || rec.Type == nil {
			return nil
		}
		i := rec.Type.Field(p)
		if i < 0 || i >= len(rec.Fields) {
			return nil
		}
		v = rec.Fields[i]
	}
	return v
}

// judge compares the recomputed tabs of one edited workbook with Sheaf's
// results for the same edit: every value equals Sheaf's (relative 1e-9)
// or is marked out of date; every verdict is Sheaf's or VerdictRerun.
func judge(t *testing.T, x *exporter, e edit, res *engine.Results, calc, summary [][]string, n *tally) {
	t.Helper()
	at := func(rows [][]string, row, col int) string {
		if row-1 < len(rows) && col < len(rows[row-1]) {
			return rows[row-1][col]
		}
		return ""
	}
	for i := range x.rows {
		r := &x.rows[i]
		want, ok := expectedRow(r, res)
		if !ok {
			continue
		}
		got, note := at(calc, r.row, 4), at(calc, r.row, 7)
		if strings.HasPrefix(note, NoteStale) {
			n.guarded++
			continue
		}
		var same bool
		switch w := want.(type) {
		case bool:
			same = strings.EqualFold(got, strconv.FormatBool(w))
		case float64:
			g, err := parseShown(got)
			same = err == nil && (closeOrCancelled(g, w) || withinShown(got, g, w))
		}
		if same {
			n.live++
			continue
		}
		n.wrong++
		name := r.path
		if r.kind == rowCell {
			name = r.cr.Cell.Name
		}
		t.Errorf("%s raised 10 %%: %s shows %q, Sheaf gives %v, and it is not marked out of date (note %q)", e.what, name, got, want, note)
	}
	// The Summary lists the checks in order under their header.
	first := -1
	for i, row := range summary {
		if len(row) > 6 && row[0] == "Check" && row[6] == "Verdict" {
			first = i + 2
		}
	}
	for k, ch := range x.checks {
		cr := res.Cell(ch.cell.Name)
		row := first + k
		if first < 0 || at(summary, row, 0) != ch.cell.Name {
			t.Fatalf("%s: check %s not found on the Summary", e.what, ch.cell.Name)
		}
		got := at(summary, row, 6)
		want := VerdictUnknown
		for _, c := range res.Checks {
			if c.Cell.Name == ch.cell.Name && c.Known {
				want = map[bool]string{true: VerdictPass, false: VerdictFail}[c.Pass]
			}
		}
		switch {
		case got != want && want == VerdictUnknown && n.lenient:
			// excelize's calculator turns an error inside ABS(a-b) into 0,
			// so a check Sheaf cannot assess may show a verdict there; the
			// other spreadsheet's run of this test is strict.
			continue
		case got == VerdictRerun:
			n.guarded++
		case got == want:
			n.live++
		default:
			n.wrong++
			t.Errorf("%s raised 10 %%: check %s reads %q, Sheaf says %q (utilisation %v)", e.what, ch.cell.Name, got, want, cr.SI)
		}
	}
	if len(x.checks) > 0 {
		row := first + len(x.checks)
		got := at(summary, row, 1)
		pass, rerun := 0, 0
		for k := range x.checks {
			switch at(summary, first+k, 6) {
			case VerdictPass:
				pass++
			case VerdictRerun:
				rerun++
			}
		}
		want := fmt.Sprintf("%d of %d design checks pass", pass, len(x.checks))
		if rerun > 0 {
			want = fmt.Sprintf("%d of %d design checks out of date: %s", rerun, len(x.checks), VerdictRerun)
		}
		if got != want {
			n.wrong++
			t.Errorf("%s raised 10 %%: the overall line reads %q, want %q", e.what, got, want)
		}
	}
	// The banner names the changed input when anything depends on it
	// through a value only Sheaf computes.
	banner := at(summary, 2, 0)
	if n.guarded > 0 && banner == "" && anyStale(calc, summary) {
		t.Errorf("%s raised 10 %%: values are out of date but the Summary has no banner", e.what)
	}
	if banner != "" && !strings.Contains(banner, strings.Split(e.what, "[")[0]) {
		t.Errorf("%s raised 10 %%: the banner %q does not name the input", e.what, banner)
	}
}

// parseShown reads a number the other spreadsheet wrote to CSV: a cell
// formatted as a percentage keeps its % sign there (utilisations).
func parseShown(s string) (float64, error) {
	if p, ok := strings.CutSuffix(s, "%"); ok {
		v, err := strconv.ParseFloat(p, 64)
		return v / 100, err
	}
	return strconv.ParseFloat(s, 64)
}

// closeOrCancelled is close (relative 1e-9), or both within 1e-12 of zero
// in the display unit: a difference Sheaf computes as exactly 0 (a solver
// against a shortcut) leaves a rounding residue of about 1e-15 in a
// spreadsheet that computes it through display factors.
// withinShown reports whether want rounds to got at the decimals the
// spreadsheet printed in shown: its CSV writes a tiny number in fixed point
// with a bounded count of decimals (0.0000000000032999184), so the last
// printed digit is the resolution, not a relative 1e-9.
func withinShown(shown string, got, want float64) bool {
	i := strings.IndexByte(shown, '.')
	if i < 0 || strings.ContainsAny(shown, "eE") {
		return false
	}
	decimals := len(shown) - i - 1
	return math.Abs(got-want) <= 0.5*math.Pow(10, -float64(decimals))
}

func closeOrCancelled(a, b float64) bool {
	return close(a, b) || math.Abs(a) < 1e-12 && math.Abs(b) < 1e-12
}

func anyStale(calc, summary [][]string) bool {
	for _, r := range calc {
		if len(r) > 7 && strings.HasPrefix(r[7], NoteStale) {
			return true
		}
	}
	for _, r := range summary {
		if len(r) > 6 && r[6] == VerdictRerun {
			return true
		}
	}
	return false
}

// everySheet is every bundled sheet and the fixtures of this package.
func everySheet(t *testing.T) []string {
	t.Helper()
	all, err := filepath.Glob("../../../sheets/*.sheaf")
	if err != nil || len(all) == 0 {
		t.Fatalf("no sheets: %v", err)
	}
	return append(all, "testdata/ops.sheaf", "testdata/charts.sheaf", "testdata/template-table.sheaf", "testdata/uplift.sheaf", "testdata/curve-marks.sheaf")
}

// editedBook applies e to a fresh export of s with results base and
// returns the workbook bytes.
func editedBook(t *testing.T, s *engine.Sheet, base *engine.Results, e edit) []byte {
	t.Helper()
	x, err := export(s, base, Options{Generator: "Sheaf test"})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if _, err := x.f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := f.SetCellValue(e.tab, e.cell, e.val); err != nil {
		t.Fatal(err)
	}
	buf.Reset()
	if _, err := f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// TestEditEveryInputExcelize is the edit test of every sheet with
// excelize's calculator: it recomputes each formula cell of the two tabs.
// Source: excelize's formula calculator is the reference.
func TestEditEveryInputExcelize(t *testing.T) {
	for _, path := range everySheet(t) {
		t.Run(filepath.Base(path), func(t *testing.T) {
			s := load(t, path)
			base := s.NewState().Eval()
			x, err := export(s, base, Options{})
			if err != nil {
				t.Fatal(err)
			}
			n := tally{lenient: true}
			for _, e := range editsOf(t, x) {
				f, err := excelize.OpenReader(bytes.NewReader(editedBook(t, s, base, e)))
				if err != nil {
					t.Fatal(err)
				}
				res := e.result(s)
				calc, summary, combos := calcTabs(t, f)
				judge(t, x, e, res, calc, summary, &n)
				judgeCombos(t, x, e, res, combos, &n)
				n.edits++
				_ = f.Close()
			}
			t.Logf("%s: %d edits; %d values and verdicts right, %d marked out of date, %d wrong", filepath.Base(path), n.edits, n.live, n.guarded, n.wrong)
		})
	}
}

// calcTabs recomputes the Calculation and Summary tabs with excelize's
// calculator, as text rows like the other spreadsheet's CSV.
func calcTabs(t *testing.T, f *excelize.File) (calc, summary, combos [][]string) {
	t.Helper()
	tab := func(name string) [][]string {
		rows, err := f.GetRows(name, raw)
		if err != nil {
			t.Fatal(err)
		}
		for i, r := range rows {
			for j := range r {
				ref, _ := excelize.CoordinatesToCellName(j+1, i+1)
				if fm, _ := f.GetCellFormula(name, ref); fm != "" {
					v, err := f.CalcCellValue(name, ref, raw)
					if err != nil {
						v = "#ERR " + err.Error()
					}
					r[j] = v
				}
			}
		}
		return rows
	}
	if idx, _ := f.GetSheetIndex(TabCombos); idx >= 0 {
		combos = tab(TabCombos)
	}
	return tab(TabCalc), tab(TabSummary), combos
}
