package combine

import (
	"fmt"
	"strconv"
)

// ASCE/SEI 7 names its loads by letter. Sheaf maps the kinds of actions to
// them: permanent D, imposed A to G L (floor live load), imposed H Lr (roof
// live load), snow S, wind W. Rain (R) has no kind of its own; thermal and
// accidental actions are not part of the basic combinations.
func asceLetter(a Action) (string, error) {
	switch a.Class {
	case Permanent:
		return "D", nil
	case Imposed:
		if a.Category == 'H' {
			return "Lr", nil
		}
		return "L", nil
	case Snow:
		return "S", nil
	case Wind:
		return "W", nil
	case Thermal:
		return "", fmt.Errorf("the thermal action `%s` is not part of the basic combinations of ASCE/SEI 7 §2.3.1 and §2.4.1 (self-straining loads, §2.3.4, from memory); combine it by hand", a.Name)
	}
	return "", fmt.Errorf("the accidental action `%s` is not part of the basic combinations of ASCE/SEI 7 (extraordinary events, §2.5, from memory); combine it by hand", a.Name)
}

// term is one load of a slot: letter × factor.
type term struct {
	letter string
	f      float64
}

// slot is one place of a basic combination: a load, or "(Lr or S or R)",
// with its factor. A required slot must be filled by a load the sheet has
// for the combination to be generated; an optional one is taken filled and
// empty in turn ("effects of one or more loads not acting"). The permanent
// load D is present whenever the sheet has one.
type slot struct {
	alts     []term
	required bool
	always   bool // D: taken whenever the sheet has it
}

type asceRow struct {
	n     int
	slots []slot
}

func d(f float64) slot              { return slot{alts: []term{{"D", f}}, always: true} }
func req(ts ...term) slot           { return slot{alts: ts, required: true} }
func opt(ts ...term) slot           { return slot{alts: ts} }
func roof(f float64) []term         { return []term{{"Lr", f}, {"S", f}, {"R", f}} }
func load(l string, f float64) term { return term{l, f} }

// lrfd is ASCE/SEI 7 §2.3.1 (REFERENCES D8), without the seismic
// combinations (6) and (7):
//
//  1. 1.4D
//  2. 1.2D + 1.6L + 0.5(Lr or S or R)
//  3. 1.2D + 1.6(Lr or S or R) + (L or 0.5W)
//  4. 1.2D + 1.0W + L + 0.5(Lr or S or R)
//  5. 0.9D + 1.0W
//
// The factor of L in 3 and 4 is 1.0: the exception that allows 0.5 for
// most occupancies is not applied (conservative).
var lrfd = []asceRow{
	{1, []slot{d(1.4)}},
	{2, []slot{d(1.2), req(load("L", 1.6)), opt(roof(0.5)...)}},
	{3, []slot{d(1.2), req(roof(1.6)...), opt(load("L", 1.0), load("W", 0.5))}},
	{4, []slot{d(1.2), req(load("W", 1.0)), opt(load("L", 1.0)), opt(roof(0.5)...)}},
	{5, []slot{d(0.9), req(load("W", 1.0))}},
}

// asd is ASCE/SEI 7 §2.4.1 (REFERENCES D9), without the seismic
// combinations:
//
//  1. D
//  2. D + L
//  3. D + (Lr or S or R)
//  4. D + 0.75L + 0.75(Lr or S or R)
//  5. D + 0.6W
//  6. D + 0.75L + 0.75(0.6W) + 0.75(Lr or S or R)
//  7. 0.6D + 0.6W
var asd = []asceRow{
	{1, []slot{d(1.0)}},
	{2, []slot{d(1.0), req(load("L", 1.0))}},
	{3, []slot{d(1.0), req(roof(1.0)...)}},
	{4, []slot{d(1.0), req(load("L", 0.75)), req(roof(0.75)...)}},
	{5, []slot{d(1.0), req(load("W", 0.6))}},
	{6, []slot{d(1.0), req(load("W", 0.45)), opt(load("L", 0.75)), opt(roof(0.75)...)}},
	{7, []slot{d(0.6), req(load("W", 0.6))}},
}

// asce generates the basic combinations of ASCE/SEI 7. All actions of one
// letter act together, with the letter's factor.
func (g *gen) asce() error {
	letters := make([]string, len(g.acts))
	has := map[string]bool{}
	for i, a := range g.acts {
		l, err := asceLetter(a)
		if err != nil {
			return err
		}
		letters[i] = l
		has[l] = true
	}
	rows, prefix, clause := lrfd, "LRFD", "ASCE/SEI 7 §2.3.1 ("
	if g.r.family == asceASD {
		rows, prefix, clause = asd, "ASD", "ASCE/SEI 7 §2.4.1 ("
	}
	byLetter := map[string]float64{}
	var walk func(row asceRow, k int)
	walk = func(row asceRow, k int) {
		if k == len(row.slots) {
			f := make([]float64, len(g.acts))
			for i, l := range letters {
				f[i] = byLetter[l]
			}
			g.add(prefix, clause+strconv.Itoa(row.n)+")", f, -1)
			return
		}
		s := row.slots[k]
		if s.always && has[s.alts[0].letter] {
			byLetter[s.alts[0].letter] = s.alts[0].f
			walk(row, k+1)
			delete(byLetter, s.alts[0].letter)
			return
		}
		if !s.required {
			walk(row, k+1)
		}
		for _, t := range s.alts {
			if !has[t.letter] {
				continue
			}
			byLetter[t.letter] = t.f
			walk(row, k+1)
			delete(byLetter, t.letter)
		}
	}
	for _, row := range rows {
		walk(row, 0)
	}
	return g.err
}
