package check

import (
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/funcs"
)

// Op is the operation of a typed node.
type Op uint8

const (
	OpConst   Op = iota // Num
	OpBool              // Num != 0
	OpString            // Str
	OpCell              // value of cell Index
	OpParam             // parameter Index of the enclosing user function
	OpNeg               // -Args[0]
	OpNot               // not Args[0]
	OpAdd               // Args[0] + Args[1]
	OpSub               // Args[0] - Args[1]
	OpMul               // Args[0] * Args[1]
	OpDiv               // Args[0] / Args[1]
	OpPow               // Args[0] ^ Args[1]
	OpLT                // comparisons of numbers
	OpLE                //
	OpGT                //
	OpGE                //
	OpEQ                //
	OpNE                //
	OpAnd               // Args[0] and Args[1]
	OpOr                // Args[0] or Args[1]
	OpCond              // Args[0] ? Args[1] : Args[2]
	OpBuiltin           // built-in Builtin applied to Args
	OpPlugin            // plugin Def applied to Args
	OpUser              // user function cell Index applied to Args
	OpFuncRef           // user function cell Index as a function value
	OpField             // field Index of record Args[0]
	OpColumn            // column Index of table Args[0], as a list
	OpIndex             // Args[0][Args[1]]
	OpList              // [Args...]
	OpRecord            // {Str[i]: Args[i]}; field names in Type.Fields
)

// Node is a typed expression: the checker's output, the evaluator's input.
// A large sheet types about ten nodes per cell, so the node is kept small:
// the index is 32 bits beside the operation, and the name and plugin that
// few nodes carry sit behind one pointer.
type Node struct {
	Op      Op
	Builtin Builtin // beside Op: a million nodes, 8 bytes each
	Index   int32
	Type    *funcs.Type
	Num     float64
	Args    []*Node
	// F is the formula the node was typed from, and From, To the byte
	// span of the node in F.Source.Text: Range computes the sheet range
	// only when a message needs it, which keeps checking a large sheet
	// cheap, and the span does not hold on to the formula's syntax tree.
	From, To int32
	F        *formula.Formula
	ext      *nodeExt
}

// nodeExt holds what only a few nodes carry.
type nodeExt struct {
	str string
	def *funcs.Def
}

// Str is the text of a string constant, or the name of the function a
// call or function value names ("" for other nodes).
func (n *Node) Str() string {
	if n.ext == nil {
		return ""
	}
	return n.ext.str
}

// Def is the plugin a plugin call applies (nil for other nodes).
func (n *Node) Def() *funcs.Def {
	if n.ext == nil {
		return nil
	}
	return n.ext.def
}

func (n *Node) setStr(s string) {
	if n.ext == nil {
		n.ext = &nodeExt{}
	}
	n.ext.str = s
}

func (n *Node) setDef(d *funcs.Def) {
	if n.ext == nil {
		n.ext = &nodeExt{}
	}
	n.ext.def = d
}

// Range returns the source range of the node (zero when it has none).
func (n *Node) Range() diag.Range {
	if n.F == nil {
		return diag.Range{}
	}
	return n.F.Source.RangeAt(int(n.From), int(n.To))
}

// Text returns the source text of the node as written ("" when it has
// none), e.g. `N_plRd` or `0.9 * A_s * f_ub / gamma_M2`.
func (n *Node) Text() string {
	if n.F == nil || n.From < 0 || int(n.To) > len(n.F.Source.Text) || n.From >= n.To {
		return ""
	}
	return n.F.Source.Text[n.From:n.To]
}

// Quantity returns the quantity literal a constant node was typed from,
// such as `38 kN` with its written unit, or nil.
func (n *Node) Quantity() *formula.Quantity {
	if n.F == nil || n.Op != OpConst {
		return nil
	}
	for i := range n.F.Quantities {
		if q := &n.F.Quantities[i]; q.From == n.From && q.To == n.To {
			return q
		}
	}
	return nil
}
