package engine_test

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

const module = "github.com/sheafcalc/sheaf/"

// TestImportDirection holds the one direction of dependency that DESIGN.md
// and DEVELOPERS.md describe: the engine never sees a function family, the
// families see only the registry and the unit system, the leaf packages see
// only the standard library, and a later phase never feeds an earlier one.
func TestImportDirection(t *testing.T) {
	imports := moduleImports(t, "..")
	if len(imports) < 10 {
		t.Fatalf("found only %d packages; is the walk rooted at the module?", len(imports))
	}
	// forbidden[pkg] lists prefixes pkg may not import.
	phases := []string{"engine/diag", "engine/units", "engine/sheet", "engine/formula", "engine/check", "engine/eval", "engine/export"}
	for pkg, deps := range imports {
		for _, dep := range deps {
			if !strings.HasPrefix(dep, module) {
				if strings.Contains(dep, ".") && (pkg == "engine/diag" || pkg == "engine/units" || pkg == "engine/combine" || strings.HasPrefix(pkg, "internal/")) {
					t.Errorf("%s imports %s; it must use only the standard library", pkg, dep)
				}
				continue
			}
			dep = strings.TrimPrefix(dep, module)
			switch {
			case strings.HasPrefix(pkg, "engine") && (strings.HasPrefix(dep, "cmd") || strings.HasPrefix(dep, "funcs/")):
				t.Errorf("%s imports %s; the engine sees functions only through the funcs registry", pkg, dep)
			case strings.HasPrefix(pkg, "funcs/") && !(dep == "funcs" || dep == "engine/units" || strings.HasPrefix(dep, "funcs/")):
				t.Errorf("%s imports %s; a family may use only funcs, engine/units and families it builds on", pkg, dep)
			case pkg == "funcs" && dep != "engine/units":
				t.Errorf("funcs imports %s; the registry holds types only", dep)
			case pkg == "engine/diag" || pkg == "engine/combine" || strings.HasPrefix(pkg, "internal/"):
				t.Errorf("%s imports %s; it must use only the standard library", pkg, dep)
			case pkg == "engine/units" && dep != "engine/diag":
				t.Errorf("engine/units imports %s; it may use only engine/diag", dep)
			}
			if later(phases, pkg, dep) {
				t.Errorf("%s imports %s, a later phase", pkg, dep)
			}
		}
	}
}

// later reports whether dep belongs to a later phase than pkg.
func later(phases []string, pkg, dep string) bool {
	at := func(p string) int {
		for i, ph := range phases {
			if p == ph || strings.HasPrefix(p, ph+"/") {
				return i
			}
		}
		return -1
	}
	i, j := at(pkg), at(dep)
	return i >= 0 && j > i
}

// moduleImports maps each package directory under root (relative, slash
// separated) to the imports of its non-test files.
func moduleImports(t *testing.T, root string) map[string][]string {
	t.Helper()
	out := map[string][]string{}
	err := filepath.WalkDir(root, func(path string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			if name := d.Name(); path != root && (name == "testdata" || strings.HasPrefix(name, ".")) {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		f, err := parser.ParseFile(token.NewFileSet(), path, nil, parser.ImportsOnly)
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(root, filepath.Dir(path))
		pkg := filepath.ToSlash(rel)
		for _, spec := range f.Imports {
			p, _ := strconv.Unquote(spec.Path.Value)
			out[pkg] = append(out[pkg], p)
		}
		if _, ok := out[pkg]; !ok {
			out[pkg] = nil
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}
