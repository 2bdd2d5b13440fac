package formula

import (
	"errors"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"
	"github.com/expr-lang/expr/builtin"
	"github.com/expr-lang/expr/conf"
	"github.com/expr-lang/expr/parser"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
)

// Formula is one parsed expression of a sheet.
type Formula struct {
	Source sheet.Expr // the expression as written, with its place in the file
	// Tree is expr-lang's syntax tree of the rewritten text: every quantity
	// literal is an *ast.IdentifierNode named Quantities[i].Ident.
	Tree       ast.Node
	Rewritten  string     // the text expr-lang parsed
	Quantities []Quantity // quantity literals in order of appearance
	Refs       []Ref      // names referred to, in order of appearance

	edits   []edit
	runeIdx []int // byte offset in Rewritten of each rune; nil when ASCII
}

// Quantity is a number written with a unit, such as `38 kN`.
type Quantity struct {
	Ident    string     // synthetic identifier standing for it in Tree
	Text     string     // as written, e.g. "38 kN"
	Number   string     // the number as written, e.g. "38"
	Value    float64    // the number's value, 38
	UnitText string     // the unit as written, e.g. "kN"
	Unit     units.Unit // the parsed unit
	SI       float64    // Value in SI base units
	Range    diag.Range
}

// Ref is a name the formula refers to: a cell, a function, a table, a
// record. Member names after a dot are not refs.
type Ref struct {
	Name string
	Call bool // the name is called: f(x)
	Node *ast.IdentifierNode
	f    *Formula
}

// Range returns the sheet range of the name. It is computed when asked:
// a large sheet has hundreds of thousands of references and a message for
// very few of them.
func (r Ref) Range() diag.Range {
	if r.f == nil || r.Node == nil {
		return diag.Range{}
	}
	return r.f.Range(r.Node)
}

// edit records that text[Off:End] was replaced by an identifier occupying
// Rewritten[ROff:REnd].
type edit struct{ off, end, roff, rend int }

// Options limit what a formula may hold.
type Options struct {
	MaxDepth int  // bracket and operator nesting; 0 means 64
	MaxNodes uint // syntax tree nodes; 0 means 10,000
}

// DefaultMaxDepth is the default limit on expression nesting.
const DefaultMaxDepth = 64

var exprConfig = func() *conf.Config {
	c := conf.CreateNew()
	for _, f := range builtin.Builtins {
		c.Disabled[f.Name] = true
	}
	return c
}()

// Parse parses the expression e. Problems come back as diagnostics with
// positions in the sheet; the Formula is nil when the text cannot be
// parsed at all.
func Parse(e sheet.Expr, opt Options) (*Formula, diag.List) {
	f := &Formula{Source: e}
	ok, errs := f.parse(opt)
	if !ok {
		return nil, errs
	}
	return f, errs
}

// ParseSource parses f.Source into f itself, for callers that allocated the
// Formula already (the checker keeps one per cell): a large sheet then
// allocates one Formula per cell instead of two. It reports false when the
// text cannot be parsed at all, which is when Parse returns a nil Formula;
// f must then not be used.
func (f *Formula) ParseSource(opt Options) (bool, diag.List) {
	*f = Formula{Source: f.Source}
	return f.parse(opt)
}

func (f *Formula) parse(opt Options) (bool, diag.List) {
	if opt.MaxDepth <= 0 {
		opt.MaxDepth = DefaultMaxDepth
	}
	if opt.MaxNodes == 0 {
		opt.MaxNodes = 10000
	}
	e := f.Source
	var errs diag.List
	text := e.Text
	if strings.TrimSpace(text) == "" {
		errs.Errorf(e.Range, "an expression computes the value of the cell", "write a value such as `38 kN` or a formula such as `N / A`", "empty expression")
		return false, errs
	}
	lits, issues, depth := scan(text)
	for _, is := range issues {
		errs.Errorf(e.RangeAt(is.off, is.end), is.detail, is.hint, "%s", is.msg)
	}
	if depth > opt.MaxDepth {
		errs.Errorf(e.Range, "brackets may nest at most "+strconv.Itoa(opt.MaxDepth)+" levels deep",
			"split the formula into intermediate cells", "expression nested too deeply")
		return false, errs
	}
	f.Rewritten = text
	if len(lits) > 0 {
		f.rewrite(lits, &errs)
	}
	if !isASCII(f.Rewritten) {
		f.runeIdx = make([]int, 0, len(f.Rewritten)+1)
		for i := range f.Rewritten {
			f.runeIdx = append(f.runeIdx, i)
		}
		f.runeIdx = append(f.runeIdx, len(f.Rewritten))
	}
	// The fast parser builds the same tree as expr-lang for the common
	// subset; anything else, and every syntax error, goes to expr-lang so
	// that its messages stay as they are.
	var idents int
	if f.Tree, idents = fastParse(f.Rewritten, opt.MaxNodes); f.Tree == nil {
		tree, err := exprParse(f.Rewritten, opt.MaxNodes)
		if err != nil {
			errs.Add(f.syntaxDiag(err))
			errs.Sort()
			return false, errs
		}
		f.Tree = tree
	}
	if n := idents - len(f.Quantities); n > 0 {
		f.Refs = make([]Ref, 0, n)
	}
	errs = append(errs, f.restrict(opt.MaxDepth)...)
	errs.Sort()
	if errs.HasErrors() {
		return true, errs
	}
	return true, nil
}

