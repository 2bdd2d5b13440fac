package formula

import (
	"iter"
	"math"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
)

// Kind says what a syntax node is.
type Kind uint8

const (
	KNumber   Kind = iota // a plain number: Num(n)
	KQuantity             // a number with a unit: Quantity(n)
	KBool                 // true or false: Num(n) is 1 or 0
	KString               // "text": Text(n) without the quotes is StringText(n)
	KName                 // a name: Text(n)
	KUnary                // Op A
	KBinary               // A Op B
	KCond                 // x ? y : z, the three Terms(n)
	KCall                 // f(args): Callee(n) names f, args are ArgList(n)
	KField                // A.B: B is the KName of the field
	KIndex                // A[B]
	KList                 // [args]: ArgList(n)
	KRecord               // {k: v, ...}: ArgList(n) alternates KName keys and values
	KRange                // x Op y Op2 z, the three Terms(n): a check between two limits (Options.Range only)
)

// Op is the operator of a KUnary or KBinary node.
type Op uint8

const (
	OpNone Op = iota
	OpNeg     // -x
	OpPlus    // +x
	OpNot     // not x
	OpAdd     // +
	OpSub     // -
	OpMul     // *
	OpDiv     // /
	OpPow     // ^
	OpLT      // <
	OpLE      // <=
	OpGT      // >
	OpGE      // >=
	OpEQ      // ==
	OpNE      // !=
	OpAnd     // and
	OpOr      // or
)

var opText = [...]string{OpNone: "", OpNeg: "-", OpPlus: "+", OpNot: "not", OpAdd: "+", OpSub: "-",
	OpMul: "*", OpDiv: "/", OpPow: "^", OpLT: "<", OpLE: "<=", OpGT: ">", OpGE: ">=", OpEQ: "==",
	OpNE: "!=", OpAnd: "and", OpOr: "or"}

// String returns the operator as written.
func (o Op) String() string { return opText[o] }

// IsComparison reports whether o compares two numbers.
func (o Op) IsComparison() bool { return o >= OpLT && o <= OpNE }

// Node is one node of a formula's syntax tree. Nodes live in the flat slice
// Formula.Nodes and refer to each other by index, so that a formula is a
// few allocations however many nodes it has, and a node is 16 bytes.
type Node struct {
	Kind Kind
	Op   Op
	Op2  Op // the second operator of a KRange
	// Ref marks a KName that names a value or a function, not a field
	// name after a dot nor a record key (it fills a byte the node had
	// spare).
	Ref bool
	// From and To are the byte span of the node in the formula text,
	// children included; a formula is at most MaxText bytes, so a span
	// fits in 16 bits and the node is 16 bytes.
	From uint16
	To   uint16
	// A and B are child node indices (-1 when absent) of a KUnary,
	// KBinary, KField (B the field's name) and KIndex. A KName has no
	// children: its two words are a note for the formula's reader (Note),
	// -1 until it writes one. A node with more children keeps them in the
	// formula's argument lists: for KCall, KList, KRecord, KCond and
	// KRange A is their start there and B their count (ArgList, Terms); a
	// KCall's list starts with its callee, not counted in B (CalleeNode). For KNumber and KBool A and B
	// hold the value's 64 bits, low word first (Num reads them), so that
	// a number costs no slice of its own; for KQuantity A indexes
	// Formula.Quantities().
	A, B int32
}

// Formula is one parsed expression of a sheet: its text, its syntax tree
// and the names it refers to. Names and literal texts are slices of the
// source text; positions are byte offsets turned into line:col only when a
// message is printed.
type Formula struct {
	Source *sheet.Expr // the expression as written, with its place in the file (the sheet item's, not a copy)
	Nodes  []Node
	Root   int32 // index of the root node in Nodes (-1 when the text could not be parsed)
	nrefs  int32 // KName nodes marked Ref (Refs), held where Root left a spare word
	// side holds the argument lists and the quantity literals; nil when
	// the formula has neither, as most formulas of a large sheet have
	// (cells that combine other cells), which keeps a Formula at 48 bytes.
	side *side
}

// side is what only some formulas have.
type side struct {
	args   []int32    // the argument lists of calls, lists and records
	quants []Quantity // quantity literals in order of appearance
}

// Quantities returns the quantity literals of f in order of appearance.
func (f *Formula) Quantities() []Quantity {
	if f.side == nil {
		return nil
	}
	return f.side.quants
}

// Refs yields the KName nodes that name a value or a function (not the
// field names after a dot nor the keys of records), in order of
// appearance: the parser adds a name's node when it reads the name, so
// node order among names is their order in the text.
func (f *Formula) Refs() iter.Seq[int32] {
	return func(yield func(int32) bool) {
		left := f.nrefs
		for i := range f.Nodes {
			if left == 0 {
				return
			}
			if f.Nodes[i].Ref {
				left--
				if !yield(int32(i)) {
					return
				}
			}
		}
	}
}

