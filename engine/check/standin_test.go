package check

import (
	"fmt"
	"slices"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestStandIns: a failed cell that declares a display unit (or a user
// function that declares a result unit) stands in with that dimension, so
// real mistakes in the cells that use it are reported in the same run; a
// failed cell that declares nothing keeps its users silent. Every cell that
// failed or was typed from a stand-in stays untyped, so nothing of it is
// ever evaluated.
func TestStandIns(t *testing.T) {
	cases := []struct {
		name    string
		src     string
		want    []string // "line: summary" of every problem, in order
		untyped []string // cells left without a type
	}{
		{
			name: "display unit stands in",
			src: "P [kN] = 38 kn\n" +
				"A [mm^2] = 245 mm^2\n" +
				"sigma [MPa] = P / A + 3 m\n" +
				"check c: sigma <= P\n",
			want: []string{
				"1: unknown unit `kn`",
				"3: cannot add stress (MPa) and length (mm)",
				"4: cannot compare stress (MPa) with force (kN)",
			},
			untyped: []string{"P", "sigma", "c"},
		},
		{
			name: "no display unit: users stay silent",
			src: "P = 38 kn\n" +
				"A [mm^2] = 245 mm^2\n" +
				"sigma [MPa] = P / A + 3 m\n" +
				"check c: sigma <= P\n",
			want:    []string{"1: unknown unit `kn`"},
			untyped: []string{"P", "sigma", "c"},
		},
		{
			name: "a display unit that does not fit still stands in",
			src: "P [kN] = 38 m\n" +
				"A [mm^2] = 245 mm^2\n" +
				"sigma [MPa] = P / A\n" +
				"tau [MPa] = P\n",
			want: []string{
				"1: display unit kN is a force but the expression is length (mm)",
				"4: display unit MPa is a stress but the expression is force (kN)",
			},
			untyped: []string{"P", "sigma", "tau"},
		},
		{
			name: "a clean cell fed by a stand-in passes its type on, untyped",
			src: "P [kN] = 38 kn\n" +
				"A [mm^2] = 245 mm^2\n" +
				"s = P / A\n" +
				"check c: s <= P\n",
			want: []string{
				"1: unknown unit `kn`",
				"4: cannot compare stress (MPa) with force (kN)",
			},
			untyped: []string{"P", "s", "c"},
		},
		{
			name: "a silent cell that declares a display unit stands in for its users",
			src: "Q = 12 kn\n" +
				"R [kN] = Q * 2 + 1 m\n" +
				"A [mm^2] = 245 mm^2\n" +
				"t [MPa] = R / A + 1 m\n",
			want: []string{
				"1: unknown unit `kn`",
				"4: cannot add stress (MPa) and length (mm)",
			},
			untyped: []string{"Q", "R", "t"},
		},
		{
			name: "a formula that does not parse, with a display unit",
			src: "P [kN] = 38 kN +\n" +
				"A [mm^2] = 245 mm^2\n" +
				"sigma [MPa] = P + A\n",
			want: []string{
				"1: the formula ends after `+`",
				"3: cannot add force (kN) and area (mm^2)",
			},
			untyped: []string{"P", "sigma"},
		},
		{
			name: "a user function with a result unit stands in",
			src: "f(a [m]) [kN] = a * 2 kn/m\n" +
				"y [MPa] = f(2 m)\n" +
				"z = f(2 s)\n" +
				"ok [kN] = f(3 m)\n",
			want: []string{
				"1: unknown unit `kn`",
				"2: display unit MPa is a stress but the expression is force (kN)",
				"3: argument a of f must be length (mm), got time (s)",
			},
			untyped: []string{"f", "y", "z", "ok"},
		},
		{
			name: "a user function without a result unit keeps its calls silent",
			src: "g(a [m]) = a * 2 kn/m\n" +
				"y [MPa] = g(2 m) + 1 m\n",
			want:    []string{"1: unknown unit `kn`"},
			untyped: []string{"g", "y"},
		},
		{
			name: "a parameter of unknown unit: no stand-in",
			src: "f(a [mmm]) [kN] = a * 2 kN/m\n" +
				"y [kN] = f(2 s)\n",
			want:    []string{"1: unknown unit `mmm`"},
			untyped: []string{"f", "y"},
		},
		{
			name: "the cells of a cycle stand in for nothing",
			src: "a [m] = b + 1 m\n" +
				"b [m] = a\n" +
				"c [kN] = a + 1 kN\n",
			want:    []string{"1: cycle: `a` uses `b` uses `a`"},
			untyped: []string{"a", "b", "c"},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			f, errs := sheet.Parse("t.sheaf", []byte(c.src))
			if f == nil {
				t.Fatalf("parse: %v", errs)
			}
			p, cerrs := Sheet(f, Options{})
			errs = append(errs, cerrs...)
			errs.Sort()
			var got []string
			for _, d := range errs {
				got = append(got, fmt.Sprintf("%d: %s", d.Range.Start().Line, d.Summary))
			}
			if !slices.Equal(got, c.want) {
				t.Errorf("problems:\n  %s\nwant:\n  %s", strings.Join(got, "\n  "), strings.Join(c.want, "\n  "))
			}
			var untyped []string
			for _, cell := range p.Cells {
				if cell.Type == nil {
					untyped = append(untyped, cell.Name)
				}
			}
			if !slices.Equal(untyped, c.untyped) {
				t.Errorf("untyped cells %q, want %q", untyped, c.untyped)
			}
		})
	}
}
