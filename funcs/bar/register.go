package bar

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

const family = "bar"

const srcMech = "Gere & Goodno, Mechanics of Materials, ch. 2 (axially loaded members); Timoshenko, Strength of Materials Part I, ch. 1–2"

func init() {
	for _, d := range builders() {
		funcs.Register(d)
	}
	for _, d := range solvers() {
		funcs.Register(d)
	}
	for _, d := range shortcuts() {
		funcs.Register(d)
	}
	for _, d := range lateralDefs() {
		funcs.Register(d)
	}
}

func p(name string, t *funcs.Type, doc string) funcs.Param {
	return funcs.Param{Name: name, Type: t, Doc: doc}
}

// withBar copies the bar argument, lets change modify the copy and returns it
// as a new record: builders never change a bar another cell holds.
func withBar(args []funcs.Value, change func(b *Bar) error) (funcs.Value, error) {
	b, err := barArg(args[0])
	if err != nil {
		return nil, err
	}
	c := b.Clone()
	if err := change(c); err != nil {
		return nil, err
	}
	return barValue(c), nil
}

func builders() []*funcs.Def {
	return []*funcs.Def{
		{
			Name: "bar", Family: family,
			Params: []funcs.Param{p("segs", segmentTable, "segment table: L [m], E [Pa], the area as A | d | d1, d2 | A1, A2, optionally dT [K] and alpha [1/K]")},
			Result: barType,
			Validate: func(args []*funcs.Type) (*funcs.Type, error) {
				if len(args) < 1 {
					return nil, fmt.Errorf("bar needs a segment table")
				}
				return barType, validateSegments(args[0])
			},
			Call: func(args []funcs.Value) (funcs.Value, error) {
				tv, _ := args[0].(*funcs.TableValue)
				segs, err := segmentsFromTable(tv)
				if err != nil {
					return nil, err
				}
				return barValue(&Bar{Segments: segs}), nil
			},
			Summary: "a bar from a table of segments, start to end",
			Doc: "Builds a straight bar from a table with one row per segment, in order from the start " +
				"(x = 0). Columns: L [m] and E [Pa] always; the area as one of A [m²] (constant), d [m] " +
				"(solid circle), d1 and d2 [m] (solid circle tapered linearly in diameter), A1 and A2 [m²] " +
				"(tapered linearly in area); optionally dT [K] with alpha [1/K], a temperature change per " +
				"segment. All values must be positive except dT. Add loads with the with_* functions and " +
				"solve with solve_bar.",
			Formula: "A(x), E(x) piecewise along x",
			Source:  srcMech,
		},
		{
			Name: "bar_uniform", Family: family,
			Params: []funcs.Param{p("L", numLength, "length [m], > 0"), p("A", numArea, "area [m²], > 0"), p("E", numStress, "modulus [Pa], > 0")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				s := Prismatic(f64(args[0]), f64(args[1]), f64(args[2]))
				if err := checkSegment(0, &s); err != nil {
					return nil, err
				}
				return barValue(&Bar{Segments: []Segment{s}}), nil
			},
			Summary: "a prismatic bar of one segment",
			Doc:     "Builds a bar of length L [m] with constant area A [m²] and modulus E [Pa].",
			Formula: "A(x) = A, E(x) = E",
			Source:  srcMech,
		},
		{
			Name: "bar_fn", Family: family,
			Params: []funcs.Param{p("L", numLength, "length [m], > 0"),
				p("A", areaFnType, "area: a function A(x [m]) [m²]"),
				p("E", stressFn, "modulus: a function E(x [m]) [Pa]")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				l, err := numArg(args[0], "L")
				if err != nil {
					return nil, err
				}
				s := Segment{L: l, Shape: AreaFunc}
				switch a := args[1].(type) {
				case float64:
					s.Shape, s.A1, s.A2 = Constant, a, a
				default:
					if s.AreaFn, err = fnArg(a); err != nil {
						return nil, err
					}
				}
				switch e := args[2].(type) {
				case float64:
					s.E = e
				default:
					if s.EFn, err = fnArg(e); err != nil {
						return nil, err
					}
				}
				if err := checkSegment(0, &s); err != nil {
					return nil, err
				}
				return barValue(&Bar{Segments: []Segment{s}}), nil
			},
			Summary: "a bar whose area and modulus are functions of x",
			Doc: "Builds a bar of length L [m] of one segment whose area A and modulus E are user functions " +
				"of the position x [m] from the start (for a constant modulus write a function that returns " +
				"it, e.g. E_s(x [m]) [GPa] = 200 GPa). Each function must give a " +
				"positive finite value over 0 ≤ x ≤ L; where it fails the solver names it and the position. " +
				"The flexibility ∫dx/(EA) is then taken by adaptive Gauss–Legendre quadrature to a relative " +
				"accuracy of 1e-13.",
			Formula: "A = A(x), E = E(x)",
			Source:  srcMech,
		},
		{
			Name: "with_point_loads", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("pts", pointTable, "table of x [m] from the start and P [N], positive in +x")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				tv, ok := args[1].(*funcs.TableValue)
				if !ok || tv == nil {
					return nil, fmt.Errorf("expected a table of point loads with columns x [m] and P [N]")
				}
				xs, ps := tv.Col("x"), tv.Col("P")
				if xs == nil || ps == nil || len(xs) != len(ps) {
					return nil, fmt.Errorf("the point load table needs columns x [m] and P [N] of equal length")
				}
				return withBar(args, func(b *Bar) error {
					for i := range xs {
						if !finite(xs[i]) || !finite(ps[i]) {
							return fmt.Errorf("point load row %d: x = %s, P = %s must be finite numbers", i+1, funcs.Length(xs[i]), funcs.Quantity(ps[i], funcs.Force))
						}
						b.Points = append(b.Points, PointLoad{X: xs[i], P: ps[i]})
					}
					return nil
				})
			},
			Summary: "adds point loads from a table",
			Doc: "Returns the bar with point loads added: one per row of a table with columns x [m] " +
				"(position from the start, 0 ≤ x ≤ L) and P [N] (positive in +x, i.e. toward the end). " +
				"A load at x = 0 or x = L acts on the end of the bar next to its support.",
			Formula: "N jumps by −P at x",
			Source:  srcMech,
		},
		{
			Name: "with_point_load", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("x", numLength, "position from the start [m]"), p("P", numForce, "force, positive in +x [N]")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				return withBar(args, func(b *Bar) error {
					b.Points = append(b.Points, PointLoad{X: f64(args[1]), P: f64(args[2])})
					return nil
				})
			},
			Summary: "adds one point load",
			Doc:     "Returns the bar with a point load P [N] (positive in +x) added at x [m] from the start, 0 ≤ x ≤ L.",
			Formula: "N jumps by −P at x",
			Source:  srcMech,
		},
		{
			Name: "with_line_load", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("b0", numPerLen, "load per unit length at the start [N/m], positive in +x"),
				{Name: "b1", Type: numPerLen, Optional: true, Doc: "load per unit length at the end [N/m]; omitted: equal to b0 (uniform)"}},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				b0, err := numArg(args[0+1], "b0")
				if err != nil {
					return nil, err
				}
				b1 := b0
				if len(args) > 2 && args[2] != nil {
					if b1, err = numArg(args[2], "b1"); err != nil {
						return nil, err
					}
				}
				return withBar(args, func(b *Bar) error {
					b.B0 += b0
					b.B1 += b1
					return nil
				})
			},
			Summary: "adds a distributed load, linear from start to end",
			Doc: "Returns the bar with a distributed axial load b(x) [N/m] added that varies linearly from b0 " +
				"at the start to b1 at the end of the bar (uniform when b1 is omitted). Positive b acts in " +
				"+x. Loads added by several calls sum.",
			Formula: "b(x) = b0 + (b1 − b0)·x/L",
			Source:  srcMech,
		},
		{
			Name: "with_line_load_over", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("x0", numLength, "start of the loaded stretch [m], ≥ 0"),
				p("x1", numLength, "end of the loaded stretch [m], > x0 and ≤ L"),
				p("b0", numPerLen, "load per unit length at x0 [N/m], positive in +x"),
				{Name: "b1", Type: numPerLen, Optional: true, Doc: "load per unit length at x1 [N/m]; omitted: equal to b0 (uniform)"}},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				var v [4]float64
				for i, n := range []string{"x0", "x1", "b0"} {
					x, err := numArg(args[i+1], n)
					if err != nil {
						return nil, err
					}
					v[i] = x
				}
				v[3] = v[2]
				if len(args) > 4 && args[4] != nil {
					x, err := numArg(args[4], "b1")
					if err != nil {
						return nil, err
					}
					v[3] = x
				}
				if !(v[1] > v[0]) || v[0] < 0 {
					return nil, fmt.Errorf("the loaded stretch x0 = %g m … x1 = %g m must have 0 ≤ x0 < x1", v[0], v[1])
				}
				return withBar(args, func(b *Bar) error {
					b.Patches = append(b.Patches, Patch{X0: v[0], X1: v[1], B0: v[2], B1: v[3]})
					return nil
				})
			},
			Summary: "adds a distributed load over part of the bar, linear from x0 to x1",
			Doc: "Returns the bar with a distributed axial load added over the stretch x0 … x1 only (zero elsewhere), " +
				"varying linearly from b0 at x0 to b1 at x1: the skin friction of one soil layer along a pile, a " +
				"load on part of a hanger. The solver ends a piece at x0 and x1 itself, so the segment table need " +
				"not be split there. Positive b acts in +x; loads added by several calls sum.",
			Formula: "b(x) = b0 + (b1 − b0)·(x − x0)/(x1 − x0) for x0 ≤ x ≤ x1, else 0",
			Source:  srcMech,
		},
		{
			Name: "with_line_load_fn", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("b", lineLoadFn, "user function b(x [m]) [N/m]"),
				{Name: "steps", Type: funcs.ListOf(numLength), Optional: true, Doc: "positions [m] where b jumps (layer boundaries), e.g. [6 m, 12 m]"}},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				f, err := fnArg(args[1])
				if err != nil {
					return nil, err
				}
				var steps []float64
				if len(args) > 2 && args[2] != nil {
					steps, _ = args[2].([]float64)
				}
				return withBar(args, func(b *Bar) error {
					b.LoadFns = append(b.LoadFns, *f)
					b.Breaks = append(b.Breaks, steps...)
					return nil
				})
			},
			Summary: "adds a distributed load given as a function of x, with the positions where it steps",
			Doc: "Returns the bar with a distributed axial load b(x) [N/m] added, given as a user function " +
				"of x [m] from the start; positive in +x. Its integrals are taken by adaptive Gauss–Legendre " +
				"quadrature; the function must be finite over the bar. A function that jumps (skin friction " +
				"changing from one soil layer to the next) needs the positions of its jumps in steps: the " +
				"solver ends a piece at each, so the quadrature never spans a jump; without them a jump " +
				"inside a piece fails to converge and is reported, never smoothed over.",
			Formula: "dN/dx + b(x) = 0",
			Source:  srcMech,
		},
		{
			Name: "with_self_weight", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("gamma", numWeight, "weight density [N/m³]; positive acts in +x")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				g, err := numArg(args[1], "gamma")
				if err != nil {
					return nil, err
				}
				return withBar(args, func(b *Bar) error {
					b.Gamma += g
					return nil
				})
			},
			Summary: "adds the self-weight γ·A(x) as a distributed load",
			Doc: "Returns the bar with its own weight added as a distributed load b(x) = γ·A(x) [N/m], γ the " +
				"weight density [N/m³] (e.g. 77 kN/m^3 for steel). It acts in +x: for a hanger measured " +
				"downward from its support give γ positive; for a column measured upward from its base give " +
				"γ negative.",
			Formula: "b(x) = γ·A(x)",
			Source:  "Timoshenko, Strength of Materials Part I, Art. 2 (bar under its own weight)",
		},
		{
			Name: "with_temperature", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"), p("dT", numTemp, "temperature change [K], heating positive"), p("alpha", numPerKelv, "coefficient of thermal expansion [1/K]")},
			Result: barType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				dT, err := numArg(args[1], "dT")
				if err != nil {
					return nil, err
				}
				alpha, err := numArg(args[2], "alpha")
				if err != nil {
					return nil, err
				}
				return withBar(args, func(b *Bar) error {
					for i := range b.Segments {
						b.Segments[i].DT, b.Segments[i].Alpha = dT, alpha
					}
					return nil
				})
			},
			Summary: "sets one temperature change over the whole bar",
			Doc: "Returns the bar with the temperature change dT [K] and thermal expansion coefficient alpha " +
				"[1/K] set on every segment (replacing dT and alpha columns of the segment table). The free " +
				"thermal strain is α·ΔT; restraint turns it into stress.",
			Formula: "N = EA·(du/dx − α·ΔT)",
			Source:  "Gere & Goodno, Mechanics of Materials, §2.5 (thermal effects)",
		},
		{
			Name: "spring_support", Family: family,
			Params: []funcs.Param{p("k", numPerLen, "stiffness [N/m], > 0")},
			Result: supportType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				s := Support{Kind: Spring, K: f64(args[0])}
				if err := checkSupport("support", s); err != nil {
					return nil, err
				}
				return &funcs.RecordValue{Type: supportType, Payload: s, Fields: []funcs.Value{s.K, 0.0}}, nil
			},
			Summary: "an elastic end support",
			Doc:     "An end support for solve_bar: a linear spring of stiffness k [N/m] along the bar; the reaction is R = −k·u.",
			Formula: "R = −k·u",
			Source:  srcMech,
		},
		{
			Name: "gap_support", Family: family,
			Params: []funcs.Param{p("g", numLength, "clearance to the stop [m], ≥ 0"),
				{Name: "k", Type: numPerLen, Optional: true, Doc: "stiffness of the stop [N/m]; omitted: rigid"}},
			Result: supportType,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				s := Support{Kind: Gap, Gap: f64(args[0])}
				if len(args) > 1 && args[1] != nil {
					s.K = f64(args[1])
					if !(s.K > 0) {
						return nil, fmt.Errorf("the stop stiffness k = %g N/m must be positive; hint: omit k for a rigid stop", s.K)
					}
				}
				if err := checkSupport("support", s); err != nil {
					return nil, err
				}
				return &funcs.RecordValue{Type: supportType, Payload: s, Fields: []funcs.Value{s.K, s.Gap}}, nil
			},
			Summary: "a stop behind an initial gap",
			Doc: "An end support for solve_bar: a stop at a clearance g [m] beyond the end (in +x behind the " +
				"end of the bar, in −x behind its start). If the end would move through the clearance, the " +
				"gap closes and the stop holds the end at u = ±g (rigid) or through a spring k [N/m]; " +
				"otherwise the end is free. The result reports gap_closed. A stop only pushes.",
			Formula: "u_end ≤ g, R_end ≤ 0, (u_end − g)·R_end = 0",
			Source:  "Gere & Goodno, Mechanics of Materials, §2.5 (misfits and prestrains; from memory)",
		},
	}
}

