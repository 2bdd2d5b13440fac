package xlsxout

import (
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/units"
)

// A chart of bar samples marks every design check that compares one of
// the plotted samples with a limit: the limit as a horizontal line, the
// design point (the sample the check uses) as a single marker, each named
// in the legend with its value and unit. A check is marked only when one
// of its sides is, through cells that merely pass a value on, one of
//
//	res.samples.q[k]            the sample k
//	max(res.samples.q), min(…)  the largest, the smallest sample
//	res.q_max                   the largest |q| (sigma_max, N_max, u_max)
//	res.u_start, res.u_end      the first, the last displacement
//
// optionally inside abs(...), and when the sample it names equals that
// side's value in Sheaf's check (relative 1e-9). Anything else is not
// marked: a marker at a point the check does not use would be misread as
// the check.
//
// The limit is the other side of the check: its cell on the Summary (the
// capacity of `<=`, the demand of `>=`), so the line and its legend follow
// an edit of it. A check of a magnitude
// (abs, or a largest |q|) draws its limit on the side of the design point:
// -110 MPa for a pipe in compression checked by |σ| ≤ 110 MPa.
//
// A chart of an N–ε curve (n_eps_curve of a composite) marks every check
// whose capacity is, through cells that merely pass a value on, the squash
// load of the same composite (squash_load), compared with `<=` or `<`: the
// squash load as a horizontal line on the compression side (-N_pl,Rd, where
// the curve's plateau ends), and the design point (ε_Ed, -N_Ed), when the
// sheet computes the strain at the demand: a cell that is
// strain_for_force(c, -N_Ed) of the same composite (or minus it), with no
// temperature change, shown in the combination that governs the check.
// Without that cell the check is not marked: the exporter does not solve
// for the strain, and a point between samples would be a guess.
//
// The numbers of the marks sit on the Charts tab right of the print area
// (the series need cells; a spreadsheet plots no hidden cells). A status
// line above each chart turns to chartStale once an input upstream of the
// samples or of a marked check changes.

// chartMark is one check marked on one chart.
type chartMark struct {
	k         int     // index into x.checks (the Summary row)
	i         int     // the sample of the design point; -1: at px, py
	px, py    float64 // the design point off the samples (SI), i < 0
	pointCell int     // the cell that gives px, -1 for none
	sign      float64 // the limit is drawn at sign·limit
	magnitude bool    // the check compares |q|
	limit     float64 // the other side of the check, SI
	limitCol  string  // its column on the Summary: D (capacity) or C (demand)
	limitText string  // its expression as written
	op        string  // the comparison read with the sample on the left: "≤" or "≥"
}

// maxMarks bounds the checks marked on one chart (four helper rows each,
// within the chart's rows).
const maxMarks = chartHeight/4 - 1

// sampleFields are the fields of a bar result that are a sample: the
// column, and for a largest magnitude the field of its position.
var sampleFields = map[string]struct {
	col, at string
	first   bool // u_start
	last    bool // u_end
}{
	"sigma_max": {col: "sigma", at: "x_sigma_max"},
	"N_max":     {col: "N", at: "x_N_max"},
	"u_max":     {col: "u", at: "x_u_max"},
	"u_start":   {col: "u", first: true},
	"u_end":     {col: "u", last: true},
}

// sampleUse is what a demand picks from a table of samples.
type sampleUse struct {
	table string // path of the table: res.samples
	col   string // the column: sigma
	how   byte   // 'k' index, '+' max, '-' min, 'm' largest |q|, 'f' first, 'l' last
	k     int
	at    string // 'm': path of the field giving the position (res.x_sigma_max)
	abs   bool
}

