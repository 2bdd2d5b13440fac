package main

import (
	"bytes"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/chunks"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite golden files")

// sheaf runs the command line from the repository root, so that file names
// in messages read as a user would type them.
func sheaf(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errb bytes.Buffer
	code = Main(args, strings.NewReader(""), &out, &errb)
	return out.String(), errb.String(), code
}

// TestSheetsGolden runs every example sheet and compares the text and JSON
// listings with testdata/sheets/<name>.txt and .json. Hand checks of the
// numbers sit in each sheet's closing comment.
func TestSheetsGolden(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("sheets/*.sheaf")
	if err != nil || len(files) == 0 {
		t.Fatalf("no sheets found: %v", err)
	}
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".sheaf")
		t.Run(name, func(t *testing.T) {
			out, errs, code := sheaf(t, "run", f)
			if code != exitOK && code != exitChecks {
				t.Fatalf("exit %d: %s", code, errs)
			}
			golden.Check(t, filepath.Join("testdata", "sheets", name+".txt"), []byte(out), *update)
			js, errs, code2 := sheaf(t, "run", "--json", f)
			if code2 != code {
				t.Errorf("--json exit %d, text exit %d: %s", code2, code, errs)
			}
			golden.Check(t, filepath.Join("testdata", "sheets", name+".json"), []byte(js), *update)
			again, _, _ := sheaf(t, "run", f)
			if again != out {
				t.Error("output is not deterministic")
			}
		})
	}
}

// TestHangerHandCalc checks the example against the hand calculation in
// its closing comment (relative 1e-3: the comment rounds).
func TestHangerHandCalc(t *testing.T) {
	t.Chdir("../..")
	out, _, code := sheaf(t, "run", "--json", "sheets/mezzanine-hanger.sheaf")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	// Source: the arithmetic in the sheet's closing comment; EN 1993-1-8
	// Table 3.4 for F_t,Rd = k2 f_ub A_s / γM2 and ISO 898-1 for
	// A_s = π/4 (d − 0.9382 P)² (from memory).
	for _, want := range []string{
		`"name": "F_tRd"`, `"text": "45.12 kN"`, `"text": "17.2 kN"`, `"text": "109.8 MPa"`, `"text": "0.8562 mm"`,
	} {
		if !strings.Contains(out, want) {
			t.Errorf("JSON lacks %s", want)
		}
	}
}

func TestRunSetOverrides(t *testing.T) {
	t.Chdir("../..")
	cases := []runCase{
		// Source: tensile stress areas of M24 and M20 from the ISO 898-1
		// formula π/4 (d − 0.9382 P)² with the ISO 261 pitches 3 and 2.5 mm
		// (352.5 and 244.8 mm²; the standard's table rounds to 353 and 245).
		{"bigger rod", []string{"--set", "d=24 mm"}, exitOK, "352.5 mm^2"},
		{"no space", []string{"--set", "d=20mm"}, exitOK, "244.8 mm^2"},
		{"heavier walkway fails", []string{"--set", "q_k=25kN/m^2"}, exitChecks, "FAILS"},
		{"derived cannot be set", []string{"--set", "sigma=100MPa"}, exitInput, "only inputs can be set"},
		{"wrong dimension", []string{"--set", "d=3 kN"}, exitInput, "must be a length"},
		{"unknown cell", []string{"--set", "dd=3 mm"}, exitInput, "did you mean `d`?"},
		{"bad syntax", []string{"--set", "d"}, exitInput, "expected name=value"},
		// A cell that cannot be computed is wrong input (exit 2), unless
		// the run is a --draft, which then exits as its checks say.
		{"no such thread", []string{"--set", "d=13 mm"}, exitInput, `the nearest sizes are "M12" and "M14"`},
		{"no such thread, draft", []string{"--set", "d=13 mm", "--draft"}, exitChecks, `the nearest sizes are "M12" and "M14"`},
	}
	runCases(t, "sheets/mezzanine-hanger.sheaf", cases)
}

// runCase is a `sheaf run` of a sheet with more arguments, the exit code
// it must give and a text its output (stdout and stderr) must contain.
type runCase struct {
	name     string
	args     []string
	code     int
	contains string
}

// runCases runs `sheaf run path` with each case's arguments, from the
// repository root (the caller changes to it).
func runCases(t *testing.T, path string, cases []runCase) {
	t.Helper()
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			out, errs, code := sheaf(t, append([]string{"run", path}, c.args...)...)
			if code != c.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, c.code, out, errs)
			}
			if !strings.Contains(out+errs, c.contains) {
				t.Errorf("output lacks %q:\n%s%s", c.contains, out, errs)
			}
		})
	}
}

func TestCheckCommand(t *testing.T) {
	t.Chdir("../..")
	out, errs, code := sheaf(t, "check", "sheets/mezzanine-hanger.sheaf")
	if code != exitOK || !strings.HasPrefix(out, "ok: ") {
		t.Fatalf("exit %d: %s%s", code, out, errs)
	}
	if _, _, code := sheaf(t, "check", "no/such/file.sheaf"); code != exitInput {
		t.Errorf("missing file: exit %d, want %d", code, exitInput)
	}
}

// TestCheckerCasesExit runs every case of the checker's chunked error file
// through the command: each must exit 2 and name its line.
func TestCheckerCasesExit(t *testing.T) {
	dir := t.TempDir()
	for _, c := range chunks.Read(t, filepath.Join("..", "..", "engine", "check", "testdata", "errors.chunks")) {
		t.Run(c.Name, func(t *testing.T) {
			f := filepath.Join(dir, c.Name+".sheaf")
			if err := os.WriteFile(f, c.Src, 0o644); err != nil {
				t.Fatal(err)
			}
			_, errs, code := sheaf(t, "check", f)
			if code != exitInput {
				t.Fatalf("exit %d, want %d\n%s", code, exitInput, errs)
			}
			for line := range c.Wants {
				if !strings.Contains(errs, fmt.Sprintf("%s:%d:", f, line)) {
					t.Errorf("no message at line %d:\n%s", line, errs)
				}
			}
		})
	}
}

// TestBrokenSheets runs every sheet under testdata/broken: each must exit 2
// without a panic and print exactly the diagnostics in its .err file.
func TestBrokenSheets(t *testing.T) {
	t.Chdir("../..")
	files, _ := filepath.Glob("testdata/broken/*.sheaf")
	if len(files) < 15 {
		t.Errorf("want at least 15 broken sheets, have %d", len(files))
	}
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".sheaf")
		t.Run(name, func(t *testing.T) {
			out, errs, code := sheaf(t, "check", f)
			if code != exitInput {
				t.Fatalf("exit %d, want %d\n%s%s", code, exitInput, out, errs)
			}
			if strings.Contains(errs, "internal error") {
				t.Fatalf("panic: %s", errs)
			}
			golden.Check(t, strings.TrimSuffix(f, ".sheaf")+".err", []byte(errs), *update)
			_, errs2, code2 := sheaf(t, "run", f)
			if code2 != exitInput || errs2 != errs {
				t.Errorf("run disagrees with check: exit %d\n%s", code2, errs2)
			}
		})
	}
}
