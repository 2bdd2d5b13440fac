package units

import (
	"fmt"
	"sync"
)

// entry is one line of the catalogue listing: a symbol as Parse reads it, the
// quantity it is listed under and, for compound symbols, the system.
type entry struct {
	sym      string
	quantity string
}

// listing is the order of `sheaf units`: by quantity, metric before US,
// small before large. Every symbol here must parse; build panics otherwise,
// so a typo cannot ship.
var listing = []entry{
	{"µm", "length"}, {"mm", "length"}, {"cm", "length"}, {"m", "length"}, {"km", "length"},
	{"in", "length"}, {"ft", "length"}, {"yd", "length"}, {"mi", "length"},
	{"mm^2", "area"}, {"cm^2", "area"}, {"m^2", "area"}, {"in^2", "area"}, {"ft^2", "area"},
	{"mm^3", "volume"}, {"cm^3", "volume"}, {"m^3", "volume"}, {"in^3", "volume"}, {"ft^3", "volume"},
	{"mm^4", "second moment of area"}, {"cm^4", "second moment of area"}, {"m^4", "second moment of area"},
	{"in^4", "second moment of area"},
	{"g", "mass"}, {"kg", "mass"}, {"t", "mass"}, {"lb", "mass"},
	{"s", "time"}, {"ms", "time"}, {"min", "time"}, {"h", "time"},
	{"K", "temperature difference"}, {"degC", "temperature difference"}, {"degF", "temperature difference"},
	{"N", "force"}, {"kN", "force"}, {"MN", "force"}, {"daN", "force"}, {"lbf", "force"}, {"kip", "force"},
	{"N/mm", "force per length"}, {"kN/m", "force per length"}, {"plf", "force per length"},
	{"klf", "force per length"}, {"kip/ft", "force per length"}, {"kip/in", "force per length"},
	{"Pa", "stress"}, {"kPa", "stress"}, {"MPa", "stress"}, {"GPa", "stress"}, {"N/mm^2", "stress"},
	{"psi", "stress"}, {"ksi", "stress"},
	{"kN/m^2", "area load"}, {"psf", "area load"},
	{"kN/m^3", "weight density"}, {"pcf", "weight density"}, {"lbf/ft^3", "weight density"},
	{"kg/m^3", "mass density"}, {"t/m^3", "mass density"}, {"lb/ft^3", "mass density"},
	{"N*mm", "moment"}, {"N*m", "moment"}, {"kN*m", "moment"}, {"kN*mm", "moment"},
	{"lbf*ft", "moment"}, {"kip*in", "moment"}, {"kip*ft", "moment"},
	{"kN*m^2", "flexural rigidity"}, {"N*mm^2", "flexural rigidity"}, {"kip*in^2", "flexural rigidity"},
	{"1/K", "thermal expansion coefficient"}, {"1/degF", "thermal expansion coefficient"},
	{"m/s", "velocity"}, {"ft/s", "velocity"},
	{"m/s^2", "acceleration"}, {"ft/s^2", "acceleration"},
	{"J", "energy"}, {"kJ", "energy"}, {"MJ", "energy"},
	{"W", "power"}, {"kW", "power"},
	{"Hz", "frequency"},
	{"1", "dimensionless"}, {"%", "dimensionless"}, {"‰", "dimensionless"}, {"µε", "strain"},
	{"rad", "angle"}, {"deg", "angle"}, {"gon", "angle"},
	{"A", "electric current"}, {"mol", "amount of substance"}, {"cd", "luminous intensity"},
}

// quantities names dimensions for `--dim` and for the Quantity of a parsed
// unit. The first name given for a dimension is its default quantity.
var quantities = []struct {
	name string
	dim  Dim
}{
	{"dimensionless", None},
	{"strain", None},
	{"ratio", None},
	{"angle", dAngle},
	{"plane angle", dAngle},
	{"length", dLength},
	{"displacement", dLength},
	{"area", dimOf(2, 0, 0, 0, 0, 0, 0)},
	{"volume", dimOf(3, 0, 0, 0, 0, 0, 0)},
	{"section modulus", dimOf(3, 0, 0, 0, 0, 0, 0)},
	{"second moment of area", dimOf(4, 0, 0, 0, 0, 0, 0)},
	{"mass", dMass},
	{"time", dTime},
	{"temperature difference", dTemp},
	{"temperature", dTemp},
	{"force", dForce},
	{"axial rigidity", dForce},
	{"force per length", dLineLoad},
	{"line load", dLineLoad},
	{"axial stiffness", dLineLoad},
	{"stress", dStress},
	{"pressure", dStress},
	{"modulus", dStress},
	{"area load", dStress},
	{"weight density", dWeightD},
	{"unit weight", dWeightD},
	{"mass density", dimOf(-3, 1, 0, 0, 0, 0, 0)},
	{"density", dimOf(-3, 1, 0, 0, 0, 0, 0)},
	{"moment", dEnergy},
	{"energy", dEnergy},
	{"flexural rigidity", dimOf(3, 1, -2, 0, 0, 0, 0)},
	{"thermal expansion coefficient", dimOf(0, 0, 0, 0, -1, 0, 0)},
	{"expansion coefficient", dimOf(0, 0, 0, 0, -1, 0, 0)},
	{"velocity", dimOf(1, 0, -1, 0, 0, 0, 0)},
	{"acceleration", dimOf(1, 0, -2, 0, 0, 0, 0)},
	{"power", dPower},
	{"frequency", dFreq},
	{"electric current", dCurrent},
	{"amount of substance", dAmount},
	{"luminous intensity", dLuminous},
}

