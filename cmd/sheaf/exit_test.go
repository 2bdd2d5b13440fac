package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

// binary is the sheaf command built once for the tests that run it as a
// user does (TestExitCodes, TestJSONSchema): exit codes and the split of
// stdout and stderr are only real through the built binary.
var binary string

func TestMain(m *testing.M) {
	asMain()
	dir, err := os.MkdirTemp("", "sheaf-bin-")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	binary = filepath.Join(dir, "sheaf")
	build := exec.Command("go", "build", "-o", binary, ".")
	build.Stderr = os.Stderr
	if err := build.Run(); err != nil {
		fmt.Fprintln(os.Stderr, "building sheaf for the tests:", err)
		os.RemoveAll(dir)
		os.Exit(1)
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// runBinary runs the built sheaf in dir with args and stdin, and returns
// its stdout, stderr and exit code.
func runBinary(t *testing.T, dir, stdin string, args ...string) (string, string, int) {
	t.Helper()
	cmd := exec.Command(binary, args...)
	cmd.Dir = dir
	cmd.Stdin = strings.NewReader(stdin)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	err := cmd.Run()
	var ee *exec.ExitError
	switch {
	case err == nil:
		return out.String(), errb.String(), 0
	case errors.As(err, &ee):
		return out.String(), errb.String(), ee.ExitCode()
	}
	t.Fatalf("running sheaf %s: %v", strings.Join(args, " "), err)
	return "", "", -1
}

// TestExitCodes runs every command through the built binary with inputs
// that give each exit code it can give (the table of exitTable): 0 all
// checks pass and every cell computed, 1 a check fails or is not
// assessed, 2 wrong input (sheet error, uncomputed cell, bad flag,
// argument or file, unknown command). Exit 3, a fault of Sheaf, has no
// input that provokes it: TestExitInternal covers it in the process.
func TestExitCodes(t *testing.T) {
	const fx = "testdata/exit/"
	okSrc, err := os.ReadFile(fx + "ok.sheaf")
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name  string
		args  []string
		stdin string
		code  int
		out   string // in stdout, when not ""
		err   string // in stderr, when not ""
		json  bool   // stdout is one JSON document with this exit_code
	}{
		{"no command prints help", nil, "", 0, "Exit status", "", false},
		{"help", []string{"help", "run"}, "", 0, "--draft", "", false},
		{"version", []string{"--version"}, "", 0, "sheaf", "", false},
		{"unknown command", []string{"frob"}, "", 2, "", `unknown command "frob"`, false},
		{"misspelt command", []string{"rnu", fx + "ok.sheaf"}, "", 2, "", `did you mean "run"?`, false},
		{"unknown flag", []string{"run", "--frob", fx + "ok.sheaf"}, "", 2, "", "unknown flag", false},

		{"run ok", []string{"run", fx + "ok.sheaf"}, "", 0, "The design check is ok.", "", false},
		{"run fails", []string{"run", fx + "fails.sheaf"}, "", 1, "FAILS", "", false},
		{"run uplift not assessed", []string{"run", fx + "uplift.sheaf"}, "", 1, "not assessed  demand is compression; this check is written for tension", "", false},
		{"run uncomputed", []string{"run", fx + "uncomputed.sheaf"}, "", 2, "Not computed", "--draft accepts it", false},
		{"run uncomputed draft", []string{"run", "--draft", fx + "uncomputed.sheaf"}, "", 0, "Not computed", "", false},
		{"run sheet error", []string{"run", fx + "broken.sheaf"}, "", 2, "", "broken.sheaf:4:", false},
		{"run no file", []string{"run"}, "", 2, "", "accepts 1 arg", false},
		{"run two files", []string{"run", fx + "ok.sheaf", fx + "fails.sheaf"}, "", 2, "", "accepts 1 arg", false},
		{"run missing file", []string{"run", fx + "nosuch.sheaf"}, "", 2, "", "no such file", false},
		{"run bad set", []string{"run", fx + "ok.sheaf", "--set", "P=3 m"}, "", 2, "", "must be a force", false},
		{"run stdin", []string{"run", "-"}, string(okSrc), 0, "The design check is ok.", "", false},
		{"run over max-bytes", []string{"run", "--max-bytes", "10", fx + "ok.sheaf"}, "", 2, "", "too large", false},
		{"run stdin over max-bytes", []string{"run", "--max-bytes", "10", "-"}, string(okSrc), 2, "", "larger than the limit of 10 bytes", false},
		{"run over max-lines", []string{"run", "--max-lines", "2", fx + "ok.sheaf"}, "", 2, "", "too many lines", false},
		{"run over max-cells", []string{"run", "--max-cells", "1", fx + "ok.sheaf"}, "", 2, "", "at most 1 cell;", false},
		{"run over max-eval-steps", []string{"run", "--max-eval-steps", "1", fx + "ok.sheaf"}, "", 2, "", "the limit is 1", false},
		{"run bad max-eval-steps", []string{"run", "--max-eval-steps", "-1", fx + "ok.sheaf"}, "", 2, "", "give a positive number of steps", false},
		{"run bad system", []string{"run", "--system", "mars", fx + "ok.sheaf"}, "", 2, "", "unknown unit system", false},

		{"run json ok", []string{"run", "--json", fx + "ok.sheaf"}, "", 0, `"pass": true`, "", true},
		{"run json fails", []string{"run", "--json", fx + "fails.sheaf"}, "", 1, `"verdict": "fail"`, "", true},
		{"run json uplift", []string{"run", "--json", fx + "uplift.sheaf"}, "", 1, `"kind": "check"`, "", true},
		{"run json uncomputed", []string{"run", "--json", fx + "uncomputed.sheaf"}, "", 2, `"kind": "runtime"`, "", true},
		{"run json uncomputed draft", []string{"run", "--json", "--draft", fx + "uncomputed.sheaf"}, "", 0, `"kind": "runtime"`, "", true},
		{"run json sheet error", []string{"run", "--json", fx + "broken.sheaf"}, "", 2, `"kind": "sheet"`, "", true},
		{"run json missing file", []string{"run", "--json", fx + "nosuch.sheaf"}, "", 2, `"kind": "input"`, "", true},
		{"run json bad flag", []string{"run", "--json", "--frob", fx + "ok.sheaf"}, "", 2, "unknown flag", "", true},
		{"run json no file", []string{"run", "--json"}, "", 2, "accepts 1 arg", "", true},
		{"batch json one argument", []string{"batch", fx + "ok.sheaf", "--json"}, "", 2, "accepts 2 arg", "", true},
		{"run json bad set", []string{"run", "--json", fx + "ok.sheaf", "--set", "P=3 m"}, "", 2, "must be a force", "", true},

		{"check ok", []string{"check", fx + "ok.sheaf"}, "", 0, "ok: 2 cells, 1 checks", "", false},
		{"check does not evaluate", []string{"check", fx + "fails.sheaf"}, "", 0, "ok:", "", false},
		{"check sheet error", []string{"check", fx + "broken.sheaf"}, "", 2, "", "broken.sheaf:4:", false},
		{"check json", []string{"check", "--json", fx + "ok.sheaf"}, "", 0, `"checks": 1`, "", true},
		{"check json sheet error", []string{"check", "--json", fx + "broken.sheaf"}, "", 2, `"line": 4`, "", true},
		{"check stdin", []string{"check", "-"}, string(okSrc), 0, "ok:", "", false},
		{"check no file", []string{"check"}, "", 2, "", "accepts 1 arg", false},

		{"export ok", []string{"export", fx + "ok.sheaf", "-o", "{tmp}/ok.xlsx"}, "", 0, "wrote", "", false},
		{"export fails", []string{"export", fx + "fails.sheaf", "-o", "{tmp}/fails.xlsx"}, "", 1, "wrote", "failed", false},
		{"export uncomputed", []string{"export", fx + "uncomputed.sheaf", "-o", "{tmp}/unc.xlsx"}, "", 2, "wrote", "could not be computed", false},
		{"export uncomputed draft", []string{"export", "--draft", fx + "uncomputed.sheaf", "-o", "{tmp}/unc2.xlsx"}, "", 0, "wrote", "", false},
		{"export sheet error", []string{"export", fx + "broken.sheaf", "-o", "{tmp}/b.xlsx"}, "", 2, "", "broken.sheaf:4:", false},
		{"export bad extension", []string{"export", fx + "ok.sheaf", "-o", "{tmp}/ok.pdf"}, "", 2, "", "extension .xlsx", false},
		{"export warns of placeholders", []string{"export", fx + "placeholder.sheaf", "-o", "{tmp}/ph.xlsx"}, "", 0, "wrote", `the header date is still the placeholder "YYYY-MM-DD"`, false},
		{"export stdin needs -o", []string{"export", "-"}, string(okSrc), 2, "", "name the workbook with -o", false},
		{"export stdin", []string{"export", "-", "-o", "{tmp}/stdin.xlsx"}, string(okSrc), 0, "wrote", "", false},

		{"batch ok", []string{"batch", fx + "ok.sheaf", fx + "cases.csv"}, "", 0, "pass", "", false},
		{"batch fails", []string{"batch", fx + "ok.sheaf", fx + "cases-fail.csv"}, "", 1, "fail", "", false},
		{"batch bad rows", []string{"batch", fx + "ok.sheaf", fx + "badcases.csv"}, "", 2, "", "is a length", false},
		{"batch missing table", []string{"batch", fx + "ok.sheaf", fx + "nosuch.csv"}, "", 2, "", "cannot read the case table", false},
		{"batch sheet error", []string{"batch", fx + "broken.sheaf", fx + "cases.csv"}, "", 2, "", "broken.sheaf:4:", false},
		{"batch without checks gives the derived cells", []string{"batch", fx + "nochecks.sheaf", fx + "cases.csv"}, "", 0, "sigma [MPa]", "", false},
		{"batch semicolons and decimal commas", []string{"batch", fx + "ok.sheaf", fx + "cases-semicolon.csv"}, "", 1, "1,12.5,28,0.446429,pass", "with a decimal comma", false},
		{"batch a point and a comma is refused", []string{"batch", fx + "ok.sheaf", fx + "cases-ambiguous.csv"}, "", 2, "", "both a comma and a point", false},
		{"batch every row bad", []string{"batch", fx + "ok.sheaf", fx + "allbad.csv"}, "", 2, "", "no case evaluated: all 2 rows", false},
		{"batch json", []string{"batch", "--json", fx + "ok.sheaf", fx + "cases-fail.csv"}, "", 1, `"verdict": "fail"`, "", true},
		{"batch json bad table", []string{"batch", "--json", fx + "ok.sheaf", fx + "allbad.csv"}, "", 2, `"bad": true`, "", true},
		{"batch json sheet error", []string{"batch", "--json", fx + "broken.sheaf", fx + "cases.csv"}, "", 2, `"kind": "sheet"`, "", true},
		{"batch one argument", []string{"batch", fx + "ok.sheaf"}, "", 2, "", "accepts 2 arg", false},

		{"diff same", []string{"diff", fx + "ok.sheaf", fx + "ok.sheaf"}, "", 0, "no changes", "", false},
		{"diff flips to fail", []string{"diff", fx + "ok.sheaf", fx + "fails.sheaf"}, "", 1, "flipped to fail", "", false},
		{"diff sheet error", []string{"diff", fx + "ok.sheaf", fx + "broken.sheaf"}, "", 2, "", "broken.sheaf:4:", false},
		{"diff uncomputed", []string{"diff", fx + "ok.sheaf", fx + "uncomputed.sheaf"}, "", 2, "", "could not be computed", false},
		{"diff one file", []string{"diff", fx + "ok.sheaf"}, "", 2, "", "two sheets", false},

		{"fmt check canonical", []string{"fmt", "--check", fx + "ok.sheaf"}, "", 0, "", "", false},
		{"fmt check would change", []string{"fmt", "--check", fx + "ok-unformatted.sheaf"}, "", 1, "ok-unformatted.sheaf", "", false},
		{"fmt missing file", []string{"fmt", "--check", fx + "nosuch.sheaf"}, "", 2, "", "no such file", false},
		{"fmt no file", []string{"fmt"}, "", 2, "", "requires at least 1 arg", false},

		{"funcs", []string{"funcs"}, "", 0, "solve_bar", "", false},
		{"funcs unknown", []string{"funcs", "nosuch"}, "", 2, "", "unknown function", false},
		{"units", []string{"units"}, "", 0, "kN", "", false},
		{"units bad system", []string{"units", "--system", "mars"}, "", 2, "", "unknown unit system", false},

		{"new", []string{"new", fx + "ok.sheaf", "{tmp}/new.sheaf"}, "", 0, "", "", false},
		{"new bad date", []string{"new", "--date", "2026-02-30", fx + "ok.sheaf", "{tmp}/new2.sheaf"}, "", 2, "", "YYYY-MM-DD", false},
		{"new exists", []string{"new", fx + "ok.sheaf", fx + "fails.sheaf"}, "", 2, "", "exists", false},
		{"new missing template", []string{"new", fx + "nosuch.sheaf", "{tmp}/x.sheaf"}, "", 2, "", "", false},

		{"completion", []string{"completion", "bash"}, "", 0, "bash completion", "", false},
		{"completion of an unknown shell", []string{"completion", "tcsh"}, "", 2, "", `unknown command "tcsh" for "sheaf completion"`, false},
		{"help of an unknown command", []string{"help", "frob"}, "", 2, "", `unknown command "frob"`, false},
		{"watch missing file", []string{"watch", fx + "nosuch.sheaf"}, "", 2, "", "no such file", false},
		{"watch no file", []string{"watch"}, "", 2, "", "accepts 1 arg", false},
	}
	tmp := t.TempDir()
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			args := make([]string, len(c.args))
			for i, a := range c.args {
				args[i] = strings.ReplaceAll(a, "{tmp}", tmp)
			}
			out, errs, code := runBinary(t, ".", c.stdin, args...)
			if code != c.code {
				t.Fatalf("sheaf %s: exit %d, want %d\nstdout:\n%s\nstderr:\n%s", strings.Join(args, " "), code, c.code, out, errs)
			}
			if c.out != "" && !strings.Contains(out, c.out) {
				t.Errorf("stdout lacks %q:\n%s", c.out, out)
			}
			if c.err != "" && !strings.Contains(errs, c.err) {
				t.Errorf("stderr lacks %q:\n%s", c.err, errs)
			}
			if strings.Contains(errs, "internal error") {
				t.Errorf("an input error is reported as a fault of Sheaf:\n%s", errs)
			}
			if c.json {
				var doc struct {
					Schema   string            `json:"schema"`
					ExitCode *int              `json:"exit_code"`
					Problems []json.RawMessage `json:"problems"`
				}
				if err := json.Unmarshal([]byte(out), &doc); err != nil {
					t.Fatalf("stdout is not one JSON document: %v\n%s", err, out)
				}
				if doc.Schema == "" || doc.ExitCode == nil || *doc.ExitCode != code || doc.Problems == nil {
					t.Errorf("schema %q, exit_code %v (exit %d), problems %v", doc.Schema, doc.ExitCode, code, doc.Problems)
				}
			}
		})
	}
}

