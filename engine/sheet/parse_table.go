package sheet

import (
	"github.com/sheafcalc/sheaf/internal/plural"
)

// parseTable reads a table on lines [i, j).
//
//	table  = "table" name [ annotation ] newline header { row } .
//	header = indent column { column } newline .
//	column = name [ unit-spec ] .
//	row    = indent entry { entry } newline .
//	entry  = number | "(" expression ")" .
//
// Entries are plain numbers in the unit of their column, or an expression
// of the sheet's cells in brackets (`(A_p)`, `(2 * A_p)`), whose dimension
// the checker holds to the column's unit; they are separated by spaces or
// tabs. A bare word is never an entry, so a unit written in a row (`1.5 m`)
// stays an error rather than becoming a cell named m. A blank line or a
// line in column 1 ends the table.
func (p *parser) parseTable(i, j int) Item {
	ln := p.lines[i]
	t := p.text
	k := skipSpace(t, ln.start+len("table"), ln.end)
	id, ok := p.readName(i, k, "table")
	if id.Name == "" {
		return nil
	}
	tb := &Table{Def: Def{Name: id, Range: p.span(ln.start, p.lines[j-1].end)}}
	k = skipSpace(t, k+len(id.Name), ln.end)
	switch {
	case k >= ln.end:
	case k+1 < ln.end && t[k] == '-' && t[k+1] == '-':
		tb.Annot = p.annot(i, k)
	default:
		p.errAt(p.rng(i, k, ln.end), "a table line holds only the table's name and an optional `-- description`; its columns follow on the next, indented line",
			"e.g. `table segments -- bar segments` then `    L [m]  A [mm^2]`",
			"unexpected `%s` after `table %s`", clip(t[k:ln.end]), id.Name)
		ok = false
	}
	if j == i+1 {
		p.errAt(id.Range, "a table needs an indented header row of columns, then indented rows of numbers",
			"add a line such as `    L [m]  A [mm^2]` below `table "+id.Name+"`",
			"table `%s` has no columns", id.Name)
		return nil
	}
	if !p.tableHeader(i+1, tb) {
		return nil
	}
	if j == i+2 {
		p.errAt(id.Range, "the header row is followed by indented rows of plain numbers, one entry per column",
			"add rows such as `    2.5  314`", "table `%s` has no rows", id.Name)
		return nil
	}
	for li := i + 2; li < j; li++ {
		if row, rok := p.tableRow(li, len(tb.Columns)); rok {
			tb.Rows = append(tb.Rows, row)
		} else {
			ok = false
		}
	}
	if !ok {
		return nil
	}
	return tb
}

// tableHeader reads the columns of a table from line li.
func (p *parser) tableHeader(li int, tb *Table) bool {
	ln := p.lines[li]
	t := p.text
	k := ln.start + int(ln.indent)
	if c := t[k]; c == '+' || c == '-' || c == '.' || '0' <= c && c <= '9' {
		p.errAt(p.rng(li, k, ln.end), "the first indented line of a table names its columns, with their units",
			"add a header row above the numbers, e.g. `    L [m]  A [mm^2]`",
			"table `%s` has no header row", tb.Name.Name)
		return false
	}
	seen := map[string]bool{}
	for k < ln.end {
		id, ok := p.readName(li, k, "column")
		if !ok {
			return false
		}
		if seen[id.Name] {
			p.errAt(id.Range, "each column of a table needs its own name", "rename one of the columns",
				"duplicate column `%s` in table `%s`", id.Name, tb.Name.Name)
			return false
		}
		seen[id.Name] = true
		col := Column{Name: id}
		k = skipSpace(t, k+len(id.Name), ln.end)
		if k < ln.end && t[k] == '[' {
			var uok bool
			col.Unit, k, uok = p.unit(li, k)
			if !uok {
				return false
			}
			k = skipSpace(t, k, ln.end)
		}
		tb.Columns = append(tb.Columns, col)
	}
	return true
}

// tableRow reads one row of n plain numbers from line li.
func (p *parser) tableRow(li, n int) ([]Literal, bool) {
	ln := p.lines[li]
	t := p.text
	row := make([]Literal, 0, n)
	for k := ln.start + int(ln.indent); k < ln.end; {
		e, expr := k, false
		switch c := t[k]; {
		case c == '(':
			// A bracketed expression: to its matching bracket on this line.
			depth := 0
			for e < ln.end {
				switch t[e] {
				case '(':
					depth++
				case ')':
					depth--
				}
				e++
				if depth == 0 {
					break
				}
			}
			if depth != 0 {
				p.errAt(p.rng(li, k, ln.end), "an entry in brackets is an expression of the sheet's cells, closed on the same line",
					"close it with `)`, as in `(2 * A_p)`", "unclosed `(` in a table row")
				return nil, false
			}
			expr = true
		default:
			for e < ln.end && t[e] != ' ' && t[e] != '\t' {
				e++
			}
		}
		s := t[k:e]
		if !expr && !isNumber(s) {
			hint := "write the unit once in the column header, e.g. `L [m]`, and plain numbers in the rows"
			if s == "-" || s == "+" {
				hint = "write 0, or leave the row out"
			}
			p.errAt(p.rng(li, k, e), "table rows hold plain numbers such as `2.5`, `-40` or `2.1e5`, or expressions of cells in brackets such as `(A_p)` or `(2 * A_p)`, separated by spaces",
				hint, "`%s` is not a number", clip(s))
			return nil, false
		}
		row = append(row, Literal{Text: s, Range: p.rng(li, k, e), Expr: expr})
		k = skipSpace(t, e, ln.end)
	}
	if len(row) != n {
		p.errAt(p.rng(li, ln.start+int(ln.indent), ln.end),
			"each row has one entry per column; the header has "+plural.Count(n, "column"),
			"add or remove entries so the row matches the header",
			"row has %s, the table has %s", plural.Count(len(row), "entry"), plural.Count(n, "column"))
		return nil, false
	}
	return row, true
}
