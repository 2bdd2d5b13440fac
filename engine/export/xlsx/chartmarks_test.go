package xlsxout

import (
	"archive/zip"
	"bytes"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/funcs"
)

// chartSeries is one series of a chart part as the package holds it: its
// name (the legend text in the cell it names) and its points.
type chartSeries struct {
	name string
	xs   []float64
	ys   []float64
}

var (
	serRE   = regexp.MustCompile(`(?s)<ser>(.*?)</ser>`)
	txRE    = regexp.MustCompile(`<tx><strRef><f>([^<]*)</f>`)
	xValRE  = regexp.MustCompile(`<xVal><numRef><f>([^<]*)</f>`)
	yValRE  = regexp.MustCompile(`<yVal><numRef><f>([^<]*)</f>`)
	titleRE = regexp.MustCompile(`<a:t>([^<]*)</a:t>`)
	refRE   = regexp.MustCompile(`^([A-Za-z]+)!\$([A-Z]+)\$([0-9]+)(?::\$([A-Z]+)\$([0-9]+))?$`)
)

// chartParts returns the series of every chart of a workbook by the
// chart's title, reading the chart XML of the package and the cells its
// series refer to (cached values, as a reader first sees them).
func chartParts(t *testing.T, book []byte) map[string][]chartSeries {
	t.Helper()
	z, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(book))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cells := func(ref string) []string {
		m := refRE.FindStringSubmatch(ref)
		if m == nil {
			t.Fatalf("series reference %q is not a cell or a column range", ref)
		}
		first, _ := strconv.Atoi(m[3])
		last := first
		if m[5] != "" {
			last, _ = strconv.Atoi(m[5])
		}
		var out []string
		for r := first; r <= last; r++ {
			v, err := f.GetCellValue(m[1], m[2]+strconv.Itoa(r), raw)
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, v)
		}
		return out
	}
	nums := func(ref string) []float64 {
		var out []float64
		for _, s := range cells(ref) {
			v, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatalf("series cell of %s holds %q, not a number", ref, s)
			}
			out = append(out, v)
		}
		return out
	}
	charts := map[string][]chartSeries{}
	for _, zf := range z.File {
		if !strings.HasPrefix(zf.Name, "xl/charts/chart") {
			continue
		}
		rc, _ := zf.Open()
		b, _ := io.ReadAll(rc)
		rc.Close()
		title := titleRE.FindStringSubmatch(string(b))
		if title == nil {
			t.Fatalf("%s has no title", zf.Name)
		}
		var ss []chartSeries
		for _, m := range serRE.FindAllStringSubmatch(string(b), -1) {
			tx, xv, yv := txRE.FindStringSubmatch(m[1]), xValRE.FindStringSubmatch(m[1]), yValRE.FindStringSubmatch(m[1])
			if tx == nil || xv == nil || yv == nil {
				t.Fatalf("%s: a series without a name, x or y reference:\n%s", zf.Name, m[1])
			}
			ss = append(ss, chartSeries{name: strings.Join(cells(tx[1]), ""), xs: nums(xv[1]), ys: nums(yv[1])})
		}
		charts[title[1]] = ss
	}
	return charts
}

// sheetXML is the worksheet part of tab in a workbook package.
func sheetXML(t *testing.T, book []byte, tab string) string {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(book))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	idx, err := f.GetSheetIndex(tab)
	if err != nil || idx < 0 {
		t.Fatalf("no tab %s", tab)
	}
	z, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	if err != nil {
		t.Fatal(err)
	}
	// The workbook names its tabs' parts in order: sheet1.xml, sheet2.xml, …
	name := "xl/worksheets/sheet" + strconv.Itoa(idx+1) + ".xml"
	for _, zf := range z.File {
		if zf.Name == name {
			rc, _ := zf.Open()
			b, _ := io.ReadAll(rc)
			rc.Close()
			return string(b)
		}
	}
	t.Fatalf("no part %s", name)
	return ""
}

