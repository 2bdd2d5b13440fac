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

// call is the registered function name applied to args, for building the
// record arguments of the grid; it fails the test when the call fails.
func callDef(t *testing.T, name string, args ...funcs.Value) funcs.Value {
	t.Helper()
	d, ok := funcs.Lookup(name)
	if !ok {
		t.Fatalf("no function %s", name)
	}
	v, err := d.Call(args)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return v
}

// testComposites are the composite arguments of the grid (our own
// sections): a steel tube alone, a concrete-filled tube, three materials
// with a concrete block, and two whose parts have no plateau (squash_load
// refuses them).
func testComposites(t *testing.T) []funcs.Value {
	steel := &funcs.RecordValue{Type: funcs.RecordOf("", funcs.Field{Name: "E", Type: funcs.Num(stressDim)}, funcs.Field{Name: "f_y", Type: funcs.Num(stressDim)}),
		Fields: []funcs.Value{210e9, 355e6}}
	conc := &funcs.RecordValue{Type: funcs.RecordOf("", funcs.Field{Name: "E", Type: funcs.Num(stressDim)}, funcs.Field{Name: "f_c", Type: funcs.Num(stressDim)}),
		Fields: []funcs.Value{34e9, 23.3e6}}
	epp := callDef(t, "law_epp", 210e9, 320e6)
	bars := callDef(t, "law_epp", 200e9, 435e6)
	pr := callDef(t, "law_parabola_rect", 23.3e6, 0.002, 0.0035, 2.0)
	tube := callDef(t, "chs", 0.273, 0.01)
	core := callDef(t, "circle", 0.253)
	part := func(args ...funcs.Value) funcs.Value { return callDef(t, "part", args...) }
	comp := func(parts ...funcs.Value) funcs.Value { return callDef(t, "composite", parts) }
	return []funcs.Value{
		comp(part(tube, steel, epp)),
		comp(part(tube, steel, epp), part(core, conc, pr)),
		comp(part(callDef(t, "place", callDef(t, "rect", 0.1, 0.05), 0.0, 0.2), steel, epp),
			part(callDef(t, "rect", 0.3, 0.3), conc, pr),
			part(callDef(t, "place", callDef(t, "circle", 0.02), 0.3, 0.0), steel, bars)),
		comp(part(tube, steel)),
		comp(part(tube, steel, callDef(t, "law_elastic", 210e9))),
	}
}

var stressDim = func() units.Dim { u, _ := units.Parse("Pa"); return u.Dim }()

// axisOf is the grid of one parameter of d: numbers at the grid factors
// of their typical value (radii also at 0; λ̄ of a buckling function
// finely over the curve), the test curve for a table, the test composites
// for a composite, curve names (good, in other case, padded, unknown) for
// a text; a trailing optional one also omitted (nil).
func axisOf(t *testing.T, d *funcs.Def, p funcs.Param, composites []funcs.Value) []funcs.Value {
	var ax []funcs.Value
	switch {
	case p.Type.Kind == funcs.Table:
		ax = []funcs.Value{&funcs.TableValue{Type: p.Type, Cols: [][]float64{testCurve[0], testCurve[1]}}}
	case p.Type.Kind == funcs.Record && p.Type.Name == "composite":
		ax = composites
	case p.Type.Kind == funcs.String:
		for _, s := range []string{"a0", "a", "b", "c", "d", "A", " b ", "C", "e", "a 0", ""} {
			ax = append(ax, s)
		}
	case p.Name == "lambda_bar" && (d.Name == "buckling_factor" || d.Name == "buckling_reduction"):
		// k/20 is exact at the rows of the curve: a spreadsheet
		// compares to 15 digits, so a λ̄ one rounding step past
		// the last row would count as on it there, not in Go.
		for k := -2; k <= 43; k++ {
			ax = append(ax, float64(k)/20)
		}
		for _, l := range testCurve[0] {
			ax = append(ax, l)
		}
	case p.Name == "coef" && d.Name == "squash_load":
		for _, c := range []float64{-0.5, 0, 0.3, 0.85, 1, 1.5, 1.6} {
			ax = append(ax, c)
		}
	default:
		v, ok := typicalOf(p.Type)
		if !ok {
			t.Fatalf("%s: no typical value for parameter %s (%s)", d.Name, p.Name, p.Type)
		}
		gs := gridFactors
		if p.Name == "r" || p.Name == "r_o" || p.Name == "r_i" {
			// A radius: smaller than the plates, and 0 (no fillet).
			v, gs = v/10, []float64{-1.3, 0, 0.37, 1.1, 2.9}
		}
		for _, g := range gs {
			ax = append(ax, g*v)
		}
	}
	if p.Optional {
		ax = append(ax, nil) // omitted
	}
	return ax
}

