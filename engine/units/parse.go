package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Limits that keep a hostile or mistyped unit text cheap to reject.
const (
	maxUnitLen = 256 // bytes
	maxDepth   = 16  // nested parentheses
	maxExp     = 24  // largest whole exponent written on one factor
)

// term is a parsed piece of a unit expression.
type term struct {
	sym    string // normalised spelling
	dim    Dim
	factor float64
	sys    sysMask
}

type parser struct {
	text  string
	pos   int
	depth int
	tab   *tables // nil while build parses the catalogue itself
}

// Parse reads a unit expression and returns the unit with its Symbol
// normalised (see the package comment for the grammar):
//
//	unit     = product { "/" product }          every factor after a "/" divides
//	product  = factor { ("*" | "·" | "⋅" | "×") factor }
//	factor   = ( name [ digits ] | "(" unit ")" | "1" ) [ power ]
//	power    = ( "^" | "**" ) exponent | superscripts
//	exponent = [ "-" ] digits [ ".5" ] | "(" [ "-" ] digits [ "/" digits ] ")"
//
// Errors are *Error values with byte offsets into text.
func Parse(text string) (Unit, error) {
	t := tab()
	// Fast path: a catalogue symbol is already normalised.
	if u, ok := t.catalogueIndex[text]; ok {
		return u, nil
	}
	return parse(text, t)
}

// parse is Parse against the tables t; with t nil (build reading the
// catalogue) the unit has no quantity name and errors offer no suggestion.
func parse(text string, tab *tables) (Unit, error) {
	if len(text) > maxUnitLen {
		return Unit{}, &Error{Offset: maxUnitLen, End: len(text),
			Msg:  fmt.Sprintf("unit text is too long (%d bytes)", len(text)),
			Hint: fmt.Sprintf("a unit has at most %d bytes", maxUnitLen)}
	}
	if !utf8.ValidString(text) {
		off := 0
		for off < len(text) {
			r, size := utf8.DecodeRuneInString(text[off:])
			if r == utf8.RuneError && size <= 1 {
				break
			}
			off += size
		}
		return Unit{}, &Error{Offset: off, End: off + 1, Msg: "invalid UTF-8 in unit text",
			Hint: "save the sheet as UTF-8"}
	}
	p := parser{text: text, tab: tab}
	p.skipSpace()
	if p.pos == len(text) {
		return Unit{}, &Error{Offset: 0, End: len(text), Msg: "empty unit",
			Hint: "write a unit such as `kN` or `N/mm^2`, or `1` for a plain number"}
	}
	t, err := p.unit("")
	if err != nil {
		return Unit{}, err
	}
	if p.pos < len(text) { // only a stray ")" stops a product at the top level
		return Unit{}, &Error{Offset: p.pos, End: p.pos + 1, Msg: "unexpected `)`",
			Hint: "there is no `(` for it to close"}
	}
	return t.unit(tab), nil
}

// unit makes the Unit of a finished term, taking the quantity name from the
// catalogue when the symbol is listed there.
func (t term) unit(tab *tables) Unit {
	u := Unit{Symbol: t.sym, Dim: t.dim, Factor: t.factor, System: t.sys.system()}
	if tab == nil {
		return u
	}
	u.Quantity = tab.defaultQty[t.dim]
	if e, ok := tab.catalogueIndex[t.sym]; ok {
		u.Quantity = e.Quantity
	}
	return u
}

// unit parses `product { "/" product }`. after names what came before, for
// the message when nothing follows.
func (p *parser) unit(after string) (term, error) {
	t, err := p.product(after)
	if err != nil {
		return t, err
	}
	for {
		p.skipSpace()
		if p.pos >= len(p.text) || p.text[p.pos] != '/' {
			return t, nil
		}
		start := p.pos
		p.pos++
		den, err := p.product("`/`")
		if err != nil {
			return t, err
		}
		if t, err = p.combine(t, den, -1, start); err != nil {
			return t, err
		}
		t.sym += "/" + den.sym
	}
}

