package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// sheafWithin runs the command line like sheaf, and fails the test when it
// does not return in time: no command may block on a file that is not a
// regular file.
func sheafWithin(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	type result struct {
		out, errs string
		code      int
	}
	done := make(chan result, 1)
	go func() {
		var out, errb bytes.Buffer
		c := Main(args, strings.NewReader(""), &out, &errb)
		done <- result{out.String(), errb.String(), c}
	}()
	select {
	case r := <-done:
		return r.out, r.errs, r.code
	case <-time.After(20 * time.Second):
		t.Fatalf("sheaf %s did not return within 20 s", strings.Join(args, " "))
		return "", "", 0
	}
}

const hostileSheet = "title: tie\nP [kN] = 30 kN\nA [mm^2] = 314 mm^2\nsigma [MPa] = P / A\ncheck stress: sigma <= 235 MPa\n"

// hostileProject makes a project with a good sheet, a case table and the
// special files of the test (made by mkSpecial: a FIFO where the system
// has them), and changes into it.
func hostileProject(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"sheaf.root":      "",
		"ok.sheaf":        hostileSheet,
		"ok.csv":          "P [kN]\n30\n40\n",
		"uses-pipe.sheaf": "use t from \"pipe.sheaf\"\nx [kN] = t.P\n",
		"uses-big.sheaf":  "use t from \"big.sheaf\"\nx [kN] = t.P\n",
		"uses-zero.sheaf": "use t from \"zero.sheaf\"\nx [kN] = t.P\n",
		"uses-dir.sheaf":  "use t from \"folder.sheaf\"\nx [kN] = t.P\n",
		"zero.sheaf":      "->/dev/zero",
	})
	if err := os.Mkdir(filepath.Join(dir, "folder.sheaf"), 0o755); err != nil {
		t.Fatal(err)
	}
	// A sparse file of 2 GB: nothing may read it whole.
	big, err := os.Create(filepath.Join(dir, "big.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	if err := big.Truncate(2 << 30); err != nil {
		t.Skipf("no sparse files here: %v", err)
	}
	big.Close()
	if err := os.Link(filepath.Join(dir, "big.sheaf"), filepath.Join(dir, "big.csv")); err != nil {
		t.Fatal(err)
	}
	mkSpecial(t, filepath.Join(dir, "pipe.sheaf"))
	mkSpecial(t, filepath.Join(dir, "pipe.csv"))
	t.Chdir(dir)
	return dir
}

// TestSpecialFiles: a FIFO, a device, a folder or a file above the size
// limit, given to any command or reached as a template, is a clear error
// in bounded time, and nothing is written.
func TestSpecialFiles(t *testing.T) {
	goldDir, err := filepath.Abs(filepath.Join("testdata", "hostile"))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat("/dev/zero"); err != nil {
		t.Skip("no /dev/zero here")
	}
	hostileProject(t)
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"run-fifo", []string{"run", "pipe.sheaf"}},
		{"check-fifo", []string{"check", "pipe.sheaf"}},
		{"export-fifo", []string{"export", "pipe.sheaf", "-o", "out.xlsx"}},
		{"fmt-fifo", []string{"fmt", "pipe.sheaf"}},
		{"diff-fifo", []string{"diff", "pipe.sheaf", "ok.sheaf"}},
		{"new-fifo", []string{"new", "pipe.sheaf", "out.sheaf"}},
		{"batch-fifo-sheet", []string{"batch", "pipe.sheaf", "ok.csv"}},
		{"batch-fifo-table", []string{"batch", "ok.sheaf", "pipe.csv"}},
		{"watch-fifo", []string{"watch", "pipe.sheaf"}},
		{"template-fifo", []string{"run", "uses-pipe.sheaf"}},
		{"run-device", []string{"run", "/dev/zero"}},
		{"fmt-device", []string{"fmt", "/dev/zero"}},
		{"diff-device", []string{"diff", "/dev/zero", "ok.sheaf"}},
		{"new-device", []string{"new", "/dev/zero", "out.sheaf"}},
		{"batch-device", []string{"batch", "ok.sheaf", "/dev/zero"}},
		{"template-device-link", []string{"run", "uses-zero.sheaf"}},
		{"run-folder", []string{"run", "folder.sheaf"}},
		{"fmt-folder", []string{"fmt", "folder.sheaf"}},
		{"template-folder", []string{"check", "uses-dir.sheaf"}},
		{"run-big", []string{"run", "big.sheaf"}},
		{"fmt-big", []string{"fmt", "big.sheaf"}},
		{"diff-big", []string{"diff", "ok.sheaf", "big.sheaf"}},
		{"new-big", []string{"new", "big.sheaf", "out.sheaf"}},
		{"batch-big", []string{"batch", "ok.sheaf", "big.csv"}},
		{"watch-big", []string{"watch", "big.sheaf"}},
		{"template-big", []string{"run", "uses-big.sheaf"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := sheafWithin(t, tc.args...)
			if code != exitInput {
				t.Errorf("exit %d, want %d", code, exitInput)
			}
			golden.Check(t, filepath.Join(goldDir, tc.name+".golden"), []byte(transcript(out, errs, code)), *update)
			for _, p := range []string{"out.xlsx", "out.sheaf"} {
				if _, err := os.Lstat(p); err == nil {
					t.Errorf("%s was written", p)
				}
			}
		})
	}
}

