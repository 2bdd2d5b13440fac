package engine_test

import (
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// The template library of these tests lives in testdata/use (a project of
// its own, marked by sheaf.root): lib/bar.sheaf is a prismatic bar,
// lib/stepped.sheaf uses it twice for two segments in series, and
// calcs/plant-hanger.sheaf uses the stepped bar.

const plantHanger = "testdata/use/calcs/plant-hanger.sheaf"

func load(t testing.TB, path string) *engine.Sheet {
	t.Helper()
	s, err := engine.Load(path)
	if err != nil {
		var b strings.Builder
		if l, ok := err.(diag.List); ok {
			_ = diag.Render(&b, l, engine.ReadSources(l))
		}
		t.Fatalf("load %s: %v\n%s", path, err, b.String())
	}
	return s
}

func num(t *testing.T, r *engine.Results, name string) float64 {
	t.Helper()
	c := r.Cell(name)
	if c == nil || !c.Known {
		t.Fatalf("cell %s missing or unknown", name)
	}
	return c.SI
}

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Abs(want)
}

// TestUseReferenceValues checks a template used with overrides against
// closed forms, through one and two levels of use.
func TestUseReferenceValues(t *testing.T) {
	dir := t.TempDir()
	write(t, filepath.Join(dir, "sheaf.root"), "")
	lib, err := os.ReadFile("testdata/use/lib/bar.sheaf")
	if err != nil {
		t.Fatal(err)
	}
	write(t, filepath.Join(dir, "lib", "bar.sheaf"), string(lib))
	// Source: REFERENCES.md C1 (Gere & Goodno, prismatic bar δ = PL/(EA)):
	// P = 250 kN, L = 4.2 m, solid d = 30 mm, E = 210 GPa
	// -> δ = 7.07355303 mm, σ = 353.677651 MPa.
	write(t, filepath.Join(dir, "c1.sheaf"), `use c1 from "lib/bar.sheaf"
    P = 250 kN
    L = 4.2 m
    d = 30 mm
`)
	r := load(t, filepath.Join(dir, "c1.sheaf")).Run(nil)
	if got := num(t, r, "c1.delta"); !near(got, 7.07355303e-3, 1e-8) {
		t.Errorf("c1.delta = %.10g m, want 7.07355303 mm", got)
	}
	if got := num(t, r, "c1.sigma"); !near(got, 353.677651e6, 1e-8) {
		t.Errorf("c1.sigma = %.10g Pa, want 353.677651 MPa", got)
	}
	if r.Failed() != 0 {
		t.Errorf("c1.yield: σ = 353.7 MPa < f_y = 355 MPa must pass; failed %d", r.Failed())
	}

	// Closed form of a stepped bar in series (Gere & Goodno, Mechanics of
	// Materials, bars with intermediate axial loads): δ = Σ P·L_i/(E·A_i).
	r = load(t, plantHanger).Run(nil)
	P, E := 60e3, 200e9
	A1, A2 := math.Pi*0.030*0.030/4, math.Pi*0.020*0.020/4
	want := P*3/(E*A1) + P*1.5/(E*A2)
	if got := num(t, r, "stretch"); !near(got, want, 1e-12) {
		t.Errorf("stretch = %.12g m, want %.12g m", got, want)
	}
	if got := num(t, r, "rod.upper.sigma"); !near(got, P/A1, 1e-12) {
		t.Errorf("rod.upper.sigma = %g, want %g", got, P/A1)
	}
	if got := num(t, r, "s_up"); !near(got, P/A1, 1e-12) {
		t.Errorf("s_up = %g, want %g", got, P/A1)
	}
}

