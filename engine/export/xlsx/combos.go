package xlsxout

import (
	"errors"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/combine"
)

// A sheet with actions. Sheaf evaluates every cell that depends on an
// action once per combination and shows each in one of them (a check in
// its governing one); a spreadsheet formula computes one value from the
// values it reads, so it could only ever compute one combination, and
// would compute it from the characteristic values the action cells hold.
// The workbook therefore writes:
//
//   - each action as an input (or a live formula over inputs) holding its
//     characteristic value, as the sheet defines it;
//   - every other cell that depends on an action, checks included, as a
//     value from Sheaf in the combination its note names, never as a
//     formula;
//   - the Combinations tab: the actions with their kinds and characteristic
//     values, every combination in words with the clause it follows and
//     each check's utilisation in it, and the factors of the rules with
//     their sources; the factors are cells a client may edit.
//
// The guards do the rest: every value that depends on actions is out of
// date once an input upstream of it, a characteristic value or a factor
// changes, and every check that depends on actions then reads
// VerdictRerun, as do the utilisations of the Combinations tab. So a
// client's edit never leaves a stale verdict standing; it asks for a
// Sheaf run, which computes every combination again.

// TabCombos is the tab of the actions and their combinations.
const TabCombos = "Combinations"

// comboBook is what the workbook keeps of a sheet with actions.
type comboBook struct {
	cs      *engine.ComboSummary
	factors []combine.Factor
	keys    []int32 // the guard key of each factor
	rows    []int   // the row of each factor on TabCombos
	checks  []engine.CheckResult
	// checkKeys are the input keys upstream of the checks (comboStale).
	checkKeys []int32
	// Rows of TabCombos.
	actionsRow, combosRow, factorsRow int
}

// comboIndex is the index into cs.All of the combination named name, -1
// when none.
func comboIndex(cs *engine.ComboSummary, name string) int {
	for m, c := range cs.All {
		if c.Name == name {
			return m
		}
	}
	return -1
}

// layoutCombos places the Combinations tab and registers each factor as
// an editable input that guards every value depending on actions.
func (x *exporter) layoutCombos() {
	cs := x.r.Combos
	if cs == nil {
		return
	}
	b := &comboBook{cs: cs, factors: cs.UsedFactors()}
	for _, ch := range x.r.Checks {
		if ch.Combo != nil {
			b.checks = append(b.checks, ch)
		}
	}
	row := 4 // title, banner, rules
	b.actionsRow = row
	row += 2 + len(cs.Actions) + 1 // heading, header, actions, gap
	b.combosRow = row
	row += 2 + len(cs.All) + 1
	b.factorsRow = row
	row += 2
	for _, f := range b.factors {
		path := factorPath(f.Key)
		x.keys = append(x.keys, guardKey{path: path, val: f.Value})
		b.keys = append(b.keys, int32(len(x.keys)-1))
		b.rows = append(b.rows, row)
		x.tr.refs[path] = ref{name: x.names.take("factor." + DefinedName(f.Key)), factor: 1}
		row++
	}
	x.cmb = b
	// A table Sheaf computed from a value of one combination (the samples
	// of a bar result) says which, in its title and its charts' titles.
	for _, tb := range x.tables {
		head, _, _ := strings.Cut(tb.path, ".")
		cr := x.r.Cell(head)
		if cr == nil || tb.input {
			continue
		}
		if m := x.cellCombo(cr.Cell.Index); m >= 0 {
			in := "in " + cs.All[m].Name + " = " + cs.Text(m)
			tb.desc = strings.TrimSpace(tb.desc + " (" + in + ")")
			if tb.owner == "" {
				tb.owner = tb.path
			}
			tb.owner += " (" + in + ")"
		}
	}
}

// factorPath is how the guards name factor key k: as the sheet's factor
// line would write it.
func factorPath(k string) string { return "factor " + k }

// comboDep reports whether cell i depends on an action without being one:
// its value is Sheaf's in one combination.
func (x *exporter) comboDep(i int) bool {
	cs := x.r.Combos
	if cs == nil || i < 0 || i >= len(cs.Depends) || !cs.Depends[i] {
		return false
	}
	return x.r.Cells[i].Cell.Extra().Action == nil
}

// cellCombo is the combination whose value cell i shows, -1 for none.
func (x *exporter) cellCombo(i int) int {
	cs := x.r.Combos
	if !x.comboDep(i) {
		return -1
	}
	if x.r.Cells[i].Cell.Kind == engine.Check {
		for _, ch := range x.r.Checks {
			if ch.Cell.Index == i && ch.Combo != nil {
				return comboIndex(cs, ch.Combo.Governing)
			}
		}
		return -1
	}
	return cs.CellIn[i]
}

