package lsp

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// What a target names.
type targetKind uint8

const (
	tNone    targetKind = iota
	tCell               // a cell of the compiled sheet (cell set)
	tField              // field `name` of record cell (cell set)
	tParam              // parameter `name` of the user function cell
	tPlugin             // a plugin function (def set)
	tBuiltin            // a built-in function (name)
	tConst              // a built-in constant (name)
	tUnit               // a unit (unit set, name as written)
	tItem               // an item of the parse (when the sheet does not check)
)

// target is what lies under the cursor.
type target struct {
	kind targetKind
	name string // as written under the cursor
	rng  lspRange
	cell *engine.Cell
	def  *funcs.Def
	unit units.Unit
	item sheet.Item
	// node is the expression node under the cursor (nil on a name).
	node check.Node
}

// isNameRune reports whether r may stand in a name.
func isNameRune(r rune) bool { return r == '_' || unicode.IsLetter(r) || unicode.IsDigit(r) }

// wordAt returns the dotted name around byte offset off of line ln
// (`rod.sigma`, `σ_Ed`) and its byte span; "" when none.
func wordAt(ln string, off int) (string, int, int) {
	from, to := off, off
	for from > 0 {
		r, size := utf8.DecodeLastRuneInString(ln[:from])
		if !isNameRune(r) && r != '.' {
			break
		}
		from -= size
	}
	for to < len(ln) {
		r, size := utf8.DecodeRuneInString(ln[to:])
		if !isNameRune(r) && r != '.' {
			break
		}
		to += size
	}
	w := strings.Trim(ln[from:to], ".")
	if w == "" {
		return "", off, off
	}
	from += strings.Index(ln[from:to], w)
	return w, from, from + len(w)
}

// unitAt returns the unit of a quantity literal under byte offset off of
// line ln (`38 kN`, `38kN`, `7850 kg/m^3`) and its byte span.
func unitAt(ln string, off int) (units.Unit, string, int, int, bool) {
	stopL := func(c byte) bool { return c == ' ' || c == '\t' || c == '(' || c == '[' || c == '{' || c == ',' }
	stopR := func(c byte) bool { return c == ' ' || c == '\t' || c == ')' || c == ']' || c == '}' || c == ',' }
	from, to := off, off
	for from > 0 && !stopL(ln[from-1]) {
		from--
	}
	for to < len(ln) && !stopR(ln[to]) {
		to++
	}
	tok := ln[from:to]
	if tok == "" {
		return units.Unit{}, "", 0, 0, false
	}
	if n := numberPrefix(tok); n > 0 {
		from += n
		tok = tok[n:]
	} else {
		// A unit after a space: the token before it must be a number.
		j := from
		for j > 0 && (ln[j-1] == ' ' || ln[j-1] == '\t') {
			j--
		}
		k := j
		for k > 0 && !stopL(ln[k-1]) {
			k--
		}
		if j == from || k == j || numberPrefix(ln[k:j]) != j-k {
			return units.Unit{}, "", 0, 0, false
		}
	}
	if tok == "" || off < from {
		return units.Unit{}, "", 0, 0, false
	}
	u, err := units.Parse(tok)
	if err != nil {
		return units.Unit{}, "", 0, 0, false
	}
	return u, tok, from, to, true
}

// numberPrefix returns the length of the number at the start of s.
func numberPrefix(s string) int {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	d := i
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
		}
	}
	if i == d || (i == d+1 && s[d] == '.') {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return i
}

// spanRange converts a byte span of 0-based line li.
func (d *document) spanRange(li, from, to int) lspRange {
	start := d.lines.starts[li]
	return lspRange{Start: d.lines.position(start + from), End: d.lines.position(start + to)}
}

// before reports whether engine position a is at or before line l, rune
// column c.
func atOrBefore(a diag.Pos, l, c int) bool { return a.Line < l || (a.Line == l && a.Col <= c) }

