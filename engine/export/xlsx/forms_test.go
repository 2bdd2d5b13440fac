package xlsxout

import (
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// typical SI magnitudes by the unit of a parameter; the grid takes each
// at -1.3, 0.37, 1.1 and 2.9 times it, so that it reaches the arguments a
// function refuses (a negative modulus, a wall thicker than half the
// tube), where the spreadsheet form must be an error too.
var typical = []struct {
	unit string
	v    float64
}{
	{"m", 0.1}, {"m^2", 1e-3}, {"m^4", 1e-5}, {"Pa", 1e8}, {"N", 1e5}, {"1", 0.8}, {"1/K", 1.2e-5}, {"K", 30}, {"N/m^3", 7.8e4},
}

var gridFactors = []float64{-1.3, 0.37, 1.1, 2.9}

func typicalOf(t *funcs.Type) (float64, bool) {
	if t == nil || t.Kind != funcs.Number {
		return 0, false
	}
	for _, c := range typical {
		u, err := units.Parse(c.unit)
		if err == nil && u.Dim == t.Dim {
			return c.v, true
		}
	}
	return 0, false
}

// testCurve is the table argument of the grid: a buckling-curve-like
// table of our own (not a code's values).
var testCurve = [2][]float64{{0, 0.2, 0.5, 0.9, 1.4, 2.0}, {1, 1, 0.91, 0.66, 0.42, 0.23}}

// formCase is one function at one grid point: the formula of its result
// (or of one field) over the argument cells, and what Go's Call gives.
type formCase struct {
	what    string
	formula string
	want    float64
	err     bool    // Call fails here
	scale   float64 // for a zero result: the size of its kind of value
}

// formCases lays every spreadsheet form of the registry out on a grid:
// the arguments of each point in a row of sheet1 (columns A…), the curve
// table in columns Y and Z, and returns the formulas to evaluate.
func formCases(t *testing.T, f *excelize.File) []formCase {
	t.Helper()
	const sh = "Sheet1"
	for i := range testCurve[0] {
		for j, col := range []string{"Y", "Z"} {
			if err := f.SetCellValue(sh, col+strconv.Itoa(i+1), testCurve[j][i]); err != nil {
				t.Fatal(err)
			}
		}
	}
	n := strconv.Itoa(len(testCurve[0]))
	curveCols := map[string]string{"lambda": sh + "!$Y$1:$Y$" + n, "chi": sh + "!$Z$1:$Z$" + n}
	var out []formCase
	row := 1
	covered := 0
	for _, d := range funcs.All() {
		if d.Spreadsheet == nil {
			continue
		}
		covered++
		// The grid of each parameter: numbers at the grid factors (a
		// trailing optional one also omitted), λ̄ finely over the curve.
		var axes [][]float64
		for _, p := range d.Params {
			switch {
			case p.Type.Kind == funcs.Table:
				axes = append(axes, []float64{math.NaN()}) // the curve
			case d.Name == "buckling_factor":
				var ls []float64
				// k/20 is exact at the rows of the curve: a spreadsheet
				// compares to 15 digits, so a λ̄ one rounding step past
				// the last row would count as on it there, not in Go.
				for k := -2; k <= 43; k++ {
					ls = append(ls, float64(k)/20)
				}
				axes = append(axes, append(ls, testCurve[0]...))
			default:
				v, ok := typicalOf(p.Type)
				if !ok {
					t.Fatalf("%s: no typical value for parameter %s (%s)", d.Name, p.Name, p.Type)
				}
				ax := make([]float64, 0, len(gridFactors)+1)
				for _, g := range gridFactors {
					ax = append(ax, g*v)
				}
				if p.Optional {
					ax = append(ax, math.Inf(1)) // omitted
				}
				axes = append(axes, ax)
			}
		}
		idx := make([]int, len(axes))
		for {
			args := make([]funcs.Value, 0, len(axes))
			cells := make([]string, len(axes))
			for k, ax := range axes {
				v := ax[idx[k]]
				col, _ := excelize.ColumnNumberToName(k + 1)
				cells[k] = "$" + col + "$" + strconv.Itoa(row)
				switch {
				case math.IsNaN(v):
					args = append(args, &funcs.TableValue{Type: d.Params[k].Type, Cols: [][]float64{testCurve[0], testCurve[1]}})
				case math.IsInf(v, 1):
					// omitted: no argument
				default:
					args = append(args, v)
					if err := f.SetCellValue(sh, cells[k], v); err != nil {
						t.Fatal(err)
					}
				}
			}
			arg := func(p funcs.Placeholder) (string, error) {
				if p.Param >= len(args) {
					return p.Default, nil
				}
				if p.Column != "" {
					if p.Increasing {
						return increasing(curveCols[p.Column], len(testCurve[0])), nil
					}
					return curveCols[p.Column], nil
				}
				return cells[p.Param], nil
			}
			got, callErr := d.Call(args)
			forms := map[string]string{"": d.Spreadsheet.Formula}
			if d.Spreadsheet.Formula == "" {
				forms = d.Spreadsheet.Fields
			}
			for field, form := range forms {
				s, err := spreadsheetFormula(d, form, arg)
				if err != nil {
					t.Fatalf("%s: %v", d.Name, err)
				}
				c := formCase{what: d.Name + " row " + strconv.Itoa(row), formula: s, err: callErr != nil}
				if field != "" {
					c.what += " ." + field
				}
				if callErr == nil {
					c.want, c.scale = resultOf(t, d, got, field)
				}
				out = append(out, c)
			}
			row++
			k := 0
			for ; k < len(idx); k++ {
				idx[k]++
				if idx[k] < len(axes[k]) {
					break
				}
				idx[k] = 0
			}
			if k == len(idx) {
				break
			}
		}
	}
	if covered < 15 {
		t.Errorf("only %d functions have a spreadsheet form", covered)
	}
	return out
}

// resultOf is the number Call returned (a field of it for a record) and
// the size of values of its dimension in the same result.
func resultOf(t *testing.T, d *funcs.Def, v funcs.Value, field string) (float64, float64) {
	if field == "" {
		x := v.(float64)
		return x, math.Abs(x)
	}
	rec := v.(*funcs.RecordValue)
	i := rec.Type.Field(field)
	x := rec.Fields[i].(float64)
	scale := 0.0
	for j, fld := range rec.Type.Fields {
		if y, ok := rec.Fields[j].(float64); ok && fld.Type.Dim == rec.Type.Fields[i].Type.Dim {
			scale = math.Max(scale, math.Abs(y))
		}
	}
	return x, scale
}

// judgeForm compares one spreadsheet result with Go: relative 1e-12 (a
// value that is zero by symmetry, such as the product moment of a
// rectangle, to 1e-12 of the largest value of its dimension in the same
// result: Go's polygon moments leave a residue of about 1e-21 m⁴ there),
// and an error where Call fails.
func judgeForm(t *testing.T, engine string, c formCase, got string) {
	t.Helper()
	x, err := strconv.ParseFloat(got, 64)
	switch {
	case c.err:
		if err == nil {
			t.Errorf("%s: %s gives %s where the Go function fails\n%s", engine, c.what, got, c.formula)
		}
	case err != nil:
		t.Errorf("%s: %s gives %q, the Go function %.17g\n%s", engine, c.what, got, c.want, c.formula)
	case math.Abs(x-c.want) > 1e-12*math.Max(math.Abs(c.want), math.Abs(x)) && math.Abs(x-c.want) > 1e-12*c.scale:
		t.Errorf("%s: %s gives %.17g, the Go function %.17g (relative %.2g)\n%s", engine, c.what, x, c.want, math.Abs(x-c.want)/math.Abs(c.want), c.formula)
	}
}

// TestSpreadsheetForms: every spreadsheet form of the registry equals its
// Go function on a grid of arguments (relative 1e-12), and is an error
// where the Go function fails, in excelize's calculator and in the other
// spreadsheet engine (one soffice run for the whole grid).
// Source: the Go functions of the families are the reference; excelize's
// calculator and the other spreadsheet engine evaluate the forms.
func TestSpreadsheetForms(t *testing.T) {
	f := excelize.NewFile()
	defer f.Close()
	cases := formCases(t, f)
	for i, c := range cases {
		cell := "AB" + strconv.Itoa(i+1)
		if err := f.SetCellFormula("Sheet1", cell, c.formula); err != nil {
			t.Fatal(err)
		}
	}
	for i, c := range cases {
		got, err := f.CalcCellValue("Sheet1", "AB"+strconv.Itoa(i+1), raw)
		if err != nil {
			got = "#ERR " + err.Error()
		}
		judgeForm(t, "excelize", c, got)
	}
	t.Logf("%d formulas compared in excelize's calculator", len(cases))

	if testing.Short() {
		return
	}
	if _, err := exec.LookPath("soffice"); err != nil {
		t.Log("soffice is not installed: the other spreadsheet engine is not compared")
		return
	}
	cmd, profile := office(t)
	dir := t.TempDir()
	book := filepath.Join(dir, "forms.xlsx")
	full := true
	if err := f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full}); err != nil {
		t.Fatal(err)
	}
	if err := f.SaveAs(book); err != nil {
		t.Fatal(err)
	}
	out := officeCSV(t, cmd, profile, dir, []string{book})
	rows := readCSV(t, filepath.Join(out, "forms-Sheet1.csv"))
	for i, c := range cases {
		got := ""
		if i < len(rows) && len(rows[i]) > 27 {
			got = rows[i][27]
		}
		judgeForm(t, "soffice", c, got)
	}
	t.Logf("%d formulas compared in the other spreadsheet engine", len(cases))
	_ = os.Remove(book)
}