// wantMark is a check marked on a chart: the legend text of its limit and
// of its design point (each must start so), the limit's height and the
// design point, in the chart's units. A NaN x is "any x from xMin on".
type wantMark struct {
	limit, point string
	y            float64
	px, py       float64
	xMin         float64
}

// sampleValue is a number Sheaf computed: the cell or the field path.
func sampleValue(t *testing.T, r *engine.Results, path string) float64 {
	t.Helper()
	head, rest, _ := strings.Cut(path, ".")
	for _, cr := range r.Cells {
		if cr.Cell.Name != head {
			continue
		}
		v := cr.Value
		for rest != "" {
			var f string
			f, rest, _ = strings.Cut(rest, ".")
			rec, ok := v.(*funcs.RecordValue)
			if !ok || rec.Type.Field(f) < 0 {
				t.Fatalf("%s: no field %s", path, f)
			}
			v = rec.Fields[rec.Type.Field(f)]
		}
		x, ok := v.(float64)
		if !ok {
			t.Fatalf("%s is not a number", path)
		}
		return x
	}
	t.Fatalf("no cell %s", head)
	return 0
}

func near(a, b, rel float64) bool {
	return math.Abs(a-b) <= rel*math.Max(math.Max(math.Abs(a), math.Abs(b)), 1e-300)
}

