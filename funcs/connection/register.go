package connection

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

var (
	dimL      = units.Base(units.Length)
	dimA      = dimL.Mul(dimL)
	dimForce  = units.Base(units.Mass).Mul(dimL).Div(units.Base(units.Time).Mul(units.Base(units.Time)))
	dimStress = dimForce.Div(dimA)
)

// K2 are the factors k_2 of EN 1993-1-8 Table 3.4 (from memory).
const (
	K2        = 0.9
	K2Counter = 0.63 // countersunk bolts
)

// TensionResistance returns F_t,Rd = k_2·f_ub·A_s/γ_M2 of a bolt or threaded
// rod, EN 1993-1-8:2005 Table 3.4 (from memory).
func TensionResistance(fub, as, gammaM2, k2 float64) (float64, error) {
	for _, a := range []struct {
		n string
		v float64
	}{{"f_ub", fub}, {"A_s", as}, {"gamma_M2", gammaM2}, {"k_2", k2}} {
		if !(a.v > 0) || math.IsInf(a.v, 0) {
			return 0, fmt.Errorf("%s must be positive, got %g", a.n, a.v)
		}
	}
	if gammaM2 < 1 {
		return 0, fmt.Errorf("gamma_M2 = %g is below 1; a partial factor on resistance is at least 1 (EN 1993-1-8 recommends 1.25)", gammaM2)
	}
	if k2 > 1 {
		return 0, fmt.Errorf("k_2 = %g exceeds 1; Table 3.4 gives 0.9 (0.63 for countersunk bolts)", k2)
	}
	return k2 * fub * as / gammaM2, nil
}

func init() {
	num := funcs.Num
	funcs.Register(&funcs.Def{
		Name: "bolt_tension_resistance", Family: "connection",
		Params: []funcs.Param{
			{Name: "f_ub", Type: num(dimStress), Doc: "ultimate tensile strength of the bolt or rod, Pa (bolt_class(\"8.8\").f_ub)"},
			{Name: "A_s", Type: num(dimA), Doc: "tensile stress area of the thread, m² (thread(\"M16\").A_s)"},
			{Name: "gamma_M2", Type: num(units.None), Doc: "partial factor, ≥ 1 (1.25 recommended; the national annex decides)"},
			{Name: "k_2", Type: num(units.None), Optional: true, Doc: "0.9 (default), 0.63 for countersunk bolts"},
		},
		Result: num(dimForce),
		Call: func(a []funcs.Value) (funcs.Value, error) {
			f := func(i int) float64 { v, _ := a[i].(float64); return v }
			k2 := K2
			if len(a) > 3 && a[3] != nil {
				k2 = f(3)
			}
			return TensionResistance(f(0), f(1), f(2), k2)
		},
		Summary: "EN 1993-1-8 tension resistance k_2·f_ub·A_s/γ_M2 of a bolt or threaded rod",
		Doc: "The design tension resistance of a bolt or a threaded rod through its thread, F_t,Rd = k_2·f_ub·A_s/γ_M2. " +
			"Punching shear of the plate under the head or nut (B_p,Rd) and the resistance of the unthreaded shank are " +
			"separate checks.",
		Formula: "F_t,Rd = k_2·f_ub·A_s/γ_M2",
		Source:  "EN 1993-1-8:2005 Table 3.4 (from memory)",
		// The default of k_2 is K2 (0.9); the condition is TensionResistance's.
		Spreadsheet: &funcs.Spreadsheet{
			Formula: "({k_2=0.9})*({f_ub})*({A_s})/({gamma_M2})",
			Valid:   "AND({f_ub}>0,{A_s}>0,{gamma_M2}>=1,{k_2=0.9}>0,{k_2=0.9}<=1)",
		},
	})
}
