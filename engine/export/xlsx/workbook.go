package xlsxout

import (
	"fmt"
	"regexp"
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
	TabSamples = "Samples"
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
	Marks     int // design checks marked on the charts (a limit line and a design point each)
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
	// liveField marks the fields of records made by a plugin call that the
	// workbook computes by the plugin's spreadsheet form (tube.A).
	liveField   map[string]bool
	staleFields [][]int32 // by record cell: the inputs that make its live fields out of date
	// Guards (see guard.go): the editable inputs, those of each input
	// cell, for each cell the inputs that make it out of date, the tables
	// to lock, the inputs that guard something, the flag of any change.
	keys      []guardKey
	inputKeys [][]int32
	stale     [][]int32
	lockTable []bool
	usedKeys  []int
	anyFlag   string
	anyRow    int
	cmb       *comboBook // a sheet with actions (combos.go); nil otherwise
}

// Build makes the workbook of sheet s with results r (from s.NewState()
// after any overrides, then Eval).
func Build(s *engine.Sheet, r *engine.Results, opt Options) (*excelize.File, Stats, error) {
	x, err := export(s, r, opt)
	if err != nil {
		return nil, x.stats, err
	}
	return x.f, x.stats, nil
}

// export builds the workbook and returns the exporter with its layout.
func export(s *engine.Sheet, r *engine.Results, opt Options) (*exporter, error) {
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
	x.tr = &translator{refs: make(map[string]ref, n), cells: s.Cells(), result: func(i int) (funcs.Value, bool) {
		if i < 0 || i >= len(r.Cells) || !r.Cells[i].Known {
			return nil, false
		}
		return r.Cells[i].Value, true
	}}
	x.layout()
	for _, step := range []func() error{x.writeSummary, x.writeCalc, x.writeCombos, x.writeData, x.writeCharts, x.writeRun, x.finishTabs, x.workbookProps} {
		if err := step(); err != nil {
			_ = x.f.Close()
			return x, err
		}
	}
	if x.st.err != nil {
		_ = x.f.Close()
		return x, x.st.err
	}
	return x, nil
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
	rowComment // a comment of the sheet, in its place
)

