package combine

import (
	"math"
	"strings"
	"testing"
)

// want is one expected combination: the clause it follows and the factor
// of every action, in the order of the actions.
type want struct {
	clause  string
	factors []float64
}

// Factors used in the hand-written lists below, each with its source.
const (
	gSup  = 1.35        // γG,sup: EN 1990 Table A1.2(B) (REFERENCES D7)
	gInf  = 1.00        // γG,inf: EN 1990 Table A1.2(B) (D7)
	gQ    = 1.5         // γQ: EN 1990 Table A1.2(B) (D7)
	xiSup = 0.85 * 1.35 // ξ·γG,sup of (6.10b): EN 1990 Table A1.2(B) (D7)
	q0B   = 1.5 * 0.7   // γQ·ψ0, imposed B: ψ0 0.7, EN 1990 Table A1.1 (D6)
	s0    = 1.5 * 0.5   // γQ·ψ0, snow at or below 1000 m: ψ0 0.5, Table A1.1 (D6)
	w0    = 1.5 * 0.6   // γQ·ψ0, wind: ψ0 0.6, Table A1.1 (D6)
)

var (
	g   = Action{Name: "G", Class: Permanent}
	gf  = Action{Name: "G", Class: Permanent, Favourable: true}
	qB  = Action{Name: "Q", Class: Imposed, Category: 'B'}
	sn  = Action{Name: "S", Class: Snow}
	wi  = Action{Name: "W", Class: Wind}
	dL  = Action{Name: "L", Class: Imposed} // L of ASCE/SEI 7: no category of EN 1990
	dD  = Action{Name: "D", Class: Permanent}
	thm = Action{Name: "T", Class: Thermal}
)