// comboReason is why cell i, which depends on actions, is a value from
// Sheaf: the reason its note gives.
func (x *exporter) comboReason(i int) error {
	cs := x.r.Combos
	what := "value"
	if x.r.Cells[i].Cell.Kind == engine.Check {
		what = "governing utilisation"
	}
	if m := x.cellCombo(i); m >= 0 {
		return errors.New(what + " in " + cs.All[m].Name + " = " + cs.Text(m) + "; Sheaf computes every combination (see the " + TabCombos + " tab)")
	}
	return errors.New("depends on actions; Sheaf computes every combination (see the " + TabCombos + " tab)")
}

// comboStale adds the factor keys to the guard of every value that
// depends on actions. A cell (not a check) also takes the inputs upstream
// of every check that depends on actions: the combination it is shown in
// is the governing one of the check it feeds that governs the most, so an
// input of another check can move it to another combination (two template
// uses whose rods meet in one check: editing one rod's diameter changes
// which combination the other rod's force is shown in).
func (x *exporter) comboStale(i int, keys []int32) []int32 {
	if x.cmb == nil || !x.comboDep(i) {
		return keys
	}
	keys = append(slices.Clone(keys), x.cmb.keys...)
	if x.r.Cells[i].Cell.Kind != engine.Check {
		if x.cmb.checkKeys == nil {
			x.cmb.checkKeys = []int32{}
			for _, ch := range x.cmb.checks {
				x.cmb.checkKeys = append(x.cmb.checkKeys, x.upstream(ch.Cell.Index)...)
			}
		}
		keys = append(keys, x.cmb.checkKeys...)
	}
	slices.Sort(keys)
	return slices.Compact(keys)
}

// actionNote is the note of action cell c: its kind and that it holds the
// characteristic value; "" for any other cell.
func (x *exporter) actionNote(c *check.Cell) string {
	if c.Extra().Action == nil || x.r.Combos == nil {
		return ""
	}
	return "action, " + c.Extra().Action.Kind.Text() + ": characteristic value; its factors are on the " + TabCombos + " tab"
}

// comboSubst is the text a hand calculation of cell c puts in for node n,
// which reads the value v: an action as its factor in c's combination
// times its characteristic value. ok is false when n shows a value of
// another combination than c (the hand calculation then shows none).
func (x *exporter) comboSubst(c *check.Cell, n check.Node, v string) (string, bool) {
	cs := x.r.Combos
	if cs == nil {
		return v, true
	}
	for n.Op() == check.OpField {
		n = n.Arg(0)
	}
	if n.Op() != check.OpCell {
		return v, true
	}
	i := int(n.Index())
	m := x.cellCombo(c.Index)
	for a, ac := range cs.Cells {
		if ac.Index == i {
			if m < 0 {
				return "", false
			}
			return "(" + combine.FormatFactor(cs.All[m].Factors[a]) + " * " + v + ")", true
		}
	}
	if k := x.cellCombo(i); k >= 0 && k != m {
		return "", false
	}
	return v, true
}

// comboGuard is the guard of every value that depends on actions: TRUE
// once any input they read, any characteristic value or any factor has
// changed.
func (x *exporter) comboGuard() string {
	var keys []int32
	for i := range x.r.Cells {
		if x.comboDep(i) {
			keys = append(keys, x.stale[i]...)
		}
	}
	slices.Sort(keys)
	return x.guardExpr(slices.Compact(keys))
}

var comboWidths = []float64{16, 21, 24, 36, 12, 12, 12, 12}

// utilReversed stands on the Combinations tab for a combination in which a
// check's demand has the other sense: it is not assessed there, and such a
// combination governs (SPEC.md §5a).
const utilReversed = "reversed"