// contains reports whether r holds line l, column c (its end included,
// so that a cursor just after a name is on it).
func contains(r diag.Range, l, c int) bool {
	return r.Start().IsValid() && atOrBefore(r.Start(), l, c) && atOrBefore(diag.Pos{Line: l, Col: c}, r.End().Line, r.End().Col)
}

// cellAt returns the cell of the compiled sheet whose item holds the
// position (line, rune column, 1-based), or nil.
func (d *document) cellAt(l, c int) *engine.Cell {
	if d.sheet == nil {
		return nil
	}
	for _, x := range d.sheet.Cells() {
		if d.own(x.Range().Start()) && contains(x.Range(), l, c) {
			return x
		}
	}
	return nil
}

// nodeAt returns the innermost node of n that holds the position.
func nodeAt(n check.Node, l, c int) check.Node {
	if n.IsZero() || !contains(n.Range(), l, c) {
		return check.Node{}
	}
	for _, a := range n.Args() {
		if m := nodeAt(a, l, c); !m.IsZero() {
			return m
		}
	}
	return n
}

// trees returns the typed trees of a cell.
func trees(c *engine.Cell) []check.Node {
	return []check.Node{c.Body(), c.Extra().Demand, c.Extra().Capacity}
}

// unitSpecs returns the unit specs written on an item.
func unitSpecs(it sheet.Item) []*sheet.UnitSpec {
	var out []*sheet.UnitSpec
	switch it := it.(type) {
	case *sheet.Cell:
		out = append(out, it.Unit)
	case *sheet.FuncDef:
		out = append(out, it.Unit)
		for _, p := range it.Params {
			out = append(out, p.Unit)
		}
	case *sheet.Table:
		for _, c := range it.Columns {
			out = append(out, c.Unit)
		}
	case *sheet.Use:
		for _, o := range it.Overrides {
			out = append(out, o.Unit)
		}
	}
	return out
}

// itemAt returns the item of the parse that holds 1-based line l.
func (d *document) itemAt(l int) sheet.Item {
	for _, it := range d.file.Items {
		r := it.Span()
		if r.Start().Line <= l && l <= r.End().Line {
			if _, blank := it.(*sheet.Blank); !blank {
				return it
			}
		}
	}
	return nil
}

// resolve finds what lies under protocol position p.
func (d *document) resolve(p position) *target {
	if p.Line < 0 || p.Line >= d.lines.lineCount() {
		return nil
	}
	ln := d.lines.line(p.Line)
	off := d.lines.offset(p) - d.lines.starts[p.Line]
	l, c := p.Line+1, d.lines.runeCol(p)
	it := d.itemAt(l)

	// A unit in brackets.
	for _, u := range unitSpecs(it) {
		if u != nil && contains(u.Range, l, c) {
			if unit, err := units.Parse(u.Text); err == nil {
				return &target{kind: tUnit, name: u.Text, unit: unit, rng: d.lines.rangeOf(u.Range)}
			}
			return nil
		}
	}
	word, from, to := wordAt(ln, off)
	wr := d.spanRange(p.Line, from, to)
	// A unit after a number.
	if u, text, uf, ut, ok := unitAt(ln, off); ok && (word == "" || (from >= uf && to <= ut)) {
		return &target{kind: tUnit, name: text, unit: u, rng: d.spanRange(p.Line, uf, ut)}
	}
	if word == "" {
		return nil
	}
	if x := d.cellAt(l, c); x != nil && !d.stale {
		if contains(x.NameRange(), l, c) {
			return &target{kind: tCell, name: x.Name, cell: x, rng: d.lines.rangeOf(x.NameRange())}
		}
		for _, t := range trees(x) {
			n := nodeAt(t, l, c)
			if n.IsZero() {
				continue
			}
			if tg := d.nodeTarget(n, word, wr); tg != nil {
				return tg
			}
		}
	}
	return d.lexicalTarget(word, wr, it, ln, to)
}

