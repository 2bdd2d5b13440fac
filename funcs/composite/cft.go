package composite

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// CFT is the plastic resistance of a concrete-filled circular tube.
type CFT struct {
	NplRd, EtaA, EtaC, Aa, Ac float64
}

// CFTResistance returns the plastic resistance to compression of a
// concrete-filled circular tube of outside diameter d and wall t, EN 1994-1-1
// §6.7.3.2(1) and (6) (from memory; REFERENCES.md C11):
//
//	N_pl,Rd = η_a·A_a·f_yd + A_c·f_cd·(1 + η_c·(t/d)·(f_y/f_ck))
//
// with, for λ̄ ≤ 0.5 and e/d < 0.1, η_a0 = 0.25·(3 + 2λ̄) ≤ 1 and
// η_c0 = 4.9 − 18.5λ̄ + 17λ̄² ≥ 0, η_a = η_a0 + (1 − η_a0)·10e/d,
// η_c = η_c0·(1 − 10e/d); otherwise η_a = 1, η_c = 0 (Eq. 6.30 with the
// coefficient 1.0 of filled tubes). e is the eccentricity M_Ed/N_Ed.
func CFTResistance(d, t, fyd, fy, fcd, fck, lambda, e float64) (CFT, error) {
	for _, a := range []struct {
		n string
		v float64
	}{{"d", d}, {"t", t}, {"f_yd", fyd}, {"f_y", fy}, {"f_cd", fcd}, {"f_ck", fck}} {
		if !(a.v > 0) || math.IsInf(a.v, 0) {
			return CFT{}, fmt.Errorf("%s must be positive, got %g", a.n, a.v)
		}
	}
	if !(2*t < d) {
		return CFT{}, fmt.Errorf("the wall t = %g m leaves no core in a tube of d = %g m", t, d)
	}
	if !(lambda >= 0) || math.IsInf(lambda, 0) || !(e >= 0) || math.IsInf(e, 0) {
		return CFT{}, fmt.Errorf("lambda_bar and e must be finite and ≥ 0, got %g and %g m", lambda, e)
	}
	di := d - 2*t
	r := CFT{Aa: math.Pi * (d*d - di*di) / 4, Ac: math.Pi * di * di / 4, EtaA: 1}
	if ed := e / d; lambda <= 0.5 && ed < 0.1 {
		ea0 := math.Min(1, 0.25*(3+2*lambda))
		ec0 := math.Max(0, 4.9-18.5*lambda+17*lambda*lambda)
		r.EtaA = ea0 + (1-ea0)*10*ed
		r.EtaC = ec0 * (1 - 10*ed)
	}
	r.NplRd = r.EtaA*r.Aa*fyd + r.Ac*fcd*(1+r.EtaC*(t/d)*(fy/fck))
	return r, nil
}

// CFTType is the record type "cft_resistance".
var CFTType = funcs.RecordOf("cft_resistance",
	funcs.Field{Name: "N_plRd", Type: funcs.Num(Force), Doc: "plastic resistance to compression, N"},
	funcs.Field{Name: "eta_a", Type: funcs.Num(units.None), Doc: "factor on the steel (≤ 1 when the tube is confining)"},
	funcs.Field{Name: "eta_c", Type: funcs.Num(units.None), Doc: "confinement factor on the concrete (0 outside the clause's range)"},
	funcs.Field{Name: "A_a", Type: funcs.Num(L.Mul(L)), Doc: "steel area π(d² − (d − 2t)²)/4, m²"},
	funcs.Field{Name: "A_c", Type: funcs.Num(L.Mul(L)), Doc: "concrete area π(d − 2t)²/4, m²"},
)

