package check

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Builtin names a built-in function. Each has a dimension rule, written
// beside it in builtinRules.
type Builtin uint8

// The built-in functions, one per name of Builtins; BNone marks a node that
// is not a call of a built-in.
const (
	BNone Builtin = iota
	BSqrt
	BCbrt
	BAbs
	BMin
	BMax
	BPow
	BExp
	BLn
	BLog10
	BSin
	BCos
	BTan
	BAsin
	BAcos
	BAtan
	BAtan2
	BHypot
	BRound
	BFloor
	BCeil
	BInterp
	BSum
	BMean
	BLen
	BInCombo
)

// BuiltinInfo documents a built-in for messages and `sheaf funcs`.
type BuiltinInfo struct {
	ID   Builtin
	Name string
	Sig  string // signature as shown to users
	Rule string // the dimension rule
}

// Builtins lists the built-in functions in the order `sheaf funcs` shows them.
var Builtins = []BuiltinInfo{
	{BSqrt, "sqrt", "sqrt(x)", "result dimension is half of x's: sqrt(mm^2) is mm"},
	{BCbrt, "cbrt", "cbrt(x)", "result dimension is a third of x's: cbrt(m^3) is m"},
	{BAbs, "abs", "abs(x)", "same dimension as x"},
	{BMin, "min", "min(a, b, ...) or min(list)", "all arguments of one dimension; the result has it"},
	{BMax, "max", "max(a, b, ...) or max(list)", "all arguments of one dimension; the result has it"},
	{BPow, "pow", "pow(x, n)", "n is a constant number; the result dimension is x's to the n (halves allowed)"},
	{BExp, "exp", "exp(x)", "x is a plain number; the result is a plain number"},
	{BLn, "ln", "ln(x)", "x is a plain number; normalise first, e.g. ln(t / (1 s))"},
	{BLog10, "log10", "log10(x)", "x is a plain number"},
	{BSin, "sin", "sin(angle)", "an angle such as 30 deg or 0.5 rad, not a plain number; the result is a plain number"},
	{BCos, "cos", "cos(angle)", "an angle such as 30 deg or 0.5 rad, not a plain number; the result is a plain number"},
	{BTan, "tan", "tan(angle)", "an angle such as 30 deg or 0.5 rad, not a plain number; the result is a plain number"},
	{BAsin, "asin", "asin(x)", "x is a plain number; the result is an angle"},
	{BAcos, "acos", "acos(x)", "x is a plain number; the result is an angle"},
	{BAtan, "atan", "atan(x)", "x is a plain number; the result is an angle"},
	{BAtan2, "atan2", "atan2(y, x)", "y and x of one dimension; the result is an angle"},
	{BHypot, "hypot", "hypot(a, b, ...)", "all arguments of one dimension; the result has it"},
	{BRound, "round", "round(x, step) or round(x)", "x and step of one dimension; round(x) needs a plain number"},
	{BFloor, "floor", "floor(x)", "x is a plain number"},
	{BCeil, "ceil", "ceil(x)", "x is a plain number"},
	{BInterp, "interp", "interp(xs, ys, x)", "xs a list of dimension A, ys a list of dimension B, x of dimension A; the result has B. Linear; outside xs is an error, not an extrapolation"},
	{BSum, "sum", "sum(list)", "the dimension of the list's numbers"},
	{BMean, "mean", "mean(list)", "the dimension of the list's numbers"},
	{BLen, "len", "len(list)", "a plain number"},
	{BInCombo, "in_combination", `in_combination(cell, "SLS-c 2")`, "the cell's value in the one combination named (SPEC.md §5a), the same in every combination; the result has the cell's dimension"},
}

// builtinNames names each built-in by its ID.
var builtinNames = func() []string {
	names := make([]string, BInCombo+1)
	for _, b := range Builtins {
		names[b.ID] = b.Name
	}
	return names
}()

var builtinByName = func() map[string]BuiltinInfo {
	m := map[string]BuiltinInfo{}
	for _, b := range Builtins {
		m[b.Name] = b
	}
	return m
}()

// Constants built into the language.
var Constants = map[string]Constant{
	"pi":  {math.Pi, units.None},
	"g_n": {9.80665, units.Base(units.Length).Div(units.Base(units.Time)).Div(units.Base(units.Time))}, // standard acceleration of gravity in m/s^2, exact (3rd CGPM 1901; NIST SP 811 (2008) App. B)
}

