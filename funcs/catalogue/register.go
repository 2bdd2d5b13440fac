package catalogue

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/section"
)

const family = "catalogue"

func num(d units.Dim) *funcs.Type { return funcs.Num(d) }

func field(name string, d units.Dim, doc string) funcs.Field {
	return funcs.Field{Name: name, Type: funcs.Num(d), Doc: doc}
}

// Record types of the lookups. Material records carry E (and alpha, f_y
// where they apply) under the names composite parts read.
var (
	ThreadType = funcs.RecordOf("thread",
		field("d", dimL, "nominal diameter, m"),
		field("P", dimL, "pitch, m"),
		field("A_s", dimA, "tensile stress area π/4·(d − 0.9382·P)², m²"),
	)
	BoltClassType = funcs.RecordOf("bolt_class",
		field("f_yb", dimStress, "nominal yield strength, Pa"),
		field("f_ub", dimStress, "nominal ultimate tensile strength, Pa"),
	)
	SteelType = funcs.RecordOf("steel",
		field("E", dimStress, "modulus of elasticity, Pa"),
		field("G", dimStress, "shear modulus E/(2(1 + ν)), Pa"),
		field("nu", units.None, "Poisson's ratio"),
		field("alpha", dimPerK, "coefficient of thermal expansion, 1/K"),
		field("rho", dimRho, "density, kg/m³"),
		field("f_y", dimStress, "yield strength for the thickness asked, Pa"),
		field("f_u", dimStress, "ultimate tensile strength for the thickness asked, Pa"),
		field("t_max", dimL, "upper end of the thickness band used, m"),
	)
	AluminiumType = funcs.RecordOf("aluminium",
		field("E", dimStress, "modulus of elasticity, Pa"),
		field("G", dimStress, "shear modulus E/(2(1 + ν)), Pa"),
		field("nu", units.None, "Poisson's ratio"),
		field("alpha", dimPerK, "coefficient of thermal expansion, 1/K"),
		field("rho", dimRho, "density, kg/m³"),
		field("f_o", dimStress, "0.2 % proof strength for the thickness asked, Pa"),
		field("f_y", dimStress, "the same value as f_o, under the name composite parts read, Pa"),
		field("f_u", dimStress, "ultimate tensile strength for the thickness asked, Pa"),
		field("t_max", dimL, "upper end of the thickness band used, m"),
	)
	ConcreteType = funcs.RecordOf("concrete",
		field("E", dimStress, "the secant modulus E_cm, under the name composite parts read, Pa"),
		field("alpha", dimPerK, "coefficient of thermal expansion 10e-6 1/K (EN 1992-1-1 §3.1.3(5), from memory)"),
		field("nu", units.None, "Poisson's ratio 0.2, uncracked (EN 1992-1-1 §3.1.3(4))"),
		field("f_ck", dimStress, "characteristic cylinder strength, Pa"),
		field("f_ck_cube", dimStress, "characteristic cube strength, Pa"),
		field("f_cm", dimStress, "mean strength f_ck + 8 MPa, Pa"),
		field("f_ctm", dimStress, "mean axial tensile strength, Pa"),
		field("E_cm", dimStress, "secant modulus 22·(f_cm/10)^0.3 GPa, Pa"),
		field("eps_c1", units.None, "strain at peak stress (non-linear analysis)"),
		field("eps_cu1", units.None, "ultimate strain (non-linear analysis)"),
		field("eps_c2", units.None, "strain at peak stress of the parabola-rectangle diagram"),
		field("eps_cu2", units.None, "ultimate strain of the parabola-rectangle diagram"),
		field("n", units.None, "exponent of the parabola"),
	)
	RebarType = funcs.RecordOf("rebar",
		field("E", dimStress, "modulus of elasticity, Pa"),
		field("f_yk", dimStress, "characteristic yield strength, Pa"),
		field("f_y", dimStress, "the same value as f_yk, under the name composite parts read, Pa"),
		field("eps_uk", units.None, "characteristic strain at maximum force"),
		field("k", units.None, "ratio (f_t/f_y)_k, lower limit"),
	)
)

