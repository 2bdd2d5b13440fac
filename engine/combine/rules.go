package combine

import (
	"fmt"
	"slices"
	"strings"
)

// Class is the class of an action.
type Class uint8

// Classes of actions (EN 1990 4.1.1; the variable ones by their ψ rows of
// Table A1.1).
const (
	Permanent Class = iota
	Imposed
	Snow
	Wind
	Thermal
	Accidental
)

var classNames = [...]string{"permanent", "imposed", "snow", "wind", "thermal", "accidental"}

func (c Class) String() string {
	if int(c) < len(classNames) {
		return classNames[c]
	}
	return "unknown"
}

// ParseClass returns the class named s ("permanent", "imposed", ...).
func ParseClass(s string) (Class, bool) {
	for i, n := range classNames {
		if n == s {
			return Class(i), true
		}
	}
	return 0, false
}

// Action is one action of a sheet as the generator needs it.
type Action struct {
	Name       string
	Class      Class
	Category   byte // Imposed: 'A' … 'H' (EN 1990 Table A1.1), 0 when not given (ASCE/SEI 7 needs none but H for roofs)
	High       bool // Snow: a site above 1000 m
	Favourable bool // Permanent: also taken with its favourable factor
}

// Variable reports whether the action is a variable one.
func (a Action) Variable() bool { return a.Class >= Imposed && a.Class <= Thermal }

// Row is the name of the action's row in EN 1990 Table A1.1, as factor
// keys write it: "imposed B", "snow", "snow high", "wind", "thermal".
func (a Action) Row() string {
	switch a.Class {
	case Imposed:
		return "imposed " + string(a.Category)
	case Snow:
		if a.High {
			return "snow high"
		}
	}
	return a.Class.String()
}

// Factor is one partial or combination factor of a rule set.
type Factor struct {
	Key        string  // as a sheet's factor line names it: "gamma_Q", "psi_0 imposed B"
	Symbol     string  // as a listing prints it: "γQ", "ψ0 imposed B"
	Value      float64 // the value in use
	Source     string  // where it comes from: a clause, or the sheet's line
	FromMemory bool    // the value was not confirmed against the published text
	Replaced   bool    // the sheet replaced the built-in value
	Builtin    float64 // the built-in value (equal to Value unless replaced)
}

// SourceText is the source with "(from memory)" where it applies.
func (f Factor) SourceText() string {
	if f.FromMemory && !strings.Contains(f.Source, "(from memory)") {
		return f.Source + " (from memory)"
	}
	return f.Source
}

// Limit states. Default is the one a check belongs to when it names none.
const (
	ULS            = "uls"
	EQU            = "equ"
	Characteristic = "characteristic"
	Frequent       = "frequent"
	QuasiPermanent = "quasi-permanent"
	AccidentalLS   = "accidental"
	Default        = ULS
)

// Rules is one set of combination rules with its factors. Lookup returns a
// fresh copy, so a sheet's replaced factors stay with that sheet.
type Rules struct {
	Name    string   // as the sheet's header writes it: "EN 1990 6.10"
	Title   string   // in words, with the source
	States  []string // the limit states it has combinations for
	family  family
	factors []Factor
}

type family uint8

// Standard is the standard the rules follow, "EN 1990" or "ASCE/SEI 7":
// rules of one standard may replace each other (6.10 for 6.10a/b, LRFD
// for ASD), rules of two may not.
func (r *Rules) Standard() string {
	if r.family == asceLRFD || r.family == asceASD {
		return "ASCE/SEI 7"
	}
	return "EN 1990"
}

const (
	en610 family = iota
	en610ab
	asceLRFD
	asceASD
)

// Source strings of the built-in data.
const (
	srcA11  = "EN 1990 Table A1.1"
	srcA12B = "EN 1990 Table A1.2(B)"
	srcA12A = "EN 1990 Table A1.2(A)"
)

