package formula

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"
	"github.com/expr-lang/expr/file"
)

// fastParse parses the common subset of formulas straight into expr-lang's
// syntax tree, building the same nodes with the same locations as
// parser.ParseWithConfig does with our configuration (every expr built-in
// disabled). Loading a large sheet spends most of its time in expr-lang's
// parser (its lexer runs as a state machine over a token ring and every
// token allocates); this one reads the text once, without tokens on the
// heap.
//
// It returns nil for anything outside the subset, for any syntax error and
// beyond maxNodes nodes: the caller then asks expr-lang, so the messages of
// broken formulas stay exactly as expr-lang words them. The subset: numbers
// (decimal), names, quantity identifiers, + - * / ^ ** unary - + !,
// comparisons (chained ones too), and/or/&&/||, == !=, `a ? b : c`, calls,
// member access r.x, indexing xs[i], list and record literals, plain
// strings. Refused (left to expr-lang): `not`, `in` and the other word
// operators, `%`, `..`, `??`, `?.`, pipes, `;`, `let`, `if`, `#`, slices,
// methods, comments, escapes and non-ASCII text in strings, bytes, raw
// strings, hex/octal/binary numbers, and the closure built-ins (except
// sum(x) and count(x) without a predicate).
//
// The rule it follows everywhere: when expr-lang's parser would report an
// error or take a path this code does not mimic exactly, give up.
//
// It also returns the number of identifier nodes of the tree, so that the
// caller can size the list of references.
func fastParse(src string, maxNodes uint) (ast.Node, int) {
	p := fastParser{src: src, maxNodes: maxNodes}
	p.runes = utf8.RuneCountInString(src)
	p.next()
	n := p.sequence()
	if p.failed || p.tok.kind != tEOF {
		return nil, 0
	}
	return n, p.idents
}

type tokKind uint8

const (
	tEOF tokKind = iota
	tIdent
	tNumber
	tString
	tOp      // operator; text in tok.val
	tBracket // one of ( ) [ ] { }
)

type token struct {
	kind tokKind
	val  string // identifier name, operator, bracket, number text, string value
	loc  file.Location
}

type fastParser struct {
	src      string
	pos      int // byte offset of the next character
	rpos     int // rune offset of the next character
	runes    int // runes in src
	tok      token
	failed   bool
	nodes    uint
	maxNodes uint
	idents   int
}

// fail gives up on the fast path; it returns nil so callers can write
// `return p.fail()`.
func (p *fastParser) fail() ast.Node {
	p.failed = true
	return nil
}

// count tracks the node limit as expr-lang does (one per node created).
func (p *fastParser) count() bool {
	p.nodes++
	if p.maxNodes > 0 && p.nodes > p.maxNodes {
		p.failed = true
		return false
	}
	return true
}

func (p *fastParser) is(k tokKind, v string) bool { return p.tok.kind == k && p.tok.val == v }

