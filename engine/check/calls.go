package check

import (
	"fmt"

	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// call types a call of name with args: a user function of the sheet, a
// built-in, or a plugin function from the registry, in that order.
func (t *typer) call(n int32, name string, argNodes []int32) Node {
	if i, ok := t.c.local(t.cell, name); ok {
		fn := t.c.prog.Cells[i]
		if fn.Kind != Function {
			return t.fail(n, "`"+name+"` is a cell, not a function", "only functions of the sheet, built-ins and plugin functions can be called",
				"to multiply, write the operator: `"+name+" * (...)`")
		}
		fnType := t.c.typeOf(i)
		if fnType == nil {
			return Node{}
		}
		return t.userCall(n, i, fn, fnType, argNodes)
	}
	if b, ok := builtinByName[name]; ok {
		args := t.args(argNodes)
		if args == nil {
			return Node{}
		}
		ty, p := t.builtinType(b, args)
		if p != nil {
			at := n
			if p.arg >= 0 {
				at = argNodes[p.arg]
			}
			return t.fail(at, p.summary, "the rule of "+b.Name+": "+b.Rule, p.hint)
		}
		r := t.node(n, OpBuiltin, ty)
		r.setIndex(int32(b.ID))
		if b.ID == BInCombo {
			t.c.prog.InCombination = true
		}
		return r
	}
	if def, ok := funcs.Lookup(name); ok {
		return t.pluginCall(n, def, argNodes)
	}
	if _, ok := Constants[name]; ok {
		return t.fail(n, "`"+name+"` is a constant, not a function", "", "to multiply, write the operator: `"+name+" * (...)`")
	}
	return t.undefined(n, name)
}

// args types every argument; nil if any failed.
func (t *typer) args(argNodes []int32) []Node {
	args := make([]Node, len(argNodes))
	ok := true
	for i, a := range argNodes {
		args[i] = t.expr(a)
		ok = ok && !args[i].IsZero()
	}
	if !ok {
		return nil
	}
	return args
}

// userCall types a call of the user function fn (cell idx) whose type is
// fnType: its own, or the stand-in of a function that failed.
func (t *typer) userCall(n int32, idx int, fn *Cell, fnType *funcs.Type, argNodes []int32) Node {
	if len(argNodes) != len(fn.Extra().Params) {
		return t.fail(n, fmt.Sprintf("%s takes %s, got %d", fn.Name, plural.Count(len(fn.Extra().Params), "argument"), len(argNodes)),
			"the function is defined at "+fn.Pos().String(), "write "+fn.Name+"("+paramList(fn)+")")
	}
	args := t.args(argNodes)
	if args == nil {
		return Node{}
	}
	for i, a := range args {
		p := fn.Extra().Params[i]
		if !p.Type.Accepts(a.Type()) {
			return t.fail(argNodes[i], fmt.Sprintf("argument %s of %s must be %s, got %s", p.Name, fn.Name, t.describeType(p.Type), t.describeType(a.Type())),
				"the function is defined at "+fn.Pos().String(), t.argHint(p.Type))
		}
	}
	r := t.node(n, OpUser, fnType.Result)
	r.setIndex(int32(idx))
	return r
}

func (t *typer) pluginCall(n int32, def *funcs.Def, argNodes []int32) Node {
	lo, hi := def.MinArgs(), len(def.Params)
	if len(argNodes) < lo || (len(argNodes) > hi && def.Validate == nil) {
		want := fmt.Sprintf("%d", hi)
		if lo != hi {
			want = fmt.Sprintf("%d to %d", lo, hi)
		}
		return t.fail(n, fmt.Sprintf("%s takes %s %s, got %d", def.Name, want, plural.Noun(hi, "argument"), len(argNodes)), def.Summary, "see `sheaf funcs "+def.Name+"`")
	}
	args := make([]Node, len(argNodes))
	types := make([]*funcs.Type, len(argNodes))
	ok := true
	for i, a := range argNodes {
		var p *funcs.Param
		if i < len(def.Params) {
			p = &def.Params[i]
		}
		// A bare name of a user function passed where a function is
		// expected becomes a function value.
		if t.f.Nodes[a].Kind == formula.KName && p != nil && p.Type.Kind == funcs.Func {
			if j, found := t.c.local(t.cell, t.f.Text(a)); found && t.c.prog.Cells[j].Kind == Function {
				fn := t.c.prog.Cells[j]
				fnType := t.c.typeOf(j)
				if fnType == nil {
					return Node{}
				}
				r := t.node(a, OpFuncRef, fnType)
				r.setIndex(int32(j))
				args[i], types[i] = r, fnType
				if !p.Type.Accepts(fnType) {
					t.fail(a, fmt.Sprintf("%s of %s must be %s, got %s", p.Name, def.Name, p.Type.String(), fnType.String()), p.Doc,
						"give "+fn.Name+" the parameter and result units "+def.Name+" expects; see `sheaf funcs "+def.Name+"`")
					ok = false
				}
				continue
			}
		}
		x := t.expr(a)
		if x.IsZero() {
			ok = false
			continue
		}
		args[i], types[i] = x, x.Type()
		if p != nil && !p.Type.Accepts(x.Type()) {
			t.fail(a, fmt.Sprintf("%s of %s must be %s, got %s", p.Name, def.Name, t.describeType(p.Type), t.describeType(x.Type())), p.Doc, angleArgHint(p.Type, x.Type())+"see `sheaf funcs "+def.Name+"`")
			ok = false
		}
	}
	if !ok {
		return Node{}
	}
	res := def.Result
	if def.Validate != nil {
		ty, err := def.Validate(types)
		if err != nil {
			return t.fail(n, def.Name+": "+err.Error(), def.Summary, "see `sheaf funcs "+def.Name+"`")
		}
		res = ty
	}
	if res == nil {
		return t.fail(n, def.Name+" returns nothing", "a plugin function must declare its result", "report this to the author of the "+def.Family+" functions")
	}
	r := t.node(n, OpPlugin, res)
	r.setIndex(t.c.prog.plugin(def))
	return r
}

// argHint says what to pass for a parameter of type want.
func (t *typer) argHint(want *funcs.Type) string {
	if want.Kind != funcs.Number {
		return ""
	}
	if want.Dim.IsNone() {
		return "pass a plain number; divide by a unit to make one, as in `L / (1 m)`"
	}
	u := t.unitOf(want.Dim)
	if p, ok := units.Preferred(want.Dim, t.system); ok && p.Quantity != "" {
		return "pass " + article(p.Quantity) + ", e.g. `1 " + u + "`"
	}
	return "pass a value in " + u + ", e.g. `1 " + u + "`"
}
