package xlsxout

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/engine/check"
)

// nodeAlias keeps the summary's signature short.
type nodeAlias = check.Node

// writeData writes every table, one block under another: a title row, a
// header row of "column [unit]", then the entries in display units. The
// entries of the sheet's own tables are inputs.
func (x *exporter) writeData() error {
	if err := x.writeTables(TabData); err != nil {
		return err
	}
	return x.writeTables(TabSamples)
}

// writeTables writes the tables of one tab.
func (x *exporter) writeTables(tab string) error {
	var blocks []*tableBlock
	for _, b := range x.tables {
		if b.tab == tab {
			blocks = append(blocks, b)
		}
	}
	if len(blocks) == 0 {
		return nil
	}
	if _, err := x.f.NewSheet(tab); err != nil {
		return err
	}
	// Print setup and protection go on before streaming: the stream
	// writer keeps what the tab had, but drops what is set after it.
	if err := x.finishTab(tab, false); err != nil {
		return err
	}
	sw, err := x.f.NewStreamWriter(tab)
	if err != nil {
		return err
	}
	if err := sw.SetColWidth(1, 16, 14); err != nil {
		return err
	}
	for _, b := range blocks {
		title := b.path
		if b.desc != "" {
			title += ": " + b.desc
		}
		locked := b.input && x.locked(b.cell)
		if locked {
			title += " " + noteLocked
		}
		if err := sw.SetRow("A"+strconv.Itoa(b.row), []any{x.text(title, clsHeading)}); err != nil {
			return err
		}
		head := make([]any, len(b.t.Type.Fields))
		fmts := make([]string, len(head))
		for j, f := range b.t.Type.Fields {
			h := f.Name
			if u := b.units[j].Pretty(); u != "" && u != "1" {
				h += " [" + u + "]"
			}
			head[j] = x.text(h, clsHeader)
			big := 0.0
			if j < len(b.t.Cols) {
				for _, v := range b.t.Cols[j] {
					big = math.Max(big, math.Abs(v/b.units[j].Factor))
				}
			}
			fmts[j] = numFormat(big, x.sig)
			if j < len(b.written) && b.written[j] != "" {
				fmts[j] = b.written[j]
			}
		}
		if err := sw.SetRow("A"+strconv.Itoa(b.row+1), head); err != nil {
			return err
		}
		cls := clsData
		if b.input && !locked {
			cls = clsInput
		}
		// The style of a column is the same down the column (made only
		// when there is an entry); one row of cells is reused, as SetRow
		// writes them out before it returns.
		ids := make([]int, len(b.t.Cols))
		cells := make([]excelize.Cell, len(b.t.Cols))
		row := make([]any, len(b.t.Cols))
		for j := range b.t.Cols {
			if b.t.Rows() > 0 {
				ids[j] = x.st.id(cls, fmts[j])
			}
			row[j] = &cells[j]
		}
		for i := 0; i < b.t.Rows(); i++ {
			for j, col := range b.t.Cols {
				cells[j] = excelize.Cell{StyleID: ids[j], Value: col[i] / b.units[j].Factor}
				if s, over := x.beyondRange(col[i], b.units[j].Factor); over {
					cells[j].Value = s // never +Inf for a finite entry
				}
			}
			if b.input && !locked {
				x.stats.Inputs += len(cells)
			}
			if err := sw.SetRow("A"+strconv.Itoa(b.firstDataRow()+i), row); err != nil {
				return err
			}
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	return nil
}

// Chart fonts: axis numbers in black at a size that prints (the default
// grey is close to white on paper).
var (
	axisFont      = excelize.Font{Color: "000000", Size: 10}
	axisTitleFont = excelize.Font{Color: "000000", Size: 10, Bold: true}
)

// chartSpec is one chart: y column against x column of a table.
type chartSpec struct {
	b          *tableBlock
	xc, yc     int
	title      string
	xAxis, yAx string
}

// xMin and xMax are the range of the x values of a chart of bar samples
// in display units (nil for other charts: the axis is scaled to fit).
func (s chartSpec) xMin() *float64 { return s.xEnd(0) }
func (s chartSpec) xMax() *float64 { return s.xEnd(1) }

func (s chartSpec) xEnd(last int) *float64 {
	xs := s.b.t.Cols[s.xc]
	if s.b.t.Type.Name != "bar_samples" || len(xs) < 2 {
		return nil
	}
	v := xs[last*(len(xs)-1)] / s.b.units[s.xc].Factor
	return &v
}

// chartsOf lists the charts of a table by its type name: N(x), u(x) and
// σ(x) of bar samples, N(ε) of a curve. Other tables are not charted.
func chartsOf(b *tableBlock) []chartSpec {
	col := func(n string) int { return b.t.Type.Field(n) }
	label := func(j int, what string) string {
		if u := b.units[j].Pretty(); u != "" && u != "1" {
			return what + " [" + u + "]"
		}
		return what
	}
	// The title says what is plotted and for which result, in the words
	// of the sheet (its description), not by internal name.
	of := b.owner
	if of == "" {
		of = b.path
	}
	var out []chartSpec
	switch b.t.Type.Name {
	case "bar_samples":
		x := col("x")
		if x < 0 {
			return nil
		}
		for _, s := range [][3]string{{"N", "N(x)", "axial force N"}, {"u", "u(x)", "displacement u"}, {"sigma", "σ(x)", "axial stress σ"}} {
			if y := col(s[0]); y >= 0 {
				out = append(out, chartSpec{b, x, y, s[1] + ", " + s[2] + " along the bar: " + of, label(x, "position x"), label(y, s[2])})
			}
		}
	case "n_eps_curve":
		e, n := col("eps"), col("N")
		if e >= 0 && n >= 0 {
			out = append(out, chartSpec{b, e, n, "N(ε), axial force against uniform strain: " + of, label(e, "strain ε"), label(n, "axial force N")})
		}
	}
	return out
}

// chartHeight is the number of rows one chart takes on the Charts tab:
// one chart a printed page (landscape A4), with a page break before each.
const chartHeight = 26

func (x *exporter) writeCharts() error {
	var specs []chartSpec
	for _, b := range x.tables {
		if b.t.Rows() >= 2 {
			specs = append(specs, chartsOf(b)...)
		}
	}
	if len(specs) == 0 {
		return nil
	}
	if _, err := x.f.NewSheet(TabCharts); err != nil {
		return err
	}
	// The cells of the marks go in by a stream writer (which types a
	// formula's cached text and number rightly), after the charts.
	cells := map[int]map[int]excelize.Cell{}
	put := func(col, row int, c excelize.Cell) {
		if cells[row] == nil {
			cells[row] = map[int]excelize.Cell{}
		}
		cells[row][col] = c
	}
	charts := make([]*excelize.Chart, len(specs))
	for i, s := range specs {
		colRange := func(j int) string {
			c, _ := excelize.ColumnNumberToName(j + 1)
			return dataColumnRef(s.b.tab, c, s.b.firstDataRow(), s.b.firstDataRow()+s.b.t.Rows()-1)
		}
		headerRef := func(j int) string {
			c, _ := excelize.ColumnNumberToName(j + 1)
			row := strconv.Itoa(s.b.firstDataRow() - 1)
			return s.b.tab + "!$" + c + "$" + row
		}
		// The series name must be a cell reference: the header of the
		// plotted column. A scatter series draws no line unless its type
		// is set.
		series := []excelize.ChartSeries{{Name: headerRef(s.yc), Categories: colRange(s.xc), Values: colRange(s.yc),
			Marker: excelize.ChartMarker{Symbol: "none"}, Line: excelize.LineOptions{Type: excelize.LineSolid, Width: 1.5}}}
		legend := excelize.ChartLegend{Position: "none"}
		if marks := x.marksOf(s); len(marks) > 0 {
			series = append(series, x.writeMarks(s, marks, 2+i*chartHeight, put)...)
			legend = excelize.ChartLegend{Position: "bottom", Font: &axisFont}
			x.stats.Marks += len(marks)
		}
		charts[i] = &excelize.Chart{
			Type:   excelize.Scatter,
			Series: series,
			Title:  excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s.title}}},
			Legend: legend,
			// The x axis spans the samples (a bar from end to end), not a
			// rounded range beyond them. The numbers of both axes print
			// below and left of the plot even where every value is negative
			// (a strut, a heated pipe, a curve in compression).
			XAxis: excelize.ChartAxis{MajorGridLines: true, Font: axisFont, Minimum: s.xMin(), Maximum: s.xMax(), TickLabelPosition: excelize.ChartTickLabelLow,
				Title: excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s.xAxis, Font: &axisTitleFont}}}},
			YAxis: excelize.ChartAxis{MajorGridLines: true, Font: axisFont, TickLabelPosition: excelize.ChartTickLabelLow,
				Title: excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s.yAx, Font: &axisTitleFont}}}},
			Dimension: excelize.ChartDimension{Width: 900, Height: 460},
		}
	}
	for i, ch := range charts {
		cell, _ := excelize.CoordinatesToCellName(2, 2+i*chartHeight)
		if i > 0 {
			if err := x.f.InsertPageBreak(TabCharts, "A"+strconv.Itoa(1+i*chartHeight)); err != nil {
				return err
			}
		}
		if err := x.f.AddChart(TabCharts, cell, ch); err != nil {
			return fmt.Errorf("chart %q: %w", specs[i].title, err)
		}
		x.stats.Charts++
	}
	numericXValues(x.f)
	// The numbers of the marks lie right of the printed columns.
	last := len(specs) * chartHeight
	end, _ := excelize.ColumnNumberToName(chartsPrintWidth)
	if err := x.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Area", RefersTo: TabCharts + "!$A$1:$" + end + "$" + strconv.Itoa(last), Scope: TabCharts}); err != nil {
		return err
	}
	// Print setup and protection go on before streaming: the stream
	// writer keeps what the tab had (the charts too), but drops what is
	// set after it.
	if err := x.finishTab(TabCharts, true); err != nil {
		return err
	}
	if len(cells) > 0 {
		return x.streamCells(TabCharts, cells)
	}
	return nil
}

// xValText matches the x values of a scatter series written as a text
// reference; xValNumber is what replaces it.
var (
	xValText   = regexp.MustCompile(`<xVal><strRef>(<f>[^<]*</f>)</strRef></xVal>`)
	xValNumber = []byte(`<xVal><numRef>$1</numRef></xVal>`)
)

// numericXValues makes the x values of every scatter series a numeric
// reference. excelize writes them as a text reference, which a spreadsheet
// program may read as category labels and plot at x = 1, 2, 3, …: wrong for
// samples spaced unevenly along a bar (they crowd at every joint and load).
func numericXValues(f *excelize.File) {
	f.Pkg.Range(func(key, value any) bool {
		name, _ := key.(string)
		b, ok := value.([]byte)
		if ok && strings.HasPrefix(name, "xl/charts/chart") {
			f.Pkg.Store(name, xValText.ReplaceAll(b, xValNumber))
		}
		return true
	})
}
