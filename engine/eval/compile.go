package eval

import (
	"math"
	"slices"
	"strconv"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Machine is a compiled program. It is immutable after Compile and shared
// by every State evaluating it.
type Machine struct {
	P        *check.Program
	num      []numFn // Number cells and Number-valued function bodies
	val      []valFn // every other cell and function body
	demand   []numFn
	capacity []numFn
	topoPos  []int32
	// code[i] is where the code of cell i lies (see code.go, codeOf)
	// when it is an input or a derived cell of type Number, which has no
	// other path; else empty. An incremental Eval runs such a cell from
	// it and P.Deps(i) alone, without reaching for the cell itself.
	code []codeSpan
	// The code of every cell, and what its instructions index.
	chunks   [][]instr
	consts   []float64
	constIdx map[uint64]int32
	calls    []numFn
	nodes    []check.Node
	// needVal is set when some cell keeps its value in Frame.Val; else a
	// state leaves Val nil.
	needVal  bool
	hasCheck bool
	// noOver is all false, shared read only by every state until it
	// writes its own (see State.ownOverrides).
	noOver []bool
	// Pins lists the in_combination calls; Frame.Pins holds their values
	// in the same order.
	Pins    []check.Node
	pinSlot map[check.Node]int
}

// Compile turns every typed cell of p into code or closures. Cells without a type
// (they failed checking) get none and evaluate as unknown.
func Compile(p *check.Program) *Machine {
	n := len(p.Cells)
	m := &Machine{P: p, topoPos: make([]int32, n),
		code: make([]codeSpan, n), constIdx: map[uint64]int32{},
		noOver: make([]bool, n)}
	for _, c := range p.Cells {
		if c.Kind == check.Check {
			m.demand, m.capacity = make([]numFn, n), make([]numFn, n)
			break
		}
	}
	for k, i := range p.Order {
		m.topoPos[i] = int32(k)
	}
	// Cells compile in evaluation order, so the code of cells evaluated
	// one after the other lies side by side in memory.
	for _, i := range p.Order {
		m.compileCell(p.Cells[i])
	}
	for _, i := range p.Order {
		c := p.Cells[i]
		if c.Type == nil {
			continue
		}
		switch c.Kind {
		case check.Check:
			m.hasCheck = true
		case check.Function, check.Table:
			m.needVal = true
		default:
			if c.Type.Kind != funcs.Number || m.valAt(i) != nil {
				m.needVal = true
			}
		}
	}
	return m
}

// setNum and setVal set the closure of cell i, making the table on the
// first: a sheet of Number cells and no functions (a large one, most
// often) needs neither table, and each is 8 bytes a cell.
func (m *Machine) setNum(i int, fn numFn) {
	if m.num == nil {
		m.num = make([]numFn, len(m.P.Cells))
	}
	m.num[i] = fn
}

func (m *Machine) setVal(i int, fn valFn) {
	if m.val == nil {
		m.val = make([]valFn, len(m.P.Cells))
	}
	m.val[i] = fn
}

// numAt and valAt return the closure of cell i, nil when it has none.
func (m *Machine) numAt(i int) numFn {
	if m.num == nil {
		return nil
	}
	return m.num[i]
}

func (m *Machine) valAt(i int) valFn {
	if m.val == nil {
		return nil
	}
	return m.val[i]
}

// compileCell fills the slots of cell c.
func (m *Machine) compileCell(c *check.Cell) {
	if c.Type == nil {
		return
	}
	switch c.Kind {
	case check.Check:
		xc := c.Extra()
		m.demand[c.Index] = m.numOf(xc.Demand)
		m.capacity[c.Index] = m.numOf(xc.Capacity)
	case check.Table:
		if len(c.Extra().Entries) > 0 {
			m.setVal(c.Index, m.tableOf(c))
		}
	default:
		if c.Body().IsZero() {
			return
		}
		switch c.Body().Type().Kind {
		case funcs.Number:
			if c.Kind == check.Function {
				m.setNum(c.Index, m.numOf(c.Body()))
			} else {
				m.code[c.Index] = m.compileCode(c.Body())
			}
		case funcs.Bool:
			b := m.boolOf(c.Body())
			m.setVal(c.Index, func(f *Frame) funcs.Value { return b(f) })
		default:
			m.setVal(c.Index, m.valOf(c.Body()))
		}
	}
}

var nan = math.NaN()

// numOf compiles a Number-typed node.
func (m *Machine) numOf(n check.Node) numFn {
	switch n.Op() {
	case check.OpConst:
		v := n.Num()
		return func(*Frame) float64 { return v }
	case check.OpCell:
		i := n.Index()
		return func(f *Frame) float64 { return f.Num[i] }
	case check.OpParam:
		i := n.Index()
		return func(f *Frame) float64 { return f.Args[i] }
	case check.OpNeg:
		a := m.numOf(n.Arg(0))
		return func(f *Frame) float64 { return -a(f) }
	case check.OpAdd, check.OpSub, check.OpMul:
		if fn := arith(n); fn != nil {
			return fn
		}
		a, y := m.numOf(n.Arg(0)), n.Arg(1)
		if y.Op() == check.OpConst && n.Op() != check.OpSub {
			// A constant right operand is read in place, not called.
			k := y.Num()
			if n.Op() == check.OpAdd {
				return func(f *Frame) float64 { return a(f) + k }
			}
			return func(f *Frame) float64 { return a(f) * k }
		}
		b := m.numOf(y)
		switch n.Op() {
		case check.OpAdd:
			return func(f *Frame) float64 { return a(f) + b(f) }
		case check.OpSub:
			return func(f *Frame) float64 { return a(f) - b(f) }
		}
		return func(f *Frame) float64 { return a(f) * b(f) }
	case check.OpDiv:
		if fn := arith(n); fn != nil {
			return fn
		}
		a, den := m.numOf(n.Arg(0)), n.Arg(1)
		if den.Op() == check.OpConst && den.Num() != 0 {
			k := den.Num() // a nonzero constant divisor cannot fail
			return func(f *Frame) float64 { return a(f) / k }
		}
		b := m.numOf(den)
		return func(f *Frame) float64 {
			d := b(f)
			if d == 0 {
				f.fail(den, "division by zero", "the divisor is zero with these inputs")
				return nan
			}
			return a(f) / d
		}
	case check.OpPow:
		return m.pow(n, n.Arg(0), n.Arg(1))
	case check.OpCond:
		c, a, b := m.boolOf(n.Arg(0)), m.numOf(n.Arg(1)), m.numOf(n.Arg(2))
		return func(f *Frame) float64 {
			if c(f) {
				return a(f)
			}
			return b(f)
		}
	case check.OpBuiltin:
		return m.builtin(n)
	case check.OpUser:
		return m.userCall(n)
	case check.OpIndex:
		xs, ix := m.listOf(n.Arg(0)), m.numOf(n.Arg(1))
		return func(f *Frame) float64 {
			l := xs(f)
			k, ok := index(f, n, ix(f), len(l))
			if !ok {
				return nan
			}
			return l[k]
		}
	}
	// Fields, plugin calls and anything else: through the general path.
	v := m.valOf(n)
	return func(f *Frame) float64 {
		x, ok := v(f).(float64)
		if !ok {
			if f.Fail == nil {
				f.fail(n, "expected a number", "")
			}
			return nan
		}
		return x
	}
}

// arith compiles the commonest leaves of a formula, an operation on two
// cells or on a cell and a constant, into one closure; nil for anything
// else. The arithmetic is the same as through the general closures
// (a / k, not a * (1/k)), so results are bit for bit the same; a division
// by a cell still checks for zero, through the general path.
func arith(n check.Node) numFn {
	x, y := n.Arg(0), n.Arg(1)
	switch {
	case x.Op() == check.OpCell && y.Op() == check.OpCell:
		i, j := x.Index(), y.Index()
		switch n.Op() {
		case check.OpAdd:
			return func(f *Frame) float64 { return f.Num[i] + f.Num[j] }
		case check.OpSub:
			return func(f *Frame) float64 { return f.Num[i] - f.Num[j] }
		case check.OpMul:
			return func(f *Frame) float64 { return f.Num[i] * f.Num[j] }
		}
	case x.Op() == check.OpCell && y.Op() == check.OpConst:
		i, k := x.Index(), y.Num()
		switch n.Op() {
		case check.OpAdd:
			return func(f *Frame) float64 { return f.Num[i] + k }
		case check.OpSub:
			return func(f *Frame) float64 { return f.Num[i] - k }
		case check.OpMul:
			return func(f *Frame) float64 { return f.Num[i] * k }
		case check.OpDiv:
			if k != 0 {
				return func(f *Frame) float64 { return f.Num[i] / k }
			}
		}
	case x.Op() == check.OpConst && y.Op() == check.OpCell:
		k, j := x.Num(), y.Index()
		switch n.Op() {
		case check.OpAdd:
			return func(f *Frame) float64 { return k + f.Num[j] }
		case check.OpSub:
			return func(f *Frame) float64 { return k - f.Num[j] }
		case check.OpMul:
			return func(f *Frame) float64 { return k * f.Num[j] }
		}
	}
	return nil
}

// index returns i as an index into a list of length n, or fails at node
// at when i is not a whole number from 0 to n-1.
func index(f *Frame, at check.Node, i float64, n int) (int, bool) {
	k := int(i)
	if float64(k) != i || k < 0 || k >= n {
		what := "index " + units.FormatNumber(i, 6) + " is out of range"
		if float64(k) != i && !math.IsNaN(i) && !math.IsInf(i, 0) {
			what = "index " + units.FormatNumber(i, 6) + " is not a whole number"
		}
		if n == 0 {
			f.fail(at, what+": the list is empty", "a list needs an element before it can be indexed")
		} else {
			f.fail(at, what+": the list has "+plural.Count(n, "element")+", numbered from 0 to "+strconv.Itoa(n-1),
				"lists are numbered from 0: the first element is [0], the last ["+strconv.Itoa(n-1)+"]")
		}
		return 0, false
	}
	return k, true
}

func (m *Machine) pow(n, x, e check.Node) numFn {
	a, b := m.numOf(x), m.numOf(e)
	if e.Op() == check.OpConst {
		switch e.Num() {
		case 2:
			return func(f *Frame) float64 { x := a(f); return x * x }
		case 3:
			return func(f *Frame) float64 { x := a(f); return x * x * x }
		}
	}
	return func(f *Frame) float64 {
		x, y := a(f), b(f)
		r := math.Pow(x, y)
		if math.IsNaN(r) && !math.IsNaN(x) && !math.IsNaN(y) {
			f.fail(n, "a negative number to a fractional power", "the base is negative with these inputs")
		}
		return r
	}
}

// boolOf compiles a Bool-typed node.
func (m *Machine) boolOf(n check.Node) func(*Frame) bool {
	switch n.Op() {
	case check.OpBool:
		v := n.Num() != 0
		return func(*Frame) bool { return v }
	case check.OpNot:
		a := m.boolOf(n.Arg(0))
		return func(f *Frame) bool { return !a(f) }
	case check.OpAnd:
		a, b := m.boolOf(n.Arg(0)), m.boolOf(n.Arg(1))
		return func(f *Frame) bool { return a(f) && b(f) }
	case check.OpOr:
		a, b := m.boolOf(n.Arg(0)), m.boolOf(n.Arg(1))
		return func(f *Frame) bool { return a(f) || b(f) }
	case check.OpLT, check.OpLE, check.OpGT, check.OpGE, check.OpEQ, check.OpNE:
		a, b := m.numOf(n.Arg(0)), m.numOf(n.Arg(1))
		switch n.Op() {
		case check.OpLT:
			return func(f *Frame) bool { return a(f) < b(f) }
		case check.OpLE:
			return func(f *Frame) bool { return a(f) <= b(f) }
		case check.OpGT:
			return func(f *Frame) bool { return a(f) > b(f) }
		case check.OpGE:
			return func(f *Frame) bool { return a(f) >= b(f) }
		case check.OpEQ:
			return func(f *Frame) bool { return a(f) == b(f) }
		}
		return func(f *Frame) bool { return a(f) != b(f) }
	case check.OpCell:
		i := n.Index()
		return func(f *Frame) bool { b, _ := f.Val[i].(bool); return b }
	case check.OpCond:
		c, a, b := m.boolOf(n.Arg(0)), m.boolOf(n.Arg(1)), m.boolOf(n.Arg(2))
		return func(f *Frame) bool {
			if c(f) {
				return a(f)
			}
			return b(f)
		}
	}
	v := m.valOf(n)
	return func(f *Frame) bool { b, _ := v(f).(bool); return b }
}

// listOf compiles a node typed as a list of numbers.
func (m *Machine) listOf(n check.Node) func(*Frame) []float64 {
	v := m.valOf(n)
	return func(f *Frame) []float64 { l, _ := v(f).([]float64); return l }
}

// valOf compiles any node to the general path.
func (m *Machine) valOf(n check.Node) valFn {
	switch n.Type().Kind {
	case funcs.Number:
		switch n.Op() {
		case check.OpField, check.OpPlugin:
		default:
			x := m.numOf(n)
			return func(f *Frame) funcs.Value { return x(f) }
		}
	case funcs.Bool:
		switch n.Op() {
		case check.OpBool, check.OpNot, check.OpAnd, check.OpOr, check.OpLT, check.OpLE, check.OpGT,
			check.OpGE, check.OpEQ, check.OpNE, check.OpCell, check.OpCond:
			b := m.boolOf(n)
			return func(f *Frame) funcs.Value { return b(f) }
		}
	}
	switch n.Op() {
	case check.OpString:
		s := n.Str()
		return func(*Frame) funcs.Value { return s }
	case check.OpCell:
		i := n.Index()
		return func(f *Frame) funcs.Value { return f.Val[i] }
	case check.OpList:
		if n.Type().Elem.Kind == funcs.Number {
			xs := m.nums(n.Args())
			return func(f *Frame) funcs.Value {
				out := make([]float64, len(xs))
				for i, x := range xs {
					out[i] = x(f)
				}
				return out
			}
		}
		xs := m.vals(n.Args())
		return func(f *Frame) funcs.Value {
			out := make([]funcs.Value, len(xs))
			for i, x := range xs {
				out[i] = x(f)
			}
			return out
		}
	case check.OpRecord:
		xs := m.vals(n.Args())
		ty := n.Type()
		return func(f *Frame) funcs.Value {
			r := &funcs.RecordValue{Type: ty, Fields: make([]funcs.Value, len(xs))}
			for i, x := range xs {
				r.Fields[i] = x(f)
			}
			return r
		}
	case check.OpField:
		rec, i := m.valOf(n.Arg(0)), int(n.Index())
		return func(f *Frame) funcs.Value {
			r, ok := rec(f).(*funcs.RecordValue)
			if !ok || i >= len(r.Fields) {
				f.fail(n, "the record has no such field", "")
				return nil
			}
			return r.Fields[i]
		}
	case check.OpColumn:
		tbl, i := m.valOf(n.Arg(0)), int(n.Index())
		return func(f *Frame) funcs.Value {
			t, ok := tbl(f).(*funcs.TableValue)
			if !ok || i >= len(t.Cols) {
				f.fail(n, "the table has no such column", "")
				return []float64(nil)
			}
			return t.Cols[i]
		}
	case check.OpIndex:
		xs, ix := m.valOf(n.Arg(0)), m.numOf(n.Arg(1))
		return func(f *Frame) funcs.Value {
			l, _ := xs(f).([]funcs.Value)
			k, ok := index(f, n, ix(f), len(l))
			if !ok {
				return nil
			}
			return l[k]
		}
	case check.OpCond:
		c, a, b := m.boolOf(n.Arg(0)), m.valOf(n.Arg(1)), m.valOf(n.Arg(2))
		return func(f *Frame) funcs.Value {
			if c(f) {
				return a(f)
			}
			return b(f)
		}
	case check.OpPlugin:
		return m.plugin(n)
	case check.OpFuncRef:
		return m.funcRef(n)
	case check.OpUser:
		return m.userCallVal(n)
	}
	return func(f *Frame) funcs.Value {
		f.fail(n, "cannot evaluate this expression", "")
		return nil
	}
}

func (m *Machine) nums(ns []check.Node) []numFn {
	out := make([]numFn, len(ns))
	for i, a := range ns {
		out[i] = m.numOf(a)
	}
	return out
}

func (m *Machine) vals(ns []check.Node) []valFn {
	out := make([]valFn, len(ns))
	for i, a := range ns {
		out[i] = m.valOf(a)
	}
	return out
}

// Value evaluates a stand-alone typed node that uses no cell.
func Value(n check.Node) (funcs.Value, *Failure) {
	m := &Machine{P: &check.Program{}}
	f := &Frame{}
	var v funcs.Value
	switch n.Type().Kind {
	case funcs.Number:
		v = m.numOf(n)(f)
	default:
		v = m.valOf(n)(f)
	}
	return v, f.Fail
}

// tableOf compiles a table with entries written as expressions: each run
// copies the written table and fills in the entries' values.
func (m *Machine) tableOf(c *check.Cell) valFn {
	fns := make([]numFn, len(c.Extra().Entries))
	for k, e := range c.Extra().Entries {
		fns[k] = m.numOf(e.Node)
	}
	written := c.Extra().Table
	return func(f *Frame) funcs.Value {
		t := &funcs.TableValue{Type: written.Type, Cols: make([][]float64, len(written.Cols))}
		for i, col := range written.Cols {
			t.Cols[i] = slices.Clone(col)
		}
		for k, e := range c.Extra().Entries {
			v := fns[k](f)
			if f.Fail != nil {
				return nil
			}
			if !isFinite(v) {
				f.Fail = &Failure{Node: e.Node, Msg: "a table entry is not a finite number with these inputs", Hint: "check the inputs of the entry"}
				return nil
			}
			t.Cols[e.Col][e.Row] = v
		}
		return t
	}
}