// sampleOf traces a demand to the sample it uses; ok is false for any
// other demand.
func (x *exporter) sampleOf(n check.Node) (u sampleUse, ok bool) {
	cells := x.s.Program().Cells
	for depth := 0; !n.IsZero() && depth < 32; depth++ {
		switch {
		case n.Op() == check.OpBuiltin && n.Builtin() == check.BAbs && n.NArg() == 1:
			u.abs = true
			n = n.Arg(0)
		case n.Op() == check.OpCell:
			c := cells[n.Index()]
			if c.Kind != check.Derived || c.Body().IsZero() {
				return u, false
			}
			n = c.Body()
		case n.Op() == check.OpIndex && n.NArg() == 2 && n.Arg(1).Op() == check.OpConst:
			k := n.Arg(1).Num()
			if k != math.Trunc(k) || k < 0 || k > 1e9 {
				return u, false
			}
			u.how, u.k = 'k', int(k)
			return u, x.columnOf(n.Arg(0), &u)
		case n.Op() == check.OpBuiltin && (n.Builtin() == check.BMax || n.Builtin() == check.BMin) && n.NArg() == 1:
			u.how = '+'
			if n.Builtin() == check.BMin {
				u.how = '-'
			}
			return u, x.columnOf(n.Arg(0), &u)
		case n.Op() == check.OpField && n.Arg(0).Op() == check.OpCell:
			rec := n.Arg(0)
			if rec.Type() == nil || rec.Type().Name != "bar_result" {
				return u, false
			}
			f, known := sampleFields[rec.Type().Fields[n.Index()].Name]
			if !known {
				return u, false
			}
			name := cells[rec.Index()].Name
			u.table, u.col = name+".samples", f.col
			switch {
			case f.first:
				u.how = 'f'
			case f.last:
				u.how = 'l'
			default:
				u.how, u.at = 'm', name+"."+f.at
			}
			return u, true
		default:
			return u, false
		}
	}
	return u, false
}

// columnOf reads res.samples.q (a column of the samples of a cell) into u.
func (x *exporter) columnOf(n check.Node, u *sampleUse) bool {
	if n.Op() != check.OpColumn || n.Arg(0).Op() != check.OpField || n.Arg(0).Args()[0].Op() != check.OpCell {
		return false
	}
	t := n.Arg(0)
	if t.Type() == nil || t.Type().Name != "bar_samples" || t.Arg(0).Type() == nil || t.Arg(0).Type().Name != "bar_result" {
		return false
	}
	u.table = x.s.Program().Cells[t.Arg(0).Index()].Name + "." + t.Arg(0).Type().Fields[t.Index()].Name
	u.col = t.Type().Fields[n.Index()].Name
	return true
}

// marksOf lists the checks marked on chart s.
func (x *exporter) marksOf(s chartSpec) []chartMark {
	if s.b.t.Type.Name == "n_eps_curve" {
		return x.curveMarks(s)
	}
	if s.b.t.Type.Name != "bar_samples" {
		return nil
	}
	var out []chartMark
	for k, ch := range x.checks {
		if !ch.known || len(out) == maxMarks {
			continue
		}
		m, ok := x.markOf(s, k, ch)
		if ok {
			out = append(out, m)
		}
	}
	return out
}

// markOf is the mark of check k on chart s, when one side of the check is
// a sample of the chart. The checker keeps the sides as demand and
// capacity (`a >= b` has demand b), as the Summary shows them.
func (x *exporter) markOf(s chartSpec, k int, ch *checkRow) (chartMark, bool) {
	c := ch.cell
	type side struct {
		n        check.Node
		v        float64
		other    check.Node
		otherV   float64
		otherCol string
		op       string
	}
	le, ge := "≤", "≥"
	xc := c.Extra()
	if xc.Op == "<" || xc.Op == ">" {
		le, ge = "<", ">"
	}
	sides := []side{{xc.Demand, ch.demand, xc.Capacity, ch.capacity, "D", le}, {xc.Capacity, ch.capacity, xc.Demand, ch.demand, "C", ge}}
	ys := s.b.t.Cols[s.yc]
	for _, sd := range sides {
		if math.IsInf(sd.otherV, 0) || math.IsNaN(sd.otherV) {
			continue
		}
		u, ok := x.sampleOf(sd.n)
		if !ok || u.table != s.b.path || u.col != s.b.t.Type.Fields[s.yc].Name || !x.sameCombination(s.b.path, c) {
			continue
		}
		i := pickSample(ys, s.b.t.Cols[s.xc], u, x.values)
		if i < 0 {
			continue
		}
		v := ys[i]
		if u.abs || u.how == 'm' {
			v = math.Abs(v)
		}
		if math.Abs(v-sd.v) > 1e-9*math.Max(math.Abs(v), math.Abs(sd.v)) {
			continue // not the sample the check compared: no mark
		}
		m := chartMark{k: k, i: i, pointCell: -1, sign: 1, magnitude: u.abs || u.how == 'm', limit: sd.otherV, limitCol: sd.otherCol, op: sd.op}
		if !sd.other.IsZero() {
			m.limitText = sd.other.Text()
			if sd.other.Op() == check.OpConst {
				m.limitText = "" // the value says it
			}
		}
		if m.magnitude && ys[i] < 0 {
			m.sign = -1
		}
		return m, true
	}
	return chartMark{}, false
}