// TestNothingOverwritten: no command writes over a file it reads.
func TestNothingOverwritten(t *testing.T) {
	goldDir, err := filepath.Abs(filepath.Join("testdata", "hostile"))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"sheaf.root":        "",
		"ok.sheaf":          hostileSheet,
		"cases.csv":         "P [kN]\n30\n40\n",
		"uses.sheaf":        "use t from \"lib/rod.xlsx\"\nx [kN] = t.P\n",
		"lib/rod.xlsx":      hostileSheet, // a template with an odd name
		"link-to-cases.csv": "->cases.csv",
	})
	if err := os.Link(filepath.Join(dir, "cases.csv"), filepath.Join(dir, "hard.csv")); err != nil {
		t.Fatal(err)
	}
	t.Chdir(dir)
	before := map[string][]byte{}
	for _, p := range []string{"ok.sheaf", "cases.csv", "uses.sheaf", "lib/rod.xlsx"} {
		before[p], _ = os.ReadFile(p)
	}
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"batch-out-cases", []string{"batch", "ok.sheaf", "cases.csv", "--out", "cases.csv"}},
		{"batch-out-cases-link", []string{"batch", "ok.sheaf", "cases.csv", "--out", "link-to-cases.csv"}},
		{"batch-out-cases-hard-link", []string{"batch", "ok.sheaf", "hard.csv", "--out", "cases.csv"}},
		{"batch-out-template", []string{"batch", "uses.sheaf", "cases.csv", "--out", "lib/../lib/rod.xlsx"}},
		{"export-over-template", []string{"export", "uses.sheaf", "-o", "lib/rod.xlsx"}},
		{"new-over-template", []string{"new", "ok.sheaf", "./ok.sheaf", "--force"}},
		{"new-over-used-template", []string{"new", "uses.sheaf", "lib/rod.xlsx", "--force"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := sheafWithin(t, tc.args...)
			if code != exitInput {
				t.Errorf("exit %d, want %d", code, exitInput)
			}
			golden.Check(t, filepath.Join(goldDir, tc.name+".golden"), []byte(transcript(out, errs, code)), *update)
			for p, b := range before {
				if now, _ := os.ReadFile(p); !bytes.Equal(now, b) {
					t.Errorf("%s changed", p)
				}
			}
			if fi, err := os.Lstat("link-to-cases.csv"); err != nil || fi.Mode()&os.ModeSymlink == 0 {
				t.Error("the link was replaced")
			}
		})
	}
}

// TestFmtSafe: fmt formats the file a link leads to and keeps the link,
// and leaves alone a file edited while it was formatted.
func TestFmtSafe(t *testing.T) {
	dir := t.TempDir()
	const messy = "title: t\nP [kN]=30 kN\n"
	writeFiles(t, dir, map[string]string{"real.sheaf": messy, "link.sheaf": "->real.sheaf", "edited.sheaf": messy})
	t.Chdir(dir)

	if _, errs, code := sheafWithin(t, "fmt", "link.sheaf"); code != exitOK {
		t.Fatalf("fmt link: exit %d %s", code, errs)
	}
	if fi, err := os.Lstat("link.sheaf"); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Error("fmt replaced the link with a file")
	}
	if b, _ := os.ReadFile("real.sheaf"); string(b) == messy {
		t.Error("fmt did not format the file the link leads to")
	}

	const edit = "title: t\nP [kN]=31 kN\n"
	var out, errb bytes.Buffer
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, beforeReplace: func(p string) {
		if err := os.WriteFile(p, []byte(edit), 0o644); err != nil {
			t.Error(err)
		}
	}}
	err := runFmt(a, &fmtOptions{}, []string{"edited.sheaf"})
	if exitCode(err) != exitInput || !strings.Contains(errb.String(), "edited.sheaf changed while it was being formatted, so it was left as it is; run sheaf fmt again") {
		t.Errorf("exit %d, stderr %q", exitCode(err), errb.String())
	}
	if b, _ := os.ReadFile("edited.sheaf"); string(b) != edit {
		t.Errorf("the edit made meanwhile is lost: %q", b)
	}
	if es, _ := os.ReadDir("."); len(es) != 3 {
		t.Errorf("left behind: %v", es)
	}
}
