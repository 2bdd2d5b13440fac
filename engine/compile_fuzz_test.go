package engine_test

import (
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// FuzzCompile runs whole sheets through the sheet parser, the formula
// parser, the checker and the evaluator: no input may panic or hang, every
// problem must have a position inside the sheet with a snippet to show,
// and a sheet that compiles must evaluate. Seeds: the bundled sheets, the
// checker's error cases, and testdata/fuzz/FuzzCompile.
func FuzzCompile(f *testing.F) {
	files, _ := filepath.Glob("../sheets/*.sheaf")
	for _, p := range files {
		if src, err := os.ReadFile(p); err == nil {
			f.Add(src)
		}
	}
	for _, s := range []string{
		"P [kN] = 38 kN\nd [in] = 0.75 in\nA [mm^2] = pi * d^2 / 4\nsigma [MPa] = P / A\ncheck y: sigma <= 240 MPa\n",
		"f(x [m]) [m] = 2 * x\ny [m] = f(3 m) + f(1 ft)\n",
		"table t\n    L [m]  A [mm^2]\n    1  100\n    2  200\nx [mm^2] = interp(t.L, t.A, 1.5 m)\n",
		"r = {E: 210 GPa, xs: [1 m, 2 m]}\nv [m] = r.xs[1] + (r.E > 1 MPa ? 1 m : 2 m)\n",
		"x = 6 // 2\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		s, err := engine.Compile("f.sheaf", src, engine.WithMaxCells(2000))
		if err != nil {
			l, ok := err.(diag.List)
			if !ok {
				t.Fatalf("not a diagnostic list: %v", err)
			}
			for _, d := range l {
				if d.Range.Start().File != "f.sheaf" || d.Range.End().Offset > len(src) || d.Range.Start().Offset > d.Range.End().Offset {
					t.Fatalf("problem outside the sheet: %v %v..%v", d, d.Range.Start(), d.Range.End())
				}
			}
			if err := diag.Render(io.Discard, l, diag.Sources{"f.sheaf": src}); err != nil {
				t.Fatal(err)
			}
			return
		}
		s.NewState().Eval()
	})
}
