package units

import "math"

// dimOf builds a Dim from whole exponents of L, M, T, I, Θ, N, J (no angle;
// dAngle is the dimension of a plane angle).
func dimOf(l, m, t, i, th, n, j int8) Dim {
	return Dim{2 * l, 2 * m, 2 * t, 2 * i, 2 * th, 2 * n, 2 * j, 0}
}

// Exact definitions the customary units rest on.
const (
	// Source: 1959 international yard and pound agreement; NIST SP 811 (2008), App. B.
	inch  = 0.0254     // m, exact
	foot  = 0.3048     // m, exact
	yard  = 0.9144     // m, exact
	mile  = 1609.344   // m, exact (international mile)
	pound = 0.45359237 // kg, exact
	// Source: 3rd CGPM (1901); NIST SP 811 (2008), App. B.
	standardGravity = 9.80665 // m/s², exact
	poundForce      = pound * standardGravity
)

// atom is a unit name the parser knows without operators: a base of the
// catalogue. Prefixable atoms take the SI prefixes of the prefixes table.
type atom struct {
	sym        string   // canonical symbol
	aliases    []string // other spellings accepted on input
	dim        Dim
	factor     float64 // SI value of one unit
	system     System
	prefixable bool
}

var (
	dLength   = dimOf(1, 0, 0, 0, 0, 0, 0)
	dMass     = dimOf(0, 1, 0, 0, 0, 0, 0)
	dTime     = dimOf(0, 0, 1, 0, 0, 0, 0)
	dCurrent  = dimOf(0, 0, 0, 1, 0, 0, 0)
	dTemp     = dimOf(0, 0, 0, 0, 1, 0, 0)
	dAmount   = dimOf(0, 0, 0, 0, 0, 1, 0)
	dLuminous = dimOf(0, 0, 0, 0, 0, 0, 1)
	dForce    = dimOf(1, 1, -2, 0, 0, 0, 0)
	dStress   = dimOf(-1, 1, -2, 0, 0, 0, 0)
	dEnergy   = dimOf(2, 1, -2, 0, 0, 0, 0)
	dPower    = dimOf(2, 1, -3, 0, 0, 0, 0)
	dLineLoad = dimOf(0, 1, -2, 0, 0, 0, 0)
	dWeightD  = dimOf(-2, 1, -2, 0, 0, 0, 0)
	dFreq     = dimOf(0, 0, -1, 0, 0, 0, 0)
	dAngle    = Base(Angle)
)

