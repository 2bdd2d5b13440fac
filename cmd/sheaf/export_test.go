package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	xlsxout "github.com/sheafcalc/sheaf/engine/export/xlsx"
)

// TestExportEverySheet exports every sheet under sheets/ and reads each
// workbook back: the tabs are there, the summary carries the caution, and
// every check of the sheet is listed.
func TestExportEverySheet(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("sheets/*.sheaf")
	if err != nil || len(files) == 0 {
		t.Fatalf("no sheets: %v", err)
	}
	dir := t.TempDir()
	for _, file := range files {
		t.Run(filepath.Base(file), func(t *testing.T) {
			out := filepath.Join(dir, strings.TrimSuffix(filepath.Base(file), ".sheaf")+".xlsx")
			stdout, stderr, code := sheaf(t, "export", file, "-o", out)
			if code != exitOK && code != exitChecks {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			if !strings.HasPrefix(stdout, "wrote "+out) {
				t.Errorf("stdout %q", stdout)
			}
			f, err := excelize.OpenFile(out)
			if err != nil {
				t.Fatal(err)
			}
			defer f.Close()
			tabs := strings.Join(f.GetSheetList(), ",")
			if !strings.HasPrefix(tabs, xlsxout.TabSummary+","+xlsxout.TabCalc) {
				t.Errorf("tabs %s", tabs)
			}
			rows, _ := f.GetRows(xlsxout.TabSummary)
			var text strings.Builder
			for _, r := range rows {
				text.WriteString(strings.Join(r, " ") + "\n")
			}
			if src, _ := os.ReadFile(file); strings.Contains(string(src), "\naction ") {
				// A sheet with actions: the Combinations tab, and each
				// check's governing combination on the Summary.
				if !strings.Contains(tabs, xlsxout.TabCombos) {
					t.Errorf("a sheet with actions has no %s tab: %s", xlsxout.TabCombos, tabs)
				}
				if !strings.Contains(text.String(), "governs ") {
					t.Error("the Summary names no governing combination")
				}
			}
			if !strings.Contains(text.String(), xlsxout.Caution) {
				t.Error("no caution on the summary")
			}
			src, _ := os.ReadFile(file)
			for _, line := range strings.Split(string(src), "\n") {
				if name, ok := strings.CutPrefix(line, "check "); ok {
					name, _, _ = strings.Cut(name, ":")
					name, _, _ = strings.Cut(name, " in ") // its limit state
					if !strings.Contains(text.String(), "\n"+strings.TrimSpace(name)+" ") {
						t.Errorf("check %s missing from the summary", name)
					}
				}
			}
		})
	}
}

func TestExportErrors(t *testing.T) {
	t.Chdir("../..")
	dir := t.TempDir()
	cases := []struct {
		args []string
		code int
		msg  string
	}{
		{[]string{"export", "sheets/mezzanine-hanger.sheaf", "-o", filepath.Join(dir, "x.xls")}, exitInput, "needs the extension .xlsx"},
		{[]string{"export", "sheets/mezzanine-hanger.sheaf", "-o", filepath.Join(dir, "none", "x.xlsx")}, exitInput, "cannot write"},
		{[]string{"export", "sheets/mezzanine-hanger.sheaf", "-o", filepath.Join(dir, "y.xlsx"), "--set", "dd=3 mm"}, exitInput, "did you mean"},
		{[]string{"export", "sheets/no-such.sheaf", "-o", filepath.Join(dir, "z.xlsx")}, exitInput, "no such file"},
	}
	for _, c := range cases {
		_, stderr, code := sheaf(t, c.args...)
		if code != c.code || !strings.Contains(stderr, c.msg) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, stderr, c.code, c.msg)
		}
	}
	// A failing check still writes the workbook and exits 1.
	out := filepath.Join(dir, "fail.xlsx")
	_, stderr, code := sheaf(t, "export", "sheets/mezzanine-hanger.sheaf", "-o", out, "--set", "delta_lim=0.1 mm")
	if code != exitChecks || !strings.Contains(stderr, "the workbook shows them") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	if _, err := os.Stat(out); err != nil {
		t.Errorf("no workbook written: %v", err)
	}
}

// TestIsPlaceholder: the header values export warns about (they would
// reach the client's summary as written) and values it leaves alone.
func TestIsPlaceholder(t *testing.T) {
	for _, c := range []struct {
		v    string
		want bool
	}{
		{"YYYY-MM-DD", true}, {"yyyy-mm-dd", true}, {"DD-MM-YYYY", true}, {"<name>", true}, {"TODO", true},
		{"rev TBD", true}, {"XXX", true},
		{"2026-03-14", false}, {"", false}, {"A. Engineer", false}, {"Todd", false}, {"B", false}, {"MM Smith", false},
	} {
		if got := isPlaceholder(c.v); got != c.want {
			t.Errorf("isPlaceholder(%q) = %v, want %v", c.v, got, c.want)
		}
	}
}