func write(t *testing.T, path, text string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestUseProgram checks what inlining makes of a using sheet: qualified
// names, kinds, checks of the templates among the sheet's checks, files and
// sources, positions in the template files.
func TestUseProgram(t *testing.T) {
	s := load(t, plantHanger)
	wantFiles := []string{plantHanger, "testdata/use/lib/stepped.sheaf", "testdata/use/lib/bar.sheaf"}
	if got := s.Files(); !slices.Equal(got, wantFiles) {
		t.Errorf("Files() = %q, want %q", got, wantFiles)
	}
	src := s.Sources()
	for _, f := range wantFiles {
		disk, _ := os.ReadFile(f)
		if string(src[f]) != string(disk) {
			t.Errorf("Sources()[%s] is not the file's text", f)
		}
	}
	cases := []struct {
		name string
		kind engine.Kind
		file string // where its position lies
	}{
		{"N_Ed", engine.Input, plantHanger},
		{"rod.P", engine.Derived, plantHanger}, // P = N_Ed, written in the using sheet
		{"rod.E", engine.Input, plantHanger},   // E [GPa] = 200 GPa: still an input
		{"rod.upper.P", engine.Derived, "testdata/use/lib/stepped.sheaf"},
		{"rod.upper.d", engine.Input, "testdata/use/lib/stepped.sheaf"},
		{"rod.upper.f_y", engine.Input, "testdata/use/lib/bar.sheaf"},
		{"rod.upper.sigma", engine.Derived, "testdata/use/lib/bar.sheaf"},
		{"rod.lower.yield", engine.Check, "testdata/use/lib/bar.sheaf"},
		{"rod.delta", engine.Derived, "testdata/use/lib/stepped.sheaf"},
		{"drop", engine.Check, plantHanger},
	}
	for _, c := range cases {
		cell := s.Lookup(c.name)
		if cell == nil {
			t.Errorf("%s: no such cell", c.name)
			continue
		}
		if cell.Kind != c.kind {
			t.Errorf("%s: kind %v, want %v", c.name, cell.Kind, c.kind)
		}
		if cell.Pos().File != c.file {
			t.Errorf("%s: at %s, want a position in %s", c.name, cell.Pos(), c.file)
		}
	}
	if d := s.Program().DepNames(s.Lookup("rod.upper.sigma")); !slices.Equal(d, []string{"rod.upper.P", "rod.upper.A"}) {
		t.Errorf("rod.upper.sigma deps %q", d)
	}
	if d := s.Program().DepNames(s.Lookup("s_up")); !slices.Equal(d, []string{"rod.upper.sigma"}) {
		t.Errorf("s_up deps %q", d)
	}
	// An override without an annotation keeps the template's description
	// and drops its reference; one with an annotation has its own.
	if c := s.Lookup("rod.upper.E"); c.Description() != "modulus of elasticity" || c.Reference() != "" {
		t.Errorf("rod.upper.E: %q @ %q", c.Description(), c.Reference())
	}
	if c := s.Lookup("rod.E"); c.Reference() != "supplier data sheet (own assumption)" {
		t.Errorf("rod.E reference %q", c.Reference())
	}
	r := s.Run(nil)
	var checks []string
	for _, c := range r.Checks {
		checks = append(checks, c.Cell.Name)
	}
	if want := []string{"rod.upper.yield", "rod.lower.yield", "drop"}; !slices.Equal(checks, want) {
		t.Errorf("checks %q, want %q", checks, want)
	}
}

// TestUseIncremental changes inputs on both sides of the template
// boundary and checks that exactly the cells downstream are recomputed.
func TestUseIncremental(t *testing.T) {
	s := load(t, plantHanger)
	st := s.NewState()
	st.Eval()
	if err := st.Set("N_Ed", 80e3); err != nil {
		t.Fatal(err)
	}
	r := st.Eval()
	got := st.LastEvaluated()
	slices.Sort(got)
	want := []string{"N_Ed", "drop", "rod.P", "rod.delta",
		"rod.lower.P", "rod.lower.delta", "rod.lower.sigma", "rod.lower.yield",
		"rod.upper.P", "rod.upper.delta", "rod.upper.sigma", "rod.upper.yield",
		"s_up", "stretch"}
	if !slices.Equal(got, want) {
		t.Errorf("recomputed %q\nwant       %q", got, want)
	}
	A1 := math.Pi * 0.030 * 0.030 / 4 // closed form σ = N/A
	if v := num(t, r, "s_up"); !near(v, 80e3/A1, 1e-12) {
		t.Errorf("s_up = %g after the change, want %g", v, 80e3/A1)
	}
	// An input inside a template that no use block replaced can be set by
	// its qualified name; only its own segment follows.
	if err := st.Set("rod.lower.d", 0.024); err != nil {
		t.Fatal(err)
	}
	st.Eval()
	got = st.LastEvaluated()
	slices.Sort(got)
	want = []string{"drop", "rod.delta", "rod.lower.A", "rod.lower.d", "rod.lower.delta", "rod.lower.sigma", "rod.lower.yield", "stretch"}
	if !slices.Equal(got, want) {
		t.Errorf("recomputed %q\nwant       %q", got, want)
	}
	// A template input replaced by a formula of the using sheet is derived.
	if err := st.Set("rod.P", 1.0); err == nil || !strings.Contains(err.Error(), "computed from N_Ed") {
		t.Errorf("setting rod.P: %v", err)
	}
}

// TestUseTemplateCheckFails: a template's check that fails is a failed
// check of the using sheet.
func TestUseTemplateCheckFails(t *testing.T) {
	s := load(t, plantHanger)
	// σ = 150 kN / 314.16 mm² = 477 MPa > 355 MPa in the thin segment
	// (closed form σ = N/A), and the stretch grows past the 3 mm limit.
	r := s.Run(map[string]any{"N_Ed": 150e3})
	if r.Failed() != 2 {
		t.Errorf("failed %d, want 2 (rod.lower.yield and drop)", r.Failed())
	}
	for _, c := range r.Checks {
		wantPass := c.Cell.Name == "rod.upper.yield"
		if c.Pass != wantPass {
			t.Errorf("%s pass = %v", c.Cell.Name, c.Pass)
		}
	}
}

// TestUseErrors builds small projects in a temporary folder and checks the
// first message of each mistake a user can make with templates, position
// and text. Symbolic links are made here rather than kept in testdata.
func TestUseErrors(t *testing.T) {
	const strut = "N [kN] = 10 kN\nA [mm^2] = 100 mm^2\nsigma [MPa] = N / A\n"
	cases := []struct {
		name  string
		files map[string]string // relative to the project; "->target" makes a link
		want  string            // first diagnostic, as rendered on its first line
	}{
		{"symlink escape", map[string]string{
			"sheaf.root":       "",
			"lib/strut.sheaf":  "->../../outside.sheaf",
			"top.sheaf":        "use s from \"lib/strut.sheaf\"\n",
			"../outside.sheaf": strut,
		}, `top.sheaf:1:13: template path "lib/strut.sheaf" leads outside the project root`},
		{"symlink to a folder outside", map[string]string{
			"sheaf.root":               "",
			"lib":                      "->../elsewhere",
			"top.sheaf":                "use s from \"lib/strut.sheaf\"\n",
			"../elsewhere/strut.sheaf": strut,
		}, `top.sheaf:1:13: template path "lib/strut.sheaf" leads outside the project root`},
		{"dotdot past the marker", map[string]string{
			"sheaf.root":     "",
			"calc/top.sheaf": "use s from \"../../strut.sheaf\"\n",
			"../strut.sheaf": strut,
		}, `calc/top.sheaf:1:13: template path "../../strut.sheaf" leaves the project root`},
		{"absolute path", map[string]string{
			"sheaf.root": "",
			"top.sheaf":  "use s from \"/tmp/strut.sheaf\"\n",
		}, `top.sheaf:1:13: template path "/tmp/strut.sheaf" is absolute`},
		{"missing file", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"top.sheaf":       "use s from \"lib/strutt.sheaf\"\n",
		}, `top.sheaf:1:13: template file "lib/strutt.sheaf" not found`},
		{"missing folder", map[string]string{
			"sheaf.root": "",
			"top.sheaf":  "use s from \"libs/strut.sheaf\"\n",
		}, `top.sheaf:1:13: template file "libs/strut.sheaf" not found`},
		{"loop of two", map[string]string{
			"sheaf.root": "",
			"a.sheaf":    "x = 1\nuse b from \"b.sheaf\"\n",
			"b.sheaf":    "use a from \"a.sheaf\"\n",
		}, `a.sheaf:2:13: templates use one another in a loop: a.sheaf uses b.sheaf uses a.sheaf`},
		{"loop of three below the sheet", map[string]string{
			"sheaf.root":      "",
			"top.sheaf":       "use p from \"lib/p.sheaf\"\n",
			"lib/p.sheaf":     "use q from \"q.sheaf\"\n",
			"lib/q.sheaf":     "use r from \"sub/r.sheaf\"\n",
			"lib/sub/r.sheaf": "use p from \"../p.sheaf\"\n",
		}, `lib/p.sheaf:1:13: templates use one another in a loop: lib/p.sheaf uses lib/q.sheaf uses lib/sub/r.sheaf uses lib/p.sheaf`},
		{"uses itself", map[string]string{
			"top.sheaf": "use me from \"top.sheaf\"\n",
		}, `top.sheaf:1:14: top.sheaf uses itself as a template`},
		{"unknown override", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"top.sheaf":       "use s from \"lib/strut.sheaf\"\n    NN = 3 kN\n",
		}, "top.sheaf:2:5: template `s` has no cell `NN`"},
		{"derived override", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"top.sheaf":       "use s from \"lib/strut.sheaf\"\n    sigma = 3 MPa\n",
		}, "top.sheaf:2:5: `sigma` of template `s` is derived, not an input"},
		{"override of another dimension", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"top.sheaf":       "L [m] = 2 m\nuse s from \"lib/strut.sheaf\"\n    N = L\n",
		}, "top.sheaf:3:9: `N` of template `s` is a force (kN), but this value is a length (mm)"},
		{"nested template unknown member", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"lib/pair.sheaf":  "use one from \"strut.sheaf\"\n",
			"top.sheaf":       "use p from \"lib/pair.sheaf\"\nx = p.one.sigmaa\n",
		}, "top.sheaf:2:11: template `p.one` has no cell `sigmaa`"},
		{"nested template as a value", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"lib/pair.sheaf":  "use one from \"strut.sheaf\"\n",
			"top.sheaf":       "use p from \"lib/pair.sheaf\"\nx = p.one + 1\n",
		}, "top.sheaf:2:5: `p.one` is a template use, not a value"},
		{"undefined name inside a template", map[string]string{
			"sheaf.root":    "",
			"lib/bad.sheaf": "N [kN] = 10 kN\nM = Nn * 2\n",
			"top.sheaf":     "N = 3 kN\nuse b from \"lib/bad.sheaf\"\n",
		}, "lib/bad.sheaf:2:5: undefined name `Nn`"},
		{"template function from the using sheet", map[string]string{
			"sheaf.root":  "",
			"lib/f.sheaf": "sq(x [m]) [m^2] = x * x\n",
			"top.sheaf":   "use f from \"lib/f.sheaf\"\nA = f.sq\n",
		}, "top.sheaf:2:5: `f.sq` is a function of the template"},
		{"folder instead of file", map[string]string{
			"sheaf.root":      "",
			"lib/strut.sheaf": strut,
			"top.sheaf":       "use s from \"lib\"\n",
		}, `top.sheaf:1:13: template path "lib" is a folder, not a sheet`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			base := t.TempDir()
			proj := filepath.Join(base, "proj")
			if err := os.Mkdir(proj, 0o755); err != nil {
				t.Fatal(err)
			}
			for name, text := range c.files {
				p := filepath.Join(proj, filepath.FromSlash(name))
				if target, ok := strings.CutPrefix(text, "->"); ok {
					if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
						t.Fatal(err)
					}
					if err := os.Symlink(filepath.FromSlash(target), p); err != nil {
						t.Skipf("no symbolic links here: %v", err)
					}
					continue
				}
				write(t, p, text)
			}
			t.Chdir(proj)
			top := "top.sheaf"
			if _, ok := c.files["a.sheaf"]; ok {
				top = "a.sheaf"
			}
			if _, ok := c.files["calc/top.sheaf"]; ok {
				top = "calc/top.sheaf"
			}
			_, err := engine.Load(top)
			l, ok := err.(diag.List)
			if !ok || len(l) == 0 {
				t.Fatalf("want diagnostics, got %v", err)
			}
			if got := l[0].Error(); got != c.want {
				t.Errorf("got  %s\nwant %s", got, c.want)
			}
			var b strings.Builder
			if err := diag.Render(&b, l, engine.ReadSources(l)); err != nil || !strings.Contains(b.String(), " | ") {
				t.Errorf("no snippet in the rendering:\n%s", b.String())
			}
		})
	}
}

