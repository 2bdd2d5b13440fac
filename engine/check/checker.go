package check

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/formula"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// Options limit and steer checking.
type Options struct {
	MaxCells  int          // 0 means DefaultMaxCells
	MaxDepth  int          // expression nesting; 0 means formula.DefaultMaxDepth
	MaxSteps  int          // work of one evaluation of a cell; 0 means MaxEvalSteps
	MaxBytes  int          // size of a template file; 0 means sheet.DefaultMaxBytes
	System    units.System // preferred units in messages; Neutral means the sheet's own
	HasSystem bool
	// Loader reads the templates the sheet uses; nil means the files on
	// disk beside the sheet (NewFileLoader of the sheet's name).
	Loader Loader
}

// DefaultMaxCells is the default limit on the number of cells of a sheet.
const DefaultMaxCells = 1_000_000

type checker struct {
	prog  *Program
	units map[string]*units.Unit // display units by their text, shared by the cells that write them
	opt   Options
	errs  diag.List
	// per cell: the syntax tree to type (nil when none)
	names []string
	// use holds the templates of the sheet (nil when it uses none).
	use *uses
	// arena allocates the typed nodes.
	arena arena
	// formulas holds the slices of the parsed formulas.
	formulas formula.Arena
	// standIn holds, per cell index, the type users of a failed cell are
	// checked against (see typeAll); nil until the first failure.
	standIn []*funcs.Type
	// badParams marks the user functions with a parameter whose unit did
	// not parse.
	badParams map[*Cell]bool
	// places holds the places of the cells, one per heading and scope.
	places map[place]*place
	// looped marks the cells of a cycle and those after one (nil when the
	// sheet has none): they stay silent.
	looped []bool
}

// Sheet resolves and types the parsed sheet f. It always returns a
// Program (possibly with untyped cells); the list holds every problem.
func Sheet(f *sheet.File, opt Options) (*Program, diag.List) {
	if opt.MaxCells <= 0 {
		opt.MaxCells = DefaultMaxCells
	}
	// A typed node notes a cell index in 32 bits (Node.setIndex); no file
	// a person writes comes near.
	opt.MaxCells = min(opt.MaxCells, math.MaxInt32-1)
	// Most items of a sheet are cells: room for them up front (templates
	// add theirs beyond it).
	items := min(len(f.Items), opt.MaxCells)
	c := &checker{prog: &Program{File: f, Files: []*sheet.File{f}, Cells: make([]*Cell, 0, items)}, opt: opt}
	c.prog.names.reserve(nil, items)
	c.collect()
	if len(c.prog.Cells) > opt.MaxCells {
		c.errs.Errorf(c.prog.Cells[opt.MaxCells].Range(), fmt.Sprintf("a sheet may hold at most %s; this one has %s", plural.Grouped(opt.MaxCells)+" "+plural.Noun(opt.MaxCells, "cell"), plural.Grouped(len(c.prog.Cells))),
			"split the calculation into sheets, or raise the limit (--max-cells)", "too many cells")
		c.errs.Sort()
		return c.prog, c.errs
	}
	c.confusableNames()
	c.parseAll()
	c.applyOverrides()
	c.resolve()
	c.order()
	c.arena.reserveTyped(c.prog)
	c.typeAll()
	c.budget()
	c.errs.Sort()
	return c.prog, c.errs
}

// collect reads the items into cells, the header into Meta, and reports
// duplicate and reserved names.
func (c *checker) collect() {
	c.prog.Meta.System = units.Metric
	c.collectFile(c.prog.File, "", 0)
}