// cftForm is CFTResistance as spreadsheet formulas, in the order of its
// operations: the confinement applies for λ̄ ≤ 0.5 and e/d < 0.1.
// Source: EN 1994-1-1:2004 §6.7.3.2(1) Eq. (6.30) and (6), Eqs. (6.33)–(6.36) (from memory).
func cftForm() *funcs.Spreadsheet {
	di := "(({d})-2*({t}))"
	ed := "(({e=0})/({d}))"
	l := "({lambda_bar})"
	confined := "AND(" + l + "<=0.5," + ed + "<0.1)"
	ea0 := "MIN(1,0.25*(3+2*" + l + "))"
	ec0 := "MAX(0,4.9-18.5*" + l + "+17*" + l + "*" + l + ")"
	etaA := "IF(" + confined + "," + ea0 + "+(1-" + ea0 + ")*10*" + ed + ",1)"
	etaC := "IF(" + confined + "," + ec0 + "*(1-10*" + ed + "),0)"
	// π as a number, not PI(): see section's piText.
	aa := "(3.141592653589793*(({d})*({d})-" + di + "*" + di + ")/4)"
	ac := "(3.141592653589793*" + di + "*" + di + "/4)"
	return &funcs.Spreadsheet{
		Valid: "AND({d}>0,{t}>0,{f_yd}>0,{f_y}>0,{f_cd}>0,{f_ck}>0,2*({t})<({d})," + l + ">=0,({e=0})>=0)",
		Fields: map[string]string{
			"N_plRd": "(" + etaA + ")*" + aa + "*({f_yd})+" + ac + "*({f_cd})*(1+(" + etaC + ")*(({t})/({d}))*(({f_y})/({f_ck})))",
			"eta_a":  etaA,
			"eta_c":  etaC,
			"A_a":    aa,
			"A_c":    ac,
		},
	}
}

func init() {
	st := func(n, doc string) funcs.Param { return funcs.Param{Name: n, Type: funcs.Num(Stress), Doc: doc} }
	ln := func(n, doc string) funcs.Param { return funcs.Param{Name: n, Type: funcs.Num(L), Doc: doc} }
	funcs.Register(&funcs.Def{
		Name: "cft_resistance", Family: family,
		Params: []funcs.Param{ln("d", "outside diameter of the tube, m"), ln("t", "wall thickness, m; 2t < d"),
			st("f_yd", "design yield strength of the tube, Pa"), st("f_y", "characteristic yield strength, Pa (in the confinement term)"),
			st("f_cd", "design strength of the concrete, Pa"), st("f_ck", "characteristic cylinder strength, Pa"),
			{Name: "lambda_bar", Type: funcs.Num(units.None), Doc: "relative slenderness of the column (confinement applies up to 0.5)"},
			{Name: "e", Type: funcs.Num(L), Optional: true, Doc: "eccentricity M_Ed/N_Ed, m; default 0 (confinement applies below e/d = 0.1)"}},
		Result: CFTType,
		Call: func(a []funcs.Value) (funcs.Value, error) {
			e := 0.0
			if len(a) > 7 && a[7] != nil {
				e = num(a[7])
			}
			r, err := CFTResistance(num(a[0]), num(a[1]), num(a[2]), num(a[3]), num(a[4]), num(a[5]), num(a[6]), e)
			if err != nil {
				return nil, err
			}
			return &funcs.RecordValue{Type: CFTType, Fields: []funcs.Value{r.NplRd, r.EtaA, r.EtaC, r.Aa, r.Ac}, Payload: r}, nil
		},
		Spreadsheet: cftForm(),
		Summary:     "EN 1994-1-1 plastic resistance of a concrete-filled circular tube, with confinement",
		Doc: "The plastic resistance to compression N_pl,Rd of a concrete-filled circular hollow section. For a stocky " +
			"column (λ̄ ≤ 0.5) with a small eccentricity (e/d < 0.1) the tube confines the core: the concrete strength " +
			"rises by η_c·(t/d)·(f_y/f_ck) while the steel's share falls to η_a. Otherwise η_a = 1, η_c = 0 and the " +
			"result is A_a·f_yd + A_c·f_cd (the coefficient 1.0 of filled tubes). The partial factors are in f_yd and " +
			"f_cd, from the local code.",
		Formula: "N_pl,Rd = η_a·A_a·f_yd + A_c·f_cd·(1 + η_c·(t/d)·(f_y/f_ck)); η_a0 = 0.25(3 + 2λ̄) ≤ 1; η_c0 = 4.9 − 18.5λ̄ + 17λ̄² ≥ 0",
		Source:  "EN 1994-1-1:2004 §6.7.3.2(1) Eq. (6.30) and (6), Eqs. (6.33)–(6.36) (from memory)",
	})
}
