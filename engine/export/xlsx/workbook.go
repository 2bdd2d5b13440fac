package xlsxout

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Tab names.
const (
	TabSummary = "Summary"
	TabCalc    = "Calculation"
	TabData    = "Data"
	TabCharts  = "Charts"
)

// Caution is written on the summary tab of every workbook.
const Caution = "Results must be checked by a qualified engineer. Limits, factors and load combinations come from " +
	"the local code and licensed practice; this workbook does not choose them."

// Options adjust the workbook.
type Options struct {
	SigFigs   int    // significant figures of displayed numbers; default engine.DefaultSigFigs
	Generator string // who made the file, for the footer, e.g. "Sheaf v1.2.0"; default "Sheaf"
}

// Stats count what the workbook holds.
type Stats struct {
	Cells     int // sheet cells written (checks included, fields of records not)
	Inputs    int // editable values (inputs, input record fields, input table entries)
	Live      int // value cells written as formulas
	ValueOnly int // value cells only Sheaf can compute, written as values
	Tables    int // tables on the Data tab
	Charts    int // charts on the Charts tab
}

// valueAt is an SI value and the unit it is shown in.
type valueAt struct {
	si   float64
	unit units.Unit
}

// exporter holds one export in progress.
type exporter struct {
	s          *engine.Sheet
	r          *engine.Results
	f          *excelize.File
	sig        int
	gen        string
	st         *styles
	names      *namer
	tr         *translator
	values     map[string]valueAt // every numeric path with a known value
	rows       []calcRow          // the Calculation tab below its header
	checks     []*checkRow
	tables     []*tableBlock
	dataRanges []namedRange
	// formulas holds the translation of each derived cell (by index);
	// opaque marks cells whose workbook value does not recompute, reads
	// the cells upstream of a live formula that are opaque.
	finish   []finishing
	formulas []translated
	opaque   []bool
	reads    [][]string
	stats    Stats
}

// Build makes the workbook of sheet s with results r (from s.NewState()
// after any overrides, then Eval).
func Build(s *engine.Sheet, r *engine.Results, opt Options) (*excelize.File, Stats, error) {
	n := len(r.Cells)
	x := &exporter{s: s, r: r, sig: opt.SigFigs, gen: opt.Generator, names: newNamer(n), values: make(map[string]valueAt, n)}
	if x.sig <= 0 {
		x.sig = engine.DefaultSigFigs
	}
	if x.gen == "" {
		x.gen = "Sheaf"
	}
	x.f = excelize.NewFile()
	x.st = &styles{f: x.f, cache: map[styleKey]int{}}
	x.tr = &translator{refs: make(map[string]ref, n), cells: s.Cells()}
	x.layout()
	for _, step := range []func() error{x.writeSummary, x.writeCalc, x.writeData, x.writeCharts, x.finishTabs, x.workbookProps} {
		if err := step(); err != nil {
			_ = x.f.Close()
			return nil, x.stats, err
		}
	}
	if x.st.err != nil {
		_ = x.f.Close()
		return nil, x.stats, x.st.err
	}
	return x.f, x.stats, nil
}

// finishing is a tab waiting for its print setup and protection.
type finishing struct {
	tab       string
	landscape bool
}

func (x *exporter) finishTabs() error {
	for _, t := range x.finish {
		if err := x.finishTab(t.tab, t.landscape); err != nil {
			return err
		}
	}
	return nil
}

// rowKind says what a Calculation row shows.
type rowKind uint8

const (
	rowHeading rowKind = iota
	rowCell
	rowField
)

// calcRow is one row of the Calculation tab.
type calcRow struct {
	kind  rowKind
	row   int
	title string // heading text
	cr    *engine.CellResult
	// rowField: the record cell, the field path and value.
	path   string
	expr   string
	val    funcs.Value
	unit   units.Unit
	input  bool
	formul *check.Node // the field's own expression, when written in a record literal
	desc   string
}

// checkRow is a design check as the summary shows it.
type checkRow struct {
	cell                   *check.Cell
	known, pass            bool
	demand, capacity, util float64
	unit                   units.Unit
	calcRow                int
}

