package eval

import (
	"math"

	"github.com/sheafcalc/sheaf/engine/check"
)

// A Number cell runs as a few instructions of a small stack machine, not
// as a tree of closures. Most cells of a large sheet are arithmetic on
// other cells and constants: as instructions they cost 8 bytes an
// operation in one shared array the collector need not scan, where a
// closure is an allocation of its own that holds pointers; and a cell
// compiles in one pass that appends to that array. A part of a formula the
// machine has no instruction for (a built-in, a call, a condition, a field)
// is compiled to a closure, as before, and the machine calls it (opCall).
// The commonest leaves, an operation on two cells or on a cell and a
// constant, are one instruction each, as they were one closure each.
//
// The instructions perform the same IEEE 754 operations in the same order
// as the closures do, so a cell has the same value to the bit, and the
// same failure, whichever way it is compiled: TestCodeMatchesClosures
// checks it.

// opcode is what one instruction does. The top of the stack is the
// accumulator acc; "push" moves acc onto the stack below, and "pop x"
// takes the value below acc into x. C(a) is Frame.Num[a], the value of a
// cell; K(a) is consts[a].
type opcode uint8

const (
	opCell        opcode = iota // push; acc = C(a)
	opConst                     // push; acc = K(a)
	opCall                      // push; acc = calls[a](f)
	opNeg                       // acc = -acc
	opAdd                       // pop x; acc = x + acc
	opSub                       // pop x; acc = x - acc
	opMul                       // pop x; acc = x * acc
	opDivR                      // pop x; acc = acc / x (the divisor x was pushed first)
	opAddCell                   // acc = acc + C(a)
	opSubCell                   // acc = acc - C(a)
	opMulCell                   // acc = acc * C(a)
	opAddK                      // acc = acc + K(a)
	opSubK                      // acc = acc - K(a)
	opMulK                      // acc = acc * K(a)
	opDivK                      // acc = acc / K(a), a constant other than zero
	opCellAddCell               // push; acc = C(a) + C(b)
	opCellSubCell               // push; acc = C(a) - C(b)
	opCellMulCell               // push; acc = C(a) * C(b)
	opCellAddK                  // push; acc = C(a) + K(b)
	opCellSubK                  // push; acc = C(a) - K(b)
	opCellMulK                  // push; acc = C(a) * K(b)
	opCellDivK                  // push; acc = C(a) / K(b), a constant other than zero
	opKAddCell                  // push; acc = K(a) + C(b)
	opKSubCell                  // push; acc = K(a) - C(b)
	opKMulCell                  // push; acc = K(a) * C(b)
	opNonzero                   // a divisor acc of zero fails at nodes[a] and becomes NaN
	opSquare                    // acc = acc * acc
	opCube                      // acc = acc * acc * acc
	opPow                       // pop x; acc = pow(x, acc), failing at nodes[a] as pow does
)

// instr is one instruction: the opcode in the low byte, then two indices
// of 28 bits each into Frame.Num, consts, calls or nodes, as the opcode
// says. One word is read for an instruction, where a struct of an opcode
// and two int32s took three loads.
type instr uint64

const (
	argBits = 28
	argMax  = 1<<argBits - 1 // beyond it (a sheet of 268 million cells) a formula compiles to closures
)

func mkInstr(op opcode, a, b int32) instr {
	return instr(op) | instr(a)<<8 | instr(b)<<(8+argBits)
}

func (in instr) op() opcode { return opcode(in) }
func (in instr) a() int     { return int(in >> 8 & argMax) }
func (in instr) b() int     { return int(in >> (8 + argBits)) }

// maxDepth is the deepest stack a cell's code may need; a formula nested
// deeper (no real one is) compiles to closures alone.
const maxDepth = 16

// Code lies in chunks rather than in one growing slice, which would be
// copied over and over as a large sheet compiles (a large slice grows by a
// quarter at a time). The first chunk holds firstChunk instructions and
// each next one twice as many as the last, up to chunkSize: a small sheet
// fills a chunk or two of a few kilobytes, a large one chunks of 32 kB.
const (
	firstChunk = 256
	chunkSize  = 4096
)

// emitter compiles one formula into the last chunk of the machine.
type emitter struct {
	m            *Machine
	depth, worst int  // the stack's depth now and at its deepest
	failed       bool // an instruction did not fit: the formula compiles to a closure
}

// codeSpan is where the code of a cell lies: n instructions from from in
// chunk k; n is 0 for a cell without code. A chunk holds at most chunkSize
// instructions unless it holds one formula alone, from 0, and a formula
// has at most maxCodeLen (compileCode keeps to it), so 16 bits hold both:
// a span is 8 bytes where a slice is 24.
type codeSpan struct {
	k       int32
	from, n uint16
}

// maxCodeLen is the most instructions a formula's code may have.
const maxCodeLen = 1<<16 - 1

// codeOf returns the code of cell i, empty when it has none.
func (m *Machine) codeOf(i int) []instr {
	c := m.code[i]
	if c.n == 0 {
		return nil
	}
	return m.chunks[c.k][c.from : c.from+c.n : c.from+c.n]
}

