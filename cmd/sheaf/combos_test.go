package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// TestCombinationsGolden: the table of every combination of the bundled
// sheet with actions.
func TestCombinationsGolden(t *testing.T) {
	t.Chdir("../..")
	out, errs, code := sheaf(t, "run", "--combinations", "testdata/actions/canopy-hanger.sheaf")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	golden.Check(t, filepath.Join("testdata", "actions", "canopy-hanger.combinations.txt"), []byte(out), *update)
}

// TestBatchWithActions: a case table that changes a characteristic value
// gives, per row, the governing utilisation that `sheaf run --set` gives.
func TestBatchWithActions(t *testing.T) {
	t.Chdir("../..")
	csv := filepath.Join(t.TempDir(), "snow.csv")
	if err := os.WriteFile(csv, []byte("q_k [kN/m^2], d [mm]\n1.2, 16\n2.5, 16\n0.4, 12\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := sheaf(t, "batch", "testdata/actions/canopy-hanger.sheaf", csv, "--sig", "12")
	if code != exitOK && code != exitChecks {
		t.Fatalf("exit %d: %s", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	head := strings.Split(lines[0], ",")
	col := func(name string) int {
		for i, h := range head {
			if strings.HasPrefix(h, name) {
				return i
			}
		}
		t.Fatalf("no column %s in %s", name, lines[0])
		return -1
	}
	cs, cd := col("stress"), col("stretch")
	for k, set := range [][]string{{"q_k=1.2kN/m^2", "d=16mm"}, {"q_k=2.5kN/m^2", "d=16mm"}, {"q_k=0.4kN/m^2", "d=12mm"}} {
		row := strings.Split(lines[k+1], ",")
		args := []string{"run", "--json", "testdata/actions/canopy-hanger.sheaf"}
		for _, s := range set {
			args = append(args, "--set", s)
		}
		js, _, _ := sheaf(t, args...)
		var doc struct {
			Checks []struct {
				Name string   `json:"name"`
				Util *float64 `json:"utilisation"`
			} `json:"checks"`
		}
		if err := json.Unmarshal([]byte(js), &doc); err != nil {
			t.Fatal(err)
		}
		for _, c := range doc.Checks {
			i := map[string]int{"stress": cs, "stretch": cd}[c.Name]
			got, err := strconv.ParseFloat(strings.TrimSuffix(strings.TrimSpace(row[i]), "%"), 64)
			if err != nil || c.Util == nil {
				t.Fatalf("row %d %s: %q %v", k+1, c.Name, row[i], err)
			}
			if math.Abs(got-*c.Util) > 1e-9*math.Max(1, *c.Util) && math.Abs(got/100-*c.Util) > 1e-9 {
				t.Errorf("row %d %s: batch %g, run %g", k+1, c.Name, got, *c.Util)
			}
		}
	}
}

// TestCombinationErrorsGolden renders every mistake of a sheet with actions
// at its place, all of them in one run.
func TestCombinationErrorsGolden(t *testing.T) {
	t.Chdir("../..")
	out, errs, code := sheaf(t, "check", "cmd/sheaf/testdata/combos/broken.sheaf")
	if code != exitInput || out != "" {
		t.Fatalf("exit %d, stdout %q", code, out)
	}
	golden.Check(t, filepath.Join("cmd", "sheaf", "testdata", "combos", "broken.golden"), []byte(errs), *update)
	out, _, code = sheaf(t, "check", "testdata/actions/canopy-hanger.sheaf")
	if code != exitOK || out != "ok: 30 cells, 2 checks, 3 actions in 4 combinations of EN 1990 6.10\n" {
		t.Errorf("check of the canopy sheet: exit %d, %q", code, out)
	}
}