// next reads the next token into p.tok, mimicking expr-lang's lexer for
// the tokens of the subset; anything else sets failed.
func (p *fastParser) next() {
	if p.failed {
		p.tok = token{kind: tEOF}
		return
	}
	// skip spaces (unicode.IsSpace, as expr-lang's lexer)
	for p.pos < len(p.src) {
		c := p.src[p.pos]
		if c < utf8.RuneSelf {
			if c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f' {
				p.pos++
				p.rpos++
				continue
			}
			break
		}
		r, n := utf8.DecodeRuneInString(p.src[p.pos:])
		if !unicode.IsSpace(r) {
			break
		}
		p.pos += n
		p.rpos++
	}
	if p.pos >= len(p.src) {
		p.tok = token{kind: tEOF, loc: file.Location{From: max(p.runes-1, 0), To: p.runes}}
		return
	}
	start, rstart := p.pos, p.rpos
	c := p.src[p.pos]
	emit := func(k tokKind, v string, n int) {
		p.pos += n
		p.rpos += n // ASCII only
		p.tok = token{kind: k, val: v, loc: file.Location{From: rstart, To: p.rpos}}
	}
	switch {
	case c >= '0' && c <= '9':
		p.number(start, rstart)
	case c == '.':
		if p.pos+1 < len(p.src) && p.src[p.pos+1] >= '0' && p.src[p.pos+1] <= '9' {
			p.number(start, rstart)
			return
		}
		if p.pos+1 < len(p.src) && p.src[p.pos+1] == '.' {
			p.failed = true // range
			return
		}
		emit(tOp, ".", 1)
	case c == '"' || c == '\'':
		j := p.pos + 1
		for j < len(p.src) && p.src[j] != c {
			b := p.src[j]
			if b == '\\' || b == '\n' || b == '\r' || b >= utf8.RuneSelf {
				p.failed = true
				return
			}
			j++
		}
		if j >= len(p.src) {
			p.failed = true
			return
		}
		emit(tString, p.src[p.pos+1:j], j+1-p.pos)
	case strings.IndexByte("()[]{}", c) >= 0:
		emit(tBracket, p.src[p.pos:p.pos+1], 1)
	case c == ',':
		emit(tOp, ",", 1)
	case c == '|':
		if p.peekByte(1) != '|' {
			p.failed = true // a pipe
			return
		}
		emit(tOp, "||", 2)
	case c == ':':
		if p.peekByte(1) == ':' {
			p.failed = true
			return
		}
		emit(tOp, ":", 1)
	case c == '+':
		emit(tOp, "+", 1)
	case c == '-':
		emit(tOp, "-", 1)
	case c == '^':
		emit(tOp, "^", 1)
	case c == '/':
		if d := p.peekByte(1); d == '/' || d == '*' {
			p.failed = true // comment
			return
		}
		emit(tOp, "/", 1)
	case c == '?':
		if d := p.peekByte(1); d == '.' || d == '?' {
			p.failed = true
			return
		}
		emit(tOp, "?", 1)
	case c == '&' || c == '!' || c == '=' || c == '*' || c == '<' || c == '>':
		// expr-lang: the character and at most one of & = * after it.
		op := string(c)
		if d := p.peekByte(1); d == '&' || d == '=' || d == '*' {
			op = p.src[p.pos : p.pos+2]
		}
		v, ok := operators[op]
		if !ok {
			p.failed = true
			return
		}
		emit(tOp, v, len(op))
	default:
		r, n := utf8.DecodeRuneInString(p.src[p.pos:])
		if !isAlnum(r) {
			p.failed = true
			return
		}
		if (r == 'b' || r == 'B') && (p.peekByte(1) == '"' || p.peekByte(1) == '\'') {
			p.failed = true // bytes literal
			return
		}
		j, rj := p.pos+n, p.rpos+1
		for j < len(p.src) {
			c := p.src[j]
			if c < utf8.RuneSelf {
				if c == '_' || c == '$' || (c|0x20 >= 'a' && c|0x20 <= 'z') || (c >= '0' && c <= '9') {
					j++
					rj++
					continue
				}
				break
			}
			r, n := utf8.DecodeRuneInString(p.src[j:])
			if !isAlnum(r) {
				break
			}
			j += n
			rj++
		}
		word := p.src[start:j]
		p.pos, p.rpos = j, rj
		p.tok = token{kind: tIdent, val: word, loc: file.Location{From: rstart, To: rj}}
		switch word {
		case "and", "or":
			p.tok.kind = tOp
		case "not", "in", "matches", "contains", "startsWith", "endsWith", "let", "if", "else":
			p.failed = true
		}
	}
}

// operators interns the operator texts the subset accepts.
var operators = map[string]string{
	"&&": "&&", "!": "!", "!=": "!=", "==": "==", "*": "*", "**": "**",
	"<": "<", "<=": "<=", ">": ">", ">=": ">=",
}

func (p *fastParser) peekByte(k int) byte {
	if p.pos+k < len(p.src) {
		return p.src[p.pos+k]
	}
	return 0
}

// isAlnum is expr-lang's identifier character class.
func isAlnum(r rune) bool {
	return r == '_' || r == '$' || unicode.IsLetter(r) || unicode.IsDigit(r)
}

func isDec(c byte) bool { return c >= '0' && c <= '9' || c == '_' }

