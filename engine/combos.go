package engine

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/combine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/funcs"
)

// Combos is the combination set-up of a sheet with actions: the rules, the
// actions, and every combination of every limit state a check belongs to.
// It is part of the immutable Sheet.
type Combos struct {
	Rules   *combine.Rules
	Actions []combine.Action
	Cells   []*Cell               // the cell of each action, in the order of Actions
	All     []combine.Combination // every combination evaluated, limit state by limit state
	// Depends marks, per cell index, the cells whose value depends on an
	// action (the action cells included): they are evaluated in every
	// combination; the others once.
	Depends []bool
	// checks are the indices of the checks that depend on an action, and
	// states their limit state.
	checks []int
	states []string
	// feeds lists, per cell index, the dependent checks (indices into
	// checks) that use the cell, directly or through other cells.
	feeds [][]int
	// pins are the in_combination calls (combos_pin.go); direct marks
	// the cells an action reaches other than through one: they take
	// another value in each combination (Depends without direct: the
	// same value in every combination, from the characteristic values).
	pins   []pin
	direct []bool
	pinIn  []int // per cell: the one combination its own in_combination calls name, else negative
}

// Combos returns the combination set-up of the sheet, or nil when the
// sheet has no actions.
func (s *Sheet) Combos() *Combos { return s.combos }

// Text writes combination k in words ("1.35 G + 1.5 Q").
func (cs *Combos) Text(k int) string { return cs.All[k].Text(cs.Actions) }

// StateOf returns the limit state check c is checked in.
func StateOf(c *Cell) string {
	if c.LimitState() == "" {
		return combine.Default
	}
	return c.LimitState()
}

