package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/golden"
)

// roundTripInputs returns every sheet in sheets/ and every seed of the
// sheet parser's fuzz corpus, by name.
func roundTripInputs(t *testing.T) map[string][]byte {
	t.Helper()
	in := map[string][]byte{}
	sheets, _ := filepath.Glob(filepath.Join("..", "..", "sheets", "*.sheaf"))
	if len(sheets) == 0 {
		t.Fatal("no sheets in sheets/")
	}
	for _, p := range sheets {
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		in[p] = b
	}
	seeds, _ := filepath.Glob(filepath.Join("..", "..", "engine", "sheet", "testdata", "fuzz", "FuzzParse", "*"))
	if len(seeds) == 0 {
		t.Fatal("no fuzz seeds for the sheet parser")
	}
	for _, p := range seeds {
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		src, ok := corpusBytes(string(b))
		if !ok {
			t.Fatalf("%s: not a fuzz corpus file with one []byte or string value", p)
		}
		in[p] = src
	}
	return in
}

// corpusBytes decodes a "go test fuzz v1" file holding one []byte or string.
func corpusBytes(text string) ([]byte, bool) {
	lines := strings.SplitN(strings.TrimSpace(text), "\n", 2)
	if len(lines) != 2 || lines[0] != "go test fuzz v1" {
		return nil, false
	}
	v := strings.TrimSpace(lines[1])
	for _, pre := range []string{"[]byte(", "string("} {
		if strings.HasPrefix(v, pre) && strings.HasSuffix(v, ")") {
			s, err := strconv.Unquote(v[len(pre) : len(v)-1])
			return []byte(s), err == nil
		}
	}
	return nil, false
}

// TestFmtRoundTrip: for every sheet and seed x without syntax errors,
// fmt(fmt(x)) = fmt(x), and fmt(x) has the same cells, comments and
// results as x.
func TestFmtRoundTrip(t *testing.T) {
	formatted := 0
	for name, src := range roundTripInputs(t) {
		out, err := sheet.FormatSource(name, src)
		if err != nil {
			continue // syntax errors: fmt refuses, tested below
		}
		formatted++
		again, err := sheet.FormatSource(name, out)
		if err != nil || string(again) != string(out) {
			t.Errorf("%s: formatting is not idempotent (%v):\n%s\n---\n%s", name, err, out, again)
			continue
		}
		f1, _ := sheet.Parse(name, src)
		f2, _ := sheet.Parse(name, out)
		if a, b := comments(f1), comments(f2); strings.Join(a, "\n") != strings.Join(b, "\n") {
			t.Errorf("%s: comments changed: %q -> %q", name, a, b)
		}
		s1, err1 := engine.Compile(name, src)
		s2, err2 := engine.Compile(name, out)
		if (err1 == nil) != (err2 == nil) {
			t.Errorf("%s: the sheet checks %v before formatting and %v after", name, err1, err2)
			continue
		}
		if err1 != nil {
			if summaries(err1) != summaries(err2) {
				t.Errorf("%s: other problems after formatting:\n%s\n---\n%s", name, summaries(err1), summaries(err2))
			}
			continue
		}
		sameCells(t, name, s1, s2)
	}
	if formatted < 5 {
		t.Errorf("only %d inputs could be formatted", formatted)
	}
}

func comments(f *sheet.File) []string {
	var out []string
	for _, it := range f.Items {
		if c, ok := it.(*sheet.Comment); ok {
			out = append(out, c.Text)
		}
	}
	return out
}

func summaries(err error) string {
	var b strings.Builder
	for _, line := range strings.Split(err.Error(), "\n") {
		// Drop the position: columns move when the layout changes.
		if i := strings.Index(line, ": "); i >= 0 {
			line = line[i+2:]
		}
		b.WriteString(line + "\n")
	}
	return b.String()
}