// rewrite replaces each quantity literal of the text by its synthetic
// identifier (`__q0`, `__q1`, ...) and parses its unit.
func (f *Formula) rewrite(lits []literal, errs *diag.List) {
	e := f.Source
	text := e.Text
	var b strings.Builder
	b.Grow(len(text) + 4*len(lits))
	last := 0
	f.Quantities = make([]Quantity, 0, len(lits))
	f.edits = make([]edit, 0, len(lits))
	for i, l := range lits {
		q := Quantity{
			Ident:    syntheticName(i),
			Text:     text[l.off:l.end],
			Number:   l.numberText,
			Value:    l.value,
			UnitText: l.unitText,
			Range:    e.RangeAt(l.off, l.end),
		}
		u, err := units.Parse(l.unitText)
		if err != nil {
			errs.Add(unitDiag(e, l, err))
		} else {
			q.Unit = u
			q.SI = l.value * u.Factor
		}
		b.WriteString(text[last:l.off])
		roff := b.Len()
		b.WriteString(q.Ident)
		f.edits = append(f.edits, edit{l.off, l.end, roff, b.Len()})
		last = l.end
		f.Quantities = append(f.Quantities, q)
	}
	b.WriteString(text[last:])
	f.Rewritten = b.String()
}

// syntheticNames holds the names of the first quantity literals, so that
// the common formula allocates none.
var syntheticNames = func() (s [16]string) {
	for i := range s {
		s[i] = SyntheticPrefix + strconv.Itoa(i)
	}
	return s
}()

func syntheticName(i int) string {
	if i < len(syntheticNames) {
		return syntheticNames[i]
	}
	return SyntheticPrefix + strconv.Itoa(i)
}

// exprParse parses text with expr-lang's parser and our configuration.
func exprParse(text string, maxNodes uint) (ast.Node, error) {
	cfg := *exprConfig
	cfg.MaxNodes = maxNodes
	tree, err := parser.ParseWithConfig(text, &cfg)
	if err != nil {
		return nil, err
	}
	return tree.Node, nil
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return false
		}
	}
	return true
}

// unitDiag turns a unit parse error into a diagnostic pointing into the
// unit text.
func unitDiag(e sheet.Expr, l literal, err error) *diag.Diagnostic {
	d := &diag.Diagnostic{
		Range:   e.RangeAt(l.unitOff, l.end),
		Summary: err.Error(),
		Detail:  "a number followed by a unit is a quantity: `38 kN`, `4.5 kN/m`, `12e-6 1/K`",
		Hint:    "to multiply by a cell, write the operator: `2 * x`",
	}
	var ue *units.Error
	if errors.As(err, &ue) {
		from, to := l.unitOff+ue.Offset, l.unitOff+ue.End
		if to <= from {
			to = l.end
		}
		if from >= l.unitOff && to <= l.end {
			d.Range = e.RangeAt(from, to)
		}
		d.Summary = ue.Msg
		if ue.Hint != "" {
			d.Hint = ue.Hint
		}
	}
	return d
}

// syntaxDiag maps an expr-lang parse error back to the sheet.
func (f *Formula) syntaxDiag(err error) *diag.Diagnostic {
	d := &diag.Diagnostic{
		Range:   f.Source.Range,
		Summary: "cannot read the formula",
		Detail:  "formulas use + - * / ^, comparisons, `a ? b : c`, calls f(x), fields r.x, lists [a, b] and records {k: v}",
	}
	if fe, ok := asFileError(err); ok {
		from, to := f.orig(f.byteAt(fe.From), false), f.orig(f.byteAt(fe.To), true)
		if to <= from {
			to = from + 1
		}
		to = min(to, len(f.Source.Text))
		from = min(from, len(f.Source.Text))
		if from == to && from > 0 {
			from--
		}
		d.Range = f.Source.RangeAt(from, to)
		got, last := f.syntaxWords(fe)
		d.Summary, d.Hint = reword(fe.Message, got, last)
		if atEnd(fe.Message) && strings.Contains(f.Source.Text, "?") && !strings.Contains(f.Source.Text, ":") {
			d.Hint = "a choice is written `condition ? value_if_true : value_if_false`"
		}
	}
	return d
}

