package xlsxout

import (
	"math"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

// maxFormulaLen is the longest formula a spreadsheet stores (characters).
const maxFormulaLen = 8192

// ref is what a Sheaf path (a cell, steel.E, threads.d) is in the workbook:
// a defined name of a value cell, or of a column range.
type ref struct {
	name   string  // defined name
	factor float64 // SI value of one display unit of the cell(s)
	bool   bool    // a TRUE/FALSE cell
	rows   int     // >0: a column range of this many rows
}

// notLive says why an expression cannot be a spreadsheet formula.
type notLive struct{ reason string }

func (e *notLive) Error() string { return e.reason }

func fail(format string, args ...string) *notLive {
	return &notLive{reason: format + strings.Join(args, "")}
}

// term is a translated expression; atoms need no brackets as operands.
type term struct {
	s    string
	atom bool
}

func (t term) operand() string {
	if t.atom {
		return t.s
	}
	return "(" + t.s + ")"
}

// translator turns typed trees into spreadsheet formulas over defined
// names, in SI.
type translator struct {
	refs  map[string]ref
	cells []*check.Cell
	// result is Sheaf's value of cell i, for the terms a spreadsheet form
	// takes from a record argument (funcs.Terms); nil: none is known.
	result func(i int) (funcs.Value, bool)
	args   [][]term // the arguments of the user functions being inlined
	depth  int
}

// num formats a number for a formula: shortest exact form, upper-case
// exponent (the lower-case form is not read by every calculator).
func num(x float64) term {
	s := strconv.FormatFloat(x, 'G', -1, 64)
	return term{s: s, atom: x >= 0}
}

// path returns the Sheaf path of a node that names a value: a cell, a
// field of one, a column of a table; "" otherwise.
func (t *translator) path(n check.Node) string {
	switch n.Op() {
	case check.OpCell:
		if c := t.cells[n.Index()]; c.Kind == check.Table && len(c.Extra().Entries) > 0 {
			// Its entries follow cells of the sheet; the Data tab holds
			// their values of this run, so a formula over it would not
			// follow an edited input: only Sheaf computes it.
			return ""
		}
		return t.cells[n.Index()].Name
	case check.OpField, check.OpColumn:
		p := t.path(n.Arg(0))
		if p == "" {
			return ""
		}
		return p + "." + n.Arg(0).Type().Fields[n.Index()].Name
	}
	return ""
}

// value translates a node that names a value cell.
func (t *translator) value(n check.Node) (term, error) {
	p := t.path(n)
	r, ok := t.refs[p]
	if p == "" || !ok || r.rows > 0 {
		what := describeNode(t, n)
		return term{}, fail("uses ", what, ", which has no single value cell")
	}
	if r.bool || r.factor == 1 {
		return term{s: r.name, atom: true}, nil
	}
	return term{s: r.name + "*" + num(r.factor).operand()}, nil
}

func describeNode(t *translator, n check.Node) string {
	if p := t.path(n); p != "" {
		return "`" + p + "`"
	}
	switch n.Op() {
	case check.OpPlugin:
		return "`" + n.Def().Name + "`"
	case check.OpIndex:
		return "a list element"
	}
	return "a " + n.Type().Kind.String()
}

var cmpText = map[check.Op]string{check.OpLT: "<", check.OpLE: "<=", check.OpGT: ">", check.OpGE: ">=", check.OpEQ: "=", check.OpNE: "<>"}
var arithText = map[check.Op]string{check.OpAdd: "+", check.OpSub: "-", check.OpMul: "*", check.OpDiv: "/", check.OpPow: "^"}

// expr translates a Number or Bool node to a formula in SI.
func (t *translator) expr(n check.Node) (term, error) {
	if n.IsZero() {
		return term{}, fail("the expression did not check")
	}
	switch n.Op() {
	case check.OpConst:
		if n.Num() == math.Pi {
			return term{s: "PI()", atom: true}, nil
		}
		return num(n.Num()), nil
	case check.OpBool:
		if n.Num() != 0 {
			return term{s: "TRUE", atom: true}, nil
		}
		return term{s: "FALSE", atom: true}, nil
	case check.OpCell, check.OpField:
		if n.Type().Kind != funcs.Number && n.Type().Kind != funcs.Bool {
			return term{}, fail("its value is a " + n.Type().Kind.String())
		}
		if n.Op() == check.OpField && n.Arg(0).Op() == check.OpPlugin {
			// A field of a call written in place: circle(d).A.
			return t.pluginField(n.Arg(0), n.Arg(0).Type().Fields[n.Index()].Name)
		}
		return t.value(n)
	case check.OpParam:
		if len(t.args) == 0 || int(n.Index()) >= len(t.args[len(t.args)-1]) {
			return term{}, fail("a parameter outside its function")
		}
		a := t.args[len(t.args)-1][n.Index()]
		return term{s: a.operand(), atom: true}, nil
	case check.OpNeg:
		x, err := t.expr(n.Arg(0))
		if err != nil {
			return x, err
		}
		return term{s: "-" + x.operand()}, nil
	case check.OpNot:
		x, err := t.expr(n.Arg(0))
		if err != nil {
			return x, err
		}
		return term{s: "NOT(" + x.s + ")", atom: true}, nil
	case check.OpAdd, check.OpSub, check.OpMul, check.OpDiv, check.OpPow,
		check.OpLT, check.OpLE, check.OpGT, check.OpGE, check.OpEQ, check.OpNE:
		a, err := t.expr(n.Arg(0))
		if err != nil {
			return a, err
		}
		b, err := t.expr(n.Arg(1))
		if err != nil {
			return b, err
		}
		op, ok := arithText[n.Op()]
		if !ok {
			op = cmpText[n.Op()]
		}
		return term{s: a.operand() + op + b.operand()}, nil
	case check.OpAnd, check.OpOr:
		a, err := t.expr(n.Arg(0))
		if err != nil {
			return a, err
		}
		b, err := t.expr(n.Arg(1))
		if err != nil {
			return b, err
		}
		fn := "AND("
		if n.Op() == check.OpOr {
			fn = "OR("
		}
		return term{s: fn + a.s + "," + b.s + ")", atom: true}, nil
	case check.OpCond:
		xs, err := t.all(n.Args())
		if err != nil {
			return term{}, err
		}
		return term{s: "IF(" + xs[0].s + "," + xs[1].s + "," + xs[2].s + ")", atom: true}, nil
	case check.OpBuiltin:
		return t.builtin(n)
	case check.OpUser:
		return t.user(n)
	case check.OpPlugin:
		if f := n.Def().Spreadsheet; f != nil && f.Formula != "" {
			return t.plugin(n, f.Formula)
		}
		return term{}, fail("uses `"+n.Def().Name+"`", ", which only Sheaf computes")
	case check.OpIndex:
		return term{}, fail("picks an element of a list")
	}
	return term{}, fail("its value is a " + n.Type().Kind.String())
}

// plugin translates a call of a plugin by its spreadsheet form (the
// registry's Spreadsheet) with the call's arguments in place.
func (t *translator) plugin(n check.Node, form string) (term, error) {
	d := n.Def()
	s, err := spreadsheetFormula(d, form, func(p funcs.Placeholder) (string, error) {
		if p.Param >= n.NArg() || n.Arg(p.Param).IsZero() {
			if p.Default == "" {
				return "", fail("calls `" + d.Name + "` without an argument its spreadsheet form needs")
			}
			return p.Default, nil
		}
		a := n.Arg(p.Param)
		switch {
		case p.Term >= 0:
			return t.term(d, a, p.Term)
		case p.Field != "":
			// A field of a record argument: its value cell.
			path := t.path(a)
			r, ok := t.refs[path+"."+p.Field]
			if path == "" || !ok || r.rows > 0 || r.bool {
				return "", fail("passes `"+d.Name+"` a record whose field "+p.Field, " has no value cell")
			}
			return scaled(r.name, r.factor).s, nil
		case d.Params[p.Param].Type.Kind == funcs.String:
			return t.text(d, a)
		}
		if p.Column != "" {
			path := t.path(a)
			r, ok := t.refs[path+"."+p.Column]
			if path == "" || !ok || r.rows == 0 {
				return "", fail("passes `"+d.Name+"` a table that is not on the Data tab", "")
			}
			if r.factor != 1 {
				return "", fail("passes `" + d.Name + "` a table column that is not shown in SI units")
			}
			if p.Increasing {
				return increasing(r.name, r.rows), nil
			}
			return r.name, nil
		}
		x, err := t.expr(a)
		if err != nil {
			return "", err
		}
		return x.s, nil
	})
	if err != nil {
		return term{}, err
	}
	return term{s: s, atom: true}, nil
}

// text translates a text argument of d: a string written in the call (a
// sheet has no text cells; a text reaching d otherwise, through a
// user function's parameter, only Sheaf passes on).
func (t *translator) text(d *funcs.Def, a check.Node) (string, error) {
	if a.Op() != check.OpString {
		return "", fail("passes `"+d.Name+"` a text", " that is not written in the call")
	}
	if len(a.Str()) > 255 {
		return "", fail("passes `" + d.Name + "` a text longer than a formula may hold")
	}
	return quoted(a.Str()), nil
}

// term is term k of d's Terms, computed from Sheaf's value of the record
// argument a (a cell of the sheet), written as a number.
func (t *translator) term(d *funcs.Def, a check.Node, k int) (string, error) {
	if a.Op() != check.OpCell || t.result == nil {
		return "", fail("passes `"+d.Name+"` a record", " that is not a cell of the sheet")
	}
	v, ok := t.result(int(a.Index()))
	if !ok {
		return "", fail("passes `"+d.Name+"` a record", " that Sheaf did not compute")
	}
	xs, err := d.Spreadsheet.Terms.Of(v)
	if err != nil || k >= len(xs) || math.IsNaN(xs[k]) || math.IsInf(xs[k], 0) {
		return "", fail("calls `"+d.Name+"`", " where it fails")
	}
	return num(xs[k]).operand(), nil
}

// spreadsheetFormula expands a spreadsheet form of d (its Formula or a
// field's) with arg, divided by the form's validity condition so that
// the formula is an error where the call is one; bracketed.
func spreadsheetFormula(d *funcs.Def, form string, arg func(funcs.Placeholder) (string, error)) (string, error) {
	s, err := d.ExpandSpreadsheet(form, arg)
	if err != nil {
		return "", err
	}
	if v := d.Spreadsheet.Valid; v != "" {
		cond, err := d.ExpandSpreadsheet(v, arg)
		if err != nil {
			return "", err
		}
		s = "(" + s + ")/IF(" + cond + ",1,0)"
	}
	return "(" + s + ")", nil
}

// increasing is the condition that the column range rng of n rows
// increases strictly: each entry above the one before it. (A comparison
// of two ranges in SUMPRODUCT would be shorter, but not every calculator
// takes arrays there.)
func increasing(rng string, n int) string {
	if n < 2 {
		return "TRUE"
	}
	parts := make([]string, n-1)
	for i := range parts {
		parts[i] = "INDEX(" + rng + "," + strconv.Itoa(i+2) + ")>INDEX(" + rng + "," + strconv.Itoa(i+1) + ")"
	}
	return "AND(" + strings.Join(parts, ",") + ")"
}

// pluginField translates the field of a plugin call's record result by
// the field's spreadsheet form, when the registry gives one.
func (t *translator) pluginField(call check.Node, field string) (term, error) {
	d := call.Def()
	if d == nil || d.Spreadsheet == nil || d.Spreadsheet.Fields[field] == "" {
		name := "a plugin"
		if d != nil {
			name = "`" + d.Name + "`"
		}
		return term{}, fail("uses the field "+field+" of "+name, ", which only Sheaf computes")
	}
	return t.plugin(call, d.Spreadsheet.Fields[field])
}

func (t *translator) all(ns []check.Node) ([]term, error) {
	out := make([]term, len(ns))
	for i, a := range ns {
		x, err := t.expr(a)
		if err != nil {
			return nil, err
		}
		out[i] = x
	}
	return out, nil
}

// user inlines a call of a user function: its body with the arguments in
// place of the parameters.
func (t *translator) user(n check.Node) (term, error) {
	fn := t.cells[n.Index()]
	if t.depth > 16 {
		return term{}, fail("user functions nest too deeply to inline")
	}
	args, err := t.all(n.Args())
	if err != nil {
		return term{}, err
	}
	t.args = append(t.args, args)
	t.depth++
	x, err := t.expr(fn.Body())
	t.depth--
	t.args = t.args[:len(t.args)-1]
	if err != nil {
		return x, err
	}
	return term{s: x.operand(), atom: true}, nil
}

// list is a list argument: a column range with its factor, or the
// translated elements of a list literal.
type list struct {
	rng    string
	factor float64
	rows   int
	elems  []term
}

func (t *translator) list(n check.Node) (list, error) {
	switch n.Op() {
	case check.OpList:
		xs, err := t.all(n.Args())
		return list{elems: xs}, err
	case check.OpColumn:
		p := t.path(n)
		if r, ok := t.refs[p]; ok && r.rows > 0 {
			return list{rng: r.name, factor: r.factor, rows: r.rows}, nil
		}
		return list{}, fail("uses the column `" + p + "`, which is not on the Data tab")
	}
	return list{}, fail("uses a list that only Sheaf computes")
}

func scaled(s string, f float64) term {
	if f == 1 {
		return term{s: s, atom: true}
	}
	return term{s: s + "*" + num(f).operand()}
}

func joinTerms(xs []term) string {
	s := make([]string, len(xs))
	for i, x := range xs {
		s[i] = x.s
	}
	return strings.Join(s, ",")
}

func call(fn string, xs ...term) term {
	return term{s: fn + "(" + joinTerms(xs) + ")", atom: true}
}

var simple = map[check.Builtin]string{
	check.BSqrt: "SQRT", check.BAbs: "ABS", check.BExp: "EXP", check.BLn: "LN", check.BLog10: "LOG10",
	check.BSin: "SIN", check.BCos: "COS", check.BTan: "TAN", check.BAsin: "ASIN", check.BAcos: "ACOS", check.BAtan: "ATAN",
}

// builtin maps the built-in functions. The spreadsheet works in radians as
// Sheaf does; atan2 swaps its arguments (the spreadsheet takes x first);
// floor and ceil go through INT, which rounds toward minus infinity for
// negative numbers as Go's math.Floor does; ROUND rounds half away from
// zero as Go's math.Round does.
func (t *translator) builtin(n check.Node) (term, error) {
	isList := n.NArg() == 1 && n.Arg(0).Type().Kind == funcs.List
	switch n.Builtin() {
	case check.BMin, check.BMax, check.BSum, check.BMean, check.BHypot, check.BLen:
		fn := map[check.Builtin]string{check.BMin: "MIN", check.BMax: "MAX", check.BSum: "SUM", check.BMean: "AVERAGE", check.BHypot: "SUMSQ", check.BLen: "COUNT"}[n.Builtin()]
		var x term
		if isList {
			l, err := t.list(n.Arg(0))
			if err != nil {
				return l0(err)
			}
			if l.rng != "" {
				x = call(fn, term{s: l.rng})
				if n.Builtin() == check.BHypot {
					x = call("SQRT", x)
				}
				if n.Builtin() != check.BLen {
					x = scaled(x.s, l.factor)
				}
				return x, nil
			}
			if n.Builtin() == check.BLen {
				return num(float64(len(l.elems))), nil
			}
			x = call(fn, l.elems...)
		} else {
			xs, err := t.all(n.Args())
			if err != nil {
				return term{}, err
			}
			x = call(fn, xs...)
		}
		if n.Builtin() == check.BHypot {
			x = call("SQRT", x)
		}
		return x, nil
	case check.BInterp:
		return t.interp(n)
	}
	xs, err := t.all(n.Args())
	if err != nil {
		return term{}, err
	}
	if fn, ok := simple[n.Builtin()]; ok {
		return call(fn, xs...), nil
	}
	switch n.Builtin() {
	case check.BCbrt:
		x := xs[0].s
		return term{s: "SIGN(" + x + ")*ABS(" + x + ")^(1/3)"}, nil
	case check.BPow:
		return term{s: xs[0].operand() + "^" + xs[1].operand()}, nil
	case check.BAtan2:
		return call("ATAN2", xs[1], xs[0]), nil
	case check.BRound:
		if len(xs) == 1 {
			return term{s: "ROUND(" + xs[0].s + ",0)", atom: true}, nil
		}
		return term{s: "ROUND(" + xs[0].operand() + "/" + xs[1].operand() + ",0)*" + xs[1].operand()}, nil
	case check.BFloor:
		return call("INT", xs[0]), nil
	case check.BCeil:
		return term{s: "-INT(-" + xs[0].operand() + ")"}, nil
	}
	return term{}, fail("uses a built-in the workbook cannot compute")
}

func l0(err error) (term, error) { return term{}, err }

// interp is linear interpolation in two columns of the Data tab, in their
// display units: y = fy · lerp(X, Y, x / fx). Below the first x MATCH gives
// #N/A, above the last the division by IF(...,0,1) gives #DIV/0!: like
// Sheaf, the workbook does not extrapolate. (NA() in an IF branch, or INDEX in
// its condition, would be simpler, but not every calculator evaluates them
// lazily or as a single value.)
func (t *translator) interp(n check.Node) (term, error) {
	xs, err := t.list(n.Arg(0))
	if err != nil {
		return term{}, err
	}
	ys, err := t.list(n.Arg(1))
	if err != nil {
		return term{}, err
	}
	if xs.rng == "" || ys.rng == "" || xs.rows < 2 || xs.rows != ys.rows {
		return term{}, fail("interpolates in a list that is not a table column of two or more rows")
	}
	x, err := t.expr(n.Arg(2))
	if err != nil {
		return x, err
	}
	v := x.operand()
	if xs.factor != 1 {
		v = "(" + v + "/" + num(xs.factor).operand() + ")"
	}
	X, Y := xs.rng, ys.rng
	i := "MIN(MATCH(" + v + "," + X + ",1)," + strconv.Itoa(xs.rows-1) + ")"
	lerp := "INDEX(" + Y + "," + i + ")+(" + v + "-INDEX(" + X + "," + i + "))*(INDEX(" + Y + "," + i + "+1)-INDEX(" + Y + "," + i +
		"))/(INDEX(" + X + "," + i + "+1)-INDEX(" + X + "," + i + "))"
	s := "(" + lerp + ")/IF(" + v + ">MAX(" + X + "),0,1)"
	return scaled(s, ys.factor), nil
}

// cellFormula returns the formula of a value cell shown in a unit of
// factor f: the SI expression divided by f.
func (t *translator) cellFormula(body check.Node, f float64) (string, error) {
	x, err := t.expr(body)
	if err != nil {
		return "", err
	}
	s := x.s
	if f != 1 && body.Type().Kind == funcs.Number {
		s = x.operand() + "/" + num(f).operand()
	}
	if len(s) > maxFormulaLen {
		return "", fail("its formula would be longer than a spreadsheet allows")
	}
	return s, nil
}

// checkFormula returns the utilisation formula of a check: demand over
// capacity, both in SI. As in Sheaf, a check is assessed only for a
// positive capacity and a demand of its sense (not negative): otherwise the
// formula is an error, which the verdict shows as "not assessed", so a
// demand that changes sign after an edit can never read "passes".
func (t *translator) checkFormula(c *check.Cell) (string, error) {
	d, err := t.expr(c.Extra().Demand)
	if err != nil {
		return "", err
	}
	k, err := t.expr(c.Extra().Capacity)
	if err != nil {
		return "", err
	}
	s := "IF(AND(" + k.operand() + ">0," + d.operand() + ">=0)," + d.operand() + "/" + k.operand() + ",NA())"
	if len(s) > maxFormulaLen {
		return "", fail("its formula would be longer than a spreadsheet allows")
	}
	return s, nil
}
