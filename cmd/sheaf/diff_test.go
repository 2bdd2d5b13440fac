package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

func TestDiffCommand(t *testing.T) {
	dir := filepath.Join("testdata", "diff")
	old, cur := filepath.Join(dir, "old.sheaf"), filepath.Join(dir, "new.sheaf")
	for _, tc := range []struct {
		name string
		args []string
		code int
	}{
		{"text", []string{old, cur}, exitChecks},
		{"json", []string{"--json", old, cur}, exitChecks},
		{"same", []string{old, old}, exitOK},
		{"back", []string{cur, old}, exitOK},
		{"rtol", []string{"--rtol", "0.5", old, cur}, exitChecks},
		{"one-arg", []string{old}, exitInput},
		{"broken", []string{old, filepath.Join("testdata", "fmt", "broken.sheaf")}, exitInput},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := sheaf(t, append([]string{"diff"}, tc.args...)...)
			if code != tc.code {
				t.Errorf("exit %d, want %d\n%s", code, tc.code, errs)
			}
			got := transcript(out, errs, code)
			golden.Check(t, filepath.Join(dir, tc.name+".golden"), []byte(got), *update)
			if o2, e2, c2 := sheaf(t, append([]string{"diff"}, tc.args...)...); transcript(o2, e2, c2) != got {
				t.Error("a second run prints other bytes")
			}
		})
	}
}

// TestDiffRev builds a git repository with two commits of a sheet and
// compares revisions with the working copy.
func TestDiffRev(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not installed")
	}
	repo := t.TempDir()
	gitRun := func(args ...string) {
		t.Helper()
		cmd := exec.Command("git", append([]string{"-C", repo, "-c", "user.name=Sheaf test", "-c", "user.email=test@example.invalid", "-c", "commit.gpgsign=false"}, args...)...)
		cmd.Env = append(os.Environ(), "GIT_CONFIG_NOSYSTEM=1", "HOME="+repo)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	copyTo := func(src, dst string) {
		t.Helper()
		b, err := os.ReadFile(src)
		if err != nil {
			t.Fatal(err)
		}
		if err := os.MkdirAll(filepath.Dir(dst), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(dst, b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	file := filepath.Join(repo, "calcs", "hanger.sheaf")
	gitRun("init", "-q")
	copyTo(filepath.Join("testdata", "diff", "old.sheaf"), file)
	gitRun("add", ".")
	gitRun("commit", "-q", "-m", "rev A")
	copyTo(filepath.Join("testdata", "diff", "new.sheaf"), file)
	gitRun("commit", "-q", "-a", "-m", "rev B")

	// HEAD~1 against the working copy (= HEAD): the same report as the
	// two files, under the revision's name.
	out, errs, code := sheaf(t, "diff", "--rev", "HEAD~1", file)
	if code != exitChecks {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.HasPrefix(out, "--- HEAD~1:calcs/hanger.sheaf\n+++ "+file+"\n") {
		t.Errorf("header:\n%s", out)
	}
	want, _, _ := sheaf(t, "diff", filepath.Join("testdata", "diff", "old.sheaf"), filepath.Join("testdata", "diff", "new.sheaf"))
	body := func(s string) string { return strings.SplitN(s, "\n", 3)[2] } // after the two name lines
	if body(out) != body(want) {
		t.Errorf("--rev report differs from the two-file report:\n%s\nwant\n%s", out, want)
	}
	if out, errs, code := sheaf(t, "diff", "--rev", "HEAD", file); code != exitOK || !strings.Contains(out, "no changes") {
		t.Errorf("HEAD against an unchanged copy: exit %d\n%s%s", code, out, errs)
	}

	// A sheet that uses a template, the template unchanged: only the
	// sheet's override moved.
	rod := "title: rod\nP [kN] = 10 kN\nA [mm^2] = 100 mm^2\nsigma [MPa] = P / A\n"
	user := "title: user\nuse r from \"rod.sheaf\"\n    P = 20 kN\nf_y [MPa] = 235 MPa\ncheck stress: r.sigma <= f_y\n"
	if err := os.WriteFile(filepath.Join(repo, "calcs", "rod.sheaf"), []byte(rod), 0o644); err != nil {
		t.Fatal(err)
	}
	userPath := filepath.Join(repo, "calcs", "user.sheaf")
	if err := os.WriteFile(userPath, []byte(user), 0o644); err != nil {
		t.Fatal(err)
	}
	gitRun("add", ".")
	gitRun("commit", "-q", "-m", "template use")
	if err := os.WriteFile(userPath, []byte(strings.Replace(user, "20 kN", "30 kN", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code = sheaf(t, "diff", "--rev", "HEAD", userPath)
	if code != exitChecks || errs != "" || !strings.Contains(out, "85.1 % ok → 128 % FAILS") {
		t.Errorf("template use: exit %d\n%s%s", code, out, errs)
	}

	// Errors: an unknown revision, a file git does not know, no repository.
	for _, tc := range []struct {
		name, rev, file, want string
	}{
		{"unknown revision", "no-such-tag", file, "git cannot show calcs/hanger.sheaf at revision \"no-such-tag\""},
		{"untracked file", "HEAD", filepath.Join(repo, "calcs", "new.sheaf"), "git cannot show calcs/new.sheaf"},
		{"outside a repository", "HEAD", filepath.Join(t.TempDir(), "x.sheaf"), "is not inside a git repository"},
	} {
		if !strings.Contains(tc.file, "hanger") {
			copyTo(filepath.Join("testdata", "diff", "new.sheaf"), tc.file)
		}
		_, errs, code := sheaf(t, "diff", "--rev", tc.rev, tc.file)
		if code != exitInput || !strings.Contains(errs, tc.want) {
			t.Errorf("%s: exit %d, stderr %q, want %q", tc.name, code, errs, tc.want)
		}
	}
}