func solvers() []*funcs.Def {
	query := func(name, what string, res *funcs.Type, get func(r *Result, x float64) (float64, error), formula string) *funcs.Def {
		return &funcs.Def{
			Name: name, Family: family,
			Params: []funcs.Param{p("res", &funcs.Type{Kind: funcs.Record, Name: "bar_result"}, "a solved bar"), p("x", numLength, "position from the start [m], 0 ≤ x ≤ L")},
			Result: res,
			Call: func(args []funcs.Value) (funcs.Value, error) {
				r, err := resultArg(args[0])
				if err != nil {
					return nil, err
				}
				return get(r, f64(args[1]))
			},
			Summary: what + " at a position of a solved bar",
			Doc: "Returns the " + what + " at x [m] from the start of a bar solved by solve_bar. At a point " +
				"load or joint the value just after x is returned (at x = L the value just before).",
			Formula: formula,
			Source:  srcMech,
		}
	}
	return []*funcs.Def{
		{
			Name: "solve_bar", Family: family,
			Params: []funcs.Param{p("bar", barParam, "the bar"),
				p("start", funcs.AnyType, "support at x = 0: \"fixed\", \"free\", spring_support(k) or gap_support(g, k)"),
				p("end", funcs.AnyType, "support at x = L: same choices")},
			Result: resultType,
			Validate: func(args []*funcs.Type) (*funcs.Type, error) {
				if len(args) != 3 {
					return nil, fmt.Errorf("solve_bar needs a bar and the supports at its start and end")
				}
				if err := validateSupport(args[1], "start"); err != nil {
					return nil, err
				}
				if err := validateSupport(args[2], "end"); err != nil {
					return nil, err
				}
				return resultType, nil
			},
			Call: func(args []funcs.Value) (funcs.Value, error) {
				b, err := barArg(args[0])
				if err != nil {
					return nil, err
				}
				s0, err := supportArg(args[1], "start")
				if err != nil {
					return nil, err
				}
				s1, err := supportArg(args[2], "end")
				if err != nil {
					return nil, err
				}
				r, err := Solve(b, s0, s1)
				if err != nil {
					return nil, err
				}
				return resultValue(r)
			},
			Summary: "solves a bar for reactions, N, σ and u",
			Doc: "Solves the bar held at its start and end. Statically indeterminate bars (fixed at both " +
				"ends, springs, closed gaps) are solved exactly by compatibility, with the flexibility " +
				"integrals ∫dx/(EA) and ∫N₀dx/(EA) in closed form for prismatic and tapered segments and by " +
				"adaptive Gauss–Legendre quadrature (relative 1e-13) otherwise. A bar free at both ends is " +
				"accepted when its loads balance (its start is then taken as fixed in place). Signs: loads, " +
				"reactions and u positive in +x; N and σ positive in tension. The result has R_start, R_end, " +
				"u_start, u_end, elongation, N_max, sigma_max, u_max (largest magnitudes) with positions " +
				"x_N_max, x_sigma_max, x_u_max, gap_closed (0/1) and samples, a bar_samples table of x, N, " +
				"sigma, u at 101 stations and both sides of every jump.",
			Formula: "N = EA(du/dx − αΔT), dN/dx + b = 0; u(L) − u(0) = ∫(N/(EA) + αΔT)dx",
			Source:  srcMech,
		},
		query("bar_N", "axial force", numForce, (*Result).N, "N(x) = −R_start − ΣP(x_i < x) − ∫₀ˣ b dξ"),
		query("bar_sigma", "axial stress", numStress, (*Result).Sigma, "σ(x) = N(x)/A(x)"),
		query("bar_u", "displacement", numLength, (*Result).U, "u(x) = u(0) + ∫₀ˣ (N/(EA) + αΔT) dξ"),
	}
}