// TestExitInternal: a fault of Sheaf (here a command that panics, standing
// for a bug) exits 3 with the stack and a request to report it; an error
// that is not typed as the user's is a fault too.
func TestExitInternal(t *testing.T) {
	var out, errb bytes.Buffer
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	root := newRootCmd(a)
	root.AddCommand(&cobra.Command{Use: "boom", RunE: func(*cobra.Command, []string) error { panic("index out of range") }})
	root.AddCommand(&cobra.Command{Use: "fault", RunE: func(*cobra.Command, []string) error { return errors.New("unexpected state") }})
	if code := execute(context.Background(), root, []string{"boom"}, &errb); code != exitInternal || !strings.Contains(errb.String(), "please report this") {
		t.Errorf("panic: exit %d, stderr %q", code, errb.String())
	}
	errb.Reset()
	if code := execute(context.Background(), root, []string{"fault"}, &errb); code != exitInternal {
		t.Errorf("untyped error: exit %d, want %d", code, exitInternal)
	}
}

// TestHelpHasExitTable: every command's help carries the one exit table.
func TestHelpHasExitTable(t *testing.T) {
	a := &app{stdin: strings.NewReader(""), stdout: &bytes.Buffer{}, stderr: &bytes.Buffer{}}
	root := newRootCmd(a)
	for _, c := range append(root.Commands(), root) {
		if !strings.Contains(c.Long, exitTable) {
			t.Errorf("the help of %s lacks the exit table", c.Name())
		}
	}
}

