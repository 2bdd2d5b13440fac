package xlsxout

import (
	"archive/zip"
	"bytes"
	"flag"
	"io"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// tabText renders a tab as text, one row a line, cells joined by " | ",
// formula cells showing their cached value.
func tabText(t *testing.T, f *excelize.File, tab string) string {
	t.Helper()
	rows, err := f.GetRows(tab)
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	for _, r := range rows {
		b.WriteString(strings.TrimRight(strings.Join(r, " | "), " |") + "\n")
	}
	return b.String()
}

// TestSummaryGolden: the summary tab of each fixture, as text.
func TestSummaryGolden(t *testing.T) {
	for _, c := range []struct{ sheet, golden string }{
		{"../../../sheets/mezzanine-hanger.sheaf", "summary-hanger.golden"},
		{"testdata/ops.sheaf", "summary-ops.golden"},
	} {
		t.Run(c.golden, func(t *testing.T) {
			s := load(t, c.sheet)
			f := build(t, s, s.NewState().Eval())
			text := strings.ReplaceAll(tabText(t, f, TabSummary), s.Name(), filepath.Base(s.Name()))
			if !strings.Contains(text, Caution) {
				t.Error("the caution is missing")
			}
			golden.Check(t, filepath.Join("testdata", c.golden), []byte(text), *update)
		})
	}
}

// TestCalculationGolden: the calculation tab of the hanger, as text: the
// reading order, hand calculations, values and notes, and the Data tab when
// the sheet has tables (the hanger takes its thread from the catalogue and
// has none).
func TestCalculationGolden(t *testing.T) {
	s := load(t, "../../../sheets/mezzanine-hanger.sheaf")
	f := build(t, s, s.NewState().Eval())
	text := tabText(t, f, TabCalc)
	if i, _ := f.GetSheetIndex(TabData); i >= 0 {
		text += "--- Data\n" + tabText(t, f, TabData)
	}
	golden.Check(t, filepath.Join("testdata", "calculation-hanger.golden"), []byte(text), *update)
}

// TestCharts: every bar result gets N(x), u(x) and σ(x), every N–ε curve
// its chart, each over the right columns of the Data tab.
func TestCharts(t *testing.T) {
	s := load(t, "testdata/charts.sheaf")
	r := s.NewState().Eval()
	fb, stats, err := Build(s, r, Options{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if _, err := fb.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	if stats.Charts != 4 || stats.Tables != 2 {
		t.Errorf("stats %+v, want 4 charts and 2 tables", stats)
	}
	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	data := tabText(t, f, TabSamples)
	for _, want := range []string{"res.samples: N, σ, u along the bar for plots", "x [mm] | N [kN] | sigma [MPa] | u [mm]", "curve: N against strain", "eps | N [kN]"} {
		if !strings.Contains(data, want) {
			t.Errorf("Data tab lacks %q:\n%s", want, data)
		}
	}
	z, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	if err != nil {
		t.Fatal(err)
	}
	var charts []string
	for _, zf := range z.File {
		if strings.HasPrefix(zf.Name, "xl/charts/chart") {
			rc, _ := zf.Open()
			b, _ := io.ReadAll(rc)
			rc.Close()
			charts = append(charts, string(b))
		}
	}
	if len(charts) != 4 {
		t.Fatalf("%d chart parts, want 4", len(charts))
	}
	for i, c := range charts {
		// Every series is drawn with a line, and its name is a reference
		// to a header cell, not free text (which a spreadsheet program
		// would reject as a broken formula).
		if !strings.Contains(c, "<xVal><numRef>") || strings.Contains(c, "<xVal><strRef>") {
			t.Errorf("chart %d does not give its x values as numbers", i+1)
		}
		// The samples are the first series (a design point, drawn
		// after them, is a marker without a line; see TestChartMarks).
		if first := serRE.FindString(c); strings.Contains(first, "<a:ln><a:noFill>") {
			t.Errorf("chart %d draws its samples without a line", i+1)
		}
		// The axis numbers print at the low side of the plot, not beside
		// an axis that crosses through it (all values negative).
		if strings.Count(c, `<tickLblPos val="low">`) != 2 {
			t.Errorf("chart %d does not print its axis numbers below and left of the plot", i+1)
		}
		for _, m := range regexp.MustCompile(`<tx><strRef><f>([^<]*)</f>`).FindAllStringSubmatch(c, -1) {
			if !regexp.MustCompile(`^(Samples|Charts)!\$[A-Z]+\$[0-9]+$`).MatchString(m[1]) {
				t.Errorf("chart %d names its series %q, not a cell reference", i+1, m[1])
			}
		}
	}
	all := strings.Join(charts, "\n")
	for _, want := range []string{
		// Titles in the sheet's words: the description of the result.
		"N(x), axial force N along the bar: fixed at the top, loaded at the foot", "u(x), displacement u along the bar: fixed at the top",
		"σ(x), axial stress σ along the bar: fixed", "N(ε), axial force against uniform strain: N against strain",
		"Samples!$A$", "Samples!$B$", "Samples!$C$", "Samples!$D$", "position x [mm]", "strain ε",
	} {
		if !strings.Contains(all, want) {
			t.Errorf("charts lack %q", want)
		}
	}
	// The plotted numbers are Sheaf's samples in display units: the last
	// u is the displacement of the foot.
	// Source: δ = P·L/(E·A) = 25 kN · 3 m / (200 GPa · 400 mm²) = 0.9375 mm (closed form).
	rows, _ := f.GetRows(TabSamples)
	var last []string
	for _, row := range rows[2:] {
		if len(row) == 0 {
			break
		}
		last = row
	}
	if len(last) != 4 || last[0] != "3000" || last[3] != "0.9375" {
		t.Errorf("last sample row %v, want x = 3000 mm, u = 0.9375 mm", last)
	}
}
