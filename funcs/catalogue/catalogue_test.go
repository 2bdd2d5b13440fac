package catalogue

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

// TestThreadStressArea: A_s = π/4·(d − 0.9382P)² against the ISO 898-1
// table for M6–M36 within its rounding.
// Source: ISO 898-1:2013 Table 4 and REFERENCES.md D3 (from memory).
func TestThreadStressArea(t *testing.T) {
	c := Shipped()
	n := 0
	for _, k := range []string{"M6", "M8", "M10", "M12", "M14", "M16", "M18", "M20", "M22", "M24", "M27", "M30", "M33", "M36"} {
		rows, err := c.Find("thread", k)
		if err != nil {
			t.Fatal(err)
		}
		e := rows[0]
		got := StressArea(e.Vals["d"], e.Vals["P"]) * 1e6
		want := e.Vals["A_s_tab"] * 1e6
		if math.Abs(got-want) > halfUnit(e.Text["A_s_tab"]) {
			t.Errorf("%s: A_s = %.4g mm², table %s", k, got, e.Text["A_s_tab"])
		}
		n++
	}
	// ISO 261 coarse pitches. Source: REFERENCES.md D3 (from memory).
	for k, p := range map[string]float64{"M6": 1.0, "M8": 1.25, "M10": 1.5, "M12": 1.75, "M16": 2.0, "M20": 2.5, "M24": 3.0, "M30": 3.5, "M36": 4.0} {
		rows, _ := c.Find("thread", k)
		if got := rows[0].Vals["P"] * 1e3; got != p {
			t.Errorf("%s: P = %g mm, ISO 261 gives %g mm", k, got, p)
		}
	}
}

// TestConcreteFormulas: the EN 1992-1-1 Table 3.1 formulas against values
// computed from them to 9 figures (REFERENCES.md B4) and against the rounded
// rows of the table within their rounding.
// Source: EN 1992-1-1:2004 Table 3.1 (the row values from memory).
func TestConcreteFormulas(t *testing.T) {
	for _, c := range []struct {
		fck, ecm float64 // MPa, GPa
	}{{20, 29.9619511}, {40, 35.2204623}} {
		p, err := Concrete(c.fck * 1e6)
		if err != nil || functest.RelErr(p.Ecm/1e9, c.ecm) > 1e-8 {
			t.Errorf("f_ck %g: E_cm = %.9g GPa (%v), want %.9g", c.fck, p.Ecm/1e9, err, c.ecm)
		}
	}
	rows := []struct {
		class                                      string
		fctm, ecm, epsC1, epsCu1, epsC2, epsCu2, n float64 // MPa, GPa, ‰, ‰, ‰, ‰, 1
		tol                                        [7]float64
	}{
		{"C20/25", 2.2, 30, 2.0, 3.5, 2.0, 3.5, 2.0, [7]float64{0.05, 0.5, 0.05, 0, 0, 0, 0}},
		{"C30/37", 2.9, 33, 2.2, 3.5, 2.0, 3.5, 2.0, [7]float64{0.05, 0.5, 0.05, 0, 0, 0, 0}},
		{"C50/60", 4.1, 37, 2.45, 3.5, 2.0, 3.5, 2.0, [7]float64{0.05, 0.5, 0.05, 0, 0, 0, 0}},
		{"C60/75", 4.4, 39, 2.6, 3.0, 2.3, 2.9, 1.6, [7]float64{0.05, 0.5, 0.05, 0.05, 0.05, 0.05, 0.05}},
		{"C70/85", 4.6, 41, 2.7, 2.8, 2.4, 2.7, 1.45, [7]float64{0.05, 0.5, 0.05, 0.05, 0.05, 0.05, 0.025}}, // the row prints n to 0.05,
		{"C90/105", 5.0, 44, 2.8, 2.8, 2.6, 2.6, 1.4, [7]float64{0.05, 0.5, 0.05, 0.05, 0.05, 0.05, 0.05}},
	}
	c := Shipped()
	for _, r := range rows {
		e, err := c.Find("concrete", r.class)
		if err != nil {
			t.Fatal(err)
		}
		p, _ := Concrete(e[0].Vals["f_ck"])
		got := [7]float64{p.Fctm / 1e6, p.Ecm / 1e9, p.EpsC1 * 1e3, p.EpsCu1 * 1e3, p.EpsC2 * 1e3, p.EpsCu2 * 1e3, p.N}
		want := [7]float64{r.fctm, r.ecm, r.epsC1, r.epsCu1, r.epsC2, r.epsCu2, r.n}
		names := [7]string{"f_ctm", "E_cm", "eps_c1", "eps_cu1", "eps_c2", "eps_cu2", "n"}
		for i := range got {
			if math.Abs(got[i]-want[i]) > r.tol[i]+1e-12 {
				t.Errorf("%s %s = %.4g, table %g", r.class, names[i], got[i], want[i])
			}
		}
	}
	if _, err := Concrete(95e6); err == nil {
		t.Error("f_ck 95 MPa is outside Table 3.1 and must be refused")
	}
}