// gridOf lists the argument rows of d: every combination of the axes of
// its parameters, but for cft_resistance (eight parameters) the
// combinations of the geometry, λ̄ and e at one set of strengths, another
// set, and each strength in turn negative or zero.
func gridOf(t *testing.T, d *funcs.Def, composites []funcs.Value) [][]funcs.Value {
	if d.Name == "cft_resistance" {
		var rows [][]funcs.Value
		strengths := [][4]float64{{320e6, 355e6, 23.3e6, 35e6}, {460e6, 460e6, 13.3e6, 20e6}}
		for k := range 4 {
			for _, bad := range []float64{-1e6, 0} {
				s := strengths[0]
				s[k] = bad
				strengths = append(strengths, s)
			}
		}
		for si, st := range strengths {
			for _, dd := range []float64{-0.13, 0.037, 0.11, 0.29} {
				for _, tt := range []float64{-0.013, 0.0037, 0.011, 0.037} {
					for _, l := range []float64{-0.1, 0, 0.2, 0.5, 0.55, 1.2} {
						// e/d near 0.1 only where the spreadsheet's 15
						// digits cannot make it a tie.
						for _, e := range []funcs.Value{nil, -0.004, 0.0, 0.004, 0.02} {
							if si > 1 && (l != 0.2 || e != nil) {
								continue // a bad strength: one point of the rest
							}
							row := []funcs.Value{dd, tt, st[0], st[1], st[2], st[3], l}
							if e != nil {
								row = append(row, e)
							}
							rows = append(rows, row)
						}
					}
				}
			}
		}
		return rows
	}
	axes := make([][]funcs.Value, len(d.Params))
	for k, p := range d.Params {
		axes[k] = axisOf(t, d, p, composites)
	}
	var rows [][]funcs.Value
	idx := make([]int, len(axes))
	for {
		row := make([]funcs.Value, 0, len(axes))
		for k, ax := range axes {
			if v := ax[idx[k]]; v != nil {
				row = append(row, v)
			} else {
				break // omitted: the trailing optional ones
			}
		}
		rows = append(rows, row)
		k := 0
		for ; k < len(idx); k++ {
			idx[k]++
			if idx[k] < len(axes[k]) {
				break
			}
			idx[k] = 0
		}
		if k == len(idx) {
			return rows
		}
	}
}

// formCases lays every spreadsheet form of the registry out on a grid:
// the arguments of each point in a row of sheet1 (columns A…X; a record
// argument takes a column for each number field), the curve table in
// columns Y and Z, and returns the formulas to evaluate.
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
	composites := testComposites(t)
	var out []formCase
	row := 1
	covered := 0
	for _, d := range funcs.All() {
		if d.Spreadsheet == nil {
			continue
		}
		covered++
		for _, args := range gridOf(t, d, composites) {
			// cells: the argument cell of each number or text, and of
			// each number field of a record ("k.field").
			cells := map[string]string{}
			col := 1
			put := func(key string, v any) {
				name, _ := excelize.ColumnNumberToName(col)
				if col > 24 {
					t.Fatalf("%s: its arguments take more than 24 columns", d.Name)
				}
				col++
				cells[key] = "$" + name + "$" + strconv.Itoa(row)
				if err := f.SetCellValue(sh, name+strconv.Itoa(row), v); err != nil {
					t.Fatal(err)
				}
			}
			for k, v := range args {
				key := strconv.Itoa(k)
				switch v := v.(type) {
				case float64, string:
					put(key, v)
				case *funcs.RecordValue:
					for j, fld := range v.Type.Fields {
						if x, ok := v.Fields[j].(float64); ok {
							put(key+"."+fld.Name, x)
						}
					}
				}
			}
			termsErr := false
			arg := func(p funcs.Placeholder) (string, error) {
				if p.Param >= len(args) {
					return p.Default, nil
				}
				key := strconv.Itoa(p.Param)
				switch {
				case p.Term >= 0:
					// As the exporter writes them: numbers from Sheaf's
					// value of the record.
					xs, err := d.Spreadsheet.Terms.Of(args[p.Param])
					if err != nil {
						termsErr = true
						return "0", nil
					}
					return num(xs[p.Term]).operand(), nil
				case p.Field != "":
					return cells[key+"."+p.Field], nil
				case p.Column != "":
					if p.Increasing {
						return increasing(curveCols[p.Column], len(testCurve[0])), nil
					}
					return curveCols[p.Column], nil
				}
				return cells[key], nil
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
				if termsErr {
					// The exporter writes no formula here (only Sheaf's
					// value): Terms must fail only where Call does.
					if callErr == nil {
						t.Errorf("%s: Terms fail where the Go function gives %v", c.what, got)
					}
					continue
				}
				if callErr == nil {
					c.want, c.scale = resultOf(t, d, got, field)
				}
				out = append(out, c)
			}
			row++
		}
	}
	if covered < 24 {
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