// calcRow is one row of the Calculation tab.
type calcRow struct {
	kind  rowKind
	row   int
	title string // heading text
	cr    *engine.CellResult
	// rowField: the record cell, the field path and value.
	path     string
	expr     string
	val      funcs.Value
	unit     units.Unit
	input    bool
	listUnit units.Unit // rowField of a list of numbers: the unit its elements are shown in
	formul   check.Node // the field's own expression, when written in a record literal
	desc     string
	cell     int // rowField: the index of the record cell
	// rowField: the plugin call that made the record, when the field has
	// a spreadsheet form (see translator.pluginField).
	plugin check.Node
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
	input bool   // a table of the sheet: its entries are editable
	cell  int    // the index of the table cell; -1 for a table inside a value
	owner string // the description of the cell the table belongs to
	tab   string // TabData or TabSamples
	// written: the number format of each column of a table of the
	// sheet, which shows its entries as written (generalFormat).
	written []string
	row     int // first row (the title)
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
		if s := x.r.Cells[i].Cell.Section(); s != section {
			section = s
			if s != "" {
				headings++
			}
		}
	}
	section = ""
	comments := x.commentBlocks()
	x.rows = make([]calcRow, 0, len(x.r.Cells)+headings+len(comments)) // record fields may add more
	for i := range x.r.Cells {
		cr := &x.r.Cells[i]
		c := cr.Cell
		if c.Range().Start().File == x.s.Name() {
			for len(comments) > 0 && comments[0].off < c.Range().Start().Offset {
				x.rows = append(x.rows, calcRow{kind: rowComment, row: row, title: comments[0].text})
				row++
				comments = comments[1:]
			}
		}
		if c.Section() != section {
			section = c.Section()
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
		x.inputKeyOf(i)
		if cr.Known {
			if v, ok := cr.Value.(float64); ok {
				x.values[c.Name] = valueAt{v, units.Unit{Factor: r.factor, Symbol: cr.Unit.Symbol}}
			}
		}
		switch v := cr.Value.(type) {
		case *funcs.RecordValue:
			row = x.layoutRecord(c, c.Name, v, c.Kind == engine.Input, c.Body(), row)
		case *funcs.TableValue:
			x.addTable(c.Name, c.Description(), v, x.tableUnits(c, v), c.Kind == engine.Table && len(c.Extra().Entries) == 0, i).setOwner(c.Description())
		}
	}
	for _, b := range comments {
		x.rows = append(x.rows, calcRow{kind: rowComment, row: row, title: b.text})
		row++
	}
	// The tables of the sheet go on the Data tab, the tables Sheaf
	// computed (bar samples, curves) on the Samples tab, each in the order
	// met.
	drow := map[string]int{TabData: 1, TabSamples: 1}
	for _, b := range x.tables {
		b.tab = TabSamples
		if b.input {
			b.tab = TabData
		}
		b.row = drow[b.tab]
		n := b.t.Rows()
		for j, fld := range b.t.Type.Fields {
			col, _ := excelize.ColumnNumberToName(j + 1)
			rng := dataColumnRef(b.tab, col, b.firstDataRow(), b.firstDataRow()+max(n, 1)-1)
			p := b.path + "." + fld.Name
			x.tr.refs[p] = ref{name: x.pathName(p), factor: b.units[j].Factor, rows: n}
			x.dataRanges = append(x.dataRanges, namedRange{x.tr.refs[p].name, rng})
		}
		drow[b.tab] += n + 3
	}
	x.layoutCombos()
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
		if x.comboDep(i) {
			// A value of one combination: only Sheaf computes the others.
			x.formulas[i] = translated{"", x.comboReason(i), true}
			x.opaque[i] = true
			continue
		}
		switch c.Kind {
		case engine.Derived:
			switch cr.Value.(type) {
			case float64, bool:
				f, err := x.tr.cellFormula(c.Body(), x.tr.refs[c.Name].factor)
				x.formulas[i] = translated{f, err, true}
				x.opaque[i] = err != nil
			default:
				x.opaque[i] = !(!c.Body().IsZero() && c.Body().Op() == check.OpRecord)
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
		x.walkRefs(func(d int, live bool) {
			if x.opaque[d] && !live {
				reads = append(reads, p.Cells[d].Name)
			}
			if !live {
				reads = append(reads, x.reads[d]...)
			}
		}, c.Body(), c.Extra().Demand, c.Extra().Capacity)
		slices.Sort(reads)
		x.reads[i] = slices.Compact(reads)
	}
	x.guardStale()
}

// calcValueRef is the absolute reference of the value cell in row on the
// Calculation tab: Calculation!$E$12.
func calcValueRef(row int) string {
	return TabCalc + "!$" + colValue + "$" + strconv.Itoa(row)
}

// dataColumnRef is the absolute reference of rows first to last of column
// col on the Data tab: Data!$B$4:$B$20.
func dataColumnRef(tab, col string, first, last int) string {
	return tab + "!$" + col + "$" + strconv.Itoa(first) + ":$" + col + "$" + strconv.Itoa(last)
}

// namedRange is a defined name of a column range on the Data tab.
type namedRange struct{ name, rng string }

// layoutRecord adds a row for each field of a record value, below the
// record's own row, and names the numeric ones path-wise (steel.E).
func (x *exporter) layoutRecord(c *check.Cell, path string, v *funcs.RecordValue, input bool, lit check.Node, row int) int {
	if v.Type == nil {
		return row
	}
	for i, fld := range v.Type.Fields {
		if i >= len(v.Fields) {
			break
		}
		p := path + "." + fld.Name
		var arg check.Node
		if !lit.IsZero() && lit.Op() == check.OpRecord && i < lit.NArg() && lit.Type() != nil && i < len(lit.Type().Fields) && lit.Type().Fields[i].Name == fld.Name {
			arg = lit.Arg(i)
		}
		fr := calcRow{kind: rowField, row: row, path: p, val: v.Fields[i], input: input, formul: arg, desc: fld.Doc, cell: c.Index}
		if fld.Type != nil && fld.Type.Kind == funcs.List && fld.Type.Elem != nil {
			fr.listUnit = x.preferred(fld.Type.Elem.Dim)
		}
		if path == c.Name && !lit.IsZero() && lit.Op() == check.OpPlugin && !x.comboDep(c.Index) {
			if f := lit.Def().Spreadsheet; f != nil && f.Fields[fld.Name] != "" {
				fr.plugin = lit
				if x.liveField == nil {
					x.liveField = map[string]bool{}
				}
				x.liveField[p] = true
			}
		}
		if !arg.IsZero() {
			fr.expr = x.exprText(c, arg)
		}
		switch fv := v.Fields[i].(type) {
		case float64:
			fr.unit = x.fieldUnit(c, arg, fld.Type)
			fr.desc = withoutSIUnit(fld.Doc, fr.unit)
			x.tr.refs[p] = ref{name: x.pathName(p), factor: fr.unit.Factor}
			x.values[p] = valueAt{fv, fr.unit}
			if input && !arg.IsZero() {
				u := fr.unit.Pretty()
				if u == "1" {
					u = ""
				}
				x.addKey(c.Index, p, fv/fr.unit.Factor, u)
			}
			x.rows = append(x.rows, fr)
			row++
		case bool:
			x.tr.refs[p] = ref{name: x.pathName(p), factor: 1, bool: true}
			if input && !arg.IsZero() {
				x.addKey(c.Index, p, fv, "")
			}
			x.rows = append(x.rows, fr)
			row++
		case *funcs.RecordValue:
			x.rows = append(x.rows, fr)
			row = x.layoutRecord(c, p, fv, input, arg, row+1)
		case *funcs.TableValue:
			x.rows = append(x.rows, fr)
			row++
			x.addTable(p, fld.Doc, fv, x.tableUnits(nil, fv), false, -1).setOwner(c.Description())
		default:
			x.rows = append(x.rows, fr)
			row++
		}
	}
	return row
}

// exprText is the source text of a node of cell c's expression.
func (x *exporter) exprText(c *check.Cell, n check.Node) string {
	if c.Formula == nil {
		return ""
	}
	base := c.Formula.Source.Range.Start().Offset
	a, b := n.Range().Start().Offset-base, n.Range().End().Offset-base
	if a < 0 || b > len(c.Formula.Source.Text) || a > b {
		return ""
	}
	return oneLine(c.Formula.Source.Text[a:b])
}

// fieldUnit is the display unit of a record field: the unit written on
// its literal, else the preferred unit of the sheet's system.
func (x *exporter) fieldUnit(c *check.Cell, arg check.Node, t *funcs.Type) units.Unit {
	if !arg.IsZero() {
		if q := arg.Quantity(); q != nil && q.Unit().Factor != 0 {
			return q.Unit()
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
		cols = x.tableColumns(c)
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

// tableColumns returns the header of the table item that wrote cell c, in
// the file it was written in: the sheet, or the template a `use` inlined
// it from (there its name is the template's own, without the scope).
// The checked program keeps the parsed files (Program.Files), so the header
// is read as it was checked; a template's table used to be shown in the
// preferred unit under a header the template does not have (lengths
// written in cm shown in mm).
func (x *exporter) tableColumns(c *check.Cell) []sheet.Column {
	if tb := x.tableItem(c); tb != nil {
		return tb.Columns
	}
	return nil
}

// tableItem is the table item that wrote table cell c (see tableColumns).
func (x *exporter) tableItem(c *check.Cell) *sheet.Table {
	name := strings.TrimPrefix(c.Name, c.Scope())
	var file *sheet.File
	for _, pf := range x.s.Program().Files {
		if pf != nil && pf.Name == c.Pos().File {
			file = pf
			break
		}
	}
	if file == nil {
		return nil
	}
	for _, it := range file.Items {
		if tb, ok := it.(*sheet.Table); ok && tb.Name.Name == name {
			return tb
		}
	}
	return nil
}

// setOwner records the description of the cell a table belongs to (a nil
// block, a table not exported, takes none).
func (b *tableBlock) setOwner(desc string) {
	if b != nil {
		b.owner = desc
	}
}

// addTable adds a table to the Data tab; nil when it has no type.
func (x *exporter) addTable(path, desc string, t *funcs.TableValue, us []units.Unit, input bool, cell int) *tableBlock {
	if t == nil || t.Type == nil {
		return nil
	}
	b := &tableBlock{path: path, desc: desc, t: t, units: us, input: input, cell: cell}
	if input {
		b.written = make([]string, len(t.Type.Fields))
		for j := range b.written {
			b.written[j] = generalFormat
		}
	}
	x.tables = append(x.tables, b)
	x.stats.Tables++
	return b
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
	names = append(names, x.guardNames()...)
	names = append(names, x.comboNames()...)
	for _, nr := range x.dataRanges {
		names = append(names, excelize.DefinedName{Name: nr.name, RefersTo: nr.rng})
	}
	if i, err := addNames(x.f, names); err != nil {
		if d := names[i]; d.Comment != "" {
			return fmt.Errorf("defined name %s for %s: %w", d.Name, d.Comment, err)
		}
		return fmt.Errorf("defined name %s: %w", names[i].Name, err)
	}
	// The column headers of the Calculation tab print on every page.
	if err := x.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: TabCalc + "!$2:$2", Scope: TabCalc}); err != nil {
		return err
	}
	full := true
	if err := x.f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full}); err != nil {
		return err
	}
	m := x.s.Meta()
	return x.f.SetDocProps(&excelize.DocProperties{Title: m.Title, Subject: m.Project, Creator: m.Author, Revision: m.Revision,
		Description: "Calculation sheet " + x.s.Name() + ", exported by " + x.gen})
}

// siSuffix matches the SI unit a field's description ends with
// ("area, m²", "force [N]").
var siSuffix = regexp.MustCompile(`(,\s*|\s*\[)(m|m²|m³|m⁴|Pa|N|N/m|N·m|K|1/K|kg/m³|rad)\]?($|\s*\()`)

// withoutSIUnit drops the SI unit from the end of a field's description
// when the field is shown in another unit (the Unit column says which):
// "area, m²" beside a value in mm² would be misread.
func withoutSIUnit(doc string, u units.Unit) string {
	if u.Factor == 1 {
		return doc
	}
	return strings.TrimSpace(siSuffix.ReplaceAllStringFunc(doc, func(m string) string {
		if strings.HasSuffix(m, "(") {
			return " ("
		}
		return ""
	}))
}