// number reads a decimal number as expr-lang's lexer does: digits and
// underscores, an optional fraction (not when `..` follows), an optional
// exponent, and no letter or digit right after it.
func (p *fastParser) number(start, rstart int) {
	s := p.src
	j := start
	if s[j] == '0' && j+1 < len(s) && strings.IndexByte("xXoObB", s[j+1]) >= 0 {
		p.failed = true
		return
	}
	for j < len(s) && isDec(s[j]) {
		j++
	}
	if j < len(s) && s[j] == '.' {
		if j+1 < len(s) && s[j+1] == '.' {
			p.failed = true // range
			return
		}
		j++
		for j < len(s) && isDec(s[j]) {
			j++
		}
	}
	if j < len(s) && (s[j] == 'e' || s[j] == 'E') {
		j++
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		for j < len(s) && isDec(s[j]) {
			j++
		}
	}
	if j < len(s) {
		r, _ := utf8.DecodeRuneInString(s[j:])
		if isAlnum(r) {
			p.failed = true
			return
		}
	}
	p.pos, p.rpos = j, rstart+(j-start)
	p.tok = token{kind: tNumber, val: s[start:j], loc: file.Location{From: rstart, To: p.rpos}}
}

// expect consumes the token k v or gives up.
func (p *fastParser) expect(k tokKind, v string) bool {
	if p.is(k, v) {
		p.next()
		return true
	}
	p.failed = true
	return false
}

// sequence: expression, with no `;` (sequences are left to expr-lang).
func (p *fastParser) sequence() ast.Node {
	n := p.expression(0)
	if p.failed || p.is(tOp, ";") {
		return p.fail()
	}
	return n
}

// binaryPrec holds the binary operators of the subset with expr-lang's
// precedences (all left-associative but ** and ^).
func binaryPrec(op string) (prec int, ok bool) {
	switch op {
	case "or", "||":
		return 10, true
	case "and", "&&":
		return 15, true
	case "==", "!=", "<", ">", "<=", ">=":
		return 20, true
	case "+", "-":
		return 30, true
	case "*", "/":
		return 60, true
	case "**", "^":
		return 100, true
	}
	return 0, false
}

func isComparison(op string) bool { return op == "<" || op == ">" || op == "<=" || op == ">=" }

// expression mirrors parser.parseExpression: a primary, then binary
// operators of at least the given precedence, then `? :` at the top.
func (p *fastParser) expression(prec int) ast.Node {
	left := p.primary()
	for !p.failed && p.tok.kind == tOp {
		op := p.tok
		opPrec, ok := binaryPrec(op.val)
		if !ok {
			switch op.val {
			case ",", ":", "?", ".", "!":
				// not binary operators: the caller decides (expr-lang
				// breaks out of its loop on these too)
			default:
				return p.fail()
			}
			break
		}
		if opPrec < prec {
			break
		}
		p.next()
		if isComparison(op.val) {
			left = p.comparison(left, op, opPrec)
			continue
		}
		var right ast.Node
		if op.val == "**" || op.val == "^" {
			right = p.expression(opPrec)
		} else {
			right = p.expression(opPrec + 1)
		}
		if p.failed || !p.count() {
			return nil
		}
		b := &ast.BinaryNode{Operator: op.val, Left: left, Right: right}
		b.SetLocation(op.loc)
		left = b
	}
	if p.failed {
		return nil
	}
	if prec == 0 {
		left = p.conditional(left)
	}
	return left
}

// comparison mirrors parser.parseComparison: `a < b < c` is read as
// `a < b && b < c`.
func (p *fastParser) comparison(left ast.Node, op token, prec int) ast.Node {
	var root ast.Node
	for {
		right := p.expression(prec + 1)
		if p.failed || !p.count() {
			return nil
		}
		cmp := &ast.BinaryNode{Operator: op.val, Left: left, Right: right}
		cmp.SetLocation(op.loc)
		if root == nil {
			root = cmp
		} else {
			if !p.count() {
				return nil
			}
			and := &ast.BinaryNode{Operator: "&&", Left: root, Right: cmp}
			and.SetLocation(op.loc)
			root = and
		}
		left = right
		op = p.tok
		if op.kind != tOp || !isComparison(op.val) {
			break
		}
		p.next()
	}
	return root
}