// compileCode appends the code of Number node n, the body of a cell, and
// returns where it lies. A syntax node gives at most two instructions, so the
// chunk is given room for that many first. A formula that needs a deeper
// stack than maxDepth compiles to a closure, called by a single
// instruction.
func (m *Machine) compileCode(n check.Node) codeSpan {
	room := 2*len(n.Formula().Nodes) + 1
	if room > chunkSize {
		// A long formula (a sum of a thousand terms) gets a chunk of
		// its own, as long as it needs.
		m.chunks = append(m.chunks, make([]instr, 0, room))
	} else if len(m.chunks) == 0 {
		m.chunks = append(m.chunks, make([]instr, 0, max(firstChunk, room)))
	} else if last := m.chunks[len(m.chunks)-1]; cap(last)-len(last) < room {
		m.chunks = append(m.chunks, make([]instr, 0, max(min(2*cap(last), chunkSize), room)))
	}
	k := len(m.chunks) - 1
	from := len(m.chunks[k])
	e := emitter{m: m}
	e.num(n)
	if e.worst > maxDepth || e.failed || len(m.chunks[k])-from > maxCodeLen {
		m.chunks[k] = append(m.chunks[k][:from], mkInstr(opCall, m.call(m.numOf(n)), 0))
	}
	return codeSpan{k: int32(k), from: uint16(from), n: uint16(len(m.chunks[k]) - from)}
}

// emit appends an instruction with one index; push is what it adds to the
// depth of the stack.
func (e *emitter) emit(op opcode, arg int32, push int) { e.emit2(op, arg, 0, push) }

// emit2 appends an instruction with two indices.
func (e *emitter) emit2(op opcode, a, b int32, push int) {
	c := &e.m.chunks[len(e.m.chunks)-1]
	// Neither happens: compileCode makes the room, and no sheet has
	// argMax cells.
	if len(*c) == cap(*c) || a > argMax || b > argMax || a < 0 || b < 0 {
		e.failed = true
		return
	}
	*c = append(*c, mkInstr(op, a, b))
	e.depth += push
	e.worst = max(e.worst, e.depth)
}

// num appends the code of Number node n, which leaves its value on the
// stack. The cases follow numOf, arith and pow, operand for operand.
func (e *emitter) num(n check.Node) {
	m := e.m
	switch n.Op() {
	case check.OpConst:
		e.emit(opConst, m.constant(n.Num()), 1)
		return
	case check.OpCell:
		e.emit(opCell, n.Index(), 1)
		return
	case check.OpNeg:
		e.num(n.Arg(0))
		e.emit(opNeg, 0, 0)
		return
	case check.OpAdd, check.OpSub, check.OpMul:
		if e.leaf(n) {
			return
		}
		e.num(n.Arg(0))
		y := n.Arg(1)
		switch y.Op() {
		case check.OpCell:
			e.emit(cellOp[n.Op()], y.Index(), 0)
		case check.OpConst:
			e.emit(constOp[n.Op()], m.constant(y.Num()), 0)
		default:
			e.num(y)
			e.emit(stackOp[n.Op()], 0, -1)
		}
		return
	case check.OpDiv:
		if e.leaf(n) {
			return
		}
		x, den := n.Arg(0), n.Arg(1)
		if den.Op() == check.OpConst && den.Num() != 0 {
			e.num(x)
			e.emit(opDivK, m.constant(den.Num()), 0)
			return
		}
		// The divisor first, as the closure computes it: a divisor of
		// zero fails before the dividend is computed.
		e.num(den)
		e.emit(opNonzero, m.failAt(den), 0)
		e.num(x)
		e.emit(opDivR, 0, -1)
		return
	case check.OpPow:
		x, y := n.Arg(0), n.Arg(1)
		e.num(x)
		if y.Op() == check.OpConst {
			switch y.Num() {
			case 2:
				e.emit(opSquare, 0, 0)
				return
			case 3:
				e.emit(opCube, 0, 0)
				return
			}
		}
		e.num(y)
		e.emit(opPow, m.failAt(n), -1)
		return
	}
	e.emit(opCall, m.call(m.numOf(n)), 1)
}

// leaf appends the one instruction of binary node n when it is an
// operation on two cells or on a cell and a constant, as arith compiles it
// to one closure, and reports whether it did.
func (e *emitter) leaf(n check.Node) bool {
	x, y := n.Arg(0), n.Arg(1)
	op := n.Op()
	var code opcode
	var a, b int32
	switch {
	case x.Op() == check.OpCell && y.Op() == check.OpCell && op != check.OpDiv:
		code, a, b = cellCellOp[op], x.Index(), y.Index()
	case x.Op() == check.OpCell && y.Op() == check.OpConst && (op != check.OpDiv || y.Num() != 0):
		code, a, b = cellConstOp[op], x.Index(), e.m.constant(y.Num())
	case x.Op() == check.OpConst && y.Op() == check.OpCell && op != check.OpDiv:
		code, a, b = constCellOp[op], e.m.constant(x.Num()), y.Index()
	default:
		return false
	}
	e.emit2(code, a, b, 1)
	return true
}

