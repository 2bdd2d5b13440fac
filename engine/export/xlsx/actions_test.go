package xlsxout

import (
	"path/filepath"

	"github.com/sheafcalc/sheaf/internal/golden"

	"bytes"

	"github.com/xuri/excelize/v2"

	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// factorEdits are the edits of the factors on the Combinations tab: each
// raised by 10 % in the workbook, and in Sheaf by a factor line with the
// same value added to the sheet (how a sheet replaces a factor, SPEC.md
// §5a). A factor the sheet already replaces is left out.
func factorEdits(t *testing.T, x *exporter) []edit {
	t.Helper()
	if x.cmb == nil {
		return nil
	}
	src := x.s.Source()
	var out []edit
	for k, f := range x.cmb.factors {
		if f.Replaced {
			continue
		}
		v := f.Value * 1.1
		line := "\nfactor " + f.Key + " = " + strconv.FormatFloat(v, 'g', -1, 64) + "  -- raised by the test\n"
		name := x.s.Name()
		out = append(out, edit{what: factorPath(f.Key), tab: TabCombos, cell: "C" + strconv.Itoa(x.cmb.rows[k]), val: v,
			results: func() *engine.Results {
				s, err := engine.Compile(name, append(append([]byte(nil), src...), line...))
				if err != nil {
					t.Fatalf("%s with %s: %v", name, strings.TrimSpace(line), err)
				}
				return s.Run(nil)
			}})
	}
	return out
}

// judgeCombos compares the utilisations of the Combinations tab after edit
// e with Sheaf's for the same edit: each reads VerdictRerun or Sheaf's
// utilisation in that combination.
func judgeCombos(t *testing.T, x *exporter, e edit, res *engine.Results, rows [][]string, n *tally) {
	t.Helper()
	b := x.cmb
	if b == nil {
		return
	}
	if res.Combos == nil || len(res.Combos.All) != len(b.cs.All) {
		t.Fatalf("%s: Sheaf's combinations changed with the edit", e.what)
	}
	first := -1
	for i, r := range rows {
		if len(r) > 3 && r[0] == "Combination" && r[3] == "In words" {
			first = i + 1
		}
	}
	if first < 0 {
		t.Fatalf("%s: no combinations table on the %s tab", e.what, TabCombos)
	}
	for m := range b.cs.All {
		if first+m >= len(rows) {
			t.Fatalf("%s: the combinations table ends before %s", e.what, b.cs.All[m].Name)
		}
		row := rows[first+m]
		for k, ch := range b.checks {
			got := ""
			if 4+k < len(row) {
				got = row[4+k]
			}
			var want float64 = math.NaN()
			for _, rc := range res.Checks {
				if rc.Cell.Name == ch.Cell.Name && rc.Combo != nil {
					want = rc.Combo.Utils[m]
				}
			}
			ok := false
			switch {
			case got == VerdictRerun:
				n.guarded++
				continue
			case b.cs.All[m].State != ch.Combo.State:
				ok = got == ""
			case math.IsNaN(want):
				ok = got == VerdictUnknown
			case want < 0:
				ok = got == utilReversed
			default:
				g, err := parseShown(got)
				ok = err == nil && (closeOrCancelled(g, want) || withinShown(got, g, want))
			}
			if ok {
				n.live++
				continue
			}
			n.wrong++
			t.Errorf("%s raised 10 %%: %s in %s reads %q on the %s tab, Sheaf gives %v", e.what, ch.Cell.Name, b.cs.All[m].Name, got, TabCombos, want)
		}
	}
}

// TestActionsWorkbook: the workbook of a sheet with actions carries the
// combinations table (every combination in words, the clause it follows,
// the source of each factor), each check's governing combination on the
// Summary, and writes every value that depends on actions as a value from
// Sheaf in its combination, never as a formula that would compute one
// combination from the characteristic values.
func TestActionsWorkbook(t *testing.T) {
	// A tie (our own scenario): EN 1990 6.10 with Table A1.2(B) and A1.1
	// (REFERENCES D7): ULS 1 = 1.35 G, ULS 2 = 1.35 G + 1.5 Q = 13.5 + 7.5
	// = 21 kN, which governs; 21 / 100 = 21 %.
	const src = `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN  -- own weight
action imposed B Q [kN] = 5 kN   -- office floor
N_Ed [kN] = G + Q
N_Rd [kN] = 100 kN
check tension: N_Ed <= N_Rd
`
	s, err := engine.Compile("tie.sheaf", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	r := s.Run(nil)
	f := build(t, s, r)
	defer f.Close()
	text := func(tab string) string {
		rows, err := f.GetRows(tab)
		if err != nil {
			t.Fatal(err)
		}
		var b strings.Builder
		for _, r := range rows {
			b.WriteString(strings.Join(r, "|") + "\n")
		}
		return b.String()
	}
	combos, summary := text(TabCombos), text(TabSummary)
	for _, want := range []string{"1.35 G + 1.5 Q", "EN 1990 (6.10)", "EN 1990 Table A1.2(B)", "EN 1990 Table A1.1", "permanent", "imposed B", "gamma_Q"} {
		if !strings.Contains(combos, want) {
			t.Errorf("the %s tab lacks %q:\n%s", TabCombos, want, combos)
		}
	}
	if !strings.Contains(summary, "governs ULS 2 = 1.35 G + 1.5 Q") {
		t.Errorf("the Summary does not name the governing combination:\n%s", summary)
	}
	ref := nameCell(t, f, "N_Ed")
	if fm, _ := f.GetCellFormula(TabCalc, ref); fm != "" {
		t.Errorf("N_Ed is the live formula %s: it would compute G + Q from the characteristic values", fm)
	}
	if v, _ := f.GetCellValue(TabCalc, ref, raw); v != "21" {
		t.Errorf("N_Ed shows %s, Sheaf gives 21 kN in ULS 2", v)
	}
	if note, _ := f.GetCellValue(TabCalc, "H"+ref[1:]); !strings.Contains(note, "in ULS 2 = 1.35 G + 1.5 Q") {
		t.Errorf("the note of N_Ed does not name its combination: %q", note)
	}
	if hand, _ := f.GetCellValue(TabCalc, "D"+ref[1:]); !strings.Contains(hand, "(1.35 * 10 kN) + (1.5 * 5 kN)") {
		t.Errorf("the hand calculation of N_Ed does not put the actions in with their factors: %q", hand)
	}
	// An edit of a characteristic value or of a factor turns the verdict
	// into VerdictRerun (excelize's calculator; the other spreadsheet runs
	// the same edits in TestRecomputeInAnotherSpreadsheet).
	x, err := export(s, r, Options{})
	if err != nil {
		t.Fatal(err)
	}
	es := editsOf(t, x)
	if len(es) < 4 { // G, Q and the factors γG,sup, γQ (ψ0 of B is used in no combination of one variable action)
		t.Fatalf("%d edits", len(es))
	}
	for _, e := range es {
		g, err := openBook(editedBook(t, s, r, e))
		if err != nil {
			t.Fatal(err)
		}
		got, err := g.CalcCellValue(TabSummary, "G"+strconv.Itoa(summaryFirstCheck))
		if err != nil || got != VerdictRerun {
			t.Errorf("%s raised 10 %%: the verdict reads %q (%v), want %q", e.what, got, err, VerdictRerun)
		}
		_ = g.Close()
	}
}

// openBook opens workbook bytes.
func openBook(b []byte) (*excelize.File, error) { return excelize.OpenReader(bytes.NewReader(b)) }

// TestActionsGolden: the Summary, Calculation and Combinations tabs of the
// bundled canopy sheet, written with actions, as text (formula cells show
// their cached values).
func TestActionsGolden(t *testing.T) {
	s := load(t, "../../../sheets/canopy-hanger.sheaf")
	f := build(t, s, s.NewState().Eval())
	var text string
	for _, tab := range []string{TabSummary, TabCalc, TabCombos} {
		text += "--- " + tab + "\n" + strings.ReplaceAll(tabText(t, f, tab), s.Name(), filepath.Base(s.Name()))
	}
	golden.Check(t, filepath.Join("testdata", "actions-canopy.golden"), []byte(text), *update)
}