// conditional mirrors parser.parseConditional, `c ? a : b` and `c ?: b`;
// the node sits at the token after it, as expr-lang places it.
func (p *fastParser) conditional(n ast.Node) ast.Node {
	for !p.failed && p.is(tOp, "?") {
		p.next()
		var a, b ast.Node
		if !p.is(tOp, ":") {
			a = p.expression(0)
			if !p.expect(tOp, ":") {
				return nil
			}
			b = p.expression(0)
		} else {
			p.next()
			a = n
			b = p.expression(0)
		}
		if p.failed || !p.count() {
			return nil
		}
		c := &ast.ConditionalNode{Ternary: true, Cond: n, Exp1: a, Exp2: b}
		c.SetLocation(p.tok.loc)
		n = c
	}
	return n
}

// primary mirrors parser.parsePrimary: unary operators, parentheses, and
// the rest through secondary.
func (p *fastParser) primary() ast.Node {
	t := p.tok
	if t.kind == tOp {
		var prec int
		switch t.val {
		case "-", "+":
			prec = 90
		case "!":
			prec = 50
		default:
			return p.fail()
		}
		p.next()
		x := p.expression(prec)
		if p.failed || !p.count() {
			return nil
		}
		u := &ast.UnaryNode{Operator: t.val, Node: x}
		u.SetLocation(t.loc)
		return p.postfix(u)
	}
	if p.is(tBracket, "(") {
		p.next()
		x := p.sequence()
		if p.failed || !p.expect(tBracket, ")") {
			return nil
		}
		return p.postfix(x)
	}
	return p.secondary()
}

// secondary mirrors parser.parseSecondary.
func (p *fastParser) secondary() ast.Node {
	t := p.tok
	var n ast.Node
	switch t.kind {
	case tIdent:
		p.next()
		switch t.val {
		case "true", "false":
			if !p.count() {
				return nil
			}
			b := &ast.BoolNode{Value: t.val == "true"}
			b.SetLocation(t.loc)
			return b
		case "nil":
			return p.fail()
		}
		if p.is(tBracket, "(") {
			n = p.call(t)
		} else {
			if !p.count() {
				return nil
			}
			p.idents++
			id := &ast.IdentifierNode{Value: t.val}
			id.SetLocation(t.loc)
			n = id
		}
	case tNumber:
		p.next()
		return p.numberNode(t)
	case tString:
		p.next()
		if !p.count() {
			return nil
		}
		s := &ast.StringNode{Value: t.val}
		s.SetLocation(t.loc)
		n = s
	case tBracket:
		switch t.val {
		case "[":
			n = p.array(t)
		case "{":
			n = p.record(t)
		default:
			return p.fail()
		}
	default:
		return p.fail()
	}
	if p.failed {
		return nil
	}
	return p.postfix(n)
}

// numberNode converts a number token as parser.parseSecondary does: with a
// `.` or an `e` it is a float, else an integer.
func (p *fastParser) numberNode(t token) ast.Node {
	v := t.val
	if strings.IndexByte(v, '_') >= 0 {
		v = strings.ReplaceAll(v, "_", "")
	}
	if !p.count() {
		return nil
	}
	if strings.ContainsAny(v, ".eE") {
		x, err := strconv.ParseFloat(v, 64)
		if err != nil {
			return p.fail()
		}
		n := &ast.FloatNode{Value: x}
		n.SetLocation(t.loc)
		return n
	}
	x, err := strconv.ParseInt(v, 10, 64)
	if err != nil {
		return p.fail()
	}
	n := &ast.IntegerNode{Value: int(x)}
	n.SetLocation(t.loc)
	return n
}

// call mirrors parser.parseCall for a name followed by `(`.
func (p *fastParser) call(name token) ast.Node {
	switch name.val {
	case "sum", "count":
		// expr-lang's closure built-ins with an optional predicate: with
		// one argument they are a BuiltinNode.
		p.next()
		if p.is(tBracket, ")") {
			return p.fail()
		}
		x := p.expression(0)
		if p.failed {
			return nil
		}
		// `sum(x, ...)` would need a predicate: left to expr-lang.
		if !p.expect(tBracket, ")") || !p.count() {
			return nil
		}
		b := &ast.BuiltinNode{Name: name.val, Arguments: []ast.Node{x}}
		b.SetLocation(name.loc)
		return b
	case "all", "none", "any", "one", "filter", "map", "find", "findIndex", "findLast",
		"findLastIndex", "groupBy", "sortBy", "reduce":
		return p.fail()
	}
	if !p.count() {
		return nil
	}
	p.idents++
	callee := &ast.IdentifierNode{Value: name.val}
	callee.SetLocation(name.loc)
	args := p.arguments()
	if p.failed || !p.count() {
		return nil
	}
	c := &ast.CallNode{Callee: callee, Arguments: args}
	c.SetLocation(name.loc)
	return c
}