// psiRows is EN 1990 Table A1.1: ψ0, ψ1, ψ2 of each row (REFERENCES D6
// gives all but categories F and G, which are from memory).
var psiRows = []struct {
	row        string
	psi        [3]float64
	fromMemory bool
}{
	{"imposed A", [3]float64{0.7, 0.5, 0.3}, false}, // domestic, residential
	{"imposed B", [3]float64{0.7, 0.5, 0.3}, false}, // offices
	{"imposed C", [3]float64{0.7, 0.7, 0.6}, false}, // congregation areas
	{"imposed D", [3]float64{0.7, 0.7, 0.6}, false}, // shopping areas
	{"imposed E", [3]float64{1.0, 0.9, 0.8}, false}, // storage areas
	{"imposed F", [3]float64{0.7, 0.7, 0.6}, true},  // traffic, vehicle weight ≤ 30 kN (from memory)
	{"imposed G", [3]float64{0.7, 0.5, 0.3}, true},  // traffic, 30 kN < vehicle weight ≤ 160 kN (from memory)
	{"imposed H", [3]float64{0, 0, 0}, false},       // roofs
	{"snow", [3]float64{0.5, 0.2, 0}, false},        // sites at or below 1000 m
	{"snow high", [3]float64{0.7, 0.5, 0.2}, false}, // sites above 1000 m
	{"wind", [3]float64{0.6, 0.2, 0}, false},
	{"thermal", [3]float64{0.6, 0.5, 0}, false}, // temperature (non-fire)
}

// enFactors returns the factors of EN 1990 rules: Table A1.2(B) as in
// REFERENCES D7; Table A1.2(A) (EQU) and the accidental combination (6.11b)
// from memory.
func enFactors() []Factor {
	fs := []Factor{
		{Key: "gamma_G_sup", Symbol: "γG,sup", Value: 1.35, Source: srcA12B},
		{Key: "gamma_G_inf", Symbol: "γG,inf", Value: 1.00, Source: srcA12B},
		{Key: "gamma_Q", Symbol: "γQ", Value: 1.5, Source: srcA12B},
		{Key: "xi", Symbol: "ξ", Value: 0.85, Source: srcA12B + ", (6.10b)"},
		{Key: "gamma_G_sup equ", Symbol: "γG,sup (EQU)", Value: 1.10, Source: srcA12A, FromMemory: true},
		{Key: "gamma_G_inf equ", Symbol: "γG,inf (EQU)", Value: 0.90, Source: srcA12A, FromMemory: true},
		{Key: "gamma_Q equ", Symbol: "γQ (EQU)", Value: 1.50, Source: srcA12A, FromMemory: true},
		{Key: "gamma_A", Symbol: "γA", Value: 1.0, Source: "EN 1990 6.4.3.3, (6.11b)", FromMemory: true},
		{Key: "gamma_G accidental", Symbol: "γG (accidental)", Value: 1.0, Source: "EN 1990 6.4.3.3, (6.11b)", FromMemory: true},
		{Key: "psi accidental leading", Symbol: "ψ of the leading action (accidental)", Value: 1,
			Source: "EN 1990 6.4.3.3: ψ1 (1) or ψ2 (2), the national annex chooses", FromMemory: true},
	}
	for _, r := range psiRows {
		for n := range 3 {
			fs = append(fs, Factor{Key: fmt.Sprintf("psi_%d %s", n, r.row), Symbol: fmt.Sprintf("ψ%d %s", n, r.row),
				Value: r.psi[n], Source: srcA11, FromMemory: r.fromMemory})
		}
	}
	for i := range fs {
		fs[i].Builtin = fs[i].Value
	}
	return fs
}

var enStates = []string{ULS, EQU, Characteristic, Frequent, QuasiPermanent, AccidentalLS}

// Names lists the rule sets a sheet's `combinations:` line may name.
func Names() []string {
	return []string{"EN 1990 6.10", "EN 1990 6.10a/b", "ASCE 7 LRFD", "ASCE 7 ASD"}
}

// Lookup returns a fresh copy of the named rule set; the name is compared
// with runs of spaces taken as one.
func Lookup(name string) (*Rules, bool) {
	switch strings.Join(strings.Fields(name), " ") {
	case "EN 1990 6.10":
		return &Rules{Name: "EN 1990 6.10", Title: "EN 1990, fundamental combination (6.10); partial factors of Table A1.2(B), ψ of Table A1.1",
			States: enStates, family: en610, factors: enFactors()}, true
	case "EN 1990 6.10a/b":
		return &Rules{Name: "EN 1990 6.10a/b", Title: "EN 1990, the less favourable of (6.10a) and (6.10b); partial factors of Table A1.2(B), ψ of Table A1.1",
			States: enStates, family: en610ab, factors: enFactors()}, true
	case "ASCE 7 LRFD":
		return &Rules{Name: "ASCE 7 LRFD", Title: "ASCE/SEI 7, basic combinations for strength design, §2.3.1 (seismic combinations not included)",
			States: []string{ULS}, family: asceLRFD}, true
	case "ASCE 7 ASD":
		return &Rules{Name: "ASCE 7 ASD", Title: "ASCE/SEI 7, basic combinations for allowable stress design, §2.4.1 (seismic combinations not included)",
			States: []string{ULS}, family: asceASD}, true
	}
	return nil, false
}