// find looks a key up in the active catalogue.
func find(ns string, v funcs.Value) ([]*Entry, error) {
	key, ok := v.(string)
	if !ok {
		return nil, fmt.Errorf("expected the key as text, e.g. %s(\"…\")", ns)
	}
	c, err := Active()
	if err != nil {
		return nil, err
	}
	return c.Find(ns, key)
}

// band picks the row of a banded key for thickness t.
func band(rows []*Entry, t float64, what string) (*Entry, error) {
	if !(t > 0) || math.IsInf(t, 0) {
		return nil, fmt.Errorf("the thickness t must be a positive length, got %g m", t)
	}
	for _, e := range rows {
		if t <= e.Vals["t_max"]*(1+1e-12) {
			return e, nil
		}
	}
	last := rows[len(rows)-1]
	return nil, fmt.Errorf("%s %s is tabulated up to t = %g mm; t = %g mm is outside the table (%s)", what, last.Key, last.Vals["t_max"]*1e3, t*1e3, last.Table.Source)
}

func record(t *funcs.Type, vals ...float64) *funcs.RecordValue {
	fs := make([]funcs.Value, len(vals))
	for i, v := range vals {
		fs[i] = v
	}
	return &funcs.RecordValue{Type: t, Fields: fs}
}

// ConcreteProps are the properties of EN 1992-1-1 Table 3.1 for f_ck, in SI.
type ConcreteProps struct {
	Fcm, Fctm, Ecm, EpsC1, EpsCu1, EpsC2, EpsCu2, N float64
}

// Concrete evaluates the formulas of EN 1992-1-1:2004 Table 3.1 (the
// formulas, not the rounded rows) for f_ck in Pa, 12 to 90 MPa:
//
//	f_cm = f_ck + 8 MPa
//	f_ctm = 0.30·f_ck^(2/3) up to C50/60, else 2.12·ln(1 + f_cm/10)
//	E_cm = 22·(f_cm/10)^0.3 GPa
//	ε_c1 = 0.7·f_cm^0.31 ‰ ≤ 2.8 ‰
//	ε_cu1 = 3.5 ‰, above C50/60 2.8 + 27·((98 − f_cm)/100)^4 ‰
//	ε_c2 = 2.0 ‰, above 2.0 + 0.085·(f_ck − 50)^0.53 ‰
//	ε_cu2 = 3.5 ‰, above 2.6 + 35·((90 − f_ck)/100)^4 ‰
//	n = 2.0, above 1.4 + 23.4·((90 − f_ck)/100)^4
//
// with strengths in MPa inside the formulas.
func Concrete(fckPa float64) (ConcreteProps, error) {
	fck := fckPa / 1e6
	if !(fck >= 12 && fck <= 90) {
		return ConcreteProps{}, fmt.Errorf("f_ck = %g MPa is outside 12 … 90 MPa, the range of EN 1992-1-1 Table 3.1", fck)
	}
	fcm := fck + 8
	p := ConcreteProps{Fcm: fcm * 1e6}
	if fck <= 50 {
		p.Fctm = 0.30 * math.Pow(fck, 2.0/3) * 1e6
		p.EpsCu1, p.EpsC2, p.EpsCu2, p.N = 3.5e-3, 2.0e-3, 3.5e-3, 2.0
	} else {
		p.Fctm = 2.12 * math.Log(1+fcm/10) * 1e6
		p.EpsCu1 = (2.8 + 27*math.Pow((98-fcm)/100, 4)) * 1e-3
		p.EpsC2 = (2.0 + 0.085*math.Pow(fck-50, 0.53)) * 1e-3
		p.EpsCu2 = (2.6 + 35*math.Pow((90-fck)/100, 4)) * 1e-3
		p.N = 1.4 + 23.4*math.Pow((90-fck)/100, 4)
	}
	p.Ecm = 22e9 * math.Pow(fcm/10, 0.3)
	p.EpsC1 = math.Min(0.7*math.Pow(fcm, 0.31), 2.8) * 1e-3
	return p, nil
}

// StressArea is the tensile stress area of an ISO metric thread,
// A_s = π/4·(d − 0.9382·P)² (ISO 898-1; the mean of the pitch and minor
// diameters d_2 = d − 0.6495P and d_3 = d − 1.2269P, from memory).
func StressArea(d, p float64) float64 {
	x := d - 0.9382*p
	return math.Pi / 4 * x * x
}

