package engine_test

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestUpdateEqualsResults: results brought up to date with Update after a
// change of inputs are those Results builds from scratch: texts, values,
// checks (verdict, not assessed, governing term) and problems.
func TestUpdateEqualsResults(t *testing.T) {
	src := "P [kN] = 10 kN\nd [m] = 1 m\nN_pl [kN] = 50 kN\nN_b [kN] = 32 kN\nN_Rd [kN] = min(N_pl, N_b)\n" +
		"r = 1 / d\ncheck c: P <= N_Rd\nQ [kN] = 2 * P\n"
	s, err := engine.Compile("t.sheaf", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	st := s.NewState()
	r := st.Eval()
	steps := []map[string]string{
		{"P": "20 kN"},
		{"N_b": "60 kN"}, // the governing term moves to N_pl
		{"d": "0 m"},     // r cannot be computed
		{"P": "-5 kN"},   // c is not assessed
		{"d": "2 m", "P": "70 kN"},
	}
	for k, step := range steps {
		for name, v := range step {
			if err := st.SetText(name, v); err != nil {
				t.Fatal(err)
			}
		}
		st.Recompute()
		st.Update(r, st.Recomputed())
		want := st.Results()
		for i := range want.Cells {
			a, b := r.Cells[i], want.Cells[i]
			if a.Known != b.Known || a.Text != b.Text || (a.Known && a.SI != b.SI) {
				t.Errorf("step %d, %s: updated %q (%v), fresh %q (%v)", k, b.Cell.Name, a.Text, a.SI, b.Text, b.SI)
			}
		}
		for i := range want.Checks {
			a, b := r.Checks[i], want.Checks[i]
			if a.Known != b.Known || a.Pass != b.Pass || a.Governing != b.Governing || (a.Problem == nil) != (b.Problem == nil) {
				t.Errorf("step %d, check %s: updated %+v, fresh %+v", k, b.Cell.Name, a, b)
			}
		}
		if len(r.Problems) != len(want.Problems) || r.Uncomputed() != want.Uncomputed() {
			t.Errorf("step %d: %d problems (%d uncomputed), fresh %d (%d)", k, len(r.Problems), r.Uncomputed(), len(want.Problems), want.Uncomputed())
		}
	}
}
