package catalogue

import (
	"fmt"
	"slices"
	"sort"
	"sync"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// ColSpec is a column a kind of table knows.
type ColSpec struct {
	Name     string
	Dim      units.Dim
	What     string // "length", "stress", … for messages
	Optional bool
	Alt      string // another column that may stand in for this one
}

// Kind is a kind of table: the columns it takes, the lookup (namespace) its
// keys belong to, and how a row is checked and turned into a value.
type Kind struct {
	Name   string
	NS     string // the lookup function: "section", "thread", "steel", …
	Doc    string
	Cols   []ColSpec
	Banded bool // several rows per key, by thickness band t_max
	// prepare checks a row and computes what the lookup returns (the shape
	// of a section); it returns a message for a bad row.
	prepare func(e *Entry) string
}

func (k *Kind) col(name string) *ColSpec {
	for i := range k.Cols {
		if k.Cols[i].Name == name {
			return &k.Cols[i]
		}
	}
	return nil
}

func (k *Kind) check(e *Entry) string {
	if k.prepare == nil {
		return ""
	}
	return k.prepare(e)
}

var (
	dimL      = units.Base(units.Length)
	dimA      = dimL.Mul(dimL)
	dimI      = dimA.Mul(dimA)
	dimForce  = units.Base(units.Mass).Mul(dimL).Div(units.Base(units.Time).Mul(units.Base(units.Time)))
	dimStress = dimForce.Div(dimA)
	dimPerK   = units.Base(units.Temperature).Inv()
	dimRho    = units.Base(units.Mass).Div(dimA.Mul(dimL))
)

func length(n string) ColSpec { return ColSpec{Name: n, Dim: dimL, What: "length"} }
func optLength(n, alt string) ColSpec {
	return ColSpec{Name: n, Dim: dimL, What: "length", Optional: true, Alt: alt}
}
func tab(n string, d units.Dim, what string) ColSpec {
	return ColSpec{Name: n, Dim: d, What: what, Optional: true}
}
func stress(n string) ColSpec { return ColSpec{Name: n, Dim: dimStress, What: "stress"} }
func pure(n string) ColSpec   { return ColSpec{Name: n, Dim: units.None, What: "plain number"} }

// Design rules of the hollow-section kinds.
const (
	// HSSWall is the design wall thickness of ASTM A500 HSS as a share of
	// the nominal one: AISC 360-16 §B4.2 (from memory).
	HSSWall = 0.93
)

// byShape finds the catalogue entry behind a section's shape, so that
// section_dim takes the section itself and the key is written once.
var byShape sync.Map // *section.Shape -> *Entry

// keep keeps the shape built for a section entry, or returns why it
// could not be built.
func keep(e *Entry) func(*section.Shape, error) string {
	return func(s *section.Shape, err error) string {
		if err != nil {
			return err.Error()
		}
		e.shape = s
		byShape.Store(s, e)
		return ""
	}
}

var kinds = map[string]*Kind{
	"i": {Name: "i", NS: "section",
		Doc:  "rolled I and H profiles: h, b, t_w, t_f and the root radius r (or k_des, the distance from the outer face of the flange to the end of the fillet, as the US tables give it: r = k_des − t_f)",
		Cols: []ColSpec{length("h"), length("b"), length("t_w"), length("t_f"), optLength("r", "k_des"), optLength("k_des", "r"), tab("A_tab", dimA, "area"), tab("I_y_tab", dimI, "second moment"), tab("I_z_tab", dimI, "second moment")},
		prepare: func(e *Entry) string {
			v := e.Vals
			r, ok := v["r"]
			if kd, has := v["k_des"]; has {
				if ok {
					return "give r or k_des, not both"
				}
				r = kd - v["t_f"]
				if r < 0 {
					return "k_des is less than t_f"
				}
				v["r"] = r
			} else if !ok {
				return "the root radius r (or k_des) is missing"
			}
			return keep(e)(section.RolledI(v["h"], v["b"], v["t_w"], v["t_f"], r))
		}},
	"chs": {Name: "chs", NS: "section",
		Doc:  "circular hollow sections: outside diameter d and wall t",
		Cols: []ColSpec{length("d"), length("t"), tab("A_tab", dimA, "area"), tab("I_tab", dimI, "second moment")},
		prepare: func(e *Entry) string {
			return keep(e)(section.CHS(e.Vals["d"], e.Vals["t"]))
		}},
	"rhs": {Name: "rhs", NS: "section",
		Doc:  "hot-finished rectangular and square hollow sections (EN 10210-2): h × b × t with corner radii r_o = 1.5t outside and r_i = t inside for calculation (from memory)",
		Cols: []ColSpec{length("h"), length("b"), length("t"), tab("A_tab", dimA, "area"), tab("I_y_tab", dimI, "second moment"), tab("I_z_tab", dimI, "second moment")},
		prepare: func(e *Entry) string {
			v := e.Vals
			v["r_o"], v["r_i"] = 1.5*v["t"], v["t"]
			return keep(e)(section.RoundedRHS(v["b"], v["h"], v["t"], v["r_o"], v["r_i"]))
		}},
	"hss_round": {Name: "hss_round", NS: "section",
		Doc:  "round HSS (ASTM A500): outside diameter d and nominal wall t_nom; the section is computed with the design wall t = 0.93·t_nom (AISC 360-16 §B4.2, from memory)",
		Cols: []ColSpec{length("d"), length("t_nom"), tab("A_tab", dimA, "area"), tab("I_tab", dimI, "second moment")},
		prepare: func(e *Entry) string {
			v := e.Vals
			v["t"] = HSSWall * v["t_nom"]
			return keep(e)(section.CHS(v["d"], v["t"]))
		}},
	"hss_rect": {Name: "hss_rect", NS: "section",
		Doc:  "square and rectangular HSS (ASTM A500): h × b × t_nom; computed with the design wall t = 0.93·t_nom and corner radii r_o = 2t, r_i = t (AISC 360-16 §B4.2 and the AISC Manual's property basis, from memory)",
		Cols: []ColSpec{length("h"), length("b"), length("t_nom"), tab("A_tab", dimA, "area"), tab("I_y_tab", dimI, "second moment"), tab("I_z_tab", dimI, "second moment")},
		prepare: func(e *Entry) string {
			v := e.Vals
			t := HSSWall * v["t_nom"]
			v["t"], v["r_o"], v["r_i"] = t, 2*t, t
			return keep(e)(section.RoundedRHS(v["b"], v["h"], t, 2*t, t))
		}},
	"thread": {Name: "thread", NS: "thread",
		Doc:  "ISO metric threads: nominal diameter d and pitch P; the stress area A_s = π/4·(d − 0.9382·P)² (ISO 898-1)",
		Cols: []ColSpec{length("d"), length("P"), tab("A_s_tab", dimA, "area")},
		prepare: func(e *Entry) string {
			if d, p := e.Vals["d"], e.Vals["P"]; !(d > 0) || !(p > 0) || d-0.9382*p <= 0 {
				return "d and P must be positive with d > 0.9382·P"
			}
			return ""
		}},
	"bolt": {Name: "bolt", NS: "bolt_class",
		Doc:  "property classes of bolts: nominal yield f_yb and ultimate f_ub strength",
		Cols: []ColSpec{stress("f_yb"), stress("f_ub")},
		prepare: func(e *Entry) string {
			if !(e.Vals["f_yb"] > 0) || e.Vals["f_ub"] < e.Vals["f_yb"] {
				return "f_yb must be positive and f_ub ≥ f_yb"
			}
			return ""
		}},
	"steel": {Name: "steel", NS: "steel", Banded: true,
		Doc:     "structural steel grades by thickness band: each row holds f_y and f_u for thicknesses above the previous row's t_max up to its own",
		Cols:    []ColSpec{length("t_max"), stress("f_y"), stress("f_u"), stress("E"), pure("nu"), {Name: "alpha", Dim: dimPerK, What: "coefficient of thermal expansion"}, {Name: "rho", Dim: dimRho, What: "density"}},
		prepare: materialCheck("f_y"),
	},
	"aluminium": {Name: "aluminium", NS: "aluminium", Banded: true,
		Doc:     "aluminium alloys and tempers by thickness band: 0.2 % proof strength f_o and ultimate f_u",
		Cols:    []ColSpec{length("t_max"), stress("f_o"), stress("f_u"), stress("E"), pure("nu"), {Name: "alpha", Dim: dimPerK, What: "coefficient of thermal expansion"}, {Name: "rho", Dim: dimRho, What: "density"}},
		prepare: materialCheck("f_o"),
	},
	"concrete": {Name: "concrete", NS: "concrete",
		Doc:  "concrete strength classes: characteristic cylinder f_ck and cube f_ck_cube strength; the other properties follow from the EN 1992-1-1 Table 3.1 formulas",
		Cols: []ColSpec{stress("f_ck"), stress("f_ck_cube")},
		prepare: func(e *Entry) string {
			if f := e.Vals["f_ck"]; !(f >= 12e6 && f <= 90e6) {
				return "f_ck must lie between 12 and 90 MPa, the range of EN 1992-1-1 Table 3.1"
			}
			return ""
		}},
	"rebar": {Name: "rebar", NS: "rebar",
		Doc:  "reinforcing steel: characteristic yield f_yk, modulus E, strain at maximum force ε_uk and ratio k = (f_t/f_y)_k",
		Cols: []ColSpec{stress("f_yk"), stress("E"), pure("eps_uk"), pure("k")},
		prepare: func(e *Entry) string {
			if !(e.Vals["f_yk"] > 0) || !(e.Vals["E"] > 0) || !(e.Vals["k"] >= 1) || !(e.Vals["eps_uk"] > 0 && e.Vals["eps_uk"] < 1) {
				return "f_yk and E must be positive, k ≥ 1 and 0 < eps_uk < 1 (a strain, not a percentage)"
			}
			return ""
		}},
}

func materialCheck(fy string) func(e *Entry) string {
	return func(e *Entry) string {
		v := e.Vals
		if !(v["t_max"] > 0) || !(v[fy] > 0) || v["f_u"] < v[fy] || !(v["E"] > 0) || !(v["nu"] < 0.5) || !(v["alpha"] > 0) || !(v["rho"] > 0) {
			return fmt.Sprintf("t_max, %s, E, alpha and rho must be positive, f_u ≥ %s and nu < 0.5", fy, fy)
		}
		return ""
	}
}

func kindNames() []string {
	var out []string
	for n := range kinds {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// namespaces lists the lookups, in a fixed order.
func namespaces() []string {
	seen := map[string]bool{}
	var out []string
	for _, n := range kindNames() {
		if ns := kinds[n].NS; !seen[ns] {
			seen[ns] = true
			out = append(out, ns)
		}
	}
	slices.Sort(out)
	return out
}
