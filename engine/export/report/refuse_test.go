package report

import (
	"strings"
	"testing"
)

// TestRefusesActions: the report of a sheet with actions would put
// characteristic values into design formulas and show no governing
// combination, so it is refused, with the reason, by Refusal and by
// Render itself (the live preview renders without asking first); a sheet
// without actions is not.
func TestRefusesActions(t *testing.T) {
	tests := []struct {
		name, src string
		refused   bool
	}{
		{"actions", `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 5 kN
N_Ed [kN] = G + Q
N_Rd [kN] = 100 kN
check tension: N_Ed <= N_Rd
`, true},
		{"no actions", `N_Ed [kN] = 1.35 * 10 kN + 1.5 * 5 kN
N_Rd [kN] = 100 kN
check tension: N_Ed <= N_Rd
`, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, r := compile(t, tt.name+".sheaf", tt.src)
			why := Refusal(s)
			html := Render(s, r, testOptions)
			if !tt.refused {
				if why != "" || !strings.Contains(html, "Sign-off") {
					t.Fatalf("a sheet without actions is refused: %q", why)
				}
				return
			}
			for _, want := range []string{"has actions", "EN 1990 6.10", "sheaf run --combinations"} {
				if !strings.Contains(why, want) {
					t.Errorf("reason %q lacks %q", why, want)
				}
			}
			if !strings.Contains(html, "No report:") || !strings.Contains(html, esc(why)) {
				t.Errorf("Render of a sheet with actions does not say why:\n%s", html)
			}
			for _, bad := range []string{"Sign-off", "tension", "N_Ed"} {
				if strings.Contains(html, bad) {
					t.Errorf("the refusal page shows %q, as if it were a report", bad)
				}
			}
		})
	}
}

// TestRangeCheckInBody: a check between two limits is written in the body
// as its two checks, at the line of the item that made them.
func TestRangeCheckInBody(t *testing.T) {
	s, r := compile(t, "range.sheaf", "r = 0.45\ncheck spacing: 0.2 <= r <= 0.9\n")
	html := Render(s, r, testOptions)
	for _, id := range []string{`id="c-spacing_min"`, `id="c-spacing_max"`} {
		if !strings.Contains(html, id) {
			t.Errorf("the body lacks %s", id)
		}
	}
}
