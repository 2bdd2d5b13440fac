package bar

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

// Checks against closed-form results of the mechanics of materials, each
// through the general solver (Go API and the registered sheet functions) and
// through the shortcut formula where there is one. The expected values are
// REFERENCES.md group C, computed there to 9 significant figures, so the
// tolerance against them is 1e-8; solver and shortcut must agree to 1e-10.

// C1: prismatic bar δ = PL/(EA), σ = P/A.
// Source: Gere & Goodno, Mechanics of Materials, §2.2; REFERENCES.md C1.
func TestC1Prismatic(t *testing.T) {
	P, L, d, E := 250*kN, 4.2, 30*mm, 210*GPa
	A := math.Pi * d * d / 4
	const wantDelta, wantSigma = 7.07355303 * mm, 353.677651 * MPa

	short := Elongation(P, L, E, A)
	near(t, "PL/EA", short, wantDelta, 1e-8)

	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{L, P}}}
	r := mustSolve(t, b, fixed, free)
	near(t, "solver δ", r.Elongation, wantDelta, 1e-8)
	near(t, "solver σ_max", r.SigmaMax, wantSigma, 1e-8)
	near(t, "solver vs shortcut", r.Elongation, short, 1e-10)
	near(t, "R_start", r.RStart, -P, 1e-12)

	// The same through the sheet functions, with the diameter column.
	bv := call(t, "bar", table([]string{"L", "d", "E"}, []float64{L}, []float64{d}, []float64{E}))
	bv = call(t, "with_point_load", bv, L, P)
	res := call(t, "solve_bar", bv, "fixed", "free")
	near(t, "sheet elongation", field(t, res, "elongation"), short, 1e-10)
	near(t, "sheet sigma_max", field(t, res, "sigma_max"), wantSigma, 1e-8)
	near(t, "axial_elongation", call(t, "axial_elongation", P, L, E, A).(float64), wantDelta, 1e-8)
}

// C2: tapered solid circular bar δ = 4PL/(πE d1 d2).
// Source: Gere & Goodno, Mechanics of Materials, §2.3 (from memory); REFERENCES.md C2.
func TestC2Tapered(t *testing.T) {
	P, L, d1, d2, E := 50*kN, 2.0, 40*mm, 20*mm, 210*GPa
	const want = 0.757880681 * mm
	short := TaperedElongation(P, L, E, d1, d2)
	near(t, "4PL/(πEd1d2)", short, want, 1e-8)

	// Closed-form flexibility (taper in diameter).
	b := &Bar{Segments: []Segment{TaperedDiameter(L, d1, d2, E)}, Points: []PointLoad{{L, P}}}
	r := mustSolve(t, b, fixed, free)
	near(t, "solver (closed form)", r.Elongation, short, 1e-10)

	// The same bar with A(x) as a user function: adaptive quadrature.
	area := &Fn{Name: "A_taper", F: func(x float64) float64 {
		d := d1 + (d2-d1)*x/L
		return math.Pi * d * d / 4
	}}
	bq := &Bar{Segments: []Segment{{L: L, Shape: AreaFunc, AreaFn: area, E: E}}, Points: []PointLoad{{L, P}}}
	rq := mustSolve(t, bq, fixed, free)
	near(t, "solver (quadrature)", rq.Elongation, short, 1e-10)
	// σ_max at the thin end: P/(π d2²/4).
	near(t, "σ_max", rq.SigmaMax, P/(math.Pi*d2*d2/4), 1e-10)
	near(t, "x of σ_max", rq.XSigmaMax, L, 1e-9)

	// The mean-diameter shortcut is 11 % low (REFERENCES.md C2 note).
	dm := (d1 + d2) / 2
	near(t, "mean-diameter estimate", Elongation(P, L, E, math.Pi*dm*dm/4), 0.673672*mm, 1e-6)

	// Through the sheet with d1, d2 columns and tapered_rod_elongation.
	bv := call(t, "bar", table([]string{"L", "d1", "d2", "E"}, []float64{L}, []float64{d1}, []float64{d2}, []float64{E}))
	res := call(t, "solve_bar", call(t, "with_point_load", bv, L, P), "fixed", "free")
	near(t, "sheet", field(t, res, "elongation"), short, 1e-10)
	near(t, "tapered_rod_elongation", call(t, "tapered_rod_elongation", P, L, E, d1, d2).(float64), want, 1e-8)
}

