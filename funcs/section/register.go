package section

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

const family = "section"

// src names the mechanics of materials sources for closed-form properties.
const srcMech = "J. M. Gere and B. J. Goodno, Mechanics of Materials, Appendix E (properties of plane areas); common practice"

func length(name, doc string) funcs.Param {
	return funcs.Param{Name: name, Type: funcs.Num(L), Doc: doc}
}

func num(v funcs.Value) float64 { f, _ := v.(float64); return f }

func wrap(s *Shape, err error) (funcs.Value, error) {
	if err != nil {
		return nil, err
	}
	return Record(s), nil
}

// FieldType is the parameter type of a field f(y [m], z [m]) of any result.
var FieldType = funcs.FuncOf(funcs.AnyType, funcs.Num(L), funcs.Num(L))

// ToField adapts a sheet function value to a Field.
func ToField(v funcs.Value) (Field, error) {
	fv, ok := v.(*funcs.FuncValue)
	if !ok || fv == nil || fv.Call == nil {
		return nil, fmt.Errorf("expected a function of (y, z), got %T", v)
	}
	return func(y, z float64) float64 { return fv.Call(y, z) }, nil
}

// fieldResult checks that args[i] is a function of two lengths returning a
// number and gives the dimension of its result.
func fieldResult(args []*funcs.Type, i int, what string) (units.Dim, error) {
	if i >= len(args) || args[i] == nil || args[i].Kind != funcs.Func {
		return units.None, fmt.Errorf("%s must be a function of (y [m], z [m]) defined in the sheet", what)
	}
	f := args[i]
	if len(f.Params) != 2 || f.Params[0].Kind != funcs.Number || f.Params[0].Dim != L || f.Params[1].Kind != funcs.Number || f.Params[1].Dim != L {
		return units.None, fmt.Errorf("%s must take two lengths (y [m], z [m]), got %s", what, f)
	}
	if f.Result == nil || f.Result.Kind != funcs.Number {
		return units.None, fmt.Errorf("%s must return a number, got %s", what, f.Result)
	}
	return f.Result.Dim, nil
}

func tolArg(args []funcs.Value, i int) float64 {
	if i < len(args) && args[i] != nil {
		return num(args[i])
	}
	return DefaultTol
}

func integrateArgs(args []funcs.Value) (Result, error) {
	s, err := ShapeOf(args[0])
	if err != nil {
		return Result{}, err
	}
	f, err := ToField(args[1])
	if err != nil {
		return Result{}, err
	}
	return Integrate(s, f, tolArg(args, 2))
}

