package bar

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

// LateralStrain returns ε_lat = −ν·ε, the strain across a bar in the 1-D
// stress state (only the axial stress non-zero), for the axial strain ε
// (lengthening positive) and Poisson's ratio ν, −1 < ν ≤ 0.5.
// Source: Gere & Goodno, Mechanics of Materials, §1.6 (Poisson's ratio).
func LateralStrain(eps, nu float64) (float64, error) {
	if math.IsNaN(eps) || math.IsInf(eps, 0) {
		return 0, fmt.Errorf("the axial strain must be finite, got %g", eps)
	}
	if !(nu > -1 && nu <= 0.5) {
		return 0, fmt.Errorf("Poisson's ratio must lie in (−1, 0.5] for an isotropic material, got %g", nu)
	}
	return -nu * eps, nil
}

func lateralDefs() []*funcs.Def {
	return []*funcs.Def{
		{
			Name: "lateral_strain", Family: family,
			Params: []funcs.Param{p("eps", numPure, "axial strain, lengthening positive"), p("nu", numPure, "Poisson's ratio, −1 < ν ≤ 0.5")},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return LateralStrain(f64(a[0]), f64(a[1]))
			},
			Summary: "strain across the bar −ν·ε (a stretched rod gets thinner)",
			Doc: "The lateral strain of a bar under axial stress alone: ε_lat = −ν·ε in every direction across the bar " +
				"(isotropic, linear elastic). A thermal strain is not multiplied by ν: pass the mechanical strain σ/E. " +
				"Negative for a bar in tension (it contracts), positive in compression.",
			Formula: "ε_lat = −ν·ε",
			Source:  "Gere & Goodno, Mechanics of Materials, §1.6 (Poisson's ratio); Timoshenko, Strength of Materials Part I, §2",
			// A spreadsheet number is always finite: the range of ν is the
			// whole condition.
			Spreadsheet: &funcs.Spreadsheet{Formula: "-({nu})*({eps})", Valid: "AND({nu}>-1,{nu}<=0.5)"},
		},
		{
			Name: "diameter_change", Family: family,
			Params: []funcs.Param{p("d", numLength, "diameter (or any width across the bar) [m], > 0"),
				p("eps", numPure, "axial strain, lengthening positive"), p("nu", numPure, "Poisson's ratio, −1 < ν ≤ 0.5")},
			Result: numLength,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				d := f64(a[0])
				if !(d > 0) || math.IsInf(d, 0) {
					return nil, fmt.Errorf("the diameter must be a positive length, got %g m", d)
				}
				el, err := LateralStrain(f64(a[1]), f64(a[2]))
				if err != nil {
					return nil, err
				}
				return el * d, nil
			},
			Summary: "change of diameter −ν·ε·d of a bar under axial stress",
			Doc: "The change of a bar's diameter (or of any dimension across it) under axial stress alone: Δd = −ν·ε·d, " +
				"negative when the bar is stretched. Small strains: d changes to d·(1 − ν·ε).",
			Formula: "Δd = −ν·ε·d",
			Source:  "Gere & Goodno, Mechanics of Materials, §1.6 (Poisson's ratio)",
			// (−ν·ε)·d in the order Go multiplies.
			Spreadsheet: &funcs.Spreadsheet{Formula: "-({nu})*({eps})*({d})", Valid: "AND({d}>0,{nu}>-1,{nu}<=0.5)"},
		},
	}
}
