package combine

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// Combination is one combination of actions.
type Combination struct {
	Name    string    // "ULS 3", "SLS-f 2", "LRFD 4"
	State   string    // its limit state
	Clause  string    // the expression it follows: "EN 1990 (6.10b)", "ASCE/SEI 7 §2.3.1 (4)"
	Factors []float64 // one per action, in the order of the actions given; 0 when it does not act
	Lead    int       // index of the leading variable action, -1 when none
}

// Text writes the combination in words: "1.35 G + 1.5 Q + 1.05 S".
func (c Combination) Text(acts []Action) string {
	var b strings.Builder
	for i, f := range c.Factors {
		if f == 0 {
			continue
		}
		if b.Len() > 0 {
			b.WriteString(" + ")
		}
		b.WriteString(FormatFactor(f))
		b.WriteByte(' ')
		b.WriteString(acts[i].Name)
	}
	if b.Len() == 0 {
		return "no action"
	}
	return b.String()
}

// FormatFactor writes a factor with at least one decimal and no rounding
// noise: 1.5 × 0.7 is "1.05", 1 is "1.0".
func FormatFactor(f float64) string {
	s := strconv.FormatFloat(math.Round(f*1e9)/1e9, 'f', -1, 64)
	if !strings.Contains(s, ".") {
		s += ".0"
	}
	return s
}

// MaxCombinations bounds the combinations of one limit state.
const MaxCombinations = 10_000

// Combinations returns the combinations of acts for the limit state (one of
// r.States). It refuses actions the rule set has no combinations for.
func (r *Rules) Combinations(acts []Action, state string) ([]Combination, error) {
	if !slices.Contains(r.States, state) {
		return nil, fmt.Errorf("%s has no combinations for the limit state `%s`; it has %s", r.Name, state, strings.Join(r.States, ", "))
	}
	g := &gen{r: r, acts: acts, state: state, seen: map[string]bool{}}
	var err error
	switch r.family {
	case en610, en610ab:
		err = g.en()
	default:
		err = g.asce()
	}
	if err != nil {
		return nil, err
	}
	return g.out, nil
}

type gen struct {
	r     *Rules
	acts  []Action
	state string
	out   []Combination
	seen  map[string]bool
	n     int
	err   error
}

var statePrefix = map[string]string{ULS: "ULS", EQU: "EQU", Characteristic: "SLS-c", Frequent: "SLS-f",
	QuasiPermanent: "SLS-qp", AccidentalLS: "ACC"}

// add records a combination unless an equal one is already there.
func (g *gen) add(prefix, clause string, f []float64, lead int) {
	if g.err != nil {
		return
	}
	var key strings.Builder
	for _, x := range f {
		key.WriteString(strconv.FormatFloat(x, 'g', 12, 64))
		key.WriteByte(',')
	}
	if g.seen[key.String()] {
		return
	}
	if len(g.out) >= MaxCombinations {
		g.err = fmt.Errorf("the actions give more than %d combinations in the limit state `%s`; mark fewer permanent actions favourable or split the sheet", MaxCombinations, g.state)
		return
	}
	g.seen[key.String()] = true
	g.n++
	g.out = append(g.out, Combination{Name: prefix + " " + strconv.Itoa(g.n), State: g.state, Clause: clause, Factors: slices.Clone(f), Lead: lead})
}

