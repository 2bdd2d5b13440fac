package xlsxout

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/catalogue"
	_ "github.com/sheafcalc/sheaf/funcs/composite"
	_ "github.com/sheafcalc/sheaf/funcs/connection"
	_ "github.com/sheafcalc/sheaf/funcs/plastic"
	_ "github.com/sheafcalc/sheaf/funcs/section"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)

func compile(t testing.TB, name, src string) *engine.Sheet {
	t.Helper()
	s, err := engine.Compile(name, []byte(src), engine.WithMaxBytes(32<<20))
	if err != nil {
		var b strings.Builder
		if l, ok := err.(diag.List); ok {
			_ = diag.Render(&b, l, diag.Sources{name: []byte(src)})
		}
		t.Fatalf("compile: %v\n%s", err, b.String())
	}
	return s
}

func load(t testing.TB, path string) *engine.Sheet {
	t.Helper()
	s, err := engine.Load(path)
	if err != nil {
		t.Fatalf("load %s: %v", path, err)
	}
	return s
}
