package engine_test

import (
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// FuzzUse checks sheets that use templates from a small project (a
// template, a template that uses it twice, a pair of files that loop): no
// input may panic, every problem must have a position in a file of the
// project with a snippet to show, and a sheet that loads must evaluate.
// Seeds are here and under testdata/fuzz/FuzzUse.
func FuzzUse(f *testing.F) {
	dir := f.TempDir()
	files := map[string]string{
		"sheaf.root":       "",
		"lib/bar.sheaf":    "P [kN] = 10 kN\nd [mm] = 20 mm\nA [mm^2] = pi * d^2 / 4\nsigma [MPa] = P / A\ncheck y: sigma <= 355 MPa\n",
		"lib/pair.sheaf":   "P [kN] = 10 kN\nuse a from \"bar.sheaf\"\n    P = P\nuse b from \"bar.sheaf\"\n    P = 2 * P\n",
		"lib/loop-a.sheaf": "use b from \"loop-b.sheaf\"\n",
		"lib/loop-b.sheaf": "use a from \"loop-a.sheaf\"\n",
		"top.sheaf":        "use t from \"top.sheaf\"\n",
	}
	for name, text := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			f.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			f.Fatal(err)
		}
	}
	for _, s := range []string{
		"use r from \"lib/bar.sheaf\"\n    P = 45 kN\nx = r.sigma\n",
		"N = 3 kN\nuse p from \"lib/pair.sheaf\"\n    P = N\ny [MPa] = p.b.sigma - p.a.sigma\n",
		"use l from \"lib/loop-a.sheaf\"\n",
		"use t from \"top.sheaf\"\n",
		"use r from \"../x.sheaf\"\n",
		"use r from \"/x.sheaf\"\n",
		"use r from \"lib\"\nz = r\n",
		"use r from \"lib/bar.sheaf\"\n    sigma = 1 MPa\n    d = 1 kN\n    q = 1\nz = r[0] + r.A.x + r.sigma.P\n",
		"use r from \"lib/bar.sheaf\"\nuse r from \"lib/bar.sheaf\"\nr = 1\n",
	} {
		f.Add(s)
	}
	top := filepath.Join(dir, "main.sheaf")
	f.Fuzz(func(t *testing.T, src string) {
		s, err := engine.Compile(top, []byte(src))
		if err != nil {
			l, ok := err.(diag.List)
			if !ok {
				t.Fatalf("not a diagnostic list: %v", err)
			}
			srcs := engine.ReadSources(l)
			srcs[top] = []byte(src)
			for _, d := range l {
				file := d.Range.Start().File
				if !strings.HasPrefix(file, dir) {
					t.Errorf("problem outside the project: %s", d.Error())
				}
				if _, ok := srcs[file]; !ok {
					t.Errorf("no source for %s", d.Error())
				}
			}
			if err := diag.Render(io.Discard, l, srcs); err != nil {
				t.Fatal(err)
			}
			return
		}
		if len(s.Files()) == 0 || s.Files()[0] != top {
			t.Fatalf("Files() = %q", s.Files())
		}
		s.Run(nil)
	})
}