// setupCombos reads the actions, the rules and the factor lines of prog and
// generates the combinations; it returns nil for a sheet without actions.
func setupCombos(prog *check.Program) (*Combos, diag.List) {
	var errs diag.List
	var acts []*Cell
	for _, c := range prog.Cells {
		if c.Extra().Action != nil {
			acts = append(acts, c)
		}
	}
	pins := findPins(prog, &errs)
	if len(acts) == 0 {
		for _, p := range pins {
			errs.Errorf(p.node.Range(), "in_combination reads a cell in one combination of the sheet's actions, and the sheet has none",
				"write the actions (`action permanent G [kN] = ...`), or use the cell alone", "in_combination without actions")
		}
	}
	md := prog.Meta
	var rules *combine.Rules
	if md.Combinations != "" {
		var ok bool
		if rules, ok = combine.Lookup(md.Combinations); !ok {
			hint := "write one of: " + strings.Join(combine.Names(), "; ")
			if n := diag.Nearest(md.Combinations, combine.Names()); n != "" {
				hint = "did you mean `" + n + "`?"
			}
			errs.Errorf(md.CombinationsPos, "`combinations:` names the combination rules of the sheet's actions", hint,
				"unknown combination rules `%s`", md.Combinations)
			return nil, errs
		}
	}
	if len(acts) == 0 {
		for _, f := range prog.Factors {
			errs.Errorf(f.KeyRange, "a factor line replaces a factor of the combination rules of the sheet's actions, and the sheet has none",
				"write the actions (`action permanent G [kN] = ...`) or delete the line", "factor line without actions")
		}
		return nil, errs
	}
	if rules == nil {
		at, hint := acts[0].Extra().Action.Kind.Range, "add a header line `combinations: EN 1990 6.10` (or EN 1990 6.10a/b, ASCE 7 LRFD, ASCE 7 ASD)"
		for _, t := range prog.Templates {
			if t.Combinations != "" {
				hint = "add the header line `combinations: " + t.Combinations + "` to this sheet, as " + t.File + " has; the using sheet's rules combine its templates' actions"
				if acts[0].Scope() != "" {
					at = t.Use
				}
				break
			}
		}
		errs.Errorf(at, "a sheet with actions names the rules that combine them in its header",
			hint, "actions without combination rules")
		return nil, errs
	}
	cs := &Combos{Rules: rules, Depends: make([]bool, len(prog.Cells))}
	for _, c := range acts {
		k := c.Extra().Action.Kind
		cl, _ := combine.ParseClass(k.Class)
		a := combine.Action{Name: c.Name, Class: cl, High: k.High, Favourable: k.Favourable}
		if k.Category != "" {
			a.Category = k.Category[0]
		}
		if c.Type != nil && c.Type.Kind != funcs.Number {
			errs.Errorf(c.NameRange(), "an action's characteristic value is a number with its unit (a force, a line load, a pressure, a temperature change)",
				"write e.g. `action permanent G [kN] = 12 kN`", "action `%s` is a %s, not a number", c.Name, c.Type.Kind)
		}
		cs.Actions = append(cs.Actions, a)
		cs.Cells = append(cs.Cells, c)
	}
	for _, f := range prog.Factors {
		v, err := strconv.ParseFloat(f.Value.Text, 64)
		src := "sheet line " + strconv.Itoa(f.Range.Start().Line)
		if desc, ref := f.Annot.Text(); ref != "" {
			src += ", " + ref
		} else if desc != "" {
			src += ", " + desc
		}
		if err == nil {
			err = rules.Set(f.Key, v, src)
		}
		if err != nil {
			hint := "the factors of " + rules.Name + " are listed by `sheaf run --combinations`"
			if n := diag.Nearest(f.Key, rules.FactorKeys()); n != "" {
				hint = "did you mean `" + n + "`?"
			}
			errs.Errorf(f.KeyRange, err.Error(), hint, "cannot replace factor `%s`", f.Key)
		}
	}
	templateCombos(prog, rules, &errs)
	// Which cells depend on an action: in dependency order, a cell depends
	// on one when it is one or uses a cell that does. An action's own value
	// must not use another action: it would be factored twice.
	for _, i := range prog.Order {
		c := prog.Cells[i]
		for _, dep := range prog.Deps(i) {
			j := int(dep)
			if cs.Depends[j] {
				if c.Extra().Action != nil {
					errs.Errorf(c.NameRange(), "the characteristic value of an action is factored in each combination; one computed from another action would be factored twice",
						"compute it from cells that are not actions", "action `%s` uses the action `%s`", c.Name, actionUsed(prog, cs.Depends, j))
				}
				cs.Depends[i] = true
			}
		}
		if c.Extra().Action != nil {
			cs.Depends[i] = true
		}
	}
	cs.direct = direct(prog, cs.Depends, pins)
	var states []string
	for _, c := range prog.Cells {
		if c.Kind != Check {
			continue
		}
		st := StateOf(c)
		if !slices.Contains(rules.States, st) {
			at := c.NameRange()
			if c.Extra().State != nil {
				at = c.Extra().State.Range
			}
			errs.Errorf(at, fmt.Sprintf("%s has combinations for %s", rules.Name, strings.Join(rules.States, ", ")),
				"write one of those after `in`, or leave it out for the ultimate limit state", "no combinations of %s for the limit state `%s`", rules.Name, st)
			continue
		}
		if !cs.direct[c.Index] {
			continue // the same in every combination (or no action at all)
		}
		cs.checks = append(cs.checks, c.Index)
		cs.states = append(cs.states, st)
		if !slices.Contains(states, st) {
			states = append(states, st)
		}
	}
	cs.feeds = make([][]int, len(prog.Cells))
	for k, i := range cs.checks {
		seen := map[int]bool{i: true}
		todo := []int{i}
		for len(todo) > 0 {
			j := todo[len(todo)-1]
			todo = todo[:len(todo)-1]
			for _, dep := range prog.Deps(j) {
				d := int(dep)
				if cs.Depends[d] && !seen[d] {
					seen[d] = true
					cs.feeds[d] = append(cs.feeds[d], k)
					todo = append(todo, d)
				}
			}
		}
	}
	// An action that reaches no check is most likely a term forgotten in a
	// formula: refused, since the checks would pass without it.
	for a, c := range cs.Cells {
		reach := reachesCheck(prog, c.Index)
		switch {
		case len(reach) == 0:
			errs.Errorf(c.NameRange(), "no design check depends on this action, so leaving it out of a formula would pass unnoticed",
				"use it in the formula of the force it acts in, or delete it", "action `%s` reaches no check", c.Name)
		case cs.Actions[a].Class == combine.Accidental && !slices.ContainsFunc(reach, func(i int) bool { return StateOf(prog.Cells[i]) == combine.AccidentalLS }):
			errs.Errorf(c.NameRange(), "an accidental action is combined only in the accidental limit state (EN 1990 6.11b), and no check that uses it is in it",
				"write `check NAME in accidental: ...` for the check it acts on", "accidental action `%s` reaches no check in accidental", c.Name)
		}
	}
	if errs.HasErrors() {
		return nil, errs
	}
	if len(states) == 0 {
		states = []string{combine.Default}
	}
	for _, st := range rules.States {
		if !slices.Contains(states, st) {
			continue
		}
		all, err := rules.Combinations(cs.Actions, st)
		if err == nil && len(all) == 0 {
			err = fmt.Errorf("the sheet's actions give no combination in the limit state `%s`", st)
		}
		if err != nil {
			at := md.CombinationsPos
			for k, i := range cs.checks {
				if cs.states[k] == st {
					at = prog.Cells[i].NameRange()
					break
				}
			}
			errs.Errorf(at, err.Error(), "check the kinds of the actions and the limit states of the checks", "cannot combine the actions for `%s`", st)
			continue
		}
		cs.All = append(cs.All, all...)
	}
	if errs.HasErrors() {
		return nil, errs
	}
	cs.resolvePins(prog, pins, &errs)
	if errs.HasErrors() {
		return nil, errs
	}
	return cs, nil
}

