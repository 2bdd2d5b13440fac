package xlsxout

import (
	"strings"
	"testing"
)

// TestVerdictColoursFollow: the verdict colours are conditional formats
// on the verdict cells (so a verdict that flips after an edit takes its
// colour with it), one rule per verdict word; guarded values carry a rule
// that reads their inputs' flags.
// Source: ECMA-376 Part 1, 18.3.1.10 cfRule (cellIs and expression rules).
func TestVerdictColoursFollow(t *testing.T) {
	// encased-column has a squash load that only Sheaf computes.

	s := load(t, "../../../sheets/encased-column.sheaf")
	f := build(t, s, s.NewState().Eval())
	cf, err := f.GetConditionalFormats(TabSummary)
	if err != nil {
		t.Fatal(err)
	}
	words := map[string]bool{}
	for rng, opts := range cf {
		if !strings.HasPrefix(rng, "G") {
			continue
		}
		for _, o := range opts {
			words[strings.Trim(o.Value, `"`)] = true
		}
	}
	for _, w := range []string{VerdictPass, VerdictFail, VerdictRerun} {
		if !words[w] {
			t.Errorf("no conditional format for the verdict %q (have %v)", w, words)
		}
	}
	calc, err := f.GetConditionalFormats(TabCalc)
	if err != nil {
		t.Fatal(err)
	}
	guarded := 0
	for _, opts := range calc {
		for _, o := range opts {
			if o.Type == "formula" && strings.Contains(o.Criteria, "changed.") {
				guarded++
			}
		}
	}
	if guarded == 0 {
		t.Error("no value of encased-column is guarded, though its squash load is computed by Sheaf only")
	}
	if _, err := f.GetRows(TabRun); err != nil {
		t.Errorf("no %s tab: %v", TabRun, err)
	}
}