// C3: bar hanging under its own weight, δ = γL²/(2E), σ_max = γL.
// Source: Timoshenko, Strength of Materials Part I, Art. 2; REFERENCES.md C3.
func TestC3SelfWeight(t *testing.T) {
	gamma, L, E, A := 78.5*kN, 100.0, 210*GPa, 1000*mm2 // γ in N/m³; A cancels
	const wantDelta, wantSigma = 1.86904762 * mm, 7.85 * MPa
	near(t, "γL²/2E", SelfWeightElongation(gamma, L, E), wantDelta, 1e-8)
	near(t, "γL", SelfWeightStress(gamma, L), wantSigma, 1e-12)

	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Gamma: gamma}
	r := mustSolve(t, b, fixed, free)
	near(t, "solver δ", r.Elongation, SelfWeightElongation(gamma, L, E), 1e-10)
	near(t, "solver σ_max", r.SigmaMax, SelfWeightStress(gamma, L), 1e-10)
	if r.XSigmaMax != 0 {
		t.Errorf("σ_max at x = %g, want 0 (the support)", r.XSigmaMax)
	}
	near(t, "R_start", r.RStart, -gamma*A*L, 1e-12)

	bv := call(t, "with_self_weight", call(t, "bar_uniform", L, A, E), gamma)
	res := call(t, "solve_bar", bv, "fixed", "free")
	near(t, "sheet δ", field(t, res, "elongation"), call(t, "self_weight_elongation", gamma, L, E).(float64), 1e-10)
	near(t, "sheet σ", field(t, res, "sigma_max"), call(t, "self_weight_stress", gamma, L).(float64), 1e-10)
}

// C4: bar fixed at x = 0 with q(x) = q0·x/L: R = q0L/2, δ_tip = q0L²/(3EA),
// u(L/2) = 0.55 mm. Source: REFERENCES.md C4 (mechanics of materials,
// integration of dN/dx + q = 0).
func TestC4LinearLoad(t *testing.T) {
	q0, L, E, A := 20*kN, 6.0, 200*GPa, 1500*mm2
	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, B0: 0, B1: q0}
	r := mustSolve(t, b, fixed, free)
	near(t, "R", -r.RStart, 60*kN, 1e-12)
	near(t, "δ_tip", r.Elongation, 0.8*mm, 1e-10)
	near(t, "δ_tip = q0L²/(3EA)", r.Elongation, q0*L*L/(3*E*A), 1e-10)
	u, err := r.U(L / 2)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "u(L/2)", u, 0.55*mm, 1e-10)
	n, _ := r.N(L / 2)
	near(t, "N(L/2) = q0(L²−x²)/(2L)", n, q0*(L*L-L*L/4)/(2*L), 1e-12)

	res := call(t, "solve_bar", call(t, "with_line_load", call(t, "bar_uniform", L, A, E), 0.0, q0), "fixed", "free")
	near(t, "sheet u(L/2)", call(t, "bar_u", res, L/2).(float64), 0.55*mm, 1e-10)
	near(t, "sheet R_start", field(t, res, "R_start"), -60*kN, 1e-12)
}

// C5: stepped bar fixed at A, +40 kN at B, +30 kN at C.
// Source: REFERENCES.md C5 (statically determinate stepped bar).
func TestC5Stepped(t *testing.T) {
	E := 200 * GPa
	b := &Bar{Segments: []Segment{Prismatic(1.5, 1200*mm2, E), Prismatic(1.0, 600*mm2, E)},
		Points: []PointLoad{{1.5, 40 * kN}, {2.5, 30 * kN}}}
	r := mustSolve(t, b, fixed, free)
	for _, c := range []struct {
		x, n float64
	}{{0.7, 70 * kN}, {1.5, 30 * kN}, {2.0, 30 * kN}} {
		n, _ := r.N(c.x)
		near(t, "N", n, c.n, 1e-12)
	}
	uB, _ := r.U(1.5)
	near(t, "δ_B", uB, 0.4375*mm, 1e-12)
	near(t, "δ_C", r.Elongation, 0.6875*mm, 1e-12)
	// Shortcut: sum of PL/EA over the segments.
	near(t, "ΣPL/EA", r.Elongation, Elongation(70*kN, 1.5, E, 1200*mm2)+Elongation(30*kN, 1.0, E, 600*mm2), 1e-10)

	segs := table([]string{"L", "A", "E"}, []float64{1.5, 1.0}, []float64{1200 * mm2, 600 * mm2}, []float64{E, E})
	pts := table([]string{"x", "P"}, []float64{1.5, 2.5}, []float64{40 * kN, 30 * kN})
	res := call(t, "solve_bar", call(t, "with_point_loads", call(t, "bar", segs), pts), "fixed", "free")
	near(t, "sheet δ_B", call(t, "bar_u", res, 1.5).(float64), 0.4375*mm, 1e-12)
	near(t, "sheet N_max", field(t, res, "N_max"), 70*kN, 1e-12)
	near(t, "sheet sigma at BC", call(t, "bar_sigma", res, 2.0).(float64), 50*MPa, 1e-12)
}