func TestLookups(t *testing.T) {
	cases := []struct {
		name string
		fn   string
		args []funcs.Value
		get  string
		want float64
		err  string
	}{
		// Source: EN 1993-1-1 Table 3.1 / REFERENCES.md D5 (from memory).
		{"S355 at 20 mm", "steel", []funcs.Value{"S355", 0.020}, "f_y", 355e6, ""},
		{"S355 at 40 mm is the first band", "steel", []funcs.Value{"S355", 0.040}, "f_y", 355e6, ""},
		{"S355 at 45 mm", "steel", []funcs.Value{"s 355", 0.045}, "f_y", 335e6, ""},
		{"S355 at 100 mm", "steel", []funcs.Value{"S355", 0.100}, "", 0, "tabulated up to t = 80 mm"},
		// Source: ASTM A992 (from memory); 29000 ksi, AISC 360 (REFERENCES B3).
		{"A992 E", "steel", []funcs.Value{"A992", 0.02}, "E", 29000 * 6.894757293168361e6, ""},
		{"A500 Gr C rect", "steel", []funcs.Value{"A500 Gr C rect", 0.01}, "f_y", 50 * 6.894757293168361e6, ""},
		// Source: EN 1992-1-1 Table 3.1: f_cm = f_ck + 8 MPa.
		{"C30/37 f_cm", "concrete", []funcs.Value{"C30/37"}, "f_cm", 38e6, ""},
		{"B500B", "rebar", []funcs.Value{"B500B"}, "eps_uk", 0.05, ""},
		{"8.8", "bolt_class", []funcs.Value{"8.8"}, "f_ub", 800e6, ""},
		// Source: EN 1999-1-1 Table 3.2b (from memory).
		{"6082 T6 at 10 mm", "aluminium", []funcs.Value{"EN AW-6082 T6", 0.010}, "f_o", 260e6, ""},
		{"M13 does not exist", "thread", []funcs.Value{"M13"}, "", 0, `the nearest sizes are "M12" and "M14"`},
		{"HEB 265", "section", []funcs.Value{"HEB 265"}, "", 0, `"HEB 260" and "HEB 280"`},
		{"CHS wall between two", "section", []funcs.Value{"CHS 219.1x11"}, "", 0, `"CHS 219.1x10" and "CHS 219.1x12.5"`},
		{"HE 260 B misspelt", "section", []funcs.Value{"HEBB 260"}, "", 0, "not in the catalogue"},
		{"CHS with ×", "section", []funcs.Value{"chs 219.1×10"}, "A", math.Pi / 4 * (0.2191*0.2191 - 0.1991*0.1991), ""},
		{"thread by diameter", "thread_coarse", []funcs.Value{0.020}, "A_s", math.Pi / 4 * math.Pow(0.020-0.9382*0.0025, 2), ""},
		{"no coarse thread of 13 mm", "thread_coarse", []funcs.Value{0.013}, "", 0, `the nearest sizes are "M12" and "M14"`},
		{"C35 written short", "concrete", []funcs.Value{"C35"}, "", 0, `did you mean "C35/45"?`},
	}
	for _, c := range cases {
		v, err := functest.TryCall(t, c.fn, c.args...)
		if c.err != "" {
			if err == nil || !strings.Contains(err.Error(), c.err) {
				t.Errorf("%s: error %v, want one containing %q", c.name, err, c.err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		got := v.(*funcs.RecordValue).Num(c.get, math.NaN())
		if c.fn == "section" {
			got = v.(*funcs.RecordValue).Num(c.get, math.NaN())
		}
		if functest.RelErr(got, c.want) > 1e-12 {
			t.Errorf("%s: %s = %.12g, want %.12g", c.name, c.get, got, c.want)
		}
	}
}

// TestHSSDesignWall: the design wall of ASTM A500 HSS is 0.93 t_nom.
// Source: AISC 360-16 §B4.2 (from memory).
func TestHSSDesignWall(t *testing.T) {
	s, err := functest.TryCall(t, "section", "HSS6x6x1/4")
	if err != nil {
		t.Fatal(err)
	}
	v, err := functest.TryCall(t, "section_dim", s, "t")
	if err != nil || functest.RelErr(v.(float64), 0.93*0.25*0.0254) > 1e-14 {
		t.Errorf("t = %v (%v), want 0.93·0.25 in", v, err)
	}
}

func TestFirmCatalogue(t *testing.T) {
	dir := t.TempDir()
	write := func(name, src string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("ours.cat", "table thread Fine threads of our rod supplier\nsource supplier sheet RS-12, rev. 3\nmemory no\ncolumns key | d [mm] | P [mm]\nM16x1.5 | 16 | 1.5\n")
	c, err := WithDirs([]string{dir})
	if err != nil {
		t.Fatal(err)
	}
	rows, err := c.Find("thread", "M16x1.5")
	if err != nil || functest.RelErr(StressArea(rows[0].Vals["d"], rows[0].Vals["P"]), math.Pi/4*math.Pow(0.016-0.9382*0.0015, 2)) > 1e-14 {
		t.Errorf("firm thread: %v", err)
	}
	write("zz.cat", "table thread Shadow\nsource ours\nmemory no\ncolumns key | d [mm] | P [mm]\nM16 | 16 | 1.5\n")
	_, err = WithDirs([]string{dir})
	if err == nil || !strings.Contains(err.Error(), "zz.cat:5:1") || !strings.Contains(err.Error(), "already in the catalogue") {
		t.Errorf("a firm row that replaces a shipped key must be refused at its line, got %v", err)
	}
	if _, err := WithDirs([]string{filepath.Join(dir, "missing")}); err == nil {
		t.Error("a missing folder must be an error")
	}
}

// TestParseErrors: every problem of a file at its line and column, with
// what was expected.
func TestParseErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"kind", "table beam X\n", `f.cat:1:7: unknown table kind "beam"`},
		{"row first", "M16 | 16 | 2\n", `f.cat:1:1: "M16 | 16 | 2" outside a table`},
		{"no source", "table thread T\nmemory no\ncolumns key | d [mm] | P [mm]\nM16 | 16 | 2\n", "f.cat:4:1: a row before the table's source"},
		{"unit dimension", "table thread T\nsource s\nmemory no\ncolumns key | d [MPa] | P [mm]\n", "f.cat:4:1: column d is a length; [MPa] is not"},
		{"missing column", "table thread T\nsource s\nmemory no\ncolumns key | d [mm]\n", "the column P is missing"},
		{"bad number", "table thread T\nsource s\nmemory no\ncolumns key | d [mm] | P [mm]\nM16 | 16 | two\n", `f.cat:5:12: P: expected a number, found "two"`},
		{"count", "table thread T\nsource s\nmemory no\ncolumns key | d [mm] | P [mm]\nM16 | 16\n", "the row has 1 numbers; the columns line names 2"},
		{"memory word", "table thread T\nsource s\nmemory maybe\n", "f.cat:3:8: expected yes or no"},
		{"bands", "table steel T\nsource s\nmemory no\ncolumns key | t_max [mm] | f_y [MPa] | f_u [MPa] | E [GPa] | nu | alpha [1/K] | rho [kg/m^3]\nX | 80 | 1 | 2 | 1 | 0.3 | 1e-5 | 1\nX | 40 | 1 | 2 | 1 | 0.3 | 1e-5 | 1\n", "band t_max = 40 mm does not follow 80 mm"},
		{"shape", "table chs T\nsource s\nmemory no\ncolumns key | d [mm] | t [mm]\nCHS 10x6 | 10 | 6\n", "more than half the diameter"},
		{"dash in required", "table chs T\nsource s\nmemory no\ncolumns key | d [mm] | t [mm]\nCHS 10x6 | 10 | -\n", "a value is required here"},
	}
	for _, c := range cases {
		_, err := Parse("f.cat", []byte(c.src))
		var l ErrorList
		if !errors.As(err, &l) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q", c.name, err, c.want)
		}
	}
	// Every problem is reported, one per line, in line order.
	_, err := Parse("f.cat", []byte("table beam X\nsource s\ntable thread T\nmemory perhaps\n"))
	if l, ok := err.(ErrorList); !ok || len(l) != 4 || l[0].Line != 1 || l[3].Line != 4 {
		t.Errorf("want two problems in line order, got %v", err)
	}
}

// FuzzParse: no input makes the parser panic or accept a table without its
// source and columns.
func FuzzParse(f *testing.F) {
	for _, n := range []string{"iso-threads-bolts.cat", "steel-grades.cat"} {
		src, err := shipped.ReadFile("data/" + n)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(src)
	}
	f.Add([]byte("table chs T\nsource s\nmemory no\ncolumns key | d [mm] | t [mm]\nCHS 10x1 | 10 | 1\n"))
	f.Fuzz(func(t *testing.T, src []byte) {
		tables, err := Parse("f.cat", src)
		if err != nil {
			return
		}
		for _, tb := range tables {
			if tb.Source == "" || tb.Cols == nil || len(tb.Rows) == 0 {
				t.Fatalf("accepted table %q without source, columns or rows", tb.Title)
			}
			for _, e := range tb.Rows {
				for k, v := range e.Vals {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("%s: %s = %g", e.Key, k, v)
					}
				}
			}
		}
	})
}