// collectFile reads the items of f into cells named scope+name. The sheet
// itself has scope ""; a template inlined by `use rod` has scope "rod.", its
// header is ignored and its headings become sections "rod: heading".
func (c *checker) collectFile(f *sheet.File, scope string, depth int) {
	p := c.prog
	section := ""
	if scope != "" {
		section = strings.TrimSuffix(scope, ".")
	}
	c.arena.reserveCells(f.Items, c.opt.MaxCells+1-len(p.Cells))
	for _, it := range f.Items {
		if len(p.Cells) > c.opt.MaxCells {
			return // reported by Sheet
		}
		cell := c.arena.newCell(it)
		switch it := it.(type) {
		case *sheet.Meta:
			if scope == "" {
				c.meta(it)
			}
			continue
		case *sheet.Heading:
			section = it.Text
			if scope != "" {
				section = strings.TrimSuffix(scope, ".") + ": " + it.Text
			}
			continue
		case *sheet.Cell:
			c.displayUnit(cell, it.Unit)
		case *sheet.FuncDef:
			c.displayUnit(cell, it.Unit)
			for _, prm := range it.Params {
				q := Param{Name: prm.Name.Name, Type: numNone}
				if prm.Unit != nil {
					u, err := units.Parse(prm.Unit.Text)
					if err != nil {
						c.unitErr(prm.Unit, err)
						if c.badParams == nil {
							c.badParams = map[*Cell]bool{}
						}
						c.badParams[cell] = true
					} else {
						q.Unit, q.Type = u, funcs.Num(u.Dim)
					}
				}
				for _, o := range cell.Extra().Params {
					if o.Name == q.Name {
						c.errs.Errorf(prm.Name.Range, "each parameter needs its own name", "rename one of them, e.g. `"+q.Name+"_2`", "parameter `%s` is written twice", q.Name)
					}
				}
				x := cell.more()
				x.Params = append(x.Params, q)
			}
		case *sheet.Check: // whole as newCell made it
		case *sheet.Action:
			// A template's actions join the using sheet's under their
			// qualified names (`hanger.G`); the using sheet's rules
			// combine them (engine.setupCombos holds the template's own
			// header and factor lines to those).
			cell = c.arena.newCell(&it.Cell)
			cell.more().Action = it
			c.displayUnit(cell, it.Cell.Unit)
		case *sheet.Factor:
			if scope == "" {
				p.Factors = append(p.Factors, it)
			}
			continue // a template's: read by useTemplate
		case *sheet.Table:
			cell = &Cell{Name: it.Name.Name, Kind: Table, def: &it.Def}
			c.table(cell, it)
		case *sheet.Use:
			c.useTemplate(f, it, scope, depth)
			continue
		default:
			continue
		}
		cells := []*Cell{cell}
		if ck, ok := it.(*sheet.Check); ok {
			if lo, hi := c.rangeCheck(ck, cell); lo != nil {
				cells = []*Cell{lo, hi}
			}
		}
		for _, cell := range cells {
			c.addCell(cell, section, scope)
		}
	}
}

// addCell registers cell, read in section of the file inlined under scope,
// and reports a reserved or a duplicate name.
func (c *checker) addCell(cell *Cell, section, scope string) {
	p := c.prog
	c.setPlace(cell, section, scope)
	if IsReserved(cell.Name) {
		c.errs.Errorf(cell.NameRange(), "built-in names, constants and keywords cannot be redefined", "choose another name, e.g. `"+cell.Name+"_1`", "`%s` is a reserved name", cell.Name)
	}
	if scope != "" {
		cell.Name = scope + cell.Name
	}
	if c.use.isAlias(cell.Name) {
		c.errs.Errorf(cell.NameRange(), "`"+cell.Name+"` names a template use at "+c.use.aliasPos(cell.Name).String()+"; each name names one thing",
			"rename one of them", "`%s` is defined twice", cell.Name)
		return
	}
	if j, dup := p.index(cell.Name); dup {
		first := p.Cells[j]
		what := "`" + cell.Name + "` is first defined at " + first.Pos().String()
		switch {
		case rangeHalf(first) != "":
			what = "`" + cell.Name + "` is the " + rangeHalf(first) + " limit of the range check `" + cell.Name[:len(cell.Name)-4] + "` at " + first.Pos().String()
		case rangeHalf(cell) != "":
			what = "the range check `" + cell.Name[:len(cell.Name)-4] + "` names its " + rangeHalf(cell) + " limit `" + cell.Name + "`, and `" + cell.Name + "` is first defined at " + first.Pos().String()
		}
		c.errs.Errorf(cell.NameRange(), what+"; each name names one cell",
			"rename one of them", "`%s` is defined twice", cell.Name)
		return
	}
	cell.Index = len(p.Cells)
	p.Cells = append(p.Cells, cell)
	p.names.add(p.Cells, cell.Index)
}

