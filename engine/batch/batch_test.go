package batch_test

import (
	"bytes"
	"context"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/batch"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden files")

func load(t testing.TB, name string) *engine.Sheet {
	t.Helper()
	s, err := engine.Load(filepath.Join("testdata", name))
	if err != nil {
		t.Fatalf("load %s: %v", name, err)
	}
	return s
}

func read(t testing.TB, s *engine.Sheet, name string) *batch.Cases {
	t.Helper()
	path := filepath.Join("testdata", name)
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	cs, err := batch.Read(path, src, s)
	if err != nil {
		t.Fatalf("read %s: %v", name, err)
	}
	return cs
}

// allNumbers picks every number cell that is not a check.
func allNumbers(s *engine.Sheet) []string {
	var names []string
	for _, c := range s.Cells() {
		if c.Kind != engine.Check && c.Kind != engine.Function && c.Type != nil && c.Type.Kind == funcs.Number {
			names = append(names, c.Name)
		}
	}
	return names
}

func sameFloat(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (math.IsNaN(a) && math.IsNaN(b))
}

// TestBatchEqualsRun evaluates every row in a batch (incrementally, on
// cloned states, with several workers) and again on its own with
// Sheet.Run, and requires the same bits for every number and check.
func TestBatchEqualsRun(t *testing.T) {
	s := load(t, "tie.sheaf")
	for _, file := range []string{"cases.csv", "bad.csv"} {
		cs := read(t, s, file)
		for _, workers := range []int{1, 2, 3} {
			out, err := batch.Run(context.Background(), s, cs, batch.Options{Workers: workers, Pick: allNumbers(s)})
			if err != nil {
				t.Fatal(err)
			}
			for i, row := range out.Rows {
				if row.Case.Err != nil {
					continue
				}
				over := map[string]any{}
				for j, col := range cs.Columns {
					over[col.Name] = row.Case.Values[j]
				}
				res := s.Run(over)
				for k, c := range out.Picks {
					want := res.Cell(c.Name).SI
					if !sameFloat(row.Picks[k], want) {
						t.Errorf("%s workers=%d case %d: %s = %v in the batch, %v on its own", file, workers, i+1, c.Name, row.Picks[k], want)
					}
				}
				for k, ch := range res.Checks {
					if !sameFloat(row.Utils[k], ch.Util) {
						t.Errorf("%s workers=%d case %d: check %s utilisation %v in the batch, %v on its own", file, workers, i+1, ch.Cell.Name, row.Utils[k], ch.Util)
					}
				}
			}
		}
	}
}

// TestHandCheck checks the first case of cases.csv against a hand
// calculation, so the batch is tied to the formulas and not only to itself.
func TestHandCheck(t *testing.T) {
	s := load(t, "tie.sheaf")
	out, err := batch.Run(context.Background(), s, read(t, s, "cases.csv"), batch.Options{Pick: []string{"A", "N_Rd", "u"}})
	if err != nil {
		t.Fatal(err)
	}
	// Source: common practice — area of a circle A = π d²/4, plastic
	// resistance N = A·f_y/γ, elongation u = P·L/(E·A).
	d, fy, P, L, E := 0.020, 235e6, 30e3, 4.2, 210e9
	A := math.Pi * d * d / 4
	want := []float64{A, A * fy, P * L / (E * A)}
	row := out.Rows[0]
	for k, w := range want {
		if math.Abs(row.Picks[k]-w) > 1e-12*math.Abs(w) {
			t.Errorf("%s = %v, want %v", out.Picks[k].Name, row.Picks[k], w)
		}
	}
	if u := row.Utils[0]; math.Abs(u-P/(A*fy)) > 1e-12 {
		t.Errorf("strength utilisation %v, want %v", u, P/(A*fy))
	}
	// Case 4 sets P in MN and L in m: 0.08 MN on a 24 mm rod.
	A4 := math.Pi * 0.024 * 0.024 / 4
	if u := out.Rows[3].Utils[0]; math.Abs(u-80e3/(A4*fy)) > 1e-12 {
		t.Errorf("case 4 strength utilisation %v, want %v", u, 80e3/(A4*fy))
	}
}