// product parses `factor { op factor }`.
func (p *parser) product(after string) (term, error) {
	t, err := p.factor(after)
	if err != nil {
		return t, err
	}
	for {
		p.skipSpace()
		if p.pos >= len(p.text) {
			return t, nil
		}
		r, size := utf8.DecodeRuneInString(p.text[p.pos:])
		switch {
		case r == '*' || r == '·' || r == '⋅' || r == '×':
			start := p.pos
			op := p.text[p.pos : p.pos+size]
			p.pos += size
			f, err := p.factor("`" + op + "`")
			if err != nil {
				return t, err
			}
			if t, err = p.combine(t, f, 1, start); err != nil {
				return t, err
			}
			t.sym += "*" + f.sym
		case r == '/' || r == ')':
			return t, nil
		case r == '.' || r == '-':
			return t, &Error{Offset: p.pos, End: p.pos + 1, Msg: fmt.Sprintf("unexpected `%c` in a unit", r),
				Hint: "write a product as `kN*m` or `kN·m`"}
		case isNameStart(r) || isDigit(r) || r == '(':
			end := p.pos + size
			if isNameStart(r) {
				end = p.nameEnd(p.pos)
			}
			return t, &Error{Offset: p.pos, End: end,
				Msg:  fmt.Sprintf("missing `*` before `%s`", p.text[p.pos:end]),
				Hint: "write a product as `kN*m` or `kN·m`; a space does not multiply in a unit"}
		default:
			return t, p.unexpected(r, size)
		}
	}
}

// factor parses one name, parenthesised unit or `1`, with its power.
func (p *parser) factor(after string) (term, error) {
	p.skipSpace()
	start := p.pos
	if p.pos >= len(p.text) {
		return term{}, &Error{Offset: p.pos, End: p.pos, Msg: "expected a unit after " + after,
			Hint: "finish the unit, as in `N/mm^2` or `kN*m`"}
	}
	r, size := utf8.DecodeRuneInString(p.text[p.pos:])
	var t term
	switch {
	case r == '(':
		if p.depth >= maxDepth {
			return t, &Error{Offset: p.pos, End: p.pos + 1, Msg: "parentheses nested too deeply",
				Hint: fmt.Sprintf("a unit nests at most %d parentheses", maxDepth)}
		}
		p.depth++
		p.pos++
		inner, err := p.unit("`(`")
		if err != nil {
			return t, err
		}
		p.skipSpace()
		if p.pos >= len(p.text) || p.text[p.pos] != ')' {
			return t, &Error{Offset: start, End: start + 1, Msg: "missing `)`",
				Hint: "close the parenthesis opened here"}
		}
		p.pos++
		p.depth--
		t = inner
		t.sym = "(" + inner.sym + ")"
	case isDigit(r):
		end := p.pos
		for end < len(p.text) && isDigit(rune(p.text[end])) {
			end++
		}
		if p.text[p.pos:end] != "1" {
			return t, &Error{Offset: p.pos, End: end,
				Msg:  fmt.Sprintf("unexpected number `%s` in a unit", p.text[p.pos:end]),
				Hint: "only `1` may stand in a unit, as in `1/K`; write other numbers in the expression"}
		}
		p.pos = end
		t = term{sym: "1", factor: 1}
	case isNameStart(r):
		end := p.nameEnd(p.pos)
		name := p.text[p.pos:end]
		sym, a, f, ok, noPrefix := resolveName(name)
		if !ok {
			return t, unknownUnit(name, p.pos, end, noPrefix, p.tab)
		}
		p.pos = end
		t = term{sym: sym, dim: a.dim, factor: f, sys: sysMask(1) << a.system}
		if a.system == Neutral {
			t.sys = 0
		}
		if p.pos < len(p.text) && isDigit(rune(p.text[p.pos])) {
			// A digit suffix is a power: mm2 = mm^2, the way section tables write it.
			dStart := p.pos
			for p.pos < len(p.text) && isDigit(rune(p.text[p.pos])) {
				p.pos++
			}
			n, err := strconv.Atoi(p.text[dStart:p.pos])
			if err != nil || n == 0 || n > maxExp {
				return t, &Error{Offset: dStart, End: p.pos,
					Msg:  fmt.Sprintf("exponent `%s` is out of range", p.text[dStart:p.pos]),
					Hint: fmt.Sprintf("write a whole exponent from 1 to %d", maxExp)}
			}
			return p.raise(t, 2*n, start)
		}
	case r == '*' || r == '/' || r == ')' || r == '^' || r == '·' || r == '⋅' || r == '×':
		return t, &Error{Offset: p.pos, End: p.pos + size,
			Msg:  fmt.Sprintf("expected a unit, found `%s`", p.text[p.pos:p.pos+size]),
			Hint: "put a unit name on each side of an operator, as in `kN*m` or `N/mm^2`"}
	default:
		return t, p.unexpected(r, size)
	}
	return p.power(t, start)
}

// unknownUnit builds the error for a name that is not a unit.
func unknownUnit(name string, off, end int, noPrefix *atom, tab *tables) *Error {
	e := &Error{Offset: off, End: end, Msg: fmt.Sprintf("unknown unit `%s`", name)}
	switch s := suggest(name, tab); {
	case noPrefix != nil:
		e.Hint = fmt.Sprintf("`%s` takes no SI prefix", noPrefix.sym)
	case s != "":
		e.Hint = fmt.Sprintf("did you mean `%s`?", s)
	default:
		e.Hint = "run `sheaf units` to list the known units"
	}
	return e
}