// arguments mirrors parser.parseArguments: `(a, b)`, a trailing comma
// allowed.
func (p *fastParser) arguments() []ast.Node {
	p.expect(tBracket, "(")
	return p.items(")")
}

// items reads the expressions `a, b` up to and including the bracket
// close, a trailing comma allowed, as parser.parseArguments and
// parser.parseArrayExpression do. It returns nil when the input fails.
func (p *fastParser) items(close string) []ast.Node {
	nodes := []ast.Node{}
	for !p.failed && !p.is(tBracket, close) {
		if len(nodes) > 0 {
			if !p.expect(tOp, ",") {
				return nil
			}
			if p.is(tBracket, close) {
				break
			}
		}
		x := p.expression(0)
		if p.failed {
			return nil
		}
		nodes = append(nodes, x)
	}
	if !p.expect(tBracket, close) {
		return nil
	}
	return nodes
}

// array mirrors parser.parseArrayExpression.
func (p *fastParser) array(open token) ast.Node {
	p.next()
	nodes := p.items("]")
	if nodes == nil || !p.count() {
		return nil
	}
	a := &ast.ArrayNode{Nodes: nodes}
	a.SetLocation(open.loc)
	return a
}

// record mirrors parser.parseMapExpression for keys that are names,
// numbers or strings; every pair sits at the opening brace, as in
// expr-lang.
func (p *fastParser) record(open token) ast.Node {
	p.next()
	pairs := make([]ast.Node, 0)
	for !p.failed && !p.is(tBracket, "}") {
		if len(pairs) > 0 {
			if !p.expect(tOp, ",") {
				return nil
			}
			if p.is(tBracket, "}") {
				break
			}
			if p.is(tOp, ",") {
				return p.fail()
			}
		}
		k := p.tok
		if k.kind != tIdent && k.kind != tNumber && k.kind != tString {
			return p.fail()
		}
		if !p.count() {
			return nil
		}
		key := &ast.StringNode{Value: k.val}
		key.SetLocation(k.loc)
		p.next()
		if !p.expect(tOp, ":") {
			return nil
		}
		v := p.expression(0)
		if p.failed || !p.count() {
			return nil
		}
		pair := &ast.PairNode{Key: key, Value: v}
		pair.SetLocation(open.loc)
		pairs = append(pairs, pair)
	}
	if !p.expect(tBracket, "}") || !p.count() {
		return nil
	}
	m := &ast.MapNode{Pairs: pairs}
	m.SetLocation(open.loc)
	return m
}

// postfix mirrors parser.parsePostfixExpression for `.name` and `[i]`.
func (p *fastParser) postfix(n ast.Node) ast.Node {
	for !p.failed {
		switch {
		case p.is(tOp, "."):
			p.next()
			prop := p.tok
			if prop.kind != tIdent {
				return p.fail()
			}
			p.next()
			if p.is(tBracket, "(") { // a method: left to expr-lang
				return p.fail()
			}
			if !p.count() || !p.count() { // two nodes: the property and the member
				return nil
			}
			s := &ast.StringNode{Value: prop.val}
			s.SetLocation(prop.loc)
			m := &ast.MemberNode{Node: n, Property: s}
			m.SetLocation(prop.loc)
			n = m
		case p.is(tBracket, "["):
			open := p.tok
			p.next()
			if p.is(tOp, ":") {
				return p.fail()
			}
			x := p.expression(0)
			if p.failed || p.is(tOp, ":") || !p.count() {
				return p.fail()
			}
			m := &ast.MemberNode{Node: n, Property: x}
			m.SetLocation(open.loc)
			n = m
			if !p.expect(tBracket, "]") {
				return nil
			}
		default:
			return n
		}
	}
	return nil
}