// tables are the catalogue and every index built from it.
type tables struct {
	catalogue      []Unit          // in listing order
	catalogueIndex map[string]Unit // canonical symbol -> entry
	quantityIndex  map[string]Dim  // quantity name -> dimension
	defaultQty     map[Dim]string  // dimension -> default quantity name
	suggestions    []string        // spellings offered by "did you mean"
	quantityNames  []string        // quantity names in listing order, for "did you mean"
	preferred      map[System]map[Dim]Unit
}

// tab returns the tables, built once on first use in one ordered step
// (build). The package has no init function: whatever calls Parse first,
// even a package-level variable of another file or package, finds the
// tables whole, and no order of files or of initialisation can change what
// Parse returns.
var tab = sync.OnceValue(build)

// build makes the tables in order: quantity names, then the catalogue
// (each symbol parsed without the tables, its quantity from the listing),
// then the spellings "did you mean" offers, then the preferred display
// units, parsed against the tables made so far. It panics on a listing
// that does not parse, so a typo cannot ship.
func build() *tables {
	t := &tables{
		quantityIndex: make(map[string]Dim, len(quantities)),
		defaultQty:    make(map[Dim]string, len(quantities)),
	}
	for _, q := range quantities {
		t.quantityNames = append(t.quantityNames, q.name)
		t.quantityIndex[q.name] = q.dim
		if _, seen := t.defaultQty[q.dim]; !seen {
			t.defaultQty[q.dim] = q.name
		}
	}
	t.catalogueIndex = make(map[string]Unit, len(listing))
	t.catalogue = make([]Unit, 0, len(listing))
	for _, e := range listing {
		u, err := parse(e.sym, nil)
		if err != nil {
			panic(fmt.Sprintf("units: catalogue symbol %q: %v", e.sym, err))
		}
		if u.Symbol != e.sym {
			panic(fmt.Sprintf("units: catalogue symbol %q normalises to %q", e.sym, u.Symbol))
		}
		if d, ok := t.quantityIndex[e.quantity]; !ok || d != u.Dim {
			panic(fmt.Sprintf("units: catalogue symbol %q is not a %s", e.sym, e.quantity))
		}
		u.Quantity = e.quantity
		t.catalogue = append(t.catalogue, u)
		t.catalogueIndex[u.Symbol] = u
		t.suggestions = append(t.suggestions, u.Symbol)
	}
	for _, a := range atoms {
		if _, listed := t.catalogueIndex[a.sym]; !listed {
			panic(fmt.Sprintf("units: atom %q is missing from the listing", a.sym))
		}
		t.suggestions = append(t.suggestions, a.aliases...)
	}
	t.preferred = buildPreferred(t)
	return t
}

// Catalogue returns the listed units in listing order (by quantity, metric
// before US). The slice is a copy; callers may keep or sort it.
func Catalogue() []Unit {
	return append([]Unit(nil), tab().catalogue...)
}

// Lookup finds a unit by a single name: a catalogue symbol ("kN", "N/mm^2",
// "kip*ft"), an alias ("tonne", "°C", "ue") or an SI-prefixed form of a
// prefixable unit ("nm", "GN", "daN"). It does not read general expressions;
// use Parse for those.
func Lookup(symbol string) (Unit, bool) {
	t := tab()
	if u, ok := t.catalogueIndex[symbol]; ok {
		return u, true
	}
	sym, a, f, ok, _ := resolveName(symbol)
	if !ok {
		return Unit{}, false
	}
	if u, ok := t.catalogueIndex[sym]; ok {
		return u, true
	}
	return Unit{Symbol: sym, Dim: a.dim, Factor: f, Quantity: t.defaultQty[a.dim], System: a.system}, true
}
