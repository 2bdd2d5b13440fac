package units

import (
	"go/ast"
	goparser "go/parser"
	"go/token"
	"path/filepath"
	"strings"
	"testing"
)

// TestOneInit: the catalogue, the quantity indexes and the preferred units
// are built in one ordered step (issue 9). Two init functions would run in
// the order of their file names, so renaming a file could change what Parse
// returns while the tables are built.
func TestOneInit(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	var inits []string
	fset := token.NewFileSet()
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := goparser.ParseFile(fset, name, nil, goparser.SkipObjectResolution)
		if err != nil {
			t.Fatal(err)
		}
		for _, d := range f.Decls {
			if fn, ok := d.(*ast.FuncDecl); ok && fn.Recv == nil && fn.Name.Name == "init" {
				inits = append(inits, fset.Position(fn.Pos()).String())
			}
		}
	}
	if len(inits) != 1 {
		t.Errorf("package units has %d init functions, want 1: %v", len(inits), inits)
	}
	// What the one step builds is in place and consistent: a preferred unit
	// carries the quantity name the catalogue gives it.
	for _, sys := range []System{Metric, US} {
		for d, u := range preferred[sys] {
			if d.IsNone() {
				continue
			}
			if c, ok := catalogueIndex[u.Symbol]; ok && c.Quantity != u.Quantity {
				t.Errorf("preferred %s unit %s has quantity %q, the catalogue %q", sys, u.Symbol, u.Quantity, c.Quantity)
			}
			if u.Quantity == "" {
				t.Errorf("preferred %s unit %s has no quantity name", sys, u.Symbol)
			}
		}
	}
}