// tableBlock is a table on the Data tab.
type tableBlock struct {
	path  string // Sheaf path: threads, res.samples
	desc  string
	t     *funcs.TableValue
	units []units.Unit
	input bool // a table of the sheet: its entries are editable
	row   int  // first row (the title)
}

// firstDataRow is the Data row of a block's first entry.
func (b *tableBlock) firstDataRow() int { return b.row + 2 }

// pathName returns the defined name of a Sheaf path: the first part is
// mangled by DefinedName, the rest kept (fields and columns after periods).
func (x *exporter) pathName(p string) string {
	head, rest, dotted := strings.Cut(p, ".")
	n := DefinedName(head)
	if dotted {
		n += "." + rest
	}
	return x.names.take(n)
}

// layout places every row and table and names every value, before any
// formula is translated (a formula may use a cell written further down).
func (x *exporter) layout() {
	row := 3 // row 1: title, row 2: column headers
	section := ""
	headings := 0
	for i := range x.r.Cells {
		if s := x.r.Cells[i].Cell.Section; s != section {
			section = s
			if s != "" {
				headings++
			}
		}
	}
	section = ""
	x.rows = make([]calcRow, 0, len(x.r.Cells)+headings) // record fields may add more
	for i := range x.r.Cells {
		cr := &x.r.Cells[i]
		c := cr.Cell
		if c.Section != section {
			section = c.Section
			if section != "" {
				x.rows = append(x.rows, calcRow{kind: rowHeading, row: row, title: section})
				row++
			}
		}
		x.rows = append(x.rows, calcRow{kind: rowCell, row: row, cr: cr})
		x.stats.Cells++
		valueRow := row
		row++
		if c.Kind == engine.Function {
			continue
		}
		r := ref{name: x.pathName(c.Name), factor: cr.Unit.Factor}
		if r.factor == 0 {
			r.factor = 1
		}
		if c.Type != nil && c.Type.Kind == funcs.Bool {
			r.bool = true
		}
		if c.Kind == engine.Check {
			r.factor = 1
			x.checks = append(x.checks, x.checkOf(c, valueRow))
		}
		x.tr.refs[c.Name] = r
		if cr.Known {
			if v, ok := cr.Value.(float64); ok {
				x.values[c.Name] = valueAt{v, units.Unit{Factor: r.factor, Symbol: cr.Unit.Symbol}}
			}
		}
		switch v := cr.Value.(type) {
		case *funcs.RecordValue:
			row = x.layoutRecord(c, c.Name, v, c.Kind == engine.Input, c.Body, row)
		case *funcs.TableValue:
			x.addTable(c.Name, c.Description, v, x.tableUnits(c, v), c.Kind == engine.Table && len(c.Entries) == 0)
		}
	}
	// The Data tab follows the order the tables were met.
	drow := 1
	for _, b := range x.tables {
		b.row = drow
		n := b.t.Rows()
		for j, fld := range b.t.Type.Fields {
			col, _ := excelize.ColumnNumberToName(j + 1)
			rng := dataColumnRef(col, b.firstDataRow(), b.firstDataRow()+max(n, 1)-1)
			p := b.path + "." + fld.Name
			x.tr.refs[p] = ref{name: x.pathName(p), factor: b.units[j].Factor, rows: n}
			x.dataRanges = append(x.dataRanges, namedRange{x.tr.refs[p].name, rng})
		}
		drow += n + 3
	}
	x.markOpaque()
}

// translated is a formula or the reason there is none.
type translated struct {
	f    string
	err  error
	done bool // the cell was translated
}

// formula returns the translation of cell i, if it was translated.
func (x *exporter) formula(i int) (translated, bool) {
	if i < 0 || i >= len(x.formulas) {
		return translated{}, false
	}
	t := x.formulas[i]
	return t, t.done
}

