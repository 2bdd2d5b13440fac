package check

import (
	"os"
	"path/filepath"
	"testing"
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
