package report

import (
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/catalogue"
	_ "github.com/sheafcalc/sheaf/funcs/composite"
	_ "github.com/sheafcalc/sheaf/funcs/connection"
	_ "github.com/sheafcalc/sheaf/funcs/plastic"
	_ "github.com/sheafcalc/sheaf/funcs/section"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)

// testOptions fix the version, so the golden files do not follow the build.
var testOptions = Options{Version: "test build"}

// bundled returns the bundled sheets.
func bundled(t testing.TB) []string {
	t.Helper()
	files, err := filepath.Glob("../../../sheets/*.sheaf")
	if err != nil || len(files) == 0 {
		t.Fatalf("no bundled sheets found: %v", err)
	}
	return files
}

func load(t testing.TB, path string) (*engine.Sheet, *engine.Results) {
	t.Helper()
	s, err := engine.Load(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return s, s.Run(nil)
}

func compile(t testing.TB, name, src string) (*engine.Sheet, *engine.Results) {
	t.Helper()
	s, err := engine.Compile(name, []byte(src))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return s, s.Run(nil)
}
