package main

import (
	"bytes"
	"io"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diff"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/engine/export/report"
	"github.com/sheafcalc/sheaf/engine/export/text"
	xlsxout "github.com/sheafcalc/sheaf/engine/export/xlsx"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// FuzzPipeline runs a sheet through everything a user can ask of it:
// canonical layout, compile, evaluation, the text and JSON listings, a
// diff with itself, the workbook and the report, with every function
// family linked in. No input may panic or take longer than the budget;
// the formatted sheet must compile as the original does and give the same
// listing; a diff of a run with itself must be empty. Seeds: the bundled
// sheets and testdata/fuzz/FuzzPipeline.
func FuzzPipeline(f *testing.F) {
	files, _ := filepath.Glob("../../sheets/*.sheaf")
	for _, p := range files {
		if src, err := os.ReadFile(p); err == nil {
			f.Add(src)
		}
	}
	for _, s := range []string{
		"title: t\nP [kN] = 38 kN\nd [in] = 0.75 in\nA [mm^2] = pi * d^2 / 4\nsigma [MPa] = P / A\ncheck y: sigma <= 240 MPa\n",
		"r = 0.45\ncheck spacing: 0.2 <= r <= 0.9  -- ratio\n",
		"b [mm] = 400 mm\ntable t\n    L [m]  A [mm^2]\n    3      (b^2)\n    2      (b^2 / 2)\nx [m] = sum(t.L)\n",
		"rod = bar_uniform(2 m, 300 mm^2, 210 GPa)\nres = solve_bar(rod, \"fixed\", \"free\")\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		if len(src) > 16<<10 {
			return
		}
		// The budget is enforced from outside the pipeline, so that an
		// input that never ends fails (and is kept) instead of stalling.
		done := make(chan struct{})
		go func() {
			defer close(done)
			pipeline(t, src)
		}()
		select {
		case <-done:
		case <-time.After(30 * time.Second):
			t.Fatalf("one input took more than 30 s:\n%q", src)
		}
	})
}

// pipeline runs src through every writer; it reports with t.Errorf, as
// it runs on a goroutine of its own.
func pipeline(t *testing.T, src []byte) {
	opts := []engine.Option{engine.WithMaxCells(500)}
	s, err := engine.Compile("f.sheaf", src, opts...)
	pf, _ := sheet.Parse("f.sheaf", src)
	if pf != nil && len(pf.Syntax) == 0 {
		out, ferr := sheet.Format(pf)
		if ferr == nil {
			s2, err2 := engine.Compile("f.sheaf", out, opts...)
			if (err == nil) != (err2 == nil) {
				t.Errorf("the formatted sheet compiles %v, the original %v\n%s", err2, err, out)
				return
			}
			if err == nil {
				var a, b bytes.Buffer
				_ = text.Write(&a, s.Run(nil), engine.DefaultSigFigs)
				_ = text.Write(&b, s2.Run(nil), engine.DefaultSigFigs)
				if !bytes.Equal(a.Bytes(), b.Bytes()) {
					t.Errorf("the formatted sheet lists differently:\n%s\n---\n%s", a.String(), b.String())
					return
				}
			}
		}
	}
	if err != nil {
		return
	}
	r := s.Run(nil)
	_ = text.Write(io.Discard, r, engine.DefaultSigFigs)
	_ = jsonout.Write(io.Discard, r)
	if d := diff.Compare("a", r, "b", s.Run(nil), diff.Options{}); !d.Empty() {
		t.Errorf("a run differs from itself: %+v", d)
		return
	}
	// The workbook and the report cost tens of milliseconds a sheet
	// (far more under the fuzzer's instrumentation): the small inputs,
	// which the mutations of the short seeds stay, get them.
	if len(src) <= 2048 {
		if f, _, err := xlsxout.Build(s, r, xlsxout.Options{}); err == nil {
			_ = f.Close()
		}
		_ = report.Render(s, r, report.Options{})
	}
}