func sameCells(t *testing.T, name string, a, b *engine.Sheet) {
	t.Helper()
	ca, cb := a.Cells(), b.Cells()
	if len(ca) != len(cb) {
		t.Errorf("%s: %d cells before formatting, %d after", name, len(ca), len(cb))
		return
	}
	ra, rb := a.Run(nil), b.Run(nil)
	for i := range ca {
		x, y := ca[i], cb[i]
		if x.Name != y.Name || x.Kind != y.Kind || x.Description() != y.Description() || x.Reference() != y.Reference() ||
			x.Unit().Symbol != y.Unit().Symbol || strings.Join(strings.Fields(x.Expr()), " ") != strings.Join(strings.Fields(y.Expr()), " ") {
			t.Errorf("%s: cell %d changed: %+v -> %+v", name, i, *x, *y)
		}
		va, vb := ra.Cells[i], rb.Cells[i]
		if va.Text != vb.Text || va.Known != vb.Known ||
			(math.Float64bits(va.SI) != math.Float64bits(vb.SI) && !(math.IsNaN(va.SI) && math.IsNaN(vb.SI))) {
			t.Errorf("%s: `%s` is %s before formatting, %s after", name, x.Name, va.Text, vb.Text)
		}
	}
}

func TestFmtCommand(t *testing.T) {
	tmp := t.TempDir()
	messy, err := os.ReadFile(filepath.Join("testdata", "fmt", "messy.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(tmp, "guy.sheaf")
	if err := os.WriteFile(path, messy, 0o600); err != nil {
		t.Fatal(err)
	}
	out, errs, code := sheaf(t, "fmt", "--check", path)
	if code != exitChecks || out != path+"\n" {
		t.Errorf("--check: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	if b, _ := os.ReadFile(path); string(b) != string(messy) {
		t.Error("--check wrote the file")
	}
	out, errs, code = sheaf(t, "fmt", path)
	if code != exitOK || out != path+"\n" {
		t.Errorf("fmt: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	got, _ := os.ReadFile(path)
	golden.Check(t, filepath.Join("testdata", "fmt", "messy.golden"), got, *update)
	if fi, _ := os.Stat(path); fi.Mode().Perm() != 0o600 {
		t.Errorf("mode %v, want the original 0600", fi.Mode().Perm())
	}
	if out, _, code := sheaf(t, "fmt", "--check", path); code != exitOK || out != "" {
		t.Errorf("a formatted file: exit %d, stdout %q", code, out)
	}
	entries, _ := os.ReadDir(tmp)
	if len(entries) != 1 {
		t.Errorf("temporary files left behind: %v", entries)
	}

	// A broken sheet is not touched; the others are still formatted.
	broken := filepath.Join(tmp, "broken.sheaf")
	b, _ := os.ReadFile(filepath.Join("testdata", "fmt", "broken.sheaf"))
	if err := os.WriteFile(broken, b, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, messy, 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code = sheaf(t, "fmt", broken, path)
	if code != exitInput {
		t.Errorf("broken: exit %d, want %d", code, exitInput)
	}
	if after, _ := os.ReadFile(broken); string(after) != string(b) {
		t.Error("a broken sheet was rewritten")
	}
	if after, _ := os.ReadFile(path); string(after) != string(got) {
		t.Error("the sound sheet after a broken one was not formatted")
	}
	golden.Check(t, filepath.Join("testdata", "fmt", "broken.golden"), []byte(strings.ReplaceAll(transcript(out, errs, code), tmp, "TMP")), *update)

	// stdin to stdout.
	var so, se strings.Builder
	if code := Main([]string{"fmt", "-"}, strings.NewReader(string(messy)), &so, &se); code != exitOK || so.String() != string(got) {
		t.Errorf("fmt -: exit %d\n%s%s", code, so.String(), se.String())
	}
	if _, errs, code := sheaf(t, "fmt", filepath.Join(tmp, "none.sheaf")); code != exitInput || !strings.Contains(errs, "no such file") {
		t.Errorf("missing file: exit %d, %s", code, errs)
	}
}