// passOn follows n through cells that merely pass a value on (a cell
// whose expression is another cell) and returns the last cell reached, or
// n when it is no cell.
func (x *exporter) passOn(n check.Node) check.Node {
	cells := x.s.Program().Cells
	for depth := 0; !n.IsZero() && n.Op() == check.OpCell && depth < 32; depth++ {
		c := cells[n.Index()]
		if c.Kind != check.Derived || c.Body().IsZero() || c.Body().Op() != check.OpCell {
			return n
		}
		n = c.Body()
	}
	return n
}

// sameCell reports whether a and b, followed through cells that pass a
// value on, end at one cell.
func (x *exporter) sameCell(a, b check.Node) bool {
	a, b = x.passOn(a), x.passOn(b)
	return !a.IsZero() && !b.IsZero() && a.Op() == check.OpCell && b.Op() == check.OpCell && a.Index() == b.Index()
}

// pluginCall is n, or the expression of the cell n reaches through cells
// that pass a value on, when it is a call of the plugin name; nil otherwise.
func (x *exporter) pluginCall(n check.Node, name string) check.Node {
	n = x.passOn(n)
	if !n.IsZero() && n.Op() == check.OpCell {
		if c := x.s.Program().Cells[n.Index()]; c.Kind == check.Derived {
			n = c.Body()
		}
	}
	if n.IsZero() || n.Op() != check.OpPlugin || n.Def() == nil || n.Def().Name != name {
		return check.Node{}
	}
	return n
}

// curveMarks lists the checks marked on chart s of an N–ε curve.
func (x *exporter) curveMarks(s chartSpec) []chartMark {
	owner := x.cellIndex(s.b.path)
	if owner < 0 {
		return nil
	}
	cells := x.s.Program().Cells
	curve := x.pluginCall(cells[owner].Body(), "n_eps_curve")
	if curve.IsZero() || curve.NArg() == 0 || x.comboDep(owner) {
		return nil
	}
	comp := curve.Arg(0)
	var out []chartMark
	for k, ch := range x.checks {
		c := ch.cell
		xc := c.Extra()
		if !ch.known || len(out) == maxMarks || xc.Op != "<=" && xc.Op != "<" || !(ch.demand >= 0) || !(ch.capacity > 0) {
			continue
		}
		sq := x.pluginCall(xc.Capacity, "squash_load")
		if sq.IsZero() || sq.NArg() == 0 || !x.sameCell(sq.Arg(0), comp) {
			continue
		}
		cell, eps, ok := x.strainAt(comp, c, ch)
		if !ok {
			continue
		}
		op := "≤"
		if xc.Op == "<" {
			op = "<"
		}
		m := chartMark{k: k, i: -1, px: eps, py: -ch.demand, pointCell: cell, sign: -1, magnitude: true,
			limit: ch.capacity, limitCol: "D", op: op}
		if xc.Capacity.Op() != check.OpConst {
			m.limitText = xc.Capacity.Text()
		}
		out = append(out, m)
	}
	return out
}