// setPlace sets the section and the scope of cell, sharing a place with
// the cells that have the same.
func (c *checker) setPlace(cell *Cell, section, scope string) {
	key := place{section, scope}
	if key == (place{}) {
		cell.place = nil
		return
	}
	pl := c.places[key]
	if pl == nil {
		if c.places == nil {
			c.places = make(map[place]*place)
		}
		pl = &place{section, scope}
		c.places[key] = pl
	}
	cell.place = pl
}

// rangeHalf is "lower" or "upper" for a half of a range check (its name
// is the written name and _min or _max), "" for any other cell.
func rangeHalf(cell *Cell) string {
	written := int(cell.NameRange().End().Offset - cell.NameRange().Start().Offset)
	if cell.Kind != Check || len(cell.Name)-len(cell.Scope()) != written+4 {
		return ""
	}
	switch {
	case strings.HasSuffix(cell.Name, "_min"):
		return "lower"
	case strings.HasSuffix(cell.Name, "_max"):
		return "upper"
	}
	return ""
}

// rangeCheck splits a check written between two limits,
// `check name: lo <= x <= hi`, into two checks, name_min (x >= lo) and
// name_max (x <= hi), each with its own utilisation, so that both limits
// are reported and the one nearer governs by itself. The formulas of the
// two are the two halves of the text as written (`lo <= x`, `x <= hi`):
// positions stay those of the sheet. It returns nils for any other check.
func (c *checker) rangeCheck(ck *sheet.Check, cell *Cell) (lo, hi *Cell) {
	// The check's formula is parsed here, once: parseAll leaves a parsed
	// formula alone. A check that is not a range keeps it, with its
	// problems (a range that points two ways says why).
	ok, errs := cell.Formula.ParseSource(formula.Options{MaxDepth: c.opt.MaxDepth, Range: true, Arena: &c.formulas})
	f := cell.Formula
	if !ok || errs.HasErrors() || f.Nodes[f.Root].Kind != formula.KRange {
		c.errs = append(c.errs, errs...)
		if !ok || errs.HasErrors() {
			cell.Formula = nil
		}
		return nil, nil
	}
	r := f.Nodes[f.Root]
	first, mid, last := f.Terms(f.Root)
	lower, upper := f.Nodes[first], f.Nodes[last] // the first and the last term as written
	x := f.Nodes[mid]
	half := func(suffix, limit string, from, to uint16) *Cell {
		body := sheet.Expr{Text: ck.Body.Text[from:to], Range: ck.Body.RangeAt(int(from), int(to))}
		h := *cell
		if cell.extra != nil { // each half fills its own sides
			x := *cell.extra
			h.extra = &x
		}
		h.Name = cell.Name + suffix
		h.expr = &body
		h.Formula = &formula.Formula{Source: &body}
		h.setAnnot(strings.TrimSpace(cell.Description()+" ("+limit+")"), cell.Reference())
		return &h
	}
	if r.Op == formula.OpGE || r.Op == formula.OpGT { // hi >= x >= lo
		return half("_min", "lower limit", x.From, upper.To), half("_max", "upper limit", lower.From, x.To)
	}
	return half("_min", "lower limit", lower.From, x.To), half("_max", "upper limit", x.From, upper.To)
}

// limitState is the limit state check ck names, nil for the default one.
func limitState(ck *sheet.Check) *sheet.Ident {
	if ck.State.Name == "" {
		return nil
	}
	return &ck.State
}

func (a *arena) newCell(it sheet.Item) *Cell {
	switch it := it.(type) {
	case *sheet.Cell:
		cell := a.cellWith(&it.Expr)
		cell.Name, cell.Kind, cell.def = it.Name.Name, Derived, &it.Def
		return cell
	case *sheet.FuncDef:
		cell := a.cellWith(&it.Body)
		cell.Name, cell.Kind, cell.def = it.Name.Name, Function, &it.Def
		return cell
	case *sheet.Check:
		cell := a.cellWith(&it.Body)
		cell.Name, cell.Kind, cell.def = it.Name.Name, Check, &it.Def
		cell.more().State = limitState(it)
		return cell
	}
	return nil
}

