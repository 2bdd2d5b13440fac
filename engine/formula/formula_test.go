package formula

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

func expr(text string) sheet.Expr {
	return sheet.Expr{Text: text, Range: diag.Range{Start: diag.Pos{File: "f", Line: 3, Col: 15, Offset: 40}}}
}

func TestQuantities(t *testing.T) {
	cases := []struct {
		text  string
		quant []string  // texts of the quantity literals
		si    []float64 // Source: SI prefixes and units, BIPM SI Brochure (9th ed.)
		refs  []string
	}{
		{"38 kN", []string{"38 kN"}, []float64{38000}, nil},
		{"38kN / A", []string{"38kN"}, []float64{38000}, []string{"A"}},
		{"4.5 kN/m * L", []string{"4.5 kN/m"}, []float64{4500}, []string{"L"}},
		{"12e-6 1/K * dT", []string{"12e-6 1/K"}, []float64{12e-6}, []string{"dT"}},
		{"7850 kg/m^3", []string{"7850 kg/m^3"}, []float64{7850}, nil},
		{"[1 m, 2 m]", []string{"1 m", "2 m"}, []float64{1, 2}, nil},
		{"{E: 210 GPa}", []string{"210 GPa"}, []float64{210e9}, nil},
		{"a > 2 and b < 3", nil, nil, []string{"a", "b"}},
		{"f(x2, 3)", nil, nil, []string{"f", "x2"}},
		{"(5 %)", []string{"5 %"}, []float64{0.05}, nil},
	}
	for _, c := range cases {
		f, errs := Parse(expr(c.text), Options{})
		if errs.HasErrors() {
			t.Errorf("%q: %v", c.text, errs)
			continue
		}
		if len(f.Quantities) != len(c.quant) {
			t.Errorf("%q: quantities %+v", c.text, f.Quantities)
			continue
		}
		for i, q := range f.Quantities {
			if q.Text != c.quant[i] || q.SI != c.si[i] {
				t.Errorf("%q: quantity %d = %q %g", c.text, i, q.Text, q.SI)
			}
			if !strings.HasPrefix(q.Ident, SyntheticPrefix) {
				t.Errorf("ident %q", q.Ident)
			}
		}
		var refs []string
		for _, r := range f.Refs {
			refs = append(refs, r.Name)
		}
		if strings.Join(refs, ",") != strings.Join(c.refs, ",") {
			t.Errorf("%q: refs %v, want %v", c.text, refs, c.refs)
		}
	}
}

// TestPositions: error positions map back through the rewriting to the
// sheet (line 3, the formula starting in column 15).
func TestPositions(t *testing.T) {
	cases := []struct {
		text string
		col  int
	}{
		{"38 kn", 18},      // unit text
		{"2 m + ) ", 21},   // stray bracket after a literal that was rewritten
		{"a % b", 15},      // modulo: the whole binary expression
		{"x | f()", 17},    // pipe
		{"µ = 2 m ) ", 17}, // `=` after a non-ASCII name: columns count runes
	}
	for _, c := range cases {
		_, errs := Parse(expr(c.text), Options{})
		if len(errs) == 0 {
			t.Errorf("%q: no error", c.text)
			continue
		}
		if p := errs[0].Range.Start; p.Line != 3 || p.Col != c.col {
			t.Errorf("%q: at %v (%s), want col %d", c.text, p, errs[0].Summary, c.col)
		}
	}
}

func TestDepthLimit(t *testing.T) {
	deep := strings.Repeat("(", 100) + "1" + strings.Repeat(")", 100)
	if _, errs := Parse(expr(deep), Options{MaxDepth: 64}); !errs.HasErrors() {
		t.Error("nesting of 100 accepted")
	}
	long := strings.Repeat("1 + ", 200) + "1"
	if _, errs := Parse(expr(long), Options{MaxDepth: 64}); !errs.HasErrors() {
		t.Error("operator chain of 200 accepted")
	}
}

// FuzzFormula: Parse never panics, and every diagnostic points inside the
// formula's lines.
func FuzzFormula(f *testing.F) {
	for _, s := range []string{"38 kN / A", "sqrt(A_s) * 2 ^ 0.5", "[1 m, 2 m][0]", "{E: 210 GPa}.E",
		"a ? 1 m : 2 m", "interp(t.x, t.y, 3 m)", "map(xs, # * 2)", "x | f()", "1..3", "\"s\" + 1", "12e-6 1/K * (20 degC)", "µε"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		e := expr(text)
		fm, errs := Parse(e, Options{})
		for _, d := range errs {
			if d.Range.Start.Line < 3 || d.Range.Start.Line > 3+strings.Count(text, "\n") {
				t.Fatalf("%q: diagnostic outside the formula: %v", text, d)
			}
		}
		if !errs.HasErrors() && fm == nil {
			t.Fatalf("%q: no formula and no error", text)
		}
	})
}
