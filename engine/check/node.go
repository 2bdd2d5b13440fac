package check

import (
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/funcs"
)

// Op is the operation of a typed node.
type Op uint8

const (
	OpConst   Op = iota // Num()
	OpBool              // Num() != 0
	OpString            // Str()
	OpCell              // value of cell Index
	OpParam             // parameter Index of the enclosing user function
	OpNeg               // -Arg(0)
	OpNot               // not Arg(0)
	OpAdd               // Arg(0) + Arg(1)
	OpSub               // Arg(0) - Arg(1)
	OpMul               // Arg(0) * Arg(1)
	OpDiv               // Arg(0) / Arg(1)
	OpPow               // Arg(0) ^ Arg(1)
	OpLT                // comparisons of numbers
	OpLE                //
	OpGT                //
	OpGE                //
	OpEQ                //
	OpNE                //
	OpAnd               // Arg(0) and Arg(1)
	OpOr                // Arg(0) or Arg(1)
	OpCond              // Arg(0) ? Arg(1) : Arg(2)
	OpBuiltin           // built-in Builtin applied to the arguments
	OpPlugin            // plugin Def() applied to the arguments
	OpUser              // user function cell Index applied to the arguments
	OpFuncRef           // user function cell Index as a function value
	OpField             // field Index of record Arg(0)
	OpColumn            // column Index of table Arg(0), as a list
	OpIndex             // Arg(0)[Arg(1)]
	OpList              // [arguments...]
	OpRecord            // {name: argument, ...}; field names in Type.Fields
)

// Node is a typed expression: the checker's output, the evaluator's input.
// It is a handle, passed by value: the formula it lies in and the index
// of its syntax node. The zero Node stands for no expression (IsZero).
//
// A formula's typed nodes lie in the program's slots, one run per formula
// at the indices of its syntax nodes: slot typed.at+i is the type and
// meaning of syntax node i. What the syntax already holds (the arguments,
// a literal's value, a name, the span) is read from it rather than
// copied, and the type is an index into the program's types, so a slot is
// 4 bytes without a pointer (see slot): the collector does not scan a
// million of them. A unary plus has no node of its own: it stands for what it
// encloses (and brackets have no syntax node either).
type Node struct {
	src *typed
	at  int32 // the syntax node in src.f
}

// slot is what the checker found a syntax node to mean: its operation
// (the low 8 bits) and its type (the rest, an index into Program.types).
// A name, a call and a field also refer to something — a cell, a
// parameter, a field, a plugin, a built-in — and the checker notes its
// index in a name node of the formula (noteAt), whose two words a name
// has spare. A slot is 4 bytes without a pointer.
type slot uint32

// maxTypes is the most distinct types a program's slots can tell apart
// (typer.node refuses more). A variable only so that a test can reach it
// with a small sheet.
var maxTypes int32 = 1 << 24

// noteAt returns the name node that holds the index of syntax node n: a
// name itself, the callee of a call, the field's name of a field; -1 for
// any other node, which refers to nothing.
func noteAt(f *formula.Formula, n int32) int32 {
	nd := &f.Nodes[n]
	switch nd.Kind {
	case formula.KName:
		return n
	case formula.KField:
		return nd.B
	case formula.KCall:
		return f.CalleeNode(n)
	}
	return -1
}

// IsZero reports whether n stands for no expression (a cell with no value
// formula, a side of a check that failed).
func (n Node) IsZero() bool { return n.src == nil }

// setIndex notes i as the index of n, a name, a call or a field; it does
// nothing for the zero Node (a node typer.node refused).
func (n Node) setIndex(i int32) {
	if n.src == nil {
		return
	}
	f := n.src.f
	f.SetNote(noteAt(f, n.at), -1, i)
}

func (n Node) slot() slot { return n.src.prog.slots[n.src.at+n.at] }

// Op is the operation of the node.
func (n Node) Op() Op { return Op(n.slot() & 0xff) }

// Builtin is the built-in function an OpBuiltin node applies.
func (n Node) Builtin() Builtin { return Builtin(n.Index()) }

// Index is the cell, parameter or field index the node refers to (see
// Op); for OpPlugin, an index of Program.plugins; -1 for a node that
// refers to none.
func (n Node) Index() int32 {
	f := n.src.f
	at := noteAt(f, n.at)
	if at < 0 {
		return -1
	}
	_, i := f.Note(at)
	return i
}

// Type is the type of the node's value.
func (n Node) Type() *funcs.Type { return n.src.prog.types[n.slot()>>8] }