func TestCombinations(t *testing.T) {
	tests := []struct {
		name  string
		rules string
		state string
		acts  []Action
		want  []want
	}{
		{"EN 1990 6.10, G + Q (imposed B) + S", "EN 1990 6.10", ULS, []Action{g, qB, sn}, []want{
			{"EN 1990 (6.10)", []float64{gSup, 0, 0}},    // G only
			{"EN 1990 (6.10)", []float64{gSup, gQ, 0}},   // Q leading
			{"EN 1990 (6.10)", []float64{gSup, gQ, s0}},  // Q leading, S accompanying
			{"EN 1990 (6.10)", []float64{gSup, 0, gQ}},   // S leading
			{"EN 1990 (6.10)", []float64{gSup, q0B, gQ}}, // S leading, Q accompanying
		}},
		{"EN 1990 6.10, G favourable too", "EN 1990 6.10", ULS, []Action{gf, qB, sn}, []want{
			{"EN 1990 (6.10)", []float64{gSup, 0, 0}},
			{"EN 1990 (6.10)", []float64{gInf, 0, 0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, 0}},
			{"EN 1990 (6.10)", []float64{gInf, gQ, 0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, s0}},
			{"EN 1990 (6.10)", []float64{gInf, gQ, s0}},
			{"EN 1990 (6.10)", []float64{gSup, 0, gQ}},
			{"EN 1990 (6.10)", []float64{gInf, 0, gQ}},
			{"EN 1990 (6.10)", []float64{gSup, q0B, gQ}},
			{"EN 1990 (6.10)", []float64{gInf, q0B, gQ}},
		}},
		{"EN 1990 6.10a/b, G + Q (imposed B) + S", "EN 1990 6.10a/b", ULS, []Action{g, qB, sn}, []want{
			{"EN 1990 (6.10a)", []float64{gSup, 0, 0}},
			{"EN 1990 (6.10a)", []float64{gSup, q0B, 0}},
			{"EN 1990 (6.10a)", []float64{gSup, 0, s0}},
			{"EN 1990 (6.10a)", []float64{gSup, q0B, s0}},
			{"EN 1990 (6.10b)", []float64{xiSup, gQ, 0}},
			{"EN 1990 (6.10b)", []float64{xiSup, gQ, s0}},
			{"EN 1990 (6.10b)", []float64{xiSup, 0, gQ}},
			{"EN 1990 (6.10b)", []float64{xiSup, q0B, gQ}},
		}},
		{"EN 1990 6.10a/b, G favourable too: γG,inf is not reduced by ξ", "EN 1990 6.10a/b", ULS, []Action{gf, wi}, []want{
			{"EN 1990 (6.10a)", []float64{gSup, 0}},
			{"EN 1990 (6.10a)", []float64{gInf, 0}},
			{"EN 1990 (6.10a)", []float64{gSup, w0}},
			{"EN 1990 (6.10a)", []float64{gInf, w0}},
			{"EN 1990 (6.10b)", []float64{xiSup, gQ}},
			{"EN 1990 (6.10b)", []float64{gInf, gQ}}, // uplift: 1.0 G + 1.5 W
		}},
		// The set: G, Q (imposed B), S (site below 1000 m) and W.
		{"EN 1990 6.10, G + Q + S + W", "EN 1990 6.10", ULS, []Action{g, qB, sn, wi}, []want{
			{"EN 1990 (6.10)", []float64{gSup, 0, 0, 0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, 0, 0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, s0, 0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, 0, w0}},
			{"EN 1990 (6.10)", []float64{gSup, gQ, s0, w0}},
			{"EN 1990 (6.10)", []float64{gSup, 0, gQ, 0}},
			{"EN 1990 (6.10)", []float64{gSup, q0B, gQ, 0}},
			{"EN 1990 (6.10)", []float64{gSup, 0, gQ, w0}},
			{"EN 1990 (6.10)", []float64{gSup, q0B, gQ, w0}},
			{"EN 1990 (6.10)", []float64{gSup, 0, 0, gQ}},
			{"EN 1990 (6.10)", []float64{gSup, q0B, 0, gQ}},
			{"EN 1990 (6.10)", []float64{gSup, 0, s0, gQ}},
			{"EN 1990 (6.10)", []float64{gSup, q0B, s0, gQ}},
		}},
		// Characteristic (6.14b): G + Q1 + Σ ψ0 Qi (EN 1990 6.5.3, from memory).
		{"EN 1990 characteristic", "EN 1990 6.10", Characteristic, []Action{g, qB, sn}, []want{
			{"EN 1990 (6.14b)", []float64{1, 0, 0}},
			{"EN 1990 (6.14b)", []float64{1, 1, 0}},
			{"EN 1990 (6.14b)", []float64{1, 1, 0.5}}, // ψ0 snow 0.5 (D6)
			{"EN 1990 (6.14b)", []float64{1, 0, 1}},
			{"EN 1990 (6.14b)", []float64{1, 0.7, 1}}, // ψ0 imposed B 0.7 (D6)
		}},
		// Frequent (6.15b): G + ψ1 Q1 + Σ ψ2 Qi; ψ2 of snow is 0, so snow
		// never accompanies.
		{"EN 1990 frequent", "EN 1990 6.10", Frequent, []Action{g, qB, sn}, []want{
			{"EN 1990 (6.15b)", []float64{1, 0, 0}},
			{"EN 1990 (6.15b)", []float64{1, 0.5, 0}}, // ψ1 imposed B 0.5 (D6)
			{"EN 1990 (6.15b)", []float64{1, 0, 0.2}}, // ψ1 snow 0.2 (D6)
			{"EN 1990 (6.15b)", []float64{1, 0.3, 0.2}},
		}},
		// Quasi-permanent (6.16b): G + Σ ψ2 Qi.
		{"EN 1990 quasi-permanent", "EN 1990 6.10", QuasiPermanent, []Action{g, qB, sn}, []want{
			{"EN 1990 (6.16b)", []float64{1, 0, 0}},
			{"EN 1990 (6.16b)", []float64{1, 0.3, 0}}, // ψ2 imposed B 0.3 (D6)
		}},
		// EQU, Table A1.2(A): 1.10 / 0.90 / 1.5 (from memory).
		{"EN 1990 EQU", "EN 1990 6.10", EQU, []Action{gf, wi}, []want{
			{"EN 1990 (6.10), Table A1.2(A)", []float64{1.10, 0}},
			{"EN 1990 (6.10), Table A1.2(A)", []float64{0.90, 0}},
			{"EN 1990 (6.10), Table A1.2(A)", []float64{1.10, 1.5}},
			{"EN 1990 (6.10), Table A1.2(A)", []float64{0.90, 1.5}},
		}},
		// ASCE/SEI 7 §2.3.1 (REFERENCES D8) with D, L, W; the row number
		// of the standard in the clause.
		{"ASCE 7 LRFD, D + L + W", "ASCE 7 LRFD", ULS, []Action{dD, dL, wi}, []want{
			{"ASCE/SEI 7 §2.3.1 (1)", []float64{1.4, 0, 0}},
			{"ASCE/SEI 7 §2.3.1 (2)", []float64{1.2, 1.6, 0}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 0, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 1.0, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (5)", []float64{0.9, 0, 1.0}},
		}},
		// The set for §2.3.1: D, L, S, W.
		{"ASCE 7 LRFD, D + L + S + W", "ASCE 7 LRFD", ULS, []Action{dD, dL, sn, wi}, []want{
			{"ASCE/SEI 7 §2.3.1 (1)", []float64{1.4, 0, 0, 0}},
			{"ASCE/SEI 7 §2.3.1 (2)", []float64{1.2, 1.6, 0, 0}},
			{"ASCE/SEI 7 §2.3.1 (2)", []float64{1.2, 1.6, 0.5, 0}},
			{"ASCE/SEI 7 §2.3.1 (3)", []float64{1.2, 0, 1.6, 0}},
			{"ASCE/SEI 7 §2.3.1 (3)", []float64{1.2, 1.0, 1.6, 0}},
			{"ASCE/SEI 7 §2.3.1 (3)", []float64{1.2, 0, 1.6, 0.5}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 0, 0, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 0, 0.5, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 1.0, 0, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (4)", []float64{1.2, 1.0, 0.5, 1.0}},
			{"ASCE/SEI 7 §2.3.1 (5)", []float64{0.9, 0, 0, 1.0}},
		}},
		// ASCE/SEI 7 §2.4.1 (REFERENCES D9) with D, L, W: 0.75(0.6W) = 0.45W.
		{"ASCE 7 ASD, D + L + W", "ASCE 7 ASD", ULS, []Action{dD, dL, wi}, []want{
			{"ASCE/SEI 7 §2.4.1 (1)", []float64{1, 0, 0}},
			{"ASCE/SEI 7 §2.4.1 (2)", []float64{1, 1, 0}},
			{"ASCE/SEI 7 §2.4.1 (5)", []float64{1, 0, 0.6}},
			{"ASCE/SEI 7 §2.4.1 (6)", []float64{1, 0, 0.45}},
			{"ASCE/SEI 7 §2.4.1 (6)", []float64{1, 0.75, 0.45}},
			{"ASCE/SEI 7 §2.4.1 (7)", []float64{0.6, 0, 0.6}},
		}},
		{"ASCE 7 ASD, D + L + S", "ASCE 7 ASD", ULS, []Action{dD, dL, sn}, []want{
			{"ASCE/SEI 7 §2.4.1 (1)", []float64{1, 0, 0}},
			{"ASCE/SEI 7 §2.4.1 (2)", []float64{1, 1, 0}},
			{"ASCE/SEI 7 §2.4.1 (3)", []float64{1, 0, 1}},
			{"ASCE/SEI 7 §2.4.1 (4)", []float64{1, 0.75, 0.75}},
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r, ok := Lookup(tc.rules)
			if !ok {
				t.Fatalf("no rules %q", tc.rules)
			}
			got, err := r.Combinations(tc.acts, tc.state)
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != len(tc.want) {
				for _, c := range got {
					t.Logf("%s  %s  %s", c.Name, c.Clause, c.Text(tc.acts))
				}
				t.Fatalf("%d combinations, want %d", len(got), len(tc.want))
			}
			for i, w := range tc.want {
				c := got[i]
				if c.Clause != w.clause {
					t.Errorf("%s: clause %q, want %q", c.Name, c.Clause, w.clause)
				}
				for k, f := range w.factors {
					if math.Abs(c.Factors[k]-f) > 1e-12 {
						t.Errorf("%s (%s): factor of %s is %g, want %g", c.Name, c.Text(tc.acts), tc.acts[k].Name, c.Factors[k], f)
					}
				}
			}
		})
	}
}

func TestText(t *testing.T) {
	r, _ := Lookup("EN 1990 6.10")
	cs, err := r.Combinations([]Action{g, sn, wi}, ULS)
	if err != nil {
		t.Fatal(err)
	}
	// 1.35 G, snow leading at γQ = 1.5, wind at γQ·ψ0 = 1.5 × 0.6 (D6, D7).
	if got, want := cs[2].Text([]Action{g, sn, wi}), "1.35 G + 1.5 S + 0.9 W"; got != want {
		t.Errorf("Text = %q, want %q", got, want)
	}
	if got := FormatFactor(1); got != "1.0" {
		t.Errorf("FormatFactor(1) = %q", got)
	}
}

func TestOverride(t *testing.T) {
	r, _ := Lookup("EN 1990 6.10")
	// A national annex's ψ0 for snow (own assumption): 1.5 × 0.6 = 0.9.
	if err := r.Set("psi_0 snow", 0.6, "sheet line 12 (national annex)"); err != nil {
		t.Fatal(err)
	}
	cs, err := r.Combinations([]Action{g, qB, sn}, ULS)
	if err != nil {
		t.Fatal(err)
	}
	if f := cs[2].Factors[2]; math.Abs(f-0.9) > 1e-12 {
		t.Errorf("accompanying snow at %g, want 0.9", f)
	}
	var src string
	for _, f := range r.Used([]Action{g, qB, sn}, []string{ULS}) {
		if f.Key == "psi_0 snow" {
			src = f.SourceText()
		}
		if f.Key == "psi_0 wind" {
			t.Errorf("wind factors listed for a sheet without wind")
		}
	}
	if src != "sheet line 12 (national annex)" {
		t.Errorf("source of the replaced factor: %q", src)
	}
	for _, bad := range []struct {
		key string
		v   float64
	}{{"psi_0 snw", 0.5}, {"gamma_Q", -1}, {"gamma_Q", math.NaN()}, {"psi accidental leading", 1.5}} {
		if err := r.Set(bad.key, bad.v, ""); err == nil {
			t.Errorf("Set(%q, %g) accepted", bad.key, bad.v)
		}
	}
	a, _ := Lookup("ASCE 7 LRFD")
	if err := a.Set("gamma_Q", 1.6, ""); err == nil {
		t.Error("ASCE/SEI 7 factors accepted a replacement")
	}
}

func TestFromMemory(t *testing.T) {
	r, _ := Lookup("EN 1990 6.10")
	for _, f := range r.Factors() {
		if strings.HasSuffix(f.Key, "equ") || strings.Contains(f.Key, "imposed F") {
			if !f.FromMemory || !strings.HasSuffix(f.SourceText(), "(from memory)") {
				t.Errorf("%s: not marked from memory", f.Key)
			}
		}
		if f.Key == "gamma_Q" && f.FromMemory {
			t.Errorf("gamma_Q is in REFERENCES D7, not from memory")
		}
	}
}

func r0() *Rules { r, _ := Lookup("EN 1990 6.10"); return r }

func TestRefused(t *testing.T) {
	a, _ := Lookup("ASCE 7 LRFD")
	if _, err := a.Combinations([]Action{dD, thm}, ULS); err == nil || !strings.Contains(err.Error(), "thermal") {
		t.Errorf("thermal action under ASCE/SEI 7: %v", err)
	}
	if _, err := a.Combinations([]Action{dD}, Frequent); err == nil {
		t.Error("ASCE/SEI 7 gave frequent combinations")
	}
	if _, err := r0().Combinations([]Action{g, {Name: "Q", Class: Imposed}}, ULS); err == nil || !strings.Contains(err.Error(), "category") {
		t.Errorf("EN 1990 without the category of an imposed action: %v", err)
	}
	if _, ok := Lookup("EN 1991 6.10"); ok {
		t.Error("unknown rules found")
	}
	// Accidental (6.11b): G + Ad + ψ1 Q1 + Σ ψ2 Qi (from memory).
	r, _ := Lookup("EN 1990 6.10")
	ad := Action{Name: "A", Class: Accidental}
	cs, err := r.Combinations([]Action{g, qB, ad}, AccidentalLS)
	if err != nil {
		t.Fatal(err)
	}
	want := [][]float64{{1, 0, 1}, {1, 0.3, 1}, {1, 0.5, 1}} // ψ2, ψ1 imposed B (D6)
	if len(cs) != len(want) {
		t.Fatalf("%d accidental combinations, want %d", len(cs), len(want))
	}
	for i, w := range want {
		for k := range w {
			if math.Abs(cs[i].Factors[k]-w[k]) > 1e-12 {
				t.Errorf("%s: %v, want %v", cs[i].Name, cs[i].Factors, w)
			}
		}
	}
	// An accidental action takes no part in the fundamental combinations.
	cs, _ = r.Combinations([]Action{g, ad}, ULS)
	if len(cs) != 1 || cs[0].Factors[1] != 0 {
		t.Errorf("accidental action in ULS: %v", cs)
	}
}

// TestStandard: the rule sets of one standard may stand in for each other
// in a template, those of two may not. Source: the rule sets' own titles
// (EN 1990:2002 6.4.3.2; ASCE/SEI 7-22 §2.3.1, §2.4.1).
func TestStandard(t *testing.T) {
	for _, c := range []struct{ name, want string }{
		{"EN 1990 6.10", "EN 1990"},
		{"EN 1990 6.10a/b", "EN 1990"},
		{"ASCE 7 LRFD", "ASCE/SEI 7"},
		{"ASCE 7 ASD", "ASCE/SEI 7"},
	} {
		r, ok := Lookup(c.name)
		if !ok {
			t.Fatalf("no rules %q", c.name)
		}
		if got := r.Standard(); got != c.want {
			t.Errorf("%s: standard %q, want %q", c.name, got, c.want)
		}
	}
}
