// Package bar is the family of axially loaded bars: a straight member along x
// made of segments whose area A(x) and modulus E(x) may be constant, tapered
// linearly in diameter or in area, or given by a user function; loaded by point
// loads, distributed loads b(x) per unit length (uniform, linear, self-weight
// γ·A(x), a user function) and temperature changes; held at its ends by fixed
// supports, elastic springs or stops behind an initial gap.
//
// The solver works from the four relations of the one-dimensional bar,
//
//	ε = du/dx = σ/E + α·ΔT,   N = E·A·(du/dx − α·ΔT),   σ = N/A,   dN/dx + b = 0,
//
// and solves statically indeterminate cases exactly by compatibility: with the
// start reaction R₀ as the redundant, N(x) = −R₀ + N₀(x) and
//
//	u(x) = u(0) − R₀·∫₀ˣ dξ/(EA) + ∫₀ˣ (N₀/(EA) + α·ΔT) dξ,
//
// so that the two end conditions give a 2×2 linear system in u(0) and R₀.
// The flexibility integrals are taken in closed form where the integrand is
// known (prismatic and tapered segments under piecewise-constant N) and by
// error-controlled adaptive Gauss–Legendre quadrature otherwise, piece by
// piece between point loads and segment joints, where N₀ is smooth; a coarse
// mesh is never used.
//
// Sign conventions (common practice): x runs from the start of the bar to its
// end; loads, reactions and displacements are positive in +x; N and σ are
// positive in tension. Reactions are the forces the supports exert on the bar,
// so that R_start + R_end + ΣP + ∫b dx = 0.
//
// The family registers sheet functions in init (see register.go): builders
// that take tables and return a "bar" record, support constructors, solve_bar
// returning a "bar_result" record with a "bar_samples" table for plots, point
// queries on the result, and shortcut formulas for the common cases that agree
// with the general solver to 1e-10.
package bar
