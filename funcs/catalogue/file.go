package catalogue

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// MaxFileSize bounds a catalogue file; no table of the trade comes near it.
const MaxFileSize = 4 << 20

// Table is one block of a catalogue file.
type Table struct {
	Kind   *Kind
	Title  string
	Source string
	Memory bool // the values were typed from memory, not from the published text
	File   string
	Line   int
	Cols   []Column
	Rows   []*Entry
}

// Column is a column of a table: its name and the unit its numbers are in.
type Column struct {
	Name string
	Unit units.Unit
}

// Entry is one row of a table: its key as written, and its numbers in SI.
type Entry struct {
	Key   string
	Table *Table
	Line  int
	Vals  map[string]float64
	Text  map[string]string // the numbers as written, for the rounding of tabulated values
	shape *section.Shape    // sections: the shape built from the dimensions
}

// Error is a problem at a place in a catalogue file.
type Error struct {
	File      string
	Line, Col int
	Msg, Hint string
}

func (e *Error) Error() string {
	s := fmt.Sprintf("%s:%d:%d: %s", e.File, e.Line, e.Col, e.Msg)
	if e.Hint != "" {
		s += "; " + e.Hint
	}
	return s
}

// ErrorList is every problem found in a file, in line order.
type ErrorList []*Error

func (l ErrorList) Error() string {
	var b strings.Builder
	for i, e := range l {
		if i > 0 {
			b.WriteString("\n")
		}
		b.WriteString(e.Error())
	}
	return b.String()
}

// Parse reads a catalogue file. The format, line by line (SPEC.md,
// "Catalogue files"):
//
//	file      = { line }
//	line      = comment | blank | directive | row
//	comment   = "#" text
//	directive = ("table" kind title | "source" text | "memory" ("yes" | "no") | "columns" header)
//	header    = "key" { "|" name [ "[" unit "]" ] }
//	row       = key { "|" number }
//
// A table starts at "table" and needs a source, a memory line and a columns
// line before its first row. Every problem is collected, one per line.
func Parse(file string, src []byte) ([]*Table, error) {
	var errs ErrorList
	fail := func(line, col int, hint, format string, a ...any) {
		if len(errs) > 0 && errs[len(errs)-1].Line == line {
			return
		}
		errs = append(errs, &Error{File: file, Line: line, Col: col, Msg: fmt.Sprintf(format, a...), Hint: hint})
	}
	if len(src) > MaxFileSize {
		return nil, ErrorList{{File: file, Line: 1, Col: 1, Msg: fmt.Sprintf("the file has %d bytes; a catalogue file has at most %d", len(src), MaxFileSize)}}
	}
	if !utf8.Valid(src) {
		return nil, ErrorList{{File: file, Line: 1, Col: 1, Msg: "the file is not UTF-8 text"}}
	}
	var tables []*Table
	var cur *Table
	memorySet := false
	lines := strings.Split(string(src), "\n")
	for i, raw := range lines {
		ln := i + 1
		line := strings.TrimRight(raw, " \t\r")
		trim := strings.TrimLeft(line, " \t")
		col := len(line) - len(trim) + 1
		if trim == "" || strings.HasPrefix(trim, "#") {
			continue
		}
		word, rest, _ := strings.Cut(trim, " ")
		rest = strings.TrimSpace(rest)
		switch word {
		case "table":
			kname, title, _ := strings.Cut(rest, " ")
			k, ok := kinds[kname]
			if !ok {
				fail(ln, col+6, hintKind(kname), "unknown table kind %q", kname)
				cur = nil
				continue
			}
			cur = &Table{Kind: k, Title: strings.TrimSpace(title), File: file, Line: ln}
			if cur.Title == "" {
				fail(ln, col, "write the title after the kind: table i EN 10365 IPE", "the table has no title")
			}
			memorySet = false
			tables = append(tables, cur)
			continue
		}
		if cur == nil {
			fail(ln, col, "start a table with a line `table KIND TITLE`", "%q outside a table", clip(trim))
			continue
		}
		switch word {
		case "source":
			if rest == "" {
				fail(ln, col, "name the standard, its edition and table", "the source is empty")
			}
			cur.Source = rest
		case "memory":
			switch rest {
			case "yes":
				cur.Memory = true
			case "no":
				cur.Memory = false
			default:
				fail(ln, col+7, "write `memory yes` when the values were not checked against the published text", "expected yes or no, found %q", clip(rest))
				continue
			}
			memorySet = true
		case "columns":
			cols, err := parseHeader(rest, cur.Kind)
			if err != "" {
				fail(ln, col, hintColumns(cur.Kind), "%s", err)
				continue
			}
			cur.Cols = cols
		default:
			if cur.Source == "" || !memorySet || cur.Cols == nil {
				fail(ln, col, "give `source`, `memory` and `columns` lines after `table`", "a row before the table's source, memory and columns lines")
				continue
			}
			e, c, msg := parseRow(line, cur)
			if msg != "" {
				fail(ln, c, "", "%s", msg)
				continue
			}
			e.Line = ln
			if msg := cur.Kind.check(e); msg != "" {
				fail(ln, col, "", "%s %s: %s", cur.Kind.Name, e.Key, msg)
				continue
			}
			cur.Rows = append(cur.Rows, e)
		}
	}
	for _, t := range tables {
		if len(t.Rows) == 0 && t.Kind != nil {
			fail(t.Line, 1, "", "table %q has no rows", t.Title)
		}
		if msg, line := t.checkBands(); msg != "" {
			fail(line, 1, "list the bands of one key together, thinnest first", "%s", msg)
		}
	}
	if len(errs) > 0 {
		sort.SliceStable(errs, func(i, j int) bool { return errs[i].Line < errs[j].Line })
		return nil, errs
	}
	return tables, nil
}