func (c *checker) meta(m *sheet.Meta) {
	md := &c.prog.Meta
	switch m.Key.Name {
	case "title":
		md.Title = m.Value
	case "project":
		md.Project = m.Value
	case "basis":
		md.Basis = m.Value
	case "author":
		md.Author = m.Value
	case "checker":
		md.Checker = m.Value
	case "date":
		md.Date = m.Value
	case "revision":
		md.Revision = m.Value
	case "combinations":
		md.Combinations, md.CombinationsPos = m.Value, m.Range
	case "units":
		md.Units = m.Value
		switch m.Value {
		case "us":
			md.System = units.US
		case "metric":
			md.System = units.Metric
		}
	}
}

func (c *checker) unitErr(u *sheet.UnitSpec, err error) {
	d := &diag.Diagnostic{Range: u.Range, Summary: err.Error(), Detail: "units are written as in `kN`, `N/mm^2`, `kN/m`, `1/K`"}
	if ue, ok := err.(*units.Error); ok {
		d.Summary, d.Hint = ue.Msg, ue.Hint
		if ue.End > ue.Offset && ue.End <= len(u.Text) {
			e := sheet.Expr{Text: u.Text, Range: u.Range}
			d.Range = e.RangeAt(ue.Offset, ue.End)
		}
	}
	c.errs.Add(d)
}

func (c *checker) displayUnit(cell *Cell, u *sheet.UnitSpec) {
	if u == nil {
		return
	}
	if shared, ok := c.units[u.Text]; ok {
		cell.unit, cell.HasUnit = shared, true
		return
	}
	parsed, err := units.Parse(u.Text)
	if err != nil {
		c.unitErr(u, err)
		return
	}
	parsed.Symbol = u.Text
	if c.units == nil {
		c.units = map[string]*units.Unit{}
	}
	c.units[u.Text] = &parsed
	cell.unit, cell.HasUnit = &parsed, true
}

// table converts the rows of a table to SI columns.
func (c *checker) table(cell *Cell, t *sheet.Table) {
	ty := &funcs.Type{Kind: funcs.Table, Name: ""}
	factors := make([]float64, len(t.Columns))
	ok := true
	for i, col := range t.Columns {
		d, f := units.None, 1.0
		if col.Unit != nil {
			u, err := units.Parse(col.Unit.Text)
			if err != nil {
				c.unitErr(col.Unit, err)
				ok = false
			} else {
				d, f = u.Dim, u.Factor
			}
		}
		for _, o := range ty.Fields {
			if o.Name == col.Name.Name {
				c.errs.Errorf(col.Name.Range, "each column needs its own name", "rename one of them, e.g. `"+col.Name.Name+"_2`", "column `%s` is written twice", col.Name.Name)
				ok = false
			}
		}
		ty.Fields = append(ty.Fields, funcs.Field{Name: col.Name.Name, Type: funcs.Num(d)})
		factors[i] = f
	}
	if len(t.Columns) == 0 {
		c.errs.Errorf(t.Name.Range, "a table needs an indented header row such as `L [m]  A [mm^2]`",
			"indent the header row and the rows of numbers below `table "+t.Name.Name+"`", "table `%s` has no columns", t.Name.Name)
		ok = false
	}
	val := &funcs.TableValue{Type: ty, Cols: make([][]float64, len(t.Columns))}
	for r, row := range t.Rows {
		for i, lit := range row {
			if i >= len(val.Cols) {
				break
			}
			if lit.Expr {
				f, ferrs := formula.Parse(sheet.Expr{Text: lit.Text, Range: lit.Range}, formula.Options{MaxDepth: c.opt.MaxDepth, Arena: &c.formulas})
				c.errs = append(c.errs, ferrs...)
				if f == nil || ferrs.HasErrors() {
					ok = false
					continue
				}
				x := cell.more()
				x.Entries = append(x.Entries, Entry{Row: r, Col: i, Formula: f})
				val.Cols[i] = append(val.Cols[i], 0) // set at evaluation
				continue
			}
			v, err := strconv.ParseFloat(strings.ReplaceAll(lit.Text, "_", ""), 64)
			if err != nil {
				c.errs.Errorf(lit.Range, "table entries are plain numbers in the unit of their column", "write e.g. 2.75 or 12e-6", "`%s` is not a number", lit.Text)
				ok = false
				continue
			}
			val.Cols[i] = append(val.Cols[i], v*factors[i])
		}
	}
	if ok {
		cell.Type, cell.more().Table = ty, val
	}
}

