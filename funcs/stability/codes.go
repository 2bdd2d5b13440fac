package stability

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/funcs"
)

// ImperfectionFactors are the α of the buckling curves of EN 1993-1-1
// Table 6.1 (from memory; REFERENCES.md D1).
var ImperfectionFactors = map[string]float64{"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}

var curveNames = []string{"a0", "a", "b", "c", "d"}

// Chi returns the flexural buckling reduction factor of EN 1993-1-1
// §6.3.1.2(1), Eq. (6.49) (from memory):
//
//	Φ = 0.5·[1 + α·(λ̄ − 0.2) + λ̄²],  χ = 1/(Φ + √(Φ² − λ̄²)) ≤ 1
//
// for the relative slenderness λ̄ ≥ 0 and curve "a0", "a", "b", "c" or "d".
func Chi(lambda float64, curve string) (float64, error) {
	alpha, ok := ImperfectionFactors[strings.ToLower(strings.TrimSpace(curve))]
	if !ok {
		return 0, fmt.Errorf("no buckling curve %q; the curves of EN 1993-1-1 Table 6.1 are %s (for another code's curve use buckling_factor with a table)", curve, strings.Join(curveNames, ", "))
	}
	if math.IsNaN(lambda) || math.IsInf(lambda, 0) || lambda < 0 {
		return 0, fmt.Errorf("the relative slenderness must be a finite number ≥ 0, got %g", lambda)
	}
	phi := 0.5 * (1 + alpha*(lambda-0.2) + lambda*lambda)
	return math.Min(1, 1/(phi+math.Sqrt(phi*phi-lambda*lambda))), nil
}

// LambdaBar returns λ̄ = (L_cr/i)/λ_1 with λ_1 = π·√(E/f_y), the relative
// slenderness of a class 1, 2 or 3 section in flexural buckling, EN 1993-1-1
// §6.3.1.3(1), Eq. (6.50) (from memory).
func LambdaBar(lcr, i, fy, e float64) (float64, error) {
	for _, a := range []struct {
		n string
		v float64
	}{{"L_cr", lcr}, {"i", i}, {"f_y", fy}, {"E", e}} {
		if err := pos(a.n, a.v); err != nil {
			return 0, err
		}
	}
	return lcr / i / (math.Pi * math.Sqrt(e/fy)), nil
}

// FcrE3 returns the critical stress for flexural buckling of AISC 360-16
// §E3 (from memory; REFERENCES.md D2): F_e = π²E/(L_c/r)²; when
// L_c/r ≤ 4.71·√(E/F_y) (F_y/F_e ≤ 2.25) F_cr = 0.658^(F_y/F_e)·F_y
// (Eq. E3-2), else F_cr = 0.877·F_e (Eq. E3-3).
func FcrE3(fy, e, slender float64) (float64, error) {
	for _, a := range []struct {
		n string
		v float64
	}{{"F_y", fy}, {"E", e}, {"L_c/r", slender}} {
		if err := pos(a.n, a.v); err != nil {
			return 0, err
		}
	}
	fe := math.Pi * math.Pi * e / (slender * slender)
	if slender <= 4.71*math.Sqrt(e/fy) {
		return math.Pow(0.658, fy/fe) * fy, nil
	}
	return 0.877 * fe, nil
}

// chiForm is Chi as a spreadsheet formula: α by the curve's name, as
// Chi reads it (TRIM and the spreadsheet's comparison of texts, which
// ignores case, do what strings.TrimSpace and ToLower do for a name padded
// with spaces; a name padded with tabs, which Go trims, is an error in the
// workbook: the safe side), then Φ and χ as in Chi, with products for the
// squares as in Go.
// Source: EN 1993-1-1:2005 §6.3.1.2(1), Eq. (6.49) and Table 6.1 (from memory).
func chiForm() *funcs.Spreadsheet {
	// &"": excelize's calculator evaluates TRIM of a bare cell reference
	// inside SQRT and MIN wrongly (to 0); of a text expression rightly.
	name := "TRIM({curve}&\"\")"
	l := "({lambda_bar})"
	// α: the factor of the first curve whose name matches; the last
	// curve's when none does, which Valid then refuses.
	alpha := strconv.FormatFloat(ImperfectionFactors[curveNames[len(curveNames)-1]], 'G', -1, 64)
	names := make([]string, len(curveNames))
	for i := len(curveNames) - 1; i >= 0; i-- {
		is := name + "=" + strconv.Quote(curveNames[i])
		names[i] = is
		if i < len(curveNames)-1 {
			alpha = "IF(" + is + "," + strconv.FormatFloat(ImperfectionFactors[curveNames[i]], 'G', -1, 64) + "," + alpha + ")"
		}
	}
	phi := "(0.5*(1+" + alpha + "*(" + l + "-0.2)+" + l + "*" + l + "))"
	return &funcs.Spreadsheet{
		Formula: "MIN(1,1/(" + phi + "+SQRT(" + phi + "*" + phi + "-" + l + "*" + l + ")))",
		Valid:   "AND(" + l + ">=0,OR(" + strings.Join(names, ",") + "))",
	}
}

func codeDefs() []*funcs.Def {
	return []*funcs.Def{
		{
			Name: "buckling_reduction", Family: family,
			Params: []funcs.Param{p("lambda_bar", numPure, "relative slenderness λ̄ ≥ 0"),
				{Name: "curve", Type: funcs.StringType, Doc: "buckling curve \"a0\", \"a\", \"b\", \"c\" or \"d\" (EN 1993-1-1 Table 6.2 says which for the section)"}},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				c, _ := a[1].(string)
				return Chi(num(a[0]), c)
			},
			Spreadsheet: chiForm(),
			Summary:     "EN 1993-1-1 reduction factor χ(λ̄, curve) for flexural buckling",
			Doc: "The reduction factor χ for flexural buckling of a uniform member in compression, from the relative " +
				"slenderness λ̄ and the buckling curve, with the imperfection factors α = 0.13 (a0), 0.21 (a), 0.34 (b), " +
				"0.49 (c), 0.76 (d). χ = 1 up to λ̄ = 0.2. The choice of curve (EN 1993-1-1 Table 6.2, EN 1994-1-1 " +
				"Table 6.5 for composite columns) and N_b,Rd = χ·A·f_y/γ_M1 stay in the sheet. For another code's " +
				"curve use buckling_factor with a table.",
			Formula: "Φ = 0.5·[1 + α·(λ̄ − 0.2) + λ̄²]; χ = 1/(Φ + √(Φ² − λ̄²)) ≤ 1",
			Source:  "EN 1993-1-1:2005 §6.3.1.2(1), Eq. (6.49) and Table 6.1 (from memory)",
		},
		{
			Name: "lambda_bar", Family: family,
			Params: []funcs.Param{p("L_cr", numLength, "buckling length [m], > 0"), p("i", numLength, "radius of gyration about the buckling axis [m], > 0"),
				p("f_y", numStress, "yield strength [Pa], > 0"), p("E", numStress, "modulus [Pa], > 0")},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return LambdaBar(num(a[0]), num(a[1]), num(a[2]), num(a[3]))
			},
			Summary: "relative slenderness (L_cr/i)/λ_1, λ_1 = π√(E/f_y), class 1–3 sections",
			Doc: "The relative slenderness λ̄ of a class 1, 2 or 3 section in flexural buckling from its buckling length and " +
				"radius of gyration: λ̄ = (L_cr/i)/λ_1 with λ_1 = π·√(E/f_y) (93.9·ε for E = 210 GPa). It equals " +
				"√(A·f_y/N_cr) (relative_slenderness). Class 4 sections need the effective area: use relative_slenderness.",
			Formula:     "λ̄ = (L_cr/i)/(π·√(E/f_y))",
			Source:      "EN 1993-1-1:2005 §6.3.1.3(1), Eq. (6.50) (from memory)",
			Spreadsheet: &funcs.Spreadsheet{Formula: "({L_cr})/({i})/(PI()*SQRT(({E})/({f_y})))", Valid: "AND({L_cr}>0,{i}>0,{f_y}>0,{E}>0)"},
		},
		{
			Name: "fcr_e3", Family: family,
			Params: []funcs.Param{p("F_y", numStress, "specified minimum yield stress [Pa], > 0"), p("E", numStress, "modulus [Pa], > 0"),
				p("Lc_r", numPure, "slenderness L_c/r, > 0 (AISC 360 advises ≤ 200)")},
			Result: numStress,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return FcrE3(num(a[0]), num(a[1]), num(a[2]))
			},
			Summary: "AISC 360 E3 critical stress F_cr for flexural buckling",
			Doc: "The critical stress F_cr of AISC 360-16 §E3 for flexural buckling of members without slender elements: " +
				"inelastic (E3-2) up to L_c/r = 4.71·√(E/F_y), elastic (E3-3) beyond. The nominal strength is " +
				"P_n = F_cr·A_g; φ_c = 0.90 (LRFD) or Ω_c = 1.67 (ASD) stay in the sheet.",
			Formula: "F_e = π²E/(L_c/r)²; F_cr = 0.658^(F_y/F_e)·F_y if L_c/r ≤ 4.71√(E/F_y), else 0.877·F_e",
			Source:  "AISC 360-16 §E3, Eqs. E3-2, E3-3, E3-4 (from memory)",
			// F_e = π²·E/(s·s) in both branches. POWER and PI()^2: excelize's
			// calculator refuses this IF with PI()*PI() or 0.658^(…) inside
			// once the validity condition divides it.
			Spreadsheet: &funcs.Spreadsheet{
				Formula: "IF(({Lc_r})<=4.71*SQRT(({E})/({F_y})),POWER(0.658,({F_y})/(PI()^2*({E})/(({Lc_r})*({Lc_r}))))*({F_y}),0.877*(PI()^2*({E})/(({Lc_r})*({Lc_r}))))",
				Valid:   "AND({F_y}>0,{E}>0,{Lc_r}>0)",
			},
		},
	}
}
