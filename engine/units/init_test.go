package units

import (
	"go/ast"
	goparser "go/parser"
	"go/token"
	"path/filepath"
	"strings"
	"testing"
)

// TestOneOrderedBuild: the catalogue, the quantity indexes and the
// preferred units are built in one ordered step (build, through
// sync.OnceValue), not by init functions (issue 9): two init functions run
// in the order of their file names, so renaming a file could change what
// Parse returns while the tables are built, and a package-level variable
// that calls Parse runs before any init function.
func TestOneOrderedBuild(t *testing.T) {
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
	if len(inits) != 0 {
		t.Errorf("package units has init functions %v; build the tables in build()", inits)
	}
	// What the one step builds is in place and consistent: a preferred unit
	// carries the quantity name the catalogue gives it.
	tb := tab()
	for _, sys := range []System{Metric, US} {
		for d, u := range tb.preferred[sys] {
			if d.IsNone() {
				continue
			}
			if c, ok := tb.catalogueIndex[u.Symbol]; ok && c.Quantity != u.Quantity {
				t.Errorf("preferred %s unit %s has quantity %q, the catalogue %q", sys, u.Symbol, u.Quantity, c.Quantity)
			}
			if u.Quantity == "" {
				t.Errorf("preferred %s unit %s has no quantity name", sys, u.Symbol)
			}
		}
	}
}

// earlyParse is parsed while the package's variables are initialised, before
// any init function could have run: it must see the whole catalogue.
var earlyParse, earlyErr = Parse("kN")
var _, earlyTypo = Parse("kn")

func TestParseDuringVariableInit(t *testing.T) {
	if earlyErr != nil || earlyParse.Quantity != "force" || earlyParse.Factor != 1000 {
		t.Errorf("Parse(\"kN\") during variable initialisation = %+v, %v; want the catalogue's force", earlyParse, earlyErr)
	}
	if earlyTypo == nil || earlyTypo.Error() != "unknown unit `kn`; did you mean `kN`?" {
		t.Errorf("Parse(\"kn\") during variable initialisation: %v", earlyTypo)
	}
}