// TestUseRoot: without a marker the sheet's own folder is the root, and a
// `.git` entry (a folder, or the file of a linked work tree) marks one.
func TestUseRoot(t *testing.T) {
	const strut = "N [kN] = 10 kN\n"
	for _, c := range []struct {
		name   string
		marker string // "" none, ".git/" folder, ".git" file
		ok     bool   // calc/top.sheaf may use ../lib/strut.sheaf
	}{
		{"no marker", "", false},
		{"git folder", ".git/", true},
		{"git file", ".git", true},
		{"sheaf.root", "sheaf.root", true},
	} {
		t.Run(c.name, func(t *testing.T) {
			proj := t.TempDir()
			switch c.marker {
			case ".git/":
				if err := os.Mkdir(filepath.Join(proj, ".git"), 0o755); err != nil {
					t.Fatal(err)
				}
			case "":
			default:
				write(t, filepath.Join(proj, c.marker), "gitdir: elsewhere\n")
			}
			write(t, filepath.Join(proj, "lib", "strut.sheaf"), strut)
			write(t, filepath.Join(proj, "calc", "top.sheaf"), "use s from \"../lib/strut.sheaf\"\n")
			_, err := engine.Load(filepath.Join(proj, "calc", "top.sheaf"))
			if (err == nil) != c.ok {
				t.Errorf("load: %v, want ok=%v", err, c.ok)
			}
			if !c.ok && (err == nil || !strings.Contains(err.Error(), "leaves the project root")) {
				t.Errorf("want an escape error, got %v", err)
			}
		})
	}
}

// TestUseCompileInMemory: Compile resolves templates relative to the
// folder of the name it is given, as Load does.
func TestUseCompileInMemory(t *testing.T) {
	src := []byte("use b from \"../lib/bar.sheaf\"\n    d = 16 mm\nA2 [mm^2] = b.A * 2\n")
	s, err := engine.Compile("testdata/use/calcs/memory.sheaf", src)
	if err != nil {
		t.Fatal(err)
	}
	r := s.Run(nil)
	want := 2 * math.Pi * 0.016 * 0.016 / 4 // closed form: twice πd²/4
	if got := num(t, r, "A2"); !near(got, want, 1e-12) {
		t.Errorf("A2 = %g, want %g", got, want)
	}
}

// BenchmarkLoadWithTemplates loads the plant hanger: three files, two
// levels of use.
func BenchmarkLoadWithTemplates(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := engine.Load(plantHanger); err != nil {
			b.Fatal(err)
		}
	}
}
