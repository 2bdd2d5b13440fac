// Package plastic is the strain-compatibility family: stress–strain laws
// (linear elastic, elastic–perfectly plastic, the parabola–rectangle law for
// concrete, a law written in the sheet), the axial force N(ε) of a composite
// section under a uniform strain, its inverse ε(N) by Brent's method, the
// squash load and the N–ε curve as a table for plots.
//
// Plane sections stay plane beyond the elastic range too, so a centric axial
// force gives one strain ε over the whole section; each part i then carries
// σ_i(ε − α_i·ΔT) on its area, and N(ε) = Σ ∫σ_i dA.
//
// Sign convention: tension positive, compression negative, for strains,
// stresses and forces alike. Parameters that are magnitudes (f_y, f_cd, the
// concrete strains ε_c2 and ε_cu2) are given positive; the laws apply the
// signs. The squash load is returned as a positive resistance.
package plastic