// writeCombos writes the Combinations tab.
func (x *exporter) writeCombos() error {
	b := x.cmb
	if b == nil {
		return nil
	}
	cs := b.cs
	const tab = TabCombos
	if _, err := x.f.NewSheet(tab); err != nil {
		return err
	}
	if err := x.finishTab(tab, true); err != nil {
		return err
	}
	// The utilisations of a check turn amber once an input it depends on
	// changed (conditional formats go on before streaming).
	id, err := x.f.NewConditionalStyle(&staleStyle)
	if err != nil {
		return err
	}
	for k, ch := range b.checks {
		if g := x.guardExpr(x.stale[ch.Cell.Index]); g != "" {
			col, _ := excelize.ColumnNumberToName(5 + k)
			rng := col + strconv.Itoa(b.combosRow+2) + ":" + col + strconv.Itoa(b.combosRow+1+len(cs.All))
			if err := x.f.SetConditionalFormat(tab, rng, []excelize.ConditionalFormatOptions{{Type: "formula", Criteria: g, Format: &id}}); err != nil {
				return err
			}
		}
	}
	sw, err := x.f.NewStreamWriter(tab)
	if err != nil {
		return err
	}
	widths := slices.Clone(comboWidths)
	for len(widths) < 4+len(b.checks)+1 {
		widths = append(widths, 12)
	}
	for i, w := range widths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	put := func(row int, cells ...any) error {
		var cc []excelize.Cell
		for _, c := range cells {
			if c, ok := c.(excelize.Cell); ok {
				cc = append(cc, c)
			}
		}
		return sw.SetRow("A"+strconv.Itoa(row), cells, excelize.RowOpts{Height: rowHeight(cc, widths, nil)})
	}
	header := func(row int, hs ...string) error {
		cells := make([]any, len(hs))
		for i, h := range hs {
			cells[i] = x.text(h, clsHeader)
		}
		return put(row, cells...)
	}
	if err := put(1, x.text("Actions and combinations", clsTitle)); err != nil {
		return err
	}
	guard := x.comboGuard()
	if guard != "" {
		f := "IF(" + guard + "," + quoted("OUT OF DATE: an input, a characteristic value or a factor changed since Sheaf computed the combinations; "+
			"the utilisations below and every value that depends on actions need a new Sheaf run.") + ",\"\")"
		if err := sw.SetRow("A2", []any{excelize.Cell{StyleID: x.st.id(clsBanner, ""), Formula: f, Value: ""}},
			excelize.RowOpts{Height: 2 * lineHeight}); err != nil {
			return err
		}
		if err := sw.MergeCell("A2", "H2"); err != nil {
			return err
		}
	}
	rules := "Combined by " + cs.Rules.Name + ": " + cs.Rules.Title + ". Each variable action takes its turn as the leading one. " +
		"Sheaf evaluates every cell that depends on an action in every combination of its checks' limit states; " +
		"the workbook shows each such value in one combination, named in its note, and does not recompute it."
	wide := func(row int, c excelize.Cell) error {
		return sw.SetRow("A"+strconv.Itoa(row), []any{c}, excelize.RowOpts{Height: rowHeight([]excelize.Cell{c}, []float64{summaryWide + 40}, nil)})
	}
	if err := wide(3, x.text(rules, clsText)); err != nil {
		return err
	}
	if err := sw.MergeCell("A3", "H3"); err != nil {
		return err
	}
	// Actions.
	row := b.actionsRow
	if err := put(row, x.text("Actions", clsHeading)); err != nil {
		return err
	}
	if err := header(row+1, "Action", "Kind", "Description", "Characteristic value", "Unit"); err != nil {
		return err
	}
	for a, c := range cs.Cells {
		cr := &x.r.Cells[c.Index]
		var val excelize.Cell
		unit := cr.Unit.Pretty()
		if unit == "1" {
			unit = ""
		}
		if v, ok := cr.Value.(float64); ok && cr.Known {
			f := cr.Unit.Factor
			if f == 0 {
				f = 1
			}
			// Live: it reads the action's cell, so it follows an edit.
			val = excelize.Cell{StyleID: x.st.id(clsDerived, numFormat(v/f, x.sig)), Value: v / f, Formula: x.tr.refs[c.Name].name}
		} else {
			val = x.text("not computed", clsValueOnly)
		}
		if err := put(row+2+a, x.text(c.Name, clsKey), x.text(c.Extra().Action.Kind.Text(), clsText), x.text(c.Description(), clsText), val, x.text(unit, clsText)); err != nil {
			return err
		}
	}
	// Combinations, with each check's utilisation in each.
	row = b.combosRow
	if err := put(row, x.text("Combinations", clsHeading)); err != nil {
		return err
	}
	hs := []string{"Combination", "Limit state", "Follows", "In words"}
	for _, ch := range b.checks {
		hs = append(hs, ch.Cell.Name)
	}
	hs = append(hs, "Governs")
	if err := header(row+1, hs...); err != nil {
		return err
	}
	for m, c := range cs.All {
		cells := []any{x.text(c.Name, clsKey), x.text(cs.Rules.StateLabel(c.State), clsText), x.text(c.Clause, clsText), x.text(cs.Text(m), clsExpr)}
		var governs []string
		for _, ch := range b.checks {
			u := ch.Combo.Utils[m]
			g := x.guardExpr(x.stale[ch.Cell.Index])
			switch {
			case ch.Combo.State != c.State:
				cells = append(cells, x.text("", clsText))
				continue
			case math.IsNaN(u):
				cells = append(cells, x.guardedText(g, VerdictUnknown))
			case u < 0:
				cells = append(cells, x.guardedText(g, utilReversed))
			default:
				cell := excelize.Cell{StyleID: x.st.id(clsValueOnly, utilFormat), Value: u}
				if g != "" {
					cell.Formula = "IF(" + g + "," + quoted(VerdictRerun) + "," + strconv.FormatFloat(u, 'g', 17, 64) + ")"
				}
				cells = append(cells, cell)
			}
			if ch.Combo.Governing == c.Name {
				governs = append(governs, ch.Cell.Name)
			}
		}
		cells = append(cells, x.guardedText(guard, strings.Join(governs, ", ")))
		if err := put(row+2+m, cells...); err != nil {
			return err
		}
	}
	// Factors.
	row = b.factorsRow
	if err := put(row, x.text("Factors", clsHeading)); err != nil {
		return err
	}
	if len(b.factors) == 0 {
		if err := put(row+1, x.text("The factors are those of each combination as the clause in the column Follows writes them.", clsText)); err != nil {
			return err
		}
	} else if err := header(row+1, "Factor", "Factor line key", "Value", "Source"); err != nil {
		return err
	}
	for k, f := range b.factors {
		src := f.SourceText()
		if f.Replaced {
			src = "replaced by " + src + "; built-in " + combine.FormatFactor(f.Builtin)
		}
		x.stats.Inputs++
		if err := put(b.rows[k], x.text(f.Symbol, clsKey), x.text(f.Key, clsExpr),
			excelize.Cell{StyleID: x.st.id(clsInput, generalFormat), Value: f.Value}, x.text(src, clsText)); err != nil {
			return err
		}
	}
	last := b.factorsRow + 2 + len(b.factors) + 1
	note := "A factor may be edited here to see what it touches: every value that depends on actions is then marked out of date and " +
		"every check that depends on them reads \"" + VerdictRerun + "\". To use another factor, write a factor line in the sheet " +
		"(factor KEY = value -- @ source) and run Sheaf: only Sheaf recomputes the combinations."
	if err := wide(last, x.text(note, clsText)); err != nil {
		return err
	}
	if err := sw.MergeCell("A"+strconv.Itoa(last), "H"+strconv.Itoa(last)); err != nil {
		return err
	}
	return sw.Flush()
}