// typeEntries types the expression entries of table cell, each against
// the dimension of its column; the table is left untyped when one fails
// (or when a cell it reads failed, silently).
func (c *checker) typeEntries(cell *Cell, sys units.System) {
	for _, j := range c.prog.Deps(cell.Index) {
		if c.typeOf(int(j)) == nil {
			cell.Type = nil // reported where it failed
			return
		}
	}
	ty := cell.Type                 // the columns; every entry is typed, each failure reported
	entries := cell.Extra().Entries // shared with the cell: typing fills them in place
	for k := range entries {
		e := &entries[k]
		t := &typer{c: c, f: e.Formula, cell: cell, system: sys, errs: &c.errs}
		n := t.expr(e.Formula.Root)
		if n.IsZero() {
			cell.Type = nil
			continue
		}
		col := ty.Fields[e.Col]
		if n.Type().Kind != funcs.Number || n.Type().Dim != col.Type.Dim {
			c.errs.Errorf(e.Formula.Source.Range, "an entry of column `"+col.Name+"` must be "+article(t.describeDim(col.Type.Dim))+", as its header says",
				"write the entry in the unit of its column's dimension, or correct the formula",
				"table entry is %s, column `%s` is %s", article(t.describeType(n.Type())), col.Name, article(t.describeDim(col.Type.Dim)))
			cell.Type = nil
			continue
		}
		e.Node = n
	}
	if cell.Type == nil {
		cell.more().Table = nil
	}
}

// parseAll parses every formula.
func (c *checker) parseAll() {
	opt := formula.Options{MaxDepth: c.opt.MaxDepth, Arena: &c.formulas}
	for _, cell := range c.prog.Cells {
		if cell.Formula == nil || cell.Formula.Nodes != nil {
			continue // none, or parsed already (a check: rangeCheck)
		}
		ok, errs := cell.Formula.ParseSource(opt)
		c.errs = append(c.errs, errs...)
		if !ok || errs.HasErrors() {
			cell.Formula, cell.Type = nil, nil
		}
	}
}

// resolve finds the dependencies of every cell, decides inputs and builds
// the reverse edges.
func (c *checker) resolve() {
	p := c.prog
	// seen[j] == i+1 when cell i already lists cell j: one slice for the
	// sheet rather than a set per cell.
	seen := make([]int32, len(p.Cells))
	// A cell uses at most as many cells as its formulas name.
	names := 0
	for _, cell := range p.Cells {
		if cell.Formula != nil {
			names += cell.Formula.NumRefs()
		}
		for _, e := range cell.Extra().Entries {
			names += e.Formula.NumRefs()
		}
	}
	p.depAt = make([]int32, len(p.Cells)+1)
	p.deps = make([]int32, 0, names)
	for i := range p.Cells {
		c.resolveCell(i, seen)
		p.depAt[i+1] = int32(len(p.deps))
	}
	// The reverse edges, counted, then placed: userAt[j+1] counts the
	// users of j, and then becomes where they end.
	p.userAt = make([]int32, len(p.Cells)+1)
	for _, j := range p.deps {
		p.userAt[j+1]++
	}
	for j := range p.Cells {
		p.userAt[j+1] += p.userAt[j]
	}
	p.users = make([]int32, p.userAt[len(p.Cells)])
	next := slices.Clone(p.userAt[:len(p.Cells)]) // where the next user of j goes
	for i := range p.Cells {
		for _, j := range p.Deps(i) {
			p.users[next[j]] = int32(i)
			next[j]++
		}
	}
}

