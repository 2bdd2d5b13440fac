package engine_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// A hanger rod carrying a slab strip (our own scenario), written as a
// template with actions of its own.
const hangerTemplate = `combinations: EN 1990 6.10
action permanent G [kN] = 6 kN  -- slab strip
action imposed B Q [kN] = 4 kN  -- office floor
N [kN] = G + Q
check tension: N <= 20 kN
`

func compileWith(t *testing.T, files map[string]string, src string) (*engine.Sheet, error) {
	t.Helper()
	m := &mapLoader{sheet: "calcs/top.sheaf", reads: map[string]int{}, files: files}
	return engine.Compile("calcs/top.sheaf", []byte(src), engine.WithLoader(m))
}

// TestTemplateActionsJoin: a template's actions join the using sheet's
// under their qualified names, each use its own; the using sheet's rules
// combine them all, --set and a use block change a characteristic value.
func TestTemplateActionsJoin(t *testing.T) {
	src := `combinations: EN 1990 6.10
use a from "hanger.sheaf"
use b from "hanger.sheaf"
    Q [kN] = 2 kN
action snow S [kN] = 3 kN
N_beam [kN] = a.N + b.N + S
check beam: N_beam <= 40 kN
`
	s, err := compileWith(t, map[string]string{"calcs/hanger.sheaf": hangerTemplate}, src)
	if err != nil {
		t.Fatal(err)
	}
	cs := s.Combos()
	var names []string
	for _, a := range cs.Actions {
		names = append(names, a.Name)
	}
	if got := strings.Join(names, " "); got != "a.G a.Q b.G b.Q S" {
		t.Fatalf("actions %q", got)
	}
	r := s.Run(nil)
	// Source: EN 1990:2002 (6.10) with Table A1.2(B): γG,sup 1.35, γQ 1.5;
	// ψ0 = 0.7 for imposed category B, 0.5 for snow below 1000 m (Table
	// A1.1) — REFERENCES D6, D7, from memory.
	want := map[string]struct {
		n    float64 // governing demand, kN, by hand
		text string
	}{
		"a.tension": {1.35*6 + 1.5*4, "1.35 a.G + 1.5 a.Q + 1.35 b.G"},
		"b.tension": {1.35*6 + 1.5*2, "1.35 a.G + 1.35 b.G + 1.5 b.Q"},
		// S leading, a.Q and b.Q accompanying: 1.35·12 + 1.05·4 + 1.05·2 +
		// 1.5·3 = 27.0 kN; a.Q leading gives 1.35·12 + 1.5·4 + 1.05·2 +
		// 0.75·3 = 26.55 kN.
		"beam": {1.35*12 + 1.5*0.7*4 + 1.5*0.7*2 + 1.5*3, "1.35 a.G + 1.05 a.Q + 1.35 b.G + 1.05 b.Q + 1.5 S"},
	}
	for _, ch := range r.Checks {
		w := want[ch.Cell.Name]
		if math.Abs(ch.Demand-w.n*1000) > 1e-6 || ch.Combo == nil || ch.Combo.Text != w.text {
			t.Errorf("%s: %g N in %+v; want %g kN in %q", ch.Cell.Name, ch.Demand, ch.Combo, w.n, w.text)
		}
	}
	// --set a.G (a case table column sets it alike) changes the
	// characteristic value: 1.35 · 8 + 1.5 · 4.
	v, err := s.ParseInput("a.G", "8 kN")
	if err != nil {
		t.Fatal(err)
	}
	r = s.Run(map[string]any{"a.G": v})
	if ch := r.Checks[0]; math.Abs(ch.Demand-(1.35*8+1.5*4)*1000) > 1e-6 {
		t.Errorf("a.tension with a.G = 8 kN: %g N", ch.Demand)
	}
}

// TestTemplateRulesAgainstTheSheets: the using sheet's rules govern; a
// template of another standard, a factor line the using sheet does not
// repeat, and a sheet without rules are refused at the use line.
func TestTemplateRulesAgainstTheSheets(t *testing.T) {
	withFactor := strings.Replace(hangerTemplate, "N [kN]", "factor psi_0 imposed B = 0.5  -- @ national annex\nN [kN]", 1)
	cases := []struct {
		name, tmpl, src, want, hint string
		line                        int // of the use
	}{
		{"another standard", hangerTemplate, "combinations: ASCE 7 LRFD\nuse a from \"hanger.sheaf\"\n",
			"template `a` is written for EN 1990", "use a template written for ASCE/SEI 7", 2},
		{"no rules in the using sheet", hangerTemplate, "use a from \"hanger.sheaf\"\n",
			"actions without combination rules", "add the header line `combinations: EN 1990 6.10` to this sheet", 1},
		{"a template's factor", withFactor, "combinations: EN 1990 6.10\nuse a from \"hanger.sheaf\"\n",
			"factor `psi_0 imposed B` of template `a` is not this sheet's", "write `factor psi_0 imposed B = 0.5` in this sheet", 2},
		{"a template's factor replaced otherwise", withFactor, "combinations: EN 1990 6.10\nfactor psi_0 imposed B = 0.6\nuse a from \"hanger.sheaf\"\n",
			"factor `psi_0 imposed B` of template `a` is not this sheet's", "if it applies here too", 3},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := compileWith(t, map[string]string{"calcs/hanger.sheaf": tc.tmpl}, tc.src)
			var l diag.List
			if !errors.As(err, &l) {
				t.Fatalf("want diagnostics, got %v", err)
			}
			for _, d := range l {
				if strings.Contains(d.Summary, tc.want) {
					// At the use line's path, in the using sheet.
					if d.Range.Start().Line != tc.line || d.Range.Start().File != "calcs/top.sheaf" || !strings.Contains(d.Hint, tc.hint) {
						t.Errorf("at %v, hint %q", d.Range.Start(), d.Hint)
					}
					return
				}
			}
			t.Errorf("want %q in %v", tc.want, l)
		})
	}
	// Within one standard the using sheet's choice governs: 6.10a/b
	// combines the template's 6.10 actions. Source: EN 1990 (6.10b),
	// ξ = 0.85 (Table A1.2(B), from memory): 0.85 · 1.35 · 6 + 1.5 · 4.
	s, err := compileWith(t, map[string]string{"calcs/hanger.sheaf": hangerTemplate}, "combinations: EN 1990 6.10a/b\nuse a from \"hanger.sheaf\"\n")
	if err != nil {
		t.Fatal(err)
	}
	if ch := s.Run(nil).Checks[0]; math.Abs(ch.Demand-(0.85*1.35*6+1.5*4)*1000) > 1e-6 {
		t.Errorf("6.10a/b over a 6.10 template: %g N in %+v", ch.Demand, ch.Combo)
	}
	// The same factor line in both is accepted.
	if _, err := compileWith(t, map[string]string{"calcs/hanger.sheaf": withFactor},
		"combinations: EN 1990 6.10\nfactor psi_0 imposed B = 0.5  -- @ national annex\nuse a from \"hanger.sheaf\"\n"); err != nil {
		t.Errorf("the factor repeated: %v", err)
	}
}