// strainAt finds a cell of the sheet that is the strain at which the
// composite comp carries minus the demand of check c: strain_for_force(comp,
// -D) or minus it, D the demand's cell, no temperature change, in the
// combination that governs c. It returns the cell and the strain (SI).
func (x *exporter) strainAt(comp check.Node, c *check.Cell, ch *checkRow) (int, float64, bool) {
	cells := x.s.Program().Cells
	gov := -1
	if x.r.Combos != nil {
		for _, r := range x.r.Checks {
			if r.Cell == c && r.Combo != nil {
				gov = comboIndex(x.r.Combos, r.Combo.Governing)
			}
		}
	}
	for i, cell := range cells {
		if cell.Kind != check.Derived || cell.Body().IsZero() || !x.r.Cells[i].Known {
			continue
		}
		v, ok := x.r.Cells[i].Value.(float64)
		if !ok {
			continue
		}
		body, sign := cell.Body(), 1.0
		if body.Op() == check.OpNeg {
			body, sign = body.Arg(0), -1
		}
		if body.Op() != check.OpPlugin || body.Def() == nil || body.Def().Name != "strain_for_force" || body.NArg() < 2 {
			continue
		}
		if body.NArg() > 2 && !body.Arg(2).IsZero() && !(body.Arg(2).Op() == check.OpConst && body.Arg(2).Num() == 0) {
			continue // a temperature change: not the curve's strain
		}
		f := body.Arg(1)
		if !x.sameCell(body.Arg(0), comp) || f.Op() != check.OpNeg || !x.sameCell(f.Arg(0), c.Extra().Demand) {
			continue
		}
		if x.cellCombo(i) != gov {
			continue // the strain of another combination
		}
		return i, sign * v, true
	}
	return -1, 0, false
}

// pickSample is the index of the sample u uses, -1 when there is none.
func pickSample(ys, xs []float64, u sampleUse, values map[string]valueAt) int {
	n := len(ys)
	if n == 0 {
		return -1
	}
	switch u.how {
	case 'k':
		if u.k < n {
			return u.k
		}
	case 'f':
		return 0
	case 'l':
		return n - 1
	case '+', '-':
		best := 0
		for i, y := range ys {
			if u.how == '+' && y > ys[best] || u.how == '-' && y < ys[best] {
				best = i
			}
		}
		return best
	case 'm':
		big := 0.0
		for _, y := range ys {
			big = math.Max(big, math.Abs(y))
		}
		// Of the samples as large as the largest (a uniform force), the
		// one nearest to where the solver says the largest is.
		at, hasAt := values[u.at]
		best, dist := -1, math.Inf(1)
		for i, y := range ys {
			if math.Abs(math.Abs(y)-big) > 1e-12*big {
				continue
			}
			d := 0.0
			if hasAt {
				d = math.Abs(xs[i] - at.si)
			}
			if d < dist {
				best, dist = i, d
			}
		}
		return best
	}
	return -1
}

// sameCombination reports whether the samples of path and check c show
// the same combination (always, in a sheet without actions): a limit of
// one combination against the samples of another is not drawn.
func (x *exporter) sameCombination(path string, c *check.Cell) bool {
	cs := x.r.Combos
	if cs == nil {
		return true
	}
	owner := x.cellIndex(strings.TrimSuffix(path, ".samples"))
	var gov string
	for _, r := range x.r.Checks {
		if r.Cell == c && r.Combo != nil {
			gov = r.Combo.Governing
		}
	}
	oc := x.cellCombo(owner)
	if gov == "" || owner < 0 {
		return oc < 0 && !x.comboDep(c.Index)
	}
	return oc >= 0 && oc == comboIndex(cs, gov)
}

// cellIndex is the index of the cell named name, -1 when none.
func (x *exporter) cellIndex(name string) int {
	for i, c := range x.s.Program().Cells {
		if c.Name == name {
			return i
		}
	}
	return -1
}

// Colours of the marks (ours): the limit in red, dashed; the design point
// as a dark blue circle.
const (
	colLimit = "C00000"
	colPoint = "1F3A93"
)