// NumRefs is the number of nodes Refs yields.
func (f *Formula) NumRefs() int { return int(f.nrefs) }

// Quantity is a number written with a unit, such as `38 kN`.
type Quantity struct {
	Value float64 // the number's value, 38
	SI    float64 // Value in SI base units
	// unit is the parsed unit (Unit reads it). It is never nil, and the
	// literals of one Arena that write the same unit share it.
	unit     *units.Unit
	From, To int32 // byte span of number and unit in the formula text
	// NumEnd is the end of the number, UnitFrom the start of the unit.
	NumEnd, UnitFrom int32
}

// Text returns the written text of node n (for a name, the name).
func (f *Formula) Text(n int32) string {
	nd := &f.Nodes[n]
	return f.Source.Text[nd.From:nd.To]
}

// StringText returns the text of a KString node without its quotes.
func (f *Formula) StringText(n int32) string {
	nd := &f.Nodes[n]
	return f.Source.Text[nd.From+1 : nd.To-1]
}

// Num returns the value of a KNumber or KBool node.
func (f *Formula) Num(n int32) float64 {
	nd := &f.Nodes[n]
	return math.Float64frombits(uint64(uint32(nd.A)) | uint64(uint32(nd.B))<<32)
}

// numNode is a KNumber or KBool node of value v spanning [from, to).
func numNode(k Kind, from, to int32, v float64) Node {
	bits := math.Float64bits(v)
	return Node{Kind: k, From: uint16(from), To: uint16(to), A: int32(uint32(bits)), B: int32(uint32(bits >> 32))}
}

// Quantity returns the literal of a KQuantity node.
func (f *Formula) Quantity(n int32) *Quantity { return &f.side.quants[f.Nodes[n].A] }

// QuantityText returns the literal as written, e.g. "38 kN".
func (f *Formula) QuantityText(q *Quantity) string { return f.Source.Text[q.From:q.To] }

// Unit returns the literal's parsed unit, a copy (Factor 0 when it did
// not parse).
func (q *Quantity) Unit() units.Unit { return *q.unit }

// QuantityNumber returns the number of the literal as written, e.g. "38".
func (f *Formula) QuantityNumber(q *Quantity) string { return f.Source.Text[q.From:q.NumEnd] }

// QuantityUnit returns the unit of the literal as written, e.g. "kN".
func (f *Formula) QuantityUnit(q *Quantity) string { return f.Source.Text[q.UnitFrom:q.To] }

// ArgList returns the arguments of a KCall, KList or KRecord node (a
// record's keys and values alternate).
func (f *Formula) ArgList(n int32) []int32 {
	nd := &f.Nodes[n]
	if nd.B == 0 {
		return nil
	}
	start := nd.A
	if nd.Kind == KCall {
		start++ // past the callee
	}
	return f.side.args[start : start+nd.B]
}

// Terms returns the three operands of a KCond (the condition and the two
// choices) or a KRange (the lower limit, the middle and the upper limit,
// as written).
func (f *Formula) Terms(n int32) (a, b, c int32) {
	t := f.side.args[f.Nodes[n].A:]
	return t[0], t[1], t[2]
}

// Callee returns the name a KCall node calls.
func (f *Formula) Callee(n int32) string { return f.Text(f.CalleeNode(n)) }

// CalleeNode returns the KName node of the name a KCall node calls.
func (f *Formula) CalleeNode(n int32) int32 { return f.side.args[f.Nodes[n].A] }

// Note returns the two words a KName node keeps for the formula's reader:
// the checker notes there what the name, or the call or the field it
// names, stands for. The parser leaves them -1.
func (f *Formula) Note(n int32) (a, b int32) {
	nd := &f.Nodes[n]
	return nd.A, nd.B
}

// SetNote writes the note of KName node n. A node of another kind has
// children where a name has its note: writing one there is a bug of the
// caller, and SetNote panics.
func (f *Formula) SetNote(n int32, a, b int32) {
	nd := &f.Nodes[n]
	if nd.Kind != KName {
		panic("formula: SetNote of a node that is not a name")
	}
	nd.A, nd.B = a, b
}

// Span returns the byte span of node n in the formula text.
func (f *Formula) Span(n int32) (from, to int) {
	nd := &f.Nodes[n]
	return int(nd.From), int(nd.To)
}

// Range returns the sheet range of node n.
func (f *Formula) Range(n int32) diag.Range {
	nd := &f.Nodes[n]
	return f.Source.RangeAt(int(nd.From), int(nd.To))
}
