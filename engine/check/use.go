package check

import (
	"fmt"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Template use is inlining. `use rod from "hanger.sheaf"` checks nothing
// apart: the template's cells join this program under the names
// `rod.<name>`, in reading order at the place of the use, and their
// formulas read names in the scope "rod.". Overrides replace the formulas
// of the template's inputs and keep the scope of the sheet that wrote them,
// so `P = N_Ed` links the two sheets in one dependency graph. Everything
// downstream — ordering, cycles, typing, evaluation, incremental
// recompute, checks and results — then works on one program, and a
// template's design checks are checks of the using sheet (`rod.tension`).

// uses is the template state of one check.
type uses struct {
	ld      *loader
	aliases map[string]*alias // by qualified name: "rod", "rod.bolt"
	blocks  []*useBlock
	// replaced holds, per overridden cell, the template's own formula, so
	// that the override can be held to its type.
	replaced map[int]*replaced
	// targets holds, for the formula targetsOf was last asked about, the
	// cell each member chain `rod.x` refers to, keyed by the chain's root
	// identifier. A formula's names are resolved one after the other, so
	// one formula's worth is enough; a map of every formula grew with the
	// sheet.
	targetsOf *formula.Formula
	targets   []target
	// cells caches expandedCells by file.
	cells map[*sheet.File]int
}

// alias is a name given by `use NAME from ...`.
type alias struct {
	pos    diag.Pos
	file   string // the template's file as shown in positions
	failed bool   // the template could not be used: stay silent about it
}

// useBlock is one instance: the use, the scope it is written in, and the
// prefix of the cells it brought in.
type useBlock struct {
	use    *sheet.Use
	scope  string // of the using file: "" or "rod."
	prefix string // scope + name + "."
	file   string
}

type replaced struct {
	orig  *formula.Formula
	scope string
}

func (u *uses) isAlias(name string) bool {
	if u == nil {
		return false
	}
	_, ok := u.aliases[name]
	return ok
}

func (u *uses) aliasPos(name string) diag.Pos {
	if a := u.aliases[name]; a != nil {
		return a.pos
	}
	return diag.Pos{}
}

// useTemplate reads the template of u, written in file from under scope,
// and inlines its cells.
func (c *checker) useTemplate(from *sheet.File, u *sheet.Use, scope string, depth int) {
	if c.use == nil {
		c.use = &uses{ld: newLoader(c.prog.File, c.opt), aliases: map[string]*alias{},
			replaced: map[int]*replaced{}, cells: map[*sheet.File]int{}}
	}
	name := scope + u.Name.Name
	if IsReserved(u.Name.Name) {
		c.errs.Errorf(u.Name.Range, "built-in names, constants and keywords cannot name a template use", "choose another name, e.g. `"+u.Name.Name+"_1`", "`%s` is a reserved name", u.Name.Name)
		return
	}
	if j, dup := c.prog.index(name); dup {
		c.errs.Errorf(u.Name.Range, "`"+name+"` is first defined at "+c.prog.Cells[j].Pos().String()+"; each name names one thing",
			"rename one of them", "`%s` is defined twice", name)
		return
	}
	if a, dup := c.use.aliases[name]; dup {
		c.errs.Errorf(u.Name.Range, "`"+name+"` is first defined at "+a.pos.String()+"; each name names one thing",
			"use the template twice under two names, e.g. `"+name+"_1`", "`%s` is defined twice", name)
		return
	}
	a := &alias{pos: u.Name.Range.Start()}
	c.use.aliases[name] = a
	f := c.use.ld.open(from, u, &c.errs)
	if f == nil {
		a.failed = true
		return
	}
	defer c.use.ld.done()
	// Count the cells the use brings in, its own templates' included,
	// before making any: a few small files that use each other twice at
	// every level would otherwise make millions of cells first.
	if n := c.expandedCells(f); len(c.prog.Cells)+n > c.opt.MaxCells {
		a.failed = true
		what := plural.Grouped(n)
		if n > c.opt.MaxCells {
			what = "more than " + plural.Grouped(c.opt.MaxCells) // the count stops there
		}
		c.errs.Errorf(u.Range, fmt.Sprintf("using %s here brings in %s cells (its own templates' included); a sheet may hold at most %s", f.Name, what, plural.Grouped(c.opt.MaxCells)),
			"use the inner templates once each, split the calculation into sheets, or raise the limit (--max-cells)", "template use too large")
		return
	}
	a.file = f.Name
	if !slices.Contains(c.prog.Files, f) {
		c.prog.Files = append(c.prog.Files, f)
	}
	b := &useBlock{use: u, scope: scope, prefix: name + ".", file: f.Name}
	c.use.blocks = append(c.use.blocks, b)
	c.collectFile(f, b.prefix, depth+1)
	tc := TemplateCombos{Prefix: b.prefix, Use: u.PathRange, File: f.Name}
	for _, it := range f.Items {
		switch it := it.(type) {
		case *sheet.Meta:
			if it.Key.Name == "combinations" {
				tc.Combinations, tc.CombinationsPos = it.Value, it.Range
			}
		case *sheet.Factor:
			tc.Factors = append(tc.Factors, it)
		}
	}
	if tc.Combinations != "" || len(tc.Factors) > 0 {
		c.prog.Templates = append(c.prog.Templates, tc)
	}
}

// local returns the cell that name means in the scope of cell (nil cell:
// the sheet itself).
func (c *checker) local(cell *Cell, name string) (int, bool) {
	if cell != nil && cell.Scope() != "" {
		name = cell.Scope() + name
	}
	i, ok := c.prog.index(name)
	return i, ok
}

// scope returns the scope the typed formula reads names in.
func (t *typer) scope() string {
	if t.cell == nil {
		return ""
	}
	return t.cell.Scope()
}

// ref returns the cell a formula's name refers to: a cell of its scope, or
// for the root of a chain `rod.x`, the template's cell `rod.x`. n is the
// KName node of the reference in cell's formula.
func (c *checker) ref(cell *Cell, f *formula.Formula, n int32) (int, bool) {
	name := f.Text(n)
	if i, ok := c.local(cell, name); ok {
		return i, true
	}
	if c.use == nil || !c.use.isAlias(cell.Scope()+name) {
		return 0, false
	}
	if c.use.targetsOf != f {
		c.use.targetsOf, c.use.targets = f, c.memberTargets(cell, f)
	}
	ts := c.use.targets
	for k := len(ts) - 1; k >= 0; k-- { // the longest chain of a root was found last
		if ts[k].root == n {
			return ts[k].cell, true
		}
	}
	return 0, false
}

// target is a member chain `rod.x` of a formula, by its root name node,
// and the template's cell it names. A formula has a few: a slice beats a
// map for them.
type target struct {
	root int32
	cell int
}

// memberTargets finds the member chains of formula f of cell that name a
// template's cell, keyed by the chain's root name node.
func (c *checker) memberTargets(cell *Cell, f *formula.Formula) []target {
	var ts []target
	for k := range f.Nodes {
		nd := &f.Nodes[k]
		if nd.Kind != formula.KField {
			continue
		}
		prefix, root, ok := c.usePath(cell, f, nd.A)
		if !ok {
			continue
		}
		if i, ok := c.prog.index(prefix + f.Text(nd.B)); ok {
			ts = append(ts, target{root, i})
		}
	}
	return ts
}

// usePath reports whether node n of cell's formula names a template use in
// cell's scope (`rod`, or `rod.bolt` for a template that rod uses) and
// returns its prefix ("rod.", "rod.bolt.") and the chain's root name node.
func (c *checker) usePath(cell *Cell, f *formula.Formula, n int32) (string, int32, bool) {
	if c.use == nil {
		return "", -1, false
	}
	nd := &f.Nodes[n]
	switch nd.Kind {
	case formula.KName:
		name := f.Text(n)
		scope := ""
		if cell != nil {
			scope = cell.Scope()
			if isParam(cell, name) {
				return "", -1, false
			}
		}
		if c.use.isAlias(scope + name) {
			return scope + name + ".", n, true
		}
	case formula.KField:
		pre, root, ok := c.usePath(cell, f, nd.A)
		if !ok {
			return "", -1, false
		}
		if field := f.Text(nd.B); c.use.isAlias(pre + field) {
			return pre + field + ".", root, true
		}
	}
	return "", -1, false
}

// templateMember types `rod.x` when rod names a template use; ok is false
// when n is an ordinary member access (a record's field, a table's column).
func (t *typer) templateMember(n int32) (Node, bool) {
	nd := &t.f.Nodes[n]
	pre, _, ok := t.c.usePath(t.cell, t.f, nd.A)
	if !ok {
		return Node{}, false
	}
	qual := strings.TrimSuffix(pre, ".")
	a := t.c.use.aliases[qual]
	if a.failed {
		return Node{}, true // reported at the use
	}
	written := strings.TrimPrefix(qual, t.scope())
	field := t.f.Text(nd.B)
	name := pre + field
	if t.c.use.isAlias(name) {
		return t.fail(n, "`"+written+"."+field+"` is a template use, not a value", "`"+written+"` uses it to bring in the cells of "+t.c.use.aliases[name].file,
			"refer to one of its cells, e.g. `"+written+"."+field+"."+t.c.firstCell(name+".")+"`"), true
	}
	i, ok := t.c.prog.index(name)
	if !ok {
		hint := ""
		if near := diag.Nearest(field, t.c.localNames(pre)); near != "" {
			hint = "did you mean `" + written + "." + near + "`?"
		}
		return t.fail(nd.B, "template `"+written+"` has no cell `"+field+"`", "`"+written+"` brings in the cells of "+a.file, hint), true
	}
	dep := t.c.prog.Cells[i]
	ty := t.c.typeOf(i)
	if dep.Kind == Function {
		if ty == nil {
			return Node{}, true
		}
		return t.fail(n, "`"+written+"."+field+"` is a function of the template", "a template's functions serve its own cells; only its values can be used here",
			"copy the function into this sheet, or give the template a cell that computes the value you need"), true
	}
	if ty == nil {
		return Node{}, true // failed or in a cycle: reported there
	}
	r := t.node(n, OpCell, ty)
	r.setIndex(int32(i))
	return r, true
}

// aliasValue reports a template use's name written as a value.
func (t *typer) aliasValue(n int32, name string) Node {
	qual := t.scope() + name
	a := t.c.use.aliases[qual]
	if a.failed {
		return Node{}
	}
	return t.fail(n, "`"+name+"` is a template use, not a value", "it brings in the cells of "+a.file,
		"refer to one of its cells, e.g. `"+name+"."+t.c.firstCell(qual+".")+"`")
}

// localNames lists the cells brought in under prefix, by their names in
// the template.
func (c *checker) localNames(prefix string) []string {
	var out []string
	for _, cell := range c.prog.Cells {
		if rest, ok := strings.CutPrefix(cell.Name, prefix); ok && !strings.Contains(rest, ".") {
			out = append(out, rest)
		}
	}
	return out
}

// firstCell names a cell brought in under prefix, for examples in hints:
// the last value cell (usually the result), else any.
func (c *checker) firstCell(prefix string) string {
	names := c.localNames(prefix)
	for k := len(c.prog.Cells) - 1; k >= 0; k-- {
		cell := c.prog.Cells[k]
		if rest, ok := strings.CutPrefix(cell.Name, prefix); ok && !strings.Contains(rest, ".") && (cell.Kind == Derived || cell.Kind == Input) {
			return rest
		}
	}
	if len(names) > 0 {
		return names[0]
	}
	return "x"
}

// suggestIn returns the known name nearest to name in scope, or "".
func (c *checker) suggestIn(scope, name string) string {
	if scope == "" || len(c.errs) >= diag.MaxShown {
		return c.suggest(name)
	}
	names := c.localNames(scope)
	for _, b := range Builtins {
		names = append(names, b.Name)
	}
	names = append(names, constantNames()...)
	return diag.Nearest(name, names)
}

// applyOverrides replaces the template inputs named in each use block with
// the block's cells. It runs after the formulas are parsed, since whether a
// template cell is an input depends on the names its formula reads.
func (c *checker) applyOverrides() {
	if c.use == nil {
		return
	}
	opt := formula.Options{MaxDepth: c.opt.MaxDepth, Arena: &c.formulas}
	for _, b := range c.use.blocks {
		seen := map[string]diag.Pos{}
		written := strings.TrimPrefix(strings.TrimSuffix(b.prefix, "."), b.scope)
		for _, o := range b.use.Overrides {
			local := o.Name.Name
			if first, dup := seen[local]; dup {
				c.errs.Errorf(o.Name.Range, "`"+local+"` is first replaced at "+first.String(), "keep one of the two lines", "`%s` is replaced twice in this use", local)
				continue
			}
			seen[local] = o.Name.Range.Start()
			f, ferrs := formula.Parse(o.Expr, opt)
			c.errs = append(c.errs, ferrs...)
			i, ok := c.prog.index(b.prefix + local)
			if !ok {
				hint := ""
				inputs := c.inputsOf(b.prefix)
				if near := diag.Nearest(local, inputs); near != "" {
					hint = "did you mean `" + near + "`?"
				} else if len(inputs) > 0 {
					if len(inputs) > 8 {
						inputs = append(inputs[:8], "...")
					}
					hint = "its inputs are: " + strings.Join(inputs, ", ")
				}
				c.errs.Errorf(o.Name.Range, "`"+written+"` brings in the cells of "+b.file+"; a use block replaces its inputs",
					hint, "template `%s` has no cell `%s`", written, local)
				continue
			}
			cell := c.prog.Cells[i]
			if !c.overridable(b, written, cell, o) {
				continue
			}
			c.use.replaced[i] = &replaced{orig: cell.Formula, scope: cell.Scope()}
			c.setPlace(cell, cell.Section(), b.scope)
			// The template's description still says what the cell is; its
			// reference backed the template's value, not this one.
			desc, ref := o.Annot.Text()
			if desc == "" {
				desc = cell.Description()
			}
			cell.expr, cell.def = &o.Expr, &o.Def
			cell.setAnnot(desc, ref)
			if o.Unit != nil {
				cell.unit, cell.HasUnit = nil, false
				c.displayUnit(cell, o.Unit)
			}
			cell.Formula = f
			if ferrs.HasErrors() {
				cell.Formula, cell.Type = nil, nil
			}
		}
	}
}

// overridable reports whether cell may be replaced by override o, and says
// why not at the override.
func (c *checker) overridable(b *useBlock, written string, cell *Cell, o *sheet.Cell) bool {
	local := o.Name.Name
	what := ""
	switch cell.Kind {
	case Check:
		what = "a design check"
	case Function:
		what = "a function"
	case Table:
		what = "a table"
	}
	if what != "" {
		c.errs.Errorf(o.Name.Range, "`"+local+"` is "+what+" of the template, defined at "+cell.Pos().String()+"; a use block replaces inputs only",
			"replace the inputs it is computed from", "`%s` of template `%s` cannot be replaced", local, written)
		return false
	}
	if deps := c.templateDeps(cell); len(deps) > 0 {
		if len(deps) > 3 {
			deps = append(deps[:3], "...")
		}
		c.errs.Errorf(o.Name.Range, "`"+local+"` is computed from "+strings.Join(deps, ", ")+" at "+cell.Pos().String()+"; a use block replaces inputs only",
			"replace the inputs it is computed from", "`%s` of template `%s` is derived, not an input", local, written)
		return false
	}
	return true
}

// templateDeps lists, by their names in the template, the cells cell's
// own formula reads; none for an input.
func (c *checker) templateDeps(cell *Cell) []string {
	if cell.Formula == nil {
		return nil
	}
	var out []string
	for r := range cell.Formula.Refs() {
		if isParam(cell, cell.Formula.Text(r)) {
			continue
		}
		if j, ok := c.ref(cell, cell.Formula, r); ok {
			n := strings.TrimPrefix(c.prog.Cells[j].Name, cell.Scope())
			if !slices.Contains(out, n) {
				out = append(out, n)
			}
		}
	}
	return out
}

// inputsOf lists the inputs of the template brought in under prefix.
func (c *checker) inputsOf(prefix string) []string {
	var out []string
	for _, cell := range c.prog.Cells {
		rest, ok := strings.CutPrefix(cell.Name, prefix)
		if ok && !strings.Contains(rest, ".") && cell.Kind == Derived && len(c.templateDeps(cell)) == 0 {
			out = append(out, rest)
		}
	}
	return out
}

// fitsOverride reports whether the typed override body has the type of the
// template input it replaces, and says so at the override when not.
func (c *checker) fitsOverride(t *typer, cell *Cell, body Node) bool {
	if c.use == nil {
		return true
	}
	r := c.use.replaced[cell.Index]
	if r == nil || r.orig == nil || r.orig.Root < 0 {
		return true
	}
	var scratch diag.List
	ot := &typer{c: c, f: r.orig, cell: c.scoped(cell.Name, r.scope), system: t.system, errs: &scratch}
	want := ot.expr(r.orig.Root)
	if want.IsZero() || sameType(want.Type(), body.Type()) {
		return true // a broken template input is reported when the template is checked alone
	}
	local := strings.TrimPrefix(cell.Name, r.scope)
	written := strings.TrimPrefix(strings.TrimSuffix(r.scope, "."), cell.Scope())
	hint := "the template writes `" + r.orig.Source.Text + "`; give a value of that kind"
	t.errs.Errorf(cell.Formula.Source.Range, "a use block replaces an input with a value of the same kind, so that the template's formulas keep their units",
		hint, "`%s` of template `%s` is %s, but this value is %s", local, written, article(t.describeType(want.Type())), article(t.describeType(body.Type())))
	return false
}

// expandedCells returns the number of cells template f brings in when it
// is used, counting its own uses of templates (each file counted once and
// remembered). A file that cannot be read counts for none: the expansion
// itself reports it.
func (c *checker) expandedCells(f *sheet.File) int {
	if n, ok := c.use.cells[f]; ok {
		return n
	}
	c.use.cells[f] = 0 // a loop: reported by the expansion
	n := 0
	var scratch diag.List
	for _, it := range f.Items {
		switch it := it.(type) {
		case *sheet.Cell, *sheet.FuncDef, *sheet.Check, *sheet.Table:
			n++
		case *sheet.Use:
			if g := c.use.ld.open(f, it, &scratch); g != nil {
				n += c.expandedCells(g)
				c.use.ld.done()
			}
		}
		if n > c.opt.MaxCells {
			break // enough to refuse; stops the count growing past int
		}
	}
	c.use.cells[f] = n
	return n
}

// scoped returns a stand-in cell named name whose formula reads its names
// in scope, for typing a formula apart from the cell that holds it.
func (c *checker) scoped(name, scope string) *Cell {
	cell := &Cell{Name: name}
	c.setPlace(cell, "", scope)
	return cell
}
