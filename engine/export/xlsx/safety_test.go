package xlsxout

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
)

// TestDefinedName checks the documented mangling.
// Source: ECMA-376 Part 1 (5th ed.) 18.2.5 definedName and the spreadsheet
// rule that a name may not be a cell reference in A1 or R1C1 style (from
// memory); common practice: TRUE and FALSE are not usable as names.
func TestDefinedName(t *testing.T) {
	cases := []struct{ in, want string }{
		{"A1", "_A1"}, {"d1", "_d1"}, {"L2", "_L2"}, {"XFD1048576", "_XFD1048576"}, {"abc123", "_abc123"},
		{"R", "_R"}, {"C", "_C"}, {"r", "_r"}, {"c", "_c"}, {"RC", "_RC"}, {"R1C1", "_R1C1"}, {"r12", "_r12"}, {"C3", "_C3"},
		{"TRUE", "_TRUE"}, {"false", "_false"},
		{"N_Ed", "N_Ed"}, {"sigma", "sigma"}, {"σ_Rd", "σ_Rd"}, {"abcd1", "abcd1"}, {"R2D2", "R2D2"}, {"A_1", "A_1"}, {"RCx", "RCx"},
		{"_x", "_x"}, {"1a", "_1a"},
	}
	for _, c := range cases {
		if got := DefinedName(c.in); got != c.want {
			t.Errorf("DefinedName(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// TestNamesInWorkbook: cells named like references, and names differing
// only by case, get distinct valid names that formulas can use.
func TestNamesInWorkbook(t *testing.T) {
	src := "A1 [kN] = 3 kN\nd1 [mm] = 12 mm\nL2 [m] = 2 m\nR [kN] = 1 kN\nC [kN] = 2 kN\nr = 2\nc = 3\nR1C1 = 4\nN [kN] = 5 kN\nn [kN] = 6 kN\n" +
		"tot [kN] = A1 + R + C + N + n + r * c * R1C1 * 1 kN + d1 / 1 mm * L2 / 1 m * 1 kN\n"
	s := compile(t, "names.sheaf", src)
	r := s.NewState().Eval()
	f := build(t, s, r)
	seen := map[string]string{}
	for _, dn := range f.GetDefinedName() {
		if misread(dn.Name) || !startsWell(dn.Name) {
			t.Errorf("name %q would be misread", dn.Name)
		}
		u := strings.ToUpper(dn.Name)
		if prev, dup := seen[u]; dup {
			t.Errorf("names %q and %q clash in a case-blind spreadsheet", prev, dn.Name)
		}
		seen[u] = dn.Name
	}
	for _, want := range []string{"_A1", "_d1", "_L2", "_R", "_C", "_r_2", "_c_2", "_R1C1", "N", "n_2"} {
		if _, ok := seen[strings.ToUpper(want)]; !ok {
			t.Errorf("missing name %s (have %v)", want, seen)
		}
	}
	if n := compareFormulas(t, f, s, r, "names"); n != 1 {
		t.Errorf("compared %d formulas, want 1", n)
	}
}

// TestNoFormulaInjection: text that a spreadsheet would take for a formula
// is stored as text.
func TestNoFormulaInjection(t *testing.T) {
	bad := []string{"=1+2", "+cmd|' /C calc'!A0", "-2+3", "@SUM(A1:A2)", "=HYPERLINK(\"x\")"}
	var b strings.Builder
	b.WriteString("title: =2+2\nproject: @risk\n")
	for i, d := range bad {
		b.WriteString("x" + string(rune('a'+i)) + " = 1 -- " + d + " @ " + d + "\n")
	}
	b.WriteString("check ok: xa <= 2 -- =1+1 @ -3\n")
	s := compile(t, "inject.sheaf", b.String())
	f := build(t, s, s.NewState().Eval())
	for _, tab := range f.GetSheetList() {
		rows, _ := f.GetRows(tab)
		for i, row := range rows {
			for j, v := range row {
				if v == "" || !strings.ContainsAny(v[:1], "=+-@") {
					continue
				}
				ref, _ := excelize.CoordinatesToCellName(j+1, i+1)
				fm, _ := f.GetCellFormula(tab, ref)
				ty, _ := f.GetCellType(tab, ref)
				if fm != "" || (ty != excelize.CellTypeSharedString && ty != excelize.CellTypeInlineString) {
					t.Errorf("%s!%s %q: formula %q, type %v; want a string cell", tab, ref, v, fm, ty)
				}
			}
		}
	}
	for i, d := range bad {
		ref := nameCell(t, f, "x"+string(rune('a'+i)))
		got, _ := f.GetCellValue(TabCalc, "B"+ref[1:])
		if got != d {
			t.Errorf("description %q read back as %q", d, got)
		}
	}
}

// TestAtomicWrite: a failed write leaves the old workbook and no temporary
// file; a good one replaces it.
func TestAtomicWrite(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "calc.xlsx")
	if err := os.WriteFile(path, []byte("old workbook"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("disk full")
	err := writeAtomic(path, func(w io.Writer) error {
		_, _ = io.WriteString(w, "half a workb")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("err = %v", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "old workbook" {
		t.Errorf("old file changed to %q", b)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("left behind: %v", ents)
	}
	s := load(t, "../../../sheets/mezzanine-hanger.sheaf")
	if _, err := WriteFile(path, s, s.NewState().Eval(), Options{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatalf("new file: %v", err)
	}
	_ = f.Close()
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("left behind: %v", ents)
	}
	if _, err := WriteFile(filepath.Join(dir, "no", "such", "dir.xlsx"), s, s.NewState().Eval(), Options{}); err == nil || !strings.Contains(err.Error(), "cannot write in") {
		t.Errorf("missing directory: %v", err)
	}
}

// TestStyles reads back the class of each value cell: inputs editable
// with the input fill, formulas locked, values only Sheaf computes grey
// and italic; every tab protected.
func TestStyles(t *testing.T) {
	s := load(t, "testdata/charts.sheaf")
	r := s.NewState().Eval()
	f := build(t, s, r)
	style := func(ref string) *excelize.Style {
		id, err := f.GetCellStyle(TabCalc, ref)
		if err != nil {
			t.Fatal(err)
		}
		st, err := f.GetStyle(id)
		if err != nil {
			t.Fatal(err)
		}
		return st
	}
	fill := func(st *excelize.Style) string {
		if len(st.Fill.Color) == 0 {
			return ""
		}
		c := strings.ToUpper(st.Fill.Color[0])
		if len(c) == 8 {
			c = c[2:]
		}
		return c
	}
	for _, c := range []struct {
		path, class string
	}{{"L", "input"}, {"P", "input"}, {"steel.E", "input"}, {"stretch_hand", "formula"}, {"u_end", "formula"}, {"foot", "formula"},
		{"res.u_end", "value"}, {"tube.A", "formula"}} {
		st := style(nameCell(t, f, c.path))
		locked := st.Protection == nil || st.Protection.Locked
		switch c.class {
		case "input":
			if locked || fill(st) != fillInput {
				t.Errorf("%s: locked %v fill %q, want an unlocked input", c.path, locked, fill(st))
			}
		case "formula":
			if !locked || fill(st) != "" {
				t.Errorf("%s: locked %v fill %q, want a locked formula", c.path, locked, fill(st))
			}
			if fm, _ := f.GetCellFormula(TabCalc, nameCell(t, f, c.path)); fm == "" {
				t.Errorf("%s has no formula", c.path)
			}
		case "value":
			if !locked || fill(st) != fillValueOnly || st.Font == nil || !st.Font.Italic {
				t.Errorf("%s: want a locked grey italic value", c.path)
			}
			// The note says why on the record's own row (res), once.
			rec, _, _ := strings.Cut(c.path, ".")
			if note, _ := f.GetCellValue(TabCalc, "H"+nameCell(t, f, rec)[1:]); !strings.HasPrefix(note, noteValueOnly) {
				t.Errorf("%s: note %q", rec, note)
			}
		}
	}
	for _, tab := range []string{TabSummary, TabCalc, TabSamples, TabCharts, TabRun} {
		if err := f.UnprotectSheet(tab); err != nil {
			t.Errorf("%s is not protected: %v", tab, err)
		}
	}
	props, err := f.GetCalcProps()
	if err != nil || props.FullCalcOnLoad == nil || !*props.FullCalcOnLoad {
		t.Errorf("full calculation on load not set: %v", err)
	}
	lay, err := f.GetPageLayout(TabCalc)
	if err != nil || lay.Size == nil || *lay.Size != paperA4 || lay.FitToWidth == nil || *lay.FitToWidth != 1 {
		t.Errorf("page layout %+v %v", lay, err)
	}
	hf, err := f.GetHeaderFooter(TabCalc)
	if err != nil || !strings.Contains(hf.OddHeader, "Charts fixture") || !strings.Contains(hf.OddFooter, "&P of &N") {
		t.Errorf("header/footer %+v %v", hf, err)
	}
	_ = engine.DefaultSigFigs
}

// TestNoInfForFiniteValues: a finite SI value beyond the range of a
// spreadsheet number in its display unit (2.36e304 m² is 2.36e310 mm²) is
// written as its text, never as +Inf (issue 15); values in range stay numbers.
func TestNoInfForFiniteValues(t *testing.T) {
	s := compile(t, "big.sheaf", "title: big\nA [mm^2] = 2.36e304 m^2\nB [m^2] = 2.36e304 m^2\nC [mm] = -1.5e306 m\n"+
		"table T\n  L [m]  F [kN]\n  1e306  1\n\ncheck c: 1e306 m <= 2e306 m\n")
	f := build(t, s, s.NewState().Eval())
	tests := []struct {
		cell, value, note string
		number            bool
	}{
		{"A", "2.36e310", noteTooLarge, false},
		{"B", "2.36E+304", "", true},
		{"C", "-1.5e309", noteTooLarge, false},
	}
	for _, tc := range tests {
		ref := nameCell(t, f, tc.cell)
		got, _ := f.GetCellValue(TabCalc, ref)
		ty, _ := f.GetCellType(TabCalc, ref)
		note, _ := f.GetCellValue(TabCalc, "H"+ref[1:])
		isText := ty == excelize.CellTypeSharedString || ty == excelize.CellTypeInlineString
		if strings.Contains(got, "Inf") || isText == tc.number || !strings.Contains(note, tc.note) {
			t.Errorf("%s: value %q (type %v), note %q; want %q, a number: %v, note %q", tc.cell, got, ty, note, tc.value, tc.number, tc.note)
		}
		if !tc.number && got != tc.value {
			t.Errorf("%s = %q, want %q", tc.cell, got, tc.value)
		}
	}
	// The Data tab and the Summary tab: no cell reads Inf.
	for _, tab := range f.GetSheetList() {
		rows, _ := f.GetRows(tab)
		for i, row := range rows {
			for j, v := range row {
				if strings.Contains(v, "Inf") {
					ref, _ := excelize.CoordinatesToCellName(j+1, i+1)
					t.Errorf("%s!%s = %q", tab, ref, v)
				}
			}
		}
	}
}