// atoms is every unit name the parser resolves. Order does not matter here;
// the listing order of `sheaf units` is the listing table in catalogue.go.
var atoms = []atom{
	// SI base units and the coherent derived units engineers use.
	{sym: "m", dim: dLength, factor: 1, system: Metric, prefixable: true},
	{sym: "g", dim: dMass, factor: 1e-3, system: Metric, prefixable: true},
	{sym: "s", aliases: []string{"sec"}, dim: dTime, factor: 1, system: Neutral, prefixable: true},
	{sym: "A", dim: dCurrent, factor: 1, system: Metric, prefixable: true},
	{sym: "K", dim: dTemp, factor: 1, system: Metric, prefixable: true},
	{sym: "mol", dim: dAmount, factor: 1, system: Metric, prefixable: true},
	{sym: "cd", dim: dLuminous, factor: 1, system: Metric, prefixable: true},
	{sym: "N", dim: dForce, factor: 1, system: Metric, prefixable: true},
	{sym: "Pa", dim: dStress, factor: 1, system: Metric, prefixable: true},
	{sym: "J", dim: dEnergy, factor: 1, system: Metric, prefixable: true},
	{sym: "W", dim: dPower, factor: 1, system: Metric, prefixable: true},
	{sym: "Hz", dim: dFreq, factor: 1, system: Neutral, prefixable: true},
	// Plane angle is a dimension of its own in Sheaf (see dim.go); the radian
	// is its coherent unit.
	{sym: "rad", dim: dAngle, factor: 1, system: Neutral, prefixable: true},

	// Metric units outside the SI that structural practice keeps.
	{sym: "t", aliases: []string{"tonne"}, dim: dMass, factor: 1000, system: Metric},
	{sym: "min", dim: dTime, factor: 60, system: Neutral},
	{sym: "h", aliases: []string{"hr"}, dim: dTime, factor: 3600, system: Neutral},
	// Temperature intervals only: 1 degC of difference is 1 K, 1 degF is 5/9 K.
	{sym: "degC", aliases: []string{"°C", "℃"}, dim: dTemp, factor: 1, system: Metric},
	{sym: "degF", aliases: []string{"°F", "℉"}, dim: dTemp, factor: 5.0 / 9.0, system: US},
	// Source: SI Brochure (BIPM 2019) Table 8: 1° = (π/180) rad.
	{sym: "deg", aliases: []string{"°"}, dim: dAngle, factor: math.Pi / 180, system: Neutral},
	// Source: 400 gon make a full turn, so 1 gon = (π/200) rad; NIST SP 811
	// (2008) App. B.8 prints 1.570 796 E-02 rad for the gon (from memory).
	{sym: "gon", dim: dAngle, factor: math.Pi / 200, system: Neutral},
	{sym: "%", aliases: []string{"percent"}, dim: None, factor: 0.01, system: Neutral},
	{sym: "‰", aliases: []string{"permille"}, dim: None, factor: 0.001, system: Neutral},
	{sym: "µε", aliases: []string{"με", "uε", "ue", "microstrain"}, dim: None, factor: 1e-6, system: Neutral},

	// US customary units.
	{sym: "in", aliases: []string{"inch"}, dim: dLength, factor: inch, system: US},
	{sym: "ft", aliases: []string{"foot", "feet"}, dim: dLength, factor: foot, system: US},
	{sym: "yd", dim: dLength, factor: yard, system: US},
	{sym: "mi", dim: dLength, factor: mile, system: US},
	{sym: "lb", aliases: []string{"lbm"}, dim: dMass, factor: pound, system: US},
	{sym: "lbf", dim: dForce, factor: poundForce, system: US},
	{sym: "kip", aliases: []string{"kips"}, dim: dForce, factor: 1000 * poundForce, system: US},
	{sym: "psi", dim: dStress, factor: poundForce / (inch * inch), system: US},
	{sym: "ksi", dim: dStress, factor: 1000 * poundForce / (inch * inch), system: US},
	{sym: "psf", dim: dStress, factor: poundForce / (foot * foot), system: US},
	// pcf is the weight density lbf/ft³ (unit weight, as US practice means it).
	// The mass density pound per cubic foot is written lb/ft^3.
	{sym: "pcf", dim: dWeightD, factor: poundForce / (foot * foot * foot), system: US},
	{sym: "plf", dim: dLineLoad, factor: poundForce / foot, system: US},
	{sym: "klf", dim: dLineLoad, factor: 1000 * poundForce / foot, system: US},
}

// prefix is an SI prefix. The micro prefix is stored as µ (U+00B5) and also
// read as μ (U+03BC) and as u, for keyboards without it.
type prefix struct {
	sym    string
	factor float64
}

// prefixes in matching order: the two-letter "da" before the one-letter ones.
var prefixes = []prefix{
	{"da", 1e1},
	{"p", 1e-12}, {"n", 1e-9}, {"µ", 1e-6}, {"μ", 1e-6}, {"u", 1e-6},
	{"m", 1e-3}, {"c", 1e-2}, {"d", 1e-1}, {"h", 1e2},
	{"k", 1e3}, {"M", 1e6}, {"G", 1e9}, {"T", 1e12},
}

// canonicalPrefix maps the micro spellings to µ.
func canonicalPrefix(p string) string {
	if p == "u" || p == "μ" {
		return "µ"
	}
	return p
}

// atomIndex maps every spelling of an atom to it.
var atomIndex = func() map[string]*atom {
	ix := make(map[string]*atom, 2*len(atoms))
	for i := range atoms {
		a := &atoms[i]
		ix[a.sym] = a
		for _, s := range a.aliases {
			ix[s] = a
		}
	}
	return ix
}()

// resolveName turns a unit name (no operators) into its canonical symbol,
// dimension, factor and system. known is set when the name is a
// non-prefixable atom under an SI prefix, so the error can say so.
func resolveName(name string) (sym string, a *atom, factor float64, ok bool, noPrefix *atom) {
	if a, found := atomIndex[name]; found {
		return a.sym, a, a.factor, true, nil
	}
	for _, p := range prefixes {
		if len(name) <= len(p.sym) || name[:len(p.sym)] != p.sym {
			continue
		}
		base, found := atomIndex[name[len(p.sym):]]
		if !found {
			continue
		}
		if !base.prefixable {
			noPrefix = base
			continue
		}
		return canonicalPrefix(p.sym) + base.sym, base, p.factor * base.factor, true, nil
	}
	return "", nil, 0, false, noPrefix
}