// unexpected is the error for a character that has no place in a unit.
func (p *parser) unexpected(r rune, size int) *Error {
	shown := p.text[p.pos : p.pos+size]
	if !unicode.IsPrint(r) {
		shown = strconv.QuoteRune(r)
	}
	return &Error{Offset: p.pos, End: p.pos + size,
		Msg:  fmt.Sprintf("unexpected `%s` in a unit", shown),
		Hint: "a unit is made of unit names, `*`, `/`, `^` and parentheses, as in `kN*m` or `N/mm^2`"}
}

// power parses an optional power after a factor that began at start.
func (p *parser) power(t term, start int) (term, error) {
	save := p.pos
	p.skipSpace()
	switch {
	case strings.HasPrefix(p.text[p.pos:], "^"), strings.HasPrefix(p.text[p.pos:], "**"):
		opStart := p.pos
		if p.text[p.pos] == '^' {
			p.pos++
		} else {
			p.pos += 2
		}
		e2, err := p.exponent(opStart)
		if err != nil {
			return t, err
		}
		return p.raise(t, e2, start)
	}
	p.pos = save
	e2, err := p.superscripts()
	if err != nil || e2 == 0 {
		return t, err
	}
	return p.raise(t, e2, start)
}

// superscripts reads a superscript exponent such as ² or ⁻¹ and returns it
// doubled; 0 when there is none.
func (p *parser) superscripts() (int, error) {
	start, sign, n, digits := p.pos, 1, 0, 0
	if strings.HasPrefix(p.text[p.pos:], "⁻") {
		sign = -1
		p.pos += len("⁻")
	}
	for p.pos < len(p.text) {
		r, size := utf8.DecodeRuneInString(p.text[p.pos:])
		d := superscriptDigit(r)
		if d < 0 {
			break
		}
		n = min(10*n+d, 1000)
		digits++
		p.pos += size
	}
	switch {
	case digits == 0 && sign > 0:
		return 0, nil
	case digits == 0:
		return 0, &Error{Offset: start, End: p.pos, Msg: "expected a superscript digit after `⁻`",
			Hint: "write `m⁻¹` or `m^-1`"}
	case n == 0 || n > maxExp:
		return 0, &Error{Offset: start, End: p.pos, Msg: "exponent is out of range",
			Hint: fmt.Sprintf("write a whole exponent from 1 to %d", maxExp)}
	}
	return 2 * sign * n, nil
}

func superscriptDigit(r rune) int {
	switch r {
	case '⁰':
		return 0
	case '¹':
		return 1
	case '²':
		return 2
	case '³':
		return 3
	}
	if r >= '⁴' && r <= '⁹' {
		return int(r-'⁴') + 4
	}
	return -1
}

// exponent parses the exponent after `^` or `**` (at opStart) and returns it
// doubled, so a half is exact.
func (p *parser) exponent(opStart int) (int, error) {
	bad := func(end int) error {
		return &Error{Offset: opStart, End: max(min(end, len(p.text)), opStart+1),
			Msg:  "expected an exponent after `" + p.text[opStart:opStart+opLen(p.text[opStart:])] + "`",
			Hint: "write a whole number such as `^2` or `^-1`, or a half such as `^0.5` or `^(1/2)`"}
	}
	p.skipSpace()
	paren := p.pos < len(p.text) && p.text[p.pos] == '('
	if paren {
		p.pos++
		p.skipSpace()
	}
	sign := 1
	if p.pos < len(p.text) && (p.text[p.pos] == '-' || p.text[p.pos] == '+') {
		if p.text[p.pos] == '-' {
			sign = -1
		}
		p.pos++
	} else if strings.HasPrefix(p.text[p.pos:], "−") { // U+2212 minus sign
		sign = -1
		p.pos += len("−")
	}
	n, ok := p.digits()
	if !ok {
		return 0, bad(p.pos + 1)
	}
	e2 := 2 * n
	switch {
	case p.pos < len(p.text) && p.text[p.pos] == '.':
		p.pos++
		frac, ok := p.digitText()
		switch {
		case !ok:
			return 0, bad(p.pos)
		case strings.Trim(frac, "0") == "":
		case strings.TrimRight(frac, "0") == "5":
			e2++
		default:
			return 0, &Error{Offset: opStart, End: p.pos,
				Msg:  fmt.Sprintf("exponent `%s` is not a whole number or a half", p.text[opStart+opLen(p.text[opStart:]):p.pos]),
				Hint: "a unit may be raised to whole powers and halves only, as in `m^2` or `MPa^0.5`"}
		}
	case paren && p.pos < len(p.text) && p.text[p.pos] == '/':
		p.pos++
		den, ok := p.digits()
		switch {
		case !ok:
			return 0, bad(p.pos)
		case den == 1:
		case den == 2:
			e2 = n
		default:
			return 0, &Error{Offset: opStart, End: p.pos,
				Msg:  fmt.Sprintf("exponent `%d/%d` is not a whole number or a half", n, den),
				Hint: "a unit may be raised to whole powers and halves only, as in `m^2` or `MPa^(1/2)`"}
		}
	}
	if paren {
		p.skipSpace()
		if p.pos >= len(p.text) || p.text[p.pos] != ')' {
			return 0, &Error{Offset: opStart, End: p.pos, Msg: "missing `)` after the exponent",
				Hint: "write a fractional exponent as `^(1/2)`"}
		}
		p.pos++
	}
	if e2 == 0 {
		return 0, &Error{Offset: opStart, End: p.pos, Msg: "a zero exponent cancels the unit",
			Hint: "leave the factor out, or write `1` for a plain number"}
	}
	if e2 > 2*maxExp {
		return 0, &Error{Offset: opStart, End: p.pos, Msg: "exponent is out of range",
			Hint: fmt.Sprintf("a unit exponent lies between -%d and %d", maxExp, maxExp)}
	}
	return sign * e2, nil
}