// tablesDoc lists the shipped tables of a lookup with their sources, and
// marks those typed from memory.
func tablesDoc(ns string) (doc, source string) {
	var docs, srcs []string
	for _, t := range Shipped().Tables {
		if t.Kind.NS != ns {
			continue
		}
		mem := ""
		if t.Memory {
			mem = " (from memory)"
		}
		keys := []string{}
		for _, e := range t.Rows {
			if len(keys) == 0 || keys[len(keys)-1] != e.Key {
				keys = append(keys, e.Key)
			}
		}
		span := keys[0]
		if len(keys) > 1 {
			span += " … " + keys[len(keys)-1]
		}
		docs = append(docs, fmt.Sprintf("%s: %s, %d keys%s", t.Title, span, len(keys), mem))
		srcs = append(srcs, t.Source+mem)
	}
	slices.Sort(srcs)
	srcs = slices.Compact(srcs)
	return "Shipped tables — " + strings.Join(docs, "; ") + ". A firm adds tables in *" + FileExt +
		" files in the folders of " + EnvDirs + " (SPEC.md, Catalogue files); they may add keys, never replace one.", strings.Join(srcs, "; ")
}

func text(name, doc string) funcs.Param {
	return funcs.Param{Name: name, Type: funcs.StringType, Doc: doc}
}

