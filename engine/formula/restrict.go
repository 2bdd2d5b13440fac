package formula

import (
	"fmt"
	"strconv"

	"github.com/expr-lang/expr/ast"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// restrict walks the tree, rejects what the sheet language does not offer,
// collects Refs and enforces the nesting limit.
func (f *Formula) restrict(maxDepth int) diag.List {
	w := &walker{f: f, max: maxDepth}
	w.walk(f.Tree, 0, ctxTop)
	return w.errs
}

type walker struct {
	f       *Formula
	max     int
	errs    diag.List
	tooDeep bool
}

// where a node sits, for the rule on strings.
type ctx uint8

const (
	ctxTop ctx = iota
	ctxArg     // direct argument of a call, or a record field value
	ctxOther
)

func (w *walker) fail(n ast.Node, summary, detail, hint string) {
	w.errs.Add(&diag.Diagnostic{Range: w.f.Range(n), Summary: summary, Detail: detail, Hint: hint})
}

var binaryOK = map[string]bool{
	"+": true, "-": true, "*": true, "/": true, "^": true, "**": true,
	"<": true, "<=": true, ">": true, ">=": true, "==": true, "!=": true,
	"and": true, "or": true, "&&": true, "||": true,
}

var binaryHint = map[string][2]string{
	"%":          {"`%` is not an operator in a sheet", "after a number `%` is the percent unit: `5 %`; there is no remainder operator"},
	"..":         {"ranges `..` are not part of the sheet language", "write the values as a list `[1, 2, 3]` or use a table"},
	"??":         {"`??` is not part of the sheet language", "every cell has a value; use `cond ? a : b` to choose"},
	"in":         {"`in` is not part of the sheet language", "compare values with == and combine with or"},
	"matches":    {"text matching is not part of the sheet language", "formulas compute numbers"},
	"contains":   {"text operators are not part of the sheet language", "formulas compute numbers"},
	"startsWith": {"text operators are not part of the sheet language", "formulas compute numbers"},
	"endsWith":   {"text operators are not part of the sheet language", "formulas compute numbers"},
}

func (w *walker) walk(n ast.Node, depth int, c ctx) {
	if n == nil {
		return
	}
	if depth > w.max {
		if !w.tooDeep {
			w.tooDeep = true
			w.fail(n, "expression nested too deeply", "operators and calls may nest at most "+strconv.Itoa(w.max)+" levels deep", "split the formula into intermediate cells")
		}
		return
	}
	d := depth + 1
	switch n := n.(type) {
	case *ast.IdentifierNode:
		if _, ok := w.f.Quantity(n); !ok {
			w.f.Refs = append(w.f.Refs, Ref{Name: n.Value, Node: n, f: w.f})
		}
	case *ast.IntegerNode, *ast.FloatNode, *ast.BoolNode:
	case *ast.StringNode:
		if c != ctxArg {
			w.fail(n, "text is only allowed as a function argument", "a cell computes a number, a list, a record or a table; text such as \"fixed\" selects a mode of a function", "remove the quotes, or pass the text to the function that needs it")
		}
	case *ast.UnaryNode:
		switch n.Operator {
		case "-", "+", "not", "!":
		default:
			w.fail(n, fmt.Sprintf("unary `%s` is not part of the sheet language", n.Operator), "a value may be preceded by `-`, `+` or `not`", "remove `"+n.Operator+"`")
		}
		w.walk(n.Node, d, ctxOther)
	case *ast.BinaryNode:
		if !binaryOK[n.Operator] {
			h, ok := binaryHint[n.Operator]
			if !ok {
				h = [2]string{fmt.Sprintf("operator `%s` is not part of the sheet language", n.Operator), "use + - * / ^, comparisons, and, or, not"}
			}
			w.fail(n, h[0], "formulas use + - * / ^ (or **), comparisons, and/or/not and `a ? b : c`", h[1])
		}
		w.walk(n.Left, d, ctxOther)
		w.walk(n.Right, d, ctxOther)
	case *ast.MemberNode:
		if n.Optional {
			w.fail(n, "`?.` is not part of the sheet language", "every cell has a value, so optional access is not needed", "write `r.x`")
		}
		if n.Method {
			w.fail(n, "methods are not part of the sheet language", "call functions by name: `f(x)`", "pass the value as the first argument: `f(x)` rather than `x.f()`")
		}
		w.walk(n.Node, d, ctxOther)
		if _, ok := n.Property.(*ast.StringNode); !ok {
			w.walk(n.Property, d, ctxOther)
		}
	case *ast.CallNode:
		if _, ok := n.Callee.(*ast.IdentifierNode); !ok {
			w.fail(n, "only named functions can be called", "write `f(x)` where f is a built-in, a plugin or a function of the sheet", "`sheaf funcs` lists the functions")
			return
		}
		w.walk(n.Callee, d, ctxOther)
		for i := range w.f.Refs {
			if w.f.Refs[i].Node == n.Callee {
				w.f.Refs[i].Call = true
			}
		}
		for _, a := range n.Arguments {
			w.walk(a, d, ctxArg)
		}
	case *ast.BuiltinNode:
		for _, a := range n.Arguments {
			if _, ok := a.(*ast.PredicateNode); ok {
				w.fail(a, "closures are not part of the sheet language", "`"+n.Name+"` with a `#` predicate is not offered", "use sum(xs), min(xs), max(xs), mean(xs) or a user function")
				return
			}
		}
		// Our own functions of the same name (sum, count...) reach here only
		// when expr-lang treats the name as a predicate builtin: keep them as
		// calls; the checker resolves the name.
		for _, a := range n.Arguments {
			w.walk(a, d, ctxArg)
		}
	case *ast.ConditionalNode:
		if !n.Ternary {
			w.fail(n, "`if { } else { }` blocks are not part of the sheet language", "choose with `cond ? a : b`", "write `x > 0 ? a : b`")
		}
		w.walk(n.Cond, d, ctxOther)
		w.walk(n.Exp1, d, ctxOther)
		w.walk(n.Exp2, d, ctxOther)
	case *ast.ArrayNode:
		for _, e := range n.Nodes {
			w.walk(e, d, ctxOther)
		}
	case *ast.MapNode:
		for _, p := range n.Pairs {
			p := p.(*ast.PairNode)
			if _, ok := p.Key.(*ast.StringNode); !ok {
				w.fail(p.Key, "a record field name must be a plain name", "records are written `{E: 210 GPa, f_y: 355 MPa}`", "write the name without quotes or brackets")
			}
			w.walk(p.Value, d, ctxArg)
		}
	case *ast.VariableDeclaratorNode:
		w.fail(n, "`let` is not part of the sheet language", "each name is a cell of its own", "write the intermediate value as its own cell")
	case *ast.SequenceNode:
		w.fail(n, "a formula is one expression", "`;` separates nothing in a sheet", "put each value in its own cell")
	case *ast.PredicateNode, *ast.PointerNode:
		w.fail(n, "closures are not part of the sheet language", "a formula computes one value from cells, lists and tables", "use sum(xs), min(xs), max(xs) or mean(xs)")
	case *ast.SliceNode:
		w.fail(n, "slices are not part of the sheet language", "index one element with `xs[i]`", "write each element you need, as in `xs[0]`, or use a table")
	case *ast.NilNode:
		w.fail(n, "`nil` is not part of the sheet language", "every cell has a value", "give the value, e.g. `0 kN`")
	case *ast.ChainNode:
		w.walk(n.Node, depth, c)
	default:
		w.fail(n, "this construct is not part of the sheet language", "formulas use + - * / ^, comparisons, calls, fields, lists and records", "split the formula into cells that use only these")
	}
}