// typed is a formula with its typed nodes.
type typed struct {
	f    *formula.Formula
	prog *Program // for the names of the cells a node refers to, and the slots
	// at is where the formula's slots begin in prog.slots: one per
	// syntax node, set when the node was typed.
	at int32
	// set counts the slots set (the low 31 bits, far more than the nodes
	// of a formula of at most 65,535 bytes; count reads it); the top
	// bit is set when some slot calls a function of the sheet (OpUser,
	// OpFuncRef; calls reads it). One word for both keeps a typed formula
	// at 24 bytes, 8 less per cell.
	set uint32
}

const callsBit = 1 << 31

// count is the number of slots set.
func (s *typed) count() int32 { return int32(s.set &^ callsBit) }

// calls reports whether some slot calls a function of the sheet.
func (s *typed) calls() bool { return s.set&callsBit != 0 }

// node returns the typed node standing for syntax node n: a unary plus
// stands for what it encloses (brackets have no node).
func (s *typed) node(n int32) Node {
	for {
		nd := &s.f.Nodes[n]
		if nd.Kind != formula.KUnary || nd.Op != formula.OpPlus {
			return Node{src: s, at: n}
		}
		n = nd.A
	}
}

// NArg returns the number of arguments of the node.
func (n Node) NArg() int {
	switch n.Op() {
	case OpNeg, OpNot, OpField, OpColumn:
		return 1
	case OpAdd, OpSub, OpMul, OpDiv, OpPow, OpLT, OpLE, OpGT, OpGE, OpEQ, OpNE, OpAnd, OpOr, OpIndex:
		return 2
	case OpCond:
		return 3
	case OpBuiltin, OpPlugin, OpUser, OpList:
		return len(n.src.f.ArgList(n.at))
	case OpRecord:
		return len(n.src.f.ArgList(n.at)) / 2
	}
	return 0
}

// Arg returns argument k of the node (0 ≤ k < NArg()).
func (n Node) Arg(k int) Node {
	nd := &n.src.f.Nodes[n.at]
	switch n.Op() {
	case OpNeg, OpNot, OpField, OpColumn:
		return n.src.node(nd.A)
	case OpBuiltin, OpPlugin, OpUser, OpList:
		return n.src.node(n.src.f.ArgList(n.at)[k])
	case OpRecord:
		return n.src.node(n.src.f.ArgList(n.at)[2*k+1]) // keys and values alternate
	case OpCond:
		c, x, y := n.src.f.Terms(n.at)
		return n.src.node([3]int32{c, x, y}[k])
	}
	if k == 0 {
		return n.src.node(nd.A)
	}
	return n.src.node(nd.B)
}

// Args returns the arguments of the node in a new slice (nil when it has
// none). Arg and NArg read them without one.
func (n Node) Args() []Node {
	k := n.NArg()
	if k == 0 {
		return nil
	}
	args := make([]Node, k)
	for i := range args {
		args[i] = n.Arg(i)
	}
	return args
}

// Num is the value in SI of a constant (OpConst) or of a yes/no literal
// (OpBool, 1 or 0); 0 for other nodes.
func (n Node) Num() float64 {
	f := n.src.f
	switch f.Nodes[n.at].Kind {
	case formula.KNumber, formula.KBool:
		return f.Num(n.at)
	case formula.KQuantity:
		return f.Quantity(n.at).SI
	case formula.KName:
		if n.Op() == OpConst {
			return Constants[f.Text(n.at)].SI
		}
	}
	return 0
}

// Str is the text of a string constant, or the name of the function a
// call or function value names ("" for other nodes).
func (n Node) Str() string {
	switch n.Op() {
	case OpString:
		return n.src.f.StringText(n.at)
	case OpBuiltin:
		return builtinNames[n.Builtin()]
	case OpPlugin:
		return n.Def().Name
	case OpUser, OpFuncRef:
		return n.src.prog.Cells[n.Index()].Name
	}
	return ""
}

// Def is the plugin a plugin call applies (nil for other nodes).
func (n Node) Def() *funcs.Def {
	if n.Op() != OpPlugin {
		return nil
	}
	return n.src.prog.plugins[n.Index()]
}

// Formula is the formula the node was typed from.
func (n Node) Formula() *formula.Formula { return n.src.f }

// Span is the byte span of the node in Formula().Source.Text.
func (n Node) Span() (from, to int) { return n.src.f.Span(n.at) }

// Range returns the source range of the node.
func (n Node) Range() diag.Range { return n.src.f.Range(n.at) }

// Text returns the source text of the node as written, e.g. `N_plRd` or
// `0.9 * A_s * f_ub / gamma_M2`.
func (n Node) Text() string { return n.src.f.Text(n.at) }

// Quantity returns the quantity literal a constant node was typed from,
// such as `38 kN` with its written unit, or nil.
func (n Node) Quantity() *formula.Quantity {
	if n.Op() != OpConst || n.src.f.Nodes[n.at].Kind != formula.KQuantity {
		return nil
	}
	return n.src.f.Quantity(n.at)
}