// Each check marked on one chart has its own dash and symbol, so that a
// line and a point are told apart from those of another check in print.
var (
	limitDashes  = []excelize.LineDashType{excelize.LineDashDash, excelize.LineDashLgDashDot, excelize.LineDashSysDot, excelize.LineDashLgDash, excelize.LineDashSysDashDotDot}
	pointSymbols = []string{"circle", "diamond", "triangle", "square", "x"}
)

// marksColumn is the first column of the marks' numbers, right of the
// printed area (the chart spans B:O).
const marksColumn = 18 // R

// chartsPrintWidth is the last printed column of the Charts tab (P).
const chartsPrintWidth = 16

// writeMarks writes the cells of the marks of chart s, whose rows start at
// top, and returns the series that draw them (after the samples').
func (x *exporter) writeMarks(s chartSpec, marks []chartMark, top int, put func(col, row int, c excelize.Cell)) []excelize.ChartSeries {
	const tab = TabCharts
	abs := func(col, row int) string {
		c, _ := excelize.ColumnNumberToName(col)
		return tab + "!$" + c + "$" + strconv.Itoa(row)
	}
	xu, yu := s.b.units[s.xc], s.b.units[s.yc]
	xs, ys := s.b.t.Cols[s.xc], s.b.t.Cols[s.yc]
	yUnit := unitText(yu)
	q := s.b.t.Type.Fields[s.yc].Name
	sym := map[string]string{"sigma": "σ", "N": "N", "u": "u"}[q]
	if sym == "" {
		sym = q
	}
	xNum := func(v float64) string { return units.FormatNumber(v/xu.Factor, x.sig) }
	nameCol, xCol, yCol := marksColumn, marksColumn+1, marksColumn+2
	var series []excelize.ChartSeries
	var keys []int32
	for j, m := range marks {
		ch := x.checks[m.k]
		row := top + 4*j
		// The limit: the capacity on the Summary, in the chart's unit.
		factor := m.sign * ch.unit.Factor / yu.Factor
		capRef := TabSummary + "!$" + m.limitCol + "$" + strconv.Itoa(summaryFirstCheck+m.k)
		yf := capRef
		if factor != 1 {
			yf = capRef + "*" + num(factor).operand()
		}
		yv := m.sign * m.limit / yu.Factor
		for r, xv := range []float64{xs[0], xs[len(xs)-1]} {
			put(xCol, row+r, excelize.Cell{Value: xv / xu.Factor})
			put(yCol, row+r, excelize.Cell{Value: yv, Formula: yf})
		}
		what := sym
		if m.magnitude {
			what = "|" + sym + "|"
		}
		head := "limit of check " + ch.cell.Name + ": " + what + " " + m.op + " "
		tail := " " + yUnit
		if m.limitText != "" {
			tail += " (" + m.limitText + ")"
		}
		// The value in the legend follows the Summary's capacity, at the
		// precision the workbook shows numbers with.
		capShown := m.limit / yu.Factor
		code := numFormat(capShown, x.sig)
		capText := "TEXT(" + capRef + "*" + num(ch.unit.Factor/yu.Factor).operand() + "," + quoted(code) + ")"
		label := quoted(head) + "&" + capText + "&" + quoted(tail)
		cached := head + formatAs(capShown, code) + tail
		if m.sign < 0 {
			label += "&" + quoted(", drawn at ") + "&" + strings.Replace(capText, "TEXT(", "TEXT(-", 1)
			cached += ", drawn at " + formatAs(-capShown, code)
		}
		put(nameCol, row, excelize.Cell{Value: cached, Formula: label})
		series = append(series, excelize.ChartSeries{
			Name: abs(nameCol, row), Categories: abs(xCol, row) + ":" + strings.TrimPrefix(abs(xCol, row+1), tab+"!"),
			Values: abs(yCol, row) + ":" + strings.TrimPrefix(abs(yCol, row+1), tab+"!"),
			Marker: excelize.ChartMarker{Symbol: "none"},
			Line:   excelize.LineOptions{Type: excelize.LineSolid, Dash: limitDashes[j%len(limitDashes)], Width: 1.5},
			Fill:   excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colLimit}},
		})
		// The design point: the sample the check uses, or the point
		// Sheaf computed on the curve, from Sheaf.
		px, py := m.px, m.py
		if m.i >= 0 {
			px, py = xs[m.i], ys[m.i]
		}
		pr := row + 2
		put(xCol, pr, excelize.Cell{Value: px / xu.Factor})
		put(yCol, pr, excelize.Cell{Value: py / yu.Factor})
		xName := s.b.t.Type.Fields[s.xc].Name
		if xName == "eps" {
			xName = "ε"
		}
		pt := "design point of check " + ch.cell.Name + ": " + sym + " = " + withUnit(units.FormatNumber(py/yu.Factor, x.sig), yUnit) +
			" at " + xName + " = " + withUnit(xNum(px), unitText(xu))
		put(nameCol, pr, excelize.Cell{Value: pt})
		series = append(series, excelize.ChartSeries{
			Name: abs(nameCol, pr), Categories: abs(xCol, pr), Values: abs(yCol, pr),
			Marker: excelize.ChartMarker{Symbol: pointSymbols[j%len(pointSymbols)], Size: 9, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colPoint}}},
			Line:   excelize.LineOptions{Type: excelize.LineNone},
		})
		keys = append(keys, x.stale[ch.cell.Index]...)
		if m.pointCell >= 0 {
			keys = append(keys, x.stale[m.pointCell]...)
		}
	}
	// The status line above the chart.
	if owner := x.cellIndex(strings.TrimSuffix(s.b.path, ".samples")); owner >= 0 {
		keys = append(keys, x.stale[owner]...)
	}
	slices.Sort(keys)
	keys = slices.Compact(keys)
	if g := x.guardExpr(keys); g != "" {
		put(2, top-1, excelize.Cell{StyleID: x.st.id(clsFail, ""), Value: "", Formula: "IF(" + g + "," + quoted(chartStale) + `,"")`})
	}
	return series
}