func init() {
	reg := func(d *funcs.Def, ns string) {
		doc, src := tablesDoc(ns)
		d.Family = family
		d.Doc += " Keys are compared without spaces and case (\"heb260\" is \"HEB 260\"); an unknown key is an error that names the nearest sizes. " + doc
		d.Source = src + "; values marked (from memory) were typed without the published text at hand: check them against the edition you work to"
		if strings.Contains(doc, "(from memory)") {
			d.Summary += " (values from memory: see sheaf funcs " + d.Name + ")"
		}
		funcs.Register(d)
	}
	reg(&funcs.Def{
		Name:   "section",
		Params: []funcs.Param{text("key", "designation, e.g. \"HEB 260\", \"IPE 300\", \"CHS 219.1x10\", \"SHS 200x200x10\", \"HSS6x6x1/4\", \"W14x90\"")},
		Result: section.Type,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("section", a[0])
			if err != nil {
				return nil, err
			}
			return section.Record(rows[0].shape), nil
		},
		Summary: "a standard steel section from the catalogue, its properties computed from its dimensions",
		Doc: "The section of a standard rolled profile or hollow section, centred at the origin with the major axis along " +
			"y, usable wherever a section is (composite parts, cut, place). Properties are computed from the tabulated " +
			"dimensions, root radii of I and H profiles and corner radii of tubes as exact circular arcs; they agree with " +
			"the steel tables' A and I within their rounding (tested). Tubes keep their core (core(s) gives the fill). " +
			"ASTM A500 HSS use the design wall 0.93·t_nom (AISC 360-16 §B4.2). Dimensions: section_dim.",
		Formula: "rolled I: A = 2·b·t_f + (h − 2t_f)·t_w + (4 − π)·r²; tubes: A = b·h − (b − 2t)(h − 2t) − (4 − π)(r_o² − r_i²)",
	}, "section")
	reg(&funcs.Def{
		Name: "section_dim",
		Params: []funcs.Param{{Name: "s", Type: section.ParamType, Doc: "a section straight from section(\"…\")"},
			text("name", "the dimension: h, b, t_w, t_f, r (I and H); d, t (CHS); h, b, t, r_o, r_i (tubes); t_nom (HSS)")},
		Result: num(dimL),
		Call: func(a []funcs.Value) (funcs.Value, error) {
			sh, err := section.ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			v, ok := byShape.Load(sh)
			if !ok {
				return nil, fmt.Errorf("section_dim needs a section straight from section(\"…\"), not one built, placed or cut in the sheet")
			}
			e := v.(*Entry)
			name, _ := a[1].(string)
			var have []string
			for n, v := range e.Vals {
				if !strings.HasSuffix(n, "_tab") {
					have = append(have, n)
					if n == name {
						return v, nil
					}
				}
			}
			slices.Sort(have)
			return nil, fmt.Errorf("%s has no dimension %q; it has %s", e.Key, name, strings.Join(have, ", "))
		},
		Summary: "one dimension of a catalogue section (t_f of an HEB 260, the design wall t of an HSS)",
		Doc:     "A dimension of a catalogue section by name, in m: section_dim(tube, \"t\") with tube = section(\"CHS 273x10\"), so the key is written once. For ASTM A500 HSS, t is the design wall 0.93·t_nom and t_nom the nominal one.",
		Formula: "as tabulated; HSS t = 0.93·t_nom; EN 10210 tubes r_o = 1.5t, r_i = t",
	}, "section")
	reg(&funcs.Def{
		Name:   "thread",
		Params: []funcs.Param{text("key", "designation, e.g. \"M16\"")},
		Result: ThreadType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("thread", a[0])
			if err != nil {
				return nil, err
			}
			v := rows[0].Vals
			return record(ThreadType, v["d"], v["P"], StressArea(v["d"], v["P"])), nil
		},
		Summary: "an ISO metric thread: d, pitch P and tensile stress area A_s",
		Doc:     "A metric thread of the coarse series by its designation. The stress area is computed from d and P, and agrees with the ISO 898-1 table within its rounding (tested). A size the series does not have (M13) is an error, never an interpolation.",
		Formula: "A_s = π/4·(d − 0.9382·P)²",
	}, "thread")
	reg(&funcs.Def{
		Name:   "thread_coarse",
		Params: []funcs.Param{{Name: "d", Type: num(dimL), Doc: "nominal diameter, m: a size of the coarse series (16 mm for M16)"}},
		Result: ThreadType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			d, _ := a[0].(float64)
			mm := d * 1e3
			if !(mm > 0) || math.IsInf(mm, 0) {
				return nil, fmt.Errorf("the nominal diameter must be a positive length, got %g m", d)
			}
			size := strconv.FormatFloat(math.Round(mm*1e6)/1e6, 'f', -1, 64)
			key := "M" + size
			// The shipped ISO 261 table only: a firm's "M13" is not a coarse thread.
			rows, err := Shipped().Find("thread", key)
			if err != nil {
				return nil, fmt.Errorf("no coarse thread of d = %s mm: %w", size, err)
			}
			v := rows[0].Vals
			return record(ThreadType, v["d"], v["P"], StressArea(v["d"], v["P"])), nil
		},
		Summary: "the ISO coarse thread of nominal diameter d (an input a case table may vary)",
		Doc:     "The coarse-pitch thread of the given nominal diameter, as thread(\"M\" + d in mm) would give: for a sheet whose rod diameter is a numeric input (overridden by --set or a case table). A diameter the series does not have (13 mm) is an error that names the sizes either side, never an interpolation.",
		Formula: "A_s = π/4·(d − 0.9382·P)², P from the coarse series",
	}, "thread")
	reg(&funcs.Def{
		Name:   "bolt_class",
		Params: []funcs.Param{text("key", "property class, e.g. \"8.8\"")},
		Result: BoltClassType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("bolt_class", a[0])
			if err != nil {
				return nil, err
			}
			v := rows[0].Vals
			return record(BoltClassType, v["f_yb"], v["f_ub"]), nil
		},
		Summary: "nominal f_yb and f_ub of a bolt property class",
		Doc:     "The nominal yield and ultimate strengths of a bolt property class, as the design of bolted connections takes them.",
		Formula: "class x.y: f_ub = 100·x MPa, f_yb = 10·x·y MPa",
	}, "bolt_class")
	reg(&funcs.Def{
		Name:   "steel",
		Params: []funcs.Param{text("grade", "grade, e.g. \"S355\", \"A992\", \"A572 Gr 50\", \"A500 Gr C rect\""), {Name: "t", Type: num(dimL), Doc: "thickness of the element (the flange of a rolled profile, the wall of a tube), m; > 0"}},
		Result: SteelType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("steel", a[0])
			if err != nil {
				return nil, err
			}
			t, _ := a[1].(float64)
			e, err := band(rows, t, "steel")
			if err != nil {
				return nil, err
			}
			v := e.Vals
			return record(SteelType, v["E"], v["E"]/(2*(1+v["nu"])), v["nu"], v["alpha"], v["rho"], v["f_y"], v["f_u"], v["t_max"]), nil
		},
		Summary: "a structural steel grade for thickness t: E, f_y, f_u, …",
		Doc:     "The properties of a steel grade for an element of thickness t: the thickness band is the first whose t_max is at least t (bands are (previous t_max, t_max]); a t beyond the last band is an error. The result is a material for part().",
		Formula: "band: t_max(i−1) < t ≤ t_max(i); G = E/(2(1 + ν))",
	}, "steel")
	reg(&funcs.Def{
		Name:   "aluminium",
		Params: []funcs.Param{text("alloy", "alloy and temper, e.g. \"EN AW-6082 T6\""), {Name: "t", Type: num(dimL), Doc: "thickness of the element, m; > 0"}},
		Result: AluminiumType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("aluminium", a[0])
			if err != nil {
				return nil, err
			}
			t, _ := a[1].(float64)
			e, err := band(rows, t, "aluminium")
			if err != nil {
				return nil, err
			}
			v := e.Vals
			return record(AluminiumType, v["E"], v["E"]/(2*(1+v["nu"])), v["nu"], v["alpha"], v["rho"], v["f_o"], v["f_o"], v["f_u"], v["t_max"]), nil
		},
		Summary: "an aluminium alloy and temper for thickness t: E, f_o, f_u, …",
		Doc:     "The properties of a wrought aluminium alloy (extruded profiles) for thickness t, by band as for steel. Heat-affected zones near welds have lower strengths, which this lookup does not give.",
		Formula: "band: t_max(i−1) < t ≤ t_max(i); G = E/(2(1 + ν))",
	}, "aluminium")
	reg(&funcs.Def{
		Name:   "concrete",
		Params: []funcs.Param{text("class", "strength class, e.g. \"C30/37\"")},
		Result: ConcreteType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("concrete", a[0])
			if err != nil {
				return nil, err
			}
			v := rows[0].Vals
			p, err := Concrete(v["f_ck"])
			if err != nil {
				return nil, err
			}
			return record(ConcreteType, p.Ecm, 10e-6, 0.2, v["f_ck"], v["f_ck_cube"], p.Fcm, p.Fctm, p.Ecm, p.EpsC1, p.EpsCu1, p.EpsC2, p.EpsCu2, p.N), nil
		},
		Summary: "a concrete strength class: f_ck, f_cm, f_ctm, E_cm, strains and n of EN 1992-1-1 Table 3.1",
		Doc: "The properties of a normal-weight concrete class from the formulas of EN 1992-1-1 Table 3.1 (the formulas are " +
			"evaluated, so values differ from the rounded rows in the last digit), including the classes above C50/60. " +
			"E_cm is for quartzite aggregates (limestone ×0.9, sandstone ×0.7, basalt ×1.2: apply in the sheet). The record " +
			"has no design strength: f_cd = α_cc·f_ck/γ_C comes from the sheet, with the local code's factors.",
		Formula: "f_cm = f_ck + 8; f_ctm = 0.30·f_ck^(2/3) (≤ C50/60) or 2.12·ln(1 + f_cm/10); E_cm = 22·(f_cm/10)^0.3 GPa; ε_c2, ε_cu2, n as Table 3.1",
	}, "concrete")
	reg(&funcs.Def{
		Name:   "rebar",
		Params: []funcs.Param{text("grade", "grade and ductility class, e.g. \"B500B\"")},
		Result: RebarType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			rows, err := find("rebar", a[0])
			if err != nil {
				return nil, err
			}
			v := rows[0].Vals
			return record(RebarType, v["E"], v["f_yk"], v["f_yk"], v["eps_uk"], v["k"]), nil
		},
		Summary: "reinforcing steel: f_yk, E, ε_uk and k of a ductility class",
		Doc:     "The characteristic properties of reinforcing steel by grade and ductility class (lower limits of the class).",
		Formula: "as tabulated",
	}, "rebar")
}