// Constant is a named constant: SI value and dimension.
type Constant struct {
	SI  float64
	Dim units.Dim
}

// IsReserved reports whether name may not be used for a cell.
func IsReserved(name string) bool {
	switch name {
	case "check", "table", "use", "from", "action", "factor", "true", "false", "and", "or", "not", "nil", "let", "in", "if", "else":
		return true
	}
	_, c := Constants[name]
	_, b := builtinByName[name]
	return c || b
}

var (
	numNone = funcs.Num(units.None)
	// angleDim is the dimension of a plane angle, which the checker keeps
	// apart from plain numbers (SPEC.md §3): sin takes one, atan gives one.
	angleDim = units.Base(units.Angle)
	numAngle = funcs.Num(angleDim)
)

// builtinType applies the dimension rule of b to the argument nodes. It
// returns the result type or a problem (summary, hint) and the index of the
// offending argument (-1 for the call as a whole).
func (t *typer) builtinType(b BuiltinInfo, args []Node) (*funcs.Type, *argProblem) {
	n := len(args)
	arity := func(lo, hi int) *argProblem {
		if n >= lo && (hi < 0 || n <= hi) {
			return nil
		}
		want := fmt.Sprintf("%d", lo)
		if hi < 0 {
			want = fmt.Sprintf("at least %d", lo)
		} else if hi != lo {
			want = fmt.Sprintf("%d or %d", lo, hi)
		}
		return &argProblem{-1, fmt.Sprintf("%s takes %s %s, got %d", b.Name, want, plural.Noun(lo, "argument"), n), "write " + b.Sig}
	}
	num := func(i int) *argProblem {
		if args[i].Type().Kind != funcs.Number {
			return &argProblem{i, fmt.Sprintf("%s needs a number, got %s", b.Name, t.describeType(args[i].Type())), "write " + b.Sig}
		}
		return nil
	}
	plain := func(i int) *argProblem {
		if p := num(i); p != nil {
			return p
		}
		if !args[i].Type().Dim.IsNone() {
			return &argProblem{i, fmt.Sprintf("%s needs a plain number, got %s", b.Name, t.describeDim(args[i].Type().Dim)),
				"divide by a unit to normalise, e.g. " + b.Name + "(x / (1 " + t.unitOf(args[i].Type().Dim) + "))"}
		}
		return nil
	}
	angle := func(i int) *argProblem {
		if p := num(i); p != nil {
			return p
		}
		switch d := args[i].Type().Dim; {
		case d == angleDim:
			return nil
		case d.IsNone():
			return &argProblem{i, b.Name + " needs an angle, got a plain number",
				"write 30 deg or x * 1 rad"}
		default:
			return &argProblem{i, fmt.Sprintf("%s needs an angle, got %s", b.Name, t.describeDim(d)),
				"check the formula: an angle is written 30 deg or 0.5 rad, or comes from atan2(y, x) or a cell shown in [deg]"}
		}
	}
	list := func(i int) *argProblem {
		if args[i].Type().Kind != funcs.List || args[i].Type().Elem.Kind != funcs.Number {
			return &argProblem{i, fmt.Sprintf("%s needs a list of numbers, got %s", b.Name, t.describeType(args[i].Type())), "write " + b.Sig + ", e.g. a table column `tbl.L` or `[1 m, 2 m]`"}
		}
		return nil
	}
	same := func(from int) (*funcs.Type, *argProblem) {
		for i := from; i < n; i++ {
			if p := num(i); p != nil {
				return nil, p
			}
			if args[i].Type().Dim != args[from].Type().Dim {
				return nil, &argProblem{i, fmt.Sprintf("%s needs arguments of one dimension: %s and %s", b.Name, t.describeDim(args[from].Type().Dim), t.describeDim(args[i].Type().Dim)), "convert both to the same kind of quantity"}
			}
		}
		return funcs.Num(args[from].Type().Dim), nil
	}
	switch b.ID {
	case BSqrt, BCbrt:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if p := num(0); p != nil {
			return nil, p
		}
		den := 2
		if b.ID == BCbrt {
			den = 3
		}
		d, ok := args[0].Type().Dim.Pow(1, den)
		if !ok {
			return nil, &argProblem{0, fmt.Sprintf("%s of %s has no dimension Sheaf can write", b.Name, t.describeDim(args[0].Type().Dim)), "normalise first, e.g. " + b.Name + "(x / (1 " + t.unitOf(args[0].Type().Dim) + "))"}
		}
		return funcs.Num(d), nil
	case BAbs:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		return same(0)
	case BInCombo:
		// The combination itself is resolved by the engine, which knows
		// the combinations (engine/combos_pin.go).
		if p := arity(2, 2); p != nil {
			return nil, p
		}
		if args[0].Op() != OpCell {
			return nil, &argProblem{0, "in_combination needs the name of a cell", "write " + b.Sig + ": the cell whose value in that combination a formula needs"}
		}
		if p := num(0); p != nil {
			return nil, p
		}
		if args[1].Op() != OpString {
			return nil, &argProblem{1, "in_combination needs the combination as a text in quotes", "write " + b.Sig + "; `sheaf run --combinations` lists the labels"}
		}
		return funcs.Num(args[0].Type().Dim), nil
	case BMin, BMax:
		if n == 1 {
			if p := list(0); p != nil {
				return nil, p
			}
			return funcs.Num(args[0].Type().Elem.Dim), nil
		}
		if p := arity(2, -1); p != nil {
			return nil, p
		}
		return same(0)
	case BHypot:
		if p := arity(2, -1); p != nil {
			return nil, p
		}
		return same(0)
	case BPow:
		if p := arity(2, 2); p != nil {
			return nil, p
		}
		return t.powType(args[0], args[1], b.Name)
	case BExp, BLn, BLog10, BFloor, BCeil:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if p := plain(0); p != nil {
			return nil, p
		}
		return numNone, nil
	case BSin, BCos, BTan:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if p := angle(0); p != nil {
			return nil, p
		}
		return numNone, nil
	case BAsin, BAcos, BAtan:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if p := plain(0); p != nil {
			return nil, p
		}
		return numAngle, nil
	case BAtan2:
		if p := arity(2, 2); p != nil {
			return nil, p
		}
		if _, p := same(0); p != nil {
			return nil, p
		}
		return numAngle, nil
	case BRound:
		if p := arity(1, 2); p != nil {
			return nil, p
		}
		if n == 1 {
			if p := plain(0); p != nil {
				if args[0].Type().Kind == funcs.Number {
					// round(30.4 deg) would round a number of radians: a step in
					// the unit says what is rounded.
					p.hint = "round to a step of the same unit, e.g. round(x, 1 " + t.unitOf(args[0].Type().Dim) + ")"
				}
				return nil, p
			}
			return numNone, nil
		}
		return same(0)
	case BInterp:
		if p := arity(3, 3); p != nil {
			return nil, p
		}
		for i := 0; i < 2; i++ {
			if p := list(i); p != nil {
				return nil, p
			}
		}
		if p := num(2); p != nil {
			return nil, p
		}
		if args[2].Type().Dim != args[0].Type().Elem.Dim {
			return nil, &argProblem{2, fmt.Sprintf("interp looks up %s in a list of %s", t.describeDim(args[2].Type().Dim), t.describeDim(args[0].Type().Elem.Dim)), "x must have the dimension of xs"}
		}
		return funcs.Num(args[1].Type().Elem.Dim), nil
	case BSum, BMean:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if p := list(0); p != nil {
			return nil, p
		}
		return funcs.Num(args[0].Type().Elem.Dim), nil
	case BLen:
		if p := arity(1, 1); p != nil {
			return nil, p
		}
		if args[0].Type().Kind != funcs.List {
			return nil, &argProblem{0, "len needs a list, got " + t.describeType(args[0].Type()), "write len(xs)"}
		}
		return numNone, nil
	}
	return nil, &argProblem{-1, "unknown built-in " + b.Name, ""}
}