// output renders what `sheaf batch` shows: the table, the summary and the
// bad rows.
func output(t *testing.T, s *engine.Sheet, file string, workers int) []byte {
	t.Helper()
	cs := read(t, s, file)
	out, err := batch.Run(context.Background(), s, cs, batch.Options{Workers: workers})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := out.WriteCSV(&b, 6); err != nil {
		t.Fatal(err)
	}
	b.WriteString("---\n")
	if err := out.Summarize().Write(&b, cs.File); err != nil {
		t.Fatal(err)
	}
	b.WriteString("---\n")
	if err := diag.Render(&b, cs.Bad(), diag.Sources{cs.File: cs.Src}); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func TestGolden(t *testing.T) {
	s := load(t, "tie.sheaf")
	for _, file := range []string{"cases.csv", "bad.csv"} {
		t.Run(file, func(t *testing.T) {
			got := output(t, s, file, 2)
			golden.Check(t, filepath.Join("testdata", strings.TrimSuffix(file, ".csv")+".golden"), got, *update)
			// Determinism: any number of workers, any run, the same bytes.
			for _, w := range []int{1, 3, 8} {
				if again := output(t, s, file, w); !bytes.Equal(got, again) {
					t.Errorf("workers=%d gives other bytes:\n%s", w, again)
				}
			}
		})
	}
}

// TestBadRowsRest: bad rows are reported with their lines and reasons and
// the other rows complete.
func TestBadRowsRest(t *testing.T) {
	s := load(t, "tie.sheaf")
	cs := read(t, s, "bad.csv")
	bad := cs.Bad()
	wantLines := []int{3, 4, 5, 7}
	if len(bad) != len(wantLines) {
		t.Fatalf("%d bad rows, want %d: %v", len(bad), len(wantLines), bad)
	}
	for i, d := range bad {
		if d.Range.Start().Line != wantLines[i] || d.Range.Start().File != cs.File {
			t.Errorf("bad row %d at %s, want line %d", i, d.Range.Start(), wantLines[i])
		}
	}
	out, err := batch.Run(context.Background(), s, cs, batch.Options{})
	if err != nil {
		t.Fatal(err)
	}
	done := 0
	for _, r := range out.Rows {
		if r.Case.Err == nil && !math.IsNaN(r.Utils[0]) {
			done++
		}
	}
	if done != 3 {
		t.Errorf("%d good rows evaluated, want 3", done)
	}
}

func TestHeaderErrors(t *testing.T) {
	s := load(t, "tie.sheaf")
	path := filepath.Join("testdata", "header.csv")
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	_, err = batch.Read(path, src, s)
	list, ok := err.(diag.List)
	if !ok {
		t.Fatalf("want a diag.List, got %v", err)
	}
	var b bytes.Buffer
	if err := diag.Render(&b, list, diag.Sources{path: src}); err != nil {
		t.Fatal(err)
	}
	golden.Check(t, filepath.Join("testdata", "header.golden"), b.Bytes(), *update)
}

func TestEmptyAndPicks(t *testing.T) {
	s := load(t, "tie.sheaf")
	if _, err := batch.Read("empty.csv", nil, s); err == nil || !strings.Contains(err.Error(), "empty") {
		t.Errorf("empty table: %v", err)
	}
	cs := read(t, s, "cases.csv")
	for _, tc := range []struct{ pick, want string }{
		{"N_rd", "did you mean `N_Rd`?"},
		{"strength", "design check"},
	} {
		_, err := batch.Run(context.Background(), s, cs, batch.Options{Pick: []string{tc.pick}})
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("--pick %s: %v, want %q", tc.pick, err, tc.want)
		}
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := batch.Run(ctx, s, cs, batch.Options{}); err == nil {
		t.Error("a cancelled run should fail")
	}
}

func TestXLSX(t *testing.T) {
	s := load(t, "tie.sheaf")
	out, err := batch.Run(context.Background(), s, read(t, s, "cases.csv"), batch.Options{})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := out.WriteXLSX(&b); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&b)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows("cases")
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 6 {
		t.Fatalf("%d rows, want a header and 5 cases", len(rows))
	}
	if got, want := strings.Join(rows[0], "|"), strings.Join(out.Header(), "|"); got != want {
		t.Errorf("header %q, want %q", got, want)
	}
	if rows[1][1] != "30" {
		t.Errorf("P of case 1 is %q, want 30", rows[1][1])
	}
}