// cleanMessage rewords expr-lang's messages in the sheet's terms.
func cleanMessage(m string) string {
	m = strings.ReplaceAll(m, "EOF", "end of formula")
	for i := 0; i < 64; i++ {
		m = strings.ReplaceAll(m, SyntheticPrefix+strconv.Itoa(i)+" ", "quantity ")
	}
	if m == "" {
		return "cannot read the formula"
	}
	return strings.ToLower(m[:1]) + m[1:]
}

// byteAt converts a rune index of Rewritten to a byte offset.
func (f *Formula) byteAt(r int) int {
	if r < 0 {
		return 0
	}
	if f.runeIdx == nil {
		return min(r, len(f.Rewritten))
	}
	if r >= len(f.runeIdx) {
		return len(f.Rewritten)
	}
	return f.runeIdx[r]
}

// orig maps a byte offset of Rewritten back to the written text. Inside a
// synthetic identifier it maps to the literal's start (or its end when end
// is set).
func (f *Formula) orig(p int, end bool) int {
	i := sort.Search(len(f.edits), func(i int) bool { return f.edits[i].roff > p }) - 1
	if i < 0 {
		return p
	}
	ed := f.edits[i]
	if p < ed.rend {
		if end && p > ed.roff {
			return ed.end
		}
		return ed.off
	}
	return p - ed.rend + ed.end
}

// Span returns the byte span of node n in the written text, covering all of
// its children.
func (f *Formula) Span(n ast.Node) (from, to int) {
	lo, hi := f.span(n)
	return f.orig(lo, false), f.orig(hi, true)
}

// Range returns the sheet range of node n.
func (f *Formula) Range(n ast.Node) diag.Range {
	from, to := f.Span(n)
	return f.Source.RangeAt(from, to)
}

// span returns the byte span of n in Rewritten. The checker asks for the
// span of every typed node, so the common nodes are walked without the
// slice children allocates.
func (f *Formula) span(n ast.Node) (lo, hi int) {
	loc := n.Location()
	lo, hi = f.byteAt(loc.From), f.byteAt(loc.To)
	add := func(c ast.Node) {
		if c == nil {
			return
		}
		a, b := f.span(c)
		lo, hi = min(lo, a), max(hi, b)
	}
	switch n := n.(type) {
	case *ast.IdentifierNode, *ast.IntegerNode, *ast.FloatNode, *ast.BoolNode, *ast.StringNode:
	case *ast.UnaryNode:
		add(n.Node)
	case *ast.BinaryNode:
		add(n.Left)
		add(n.Right)
	case *ast.MemberNode:
		add(n.Node)
		add(n.Property)
	default:
		for _, c := range children(n) {
			add(c)
		}
	}
	return lo, hi
}

// Release drops the syntax tree and the references (which point into it)
// once the checker has typed the formula: the typed nodes keep their spans
// in the written text, and on a sheet of 100,000 cells the trees are tens
// of megabytes that would otherwise stay in memory for the life of the
// sheet. Source, Quantities and the map from Rewritten back to the written
// text stay. Tree and Refs are nil afterwards.
func (f *Formula) Release() {
	f.Tree = nil
	f.Refs = nil
}

// Quantity returns the quantity literal that identifier n stands for.
func (f *Formula) Quantity(n *ast.IdentifierNode) (*Quantity, bool) {
	if !strings.HasPrefix(n.Value, SyntheticPrefix) {
		return nil, false
	}
	i, err := strconv.Atoi(n.Value[len(SyntheticPrefix):])
	if err != nil || i < 0 || i >= len(f.Quantities) || f.Quantities[i].Ident != n.Value {
		return nil, false
	}
	return &f.Quantities[i], true
}

// children lists the direct sub-nodes of n.
func children(n ast.Node) []ast.Node {
	switch n := n.(type) {
	case *ast.UnaryNode:
		return []ast.Node{n.Node}
	case *ast.BinaryNode:
		return []ast.Node{n.Left, n.Right}
	case *ast.ChainNode:
		return []ast.Node{n.Node}
	case *ast.MemberNode:
		return []ast.Node{n.Node, n.Property}
	case *ast.SliceNode:
		return []ast.Node{n.Node, n.From, n.To}
	case *ast.CallNode:
		return append([]ast.Node{n.Callee}, n.Arguments...)
	case *ast.BuiltinNode:
		return n.Arguments
	case *ast.PredicateNode:
		return []ast.Node{n.Node}
	case *ast.ConditionalNode:
		return []ast.Node{n.Cond, n.Exp1, n.Exp2}
	case *ast.VariableDeclaratorNode:
		return []ast.Node{n.Value, n.Expr}
	case *ast.SequenceNode:
		return n.Nodes
	case *ast.ArrayNode:
		return n.Nodes
	case *ast.MapNode:
		return n.Pairs
	case *ast.PairNode:
		return []ast.Node{n.Key, n.Value}
	}
	return nil
}