// TestChartMarks: a chart of bar samples draws the limit of every check
// that compares one of its samples with a limit as a horizontal line
// across the bar, and the sample the check uses as a single point, both
// named in the legend with value and unit; a check that compares
// anything else is not marked.
func TestChartMarks(t *testing.T) {
	nan := math.NaN()
	type chart struct {
		title string // the start of the chart's title
		marks []wantMark
	}
	cases := []struct {
		sheet  string
		charts []chart
		rel    float64 // of the design point against its source
		// between: the design points are Sheaf's points on the curve,
		// between two samples (an N–ε curve), not samples.
		between bool
		// fill sets the expected values that are Sheaf's own (the
		// position of a sample, a limit computed in the sheet)
		fill func(t *testing.T, r *engine.Results, cs []chart)
	}{
		{
			sheet: "testdata/marks.sheaf", rel: 1e-12,
			charts: []chart{
				// Source: statics of the hanger: N = P1 + P2 = 50 kN above the
				// mid-length load, N = P2 = 20 kN below it; σ = N/A =
				// 50 kN / 500 mm² = 100 MPa (closed form).
				{"N(x)", []wantMark{
					{"limit of check top: N ≤ 120.0 kN (N_lim)", "design point of check top: N = 50 kN at x = 0 mm", 120, 0, 50, 0},
					{"limit of check low: N ≥ 5.000 kN", "design point of check low: N = 20 kN at x = ", 5, nan, 20, 2000},
				}},
				{"u(x)", nil}, // check twice: 2·u_end is not a sample
				{"σ(x)", []wantMark{
					{"limit of check s3: |σ| ≤ 250.0 MPa", "design point of check s3: σ = 100 MPa at x = ", 250, nan, 100, 0},
					{"limit of check smax: |σ| ≤ 150.0 MPa (f_lim)", "design point of check smax: σ = 100 MPa at x = 0 mm", 150, 0, 100, 0},
				}},
			},
			fill: func(t *testing.T, r *engine.Results, cs []chart) {
				// res.samples.sigma[3]: at the fourth sample, wherever the
				// solver put it (Sheaf's own samples).
				for _, cr := range r.Cells {
					if cr.Cell.Name == "res" {
						rec := cr.Value.(*funcs.RecordValue)
						tab := rec.Fields[rec.Type.Field("samples")].(*funcs.TableValue)
						cs[2].marks[0].px = tab.Cols[0][3] * 1000
					}
				}
			},
		},
		{
			sheet: "testdata/charts.sheaf", rel: 1e-12,
			charts: []chart{
				{"N(x)", nil},
				// Source: δ = P·L/(E·A) = 25 kN · 3 m / (200 GPa · 400 mm²) = 0.9375 mm (closed form).
				{"u(x)", []wantMark{{"limit of check foot: u ≤ 5.000 mm", "design point of check foot: u = 0.9375 mm at x = 3000 mm", 5, 3000, 0.9375, 0}}},
				{"σ(x)", nil},
			},
		},
		{
			// The pipe is in compression: |σ| ≤ 110 MPa is drawn at -110 MPa.
			sheet: "../../../sheets/heated-pipe.sheaf", rel: 1e-3,
			charts: []chart{
				{"σ(x), axial stress σ along the bar: stop as a spring", []wantMark{{
					"limit of check pipe_stress: |σ| ≤ 110.0 MPa (sigma_lim), drawn at -110.0", "design point of check pipe_stress: σ = -21.42 MPa at x = 0 mm",
					// Source: the sheet's hand check, σ = -77027 N / 3595.6 mm² = -21.42 MPa (rounded).
					-110, 0, -21.42, 0}}},
				{"σ(x), axial stress σ along the bar: stop taken as rigid", nil},
				{"N(x), axial force N along the bar: stop as a spring", nil},
			},
		},
		{
			sheet: "../../../sheets/layered-pile.sheaf", rel: 1e-3,
			charts: []chart{
				// Source: the sheet's hand check, s = 36620 kN·m / 9.2844e6 kN = 3.944 mm (rounded).
				{"u(x)", []wantMark{{"limit of check shortening: u ≤ 5.000 mm (s_lim)", "design point of check shortening: u = 3.944 mm at x = 0 mm", 5, 0, 3.944, 0}}},
				{"N(x)", nil},
			},
		},
		{
			// A sheet with actions: the samples and the check are of the
			// same combination. The stress is largest at the truss (x = 0).
			sheet: "../../../sheets/canopy-hanger.sheaf", rel: 1e-12,
			charts: []chart{{"σ(x)", []wantMark{{"limit of check stress: |σ| ≤ ", "design point of check stress: σ = ", nan, 0, nan, 0}}}},
			fill: func(t *testing.T, r *engine.Results, cs []chart) {
				cs[0].marks[0].y = sampleValue(t, r, "f_yd") / 1e6
				cs[0].marks[0].py = sampleValue(t, r, "sigma_Ed") / 1e6
			},
		},
		{
			// A concrete-filled tube with actions: the squash load is the
			// curve's plateau (drawn at -N_pl,Rd), the design point is the
			// strain Sheaf finds at the governing N_Ed; the other checks
			// (buckling, the core's stress) are not marked.
			sheet: "../../../sheets/cft-column.sheaf", rel: 1e-12, between: true,
			charts: []chart{{"N(ε)", []wantMark{{"limit of check squash: |N| ≤ 4106 kN (N_plRd), drawn at -4106",
				"design point of check squash: N = -2738 kN at ε = -0.001053", nan, nan, nan, 0}}}},
			fill: func(t *testing.T, r *engine.Results, cs []chart) {
				npl, eps := sampleValue(t, r, "N_plRd"), -sampleValue(t, r, "eps_Ed")
				ned := math.NaN()
				for _, ch := range r.Checks {
					if ch.Cell.Name == "squash" {
						ned = ch.Demand
					}
				}
				// Source: the sheet's hand check, N_plRd = 4106.2 kN, ULS 2
				// = 2737.5 kN, eps_Ed = 1.053 per mille (rounded).
				if !near(npl, 4106.2e3, 1e-4) || !near(ned, 2737.5e3, 1e-9) || !near(eps, -1.053e-3, 1e-3) {
					t.Errorf("N_plRd = %g N, N_Ed = %g N, eps_Ed = %g: not the hand check's", npl, ned, eps)
				}
				m := &cs[0].marks[0]
				m.y, m.px, m.py = -npl/1e3, eps, -ned/1e3
			},
		},
		{
			sheet: "testdata/curve-marks.sheaf", rel: 1e-12, between: true,
			charts: []chart{
				{"N(ε), axial force against uniform strain: first tube", []wantMark{
					{"limit of check pl1: |N| ≤ 1713 kN (N_pl1), drawn at -1713", "design point of check pl1: N = -1200 kN at ε = -0.001184", nan, nan, -1200, 0},
					{"limit of check via: |N| ≤ 1713 kN (N_cap), drawn at -1713", "design point of check via: N = -1200 kN at ε = -0.001184", nan, nan, -1200, 0},
				}},
				{"N(ε), axial force against uniform strain: second tube", nil},
			},
			fill: func(t *testing.T, r *engine.Results, cs []chart) {
				// Source: closed forms: N_pl = A·f_y with A = π(d² − (d − 2t)²)/4
				// = π(200² − 184²)/4 mm² (Gere & Goodno, Appendix E); the
				// tube is elastic at N_Ed (ε < f_y/E), so ε = N_Ed/(E·A)
				// (Hooke's law).
				a := math.Pi * (0.2*0.2 - 0.184*0.184) / 4
				eps := sampleValue(t, r, "eps_1")
				if !near(eps, 1200e3/(210e9*a), 1e-9) {
					t.Errorf("eps_1 = %g, Hooke's law gives %g", eps, 1200e3/(210e9*a))
				}
				for j := range cs[0].marks {
					m := &cs[0].marks[j]
					m.y, m.px = -a*355e6/1e3, -eps
				}
			},
		},
		{
			// Its checks compare the load and the slenderness, no sample.
			sheet:  "../../../sheets/tapered-strut.sheaf",
			charts: []chart{{"N(x)", nil}, {"u(x)", nil}, {"σ(x)", nil}},
		},
	}
	for _, tc := range cases {
		t.Run(filepath.Base(tc.sheet), func(t *testing.T) {
			s := load(t, tc.sheet)
			r := s.NewState().Eval()
			if tc.fill != nil {
				tc.fill(t, r, tc.charts)
			}
			f, stats, err := Build(s, r, Options{})
			if err != nil {
				t.Fatal(err)
			}
			var buf bytes.Buffer
			if _, err := f.WriteTo(&buf); err != nil {
				t.Fatal(err)
			}
			parts := chartParts(t, buf.Bytes())
			// The charts stay anchored on their tab, a printed page each,
			// with the marks' cells streamed in after them.
			if xml := sheetXML(t, buf.Bytes(), TabCharts); !strings.Contains(xml, "<drawing ") ||
				len(parts) > 1 && !strings.Contains(xml, "<rowBreaks ") || !strings.Contains(xml, `orientation="landscape"`) {
				t.Errorf("the %s tab lost its drawing, page breaks or print setup", TabCharts)
			}
			marks := 0
			for _, c := range tc.charts {
				var ss []chartSeries
				found := 0
				for title, s := range parts {
					if strings.HasPrefix(title, c.title) {
						ss = s
						found++
					}
				}
				if found != 1 {
					t.Errorf("%d charts titled %q…", found, c.title)
					continue
				}
				marks += len(c.marks)
				if len(ss) != 1+2*len(c.marks) {
					names := make([]string, len(ss))
					for i, s := range ss {
						names[i] = s.name
					}
					t.Errorf("%s: %d series %q, want the samples and %d marks", c.title, len(ss), names, len(c.marks))
					continue
				}
				xs := ss[0].xs
				for j, m := range c.marks {
					lim, pt := ss[1+2*j], ss[2+2*j]
					if !strings.HasPrefix(lim.name, m.limit) || !strings.HasPrefix(pt.name, m.point) {
						t.Errorf("%s: legend %q and %q, want %q… and %q…", c.title, lim.name, pt.name, m.limit, m.point)
					}
					// The limit spans the bar at one height.
					if len(lim.xs) != 2 || lim.xs[0] != xs[0] || lim.xs[1] != xs[len(xs)-1] || len(lim.ys) != 2 ||
						!near(lim.ys[0], m.y, 1e-12) || lim.ys[1] != lim.ys[0] {
						t.Errorf("%s: limit at %v, %v; want y = %g from x = %g to %g", c.title, lim.xs, lim.ys, m.y, xs[0], xs[len(xs)-1])
					}
					// The design point is one of the plotted samples.
					if len(pt.xs) != 1 || len(pt.ys) != 1 {
						t.Errorf("%s: design point %v, %v is not one point", c.title, pt.xs, pt.ys)
						continue
					}
					onCurve := false
					for i := range xs {
						onCurve = onCurve || xs[i] == pt.xs[0] && ss[0].ys[i] == pt.ys[0]
						if tc.between && i > 0 {
							// Between the samples around it (the curve is
							// monotone there).
							lo, hi := math.Min(ss[0].ys[i-1], ss[0].ys[i]), math.Max(ss[0].ys[i-1], ss[0].ys[i])
							onCurve = onCurve || xs[i-1] <= pt.xs[0] && pt.xs[0] <= xs[i] && lo <= pt.ys[0] && pt.ys[0] <= hi
						}
					}
					if !onCurve {
						t.Errorf("%s: design point (%g, %g) is not a sample", c.title, pt.xs[0], pt.ys[0])
					}
					xOK := near(pt.xs[0], m.px, 1e-12) || math.IsNaN(m.px) && pt.xs[0] >= m.xMin
					if !xOK || !near(pt.ys[0], m.py, tc.rel) {
						t.Errorf("%s: design point (%g, %g), want (%g, %g)", c.title, pt.xs[0], pt.ys[0], m.px, m.py)
					}
				}
			}
			if stats.Marks != marks {
				t.Errorf("%d marks counted, want %d", stats.Marks, marks)
			}
		})
	}
}

