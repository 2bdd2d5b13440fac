package sheet

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/chunks"
	"github.com/sheafcalc/sheaf/internal/golden"
)

// TestErrors runs every case of testdata/errors.chunks: each expected error
// must be reported on its line, and no other error may be.
func TestErrors(t *testing.T) {
	path := filepath.Join("testdata", "errors.chunks")
	cases := chunks.Read(t, path)
	if len(cases) < 40 {
		t.Fatalf("only %d error cases", len(cases))
	}
	for _, c := range cases {
		t.Run(c.Name, func(t *testing.T) {
			if len(c.Wants) == 0 {
				t.Fatalf("%s:%d: case expects no error", path, c.Line)
			}
			f, errs := Parse("case.sheaf", c.Src)
			if f == nil {
				t.Fatal("Parse returned no file")
			}
			got := map[int]*diag.Diagnostic{}
			for _, d := range errs {
				got[d.Range.Start().Line] = d
				checkDiagnostic(t, c.Src, d)
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
			if _, err := Format(f); err == nil {
				t.Errorf("Format accepted a file with syntax errors")
			}
		})
	}
}

// checkDiagnostic asserts what every syntax diagnostic must hold: a valid
// range inside the source, a summary in lower case without a final period,
// a detail and a hint.
func checkDiagnostic(t *testing.T, src []byte, d *diag.Diagnostic) {
	t.Helper()
	r := d.Range
	if !r.Start().IsValid() || r.Start().File == "" {
		t.Errorf("%s: no position", d.Summary)
	}
	if r.End().Offset < r.Start().Offset || r.End().Offset > len(src) {
		t.Errorf("%s: range %d..%d outside the source of %d bytes", d.Error(), r.Start().Offset, r.End().Offset, len(src))
	}
	if d.Summary == "" || strings.HasSuffix(d.Summary, ".") || strings.ToLower(d.Summary[:1]) != d.Summary[:1] {
		t.Errorf("summary %q: want lower case, no final period", d.Summary)
	}
	if d.Detail == "" || d.Hint == "" {
		t.Errorf("%s: want a detail and a hint", d.Error())
	}
}

// TestErrorsRender renders every error case with diag.Render and compares
// the whole text with testdata/errors.render.golden, so the wording, the
// snippets and the carets are reviewed as a user sees them.
func TestErrorsRender(t *testing.T) {
	cases := chunks.Read(t, filepath.Join("testdata", "errors.chunks"))
	var b bytes.Buffer
	for _, c := range cases {
		fmt.Fprintf(&b, "=== %s\n", c.Name)
		_, errs := Parse("case.sheaf", c.Src)
		if err := diag.Render(&b, errs, diag.Sources{"case.sheaf": c.Src}); err != nil {
			t.Fatal(err)
		}
	}
	golden.Check(t, filepath.Join("testdata", "errors.render.golden"), b.Bytes(), *update)
}
