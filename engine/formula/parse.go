package formula

import (
	"errors"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Options limit what a formula may hold.
type Options struct {
	MaxDepth int  // bracket and operator nesting; 0 means DefaultMaxDepth
	MaxNodes uint // syntax tree nodes; 0 means 10,000
	// Range lets the whole expression be a comparison between two limits,
	// `lo <= x <= hi` (or with >=), read as a KRange node: the expression
	// of a range check.
	Range bool
	// Arena, when set, holds the formula's slices (see Arena).
	Arena *Arena
}

// MaxText is the longest formula text, in bytes: a node's span is 16 bits.
const MaxText = 1<<16 - 1

// DefaultMaxDepth is the default limit on expression nesting.
const DefaultMaxDepth = 64

// syntaxDetail is the detail line of a syntax error: what a formula may hold.
const syntaxDetail = "formulas use + - * / ^, comparisons, `a ? b : c`, calls f(x), fields r.x, lists [a, b] and records {k: v}"

// Parse parses the expression e. Problems come back as diagnostics with
// positions in the sheet; the Formula is nil when the text cannot be
// parsed. A formula whose units do not parse comes back with its tree and
// the unit errors (the literal's Unit has Factor 0).
func Parse(e sheet.Expr, opt Options) (*Formula, diag.List) {
	f := &Formula{Source: &e}
	ok, errs := f.ParseSource(opt)
	if !ok {
		return nil, errs
	}
	return f, errs
}

// ParseSource parses f.Source into f itself, for callers that allocated the
// Formula already (the checker keeps one per cell). It reports false when
// the text cannot be parsed, which is when Parse returns nil.
func (f *Formula) ParseSource(opt Options) (bool, diag.List) {
	*f = Formula{Source: f.Source, Root: -1}
	if opt.MaxDepth <= 0 {
		opt.MaxDepth = DefaultMaxDepth
	}
	if opt.MaxNodes == 0 {
		opt.MaxNodes = 10000
	}
	e := f.Source
	var errs diag.List
	if strings.TrimSpace(e.Text) == "" {
		errs.Errorf(e.Range, "an expression computes the value of the cell", "write a value such as `38 kN` or a formula such as `N / A`", "empty expression")
		return false, errs
	}
	if len(e.Text) > MaxText {
		errs.Add(&diag.Diagnostic{Range: e.RangeAt(0, 0), Summary: "the formula is too long",
			Detail: "a formula may hold at most " + plural.Grouped(MaxText) + " bytes; this one has " + plural.Grouped(len(e.Text)), Hint: "split it into intermediate cells"})
		return false, errs
	}
	p := parser{f: f, lex: lexer{src: e.Text}, opt: opt}
	if a := opt.Arena; a != nil {
		f.Nodes, p.argList, p.quants = a.scratchNodes[:0], a.scratchArgs[:0], a.scratchQuants[:0]
		defer a.keep(f, &p)
	}
	ok := p.parse()
	if opt.Arena == nil && (len(p.argList) > 0 || len(p.quants) > 0) {
		f.side = &side{args: p.argList, quants: p.quants}
	}
	errs = p.errs
	if !ok {
		errs.Sort()
		return false, errs
	}
	if errs.HasErrors() {
		errs.Sort()
		return true, errs
	}
	return true, nil
}

// parser is a recursive-descent parser of SPEC.md §4; each method quotes
// the rule it reads. The first syntax error stops it (a panic of
// *syntaxError caught in parse): a formula is one line, and what follows a
// slip is rarely worth a second message.
type parser struct {
	f       *Formula
	argList []int32    // the formula's argument lists, kept in f.side
	quants  []Quantity // its quantity literals, kept in f.side
	lex     lexer
	tok     token
	prev    token // the token before tok
	opt     Options
	depth   int
	errs    diag.List // held here, not behind a pointer, so it need not escape
}

func (p *parser) parse() (ok bool) {
	defer func() {
		if r := recover(); r != nil {
			se, isSyntax := r.(*syntaxError)
			if !isSyntax {
				panic(r)
			}
			p.report(se)
			ok = false
		}
	}()
	if p.opt.Arena == nil {
		// A formula has about one node per three bytes of text.
		p.f.Nodes = make([]Node, 0, len(p.lex.src)/3+1)
	}
	p.next()
	root := p.expression()
	if p.opt.Range && p.tok.kind == tOp && isCompare(p.tok.text) && p.f.Nodes[root].Kind == KBinary && p.f.Nodes[root].Op.IsComparison() {
		root = p.rangeTail(root)
	}
	if p.tok.kind != tEOF {
		p.unexpected()
	}
	p.f.Root = root
	return true
}

func (p *parser) next() {
	p.prev = p.tok
	p.lex.next(&p.tok)
}

func (p *parser) isOp(s string) bool { return p.tok.kind == tOp && p.tok.text == s }

// add appends a node and returns its index.
func (p *parser) add(n Node) int32 {
	if uint(len(p.f.Nodes)) >= p.opt.MaxNodes {
		panic(&syntaxError{from: int32(n.From), to: int32(n.To), summary: "the formula is too long",
			detail: "a formula may hold at most " + strconv.FormatUint(uint64(p.opt.MaxNodes), 10) + " terms", hint: "split it into intermediate cells"})
	}
	p.f.Nodes = append(p.f.Nodes, n)
	return int32(len(p.f.Nodes) - 1)
}

// enter counts one level of nesting; leave undoes it.
func (p *parser) enter() {
	p.depth++
	if p.depth > p.opt.MaxDepth {
		panic(&syntaxError{from: p.tok.from, to: max(p.tok.to, p.tok.from+1), summary: "expression nested too deeply",
			detail: "operators and brackets may nest at most " + strconv.Itoa(p.opt.MaxDepth) + " levels deep", hint: "split the formula into intermediate cells"})
	}
}

func (p *parser) leave() { p.depth-- }

// expression = choice .
// choice     = or [ "?" expression ":" expression ] .
func (p *parser) expression() int32 {
	p.enter()
	defer p.leave()
	from := p.tok.from
	c := p.climb(precOr)
	if !p.isOp("?") {
		return c
	}
	p.next()
	a := p.expression()
	if !p.isOp(":") {
		if p.tok.kind == tEOF {
			p.fail(p.tok, "the formula ends too early", "a choice is written `condition ? value_if_true : value_if_false`")
		}
		p.fail(p.tok, "expected `:` of `a ? b : c`, found `"+p.tok.text+"`", "a choice is written `condition ? value_if_true : value_if_false`")
	}
	p.next()
	b := p.expression()
	return p.add(Node{Kind: KCond, From: uint16(from), To: uint16(p.prev.to), A: p.keep(c, a, b), B: 3})
}

// The binary operators are read by precedence climbing, one loop over the
// rules of SPEC.md §4 from `or` down to `^`:
//
//	or      = and { "or" and } .
//	and     = not { "and" not } .
//	not     = "not" not | compare .
//	compare = sum [ ( "<" | "<=" | ">" | ">=" | "==" | "!=" ) sum ] .
//	sum     = product { ( "+" | "-" ) product } .
//	product = unary { ( "*" | "/" ) unary } .
//	unary   = ( "-" | "+" ) unary | power .
//	power   = postfix [ "^" unary ] .
//
// A level is the rule an operand is read at: precOr reads a whole `or`,
// precUnary a `unary`. The prefix words and signs have levels of their own
// between the binary ones, so `not a < b` is not (a < b), `-x^2` is
// -(x^2), `2^-1` is 2^(-1) and `a^b^c` is a^(b^c). Reading every operand
// through one loop, rather than down a function per rule, keeps a formula
// of a large sheet from descending ten calls for each name and number.
const (
	precOr = 1 + iota
	precAnd
	precNot
	precCompare
	precSum
	precProduct
	precUnary
	precPower
)

// binaryOp returns the operator and the level of the binary operator t
// (0 when t is not one).
func binaryOp(t token) (Op, int) {
	if t.kind != tOp {
		return OpNone, 0
	}
	switch t.text {
	case "or":
		return OpOr, precOr
	case "and":
		return OpAnd, precAnd
	case "<":
		return OpLT, precCompare
	case "<=":
		return OpLE, precCompare
	case ">":
		return OpGT, precCompare
	case ">=":
		return OpGE, precCompare
	case "==":
		return OpEQ, precCompare
	case "!=":
		return OpNE, precCompare
	case "+":
		return OpAdd, precSum
	case "-":
		return OpSub, precSum
	case "*":
		return OpMul, precProduct
	case "/":
		return OpDiv, precProduct
	case "^":
		return OpPow, precPower
	}
	return OpNone, 0
}

func isCompare(s string) bool {
	_, prec := binaryOp(token{kind: tOp, text: s})
	return prec == precCompare
}

// climb reads an expression of level at least level (see precOr).
func (p *parser) climb(level int) int32 {
	from := p.tok.from
	x := p.operand(level)
	last := precPower + 1 // the level of the operator x was made with
	for {
		op, prec := binaryOp(p.tok)
		// An operator binds here when it is of this level or above and
		// no tighter than the one before it: the tighter ones were read
		// by the right operand. Comparisons do not chain, so none follows
		// a comparison.
		if prec < level || prec > last || prec == precCompare && last == precCompare {
			return x
		}
		p.next()
		switch prec {
		case precPower: // right-associative, and its exponent may have a sign
			p.enter()
			x = p.binary(op, from, x, p.climb(precUnary))
			p.leave()
		case precCompare:
			x = p.binary(op, from, x, p.climb(precSum))
			if p.tok.kind == tOp && isCompare(p.tok.text) && !(p.opt.Range && p.depth == 1) {
				p.fail(p.tok, "comparisons do not chain",
					"write each comparison on its own and join them: `a < b and b < c`; a check may be written between two limits, `check name: lo <= x <= hi`")
			}
		default:
			x = p.binary(op, from, x, p.climb(prec+1))
		}
		last = prec
	}
}

// operand reads the first operand of an expression of level level: a
// `not` or a sign when the level has room for one, else a postfix.
func (p *parser) operand(level int) int32 {
	if p.tok.kind == tOp {
		switch t := p.tok.text; {
		case t == "not" && level <= precNot:
			return p.prefix(OpNot, precNot)
		case t == "-" && level <= precUnary:
			return p.prefix(OpNeg, precUnary)
		case t == "+" && level <= precUnary:
			return p.prefix(OpPlus, precUnary)
		}
	}
	return p.postfix()
}

// prefix reads `not x` or a sign and its operand, of level level.
func (p *parser) prefix(op Op, level int) int32 {
	from := p.tok.from
	p.next()
	p.enter()
	defer p.leave()
	x := p.climb(level)
	return p.add(Node{Kind: KUnary, Op: op, From: uint16(from), To: uint16(p.prev.to), A: x, B: -1})
}

// range = sum ( "<" | "<=" ) sum ( "<" | "<=" ) sum
//
//	| sum ( ">" | ">=" ) sum ( ">" | ">=" ) sum .
//
// rangeTail reads the second comparison of a range check.
func (p *parser) rangeTail(first int32) int32 {
	op1, op2 := p.f.Nodes[first].Op, compareOp(p.tok.text)
	t := p.tok
	up := (op1 == OpLE || op1 == OpLT) && (op2 == OpLE || op2 == OpLT)
	down := (op1 == OpGE || op1 == OpGT) && (op2 == OpGE || op2 == OpGT)
	if !up && !down {
		p.fail(t, "a range is written `lo <= x <= hi` or `hi >= x >= lo`",
			"both comparisons of a range point the same way")
	}
	p.next()
	hi := p.climb(precSum)
	fn := p.f.Nodes[first]
	return p.add(Node{Kind: KRange, Op: op1, Op2: op2, From: fn.From, To: uint16(p.prev.to), A: p.keep(fn.A, fn.B, hi), B: 3})
}

func compareOp(s string) Op {
	op, _ := binaryOp(token{kind: tOp, text: s})
	return op
}

// binary makes the node of a op b, read from offset from up to the last
// token read.
func (p *parser) binary(op Op, from int32, a, b int32) int32 {
	return p.add(Node{Kind: KBinary, Op: op, From: uint16(from), To: uint16(p.prev.to), A: a, B: b})
}

// postfix = primary { "." name | "[" expression "]" } .
func (p *parser) postfix() int32 {
	from := p.tok.from
	x := p.primary()
	for p.tok.kind == tOp {
		switch p.tok.text {
		case ".":
			p.next()
			if p.tok.kind != tName {
				p.expected("a field name after `.`", "write the field, as in `steel.f_y`")
			}
			name := p.name(false)
			if p.isOp("(") {
				p.fail(p.tok, "methods are not part of the sheet language", "pass the value as the first argument: `f(x)` rather than `x.f()`")
			}
			x = p.add(Node{Kind: KField, From: uint16(from), To: uint16(p.prev.to), A: x, B: name})
		case "[":
			p.next()
			i := p.expression()
			p.close("[", "]")
			x = p.add(Node{Kind: KIndex, From: uint16(from), To: uint16(p.prev.to), A: x, B: i})
		case "(":
			p.fail(p.tok, "only named functions can be called", "write `f(x)` where f is a built-in, a plugin or a function of the sheet")
		default:
			return x
		}
	}
	return x
}

// name makes a KName node of the current name token; ref says whether the
// name refers to a value or a function (not a field or a record key).
func (p *parser) name(ref bool) int32 {
	t := p.tok
	p.next()
	n := p.add(Node{Kind: KName, Ref: ref, From: uint16(t.from), To: uint16(t.to), A: -1, B: -1})
	if ref {
		p.f.nrefs++ // after add, which stops a formula with too many nodes
	}
	return n
}

// primary = quantity | number | "true" | "false" | call | name
//
//	| "(" expression ")" | "[" [ args ] "]" | "{" [ field { "," field } ] "}" .
func (p *parser) primary() int32 {
	t := p.tok
	switch t.kind {
	case tNumber:
		return p.number()
	case tName:
		switch t.text {
		case "let", "if", "nil", "null", "map", "filter":
			p.nonFeature(t)
		}
		if _, ok := p.lex.peekOpen(); ok {
			return p.call()
		}
		return p.name(true)
	case tString:
		panic(&syntaxError{from: t.from, to: t.to, summary: "text is only allowed as a function argument",
			detail: "a cell computes a number, a list, a record or a table; text such as \"fixed\" selects a mode of a function",
			hint:   "remove the quotes, or pass the text to the function that needs it"})
	case tEOF:
		p.atEnd()
	}
	switch t.text {
	case "true", "false":
		p.next()
		v := 0.0
		if t.text == "true" {
			v = 1
		}
		return p.add(numNode(KBool, t.from, t.to, v))
	case "(":
		p.next()
		x := p.expression()
		p.close("(", ")")
		// The brackets take no node: the spans of the nodes around x
		// run from token to token, so they take the brackets in.
		return x
	case "[":
		p.next()
		if p.isOp("]") {
			p.next()
			return p.add(Node{Kind: KList, From: uint16(t.from), To: uint16(p.prev.to), A: int32(len(p.argList)), B: 0})
		}
		args := p.args("[", "]", false)
		return p.add(Node{Kind: KList, From: uint16(t.from), To: uint16(p.prev.to), A: p.keep(args...), B: int32(len(args))})
	case "{":
		return p.record()
	}
	p.unexpected()
	return -1
}

// number makes a KNumber or KQuantity node of the current number token.
func (p *parser) number() int32 {
	t := p.tok
	p.next()
	num := t.text[:t.numEnd-t.from]
	v, out := parseNumber(num)
	if out {
		p.errs.Add(&diag.Diagnostic{Range: p.f.Source.RangeAt(int(t.from), int(t.numEnd)), Summary: "the number `" + num + "` is out of range",
			Detail: "numbers are 64-bit floating point: their magnitude must lie between about 2.2e-308 and 1.8e308", Hint: "check the exponent"})
	}
	if t.unitFrom == t.to {
		return p.add(numNode(KNumber, t.from, t.to, v))
	}
	q := Quantity{Value: v, From: t.from, To: t.to, NumEnd: t.numEnd, UnitFrom: t.unitFrom}
	u, err := p.unit(p.lex.src[t.unitFrom:t.to])
	q.unit = u
	if err != nil {
		p.errs.Add(p.unitDiag(t, err))
	} else {
		q.SI = v * u.Factor
	}
	p.quants = append(p.quants, q)
	return p.add(Node{Kind: KQuantity, From: uint16(t.from), To: uint16(t.to), A: int32(len(p.quants) - 1), B: -1})
}

// noUnit is the Unit of a literal whose unit did not parse.
var noUnit = &units.Unit{}

// unit parses the unit text of a literal, once per text for the formulas
// of an Arena; a unit that does not parse is noUnit.
func (p *parser) unit(text string) (*units.Unit, error) {
	a := p.opt.Arena
	if a != nil {
		if u, ok := a.units[text]; ok {
			return u, nil
		}
	}
	u, err := units.Parse(text)
	if err != nil {
		return noUnit, err
	}
	if a == nil {
		return &u, nil
	}
	if a.units == nil {
		a.units = map[string]*units.Unit{}
	}
	a.units[text] = &u
	return &u, nil
}

// call = name "(" [ args ] ")" .
func (p *parser) call() int32 {
	t := p.tok
	callee := p.name(true)
	p.next() // (
	if p.isOp(")") {
		p.next()
		return p.add(Node{Kind: KCall, From: uint16(t.from), To: uint16(p.prev.to), A: p.keep(callee), B: 0})
	}
	args := p.args("(", ")", true)
	// The callee, then the arguments right after it.
	start := p.keep(callee)
	p.keep(args...)
	return p.add(Node{Kind: KCall, From: uint16(t.from), To: uint16(p.prev.to), A: start, B: int32(len(args))})
}

// args = arg { "," arg } [ "," ] .
// arg  = string | expression .
//
// It reads up to and including the closing bracket.
func (p *parser) args(open, closing string, text bool) []int32 {
	var args []int32
	for {
		if text && p.tok.kind == tString {
			args = append(args, p.stringArg())
		} else {
			args = append(args, p.expression())
		}
		if p.isOp(",") {
			p.next()
			if p.isOp(closing) {
				break // a trailing comma
			}
			continue
		}
		break
	}
	p.close(open, closing)
	return args
}

// stringArg reads "text" that is a whole argument.
func (p *parser) stringArg() int32 {
	t := p.tok
	p.next()
	if p.tok.kind == tOp && (p.tok.text == "," || p.tok.text == ")" || p.tok.text == "}") {
		return p.add(Node{Kind: KString, From: uint16(t.from), To: uint16(t.to), A: -1, B: -1})
	}
	p.fail(t, "text is only allowed as a function argument", "pass the text on its own, as in f(x, \"fixed\")")
	return -1
}

// keep appends terms to the formula's argument lists and returns their
// start.
func (p *parser) keep(terms ...int32) int32 {
	start := int32(len(p.argList))
	p.argList = append(p.argList, terms...)
	return start
}

// record = "{" [ field { "," field } ] "}" .
// field  = name ":" ( string | expression ) .
func (p *parser) record() int32 {
	t := p.tok
	p.next()
	var args []int32
	for !p.isOp("}") {
		if p.tok.kind != tName {
			if p.tok.kind == tEOF {
				p.atEnd()
			}
			p.fail(p.tok, "a record field is written `name: value`", "write the fields as in `{E: 210 GPa, f_y: 355 MPa}`")
		}
		key := p.name(false)
		if !p.isOp(":") {
			p.fail(p.tok, "a record field is written `name: value`", "write the fields as in `{E: 210 GPa, f_y: 355 MPa}`")
		}
		p.next()
		var v int32
		if p.tok.kind == tString {
			v = p.stringArg()
		} else {
			v = p.expression()
		}
		args = append(args, key, v)
		if !p.isOp(",") {
			break
		}
		p.next()
	}
	p.close("{", "}")
	return p.add(Node{Kind: KRecord, From: uint16(t.from), To: uint16(p.prev.to), A: p.keep(args...), B: int32(len(args))})
}

// close consumes the closing bracket of open or reports it missing.
func (p *parser) close(open, closing string) {
	if p.isOp(closing) {
		p.next()
		return
	}
	if p.tok.kind == tEOF {
		p.fail(p.prev, "the formula ends before `"+closing+"`", "close `"+open+"` with `"+closing+"`")
	}
	p.unexpected()
}

// peekOpen reports whether the next non-space character is `(`.
func (l *lexer) peekOpen() (int, bool) {
	for i := l.pos; i < len(l.src); i++ {
		switch l.src[i] {
		case ' ', '\t', '\n', '\r':
			continue
		case '(':
			return i, true
		}
		return i, false
	}
	return len(l.src), false
}

// fail stops at token t with a summary and a hint.
func (p *parser) fail(t token, summary, hint string) {
	to := t.to
	if to <= t.from {
		to = t.from + 1
	}
	panic(&syntaxError{from: t.from, to: to, summary: summary, detail: syntaxDetail, hint: hint})
}

func (p *parser) expected(what, hint string) {
	if p.tok.kind == tEOF {
		p.fail(p.prev, "expected "+what, hint)
	}
	p.fail(p.tok, "expected "+what+", found `"+p.tok.text+"`", hint)
}

// atEnd reports a formula that ends where a value is due.
func (p *parser) atEnd() {
	last := p.prev
	switch {
	case last.kind == tEOF:
		p.fail(last, "the formula ends too early", "finish the expression")
	case last.text == ".":
		p.fail(last, "expected a field name after `.`", "write the field, as in `steel.f_y`")
	case last.text == ",":
		p.fail(last, "the formula ends after `,`", "write a value after `,`, or remove the comma")
	case last.kind == tOp && needsValue(last.text):
		p.fail(last, "the formula ends after `"+last.text+"`", "write a value after `"+last.text+"`, or remove the operator")
	}
	p.fail(last, "the formula ends too early", "finish the expression")
}

// unexpected reports the current token where it cannot stand.
func (p *parser) unexpected() {
	got, last := p.tok, p.prev
	if got.kind == tEOF {
		p.atEnd()
	}
	hint := ""
	switch {
	case got.text == "=":
		hint = "a cell has one `=`; to compare two values write `==`, or `<=` in a check"
	case (got.text == ")" || got.text == "]" || got.text == "}") && last.kind == tOp && (needsValue(last.text) || last.text == "."):
		hint = "write a value after `" + last.text + "`"
	case got.text == ")" || got.text == "]" || got.text == "}":
		hint = "remove it, or open the matching bracket before it"
	case got.text == "," && last.kind == tOp && (last.text == "," || last.text == "(" || last.text == "[" || last.text == "{"):
		hint = "write a value before `,`, or remove the comma"
	case got.text == ",":
		hint = "a comma separates the arguments of a call or the items of a list or record"
	case got.kind == tOp && needsValue(got.text) && last.kind == tOp && needsValue(last.text):
		hint = "write a value between `" + last.text + "` and `" + got.text + "`"
	case got.kind == tOp && needsValue(got.text):
		hint = "write a value before `" + got.text + "`"
	case got.text == ":" && !strings.Contains(p.lex.src[:got.from], "?"):
		hint = "a choice is written `condition ? value_if_true : value_if_false`"
	case last.kind != tEOF && !(last.kind == tOp && (needsValue(last.text) || strings.Contains("([{,.", last.text))):
		// Two values side by side: `1 2`, `foo bar`, `2 m 3 m`.
		hint = "write an operator between `" + last.text + "` and `" + got.text + "`, as in `" + last.text + " * " + got.text + "`"
	}
	p.fail(got, "unexpected `"+got.text+"`", hint)
}

// nonFeature reports a word that names a feature of other expression
// languages that a sheet does not have.
func (p *parser) nonFeature(t token) {
	if _, ok := p.lex.peekOpen(); ok && (t.text == "map" || t.text == "filter") {
		panic(&syntaxError{from: t.from, to: t.to, summary: "closures are not part of the sheet language",
			detail: "a formula computes one value from cells, lists and tables", hint: "use sum(xs), min(xs), max(xs), mean(xs) or a table column"})
	}
	switch t.text {
	case "let":
		panic(&syntaxError{from: t.from, to: t.to, summary: "`let` is not part of the sheet language", detail: "each name is a cell of its own", hint: "write the intermediate value as its own cell"})
	case "if":
		panic(&syntaxError{from: t.from, to: t.to, summary: "`if` is not part of the sheet language", detail: "a formula chooses with `cond ? a : b`", hint: "write `x > 0 ? a : b`"})
	case "nil", "null":
		panic(&syntaxError{from: t.from, to: t.to, summary: "`" + t.text + "` is not part of the sheet language", detail: "every cell has a value", hint: "give the value, e.g. `0 kN`"})
	}
}

// needsValue reports whether operator s needs a value after it.
func needsValue(s string) bool {
	switch s {
	case "+", "-", "*", "/", "^", "?", ":", "==", "!=", "<", "<=", ">", ">=", "=", "and", "or", "not":
		return true
	}
	return false
}

func (p *parser) report(se *syntaxError) {
	e := p.f.Source
	from, to := min(int(se.from), len(e.Text)), min(int(se.to), len(e.Text))
	if from == to && from > 0 {
		from--
	}
	p.errs.Add(&diag.Diagnostic{Range: e.RangeAt(from, to), Summary: se.summary, Detail: se.detail, Hint: se.hint})
}

// unitDiag turns a unit parse error into a diagnostic pointing into the
// unit text.
func (p *parser) unitDiag(t token, err error) *diag.Diagnostic {
	e := p.f.Source
	d := &diag.Diagnostic{
		Range:   e.RangeAt(int(t.unitFrom), int(t.to)),
		Summary: err.Error(),
		Detail:  "a number followed by a unit is a quantity: `38 kN`, `4.5 kN/m`, `12e-6 1/K`",
		Hint:    "to multiply by a cell, write the operator: `2 * x`",
	}
	var ue *units.Error
	if errors.As(err, &ue) {
		from, to := int(t.unitFrom)+ue.Offset, int(t.unitFrom)+ue.End
		if to <= from {
			to = int(t.to)
		}
		if from >= int(t.unitFrom) && to <= int(t.to) {
			d.Range = e.RangeAt(from, to)
		}
		d.Summary = ue.Msg
		if ue.Hint != "" {
			d.Hint = ue.Hint
		}
	}
	return d
}
