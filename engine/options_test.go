package engine_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestOptions: each load option changes what a sheet may hold or how its
// values are shown. The limits are the options' own; 12.345 kN to 2 and
// 4 significant figures is rounding half away from zero (common practice).
func TestOptions(t *testing.T) {
	src := "P [kN] = 12.345 kN\nQ [kN] = ((((P))))\nR [kN] = P + Q\n"
	bad := []struct {
		name string
		opt  engine.Option
		msg  string
	}{
		{"cells", engine.WithMaxCells(2), "t.sheaf:3:1: too many cells"},
		{"depth", engine.WithMaxDepth(3), "t.sheaf:2:13: expression nested too deeply"},
	}
	for _, c := range bad {
		_, err := engine.Compile("t.sheaf", []byte(src), c.opt)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.msg)
		}
	}
	for _, c := range []struct {
		sig  int
		want string
	}{{2, "12 kN"}, {4, "12.35 kN"}} {
		s, err := engine.Compile("t.sheaf", []byte(src), engine.WithSigFigs(c.sig))
		if err != nil {
			t.Fatal(err)
		}
		if got := s.NewState().Eval().Cell("P").Text; got != c.want {
			t.Errorf("WithSigFigs(%d): P shows %q, want %q", c.sig, got, c.want)
		}
	}
}

// TestReset: an input set and then reset takes its written value again.
func TestReset(t *testing.T) {
	s := compile(t, chain)
	st := s.NewState()
	if err := st.Set("P", 20e3); err != nil {
		t.Fatal(err)
	}
	if st.Sheet() != s {
		t.Error("State.Sheet is not the sheet it came from")
	}
	// Source: the chain sheet above, a = 2 P with P = 20 kN, then 10 kN as written.
	if got := st.Eval().Cell("a").SI; got != 40e3 {
		t.Errorf("a = %g after P = 20 kN, want 40000", got)
	}
	if err := st.Reset("P"); err != nil {
		t.Fatal(err)
	}
	if got := st.Eval().Cell("a").SI; got != 20e3 {
		t.Errorf("a = %g after reset, want 20000", got)
	}
	if err := st.Reset("a"); err == nil || !strings.Contains(err.Error(), "only inputs can be set") {
		t.Errorf("reset of a derived cell: %v", err)
	}
}

// TestMaxEvalSteps: the evaluation budget is an option; a function that
// doubles its work at each of 12 levels (about 8,000 steps) passes the
// default and is refused under a budget of 1,000.
func TestMaxEvalSteps(t *testing.T) {
	var b strings.Builder
	b.WriteString("f0(x) = x + 1\n")
	for i := 1; i <= 12; i++ {
		fmt.Fprintf(&b, "f%d(x) = f%d(x) + f%d(x)\n", i, i-1, i-1)
	}
	b.WriteString("y = f12(2)\n")
	if _, err := engine.Compile("t.sheaf", []byte(b.String())); err != nil {
		t.Fatalf("default budget: %v", err)
	}
	_, err := engine.Compile("t.sheaf", []byte(b.String()), engine.WithMaxEvalSteps(1000))
	if err == nil || !strings.Contains(err.Error(), "too costly to evaluate") {
		t.Fatalf("budget 1000: %v", err)
	}
}
