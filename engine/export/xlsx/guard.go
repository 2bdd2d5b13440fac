package xlsxout

import (
	"slices"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

// Guards: a value only Sheaf computes is written as a plain value, which
// a spreadsheet cannot recompute. So that a client who changes an input
// is never shown a stale result as if it were current, the workbook keeps
// (on the Run record tab) every input as Sheaf computed it, and compares
// it with the input's cell now. Every value that a changed input would
// have changed but cannot — a value only Sheaf computes, and every formula
// that reads one — is then marked out of date, every check that depends
// on one reads VerdictRerun instead of a verdict, and the Summary names
// the changed inputs. Tables that feed such values are locked.

// TabRun is the tab of the inputs as Sheaf computed them.
const TabRun = "Run record"

// VerdictRerun is the verdict of a check that depends on a value only
// Sheaf computes, once an input upstream of that value has changed.
const VerdictRerun = "rerun Sheaf"

// NoteStale starts the note of a value that is out of date.
const NoteStale = "OUT OF DATE: an input it depends on changed; rerun Sheaf"

// guardKey is an editable input a value only Sheaf computes depends on.
type guardKey struct {
	path string // Sheaf path: q_k, steel.E
	val  any    // the value written in the workbook (display unit)
	unit string
	used bool   // some value depends on it through a value only Sheaf computes
	flag string // defined name of its "changed" cell on the Run record tab
	row  int    // its row on the Run record tab
}

// maxGuardTerms is the most flags one guard formula lists; a value that
// depends on more inputs through values only Sheaf computes is guarded by
// the flag that any of them changed (a spreadsheet's OR takes at most
// 255 arguments).
const maxGuardTerms = 64

// addKey registers the editable input at path with its written value and
// returns its index.
func (x *exporter) addKey(cell int, path string, val any, unit string) {
	if x.inputKeys == nil {
		x.inputKeys = make([][]int32, len(x.r.Cells))
	}
	x.keys = append(x.keys, guardKey{path: path, val: val, unit: unit})
	x.inputKeys[cell] = append(x.inputKeys[cell], int32(len(x.keys)-1))
}

// inputKeysOf registers the inputs of input cell i: the cell itself, or
// the editable fields of an input record (the record rows do that).
func (x *exporter) inputKeyOf(i int) {
	cr := &x.r.Cells[i]
	if !cr.Known || cr.Cell.Kind != engine.Input {
		return
	}
	u := cr.Unit.Pretty()
	if u == "1" {
		u = ""
	}
	switch v := cr.Value.(type) {
	case float64:
		f := cr.Unit.Factor
		if f == 0 {
			f = 1
		}
		x.addKey(i, cr.Cell.Name, v/f, u)
	case bool, string:
		x.addKey(i, cr.Cell.Name, v, "")
	}
}

// guardStale finds, for every cell, the inputs whose change would leave
// its workbook value wrong: for a value only Sheaf computes, every input
// upstream of it; for a formula, the union of those of the cells it
// reads. It locks the tables upstream of values only Sheaf computes, and
// names the flags of the inputs that guard something.
func (x *exporter) guardStale() {
	p := x.s.Program()
	n := len(p.Cells)
	x.stale = make([][]int32, n)
	x.lockTable = make([]bool, n)
	for _, i := range p.Order {
		c := p.Cells[i]
		if c.Kind == engine.Input || c.Kind == engine.Table || !x.r.Cells[i].Known && c.Kind != engine.Function && !x.comboDep(i) {
			continue
		}
		if x.comboDep(i) {
			x.stale[i] = x.comboStale(i, x.upstream(i))
			continue
		}
		if x.opaque[i] {
			x.stale[i] = x.upstream(i)
			if b := c.Body(); !b.IsZero() && b.Op() == check.OpPlugin && b.Def().Spreadsheet != nil {
				// Its fields with a spreadsheet form are live: out of
				// date only through what the call's arguments read.
				if x.staleFields == nil {
					x.staleFields = make([][]int32, n)
				}
				x.staleFields[i] = x.staleOf(b.Args()...)
			}
			continue
		}
		x.stale[i] = x.staleOf(c.Body(), c.Extra().Demand, c.Extra().Capacity)
	}
	for _, s := range x.stale {
		for _, k := range s {
			x.keys[k].used = true
		}
	}
	row := runFirstRow
	for k := range x.keys {
		if !x.keys[k].used {
			continue
		}
		x.keys[k].flag = x.names.take("changed." + DefinedName(x.keys[k].path))
		x.keys[k].row = row
		x.usedKeys = append(x.usedKeys, k)
		row++
	}
	if len(x.usedKeys) > 0 {
		x.anyFlag = x.names.take("changed.any")
		x.anyRow = row
	}
}

// staleOf is the union of the stale sets of what the trees read.
func (x *exporter) staleOf(ns ...check.Node) []int32 {
	var s []int32
	x.walkRefs(func(d int, live bool) {
		if live {
			s = append(s, x.staleFields[d]...)
		} else {
			s = append(s, x.stale[d]...)
		}
	}, ns...)
	if len(s) == 0 {
		return nil
	}
	slices.Sort(s)
	return slices.Compact(s)
}

// walkRefs calls fn for every cell the trees read: live is true for a
// record read only through a field the workbook computes live (tube.A).
func (x *exporter) walkRefs(fn func(cell int, live bool), ns ...check.Node) {
	var walk func(n check.Node)
	walk = func(n check.Node) {
		if n.IsZero() {
			return
		}
		switch n.Op() {
		case check.OpCell, check.OpUser, check.OpFuncRef:
			fn(int(n.Index()), false)
		case check.OpField:
			if a := n.Arg(0); a.Op() == check.OpCell && x.liveField[x.tr.path(n)] {
				fn(int(a.Index()), true)
				return
			}
		}
		for _, a := range n.Args() {
			walk(a)
		}
	}
	for _, n := range ns {
		walk(n)
	}
}

// pluginFieldCell writes a field of a record made by a plugin call by the
// field's spreadsheet form: live, in the field's display unit.
func (x *exporter) pluginFieldCell(r *calcRow) (excelize.Cell, string) {
	v, _ := r.val.(float64)
	f := r.unit.Factor
	if f == 0 {
		f = 1
	}
	fmtStr := numFormat(v/f, x.sig)
	t, err := x.tr.pluginField(r.plugin, r.path[strings.LastIndexByte(r.path, '.')+1:])
	if err != nil {
		x.stats.ValueOnly++
		return excelize.Cell{StyleID: x.st.id(clsValueOnly, fmtStr), Value: v / f}, noteValueOnly + err.Error()
	}
	s := t.s
	if f != 1 {
		s = t.operand() + "/" + num(f).operand()
	}
	x.stats.Live++
	return excelize.Cell{StyleID: x.st.id(clsDerived, fmtStr), Value: v / f, Formula: s}, ""
}

// upstream returns the input keys upstream of cell i, and marks the
// tables upstream of it to be locked.
func (x *exporter) upstream(i int) []int32 {
	p := x.s.Program()
	seen := map[int]bool{i: true}
	stack := []int{i}
	var out []int32
	for len(stack) > 0 {
		j := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for _, dep := range p.Deps(j) {
			d := int(dep)
			if d < 0 || d >= len(p.Cells) || seen[d] {
				continue
			}
			seen[d] = true
			switch p.Cells[d].Kind {
			case engine.Input:
				if x.inputKeys != nil {
					out = append(out, x.inputKeys[d]...)
				}
			case engine.Table:
				x.lockTable[d] = true
			default:
				stack = append(stack, d)
			}
		}
	}
	slices.Sort(out)
	return slices.Compact(out)
}

// locked reports whether the table cell i is locked: values only Sheaf
// computes depend on it, and a change in the workbook would not reach them.
func (x *exporter) locked(i int) bool {
	return i >= 0 && i < len(x.lockTable) && x.lockTable[i]
}

// guardExpr is the formula that is TRUE when an input of keys has
// changed; "" when nothing guards the value.
func (x *exporter) guardExpr(keys []int32) string {
	if len(keys) == 0 {
		return ""
	}
	if len(keys) > maxGuardTerms {
		return x.anyFlag
	}
	if len(keys) == 1 {
		return x.keys[keys[0]].flag
	}
	fs := make([]string, len(keys))
	for j, k := range keys {
		fs[j] = x.keys[k].flag
	}
	return "OR(" + strings.Join(fs, ",") + ")"
}

// quoted is s as a string literal of a formula.
func quoted(s string) string { return `"` + strings.ReplaceAll(s, `"`, `""`) + `"` }

// guardedNote is the note cell of a value guarded by keys: NoteStale when
// an input changed, else the note.
func (x *exporter) guardedNote(keys []int32, note string) excelize.Cell {
	g := x.guardExpr(keys)
	cell := x.text(note, clsText)
	if g != "" {
		cell.Formula = "IF(" + g + "," + quoted(NoteStale) + "," + quoted(note) + ")"
	}
	return cell
}

// Rows of the Run record tab.
const (
	runHeadRow  = 4
	runFirstRow = 5
)

var runWidths = []float64{24, 12, 18, 18, 10}

// writeRun writes the Run record tab: every input a value only Sheaf
// computes depends on, as Sheaf computed with it and as it is now.
func (x *exporter) writeRun() error {
	if len(x.usedKeys) == 0 {
		return nil
	}
	if _, err := x.f.NewSheet(TabRun); err != nil {
		return err
	}
	if err := x.finishTab(TabRun, false); err != nil {
		return err
	}
	sw, err := x.f.NewStreamWriter(TabRun)
	if err != nil {
		return err
	}
	for i, w := range runWidths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	if err := sw.SetRow("A1", []any{x.text("Inputs as Sheaf computed with them", clsTitle)}, excelize.RowOpts{Height: 24}); err != nil {
		return err
	}
	if err := sw.SetRow("A2", []any{x.text("Values marked grey were computed by Sheaf from these inputs. When one is changed, "+
		"the values and checks that depend on it are marked out of date until Sheaf runs again.", clsText)},
		excelize.RowOpts{Height: 2 * lineHeight}); err != nil {
		return err
	}
	if err := sw.MergeCell("A2", "E2"); err != nil {
		return err
	}
	head := []string{"Input", "Unit", "At the Sheaf run", "Now", "Changed"}
	hs := make([]any, len(head))
	for i, h := range head {
		hs[i] = x.text(h, clsHeader)
	}
	if err := sw.SetRow("A"+strconv.Itoa(runHeadRow), hs); err != nil {
		return err
	}
	for _, k := range x.usedKeys {
		key := &x.keys[k]
		r := strconv.Itoa(key.row)
		name := x.tr.refs[key.path].name
		var at, now excelize.Cell
		changed := "D" + r + "<>C" + r
		switch v := key.val.(type) {
		case float64:
			// General shows every digit that matters, as typed.
			at = excelize.Cell{StyleID: x.st.id(clsData, generalFormat), Value: v}
			now = excelize.Cell{StyleID: x.st.id(clsDerived, generalFormat), Value: v, Formula: name}
		case string:
			// Text compares without regard to case in a spreadsheet;
			// Sheaf's modes do not.
			changed = "NOT(EXACT(D" + r + ",C" + r + "))"
			at = x.text(v, clsData)
			now = excelize.Cell{StyleID: x.st.id(clsDerived, ""), Value: v, Formula: name}
		default:
			at = excelize.Cell{StyleID: x.st.id(clsData, ""), Value: v}
			now = excelize.Cell{StyleID: x.st.id(clsDerived, ""), Value: v, Formula: name}
		}
		flag := excelize.Cell{StyleID: x.st.id(clsDerived, ""), Value: false, Formula: changed}
		if err := sw.SetRow("A"+r, []any{x.text(key.path, clsKey), x.text(key.unit, clsText), at, now, flag}); err != nil {
			return err
		}
	}
	r := strconv.Itoa(x.anyRow)
	anyCell := excelize.Cell{StyleID: x.st.id(clsKey, ""), Value: false,
		Formula: "OR(E" + strconv.Itoa(runFirstRow) + ":E" + strconv.Itoa(x.anyRow-1) + ")"}
	if err := sw.SetRow("A"+r, []any{x.text("Any input changed", clsKey), x.text("", clsText), x.text("", clsText), x.text("", clsText), anyCell}); err != nil {
		return err
	}
	return sw.Flush()
}

// guardNames are the defined names of the flags.
func (x *exporter) guardNames() []excelize.DefinedName {
	var out []excelize.DefinedName
	for _, k := range x.usedKeys {
		key := &x.keys[k]
		out = append(out, excelize.DefinedName{Name: key.flag, RefersTo: runRef("E", key.row), Comment: "changed: " + key.path})
	}
	if x.anyFlag != "" {
		out = append(out, excelize.DefinedName{Name: x.anyFlag, RefersTo: runRef("E", x.anyRow)})
	}
	return out
}

func runRef(col string, row int) string {
	return "'" + TabRun + "'!$" + col + "$" + strconv.Itoa(row)
}

// bannerFormula is the Summary's warning: empty while every input is as
// Sheaf computed with it, else the names of the changed inputs.
func (x *exporter) bannerFormula() string {
	if x.anyFlag == "" {
		return ""
	}
	parts := make([]string, len(x.usedKeys))
	for j, k := range x.usedKeys {
		parts[j] = "IF(" + x.keys[k].flag + "," + quoted(", "+x.keys[k].path) + ",\"\")"
	}
	list := "MID(" + strings.Join(parts, "&") + ",3,32000)"
	if len(x.usedKeys) > maxGuardTerms {
		list = quoted("inputs listed on the " + TabRun + " tab")
	}
	return "IF(" + x.anyFlag + "," + quoted("OUT OF DATE: changed since Sheaf computed this workbook: ") + "&" + list + "&" +
		quoted(". Values marked out of date and checks that read \""+VerdictRerun+"\" need a new Sheaf run.") + ",\"\")"
}

// isKeyValue reports whether v is a value a guard key can hold.
func isKeyValue(v funcs.Value) bool {
	switch v.(type) {
	case float64, bool:
		return true
	}
	return false
}
