package bar

import "math"

// Elongation returns δ = P·L/(E·A) [m] for a prismatic bar with an end load
// P [N], length L [m], modulus E [Pa] and area A [m²].
// Source: Gere & Goodno, Mechanics of Materials, §2.2 (δ = PL/EA);
// Timoshenko, Strength of Materials Part I, Art. 1.
func Elongation(p, l, e, a float64) float64 { return p * l / (e * a) }

// TaperedElongation returns δ = 4·P·L/(π·E·d1·d2) [m] for a solid circular
// bar whose diameter varies linearly from d1 to d2 [m] under end loads P [N].
// It is exact for the linear taper (∫dx/d² = L/(d1·d2)); the mean-diameter
// shortcut underestimates it. Source: Gere & Goodno, Mechanics of
// Materials, §2.3, tapered bar example (formula from memory).
func TaperedElongation(p, l, e, d1, d2 float64) float64 {
	return 4 * p * l / (math.Pi * e * d1 * d2)
}

// SelfWeightElongation returns δ = γ·L²/(2·E) [m] for a prismatic bar
// hanging under its own weight, γ [N/m³] the weight density. The area
// cancels. Source: Timoshenko, Strength of Materials Part I, Art. 2.
func SelfWeightElongation(gamma, l, e float64) float64 { return gamma * l * l / (2 * e) }

// SelfWeightStress returns σ_max = γ·L [Pa] at the support of a prismatic bar
// hanging under its own weight. Source: Timoshenko, Strength of Materials
// Part I, Art. 2.
func SelfWeightStress(gamma, l float64) float64 { return gamma * l }

// ThermalRestraintStress returns σ = −E·α·ΔT [Pa], the stress in a bar held
// between rigid supports and heated by ΔT [K] (compression when heated).
// Source: Gere & Goodno, Mechanics of Materials, §2.5 (thermal effects).
func ThermalRestraintStress(e, alpha, dT float64) float64 { return -e * alpha * dT }
