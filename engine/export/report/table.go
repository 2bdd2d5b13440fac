package report

import (
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

func itoa(i int) string { return strconv.Itoa(i) }

// table writes a table of the sheet as it is written (column units and
// numbers as the engineer typed them), or from its value when the item is
// not at hand (a table inside a template).
func (d *doc) table(c *engine.Cell, it *sheet.Table) {
	if c == nil {
		return
	}
	d.w("<div class=\"cell table\" id=\"", anchor(c.Name), "\">\n")
	if c.Reference() != "" {
		d.w("<div class=\"ref\">", esc(c.Reference()), "</div>\n")
	}
	d.w("<div class=\"eq\"><span class=\"checkname\">table ", esc(strings.TrimPrefix(c.Name, c.Scope())), "</span></div>\n")
	if c.Description() != "" {
		d.w("<div class=\"desc\">", esc(c.Description()), "</div>\n")
	}
	if it == nil {
		if tv, ok := d.res.Cells[c.Index].Value.(*funcs.TableValue); ok {
			d.tableValue(c, tv)
		}
		d.w("</div>\n")
		return
	}
	d.w("<table class=\"data\"><thead><tr>")
	for _, col := range it.Columns {
		d.w("<th>")
		d.math(func(b *strings.Builder) {
			symbol(b, col.Name.Name)
			if col.Unit != nil {
				b.WriteString("<mspace width=\"0.3em\"/><mtext class=\"u\">[" + esc(units.Unit{Symbol: col.Unit.Text}.Pretty()) + "]</mtext>")
			}
		})
		d.w("</th>")
	}
	d.w("</tr></thead><tbody>\n")
	// An entry written as an expression of cells shows its value of this
	// run beside it, in the unit of its column.
	tv, _ := d.res.Cells[c.Index].Value.(*funcs.TableValue)
	for r, row := range it.Rows {
		d.w("<tr>")
		for i, l := range row {
			text := l.Text
			if l.Expr && tv != nil && i < len(tv.Cols) && r < len(tv.Cols[i]) {
				f := 1.0
				if col := it.Columns[i]; col.Unit != nil {
					if u, err := units.Parse(col.Unit.Text); err == nil {
						f = u.Factor
					}
				}
				text += " = " + units.FormatNumber(tv.Cols[i][r]/f, d.sig)
			}
			d.w("<td class=\"num\">", esc(strings.Replace(text, "-", "−", 1)), "</td>")
		}
		d.w("</tr>\n")
	}
	d.w("</tbody></table>\n</div>\n")
}

// tableValue writes a computed table, each column in the preferred unit
// of its dimension.
func (d *doc) tableValue(c *engine.Cell, tv *funcs.TableValue) {
	if tv.Type == nil {
		return
	}
	us := make([]units.Unit, len(tv.Type.Fields))
	d.w("<table class=\"data\"><thead><tr>")
	for i, f := range tv.Type.Fields {
		us[i] = d.unitFor(f.Type.Dim)
		if f.Name == "eps" && tv.Type.Name == "n_eps_curve" {
			if u, err := units.Parse("‰"); err == nil {
				us[i] = u // strains of a section read in per mille, as the sheet writes them
			}
		}
		d.w("<th>")
		d.math(func(b *strings.Builder) {
			symbol(b, f.Name)
			if p := us[i].Pretty(); p != "" && p != "1" {
				b.WriteString("<mspace width=\"0.3em\"/><mtext class=\"u\">[" + esc(p) + "]</mtext>")
			}
		})
		d.w("</th>")
	}
	d.w("</tr></thead><tbody>\n")
	for r := 0; r < tv.Rows(); r++ {
		d.w("<tr>")
		for i := range tv.Cols {
			d.w("<td class=\"num\">", esc(strings.Replace(units.FormatNumber(tv.Cols[i][r]/us[i].Factor, d.sig), "-", "−", 1)), "</td>")
		}
		d.w("</tr>\n")
	}
	d.w("</tbody></table>\n")
}
