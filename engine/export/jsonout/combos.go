package jsonout

import (
	"math"

	"github.com/sheafcalc/sheaf/engine"
)

// Combinations is how a sheet with actions was evaluated.
type Combinations struct {
	Rules     string        `json:"rules"`
	Title     string        `json:"title"`
	Actions   []Action      `json:"actions"`
	Factors   []Factor      `json:"factors"`
	List      []Combination `json:"list"`
	Shown     string        `json:"shown"` // the combination the cells that depend on actions show
	Evaluated int           `json:"evaluated"`
}

// Action is one action with its kind.
type Action struct {
	Name string `json:"name"`
	Kind string `json:"kind"`
}

// Factor is one factor the combinations use, with its source.
type Factor struct {
	Key        string  `json:"key"`
	Symbol     string  `json:"symbol"`
	Value      float64 `json:"value"`
	Source     string  `json:"source"`
	FromMemory bool    `json:"from_memory"`
	Replaced   bool    `json:"replaced"`
}

// Combination is one combination: the factor of each action (0 when it
// does not act).
type Combination struct {
	Name    string             `json:"name"`
	State   string             `json:"limit_state"`
	Clause  string             `json:"follows"`
	Text    string             `json:"text"`
	Factors map[string]float64 `json:"factors"`
}

// CheckCombination is the outcome of a check over the combinations of its
// limit state. Utilisations hold one entry per combination of that limit
// state; null where the check could not be assessed or its demand
// reversed (Reversed names those).
type CheckCombination struct {
	State        string      `json:"limit_state"`
	Governing    string      `json:"governing"`
	Text         string      `json:"text"`
	Clause       string      `json:"follows"`
	Evaluated    int         `json:"evaluated"`
	Failing      int         `json:"failing"`
	GovReversed  bool        `json:"governing_reversed"`
	Utilisations []ComboUtil `json:"utilisations"`
	Reversed     []string    `json:"reversed,omitempty"`
}

// ComboUtil is the utilisation of a check in one combination.
type ComboUtil struct {
	Name        string   `json:"name"`
	Utilisation *float64 `json:"utilisation"`
}

func buildCombos(r *engine.Results) *Combinations {
	cs := r.Combos
	if cs == nil {
		return nil
	}
	out := &Combinations{Rules: cs.Rules.Name, Title: cs.Rules.Title, Actions: []Action{}, Factors: []Factor{}, List: []Combination{},
		Shown: cs.All[cs.Shown].Name, Evaluated: cs.Evaluated}
	for i, a := range cs.Actions {
		out.Actions = append(out.Actions, Action{Name: a.Name, Kind: cs.Cells[i].Extra().Action.Kind.Text()})
	}
	for _, f := range cs.UsedFactors() {
		out.Factors = append(out.Factors, Factor{Key: f.Key, Symbol: f.Symbol, Value: f.Value, Source: f.SourceText(),
			FromMemory: f.FromMemory, Replaced: f.Replaced})
	}
	for m, c := range cs.All {
		jc := Combination{Name: c.Name, State: c.State, Clause: c.Clause, Text: cs.Text(m), Factors: map[string]float64{}}
		for i, f := range c.Factors {
			jc.Factors[cs.Actions[i].Name] = roundFactor(f)
		}
		out.List = append(out.List, jc)
	}
	return out
}

// roundFactor drops the rounding noise of a product of factors (1.5 × 0.7).
func roundFactor(f float64) float64 { return math.Round(f*1e9) / 1e9 }

func checkCombo(r *engine.Results, ch engine.CheckResult) *CheckCombination {
	o := ch.Combo
	if o == nil {
		return nil
	}
	jc := &CheckCombination{State: o.State, Governing: o.Governing, Text: o.Text, Clause: o.Clause,
		Evaluated: o.Evaluated, Failing: o.Failing, GovReversed: o.Reversed, Utilisations: []ComboUtil{}}
	for m, c := range r.Combos.All {
		if c.State != o.State {
			continue
		}
		u := o.Utils[m]
		if u < 0 {
			jc.Reversed = append(jc.Reversed, c.Name)
			u = -1 // becomes null below
		}
		cu := ComboUtil{Name: c.Name}
		if u >= 0 {
			cu.Utilisation = num(u)
		}
		jc.Utilisations = append(jc.Utilisations, cu)
	}
	return jc
}