type argProblem struct {
	arg     int
	summary string
	hint    string
}

// powType is the rule of x^n and pow(x, n): with a dimensioned x, n must be
// a constant whose value is a fraction with a small denominator.
func (t *typer) powType(x, e Node, what string) (*funcs.Type, *argProblem) {
	if x.Type().Kind != funcs.Number || e.Type().Kind != funcs.Number {
		return nil, &argProblem{-1, what + " needs numbers", ""}
	}
	if !e.Type().Dim.IsNone() {
		return nil, &argProblem{1, "an exponent must be a plain number, got " + t.describeDim(e.Type().Dim), "normalise the exponent"}
	}
	if x.Type().Dim.IsNone() {
		return numNone, nil
	}
	v, ok := fold(e)
	if !ok {
		return nil, &argProblem{1, "the exponent of " + t.describeDim(x.Type().Dim) + " must be a constant", "write a number such as 2 or 0.5; to use a computed exponent, normalise the base first: (x / (1 " + t.unitOf(x.Type().Dim) + "))^n"}
	}
	for den := 1; den <= 12; den++ {
		num := v * float64(den)
		if math.Abs(num-math.Round(num)) < 1e-9 && math.Abs(num) < 1000 {
			n := int(math.Round(num))
			if d, ok := x.Type().Dim.Pow(n, den); ok {
				return funcs.Num(d), nil
			}
			if powOverflows(x.Type().Dim, n, den) {
				return nil, &argProblem{1, fmt.Sprintf("%s to the power %g is beyond the range of dimension exponents", t.describeDim(x.Type().Dim), v),
					t.overflowHint(x.Type().Dim)}
			}
			break
		}
	}
	return nil, &argProblem{1, fmt.Sprintf("%s to the power %g has no dimension Sheaf can write", t.describeDim(x.Type().Dim), v), "use whole or half powers, or normalise the base"}
}

