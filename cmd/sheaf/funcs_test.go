package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

var updateFuncsGolden = flag.Bool("update-funcs", false, "rewrite the golden files of `sheaf funcs`")

func runFuncsCLI(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = Main(args, strings.NewReader(""), &out, &errb)
	return code, out.String(), errb.String()
}

// TestFuncsCommandGolden pins the listing and the descriptions of the
// section, composite and plastic families; the numbers behind them are
// checked against their sources in funcs/section, funcs/composite and
// funcs/plastic.
func TestFuncsCommandGolden(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
	}{
		{"family-math", []string{"funcs", "--family", "math"}, exitOK},
		{"builtin-interp", []string{"funcs", "interp"}, exitOK},
		{"unknown-builtin", []string{"funcs", "sqr"}, exitInput},
		{"family-section", []string{"funcs", "--family", "section"}, exitOK},
		{"family-composite", []string{"funcs", "--family", "composite"}, exitOK},
		{"family-plastic", []string{"funcs", "--family", "plastic"}, exitOK},
		{"chs", []string{"funcs", "chs"}, exitOK},
		{"section_integral", []string{"funcs", "section_integral"}, exitOK},
		{"composite_axial", []string{"funcs", "composite_axial"}, exitOK},
		{"n_eps_curve", []string{"funcs", "n_eps_curve"}, exitOK},
		{"part", []string{"funcs", "part"}, exitOK},
		{"unknown", []string{"funcs", "chz"}, exitInput},
		{"unknown-far", []string{"funcs", "zzzzzz"}, exitInput},
		{"bad-family", []string{"funcs", "--family", "sections"}, exitInput},
		{"two-names", []string{"funcs", "chs", "rect"}, exitInput},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := runFuncsCLI(tc.args...)
			if code != tc.code {
				t.Errorf("exit code %d, want %d (stderr %q)", code, tc.code, stderr)
			}
			got := "$ sheaf " + strings.Join(tc.args, " ") + "\n" + stdout
			if stderr != "" {
				got += "--- stderr\n" + stderr
			}
			path := filepath.Join("testdata", "funcs", tc.name+".golden")
			if *updateFuncsGolden {
				if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./cmd/sheaf -run TestFuncsCommandGolden -update-funcs)", err)
			}
			if got != string(want) {
				t.Errorf("output differs from %s:\n--- got\n%s\n--- want\n%s", path, got, want)
			}
		})
	}
}

// TestFuncsListsEveryFunction: the full listing names every registered
// function under its family, whoever registered it.
func TestFuncsListsEveryFunction(t *testing.T) {
	code, out, errs := runFuncsCLI("funcs")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, d := range funcs.All() {
		if !strings.Contains(out, "  "+d.Name+"(") {
			t.Errorf("%s is missing from the listing", d.Name)
		}
		if !strings.Contains(out, "\n"+d.Family+"\n") && !strings.HasPrefix(out, d.Family+"\n") {
			t.Errorf("family %s has no heading", d.Family)
		}
	}
	// Every function describes itself with a source.
	for _, d := range funcs.All() {
		code, out, _ := runFuncsCLI("funcs", d.Name)
		if code != exitOK || !strings.Contains(out, "Source:") {
			t.Errorf("sheaf funcs %s: exit %d", d.Name, code)
		}
	}
}

func TestWrap(t *testing.T) {
	var b bytes.Buffer
	wrap(&b, "one two three four five six", "  ", 12)
	want := "  one two\n  three four\n  five six\n"
	if b.String() != want {
		t.Errorf("got %q want %q", b.String(), want)
	}
}
