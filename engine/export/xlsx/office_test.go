package xlsxout

import (
	"context"
	"encoding/csv"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/engine"
)

// officeProfile makes the spreadsheet engine recompute every formula of an Office Open
// XML workbook when it opens one (its default is to trust the cached
// values, which would test nothing).
const officeProfile = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`

// TestRecomputeInAnotherSpreadsheet opens the workbook in an independent
// open-source spreadsheet engine (the `soffice` command), after raising every numeric
// input by 10 % in the workbook, and compares every live formula it
// recomputes with Sheaf's own recompute of the same change, to 1e-9
// relative. It needs `soffice` on the PATH (.ci/run installs it where it
// can) and is skipped without it.
// Source: the independent spreadsheet engine's own recalculation is the reference.
func TestRecomputeInAnotherSpreadsheet(t *testing.T) {
	office, err := exec.LookPath("soffice")
	if err != nil {
		t.Skip("soffice is not installed; the excelize calculator test still runs")
	}
	if testing.Short() {
		t.Skip("starts soffice; skipped with -short")
	}
	dir := t.TempDir()
	profile := filepath.Join(dir, "profile")
	if err := os.MkdirAll(filepath.Join(profile, "user"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(profile, "user", "registrymodifications.xcu"), []byte(officeProfile), 0o644); err != nil {
		t.Fatal(err)
	}
	for i, path := range fixtures {
		t.Run(filepath.Base(path), func(t *testing.T) {
			s := load(t, path)
			base := s.NewState().Eval()
			f := build(t, s, base)
			st := s.NewState()
			changed := 0
			for _, cr := range base.Cells {
				v, ok := cr.Value.(float64)
				if !ok || cr.Cell.Kind != engine.Input {
					continue
				}
				if err := st.Set(cr.Cell.Name, v*1.1); err != nil {
					t.Fatal(err)
				}
				if err := f.SetCellValue(TabCalc, nameCell(t, f, cr.Cell.Name), cr.Display*1.1); err != nil {
					t.Fatal(err)
				}
				changed++
			}
			if changed == 0 {
				t.Fatal("no numeric input to change")
			}
			r := st.Eval()
			book := filepath.Join(dir, "book"+strconv.Itoa(i)+".xlsx")
			if err := f.SaveAs(book); err != nil {
				t.Fatal(err)
			}
			rows := officeCalcTab(t, office, profile, book, dir)
			compared := 0
			for _, cr := range r.Cells {
				c := cr.Cell
				if !cr.Known || c.Kind == engine.Function {
					continue
				}
				ref := nameCell(t, f, c.Name)
				if fm, _ := f.GetCellFormula(TabCalc, ref); fm == "" {
					continue
				}
				if note, _ := f.GetCellValue(TabCalc, "H"+ref[1:]); strings.HasPrefix(note, notePartly) {
					continue // reads values only Sheaf computes
				}
				if _, ok := cr.Value.(float64); !ok {
					continue
				}
				want := cr.Display
				if c.Kind == engine.Check {
					want = cr.SI // utilisation
				}
				row, _ := strconv.Atoi(ref[1:])
				if row > len(rows) || len(rows[row-1]) < 5 {
					t.Errorf("%s: row %d missing from the recomputed tab", c.Name, row)
					continue
				}
				got, err := strconv.ParseFloat(rows[row-1][4], 64)
				if err != nil || !close(got, want) {
					t.Errorf("%s: the other spreadsheet engine recomputes %q, Sheaf %.15g", c.Name, rows[row-1][4], want)
				}
				compared++
			}
			if compared == 0 {
				t.Error("no live formula compared")
			}
			t.Logf("%d inputs changed, %d live formulas agree", changed, compared)
		})
	}
}

// officeCalcTab converts the Calculation tab of book to CSV with
// soffice and returns its rows. The filter options ask for UTF-8,
// values at full precision rather than as shown, and the second tab.
func officeCalcTab(t *testing.T, office, profile, book, dir string) [][]string {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	defer cancel()
	out := filepath.Join(dir, "csv")
	cmd := exec.CommandContext(ctx, office, "-env:UserInstallation=file://"+profile, "--headless",
		"--convert-to", "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,2",
		"--outdir", out, book)
	// A spreadsheet engine that cannot start or convert here says nothing about our
	// formulas: skip, with its words, rather than fail.
	if msg, err := cmd.CombinedOutput(); err != nil {
		t.Skipf("soffice could not convert the workbook here: %v\n%s", err, msg)
	}
	name := strings.TrimSuffix(filepath.Base(book), ".xlsx") + "-" + TabCalc + ".csv"
	data, err := os.ReadFile(filepath.Join(out, name))
	if err != nil {
		t.Skipf("soffice wrote no %s here: %v", name, err)
	}
	rd := csv.NewReader(strings.NewReader(string(data)))
	rd.FieldsPerRecord = -1
	rows, err := rd.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}
