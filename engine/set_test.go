package engine_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// TestSetText: --set reaches an input, a field of a record input and an
// input of a template, checks the dimension of what it is given, and
// refuses what it cannot set with a reason.
func TestSetText(t *testing.T) {
	src := "steel = {E: 210 GPa, f_y: 355 MPa}\nA [mm^2] = 100 mm^2\nP [kN] = 10 kN\nN_Rd [kN] = A * steel.f_y\nfy2 = steel\n"
	s, err := engine.Compile("t.sheaf", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, text string
		err        string  // part of the error; "" for none
		nRd        float64 // N_Rd in N after the set
	}{
		// Source: N_Rd = A·f_y, by hand: 100 mm² × 460 MPa = 46 kN.
		{"steel.f_y", "460 MPa", "", 46e3},
		{"steel.f_y", "460MPa", "", 46e3},
		{"steel.E", "200 GPa", "", 35.5e3},
		{"P", "45 kN", "", 35.5e3},
		{"steel.f_y", "460 mm", "must be a stress", 0},
		{"steel.fy", "460 MPa", "did you mean `steel.f_y`?", 0},
		{"A.x", "1", "not a record", 0},
		{"fy2.f_y", "460 MPa", "only inputs can be set", 0},
		{"nosuch.f_y", "1", "has no cell", 0},
	}
	for _, c := range cases {
		t.Run(c.name+"="+c.text, func(t *testing.T) {
			st := s.NewState()
			err := st.SetText(c.name, c.text)
			if c.err != "" {
				if err == nil || !strings.Contains(err.Error(), c.err) {
					t.Fatalf("error %v, want one with %q", err, c.err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			st.Recompute()
			v, ok := st.Value("N_Rd")
			if !ok || math.Abs(v.(float64)-c.nRd) > 1e-9*c.nRd {
				t.Errorf("N_Rd = %v, want %g N", v, c.nRd)
			}
		})
	}
	// Two fields of one record both stick.
	st := s.NewState()
	if err := st.SetText("steel.f_y", "460 MPa"); err != nil {
		t.Fatal(err)
	}
	if err := st.SetText("steel.E", "200 GPa"); err != nil {
		t.Fatal(err)
	}
	st.Recompute()
	if v, _ := st.Value("N_Rd"); math.Abs(v.(float64)-46e3) > 1e-6 {
		t.Errorf("after two field sets N_Rd = %v N, want 46000", v)
	}
}

// TestLimitsStopLoading: a source over the byte or line limit is refused
// with one diagnostic, before it is parsed or checked (the errors in its
// lines are not reported).
func TestLimitsStopLoading(t *testing.T) {
	src := []byte("a = 1 +\nb = nosuch\nc = 2 m + 3 s\nd = 4\n")
	cases := []struct {
		name string
		opts []engine.Option
		want string
	}{
		{"bytes", []engine.Option{engine.WithMaxBytes(10)}, fmt.Sprintf("sheet is too large: %d bytes, the limit is 10", len(src))},
		{"lines", []engine.Option{engine.WithMaxLines(3)}, "sheet has too many lines: more than 3"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := engine.Compile("t.sheaf", src, c.opts...)
			var list diag.List
			if !errors.As(err, &list) || len(list) != 1 || !strings.Contains(list[0].Summary, c.want) || !strings.Contains(list[0].Hint, "--max-") {
				t.Fatalf("error %v, want only %q with a hint naming the flag", err, c.want)
			}
		})
	}
	if _, err := engine.Compile("t.sheaf", []byte("a = 1\nb = 2\nc = 3\n"), engine.WithMaxLines(3)); err != nil {
		t.Errorf("3 lines at a limit of 3: %v", err)
	}
}
