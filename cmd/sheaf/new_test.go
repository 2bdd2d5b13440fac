package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// TestNewFromEveryTemplate starts a sheet from each template in sheets/
// and compares it with testdata/new/<name>.golden; fromTemplate itself
// requires the copy to evaluate as the template does.
func TestNewFromEveryTemplate(t *testing.T) {
	golden0, err := filepath.Abs(filepath.Join("testdata", "new"))
	if err != nil {
		t.Fatal(err)
	}
	tmp := t.TempDir()
	t.Chdir("../..") // the library is found from the working directory up
	files, _ := filepath.Glob("sheets/*.sheaf")
	if len(files) == 0 {
		t.Fatal("no templates")
	}
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".sheaf")
		out := filepath.Join(tmp, name+".sheaf")
		if src, _ := os.ReadFile(f); strings.Contains("\n"+string(src), "\nuse ") {
			// A template that uses templates cannot be copied out of the
			// project (TestNewFromTemplateThatUses covers the copy inside).
			if _, errs, code := sheaf(t, "new", name, out); code != exitInput || !strings.Contains(errs, "leaves the project root") {
				t.Errorf("%s: copy outside the project: exit %d, %s", name, code, errs)
			}
			continue
		}
		// --date makes the copy the same on every day (the golden file).
		stdout, errs, code := sheaf(t, "new", "--date", "2026-03-14", name, out)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", name, code, errs)
		}
		if !strings.HasPrefix(stdout, "wrote "+out+" from sheets/"+name+".sheaf: ") {
			t.Errorf("%s: stdout %q", name, stdout)
		}
		got, err := os.ReadFile(out)
		if err != nil {
			t.Fatal(err)
		}
		golden.Check(t, filepath.Join(golden0, name+".golden"), got, *update)
		if strings.Contains(string(got), "date:") && !strings.Contains(string(got), " 2026-03-14\n") {
			t.Errorf("%s: the date is not the one --date gives", name)
		}
		// Refuses to overwrite; --force does, with the same bytes.
		if _, errs, code := sheaf(t, "new", name, out); code != exitInput || !strings.Contains(errs, "already exists") {
			t.Errorf("%s: overwrite: exit %d, %s", name, code, errs)
		}
		if _, errs, code := sheaf(t, "new", "--force", "--date", "2026-03-14", f, out); code != exitOK {
			t.Errorf("%s: --force: exit %d, %s", name, code, errs)
		}
		if again, _ := os.ReadFile(out); string(again) != string(got) {
			t.Errorf("%s: a second run gives other bytes", name)
		}
	}
	for _, tc := range []struct{ name, want string }{
		{"mezzanine-hangar", `did you mean "mezzanine-hanger"?`},
		{"nothing-like-it-at-all", "the templates are:"},
	} {
		if _, errs, code := sheaf(t, "new", tc.name, filepath.Join(tmp, "x.sheaf")); code != exitInput || !strings.Contains(errs, tc.want) {
			t.Errorf("%s: exit %d, stderr %q, want %q", tc.name, code, errs, tc.want)
		}
	}
	if _, errs, code := sheaf(t, "new", "--library", tmp, "x", filepath.Join(tmp, "y.sheaf")); code != exitInput || !strings.Contains(errs, "not found") {
		t.Errorf("empty library: exit %d, %s", code, errs)
	}
}

// TestNewDate: without --date the new sheet gets the day's date (from the
// clock, fixed here); a --date that is not YYYY-MM-DD is refused.
func TestNewDate(t *testing.T) {
	t.Chdir("../..")
	tmp := t.TempDir()
	var out, errb strings.Builder
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	o := &newOptions{now: func() time.Time { return time.Date(2026, 12, 2, 9, 30, 0, 0, time.UTC) }}
	dst := filepath.Join(tmp, "today.sheaf")
	if err := runNew(a, o, "mezzanine-hanger", dst); err != nil {
		t.Fatal(err)
	}
	got, _ := os.ReadFile(dst)
	if !strings.Contains(string(got), "\ndate:") || !strings.Contains(string(got), " 2026-12-02\n") {
		t.Errorf("the new sheet is not dated 2026-12-02:\n%s", got)
	}
	for _, bad := range []string{"14.03.2026", "2026-13-01", "today"} {
		if _, errs, code := sheaf(t, "new", "--date", bad, "mezzanine-hanger", filepath.Join(tmp, "x.sheaf")); code != exitInput || !strings.Contains(errs, "YYYY-MM-DD") {
			t.Errorf("--date %s: exit %d, %s", bad, code, errs)
		}
	}
}