// nodeTarget names what node n, under the cursor on word, refers to.
func (d *document) nodeTarget(n check.Node, word string, wr lspRange) *target {
	cells := d.sheet.Cells()
	switch n.Op() {
	case check.OpCell, check.OpUser, check.OpFuncRef:
		if int(n.Index()) < len(cells) {
			x := cells[n.Index()]
			if n.Op() == check.OpCell || word == n.Str() || strings.HasSuffix(x.Name, word) {
				return &target{kind: tCell, name: word, cell: x, rng: d.lines.rangeOf(n.Range()), node: n}
			}
		}
	case check.OpField:
		if n.NArg() == 1 && n.Arg(0).Op() == check.OpCell && int(n.Arg(0).Index()) < len(cells) {
			field := word[strings.LastIndexByte(word, '.')+1:]
			return &target{kind: tField, name: field, cell: cells[n.Arg(0).Index()], rng: wr, node: n}
		}
	case check.OpParam:
		return &target{kind: tParam, name: word, rng: wr, node: n}
	case check.OpPlugin:
		if def, ok := funcs.Lookup(n.Str()); ok && word == n.Str() {
			return &target{kind: tPlugin, name: word, def: def, rng: wr}
		}
	case check.OpBuiltin:
		if word == n.Str() {
			return &target{kind: tBuiltin, name: word, rng: wr}
		}
	}
	return nil
}

// lexicalTarget names word by spelling alone: functions and constants,
// and, when the sheet does not check, the items of the parse.
func (d *document) lexicalTarget(word string, wr lspRange, it sheet.Item, ln string, end int) *target {
	call := strings.HasPrefix(strings.TrimLeft(ln[end:], " \t"), "(")
	if call {
		if def, ok := funcs.Lookup(word); ok {
			return &target{kind: tPlugin, name: word, def: def, rng: wr}
		}
		if builtin(word) != nil {
			return &target{kind: tBuiltin, name: word, rng: wr}
		}
	}
	if _, ok := check.Constants[word]; ok {
		return &target{kind: tConst, name: word, rng: wr}
	}
	if d.sheet != nil && !d.stale {
		if x := d.sheet.Lookup(word); x != nil {
			return &target{kind: tCell, name: word, cell: x, rng: wr}
		}
		return nil
	}
	if fd, ok := it.(*sheet.FuncDef); ok {
		for _, p := range fd.Params {
			if p.Name.Name == word {
				return &target{kind: tParam, name: word, rng: wr}
			}
		}
	}
	if x := d.parsedItem(word); x != nil {
		return &target{kind: tItem, name: word, item: x, rng: wr}
	}
	return nil
}

// parsedItem returns the item of the parse that defines name.
func (d *document) parsedItem(name string) sheet.Item {
	for _, it := range d.file.Items {
		if itemName(it) == name {
			return it
		}
	}
	return nil
}

// itemName returns the name an item defines ("" for none).
func itemName(it sheet.Item) string {
	switch it := it.(type) {
	case *sheet.Cell:
		return it.Name.Name
	case *sheet.FuncDef:
		return it.Name.Name
	case *sheet.Check:
		return it.Name.Name
	case *sheet.Table:
		return it.Name.Name
	case *sheet.Use:
		return it.Name.Name
	}
	return ""
}

// itemNameRange returns the range of the name an item defines.
func itemNameRange(it sheet.Item) diag.Range {
	switch it := it.(type) {
	case *sheet.Cell:
		return it.Name.Range
	case *sheet.FuncDef:
		return it.Name.Range
	case *sheet.Check:
		return it.Name.Range
	case *sheet.Table:
		return it.Name.Range
	case *sheet.Use:
		return it.Name.Range
	}
	return diag.Range{}
}

// builtin returns the built-in function name, or nil.
func builtin(name string) *check.BuiltinInfo {
	for i := range check.Builtins {
		if check.Builtins[i].Name == name {
			return &check.Builtins[i]
		}
	}
	return nil
}