// TakesFavourable reports whether the rules take a permanent action marked
// favourable at its favourable factor in turn (EN 1990); ASCE/SEI 7 writes
// its 0.9D and 0.6D combinations for every permanent load instead.
func (r *Rules) TakesFavourable() bool { return r.family == en610 || r.family == en610ab }

// StateLabel is how a listing names limit state st under these rules:
// the default one of ASCE/SEI 7 is "strength" (LRFD) or "allowable
// stress" (ASD), not "uls".
func (r *Rules) StateLabel(st string) string {
	if st == ULS {
		switch r.family {
		case asceLRFD:
			return "strength"
		case asceASD:
			return "allowable stress"
		}
	}
	return st
}

// Factors returns the factors of the rule set (none for ASCE/SEI 7, whose
// factors are written in its combinations).
func (r *Rules) Factors() []Factor { return slices.Clone(r.factors) }

// FactorKeys returns the keys a factor line may name.
func (r *Rules) FactorKeys() []string {
	keys := make([]string, len(r.factors))
	for i, f := range r.factors {
		keys[i] = f.Key
	}
	return keys
}

// Set replaces the factor key with v; source says where the new value
// comes from (the sheet's line and its reference).
func (r *Rules) Set(key string, v float64, source string) error {
	if r.family == asceLRFD || r.family == asceASD {
		return fmt.Errorf("the factors of %s are part of its combinations; Sheaf does not replace them", r.Name)
	}
	i := slices.IndexFunc(r.factors, func(f Factor) bool { return f.Key == key })
	if i < 0 {
		return fmt.Errorf("%s has no factor `%s`", r.Name, key)
	}
	if !(v >= 0) || v > 10 {
		return fmt.Errorf("a factor is a number from 0 to 10; %g is not", v)
	}
	if key == "psi accidental leading" && v != 1 && v != 2 {
		return fmt.Errorf("`psi accidental leading` is 1 (ψ1) or 2 (ψ2), not %g", v)
	}
	f := &r.factors[i]
	f.Value, f.Source, f.FromMemory, f.Replaced = v, source, false, true
	return nil
}

// factor returns the value of the factor key (which must exist).
func (r *Rules) factor(key string) float64 {
	for _, f := range r.factors {
		if f.Key == key {
			return f.Value
		}
	}
	panic("combine: no factor " + key) // a programming error: keys are constants of this package
}

// psi returns ψn of action a.
func (r *Rules) psi(n int, a Action) float64 {
	return r.factor(fmt.Sprintf("psi_%d %s", n, a.Row()))
}

// Used returns the factors that the combinations of acts in the limit
// states states use, in the order of the rule set's table.
func (r *Rules) Used(acts []Action, states []string) []Factor {
	rows := map[string]bool{}
	anyPerm, anyFav, anyVar, anyAcc := false, false, false, false
	for _, a := range acts {
		switch {
		case a.Class == Permanent:
			anyPerm = true
			anyFav = anyFav || a.Favourable
		case a.Class == Accidental:
			anyAcc = true
		default:
			anyVar = true
			rows[a.Row()] = true
		}
	}
	in := func(sts ...string) bool {
		for _, s := range sts {
			if slices.Contains(states, s) {
				return true
			}
		}
		return false
	}
	acc := anyAcc && in(AccidentalLS)
	var out []Factor
	for _, f := range r.factors {
		use := false
		switch f.Key {
		case "gamma_G_sup":
			use = anyPerm && in(ULS)
		case "gamma_G_inf":
			use = anyFav && in(ULS)
		case "gamma_Q":
			use = anyVar && in(ULS)
		case "xi":
			use = anyPerm && r.family == en610ab && in(ULS)
		case "gamma_G_sup equ":
			use = anyPerm && in(EQU)
		case "gamma_G_inf equ":
			use = anyFav && in(EQU)
		case "gamma_Q equ":
			use = anyVar && in(EQU)
		case "gamma_A", "gamma_G accidental":
			use = acc
		case "psi accidental leading":
			use = acc && anyVar
		default:
			n, row, _ := strings.Cut(f.Key, " ")
			switch n {
			case "psi_0":
				use = rows[row] && in(ULS, EQU, Characteristic)
			case "psi_1":
				use = rows[row] && (in(Frequent) || acc)
			case "psi_2":
				use = rows[row] && (in(Frequent, QuasiPermanent) || acc)
			}
		}
		if use {
			out = append(out, f)
		}
	}
	return out
}