// markOpaque translates every derived cell in dependency order and finds,
// for each live formula, the opaque cells it reads through other formulas:
// a client who changes an input upstream of those will not see the change
// reach it, and the note says so.
func (x *exporter) markOpaque() {
	p := x.s.Program()
	n := len(p.Cells)
	x.formulas = make([]translated, n)
	x.opaque = make([]bool, n)
	x.reads = make([][]string, n)
	for _, i := range p.Order {
		c := p.Cells[i]
		cr := &x.r.Cells[i]
		switch c.Kind {
		case engine.Derived:
			switch cr.Value.(type) {
			case float64, bool:
				f, err := x.tr.cellFormula(c.Body, x.tr.refs[c.Name].factor)
				x.formulas[i] = translated{f, err, true}
				x.opaque[i] = err != nil
			default:
				x.opaque[i] = !(c.Body != nil && c.Body.Op == check.OpRecord)
			}
		case engine.Check:
			f, err := x.tr.checkFormula(c)
			x.formulas[i] = translated{f, err, true}
			x.opaque[i] = err != nil
		}
		if x.opaque[i] {
			continue
		}
		var reads []string
		for _, d := range c.DepIdx {
			if d < 0 || d >= n {
				continue
			}
			if x.opaque[d] {
				reads = append(reads, p.Cells[d].Name)
			}
			reads = append(reads, x.reads[d]...)
		}
		slices.Sort(reads)
		x.reads[i] = slices.Compact(reads)
	}
}

// calcValueRef is the absolute reference of the value cell in row on the
// Calculation tab: Calculation!$E$12.
func calcValueRef(row int) string {
	return TabCalc + "!$" + colValue + "$" + strconv.Itoa(row)
}

// dataColumnRef is the absolute reference of rows first to last of column
// col on the Data tab: Data!$B$4:$B$20.
func dataColumnRef(col string, first, last int) string {
	return TabData + "!$" + col + "$" + strconv.Itoa(first) + ":$" + col + "$" + strconv.Itoa(last)
}

// namedRange is a defined name of a column range on the Data tab.
type namedRange struct{ name, rng string }

// layoutRecord adds a row for each field of a record value, below the
// record's own row, and names the numeric ones path-wise (steel.E).
func (x *exporter) layoutRecord(c *check.Cell, path string, v *funcs.RecordValue, input bool, lit *check.Node, row int) int {
	if v.Type == nil {
		return row
	}
	for i, fld := range v.Type.Fields {
		if i >= len(v.Fields) {
			break
		}
		p := path + "." + fld.Name
		var arg *check.Node
		if lit != nil && lit.Op == check.OpRecord && i < len(lit.Args) && lit.Type != nil && i < len(lit.Type.Fields) && lit.Type.Fields[i].Name == fld.Name {
			arg = lit.Args[i]
		}
		fr := calcRow{kind: rowField, row: row, path: p, val: v.Fields[i], input: input, formul: arg, desc: fld.Doc}
		if arg != nil {
			fr.expr = x.exprText(c, arg)
		}
		switch fv := v.Fields[i].(type) {
		case float64:
			fr.unit = x.fieldUnit(c, arg, fld.Type)
			x.tr.refs[p] = ref{name: x.pathName(p), factor: fr.unit.Factor}
			x.values[p] = valueAt{fv, fr.unit}
			x.rows = append(x.rows, fr)
			row++
		case bool:
			x.tr.refs[p] = ref{name: x.pathName(p), factor: 1, bool: true}
			x.rows = append(x.rows, fr)
			row++
		case *funcs.RecordValue:
			x.rows = append(x.rows, fr)
			row = x.layoutRecord(c, p, fv, input, arg, row+1)
		case *funcs.TableValue:
			x.rows = append(x.rows, fr)
			row++
			x.addTable(p, fld.Doc, fv, x.tableUnits(nil, fv), false)
		default:
			x.rows = append(x.rows, fr)
			row++
		}
	}
	return row
}

// exprText is the source text of a node of cell c's expression.
func (x *exporter) exprText(c *check.Cell, n *check.Node) string {
	if c.Formula == nil {
		return ""
	}
	base := c.Formula.Source.Range.Start.Offset
	a, b := n.Range().Start.Offset-base, n.Range().End.Offset-base
	if a < 0 || b > len(c.Formula.Source.Text) || a > b {
		return ""
	}
	return oneLine(c.Formula.Source.Text[a:b])
}