func shortcuts() []*funcs.Def {
	return []*funcs.Def{
		{
			Name: "axial_elongation", Family: family,
			Params: []funcs.Param{p("P", numForce, "axial force [N], tension positive"), p("L", numLength, "length [m]"), p("E", numStress, "modulus [Pa], > 0"), p("A", numArea, "area [m²], > 0")},
			Result: numLength,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return positive(Elongation(f64(a[0]), f64(a[1]), f64(a[2]), f64(a[3])), "E·A", f64(a[2])*f64(a[3]))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "({P})*({L})/(({E})*({A}))", Valid: "({E})*({A})>0"},
			Summary:     "elongation P·L/(E·A) of a prismatic bar",
			Doc:         "The change in length δ [m] of a prismatic bar of length L under end forces P (tension positive). Agrees with solve_bar to 1e-10.",
			Formula:     "δ = P·L/(E·A)",
			Source:      "Gere & Goodno, Mechanics of Materials, §2.2, Eq. δ = PL/EA",
		},
		{
			Name: "tapered_rod_elongation", Family: family,
			Params: []funcs.Param{p("P", numForce, "axial force [N]"), p("L", numLength, "length [m]"), p("E", numStress, "modulus [Pa]"),
				p("d1", numLength, "diameter at one end [m]"), p("d2", numLength, "diameter at the other end [m]")},
			Result: numLength,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				e, d1, d2 := f64(a[2]), f64(a[3]), f64(a[4])
				return positive(TaperedElongation(f64(a[0]), f64(a[1]), e, d1, d2), "E·d1·d2", e*d1*d2)
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "4*({P})*({L})/(PI()*({E})*({d1})*({d2}))", Valid: "({E})*({d1})*({d2})>0"},
			Summary:     "elongation 4PL/(πE·d1·d2) of a tapered solid circular bar",
			Doc: "The change in length δ [m] of a solid circular bar whose diameter varies linearly from d1 " +
				"to d2 under end forces P. Exact for the linear taper; the mean-diameter estimate is low " +
				"(by 11 % for d1/d2 = 2). Agrees with solve_bar to 1e-10.",
			Formula: "δ = 4·P·L/(π·E·d1·d2)",
			Source:  "Gere & Goodno, Mechanics of Materials, §2.3 (nonuniform bars; from memory)",
		},
		{
			Name: "self_weight_elongation", Family: family,
			Params: []funcs.Param{p("gamma", numWeight, "weight density [N/m³]"), p("L", numLength, "length [m]"), p("E", numStress, "modulus [Pa]")},
			Result: numLength,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				e := f64(a[2])
				return positive(SelfWeightElongation(f64(a[0]), f64(a[1]), e), "E", e)
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "({gamma})*({L})*({L})/(2*({E}))", Valid: "{E}>0"},
			Summary:     "elongation γL²/(2E) of a prismatic bar hanging under its own weight",
			Doc:         "The elongation δ [m] of a prismatic bar of length L hanging from its top under its own weight, γ the weight density; the area cancels. Agrees with solve_bar to 1e-10.",
			Formula:     "δ = γ·L²/(2·E)",
			Source:      "Timoshenko, Strength of Materials Part I, Art. 2",
		},
		{
			Name: "self_weight_stress", Family: family,
			Params: []funcs.Param{p("gamma", numWeight, "weight density [N/m³]"), p("L", numLength, "length [m]")},
			Result: numStress,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return finiteResult(SelfWeightStress(f64(a[0]), f64(a[1])))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "({gamma})*({L})"},
			Summary:     "largest stress γL of a prismatic bar hanging under its own weight",
			Doc:         "The stress σ_max [Pa] at the support of a prismatic bar of length L hanging under its own weight.",
			Formula:     "σ_max = γ·L",
			Source:      "Timoshenko, Strength of Materials Part I, Art. 2",
		},
		{
			Name: "thermal_restraint_stress", Family: family,
			Params: []funcs.Param{p("E", numStress, "modulus [Pa]"), p("alpha", numPerKelv, "coefficient of thermal expansion [1/K]"), p("dT", numTemp, "temperature change [K]")},
			Result: numStress,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return finiteResult(ThermalRestraintStress(f64(a[0]), f64(a[1]), f64(a[2])))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "-({E})*({alpha})*({dT})"},
			Summary:     "stress −E·α·ΔT of a bar held between rigid supports",
			Doc:         "The stress σ [Pa] in a bar fully restrained between rigid supports when its temperature changes by ΔT; compression (negative) when heated.",
			Formula:     "σ = −E·α·ΔT",
			Source:      "Gere & Goodno, Mechanics of Materials, §2.5 (thermal effects)",
		},
	}
}

// positive guards a shortcut against a zero or negative rigidity.
func positive(v float64, what string, den float64) (funcs.Value, error) {
	if !(den > 0) || !finite(v) {
		return nil, fmt.Errorf("%s must be positive (got %g)", what, den)
	}
	return v, nil
}

// f64 returns a number argument, or NaN when the value is not a number (the
// checker prevents that; NaN then fails the finiteness checks downstream
// instead of panicking).
func f64(v funcs.Value) float64 {
	if x, ok := v.(float64); ok {
		return x
	}
	return math.NaN()
}

// finiteResult returns v, or an error when an argument made it NaN or ±Inf.
func finiteResult(v float64) (funcs.Value, error) {
	if !finite(v) {
		return nil, fmt.Errorf("the result is %g; check that the arguments are finite numbers", v)
	}
	return v, nil
}