// TestFiniteStaysFinite: a finite result beyond the range of float64 in
// its display unit (2.36e304 m² is 2.36e310 mm²) is written with its
// figures, in the CSV and in the workbook, never as +Inf (issue 15).
func TestFiniteStaysFinite(t *testing.T) {
	src := "title: big\nL [m] = 1 m\nA [mm^2] = L * 2.36e304 m\n"
	s, err := engine.Compile("big.sheaf", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	cs, err := batch.Read("big.csv", []byte("L [m]\n1\n2\n"), s)
	if err != nil {
		t.Fatal(err)
	}
	out, err := batch.Run(context.Background(), s, cs, batch.Options{Pick: []string{"A"}})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := out.WriteCSV(&b, 3); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"\n1,1,2.36e310,", "\n2,2,4.72e310,"} {
		if !strings.Contains(b.String(), want) || strings.Contains(b.String(), "Inf") {
			t.Errorf("CSV lacks %q or shows Inf:\n%s", want, b.String())
		}
	}
	b.Reset()
	if err := out.WriteXLSX(&b); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&b)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, _ := f.GetRows("cases")
	if len(rows) != 3 || len(rows[1]) < 3 || rows[1][2] != "2.36e310" {
		t.Errorf("workbook rows %q, want A of case 1 as 2.36e310", rows)
	}
}

// TestValueRefusesWhatIsNotDecimal: a case-table field is a plain decimal
// number (as a sheet writes one); strconv.ParseFloat's other forms and an
// overflow after scaling to SI are refused at the field, never passed on
// as Inf or NaN.
func TestValueRefusesWhatIsNotDecimal(t *testing.T) {
	s, err := engine.Compile("t.sheaf", []byte("L [km] = 2 km\nd [mm] = 20 mm\nx [m] = L + d\n"))
	if err != nil {
		t.Fatal(err)
	}
	cs, err := batch.Read("t.csv", []byte("\uFEFFL [km], d\n0x1p4, 20 mm\nNaN, 20 mm\nInf, 20 mm\n1_000, 20 mm\n1e306, 20 mm\n2.5, 1e308 km\n1.5e3, 2e1 mm\n"), s)
	if err != nil {
		t.Fatalf("read: %v (a byte order mark must not be part of the first column)", err)
	}
	for i, want := range []string{"not a decimal number", "not a decimal number", "not a decimal number", "not a decimal number", "out of range", "out of range", ""} {
		c := cs.Cases[i]
		if want == "" {
			if c.Err != nil || c.Values == nil {
				t.Errorf("case %d: %v", i+1, c.Err)
			}
			continue
		}
		if c.Err == nil || !strings.Contains(c.Err.Summary, want) {
			t.Errorf("case %d: problem %v, want %q", i+1, c.Err, want)
		}
	}
}

// TestPercentNeedsItsUnit: a bare number for an input shown in % is
// refused unless the header gives the unit (5 would be 500 %).
func TestPercentNeedsItsUnit(t *testing.T) {
	s, err := engine.Compile("t.sheaf", []byte("share [%] = 5 %\nk = share * 2\n"))
	if err != nil {
		t.Fatal(err)
	}
	// Source: ISO 80000-1 (2009) 7.1, % = 0.01.
	for _, c := range []struct {
		csv  string
		want float64 // SI, 0 when refused
	}{
		{"share\n7\n", 0},
		{"share\n7 %\n", 0.07},
		{"share [%]\n7\n", 0.07},
	} {
		cs, err := batch.Read("t.csv", []byte(c.csv), s)
		if err != nil {
			t.Fatal(err)
		}
		row := cs.Cases[0]
		switch {
		case c.want == 0 && row.Err == nil:
			t.Errorf("%q: accepted %v", c.csv, row.Values)
		case c.want != 0 && (row.Err != nil || row.Values[0] != c.want):
			t.Errorf("%q: %v %v, want %g", c.csv, row.Values, row.Err, c.want)
		}
	}
	if _, err := s.ParseInput("share", "7"); err == nil {
		t.Error("--set share=7 was accepted")
	}
}