func init() {
	sec := Type
	funcs.Register(&funcs.Def{
		Name: "circle", Family: family,
		Params:      []funcs.Param{length("d", "diameter, m; > 0")},
		Result:      sec,
		Call:        func(a []funcs.Value) (funcs.Value, error) { return wrap(Circle(num(a[0]))) },
		Spreadsheet: circleForm,
		Summary:     "solid circle of diameter d, centred at the origin",
		Doc: "A solid circular section of diameter d centred at the origin. Its properties are exact " +
			"(no polygon): A = πd²/4, I_y = I_z = πd⁴/64, i = d/4. Section integrals over it use polar " +
			"coordinates.",
		Formula: "A = π·d²/4; I_y = I_z = π·d⁴/64",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "chs", Family: family,
		Params:      []funcs.Param{length("d", "outside diameter, m; > 0"), length("t", "wall thickness, m; 0 < t ≤ d/2")},
		Result:      sec,
		Call:        func(a []funcs.Value) (funcs.Value, error) { return wrap(CHS(num(a[0]), num(a[1]))) },
		Spreadsheet: chsForm,
		Summary:     "circular hollow section (tube) d × t, centred at the origin",
		Doc: "A circular tube of outside diameter d and wall thickness t, centred at the origin; " +
			"t = d/2 gives the solid circle. Exact properties with d_i = d − 2t: A = π(d² − d_i²)/4, " +
			"I = π(d⁴ − d_i⁴)/64.",
		Formula: "A = π·(d² − (d − 2t)²)/4; I = π·(d⁴ − (d − 2t)⁴)/64",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "rect", Family: family,
		Params:      []funcs.Param{length("b", "width along y, m; > 0"), length("h", "height along z, m; > 0")},
		Result:      sec,
		Call:        func(a []funcs.Value) (funcs.Value, error) { return wrap(Rect(num(a[0]), num(a[1]))) },
		Spreadsheet: rectForm,
		Summary:     "solid rectangle b wide, h high, centred at the origin",
		Doc:         "A solid rectangle b wide (along y) and h high (along z), centred at the origin.",
		Formula:     "A = b·h; I_y = b·h³/12; I_z = h·b³/12",
		Source:      srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "rhs", Family: family,
		Params: []funcs.Param{length("b", "outside width along y, m; > 0"), length("h", "outside height along z, m; > 0"),
			length("t", "wall thickness, m; 0 < t < min(b, h)/2")},
		Result:      sec,
		Call:        func(a []funcs.Value) (funcs.Value, error) { return wrap(RHS(num(a[0]), num(a[1]), num(a[2]))) },
		Spreadsheet: rhsForm,
		Summary:     "rectangular hollow section b × h × t (sharp corners), centred at the origin",
		Doc: "A rectangular tube b wide and h high with wall t, centred at the origin. Corners are sharp: the " +
			"corner radii of a rolled or cold-formed tube are ignored, which overstates A slightly; use the " +
			"catalogue value where it matters.",
		Formula: "A = b·h − (b − 2t)(h − 2t); I_y = (b·h³ − (b − 2t)(h − 2t)³)/12",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "i_section", Family: family,
		Params: []funcs.Param{length("h", "overall depth along z, m"), length("b", "flange width along y, m"),
			length("t_w", "web thickness, m; < b"), length("t_f", "flange thickness, m; 2·t_f < h")},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			return wrap(ISection(num(a[0]), num(a[1]), num(a[2]), num(a[3])))
		},
		Spreadsheet: iSectionForm,
		Summary:     "doubly symmetric I/H shape from its plate dimensions, centred at the origin",
		Doc: "A doubly symmetric I or H section built from two flanges b × t_f and a web t_w × (h − 2t_f), " +
			"centred at the origin, major axis parallel to y. Root radii are ignored, so A and I are a little " +
			"below the catalogue values of a rolled profile (by about (4 − π)r² in area).",
		Formula: "A = 2·b·t_f + (h − 2t_f)·t_w; I_y = (b·h³ − (b − t_w)(h − 2t_f)³)/12",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "angle", Family: family,
		Params:      []funcs.Param{length("h", "leg height along z, m"), length("b", "leg width along y, m"), length("t", "thickness of both legs, m; < min(h, b)")},
		Result:      sec,
		Call:        func(a []funcs.Value) (funcs.Value, error) { return wrap(Angle(num(a[0]), num(a[1]), num(a[2]))) },
		Spreadsheet: angleShape,
		Summary:     "L shape h × b × t with its heel at the origin",
		Doc: "An angle with legs h (along +z) and b (along +y) of thickness t, the outer corner (heel) at the " +
			"origin. Root and toe radii are ignored. The principal axes are inclined: use I_1, I_2 and i_min.",
		Formula: "polygon (0,0) (b,0) (b,t) (t,t) (t,h) (0,h); properties by Green's theorem",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "polygon", Family: family,
		Params: []funcs.Param{
			{Name: "ys", Type: funcs.ListOf(funcs.Num(L)), Doc: "horizontal coordinates of the vertices, m"},
			{Name: "zs", Type: funcs.ListOf(funcs.Num(L)), Doc: "vertical coordinates of the vertices, m (same count as ys)"},
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			ys, _ := a[0].([]float64)
			zs, _ := a[1].([]float64)
			return wrap(Polygon(ys, zs))
		},
		Summary: "simple polygon through the vertices (ys[i], zs[i])",
		Doc: fmt.Sprintf("A simple polygon through the given vertices in order around the boundary, either "+
			"direction; the first vertex need not be repeated. At least 3 and at most %d vertices; edges may "+
			"not cross. Cut holes with cut(). Properties come from the exact edge formulas of Green's theorem.", MaxVertices),
		Formula: "A = ½Σ(y_i·z_{i+1} − y_{i+1}·z_i); I_y = Σ(z_i² + z_i·z_{i+1} + z_{i+1}²)·c_i/12 − A·z_c²",
		Source:  "Green's theorem over polygon edges (common practice); C. Steger, On the calculation of arbitrary moments of polygons, TU München FGBV-96-05 (1996), from memory",
	})
	funcs.Register(&funcs.Def{
		Name: "cut", Family: family,
		Params: []funcs.Param{
			{Name: "outer", Type: ParamType, Doc: "the section to cut from"},
			{Name: "hole", Type: ParamType, Doc: "the section removed; it must lie inside the material of outer"},
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			o, err := ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			h, err := ShapeOf(a[1])
			if err != nil {
				return nil, err
			}
			return wrap(Cut(o, h))
		},
		Summary: "outer section with a hole (any section) removed",
		Doc: "Removes hole from outer, for polygons with holes, plates with a circular opening, a tube of " +
			"any outline, or the block of concrete around an encased profile (cut(rect(b, h), I)). The hole " +
			"must lie inside the material of outer and may not overlap an earlier hole: the area it shares " +
			"with outer, computed by clipping boundary against boundary, must be its whole area (relative " +
			"1e-9); it may touch outer's edges. Curved holes stay exact in the properties.",
		Formula: "A = A_outer − A_hole; moments subtract about a common point",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "join", Family: family,
		Params: []funcs.Param{
			{Name: "a", Type: ParamType, Doc: "first section"},
			{Name: "b", Type: ParamType, Doc: "second section; may touch a along an edge but not overlap it"},
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			x, err := ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			y, err := ShapeOf(a[1])
			if err != nil {
				return nil, err
			}
			return wrap(Join(x, y))
		},
		Summary: "union of two sections of one material that do not overlap",
		Doc: "Joins two sections of the same material into one (a plate welded to a flange, two angles back " +
			"to back). They may touch along an edge but not overlap: their common area, computed by clipping " +
			"boundary against boundary (circles through inscribed 512-gons), must be below 1e-9 of the smaller " +
			"area. For parts of different materials build a composite instead; join_all takes a list.",
		Formula: "A = A_a + A_b; moments add about a common point",
		Source:  srcMech,
	})
	funcs.Register(&funcs.Def{
		Name: "place", Family: family,
		Params: []funcs.Param{
			{Name: "s", Type: ParamType, Doc: "the section to move"},
			length("dy", "shift along y, m"),
			length("dz", "shift along z, m"),
			{Name: "rot", Type: funcs.Num(Rot), Optional: true, Doc: "rotation about the origin, an angle such as 90 deg or 0.5 rad (not a plain number), counter-clockwise from y towards z, applied before the shift; default 0 deg"},
		},
		Result: sec,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			s, err := ShapeOf(a[0])
			if err != nil {
				return nil, err
			}
			rot := 0.0 // rad: the checker has made the argument an angle, held in SI
			if len(a) > 3 && a[3] != nil {
				rot = num(a[3])
			}
			dy, dz := num(a[1]), num(a[2])
			for _, v := range []float64{dy, dz, rot} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return nil, fmt.Errorf("place needs finite shifts and angle, got dy = %s, dz = %s, rot = %.4g rad", funcs.Length(dy), funcs.Length(dz), rot)
				}
			}
			return Record(s.Transform(dy, dz, rot)), nil
		},
		Summary: "section rotated about the origin by the angle rot, then shifted by (dy, dz)",
		Doc: "A copy of s rotated counter-clockwise by rot about the origin and then moved by (dy, dz). rot is " +
			"an angle quantity (90 deg, 0.5 rad); a plain number is refused, so 90 cannot be read as radians. " +
			"Area and principal moments do not change; the centroid moves with the shape; I_y, I_z and I_yz " +
			"follow the tensor rotation. Circles stay exact.",
		Formula: "y' = y·cos θ − z·sin θ + dy; z' = y·sin θ + z·cos θ + dz",
		Source:  srcMech,
	})
	integralDoc := "∫ f(y, z) dA over the section, f a function of (y [m], z [m]) written in the sheet. " +
		"The result has the unit of f times m². tol is the relative tolerance (default 1e-10, from 1e-14 " +
		"to 0.1), relative to ∫|f| dA so that a field whose integral cancels to zero converges too. " +
		"Polygons: Green's theorem edge by edge with an 8×8 Gauss–Legendre product rule per strip, split " +
		"adaptively; exact for polynomials up to degree 14. Circles: polar coordinates, trapezoidal rule in " +
		"angle and Gauss–Legendre in radius, doubled until two levels agree. f is evaluated over the bounding " +
		"box of the section (Green strips of a non-convex shape leave it), so it must be finite there. A " +
		"field that fails (returns no value) or that jumps so that the tolerance is not met is an error."
	integralValidate := func(args []*funcs.Type) (*funcs.Type, error) {
		d, err := fieldResult(args, 1, "the field f")
		if err != nil {
			return nil, err
		}
		r := d.Mul(L2)
		if !r.Valid() {
			return nil, fmt.Errorf("f times m² has a dimension exponent out of range (f is %s)", d)
		}
		return funcs.Num(r), nil
	}
	integralParams := []funcs.Param{
		{Name: "s", Type: ParamType, Doc: "the section"},
		{Name: "f", Type: FieldType, Doc: "field f(y [m], z [m]) of any unit"},
		{Name: "tol", Type: funcs.Num(units.None), Optional: true, Doc: "relative tolerance, 1e-14 to 0.1; default 1e-10"},
	}
	funcs.Register(&funcs.Def{
		Name: "section_integral", Family: family,
		Params: integralParams, Validate: integralValidate,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			r, err := integrateArgs(a)
			return r.Value, err
		},
		Summary: "∫ f(y, z) dA over a section to a relative tolerance [unit of f · m²]",
		Doc:     integralDoc,
		Formula: "∫∫ f dA = ∮ F dz, F(y, z) = ∫ f(s, z) ds (Green); polar ∫∫ f r dr dθ for circles",
		Source: "A. Sommariva and M. Vianello, Product Gauss cubature over polygons based on Green's integration formula, " +
			"BIT Numer. Math. 47 (2007) 441–453 (from memory); L. N. Trefethen and J. A. C. Weideman, The exponentially " +
			"convergent trapezoidal rule, SIAM Review 56 (2014) 385–458",
	})
	funcs.Register(&funcs.Def{
		Name: "section_integral_err", Family: family,
		Params: integralParams, Validate: integralValidate,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			r, err := integrateArgs(a)
			return r.Err, err
		},
		Summary: "achieved error estimate of section_integral [unit of f · m²]",
		Doc: "The absolute error estimate that section_integral reached for the same arguments: the sum over the " +
			"accepted cells of |refined − coarse|, which bounds the error of the returned value in practice. " + integralDoc,
		Formula: "err = Σ |I_refined − I_coarse| over accepted cells",
		Source:  "as section_integral",
	})
}