func clip(s string) string {
	if utf8.RuneCountInString(s) > 40 {
		r := []rune(s)
		return string(r[:40]) + "…"
	}
	return s
}

func hintKind(name string) string {
	if n := units.Nearest(name, kindNames()); n != "" {
		return "did you mean " + n + "?"
	}
	return "the kinds are " + strings.Join(kindNames(), ", ")
}

func hintColumns(k *Kind) string {
	var names []string
	for _, c := range k.Cols {
		s := c.Name
		if c.Optional {
			s += "?"
		}
		names = append(names, s)
	}
	return "a " + k.Name + " table has the columns key | " + strings.Join(names, " | ")
}

// parseHeader reads "key | h [mm] | b [mm] …" and checks every column
// against the kind: known name, unit of the right dimension, required ones
// present, none twice.
func parseHeader(text string, k *Kind) ([]Column, string) {
	cells := strings.Split(text, "|")
	if strings.TrimSpace(cells[0]) != "key" {
		return nil, "the first column must be key"
	}
	var cols []Column
	seen := map[string]bool{}
	for _, c := range cells[1:] {
		c = strings.TrimSpace(c)
		name, unit := c, ""
		if i := strings.Index(c, "["); i >= 0 {
			if !strings.HasSuffix(c, "]") {
				return nil, fmt.Sprintf("column %q: the unit needs a closing ]", clip(c))
			}
			name, unit = strings.TrimSpace(c[:i]), strings.TrimSpace(c[i+1:len(c)-1])
		}
		spec := k.col(name)
		if spec == nil {
			return nil, fmt.Sprintf("a %s table has no column %q", k.Name, clip(name))
		}
		if seen[name] {
			return nil, fmt.Sprintf("column %q appears twice", name)
		}
		seen[name] = true
		u := units.Unit{Symbol: "1", Dim: units.None, Factor: 1}
		if unit != "" {
			var err error
			if u, err = units.Parse(unit); err != nil {
				return nil, fmt.Sprintf("column %s: %v", name, err)
			}
		}
		if u.Dim != spec.Dim {
			return nil, fmt.Sprintf("column %s is a %s; [%s] is not", name, spec.What, unit)
		}
		cols = append(cols, Column{Name: name, Unit: u})
	}
	for _, s := range k.Cols {
		if !s.Optional && !seen[s.Name] && !(s.Alt != "" && seen[s.Alt]) {
			return nil, fmt.Sprintf("the column %s is missing", s.Name)
		}
	}
	return cols, ""
}

// parseRow reads one data row; it returns the column (1-based) of a problem.
func parseRow(line string, t *Table) (*Entry, int, string) {
	cells := strings.Split(line, "|")
	key := strings.TrimSpace(cells[0])
	if key == "" {
		return nil, 1, "the row has no key"
	}
	if len(cells)-1 != len(t.Cols) {
		return nil, 1, fmt.Sprintf("the row has %d numbers; the columns line names %d", len(cells)-1, len(t.Cols))
	}
	e := &Entry{Key: key, Table: t, Vals: make(map[string]float64, len(t.Cols)), Text: make(map[string]string, len(t.Cols))}
	off := len(cells[0]) + 1
	for i, c := range cells[1:] {
		s := strings.TrimSpace(c)
		col := off + len(c) - len(strings.TrimLeft(c, " \t")) + 1
		if s == "-" {
			if spec := t.Kind.col(t.Cols[i].Name); spec != nil && spec.Optional && spec.Alt == "" {
				off += len(c) + 1
				continue // not tabulated
			}
			return nil, col, fmt.Sprintf("%s: a value is required here; - marks a missing value only in the tabulated (_tab) columns", t.Cols[i].Name)
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, col, fmt.Sprintf("%s: expected a number, found %q", t.Cols[i].Name, clip(s))
		}
		if v < 0 {
			return nil, col, fmt.Sprintf("%s: expected a value ≥ 0, found %s", t.Cols[i].Name, s)
		}
		e.Vals[t.Cols[i].Name] = t.Cols[i].Unit.ToSI(v)
		e.Text[t.Cols[i].Name] = s
		off += len(c) + 1
	}
	return e, 0, ""
}

// checkBands checks the rows of a banded kind: rows of one key together,
// t_max increasing.
func (t *Table) checkBands() (string, int) {
	if t.Kind == nil || !t.Kind.Banded {
		return "", 0
	}
	done := map[string]bool{}
	for i, e := range t.Rows {
		n := Normalize(e.Key)
		if i > 0 && Normalize(t.Rows[i-1].Key) == n {
			if e.Vals["t_max"] <= t.Rows[i-1].Vals["t_max"] {
				return fmt.Sprintf("%s: band t_max = %g mm does not follow %g mm", e.Key, e.Vals["t_max"]*1e3, t.Rows[i-1].Vals["t_max"]*1e3), e.Line
			}
			continue
		}
		if done[n] {
			return fmt.Sprintf("%s: its bands are split by other keys", e.Key), e.Line
		}
		done[n] = true
	}
	return "", 0
}

// Normalize is the form keys are compared in: upper case, no spaces, and
// × or * written as X ("CHS 219.1×10" and "chs219.1x10" are one key).
func Normalize(key string) string {
	var b strings.Builder
	for _, r := range strings.ToUpper(key) {
		switch r {
		case ' ', '\t':
		case '×', '*':
			b.WriteRune('X')
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}