// resolveCell finds the dependencies of cell i (see resolve).
func (c *checker) resolveCell(i int, seen []int32) {
	p := c.prog
	cell := p.Cells[i]
	if cell.Formula != nil {
		c.resolveRefs(i, cell.Formula, seen)
	}
	for _, e := range cell.Extra().Entries {
		c.resolveRefs(i, e.Formula, seen)
	}
	if cell.Kind == Derived && len(p.deps) == int(p.depAt[i]) {
		cell.Kind = Input
	}
}

// resolveRefs adds the cells formula f of cell i reads to its dependencies.
func (c *checker) resolveRefs(i int, f *formula.Formula, seen []int32) {
	p := c.prog
	cell := p.Cells[i]
	for r := range f.Refs() {
		if isParam(cell, f.Text(r)) {
			continue
		}
		j, ok := c.ref(cell, f, r)
		if !ok || seen[j] == int32(i+1) {
			continue
		}
		seen[j] = int32(i + 1)
		p.deps = append(p.deps, int32(j))
	}
}

func isParam(cell *Cell, name string) bool {
	for _, p := range cell.Extra().Params {
		if p.Name == name {
			return true
		}
	}
	return false
}

// suggest returns the known name nearest to name, or "". The candidates
// come in a fixed order (cells in reading order, then built-ins, constants
// and plugin functions), since diag.Nearest breaks ties by order.
func (c *checker) suggest(name string) string {
	if len(c.errs) >= diag.MaxShown {
		// Past the problems a user is shown, a suggestion is never read:
		// skipping it keeps a sheet of thousands of mistakes linear.
		return ""
	}
	if c.names == nil {
		for _, cell := range c.prog.Cells {
			c.names = append(c.names, cell.Name)
		}
		for _, b := range Builtins {
			c.names = append(c.names, b.Name)
		}
		c.names = append(c.names, constantNames()...)
		for _, d := range funcs.All() {
			c.names = append(c.names, d.Name)
		}
	}
	return diag.Nearest(name, c.names)
}

// constantNames lists the built-in constants in sorted order.
func constantNames() []string {
	return slices.Sorted(maps.Keys(Constants))
}

// typeAll types every cell in topological order, so that each cell's
// dependencies are typed before it.
//
// A cell that fails is left untyped (Type nil) and is never evaluated. What
// its users see depends on what the sheet declares: a failed cell with a
// display unit (`P [kN] = 38 kn`), or a user function with a result unit,
// stands in with that dimension, so a real mistake downstream
// (`sigma [MPa] = P / A + 3 m`) is still reported in the same run; a failed
// cell without one blocks its users, which are typed for their own problems
// but report nothing (one mistake, one message). A cell typed cleanly from
// stand-ins stays untyped too, but passes on the type it found.
func (c *checker) typeAll() {
	sys := c.prog.Meta.System
	if c.opt.HasSystem {
		sys = c.opt.System
	}
	for _, i := range c.prog.Order {
		c.typeOne(i, sys)
	}
}

// typeOne types cell i (see typeAll).
func (c *checker) typeOne(i int, sys units.System) {
	cell := c.prog.Cells[i]
	if cell.Kind == Table {
		if len(cell.Extra().Entries) > 0 && cell.Type != nil {
			c.typeEntries(cell, sys)
		}
		return // typed when read
	}
	if cell.Formula == nil || cell.Formula.Root < 0 {
		if c.looped == nil || !c.looped[i] {
			c.standInFor(cell, nil, false) // its formula did not parse
		}
		return
	}
	blocked, tainted := false, false
	for _, j := range c.prog.Deps(i) {
		if c.prog.Cells[j].Type == nil {
			if c.typeOf(int(j)) == nil {
				blocked = true
			} else {
				tainted = true
			}
		}
	}
	t := &typer{c: c, f: cell.Formula, cell: cell, params: cell.Extra().Params, system: sys, errs: &c.errs}
	if blocked {
		// A dependency failed unseen: type anyway to find this cell's
		// own problems, but keep them to itself.
		t.errs = new(diag.List)
	}
	c.typeCell(t, cell)
	if blocked || tainted || cell.Type == nil {
		found := cell.Type
		cell.Type = nil
		c.standInFor(cell, found, blocked)
	}
}

