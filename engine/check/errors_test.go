package check

import (
	"bytes"
	"flag"
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/chunks"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite golden files")

// checkChunk parses and checks one case, returning every problem.
func checkChunk(c chunks.Case) diag.List {
	f, errs := sheet.Parse("case.sheaf", c.Src)
	if f == nil {
		return errs
	}
	_, cerrs := Sheet(f, Options{})
	errs = append(errs, cerrs...)
	errs.Sort()
	return errs
}

// TestErrors runs every case of testdata/errors.chunks: each expected error
// must be reported on its line, and no other error may be (one mistake, one
// message).
func TestErrors(t *testing.T) {
	path := filepath.Join("testdata", "errors.chunks")
	cases := chunks.Read(t, path)
	if len(cases) < 50 {
		t.Fatalf("only %d error cases", len(cases))
	}
	for _, c := range cases {
		t.Run(c.Name, func(t *testing.T) {
			if len(c.Wants) == 0 {
				t.Fatalf("%s:%d: case expects no error", path, c.Line)
			}
			got := map[int]*diag.Diagnostic{}
			for _, d := range checkChunk(c) {
				if d.Severity != diag.Error {
					continue
				}
				if prev, dup := got[d.Range.Start().Line]; dup {
					t.Errorf("%s:%d: two errors on line %d: %q and %q", path, c.Line, d.Range.Start().Line, prev.Summary, d.Summary)
				}
				got[d.Range.Start().Line] = d
				if r := d.Range; r.End().Offset < r.Start().Offset || r.End().Offset > len(c.Src) || r.Start().File != "case.sheaf" {
					t.Errorf("%s: range %v..%v outside the case", d.Summary, r.Start(), r.End())
				}
				if d.Summary == "" || strings.HasSuffix(d.Summary, ".") {
					t.Errorf("summary %q: want text without a final period", d.Summary)
				}
			}
			for line, re := range c.Wants {
				d, ok := got[line]
				if !ok {
					t.Errorf("%s:%d: line %d: no error, want %q", path, c.Line, line, re)
					continue
				}
				if !re.MatchString(d.Summary) {
					t.Errorf("%s:%d: line %d: got %q, want %q", path, c.Line, line, d.Summary, re)
				}
				delete(got, line)
			}
			for _, d := range got {
				t.Errorf("%s:%d: unexpected error %s", path, c.Line, d.Error())
			}
		})
	}
}

// TestErrorsRender renders every case as a user sees it (detail, snippet,
// caret, hint) into testdata/errors.render.golden.
func TestErrorsRender(t *testing.T) {
	var b bytes.Buffer
	for _, c := range chunks.Read(t, filepath.Join("testdata", "errors.chunks")) {
		fmt.Fprintf(&b, "=== %s\n", c.Name)
		if err := diag.Render(&b, checkChunk(c), diag.Sources{"case.sheaf": c.Src}); err != nil {
			t.Fatal(err)
		}
	}
	golden.Check(t, filepath.Join("testdata", "errors.render.golden"), b.Bytes(), *update)
}