// C6: bar fixed at both ends, P at a: R_A = P·b/L, R_B = P·a/L, δ_C = R_A·a/(EA).
// Source: Gere & Goodno, Mechanics of Materials, §2.4 (statically
// indeterminate bars); REFERENCES.md C6.
func TestC6FixedFixed(t *testing.T) {
	P, a, L, A, E := 120*kN, 2.0, 5.0, 2000*mm2, 200*GPa
	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{a, P}}}
	r := mustSolve(t, b, fixed, fixed)
	// The supports pull/push against +x: both reactions act in −x.
	near(t, "R_A", -r.RStart, 72*kN, 1e-12)
	near(t, "R_B", -r.REnd, 48*kN, 1e-12)
	uC, _ := r.U(a)
	near(t, "δ_C", uC, 0.36*mm, 1e-12)
	near(t, "δ_C = R_A a/(EA)", uC, Elongation(72*kN, a, E, A), 1e-10)
	if math.Abs(r.Elongation) > 1e-15 {
		t.Errorf("fixed–fixed elongation %g, want 0", r.Elongation)
	}
	res := call(t, "solve_bar", call(t, "with_point_load", call(t, "bar_uniform", L, A, E), a, P), "fixed", "fixed")
	near(t, "sheet R_end", field(t, res, "R_end"), -48*kN, 1e-12)
	near(t, "sheet u_max", field(t, res, "u_max"), 0.36*mm, 1e-12)
	near(t, "sheet x_u_max", field(t, res, "x_u_max"), a, 1e-12)
}

// C7: bar fixed at both ends heated by ΔT: σ = −EαΔT, R = EAαΔT.
// Source: Gere & Goodno, Mechanics of Materials, §2.5; REFERENCES.md C7.
func TestC7ThermalRestraint(t *testing.T) {
	E, alpha, dT, A, L := 210*GPa, 12e-6, 40.0, 2000*mm2, 3.0 // L is free: σ does not depend on it
	near(t, "−EαΔT", ThermalRestraintStress(E, alpha, dT), -100.8*MPa, 1e-12)
	s := Prismatic(L, A, E)
	s.Alpha, s.DT = alpha, dT
	r := mustSolve(t, &Bar{Segments: []Segment{s}}, fixed, fixed)
	sg, _ := r.Sigma(L / 3)
	near(t, "solver σ", sg, -100.8*MPa, 1e-12)
	near(t, "R", r.RStart, 201.6*kN, 1e-12)
	near(t, "solver vs shortcut", sg, ThermalRestraintStress(E, alpha, dT), 1e-10)

	// Per-segment columns dT, alpha over two segments of different area:
	// the force is the same, EαΔT·L / Σ(L_i/A_i).
	segs := table([]string{"L", "A", "E", "dT", "alpha"}, []float64{1, 2}, []float64{A, 2 * A}, []float64{E, E}, []float64{dT, dT}, []float64{alpha, alpha})
	res := call(t, "solve_bar", call(t, "bar", segs), "fixed", "fixed")
	near(t, "two segments R_start", field(t, res, "R_start"), E*alpha*dT*3/(1/A+2/(2*A)), 1e-12)
	res = call(t, "solve_bar", call(t, "with_temperature", call(t, "bar_uniform", L, A, E), dT, alpha), "fixed", "fixed")
	near(t, "with_temperature σ", call(t, "bar_sigma", res, 1.0).(float64), call(t, "thermal_restraint_stress", E, alpha, dT).(float64), 1e-10)
}

// C10: pile, load shed by uniform skin friction to zero at the toe, δ = PL/(2EA).
// Source: REFERENCES.md C10 (common practice for friction piles).
func TestC10FrictionPile(t *testing.T) {
	P, L, A, E := 1500*kN, 20.0, 0.4*0.4, 30*GPa
	const want = 3.125 * mm
	// x downward from the head; P pushes down (+x); friction b = −P/L up.
	// Free at both ends: the loads balance.
	b := &Bar{Segments: []Segment{Prismatic(L, A, E)}, Points: []PointLoad{{0, P}}, B0: -P / L, B1: -P / L}
	r := mustSolve(t, b, free, free)
	near(t, "shortening", -r.Elongation, want, 1e-10)
	near(t, "shortcut PL/(2EA)", -r.Elongation, Elongation(P, L, E, A)/2, 1e-10)
	near(t, "N_max at the head", r.NMax, P, 1e-12)
	// Same with the head held and the friction as the only load.
	b2 := &Bar{Segments: []Segment{Prismatic(L, A, E)}, B0: -P / L, B1: -P / L}
	r2 := mustSolve(t, b2, fixed, free)
	near(t, "head held", -r2.Elongation, want, 1e-10)
	near(t, "head reaction", r2.RStart, P, 1e-12)
	// Friction as a user function: same result by quadrature.
	fr := funcs.FuncValue{Name: "skin", Call: func(a ...float64) float64 { return -P / L }}
	bv := call(t, "with_line_load_fn", call(t, "bar_uniform", L, A, E), &fr)
	res := call(t, "solve_bar", bv, "fixed", "free")
	near(t, "user-function friction", -field(t, res, "elongation"), want, 1e-10)
}