// powOverflows reports whether d^(num/den) fails only because an exponent
// would leave the range of a units.Dim (the power is otherwise exact).
func powOverflows(d units.Dim, num, den int) bool {
	over := false
	for _, e := range d {
		p := int(e) * num
		if p%den != 0 {
			return false
		}
		if p/den > units.MaxExp2 || p/den < -units.MaxExp2 {
			over = true
		}
	}
	return over
}

// overflowDetail explains the limit behind an overflow message.
const overflowDetail = "Sheaf keeps every dimension exponent between -63 and 63; an expression beyond them cannot be a physical quantity of a design calculation"

// overflowHint is the hint of an exponent overflow of a quantity of dimension d.
func (t *typer) overflowHint(d units.Dim) string {
	if u := t.unitOf(d); parses(u) {
		return "normalise first, e.g. (x / (1 " + u + "))^n"
	}
	return "normalise the base to a plain number before raising it to a power"
}

// parses reports whether a unit symbol can be written in a sheet (a
// coherent symbol such as m^-32 is beyond the exponents a unit may carry).
func parses(sym string) bool {
	_, err := units.Parse(sym)
	return err == nil
}

// angleArgHint is the start of the hint for a plain number passed where an
// angle is wanted ("write 90 deg ...; "), and "" for any other mismatch.
func angleArgHint(want, got *funcs.Type) string {
	if want.Kind == funcs.Number && want.Dim == angleDim && got.Kind == funcs.Number && got.Dim.IsNone() {
		return "write the angle with its unit, as in 90 deg, or x * 1 rad for a number of radians; "
	}
	return ""
}

// dimOverflow is the problem of a product or quotient (op "*" or "/") of
// dimensions a and b whose result d left the range of a units.Dim
// (units.Overflow); nil when d is a dimension. The typer reports it at the
// operator's expression: an overflow is never wrapped into a wrong dimension
// (issue 15), e.g. (m^-32)·(m^-32) shown as m^-64 or as a plain number.
func (t *typer) dimOverflow(d units.Dim, op string, a, b units.Dim) *argProblem {
	if d.Valid() {
		return nil
	}
	verb := "multiplying"
	if op == "/" {
		verb = "dividing"
	}
	hint := "normalise a factor to a plain number first, dividing it by its unit"
	if u := t.unitOf(a); parses(u) {
		hint = "normalise a factor to a plain number first, e.g. x / (1 " + u + ")"
	}
	return &argProblem{-1, fmt.Sprintf("%s %s by %s gives a dimension exponent out of range", verb, t.describeDim(a), t.describeDim(b)), hint}
}

// fold evaluates a constant plain-number expression.
func fold(n Node) (float64, bool) {
	switch n.Op() {
	case OpConst:
		return n.Num(), n.Type().Dim.IsNone()
	case OpNeg:
		v, ok := fold(n.Arg(0))
		return -v, ok
	case OpAdd, OpSub, OpMul, OpDiv:
		a, ok1 := fold(n.Arg(0))
		b, ok2 := fold(n.Arg(1))
		if !ok1 || !ok2 {
			return 0, false
		}
		switch n.Op() {
		case OpAdd:
			return a + b, true
		case OpSub:
			return a - b, true
		case OpMul:
			return a * b, true
		}
		if b == 0 {
			return 0, false
		}
		return a / b, true
	}
	return 0, false
}