// templateCombos holds the combination header and the factor lines of the
// sheet's templates to the using sheet's rules, which govern every action,
// its templates' included. A template written for another standard (EN 1990
// against ASCE/SEI 7) is refused: its characteristic values and kinds were
// chosen for that standard. Within one standard the using sheet's choice
// governs (6.10 or 6.10a/b, LRFD or ASD). A factor a template replaces
// must be replaced alike by the using sheet, else the template's national
// annex would silently not apply.
func templateCombos(prog *check.Program, rules *combine.Rules, errs *diag.List) {
	values := map[string]float64{}
	for _, f := range rules.Factors() {
		values[f.Key] = f.Value
	}
	for _, t := range prog.Templates {
		alias := strings.TrimSuffix(t.Prefix, ".")
		if t.Combinations != "" {
			tr, ok := combine.Lookup(t.Combinations)
			if ok && tr.Standard() != rules.Standard() {
				errs.Errorf(t.Use, fmt.Sprintf("the template `%s` combines its actions by %s (%s), this sheet by %s; the using sheet's rules govern every action, and a template's characteristic values and kinds follow the standard it was written for",
					alias, tr.Name, t.CombinationsPos.Start(), rules.Name),
					"use a template written for "+rules.Standard()+", or make the two `combinations:` lines agree", "template `%s` is written for %s", alias, tr.Standard())
			}
		}
		for _, f := range t.Factors {
			v, err := strconv.ParseFloat(f.Value.Text, 64)
			if err != nil {
				continue // reported when the template is checked alone
			}
			if have, ok := values[f.Key]; !ok || have != v {
				now := "has no such factor"
				if ok {
					now = "takes " + strconv.FormatFloat(have, 'g', -1, 64)
				}
				errs.Errorf(t.Use, fmt.Sprintf("the template `%s` replaces the factor `%s` by %s (%s); a template's factor lines do not apply in the using sheet, whose rules govern, and this sheet %s",
					alias, f.Key, f.Value.Text, f.KeyRange.Start(), now),
					"write `factor "+f.Key+" = "+f.Value.Text+"` in this sheet if it applies here too", "factor `%s` of template `%s` is not this sheet's", f.Key, alias)
			}
		}
	}
}

// reachesCheck returns the checks that depend on cell i.
func reachesCheck(prog *check.Program, i int) []int {
	seen := map[int]bool{i: true}
	todo := []int{i}
	var out []int
	for len(todo) > 0 {
		j := todo[len(todo)-1]
		todo = todo[:len(todo)-1]
		for _, u := range prog.Users(j) {
			u := int(u)
			if !seen[u] {
				seen[u] = true
				todo = append(todo, u)
				if prog.Cells[u].Kind == Check {
					out = append(out, u)
				}
			}
		}
	}
	return out
}

// actionUsed names the action that cell j is or depends on.
func actionUsed(prog *check.Program, dep []bool, j int) string {
	for {
		c := prog.Cells[j]
		if c.Extra().Action != nil {
			return c.Name
		}
		next := -1
		for _, k := range prog.Deps(j) {
			if dep[k] {
				next = int(k)
				break
			}
		}
		if next < 0 {
			return c.Name
		}
		j = next
	}
}

// States returns the limit states that have combinations, in the order of
// the rules.
func (cs *Combos) States() []string {
	var out []string
	for _, c := range cs.All {
		if !slices.Contains(out, c.State) {
			out = append(out, c.State)
		}
	}
	return out
}

// UsedFactors returns the factors the combinations use, with their sources.
func (cs *Combos) UsedFactors() []combine.Factor { return cs.Rules.Used(cs.Actions, cs.States()) }

// InState returns the indices into All of the combinations of limit state st.
func (cs *Combos) InState(st string) []int {
	var out []int
	for k, c := range cs.All {
		if c.State == st {
			out = append(out, k)
		}
	}
	return out
}
