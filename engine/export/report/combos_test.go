package report

import (
	"strings"
	"testing"
)

// TestActionsInReport: the report of a sheet with actions names, for
// each value, the combination it is in: the actions at their
// characteristic values, the combinations in words with their sources,
// each check's governing combination, and a design formula with its
// values put in as factor times characteristic value, never the
// characteristic values alone.
func TestActionsInReport(t *testing.T) {
	// A tie (our own scenario): EN 1990 6.10 with Table A1.2(B) and A1.1
	// (REFERENCES D7): ULS 1 = 1.35 G, ULS 2 = 1.35 G + 1.5 Q = 13.5 +
	// 7.5 = 21 kN, which governs; 21 / 100 = 21 %.
	const src = `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 5 kN
N_Ed [kN] = G + Q
N_Rd [kN] = 100 kN
check tension: N_Ed <= N_Rd
`
	s, r := compile(t, "actions.sheaf", src)
	html := Render(s, r, testOptions)
	for _, want := range []string{
		"Actions and combinations", "EN 1990 6.10",
		"1.35 G + 1.5 Q", "EN 1990 (6.10)", "EN 1990 Table A1.2(B)", "EN 1990 Table A1.1",
		"governs ULS 2: 1.35 G + 1.5 Q", "characteristic value; permanent action",
		"in ULS 2: 1.35 G + 1.5 Q",
		"<mn>1.35</mn><mo>·</mo><mrow><mn>10</mn>", // G put in as 1.35 · 10 kN
		"21 %", "Sign-off",
	} {
		if !strings.Contains(html, want) {
			t.Errorf("the report lacks %q", want)
		}
	}
	// The characteristic values alone (10 kN + 5 kN) would read as the
	// design force: the line puts each in with its factor.
	if strings.Contains(html, `<mrow><mrow><mn>10</mn><mspace width="0.2em"/><mi mathvariant="normal" class="u">kN</mi></mrow><mo>+</mo>`) {
		t.Error("the design formula shows the characteristic value of G without its factor")
	}
}

// TestReversedTieInReport: a tie in compression under uplift is not
// assessed in its governing combination, and the report says why there.
func TestReversedTieInReport(t *testing.T) {
	const src = `combinations: EN 1990 6.10
action permanent favourable G [kN] = 4 kN
action wind W [kN] = -10 kN
N [kN] = G + W
check tension: N <= 20 kN
`
	s, r := compile(t, "uplift.sheaf", src)
	html := Render(s, r, testOptions)
	for _, want := range []string{"demand is compression", "governs ULS 4: 1.0 G + 1.5 W", "reversed", "not assessed"} {
		if !strings.Contains(html, want) {
			t.Errorf("the report lacks %q", want)
		}
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