// opLen is the length of the power operator at the start of s.
func opLen(s string) int {
	if strings.HasPrefix(s, "**") {
		return 2
	}
	return 1
}

// digitText reads a run of ASCII digits.
func (p *parser) digitText() (string, bool) {
	start := p.pos
	for p.pos < len(p.text) && isDigit(rune(p.text[p.pos])) {
		p.pos++
	}
	return p.text[start:p.pos], p.pos > start
}

// digits reads a run of ASCII digits as a number no larger than 1000.
func (p *parser) digits() (int, bool) {
	s, ok := p.digitText()
	if !ok {
		return 0, false
	}
	if len(s) > 4 {
		return 1000, true
	}
	n, _ := strconv.Atoi(s)
	return n, true
}

// raise applies a doubled exponent e2 to t, which began at start.
func (p *parser) raise(t term, e2 int, start int) (term, error) {
	d, ok := t.dim.Pow(e2, 2)
	if !ok {
		return t, &Error{Offset: start, End: p.pos,
			Msg:  fmt.Sprintf("`%s` gives a dimension exponent out of range or finer than a half", p.text[start:p.pos]),
			Hint: "a dimension may carry whole and half exponents only"}
	}
	t.dim = d
	if e2%2 == 0 {
		t.factor = ipow(t.factor, e2/2)
	} else {
		t.factor = math.Sqrt(ipow(t.factor, e2))
	}
	if e2%2 == 0 {
		t.sym += "^" + strconv.Itoa(e2/2)
	} else {
		t.sym += "^(" + strconv.Itoa(e2) + "/2)"
	}
	return t, nil
}

// ipow is x^n by repeated multiplication, exact where the products are.
func ipow(x float64, n int) float64 {
	if n < 0 {
		return 1 / ipow(x, -n)
	}
	r := 1.0
	for range n {
		r *= x
	}
	return r
}

// combine multiplies (sign 1) or divides (sign -1) a by b; at is where the
// operator stands, for the error when an exponent would overflow.
func (p *parser) combine(a, b term, sign int, at int) (term, error) {
	for i := range a.dim {
		e := int(a.dim[i]) + sign*int(b.dim[i])
		if e > 126 || e < -126 {
			return a, &Error{Offset: at, End: p.pos, Msg: "dimension exponent out of range",
				Hint: "a unit this large cannot be right; simplify it"}
		}
		a.dim[i] = int8(e)
	}
	if sign > 0 {
		a.factor *= b.factor
	} else {
		a.factor /= b.factor
	}
	a.sys |= b.sys
	return a, nil
}

func (p *parser) skipSpace() {
	for p.pos < len(p.text) && (p.text[p.pos] == ' ' || p.text[p.pos] == '\t') {
		p.pos++
	}
}

// nameEnd returns the end of the unit name that starts at i.
func (p *parser) nameEnd(i int) int {
	r, size := utf8.DecodeRuneInString(p.text[i:])
	if r == '%' || r == '‰' {
		return i + size
	}
	for i < len(p.text) {
		r, size := utf8.DecodeRuneInString(p.text[i:])
		if !isNameRune(r) {
			break
		}
		i += size
	}
	return i
}

func isNameStart(r rune) bool { return isNameRune(r) || r == '%' || r == '‰' }

func isNameRune(r rune) bool {
	return unicode.IsLetter(r) || r == '°' || r == '℃' || r == '℉'
}

func isDigit(r rune) bool { return r >= '0' && r <= '9' }