// TestChartMarksFollowEdits: in the other spreadsheet engine, the limit
// line and its legend follow an edit of the limit, and the status line
// above a chart reads chartStale once an input of the samples changes (it
// is empty after the edit of the limit alone, which the samples do not
// read).
// Source: the other spreadsheet engine's recalculation is the reference.
func TestChartMarksFollowEdits(t *testing.T) {
	cmd, profile := office(t)
	dir := t.TempDir()
	s := load(t, "testdata/marks.sheaf")
	r := s.NewState().Eval()
	edits := []struct {
		book, input string
		value       float64
	}{{"limit", "N_lim", 150}, {"load", "P1", 33}}
	x, err := export(s, r, Options{})
	if err != nil {
		t.Fatal(err)
	}
	var books []string
	for _, e := range edits {
		row := -1
		for _, cr := range x.rows {
			if cr.kind == rowCell && cr.cr.Cell.Name == e.input {
				row = cr.row
			}
		}
		if row < 0 {
			t.Fatalf("no row of %s", e.input)
		}
		book := filepath.Join(dir, e.book+".xlsx")
		b := editedBook(t, s, r, edit{what: e.input, tab: TabCalc, cell: colValue + strconv.Itoa(row), val: e.value})
		if err := os.WriteFile(book, b, 0o644); err != nil {
			t.Fatal(err)
		}
		books = append(books, book)
	}
	out := officeCSV(t, cmd, profile, dir, books)
	for _, e := range edits {
		rows := readCSV(t, filepath.Join(out, e.book+"-"+TabCharts+".csv"))
		at := func(row, col int) string {
			if row < len(rows) && col < len(rows[row]) {
				return rows[row][col]
			}
			return ""
		}
		// The N(x) chart is first: its status line is B1, the limit of
		// check top is in R2 (legend) and T2:T3 (heights).
		status, legend, y0, y1 := at(0, 1), at(1, marksColumn-1), at(1, marksColumn+1), at(2, marksColumn+1)
		switch e.book {
		case "limit":
			if status != "" {
				t.Errorf("after the edit of N_lim the status reads %q", status)
			}
			if y0 != "150" || y1 != "150" || legend != "limit of check top: N ≤ 150.0 kN (N_lim)" {
				t.Errorf("after N_lim = 150 kN the limit is at %s, %s with legend %q", y0, y1, legend)
			}
		case "load":
			if status != chartStale {
				t.Errorf("after the edit of P1 the status reads %q, want %q", status, chartStale)
			}
			if y0 != "120" {
				t.Errorf("after the edit of P1 the limit moved to %s", y0)
			}
		}
	}
	_ = os.RemoveAll(out)
}
