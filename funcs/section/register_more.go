package section

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// shapesOf returns the shapes behind a list of section values.
func shapesOf(v funcs.Value, what string) ([]*Shape, error) {
	list, ok := v.([]funcs.Value)
	if !ok {
		return nil, fmt.Errorf("expected a list of sections, got %T", v)
	}
	out := make([]*Shape, len(list))
	for i, e := range list {
		s, err := ShapeOf(e)
		if err != nil {
			return nil, fmt.Errorf("%s %d: %w", what, i+1, err)
		}
		out[i] = s
	}
	return out, nil
}

func init() {
	sec := Type
	funcs.Register(&funcs.Def{
		Name: "join_all", Family: family,
		Params: []funcs.Param{{Name: "parts", Type: funcs.ListOf(ParamType), Doc: "the sections, e.g. [a, b, c]; no two may overlap"}},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			ss, err := shapesOf(a[0], "section")
			if err != nil {
				return nil, err
			}
			return wrap(JoinAll(ss))
		},
		Summary: "union of any number of sections of one material, none overlapping",
		Doc: "Joins the sections of the list into one, as join does for two: every pair may touch along an edge " +
			"but not overlap (the common area of each pair, by boundary clipping, must be below 1e-9 of the " +
			"smaller). The message names the first pair that overlaps.",
		Formula: "A = Σ A_i; moments add about a common point",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "cut_all", Family: family,
		Params: []funcs.Param{
			{Name: "outer", Type: ParamType, Doc: "the section to cut from"},
			{Name: "holes", Type: funcs.ListOf(ParamType), Doc: "the sections removed, in turn; each must lie in the material left by the ones before"},
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			o, err := ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			hs, err := shapesOf(a[1], "hole")
			if err != nil {
				return nil, err
			}
			return wrap(CutAll(o, hs))
		},
		Summary: "outer section with every hole of the list removed",
		Doc: "Removes the holes of the list one after the other, with the check of cut for each: a hole must lie " +
			"inside the material that is left, so two holes may touch but not overlap.",
		Formula: "A = A_outer − Σ A_hole; moments subtract about a common point",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "bars_on_circle", Family: family,
		Params: []funcs.Param{
			{Name: "n", Type: funcs.Num(units.None), Doc: "number of bars, a whole number 1 to 1000"},
			length("d", "bar diameter, m; > 0"),
			length("D", "diameter of the circle through the bar centres, m; neighbours may touch, not overlap"),
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			n := num(a[0])
			if n != math.Trunc(n) || n < 1 || n > 1000 {
				return nil, fmt.Errorf("the number of bars must be a whole number from 1 to 1000, got %g", n)
			}
			return wrap(BarsOnCircle(int(n), num(a[1]), num(a[2])))
		},
		Summary: "n round bars of diameter d, centres equally spaced on a circle of diameter D",
		Doc: "The reinforcement of a round column or a ring of bolts: n solid circles of diameter d whose centres " +
			"lie on the circle of diameter D about the origin, the first on the positive y axis, the others " +
			"counter-clockwise at 360°/n. Each bar is an exact circle. Turn the ring with place(). A bar " +
			"arrangement in a concrete part is cut from the concrete (cut(circle(d_c), bars)) and given its own part.",
		Formula: "centre_k = (D/2)(cos(2πk/n), sin(2πk/n)); A = n·π·d²/4; I_y = Σ(π·d⁴/64 + (π·d²/4)·z_k²)",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "core", Family: family,
		Params: []funcs.Param{{Name: "s", Type: ParamType, Doc: "a hollow section: chs, rhs, rhs_rounded or a catalogue tube"}},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			return wrap(CoreOf(s))
		},
		Summary: "the void inside a tube, the shape of its concrete fill",
		Doc: "The inside of a hollow section, with the tube's inner corner radii: core(chs(d, t)) is circle(d − 2t), " +
			"core of a catalogue SHS is the rounded square inside it. It follows the tube through place(). A " +
			"section that is not a tube has no core, and asking for one is an error.",
		Formula: "the inner boundary of the tube",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "rolled_i", Family: family,
		Params: []funcs.Param{length("h", "overall depth along z, m"), length("b", "flange width along y, m"),
			length("t_w", "web thickness, m"), length("t_f", "flange thickness, m"), length("r", "root radius, m; ≥ 0")},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			return wrap(RolledI(num(a[0]), num(a[1]), num(a[2]), num(a[3]), num(a[4])))
		},
		Spreadsheet: rolledISection,
		Summary:     "rolled I/H profile with root radii, centred at the origin",
		Doc: "A doubly symmetric I or H section of plates h, b, t_w, t_f with four root fillets of radius r between " +
			"web and flanges, as hot-rolled profiles are drawn; the fillets are exact circular arcs (a square " +
			"less a quarter circle), so A and I match the steel tables' values computed from the dimensions. " +
			"r = 0 gives i_section.",
		Formula: "A = 2·b·t_f + (h − 2t_f)·t_w + (4 − π)·r²",
		Source:  "EN 10365:2017 (profile drawing with root radius, from memory); " + srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "rhs_rounded", Family: family,
		Params: []funcs.Param{length("b", "outside width along y, m"), length("h", "outside height along z, m"),
			length("t", "wall thickness, m"), length("r_o", "outside corner radius, m; ≥ 0"), length("r_i", "inside corner radius, m; ≥ 0")},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			return wrap(RoundedRHS(num(a[0]), num(a[1]), num(a[2]), num(a[3]), num(a[4])))
		},
		Spreadsheet: roundedRHS,
		Summary:     "rectangular hollow section with rounded corners, centred at the origin",
		Doc: "A rectangular tube b × h with wall t whose corners are exact circular arcs of radius r_o outside and " +
			"r_i inside (hot-finished tubes: r_o = 1.5t, r_i = t for calculation, EN 10210-2, from memory; ASTM " +
			"A500 HSS in AISC tables: r_o = 2t_des, r_i = t_des). Its core is the rounded void.",
		Formula: "A = b·h − (b − 2t)(h − 2t) − (4 − π)(r_o² − r_i²)",
		Source:  srcMech,
	})
}