// fieldUnit is the display unit of a record field: the unit written on
// its literal, else the preferred unit of the sheet's system.
func (x *exporter) fieldUnit(c *check.Cell, arg *check.Node, t *funcs.Type) units.Unit {
	if arg != nil {
		if q := arg.Quantity(); q != nil && q.Unit.Factor != 0 {
			return q.Unit
		}
	}
	if t == nil {
		return units.Unit{Factor: 1}
	}
	return x.preferred(t.Dim)
}

func (x *exporter) preferred(d units.Dim) units.Unit {
	if d.IsNone() {
		return units.Unit{Factor: 1}
	}
	u, _ := units.Preferred(d, x.s.System())
	if u.Factor == 0 {
		u = units.Coherent(d)
	}
	if u.Factor == 0 {
		u.Factor = 1
	}
	return u
}

// tableUnits are the display units of a table's columns: as written in the
// header of a table of the sheet, else preferred.
func (x *exporter) tableUnits(c *check.Cell, t *funcs.TableValue) []units.Unit {
	out := make([]units.Unit, len(t.Type.Fields))
	var cols []sheet.Column
	if c != nil && c.Kind == engine.Table {
		for _, it := range x.s.File().Items {
			if tb, ok := it.(*sheet.Table); ok && tb.Name.Name == c.Name {
				cols = tb.Columns
			}
		}
	}
	for i, f := range t.Type.Fields {
		out[i] = x.preferred(f.Type.Dim)
		for _, col := range cols {
			if col.Name.Name == f.Name && col.Unit != nil {
				if u, err := units.Parse(col.Unit.Text); err == nil && u.Dim == f.Type.Dim {
					out[i] = u
				}
			}
		}
	}
	return out
}

func (x *exporter) addTable(path, desc string, t *funcs.TableValue, us []units.Unit, input bool) {
	if t == nil || t.Type == nil {
		return
	}
	x.tables = append(x.tables, &tableBlock{path: path, desc: desc, t: t, units: us, input: input})
	x.stats.Tables++
}

func (x *exporter) checkOf(c *check.Cell, row int) *checkRow {
	cr := &checkRow{cell: c, calcRow: row}
	for _, ch := range x.r.Checks {
		if ch.Cell == c {
			cr.known, cr.pass = ch.Known, ch.Pass
			cr.demand, cr.capacity, cr.util, cr.unit = ch.Demand, ch.Capacity, ch.Util, ch.Unit
		}
	}
	if cr.unit.Factor == 0 {
		cr.unit.Factor = 1
	}
	return cr
}

// workbookProps sets what belongs to the whole workbook: the defined
// names, full recalculation on load, the document properties.
func (x *exporter) workbookProps() error {
	names := make([]excelize.DefinedName, 0, len(x.rows)+len(x.dataRanges))
	for _, r := range x.rows {
		if r.kind == rowHeading {
			continue
		}
		p := r.path
		if r.kind == rowCell {
			if r.cr.Cell.Kind == engine.Function {
				continue
			}
			p = r.cr.Cell.Name
		}
		rf, ok := x.tr.refs[p]
		if !ok {
			continue
		}
		names = append(names, excelize.DefinedName{Name: rf.name, RefersTo: calcValueRef(r.row), Comment: p})
	}
	for _, nr := range x.dataRanges {
		names = append(names, excelize.DefinedName{Name: nr.name, RefersTo: nr.rng})
	}
	if i, err := addNames(x.f, names); err != nil {
		if d := names[i]; d.Comment != "" {
			return fmt.Errorf("defined name %s for %s: %w", d.Name, d.Comment, err)
		}
		return fmt.Errorf("defined name %s: %w", names[i].Name, err)
	}
	full := true
	if err := x.f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full}); err != nil {
		return err
	}
	m := x.s.Meta()
	return x.f.SetDocProps(&excelize.DocProperties{Title: m.Title, Subject: m.Project, Creator: m.Author, Revision: m.Revision,
		Description: "Calculation sheet " + x.s.Name() + ", exported by " + x.gen})
}