// TestCompletion asks the built binary for shell completions (cobra's
// __complete, which the scripts of `sheaf completion` call): input names
// (and record fields) after --set, function names after funcs, the
// --system values, .sheaf files for a sheet argument.
func TestCompletion(t *testing.T) {
	const fx = "testdata/exit/"
	cases := []struct {
		name string
		args []string
		want []string
		not  []string
	}{
		{"inputs after --set", []string{"run", fx + "nochecks.sheaf", "--set", ""}, []string{"P=\t", "A="}, []string{"sigma="}},
		{"inputs after --set, prefix", []string{"export", fx + "ok.sheaf", "--set", "N"}, []string{"N_Rd="}, []string{"P="}},
		{"functions", []string{"funcs", "ch"}, []string{"chs\t"}, []string{"sqrt", "circle"}},
		{"systems", []string{"run", "--system", ""}, []string{"metric\t", "us\t"}, nil},
		{"sheet files", []string{"check", ""}, []string{"sheaf", ":8"}, nil}, // 8: filter by extension
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			out, errs, code := runBinary(t, ".", "", append([]string{"__complete"}, c.args...)...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			for _, w := range c.want {
				if !strings.Contains(out, w) {
					t.Errorf("completions lack %q:\n%s", w, out)
				}
			}
			for _, n := range c.not {
				if strings.Contains(out, n) {
					t.Errorf("completions offer %q:\n%s", n, out)
				}
			}
		})
	}
}

// TestWatchExitsZeroOnInterrupt: watch, the one command that runs until
// stopped, exits 0 when interrupted (Ctrl-C), through the built binary.
func TestWatchExitsZeroOnInterrupt(t *testing.T) {
	cmd := exec.Command(binary, "watch", "testdata/exit/ok.sheaf")
	var out, errb syncBuffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	waitFor(t, &out, "watching testdata/exit/ok.sheaf")
	if err := cmd.Process.Signal(os.Interrupt); err != nil {
		t.Fatal(err)
	}
	err := cmd.Wait()
	var ee *exec.ExitError
	if errors.As(err, &ee) || err != nil {
		t.Fatalf("watch after Ctrl-C: %v\n%s", err, errb.String())
	}
}