// en generates the combinations of EN 1990.
func (g *gen) en() error {
	r := g.r
	for _, a := range g.acts {
		if a.Class == Imposed && (a.Category < 'A' || a.Category > 'H') {
			return fmt.Errorf("the imposed action `%s` needs its category of use for the ψ factors of EN 1990 Table A1.1: write `imposed B` (offices), `imposed H` (roofs), ...", a.Name)
		}
	}
	var perms, vars, accs []int
	for i, a := range g.acts {
		switch {
		case a.Class == Permanent:
			perms = append(perms, i)
		case a.Class == Accidental:
			accs = append(accs, i)
		default:
			vars = append(vars, i)
		}
	}
	prefix := statePrefix[g.state]
	f := make([]float64, len(g.acts))
	// permSets calls fn once per assignment of the permanent actions: each
	// at sup, and those marked favourable also at inf, in turn.
	permSets := func(sup, inf float64, fn func()) {
		var fav []int
		for _, i := range perms {
			f[i] = sup
			if g.acts[i].Favourable {
				fav = append(fav, i)
			}
		}
		for mask := 0; mask < 1<<len(fav); mask++ {
			for b, i := range fav {
				f[i] = sup
				if mask&(1<<b) != 0 {
					f[i] = inf
				}
			}
			fn()
		}
	}
	// subsets calls fn for every subset of others (all of vars but lead)
	// whose factor fac(a) is not zero, with f set for them.
	subsets := func(lead int, fac func(Action) float64, fn func()) {
		var others []int
		for _, i := range vars {
			f[i] = 0
			if i != lead && fac(g.acts[i]) != 0 {
				others = append(others, i)
			}
		}
		if len(others) > 20 {
			g.err = fmt.Errorf("%d accompanying variable actions are too many to combine; at most 20", len(others))
			return
		}
		for mask := 0; mask < 1<<len(others); mask++ {
			for b, i := range others {
				f[i] = 0
				if mask&(1<<b) != 0 {
					f[i] = fac(g.acts[i])
				}
			}
			fn()
			if g.err != nil {
				return
			}
		}
	}
	clear := func() {
		for i := range f {
			f[i] = 0
		}
	}
	gSup, gInf, gQ := r.factor("gamma_G_sup"), r.factor("gamma_G_inf"), r.factor("gamma_Q")
	psi0 := func(a Action) float64 { return gQ * r.psi(0, a) }
	// leading: "G only", then each variable action as the leading one
	// with its factor lf and the others by fac.
	leading := func(clause string, sup, inf float64, lf float64, fac func(Action) float64, gOnly bool) {
		if gOnly {
			clear()
			permSets(sup, inf, func() { g.add(prefix, clause, f, -1) })
		}
		for _, l := range vars {
			clear()
			subsets(l, fac, func() {
				f[l] = lf * g.leadPsi(l)
				permSets(sup, inf, func() { g.add(prefix, clause, f, l) })
			})
		}
	}
	switch g.state {
	case ULS:
		if r.family == en610 {
			leading("EN 1990 (6.10)", gSup, gInf, gQ, psi0, true)
			break
		}
		clear()
		subsets(-1, psi0, func() { permSets(gSup, gInf, func() { g.add(prefix, "EN 1990 (6.10a)", f, -1) }) })
		leading("EN 1990 (6.10b)", r.factor("xi")*gSup, gInf, gQ, psi0, false)
	case EQU:
		q := r.factor("gamma_Q equ")
		leading("EN 1990 (6.10), Table A1.2(A)", r.factor("gamma_G_sup equ"), r.factor("gamma_G_inf equ"), q,
			func(a Action) float64 { return q * r.psi(0, a) }, true)
	case Characteristic:
		leading("EN 1990 (6.14b)", 1, 1, 1, func(a Action) float64 { return r.psi(0, a) }, true)
	case Frequent:
		leading("EN 1990 (6.15b)", 1, 1, 1, func(a Action) float64 { return r.psi(2, a) }, true)
	case QuasiPermanent:
		clear()
		subsets(-1, func(a Action) float64 { return r.psi(2, a) }, func() {
			permSets(1, 1, func() { g.add(prefix, "EN 1990 (6.16b)", f, -1) })
		})
	case AccidentalLS:
		gA, gG := r.factor("gamma_A"), r.factor("gamma_G accidental")
		n := int(r.factor("psi accidental leading"))
		for _, ad := range accs {
			// The leading variable action at ψ1 (or ψ2), the others at ψ2.
			clear()
			f[ad] = gA
			subsets(-1, func(a Action) float64 { return r.psi(2, a) }, func() {
				permSets(gG, gG, func() { g.add(prefix, "EN 1990 (6.11b)", f, -1) })
			})
			for _, l := range vars {
				if r.psi(n, g.acts[l]) == 0 {
					continue
				}
				clear()
				f[ad] = gA
				subsets(l, func(a Action) float64 { return r.psi(2, a) }, func() {
					f[l] = r.psi(n, g.acts[l])
					permSets(gG, gG, func() { g.add(prefix, "EN 1990 (6.11b)", f, l) })
				})
			}
		}
	}
	return g.err
}

// leadPsi is the ψ of the leading action of a serviceability combination:
// 1 in the characteristic one, ψ1 in the frequent one, 1 (the factor
// carries γ) in the others.
func (g *gen) leadPsi(l int) float64 {
	if g.state == Frequent {
		return g.r.psi(1, g.acts[l])
	}
	return 1
}
