package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/internal/golden"
)

// TestCombinationsGolden: the table of every combination of the bundled
// sheet with actions.
func TestCombinationsGolden(t *testing.T) {
	t.Chdir("../..")
	out, errs, code := sheaf(t, "run", "--combinations", "sheets/canopy-hanger.sheaf")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	golden.Check(t, filepath.Join("cmd", "sheaf", "testdata", "combos", "canopy-hanger.combinations.txt"), []byte(out), *update)
}

// TestBatchWithActions: a case table that changes a characteristic value
// gives, per row, the governing utilisation that `sheaf run --set` gives.
func TestBatchWithActions(t *testing.T) {
	t.Chdir("../..")
	csv := filepath.Join(t.TempDir(), "snow.csv")
	if err := os.WriteFile(csv, []byte("q_k [kN/m^2], d [mm]\n1.2, 16\n2.5, 16\n0.4, 12\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := sheaf(t, "batch", "sheets/canopy-hanger.sheaf", csv, "--sig", "12")
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
		args := []string{"run", "--json", "sheets/canopy-hanger.sheaf"}
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
	out, _, code = sheaf(t, "check", "sheets/canopy-hanger.sheaf")
	if code != exitOK || out != "ok: 30 cells, 2 checks, 3 actions in 4 combinations of EN 1990 6.10\n" {
		t.Errorf("check of the canopy sheet: exit %d, %q", code, out)
	}
}

// actionLine matches an action line of a sheet: the kind words, the name,
// the unit, the expression and the annotation.
var actionLine = regexp.MustCompile(`^action\s+[A-Za-z ]+?\s+([A-Za-z_][A-Za-z0-9_]*)\s*(\[[^\]]*\])?\s*=\s*(.*?)(\s+--.*)?$`)

// TestEnvelopeOverSeparateRuns: for every bundled sheet with actions, the
// governing utilisation of each check equals the largest of separate
// `sheaf run --set` runs, one per combination, of the same sheet with its
// actions written as plain cells scaled by a factor set to that
// combination's (γ·ψ); and each check's utilisation in each combination
// equals that run's. Source: EN 1990 6.3.2 (the design value of an action
// is its characteristic value times its factors); the runs without actions
// are the reference.
func TestEnvelopeOverSeparateRuns(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("sheets/*.sheaf")
	if err != nil {
		t.Fatal(err)
	}
	// Every bundled sheet without actions, in a folder of its own: each
	// action a cell scaled by an input factor, no combination rules, no
	// limit states. A template's actions are rewritten alike, and a use
	// block that replaces one replaces its characteristic value.
	plainDir := t.TempDir()
	acts := map[string]map[string]bool{} // per file: the names of its actions
	for _, path := range files {
		src, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		acts[filepath.Base(path)] = map[string]bool{}
		for _, line := range strings.Split(string(src), "\n") {
			if m := actionLine.FindStringSubmatch(line); m != nil {
				acts[filepath.Base(path)][m[1]] = true
			}
		}
	}
	for _, path := range files {
		src, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		var out []string
		var used map[string]bool // the actions of the template of the use block at hand
		for _, line := range strings.Split(string(src), "\n") {
			if m := useLine.FindStringSubmatch(line); m != nil {
				used = acts[m[1]]
			} else if line == "" || line[0] != ' ' {
				used = nil
			}
			switch {
			case strings.HasPrefix(line, "combinations:"):
				continue
			case strings.HasPrefix(line, "action "):
				m := actionLine.FindStringSubmatch(line)
				if m == nil {
					t.Fatalf("cannot read the action line %q", line)
				}
				out = append(out, m[1]+"_char "+m[2]+" = "+m[3]+m[4], "fac_"+m[1]+" = 1", m[1]+" "+m[2]+" = fac_"+m[1]+" * "+m[1]+"_char")
				continue
			case strings.HasPrefix(line, "check "):
				line = checkIn.ReplaceAllString(line, "check $1:")
			case used != nil:
				if m := overrideLine.FindStringSubmatch(line); m != nil && used[m[2]] {
					line = m[1] + m[2] + "_char" + m[3]
				}
			}
			out = append(out, line)
		}
		if err := os.WriteFile(filepath.Join(plainDir, filepath.Base(path)), []byte(strings.Join(out, "\n")), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	tested := 0
	for _, path := range files {
		s, err := engine.Load(path)
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		cs := s.Combos()
		if cs == nil {
			continue
		}
		tested++
		t.Run(filepath.Base(path), func(t *testing.T) {
			plain := filepath.Join(plainDir, filepath.Base(path))
			r := s.Run(nil)
			utils := make([]map[string]*float64, len(cs.All)) // per combination: each check's utilisation
			for m, c := range cs.All {
				args := []string{"run", "--json", "--draft", plain}
				for a, act := range cs.Actions {
					dot := strings.LastIndex(act.Name, ".") + 1 // a template's action: access.g_k is access.fac_g_k
					args = append(args, "--set", act.Name[:dot]+"fac_"+act.Name[dot:]+"="+strconv.FormatFloat(c.Factors[a], 'g', -1, 64))
				}
				js, errs, code := sheaf(t, args...)
				if code != exitOK && code != exitChecks {
					t.Fatalf("%s: exit %d\n%s", strings.Join(args, " "), code, errs)
				}
				var doc struct {
					Checks []struct {
						Name string   `json:"name"`
						Util *float64 `json:"utilisation"`
					} `json:"checks"`
				}
				if err := json.Unmarshal([]byte(js), &doc); err != nil {
					t.Fatal(err)
				}
				utils[m] = map[string]*float64{}
				for _, ch := range doc.Checks {
					utils[m][ch.Name] = ch.Util
				}
			}
			for _, ch := range r.Checks {
				if ch.Combo == nil {
					continue
				}
				best, bestAt := math.Inf(-1), ""
				for m, c := range cs.All {
					if c.State != ch.Combo.State {
						continue
					}
					u := utils[m][ch.Cell.Name]
					if u == nil {
						t.Fatalf("%s in %s: the run without actions cannot assess it", ch.Cell.Name, c.Name)
					}
					if got := ch.Combo.Utils[m]; math.Abs(got-*u) > 1e-9*math.Max(1, math.Abs(*u)) {
						t.Errorf("%s in %s: %.12g, by --set %.12g", ch.Cell.Name, c.Name, got, *u)
					}
					if *u > best {
						best, bestAt = *u, c.Name
					}
				}
				if math.Abs(ch.Util-best) > 1e-9*math.Max(1, best) || ch.Combo.Governing != bestAt {
					t.Errorf("%s: governing %s at %.12g; the largest of the separate runs is %s at %.12g", ch.Cell.Name, ch.Combo.Governing, ch.Util, bestAt, best)
				}
				t.Logf("%s: governs %s = %s at %.6g, the largest of %d runs", ch.Cell.Name, ch.Combo.Governing, ch.Combo.Text, ch.Util, ch.Combo.Evaluated)
			}
		})
	}
	if tested < 5 {
		t.Errorf("%d bundled sheets with actions; of the five converted ones some are missing", tested)
	}
}

// useLine matches a use line and its template's file name.
var useLine = regexp.MustCompile(`^use\s+[A-Za-z_][A-Za-z0-9_]*\s+from\s+"(?:[^"]*/)?([^"/]+)"`)

// overrideLine matches a line of a use block: indentation, name, the rest.
var overrideLine = regexp.MustCompile(`^(\s+)([A-Za-z_][A-Za-z0-9_]*)(\s*(?:\[[^\]]*\])?\s*=.*)$`)

// checkIn matches the limit state of a check line.
var checkIn = regexp.MustCompile(`^check\s+([A-Za-z_][A-Za-z0-9_]*)\s+in\s+[a-z-]+\s*:`)
