package check

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestWithin: containment is decided on cleaned absolute paths, by path
// element, not by string prefix (common practice: filepath.Rel).
func TestWithin(t *testing.T) {
	cases := []struct {
		dir, p string
		want   bool
	}{
		{"/proj", "/proj", true},
		{"/proj", "/proj/a.sheaf", true},
		{"/proj", "/proj/lib/x/a.sheaf", true},
		{"/proj", "/proj/../proj/a.sheaf", true},
		{"/proj", "/project/a.sheaf", false}, // a string prefix, not a folder below
		{"/proj", "/a.sheaf", false},
		{"/proj", "/proj/../other/a.sheaf", false},
		{"/proj", "/proj/..a.sheaf", true}, // a file name starting with two dots
		{"/", "/anything/at/all", true},
	}
	for _, c := range cases {
		if got := within(c.dir, filepath.Clean(c.p)); got != c.want {
			t.Errorf("within(%q, %q) = %v, want %v", c.dir, c.p, got, c.want)
		}
	}
}

// TestProjectRoot: the nearest folder with .git or sheaf.root wins; a
// folder named sheaf.root does not count; without either the start folder
// is the root.
func TestProjectRoot(t *testing.T) {
	base := t.TempDir()
	mk := func(p string) string {
		p = filepath.Join(base, p)
		if err := os.MkdirAll(p, 0o755); err != nil {
			t.Fatal(err)
		}
		return p
	}
	touch := func(p string) {
		if err := os.WriteFile(filepath.Join(base, p), nil, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	mk("repo/.git")
	mk("repo/calc/deep")
	mk("repo/sub/sheaf.root") // a folder: not a marker
	mk("repo/sub/x")
	mk("repo/inner/y")
	touch("repo/inner/" + RootMarker)
	cases := []struct{ start, want string }{
		{"repo/calc/deep", "repo"},
		{"repo", "repo"},
		{"repo/sub/x", "repo"},
		{"repo/inner/y", "repo/inner"},
	}
	for _, c := range cases {
		if got := projectRoot(filepath.Join(base, c.start)); got != filepath.Join(base, c.want) {
			t.Errorf("projectRoot(%s) = %s, want %s", c.start, got, filepath.Join(base, c.want))
		}
	}
}

// TestUseBudget: templates that use the next one twice, 33 levels deep
// (2^32 cells from 33 files of two lines), are refused at the first use
// line before any cell is made.
func TestUseBudget(t *testing.T) {
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, RootMarker), nil, 0o644); err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 33; i++ {
		text := "x = 1\n"
		if i < 32 {
			next := fmt.Sprintf("t%d.sheaf", i+1)
			text = fmt.Sprintf("use a from %q\nuse b from %q\n", next, next)
		}
		if err := os.WriteFile(filepath.Join(dir, fmt.Sprintf("t%d.sheaf", i)), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	top := filepath.Join(dir, "t0.sheaf")
	src, _ := os.ReadFile(top)
	f, _ := sheet.Parse(top, src)
	p, errs := Sheet(f, Options{MaxCells: 100_000})
	if len(errs) == 0 || errs[0].Summary != "template use too large" || errs[0].Range.Start().Line != 1 {
		t.Fatalf("errors: %v", errs)
	}
	if len(p.Cells) > 100_000 {
		t.Fatalf("%d cells made", len(p.Cells))
	}
}
