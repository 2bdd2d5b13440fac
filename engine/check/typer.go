package check

import (
	"fmt"
	"slices"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// typer types one formula.
type typer struct {
	c      *checker
	f      *formula.Formula
	typed  *typed // the typed nodes of f, made on first use
	cell   *Cell
	params []Param // of the user function being typed
	system units.System
	errs   *diag.List
}

func (t *typer) fail(n int32, summary, detail, hint string) Node {
	t.errs.Add(&diag.Diagnostic{Range: t.f.Range(n), Summary: summary, Detail: detail, Hint: hint})
	return Node{}
}

// node sets and returns the typed node of syntax node n. Its arguments are
// the typed nodes of n's operands, which the caller typed first.
func (t *typer) node(n int32, op Op, ty *funcs.Type) Node {
	if t.typed == nil {
		t.typed = t.c.arena.typed(t.f, t.c.prog)
	}
	i := t.c.prog.typeIndex(ty)
	if i >= maxTypes {
		return t.fail(n, "the sheet has too many kinds of value", "a sheet may build at most "+plural.Grouped(int(maxTypes))+" distinct lists, records and functions", "split the calculation into sheets")
	}
	t.c.prog.slots[t.typed.at+n] = slot(i)<<8 | slot(op)
	t.typed.set++
	if op == OpUser || op == OpFuncRef {
		t.typed.set |= callsBit
	}
	return Node{src: t.typed, at: n}
}

// expr types node n of the formula. It returns nil after reporting a
// problem, or silently when a cell it uses has failed (one mistake, one
// message).
func (t *typer) expr(n int32) Node {
	f := t.f
	nd := &f.Nodes[n]
	switch nd.Kind {
	case formula.KNumber:
		return t.node(n, OpConst, numNone)
	case formula.KQuantity:
		q := f.Quantity(n)
		u := q.Unit()
		if u.Factor == 0 {
			return Node{} // the unit was reported already
		}
		return t.node(n, OpConst, t.c.arena.num(u.Dim))
	case formula.KBool:
		return t.node(n, OpBool, funcs.BoolType)
	case formula.KString:
		return t.node(n, OpString, funcs.StringType)
	case formula.KName:
		return t.ident(n)
	case formula.KUnary:
		x := t.expr(nd.A)
		if x.IsZero() {
			return Node{}
		}
		if nd.Op == formula.OpNot {
			if x.Type().Kind != funcs.Bool {
				return t.fail(n, "`not` needs a comparison, got "+t.describeType(x.Type()), "", "write a comparison after it, as in `not (N > 0)`")
			}
			return t.node(n, OpNot, funcs.BoolType)
		}
		if x.Type().Kind != funcs.Number {
			return t.fail(n, "cannot negate "+t.describeType(x.Type()), "only numbers have a sign", "negate a number, as in `-mat.E` or `-xs[0]`")
		}
		if nd.Op == formula.OpPlus {
			return x
		}
		return t.node(n, OpNeg, x.Type())
	case formula.KBinary:
		return t.binary(n)
	case formula.KCond:
		cn, an, bn := f.Terms(n)
		c, a, b := t.expr(cn), t.expr(an), t.expr(bn)
		if c.IsZero() || a.IsZero() || b.IsZero() {
			return Node{}
		}
		if c.Type().Kind != funcs.Bool {
			return t.fail(cn, "the condition of `? :` must be a comparison, got "+t.describeType(c.Type()), "", "write e.g. `N > 0 ? a : b`")
		}
		if !sameType(a.Type(), b.Type()) {
			return t.fail(n, fmt.Sprintf("the two choices of `? :` differ: %s and %s", t.describeType(a.Type()), t.describeType(b.Type())), "both results of a choice must be the same kind of quantity", "check the units of the two choices")
		}
		return t.node(n, OpCond, a.Type())
	case formula.KField, formula.KIndex:
		return t.member(n)
	case formula.KCall:
		return t.call(n, f.Callee(n), f.ArgList(n))
	case formula.KList:
		return t.list(n)
	case formula.KRecord:
		return t.record(n)
	}
	return t.fail(n, "this construct is not part of the sheet language", "formulas use + - * / ^, comparisons, calls, fields, lists and records", "")
}

func sameType(a, b *funcs.Type) bool {
	if a.Kind != b.Kind {
		return false
	}
	if a.Kind == funcs.Number {
		return a.Dim == b.Dim
	}
	return a.Accepts(b) && b.Accepts(a)
}

func (t *typer) ident(n int32) Node {
	name := t.f.Text(n)
	for i, p := range t.params {
		if p.Name == name {
			r := t.node(n, OpParam, p.Type)
			r.setIndex(int32(i))
			return r
		}
	}
	if i, ok := t.depIndex(name); ok {
		dep := t.c.prog.Cells[i]
		ty := t.c.typeOf(i)
		if dep.Kind == Function {
			if ty == nil {
				return Node{}
			}
			return t.fail(n, "`"+name+"` is a function and needs arguments", "", "call it: "+name+"("+paramList(dep)+")")
		}
		if ty == nil {
			return Node{} // failed or in a cycle: reported there
		}
		r := t.node(n, OpCell, ty)
		r.setIndex(int32(i))
		return r
	}
	if t.c.use.isAlias(t.scope() + name) {
		return t.aliasValue(n, name)
	}
	if k, ok := Constants[name]; ok {
		return t.node(n, OpConst, t.c.arena.num(k.Dim))
	}
	if _, ok := builtinByName[name]; ok {
		return t.fail(n, "`"+name+"` is a function and needs arguments", "", "write "+builtinByName[name].Sig)
	}
	if _, ok := funcs.Lookup(name); ok {
		return t.fail(n, "`"+name+"` is a function and needs arguments", "", "see `sheaf funcs` for its parameters")
	}
	return t.undefined(n, name)
}

// depIndex finds the cell a name refers to. The cell's dependencies,
// resolved already, are searched first: a short list beats a lookup in a
// map of every cell of a large sheet.
func (t *typer) depIndex(name string) (int, bool) {
	if t.cell != nil && t.cell.Scope() == "" {
		for _, j := range t.c.prog.Deps(t.cell.Index) {
			if t.c.prog.Cells[j].Name == name {
				return int(j), true
			}
		}
	}
	return t.c.local(t.cell, name)
}

func paramList(c *Cell) string {
	s := ""
	for i, p := range c.Extra().Params {
		if i > 0 {
			s += ", "
		}
		s += p.Name
	}
	return s
}

func (t *typer) undefined(n int32, name string) Node {
	hint := "define it on a line of its own, as in `" + name + " = ...`, or correct the spelling"
	if t.f.Nodes[n].Kind == formula.KCall {
		hint = "`sheaf funcs` lists the functions; a sheet defines its own as `" + name + "(x [m]) = ...`"
	}
	if s := t.c.suggestIn(t.scope(), name); s != "" {
		hint = "did you mean `" + s + "`?"
	}
	return t.fail(n, "undefined name `"+name+"`", "no cell, function or constant of that name is defined in this sheet", hint)
}

// cmpOps are the typed operations of the comparisons.
var cmpOps = [...]Op{formula.OpLT: OpLT, formula.OpLE: OpLE, formula.OpGT: OpGT, formula.OpGE: OpGE, formula.OpEQ: OpEQ, formula.OpNE: OpNE}

func (t *typer) binary(n int32) Node {
	nd := &t.f.Nodes[n]
	a, b := t.expr(nd.A), t.expr(nd.B)
	if a.IsZero() || b.IsZero() {
		return Node{}
	}
	ta, tb := a.Type(), b.Type()
	op := nd.Op.String() // for messages
	switch nd.Op {
	case formula.OpAnd, formula.OpOr:
		if ta.Kind != funcs.Bool || tb.Kind != funcs.Bool {
			return t.fail(n, "`"+op+"` joins comparisons", "both sides must be comparisons such as `a < b`", "compare each value, as in `a > 0 "+op+" b > 0`")
		}
		if nd.Op == formula.OpAnd {
			return t.node(n, OpAnd, funcs.BoolType)
		}
		return t.node(n, OpOr, funcs.BoolType)
	}
	if ta.Kind != funcs.Number || tb.Kind != funcs.Number {
		bad := ta
		if ta.Kind == funcs.Number {
			bad = tb
		}
		hint := ""
		if bad.Kind == funcs.Record {
			hint = "pick a field, e.g. `mat.E`"
		} else if bad.Kind == funcs.List || bad.Kind == funcs.Table {
			hint = "reduce the list first, e.g. sum(xs) or max(xs), or pick one element xs[0]"
		}
		return t.fail(n, fmt.Sprintf("`%s` needs numbers, got %s", op, t.describeType(bad)), "arithmetic and comparisons work on numbers with units", hint)
	}
	da, db := ta.Dim, tb.Dim
	switch nd.Op {
	case formula.OpAdd, formula.OpSub:
		if da != db {
			verb := "add"
			if nd.Op == formula.OpSub {
				verb = "subtract"
			}
			return t.fail(n, fmt.Sprintf("cannot %s %s and %s", verb, t.describeDim(da), t.describeDim(db)),
				"both sides of + and - must be the same kind of quantity", "check the units of the two sides")
		}
		if nd.Op == formula.OpAdd {
			return t.node(n, OpAdd, ta)
		}
		return t.node(n, OpSub, ta)
	case formula.OpMul, formula.OpDiv:
		d, o := da.Mul(db), OpMul
		if nd.Op == formula.OpDiv {
			d, o = da.Div(db), OpDiv
		}
		if p := t.dimOverflow(d, op, da, db); p != nil {
			return t.fail(n, p.summary, overflowDetail, p.hint)
		}
		return t.node(n, o, t.c.arena.num(d))
	case formula.OpPow:
		ty, p := t.powType(a, b, "`^`")
		if p != nil {
			at := nd.B
			if p.arg < 0 {
				at = n
			}
			return t.fail(at, p.summary, "", p.hint)
		}
		return t.node(n, OpPow, ty)
	}
	if nd.Op.IsComparison() {
		if da != db {
			return t.fail(n, fmt.Sprintf("cannot compare %s with %s", t.describeDim(da), t.describeDim(db)),
				"both sides of a comparison must be the same kind of quantity", "check the units of the two sides")
		}
		return t.node(n, cmpOps[nd.Op], funcs.BoolType)
	}
	return t.fail(n, "operator `"+op+"` is not part of the sheet language", "formulas use + - * / ^ (or **), comparisons, and/or/not and `a ? b : c`", "")
}

func (t *typer) member(n int32) Node {
	nd := &t.f.Nodes[n]
	if nd.Kind == formula.KField {
		if r, ok := t.templateMember(n); ok {
			return r
		}
	}
	x := t.expr(nd.A)
	if x.IsZero() {
		return Node{}
	}
	if nd.Kind == formula.KField {
		field := t.f.Text(nd.B)
		switch x.Type().Kind {
		case funcs.Record, funcs.Table:
			i := x.Type().Field(field)
			if i < 0 {
				names := make([]string, len(x.Type().Fields))
				for j, f := range x.Type().Fields {
					names[j] = f.Name
				}
				hint := "its fields are: " + join(names)
				what := "record has no field"
				if x.Type().Kind == funcs.Table {
					hint = "its columns are: " + join(names)
					what = "table has no column"
				}
				if s := diag.Nearest(field, names); s != "" {
					hint = "did you mean `" + s + "`?"
				}
				return t.fail(nd.B, fmt.Sprintf("%s `%s`", what, field), "", hint)
			}
			if x.Type().Kind == funcs.Table {
				r := t.node(n, OpColumn, funcs.ListOf(x.Type().Fields[i].Type))
				r.setIndex(int32(i))
				return r
			}
			r := t.node(n, OpField, x.Type().Fields[i].Type)
			r.setIndex(int32(i))
			return r
		}
		return t.fail(n, "`."+field+"` needs a record or a table, got "+t.describeType(x.Type()), "fields belong to records such as `{E: 210 GPa}` and columns to tables",
			"remove `."+field+"`, or name a record or table before it")
	}
	i := t.expr(nd.B)
	if i.IsZero() {
		return Node{}
	}
	if x.Type().Kind != funcs.List {
		return t.fail(n, "indexing `[i]` needs a list, got "+t.describeType(x.Type()), "lists are written `[1 m, 2 m]`; a table's column `t.L` is a list too",
			"remove the index, or index a list")
	}
	if i.Type().Kind != funcs.Number || !i.Type().Dim.IsNone() {
		return t.fail(nd.B, "an index must be a plain number, got "+t.describeType(i.Type()), "", "the first element is xs[0]")
	}
	return t.node(n, OpIndex, x.Type().Elem)
}

func join(xs []string) string {
	s := ""
	for i, x := range xs {
		if i > 0 {
			s += ", "
		}
		s += x
	}
	return s
}

func (t *typer) list(n int32) Node {
	items := t.f.ArgList(n)
	if len(items) == 0 {
		return t.fail(n, "an empty list has no type", "a list holds one or more values of one kind", "write at least one value: [1 m]")
	}
	args := make([]Node, 0, len(items))
	for _, e := range items {
		x := t.expr(e)
		if x.IsZero() {
			return Node{}
		}
		args = append(args, x)
	}
	for i, x := range args[1:] {
		if !sameType(args[0].Type(), x.Type()) {
			return t.fail(items[i+1], fmt.Sprintf("a list holds values of one kind: %s and %s", t.describeType(args[0].Type()), t.describeType(x.Type())),
				"every item of a list has the unit of the first", "use a record for values of different kinds, as in `{L: 2 m, P: 38 kN}`")
		}
	}
	return t.node(n, OpList, funcs.ListOf(args[0].Type()))
}

func (t *typer) record(n int32) Node {
	pairs := t.f.ArgList(n)
	var args []Node
	var fields []funcs.Field
	for k := 0; k+1 < len(pairs); k += 2 {
		keyNode := pairs[k]
		key := t.f.Text(keyNode)
		if slices.ContainsFunc(fields, func(f funcs.Field) bool { return f.Name == key }) {
			return t.fail(keyNode, "field `"+key+"` is written twice", "each field of a record has its own name", "keep one of the two")
		}
		x := t.expr(pairs[k+1])
		if x.IsZero() {
			return Node{}
		}
		args = append(args, x)
		fields = append(fields, funcs.Field{Name: key, Type: x.Type()})
	}
	return t.node(n, OpRecord, funcs.RecordOf("", fields...))
}