// typeCell types one cell, setting Body (or Demand and Capacity) and Type;
// Type stays nil when the cell has a problem.
func (c *checker) typeCell(t *typer, cell *Cell) {
	switch cell.Kind {
	case Check:
		c.typeCheck(t, cell)
	case Function:
		body := t.expr(cell.Formula.Root)
		if body.IsZero() || !c.fitsUnit(t, cell, body) {
			return
		}
		ps := make([]*funcs.Type, len(cell.Extra().Params))
		for k, p := range cell.Extra().Params {
			ps[k] = p.Type
		}
		cell.setBody(body)
		cell.Type = funcs.FuncOf(body.Type(), ps...)
	default:
		body := t.expr(cell.Formula.Root)
		if body.IsZero() || !c.fitsOverride(t, cell, body) || !c.fitsUnit(t, cell, body) {
			return
		}
		cell.setBody(body)
		cell.Type = body.Type()
	}
}

// standInFor records the type that the users of an untyped cell are
// checked against: the dimension its display unit declares (for a function,
// the declared result unit with the declared parameters), else the type
// its formula was found to have from stand-ins (found, nil if it failed),
// else none: its users stay silent. A blocked cell's found type came from
// guesses and is not passed on.
func (c *checker) standInFor(cell *Cell, found *funcs.Type, blocked bool) {
	var ty *funcs.Type
	switch {
	case cell.HasUnit && cell.Kind == Function:
		if c.badParams[cell] {
			return // a parameter's unit did not parse: its dimension is unknown
		}
		ps := make([]*funcs.Type, len(cell.Extra().Params))
		for k, p := range cell.Extra().Params {
			ps[k] = p.Type
		}
		ty = funcs.FuncOf(c.arena.num(cell.Unit().Dim), ps...)
	case cell.HasUnit && cell.Kind != Check:
		ty = c.arena.num(cell.Unit().Dim)
	case !blocked:
		ty = found
	}
	if ty == nil {
		return
	}
	if c.standIn == nil {
		c.standIn = make([]*funcs.Type, len(c.prog.Cells))
	}
	c.standIn[cell.Index] = ty
}

// typeOf returns the type the users of cell i are checked against: its own
// type, or the stand-in of a cell that failed; nil when it failed without
// one.
func (c *checker) typeOf(i int) *funcs.Type {
	if ty := c.prog.Cells[i].Type; ty != nil {
		return ty
	}
	if c.standIn != nil {
		return c.standIn[i]
	}
	return nil
}

// fitsUnit reports whether the display unit fits the expression.
func (c *checker) fitsUnit(t *typer, cell *Cell, body Node) bool {
	if !cell.HasUnit {
		return true
	}
	u := cell.Unit()
	if body.Type().Kind != funcs.Number {
		t.errs.Errorf(cell.Formula.Source.Range, "a display unit applies to a number", "remove [`"+u.Symbol+"`]",
			"display unit %s given for %s", u.Symbol, t.describeType(body.Type()))
		return false
	}
	if body.Type().Dim != u.Dim {
		what := t.describeDim(u.Dim)
		if u.Quantity != "" && !u.Dim.IsNone() { // not "a dimensionless"
			what = u.Quantity
		}
		hint := "write the unit of the result, e.g. [" + t.unitOf(body.Type().Dim) + "], or correct the formula"
		if body.Type().Dim.IsNone() {
			hint = plainNumberHint(u, body)
		}
		t.errs.Errorf(cell.Formula.Source.Range,
			"the unit in brackets sets how the value is shown and must have the dimension of the expression",
			hint, "display unit %s is %s but the expression is %s", u.Symbol, article(what), t.describeDim(body.Type().Dim))
		return false
	}
	if v, ok := bareNumber(cell.Formula); ok && u.Dim.IsNone() && u.Factor != 1 {
		// `share [%] = 5` would be 500 %: a plain number is a fraction of
		// one, and the author almost always meant the number in the
		// bracket's unit. As with angles, the unit is written, not guessed.
		text := strings.TrimSpace(cell.Formula.Source.Text)
		t.errs.Errorf(cell.Formula.Source.Range,
			"a plain number is a fraction of one, so in ["+u.Symbol+"] this would show "+formatScaled(v, u.Factor)+" "+u.Symbol,
			"write the unit after the number, `"+text+" "+u.Symbol+"`; a fraction is written in the unit too ("+formatScaled(v, 1)+" is `"+formatScaled(v, u.Factor)+" "+u.Symbol+"`)",
			"a plain number written for [%s] is ambiguous", u.Symbol)
		return false
	}
	return true
}

