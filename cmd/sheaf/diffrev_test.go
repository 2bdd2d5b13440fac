package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// gitRepo makes a git repository in a temporary folder and returns it with
// a function that runs git there.
func gitRepo(t *testing.T) (string, func(args ...string)) {
	t.Helper()
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not installed")
	}
	repo := t.TempDir()
	if real, err := filepath.EvalSymlinks(repo); err == nil {
		repo = real
	}
	run := func(args ...string) {
		t.Helper()
		cmd := exec.Command("git", append([]string{"-C", repo, "-c", "user.name=Sheaf test", "-c", "user.email=test@example.invalid", "-c", "commit.gpgsign=false"}, args...)...)
		cmd.Env = append(os.Environ(), "GIT_CONFIG_NOSYSTEM=1", "HOME="+repo)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	run("init", "-q")
	return repo, run
}

// writeFiles writes files (slash paths relative to dir); a text "->x"
// makes a symbolic link to x.
func writeFiles(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	for name, text := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if target, ok := strings.CutPrefix(text, "->"); ok {
			_ = os.Remove(p)
			if err := os.Symlink(filepath.FromSlash(target), p); err != nil {
				t.Skipf("no symbolic links here: %v", err)
			}
			continue
		}
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// TestDiffRevTemplates: a revision's sheet is checked with the templates of
// that revision. Commits: a sheet and its template (A); a change of the
// template only (B); a template made invalid (C); a template path that
// leaves the project (D); a template reached through a link inside the
// project (E); a link out of it (F); a misspelt template path (G); a
// misspelt folder (H). The work tree is then checked out at E (so HEAD~4
// is A) and holds yet another template, which no comparison of two
// revisions may read. Hand check of the numbers: σ = P/A with P = 20 kN:
// A = 100 mm² gives 200 MPa, A = 80 mm² gives 250 MPa; against
// f_y = 235 MPa that is 85.1 % and 106 % (common practice: the utilisation
// is demand over capacity).
func TestDiffRevTemplates(t *testing.T) {
	goldDir, err := filepath.Abs(filepath.Join("testdata", "diffrev"))
	if err != nil {
		t.Fatal(err)
	}
	repo, git := gitRepo(t)
	const user = "title: hanger with a rod template\nuse r from \"templates/rod.sheaf\"\n    P = 20 kN\nf_y [MPa] = 235 MPa\ncheck stress: r.sigma <= f_y\n"
	rod := func(area string) string {
		return "title: rod\nP [kN] = 10 kN\nA [mm^2] = " + area + "\nsigma [MPa] = P / A\n"
	}
	writeFiles(t, repo, map[string]string{
		"calcs/sheaf.root":            "",
		"calcs/user.sheaf":            user,
		"calcs/templates/rod.sheaf":   rod("100 mm^2"),
		"calcs/templates/alias.sheaf": "->rod.sheaf",
		"outside.sheaf":               rod("50 mm^2"),
	})
	git("add", ".")
	git("commit", "-q", "-m", "A: sheet and template")
	git("tag", "A")
	writeFiles(t, repo, map[string]string{"calcs/templates/rod.sheaf": rod("80 mm^2")})
	git("commit", "-q", "-a", "-m", "B: only the template changed")
	git("tag", "B")
	writeFiles(t, repo, map[string]string{"calcs/templates/rod.sheaf": rod("80 mm^2") + "M = sigma * Ar\n"})
	git("commit", "-q", "-a", "-m", "C: a broken template")
	git("tag", "C")
	writeFiles(t, repo, map[string]string{
		"calcs/templates/rod.sheaf": rod("80 mm^2"),
		"calcs/user.sheaf":          strings.Replace(user, "templates/rod.sheaf", "../outside.sheaf", 1),
	})
	git("commit", "-q", "-a", "-m", "D: a template outside the project")
	git("tag", "D")
	writeFiles(t, repo, map[string]string{
		"calcs/user.sheaf":            strings.Replace(user, "templates/rod.sheaf", "templates/alias.sheaf", 1),
		"calcs/templates/rod.sheaf":   rod("40 mm^2"),
		"calcs/templates/other.sheaf": rod("10 mm^2"),
	})
	git("add", ".")
	git("commit", "-q", "-m", "E: through a link inside the project")
	git("tag", "E")
	writeFiles(t, repo, map[string]string{
		"calcs/user.sheaf":          strings.Replace(user, "templates/rod.sheaf", "templates/out.sheaf", 1),
		"calcs/templates/out.sheaf": "->../../outside.sheaf",
	})
	git("add", ".")
	git("commit", "-q", "-m", "F: a link out of the project")
	git("tag", "F")
	writeFiles(t, repo, map[string]string{"calcs/user.sheaf": strings.Replace(user, "templates/rod.sheaf", "templates/rodd.sheaf", 1)})
	git("commit", "-q", "-a", "-m", "G: a misspelt template")
	git("tag", "G")
	writeFiles(t, repo, map[string]string{"calcs/user.sheaf": strings.Replace(user, "templates/rod.sheaf", "templatez/rod.sheaf", 1)})
	git("commit", "-q", "-a", "-m", "H: a misspelt folder")
	git("tag", "H")
	git("checkout", "-q", "E")
	// The working copy differs from every commit: a comparison of two
	// revisions must not see it.
	writeFiles(t, repo, map[string]string{"calcs/templates/rod.sheaf": rod("1 mm^2")})
	t.Chdir(repo)
	const file = "calcs/user.sheaf"

	for _, tc := range []struct {
		name string
		args []string
		code int
	}{
		{"template-only", []string{"--rev", "HEAD~4", "--rev", "HEAD~3"}, exitChecks},
		{"dotdot", []string{"--rev", "HEAD~4..B"}, exitChecks},
		{"same-rev", []string{"--rev", "B", "--rev", "B"}, exitOK},
		{"back", []string{"--rev", "B", "--rev", "A"}, exitOK},
		{"broken-template", []string{"--rev", "B", "--rev", "C"}, exitInput},
		{"leaves-root", []string{"--rev", "B..D"}, exitInput},
		{"through-link", []string{"--rev", "B..E"}, exitOK},
		{"link-leaves-root", []string{"--rev", "E..F"}, exitInput},
		{"misspelt-template", []string{"--rev", "E..G"}, exitInput},
		{"misspelt-folder", []string{"--rev", "E..H"}, exitInput},
		{"rev-and-working-copy", []string{"--rev", "E"}, exitOK},
		{"three-revs", []string{"--rev", "A", "--rev", "B..C"}, exitInput},
		{"merge-base", []string{"--rev", "A...B"}, exitInput},
		{"half-range", []string{"--rev", "..B"}, exitInput},
		{"unknown-rev", []string{"--rev", "B", "--rev", "no-such-tag"}, exitInput},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := sheaf(t, append(append([]string{"diff"}, tc.args...), file)...)
			if code != tc.code {
				t.Errorf("exit %d, want %d\n%s%s", code, tc.code, out, errs)
			}
			golden.Check(t, filepath.Join(goldDir, tc.name+".golden"), []byte(transcript(out, errs, code)), *update)
		})
	}

	// The two spellings of two revisions give one report.
	a, _, _ := sheaf(t, "diff", "--rev", "A", "--rev", "B", file)
	b, _, _ := sheaf(t, "diff", "--rev", "A..B", file)
	if a != b {
		t.Errorf("--rev A --rev B and --rev A..B differ:\n%s\n%s", a, b)
	}
	// One revision against the working copy reads the working copy's
	// template: 20 kN on 1 mm² is 20,000 MPa.
	if out, _, _ := sheaf(t, "diff", "--rev", "E", file); !strings.Contains(out, "r.sigma") || !strings.Contains(out, "2e+04 MPa") && !strings.Contains(out, "20000 MPa") {
		t.Errorf("the working copy's template is not seen:\n%s", out)
	}
}
