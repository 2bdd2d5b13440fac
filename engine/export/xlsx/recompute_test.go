package xlsxout

import (
	"bytes"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

var raw = excelize.Options{RawCellValue: true}

// fixtures are the sheets the workbook tests run on.
var fixtures = []string{"testdata/ops.sheaf", "../../../sheets/mezzanine-hanger.sheaf", "testdata/charts.sheaf"}

// build exports s with results r into memory and reopens it, as a client
// would open the file.
func build(t testing.TB, s *engine.Sheet, r *engine.Results) *excelize.File {
	t.Helper()
	f, _, err := Build(s, r, Options{Generator: "Sheaf test"})
	if err != nil {
		t.Fatalf("build: %v", err)
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	g, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// nameCell returns the Calculation cell the defined name of a Sheaf path
// points at (the name's comment holds the path).
func nameCell(t testing.TB, f *excelize.File, path string) string {
	t.Helper()
	for _, dn := range f.GetDefinedName() {
		if dn.Comment == path {
			want := "Calculation!$E$"
			if len(dn.RefersTo) > len(want) && dn.RefersTo[:len(want)] == want {
				return "E" + dn.RefersTo[len(want):]
			}
			t.Fatalf("%s refers to %s", path, dn.RefersTo)
		}
	}
	t.Fatalf("no defined name for %s", path)
	return ""
}

func close(a, b float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b))
}

// compareFormulas recomputes every formula of the Calculation tab with the
// spreadsheet calculator and compares it with Sheaf's results r, in
// display units. It returns the number of formulas compared.
func compareFormulas(t *testing.T, f *excelize.File, s *engine.Sheet, r *engine.Results, what string) int {
	t.Helper()
	n := 0
	for _, cr := range r.Cells {
		c := cr.Cell
		if c.Kind == engine.Function || !cr.Known {
			continue
		}
		ref := nameCell(t, f, c.Name)
		fm, _ := f.GetCellFormula(TabCalc, ref)
		if fm == "" {
			continue
		}
		if note, _ := f.GetCellValue(TabCalc, "H"+ref[1:]); strings.HasPrefix(note, notePartly) {
			continue // reads values only Sheaf computes: changes upstream of them cannot reach it
		}
		got, err := f.CalcCellValue(TabCalc, ref, raw)
		if err != nil {
			t.Errorf("%s: %s = %s: %v", what, c.Name, fm, err)
			continue
		}
		n++
		switch v := cr.Value.(type) {
		case bool:
			if got != map[bool]string{true: "TRUE", false: "FALSE"}[v] {
				t.Errorf("%s: %s = %s, Sheaf says %v", what, c.Name, got, v)
			}
		case float64:
			want := cr.Display
			if c.Kind == engine.Check {
				want = cr.SI
			}
			x, err := strconv.ParseFloat(got, 64)
			// The calculator prints 15 significant digits; compare to 1e-9.
			if err != nil || !close(x, want) {
				t.Errorf("%s: %s = %s gives %s, Sheaf says %.15g", what, c.Name, fm, got, want)
			}
		}
	}
	return n
}

// TestFormulasMatchSheaf: with the written inputs, every live formula
// computes what Sheaf computed.
// Source: the engine's own evaluation (State.Eval) is the reference.
func TestFormulasMatchSheaf(t *testing.T) {
	for _, path := range fixtures {
		t.Run(path, func(t *testing.T) {
			s := load(t, path)
			r := s.NewState().Eval()
			f := build(t, s, r)
			if n := compareFormulas(t, f, s, r, "as written"); n == 0 {
				t.Error("no formula compared")
			}
		})
	}
}

// TestRecomputeAfterChange changes each numeric input in the workbook (in
// its display unit) and the same input in Sheaf (in SI), then compares
// every live formula with Sheaf's recompute, to 1e-9 relative.
func TestRecomputeAfterChange(t *testing.T) {
	for _, path := range fixtures {
		s := load(t, path)
		base := s.NewState().Eval()
		for _, cr := range base.Cells {
			c := cr.Cell
			switch v := cr.Value.(type) {
			case float64:
				if c.Kind != engine.Input {
					continue
				}
				t.Run(path+"/"+c.Name, func(t *testing.T) {
					f := build(t, s, base)
					st := s.NewState()
					if err := st.Set(c.Name, v*1.1); err != nil {
						t.Fatal(err)
					}
					r := st.Eval()
					ref := nameCell(t, f, c.Name)
					if err := f.SetCellValue(TabCalc, ref, cr.Display*1.1); err != nil {
						t.Fatal(err)
					}
					compareFormulas(t, f, s, r, c.Name+" × 1.1")
				})
			case *funcs.RecordValue:
				if c.Kind != engine.Input || c.Body().IsZero() || c.Body().Op() != check.OpRecord {
					continue
				}
				for i, fv := range v.Fields {
					x, ok := fv.(float64)
					if !ok {
						continue
					}
					field := v.Type.Fields[i].Name
					t.Run(path+"/"+c.Name+"."+field, func(t *testing.T) {
						f := build(t, s, base)
						changed := &funcs.RecordValue{Type: v.Type, Fields: append([]funcs.Value(nil), v.Fields...)}
						changed.Fields[i] = x * 1.1
						st := s.NewState()
						if err := st.Set(c.Name, changed); err != nil {
							t.Fatal(err)
						}
						r := st.Eval()
						ref := nameCell(t, f, c.Name+"."+field)
						old, _ := f.GetCellValue(TabCalc, ref, raw)
						ov, _ := strconv.ParseFloat(old, 64)
						if err := f.SetCellValue(TabCalc, ref, ov*1.1); err != nil {
							t.Fatal(err)
						}
						compareFormulas(t, f, s, r, c.Name+"."+field+" × 1.1")
					})
				}
			}
		}
	}
}

// TestTableEntryChange edits an entry of a sheet table on the Data tab and
// compares the interpolation with Sheaf's.
func TestTableEntryChange(t *testing.T) {
	s := load(t, "testdata/ops.sheaf")
	base := s.NewState().Eval()
	f := build(t, s, base)
	tv := base.Cell("sizes").Value.(*funcs.TableValue)
	changed := &funcs.TableValue{Type: tv.Type, Cols: [][]float64{append([]float64(nil), tv.Cols[0]...), append([]float64(nil), tv.Cols[1]...)}}
	changed.Cols[1][2] = 1900e-6 // the 50 mm row: 1810 -> 1900 mm²
	st := s.NewState()
	if err := st.Set("sizes", changed); err != nil {
		t.Fatal(err)
	}
	r := st.Eval()
	// The table block starts at row 1: title, header, then the rows.
	if err := f.SetCellValue(TabData, "B5", 1900.0); err != nil {
		t.Fatal(err)
	}
	compareFormulas(t, f, s, r, "sizes.A[2] = 1900 mm²")
	if got := r.Cell("A_tab").Display; close(got, base.Cell("A_tab").Display) {
		t.Error("the change did not reach A_tab; the test proves nothing")
	}
}