// bareNumber reports whether formula f is a plain number literal, perhaps
// signed or in brackets, and its value.
func bareNumber(f *formula.Formula) (float64, bool) {
	sign := 1.0
	for n := f.Root; n >= 0; {
		nd := f.Nodes[n]
		switch {
		case nd.Kind == formula.KNumber:
			return sign * f.Num(n), true
		case nd.Kind == formula.KUnary && nd.Op == formula.OpPlus:
			n = nd.A
		case nd.Kind == formula.KUnary && nd.Op == formula.OpNeg:
			sign, n = -sign, nd.A
		default:
			return 0, false
		}
	}
	return 0, false
}

// formatScaled writes v in a unit of factor f, shortest form.
func formatScaled(v, f float64) string {
	return strconv.FormatFloat(v/f, 'g', 6, 64)
}

func article(s string) string {
	if strings.HasPrefix(s, "a ") || s == "" {
		return s
	}
	if strings.ContainsRune("aeiou", rune(s[0])) {
		return "an " + s
	}
	return "a " + s
}

// typeCheck splits a check at its top-level comparison.
func (c *checker) typeCheck(t *typer, cell *Cell) {
	f := cell.Formula
	b := f.Nodes[f.Root]
	if b.Kind != formula.KBinary || (b.Op != formula.OpLE && b.Op != formula.OpGE && b.Op != formula.OpLT && b.Op != formula.OpGT) {
		t.errs.Errorf(f.Source.Range, "a check compares a demand with a capacity", "write `check name: demand <= capacity` or `capacity >= demand`",
			"check `%s` needs `<=` or `>=` at the top", cell.Name)
		return
	}
	l, r := t.expr(b.A), t.expr(b.B)
	if l.IsZero() || r.IsZero() {
		return
	}
	if l.Type().Kind != funcs.Number || r.Type().Kind != funcs.Number {
		t.fail(f.Root, "a check compares two numbers", "got "+t.describeType(l.Type())+" and "+t.describeType(r.Type()),
			"compare a number with a number, e.g. a field `mat.f_y` or an element `xs[0]`")
		return
	}
	if l.Type().Dim != r.Type().Dim {
		t.fail(f.Root, fmt.Sprintf("cannot compare %s with %s", t.describeDim(l.Type().Dim), t.describeDim(r.Type().Dim)),
			"the demand and the capacity of a check must be the same kind of quantity", "check the units of the two sides")
		return
	}
	x := cell.more()
	x.Op = b.Op.String()
	if b.Op == formula.OpLE || b.Op == formula.OpLT {
		x.Demand, x.Capacity = l, r
	} else {
		x.Demand, x.Capacity = r, l
	}
	cell.Type = numNone
}

// TypeValue types a stand-alone value such as an override `45 kN`: a
// formula that may use literals, constants and built-ins but no cell.
func (p *Program) TypeValue(f *formula.Formula, sys units.System) (Node, diag.List) {
	var errs diag.List
	for r := range f.Refs() {
		name := f.Text(r)
		if _, ok := p.index(name); ok {
			errs.Errorf(f.Range(r), "a value given for an input is a quantity such as `45 kN`",
				"write the number with its unit", "a value cannot refer to the cell `%s`", name)
			return Node{}, errs
		}
	}
	c := &checker{prog: &Program{}}
	t := &typer{c: c, f: f, system: sys, errs: &errs}
	n := t.expr(f.Root)
	return n, errs
}