// chartStale is the status line of a chart once an input it depends on
// changed.
const chartStale = "OUT OF DATE: an input the samples or the marked checks depend on changed; the chart shows the Sheaf run: rerun Sheaf"

// withUnit is a number and its unit, with a space between them, or the
// number alone for a plain number.
func withUnit(v, unit string) string {
	if unit == "" {
		return v
	}
	return v + " " + unit
}

// unitText is a unit as a chart shows it ("" for a plain number).
func unitText(u units.Unit) string {
	if p := u.Pretty(); p != "1" {
		return p
	}
	return ""
}

// streamCells writes sparse cells (by row, then column) to an empty tab.
func (x *exporter) streamCells(tab string, cells map[int]map[int]excelize.Cell) error {
	sw, err := x.f.NewStreamWriter(tab)
	if err != nil {
		return err
	}
	rows := make([]int, 0, len(cells))
	for r := range cells {
		rows = append(rows, r)
	}
	slices.Sort(rows)
	for _, r := range rows {
		last := 0
		for c := range cells[r] {
			last = max(last, c)
		}
		vals := make([]any, last)
		for c, v := range cells[r] {
			vals[c-1] = v
		}
		ref, _ := excelize.CoordinatesToCellName(1, r)
		if err := sw.SetRow(ref, vals); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// formatAs writes v as a spreadsheet's TEXT(v, code) does for a number
// format of numFormat ("0.00", "0.000E+00"), so that the cached legend is
// what the spreadsheet computes.
func formatAs(v float64, code string) string {
	mant, sci := strings.CutSuffix(code, "E+00")
	d := 0
	if _, frac, ok := strings.Cut(mant, "."); ok {
		d = len(frac)
	}
	if sci {
		return strconv.FormatFloat(v, 'E', d, 64)
	}
	return strconv.FormatFloat(v, 'f', d, 64)
}
