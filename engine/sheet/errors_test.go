package sheet

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/golden"
)

// errorCase is one chunk of testdata/errors.chunks.
type errorCase struct {
	name  string
	line  int // line of the "===" separator in the chunk file
	src   []byte
	wants map[int]*regexp.Regexp // sheet line -> expected summary
}

// wantMark ends a source line with the error expected on it. "⟵" cannot be
// mistaken for sheet text in a case because the harness strips it first.
const wantMark = "  ⟵ want "

var hexEscape = regexp.MustCompile(`\\x[0-9a-fA-F]{2}`)

// readErrorCases splits a chunk file: each case starts with a line
// "=== name"; the expected error is written on the offending line as
// `  ⟵ want "regexp"` (the pattern is taken literally between the quotes);
// `\xNN` stands for the byte NN (to write invalid
// UTF-8 and control characters).
func readErrorCases(t *testing.T, path string) []errorCase {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var cases []errorCase
	var cur *errorCase
	var body []string
	flush := func() {
		if cur != nil {
			cur.src = []byte(strings.Join(body, "\n") + "\n")
			cases = append(cases, *cur)
		}
	}
	for n, l := range strings.Split(strings.TrimSuffix(string(data), "\n"), "\n") {
		if name, ok := strings.CutPrefix(l, "=== "); ok {
			flush()
			cur = &errorCase{name: name, line: n + 1, wants: map[int]*regexp.Regexp{}}
			body = nil
			continue
		}
		if cur == nil {
			t.Fatalf("%s:%d: text before the first === line", path, n+1)
		}
		if i := strings.Index(l, wantMark); i >= 0 {
			q := l[i+len(wantMark):]
			if len(q) < 2 || q[0] != '"' || q[len(q)-1] != '"' {
				t.Fatalf("%s:%d: want needs a pattern in double quotes", path, n+1)
			}
			cur.wants[len(body)+1] = regexp.MustCompile(q[1 : len(q)-1])
			l = l[:i]
		}
		l = hexEscape.ReplaceAllStringFunc(l, func(s string) string {
			b, _ := strconv.ParseUint(s[2:], 16, 8)
			return string([]byte{byte(b)})
		})
		body = append(body, l)
	}
	flush()
	return cases
}

// TestErrors runs every case of testdata/errors.chunks: each expected error
// must be reported on its line, and no other error may be.
func TestErrors(t *testing.T) {
	path := filepath.Join("testdata", "errors.chunks")
	cases := readErrorCases(t, path)
	if len(cases) < 40 {
		t.Fatalf("only %d error cases", len(cases))
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if len(c.wants) == 0 {
				t.Fatalf("%s:%d: case expects no error", path, c.line)
			}
			f, errs := Parse("case.sheaf", c.src)
			if f == nil {
				t.Fatal("Parse returned no file")
			}
			got := map[int]*diag.Diagnostic{}
			for _, d := range errs {
				got[d.Range.Start.Line] = d
				checkDiagnostic(t, c.src, d)
			}
			for line, re := range c.wants {
				d, ok := got[line]
				if !ok {
					t.Errorf("%s:%d: line %d: no error, want %q", path, c.line, line, re)
					continue
				}
				if !re.MatchString(d.Summary) {
					t.Errorf("%s:%d: line %d: got %q, want %q", path, c.line, line, d.Summary, re)
				}
				delete(got, line)
			}
			for _, d := range got {
				t.Errorf("%s:%d: unexpected error %s", path, c.line, d.Error())
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
	if !r.Start.IsValid() || r.Start.File == "" {
		t.Errorf("%s: no position", d.Summary)
	}
	if r.End.Offset < r.Start.Offset || r.End.Offset > len(src) {
		t.Errorf("%s: range %d..%d outside the source of %d bytes", d.Error(), r.Start.Offset, r.End.Offset, len(src))
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
	cases := readErrorCases(t, filepath.Join("testdata", "errors.chunks"))
	var b bytes.Buffer
	for _, c := range cases {
		fmt.Fprintf(&b, "=== %s\n", c.name)
		_, errs := Parse("case.sheaf", c.src)
		if err := diag.Render(&b, errs, diag.Sources{"case.sheaf": c.src}); err != nil {
			t.Fatal(err)
		}
	}
	golden.Check(t, filepath.Join("testdata", "errors.render.golden"), b.Bytes(), *update)
}