// The instructions of +, -, * and / by what their operands are.
var (
	cellOp      = [...]opcode{check.OpAdd: opAddCell, check.OpSub: opSubCell, check.OpMul: opMulCell}
	constOp     = [...]opcode{check.OpAdd: opAddK, check.OpSub: opSubK, check.OpMul: opMulK}
	stackOp     = [...]opcode{check.OpAdd: opAdd, check.OpSub: opSub, check.OpMul: opMul}
	cellCellOp  = [...]opcode{check.OpAdd: opCellAddCell, check.OpSub: opCellSubCell, check.OpMul: opCellMulCell}
	cellConstOp = [...]opcode{check.OpAdd: opCellAddK, check.OpSub: opCellSubK, check.OpMul: opCellMulK, check.OpDiv: opCellDivK}
	constCellOp = [...]opcode{check.OpAdd: opKAddCell, check.OpSub: opKSubCell, check.OpMul: opKMulCell}
)

// constant returns the index of v in m.consts, adding it once: the bits
// are the key, so -0 and 0 stay apart.
func (m *Machine) constant(v float64) int32 {
	b := math.Float64bits(v)
	if k, ok := m.constIdx[b]; ok {
		return k
	}
	k := int32(len(m.consts))
	m.consts = append(m.consts, v)
	m.constIdx[b] = k
	return k
}

func (m *Machine) call(fn numFn) int32 {
	m.calls = append(m.calls, fn)
	return int32(len(m.calls) - 1)
}

func (m *Machine) failAt(n check.Node) int32 {
	m.nodes = append(m.nodes, n)
	return int32(len(m.nodes) - 1)
}

// exec runs the code of one cell and returns its value. The top of the
// stack is held in acc, the rest in the frame's stack (a local array would
// be cleared on every call): most instructions work on the top alone, and
// a value that stays in a register is not stored and read back.
func (m *Machine) exec(f *Frame, code []instr) float64 {
	var acc float64
	top := 0 // f.stack[:top] is the stack below acc
	st := &f.stack
	num, consts := f.Num, m.consts
	for _, in := range code {
		switch in.op() {
		case opCell:
			st[top] = acc
			top++
			acc = num[in.a()]
		case opConst:
			st[top] = acc
			top++
			acc = consts[in.a()]
		case opNeg:
			acc = -acc
		case opAdd:
			top--
			acc = st[top] + acc
		case opSub:
			top--
			acc = st[top] - acc
		case opMul:
			top--
			acc = st[top] * acc
		case opDivR:
			top--
			acc /= st[top]
		case opAddCell:
			acc += num[in.a()]
		case opSubCell:
			acc -= num[in.a()]
		case opMulCell:
			acc *= num[in.a()]
		case opAddK:
			acc += consts[in.a()]
		case opSubK:
			acc -= consts[in.a()]
		case opMulK:
			acc *= consts[in.a()]
		case opDivK:
			acc /= consts[in.a()]
		case opCellAddCell:
			st[top] = acc
			top++
			acc = num[in.a()] + num[in.b()]
		case opCellSubCell:
			st[top] = acc
			top++
			acc = num[in.a()] - num[in.b()]
		case opCellMulCell:
			st[top] = acc
			top++
			acc = num[in.a()] * num[in.b()]
		case opCellAddK:
			st[top] = acc
			top++
			acc = num[in.a()] + consts[in.b()]
		case opCellSubK:
			st[top] = acc
			top++
			acc = num[in.a()] - consts[in.b()]
		case opCellMulK:
			st[top] = acc
			top++
			acc = num[in.a()] * consts[in.b()]
		case opCellDivK:
			st[top] = acc
			top++
			acc = num[in.a()] / consts[in.b()]
		case opKAddCell:
			st[top] = acc
			top++
			acc = consts[in.a()] + num[in.b()]
		case opKSubCell:
			st[top] = acc
			top++
			acc = consts[in.a()] - num[in.b()]
		case opKMulCell:
			st[top] = acc
			top++
			acc = consts[in.a()] * num[in.b()]
		case opSquare:
			acc *= acc
		case opCube:
			acc = acc * acc * acc
		case opNonzero:
			if acc == 0 {
				acc, top = m.slow(f, in, acc, top)
			}
		default:
			acc, top = m.slow(f, in, acc, top)
		}
	}
	return acc
}

// slow runs one instruction that calls a function.
func (m *Machine) slow(f *Frame, in instr, acc float64, top int) (float64, int) {
	st := &f.stack
	switch in.op() {
	case opCall:
		st[top] = acc
		top++
		acc = m.calls[in.a()](f)
	case opNonzero:
		if acc == 0 {
			f.fail(m.nodes[in.a()], "division by zero", "the divisor is zero with these inputs")
			acc = nan
		}
	case opPow:
		top--
		x, y := st[top], acc
		acc = math.Pow(x, y)
		if math.IsNaN(acc) && !math.IsNaN(x) && !math.IsNaN(y) {
			f.fail(m.nodes[in.a()], "a negative number to a fractional power", "the base is negative with these inputs")
		}
	}
	return acc, top
}