// guardedText is a text that reads VerdictRerun once guard g holds.
func (x *exporter) guardedText(g, s string) excelize.Cell {
	cell := x.text(s, clsText)
	if g != "" {
		cell.Formula = "IF(" + g + "," + quoted(VerdictRerun) + "," + quoted(s) + ")"
	}
	return cell
}

// comboNames are the defined names of the factor cells.
func (x *exporter) comboNames() []excelize.DefinedName {
	if x.cmb == nil {
		return nil
	}
	var out []excelize.DefinedName
	for k, f := range x.cmb.factors {
		out = append(out, excelize.DefinedName{Name: x.tr.refs[factorPath(f.Key)].name,
			RefersTo: "'" + TabCombos + "'!$C$" + strconv.Itoa(x.cmb.rows[k]), Comment: factorPath(f.Key)})
	}
	return out
}

// governsLine is the line the Summary adds under the description of a
// check that depends on actions: its governing combination in words.
func (x *exporter) governsLine(c *check.Cell) string {
	if x.r.Combos == nil {
		return ""
	}
	for _, ch := range x.r.Checks {
		if ch.Cell == c && ch.Combo != nil {
			o := ch.Combo
			return "governs " + o.Governing + " = " + o.Text + " (" + o.Clause + "), of " + strconv.Itoa(o.Evaluated) + " " +
				x.r.Combos.Rules.StateLabel(o.State) + " combinations"
		}
	}
	return ""
}

// readsActions reports whether expression n reads a cell that depends on
// an action.
func (x *exporter) readsActions(n check.Node) bool {
	cs := x.r.Combos
	if cs == nil {
		return false
	}
	found := false
	x.walkRefs(func(d int, _ bool) {
		if d >= 0 && d < len(cs.Depends) && cs.Depends[d] {
			found = true
		}
	}, n)
	return found
}

// guideLines are the lines of the Summary's guide, with the one about
// combinations for a sheet with actions.
func (x *exporter) guideLines() []string {
	if x.cmb == nil {
		return guide
	}
	return append(slices.Clone(guide), "This sheet has actions: Sheaf computed every value that depends on them in each combination of "+
		x.cmb.cs.Rules.Name+"; each such value is shown in one combination (its note names it), each check in its governing one. "+
		"The "+TabCombos+" tab lists every combination in words with each check's utilisation and the factors with their sources. "+
		"A change of an input, a characteristic value or a factor marks them out of date: run Sheaf again for those.")
}

// unassessedNote is the note of a check that is not assessed: with the
// reason Sheaf gives (a demand of the other sense, in the combination
// where it holds), when it gave one.
func (x *exporter) unassessedNote(c *check.Cell) string {
	for _, ch := range x.r.Checks {
		if ch.Cell == c && ch.Problem != nil {
			return VerdictUnknown + ": " + ch.Problem.Summary
		}
	}
	return VerdictUnknown
}
