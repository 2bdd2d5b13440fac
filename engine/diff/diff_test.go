package diff_test

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diff"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden files")

func run(t *testing.T, name string) *engine.Results {
	t.Helper()
	s, err := engine.Load(filepath.Join("testdata", name))
	if err != nil {
		t.Fatal(err)
	}
	return s.Run(nil)
}

func TestCompare(t *testing.T) {
	old, cur := run(t, "old.sheaf"), run(t, "new.sheaf")
	r := diff.Compare("old.sheaf", old, "new.sheaf", cur, diff.Options{})
	var txt, js bytes.Buffer
	if err := r.WriteText(&txt); err != nil {
		t.Fatal(err)
	}
	if err := r.WriteJSON(&js); err != nil {
		t.Fatal(err)
	}
	golden.Check(t, filepath.Join("testdata", "old-new.golden"), txt.Bytes(), *update)
	golden.Check(t, filepath.Join("testdata", "old-new.json.golden"), js.Bytes(), *update)
	var back diff.Report
	if err := json.Unmarshal(js.Bytes(), &back); err != nil {
		t.Fatalf("the JSON does not read back: %v", err)
	}
	// Determinism: a second comparison of fresh runs gives the same bytes.
	var again bytes.Buffer
	if err := diff.Compare("old.sheaf", run(t, "old.sheaf"), "new.sheaf", run(t, "new.sheaf"), diff.Options{}).WriteText(&again); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(again.Bytes(), txt.Bytes()) {
		t.Error("two comparisons differ")
	}

	// What the report must say, independent of layout.
	// P 22 → 31 kN: A = π·16²/4 = 201.06 mm², N_Rd = 47.25 kN, so the
	// strength check stays ok (65.6 %); u = 31e3·3.5/(210e9·201.06e-6) =
	// 2.57 mm against L/500 = 7 mm stays ok; the new slenderness check
	// 3.5 m against 200·16 mm = 3.2 m fails (109 %).
	// Source: common practice (N = A·f_y, u = P·L/(E·A)).
	if len(r.Inputs) != 1 || r.Inputs[0].Name != "P" || r.Inputs[0].Rel == nil || !near(*r.Inputs[0].Rel, 9.0/22) {
		t.Errorf("inputs: %+v", r.Inputs)
	}
	if len(r.Formulas) != 1 || r.Formulas[0].Name != "N_Rd" {
		t.Errorf("formulas: %+v", r.Formulas)
	}
	if len(r.Added) != 2 || r.Added[0].Name != "gamma_M0" || r.Added[1].Name != "slender" {
		t.Errorf("added: %+v", r.Added)
	}
	if len(r.Removed) != 1 || r.Removed[0].Name != "note" {
		t.Errorf("removed: %+v", r.Removed)
	}
	if r.Flipped != 1 {
		t.Errorf("%d checks flipped to fail, want 1 (slender)", r.Flipped)
	}
	for _, c := range r.Results {
		if c.Name == "N_Rd" || c.Name == "A" {
			t.Errorf("%s did not change but is listed", c.Name)
		}
	}
}

func near(a, b float64) bool { return a-b < 1e-12 && b-a < 1e-12 }

// TestSameAfterFormat: a sheet and its canonical layout compare equal.
func TestSameAfterFormat(t *testing.T) {
	path := filepath.Join("testdata", "old.sheaf")
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	out, err := sheet.FormatSource(path, src)
	if err != nil {
		t.Fatal(err)
	}
	s2, err := engine.Compile("formatted", out)
	if err != nil {
		t.Fatal(err)
	}
	r := diff.Compare("a", run(t, "old.sheaf"), "b", s2.Run(nil), diff.Options{})
	if !r.Empty() {
		var b bytes.Buffer
		_ = r.WriteText(&b)
		t.Errorf("a reformatted sheet shows changes:\n%s", b.String())
	}
}

// TestTolerance: a change below the tolerance is not a change.
func TestTolerance(t *testing.T) {
	s, err := engine.Load(filepath.Join("testdata", "old.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	a := s.Run(nil)
	b := s.Run(map[string]any{"P": 22e3 * (1 + 1e-9)})
	for _, tc := range []struct {
		tol             float64
		results, checks int
	}{{1e-6, 0, 0}, {1e-12, 1, 2}} {
		r := diff.Compare("a", a, "b", b, diff.Options{RelTol: tc.tol})
		if len(r.Results) != tc.results || len(r.Checks) != tc.checks {
			t.Errorf("rtol %g: %d results and %d checks changed, want %d and %d (u and both utilisations move by 1e-9)",
				tc.tol, len(r.Results), len(r.Checks), tc.results, tc.checks)
		}
		if len(r.Inputs) != 1 {
			t.Errorf("rtol %g: an input set to another value is a change: %+v", tc.tol, r.Inputs)
		}
	}
}
