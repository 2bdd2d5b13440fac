// Package units holds Sheaf's physical dimensions, its catalogue of units,
// the parser for unit expressions and the formatting of values in a unit.
//
// It imports only the standard library: every later phase (the sheet reader,
// the checker, the function families, the exporters) stands on it.
//
// # Dimensions
//
// A Dim is the exponents of the seven SI base dimensions and of plane angle
// in a fixed array of int8, stored doubled. Products, quotients and powers
// are array arithmetic that allocates nothing, which matters because the
// checker combines dimensions at every node of every expression. Doubling
// makes half exponents exact, so √MPa inside an empirical formula has a
// dimension (L^(-1/2)·M^(1/2)·T^-1) rather than an error; finer fractions
// are rejected. Exponents are checked, never wrapped: a product whose
// exponent would pass 63 (126 doubled) is Overflow, which the checker
// reports at the expression.
//
// # What the catalogue leaves out, and why
//
// Absolute temperature scales are affine (0 °C is 273.15 K), so a reading
// and a difference cannot share one factor. Structural calculations need
// differences (ΔT of a restrained bar), so the catalogue has K, degC and degF
// as temperature intervals only: 1 degC = 1 K and 1 degF = 5/9 K. A
// temperature reading must be written as a difference from a stated datum.
//
// Plane angle is a dimension of its own, although the SI counts the radian
// as one: rad has factor 1, deg (also °) π/180 and gon π/200, and none of
// them is a plain number. A plain number in a cell shown in degrees, or the
// sine of one, is then an error at check time instead of 35 rad shown as
// 2005°; a formula that needs the number of radians divides by `1 rad`.
// Percent (%), per mille (‰, also "permille") and microstrain (µε, also
// "ue", "uε", "microstrain") are plain numbers with factors 0.01, 0.001 and
// 1e-6.
//
// Mass density and weight density are different quantities. `pcf` is the
// weight density lbf/ft³ (the "unit weight" of US practice, comparable with
// kN/m³); the mass density pound per cubic foot is written `lb/ft^3` (and
// compares with kg/m³). `lb` is the pound mass; the pound force is `lbf`.
//
// # Unit expressions
//
// Parse reads the ways engineers write units: products `kN*m`, `kN·m`;
// quotients `N/mm^2`, `kN/m^3`, `1/K`; powers `m^2`, `m^-1`, `N/mm²`, `m⁻¹`,
// `MPa^0.5`, `MPa^(1/2)`, and the digit suffix of section tables, `mm2` and
// `mm4`. Decisions:
//
//   - Everything after a `/` divides: `W/m*K` is W/(m·K) and `N/mm/s` is
//     N/(mm·s), the reading engineers intend when they write a solidus once
//     and keep going. Parentheses group explicitly: `kN/(m*s)`.
//   - A product needs an operator (`*`, `·`, `⋅` or `×`); a space or a dot
//     does not multiply, since `kN.m` sits too close to a decimal point and
//     `kN m` inside a sheet line is ambiguous. The error says how to write it.
//   - SI prefixes (p n µ m c d da h k M G T; µ may be written u) apply to the
//     SI units (m, g, s, N, Pa, J, W, Hz, K, A, mol, cd, rad) and to nothing
//     else, so `kft` is an error and `kip` is not "kilo-ip".
//   - Names are case-sensitive (`mN` is not `MN`); an unknown name gets a
//     suggestion, case-insensitive match first ("unknown unit `kn`; did you
//     mean `kN`?").
//
// The normalised Symbol of a parsed unit uses ASCII operators around the SI
// letter symbols: `kN*m`, `N/mm^2`, `m^-1`, `MPa^(1/2)`, `µm`. ASCII
// operators survive every file, terminal and spreadsheet, and the symbol
// parses back to the same unit. Unit.Pretty gives the typographic form
// (`kN·m`, `N/mm²`) for reports; it parses back too.
//
// # Display
//
// Format writes a value in a unit with a number of significant figures;
// Preferred picks the unit to show for a dimension from an ordered list per
// System (metric engineering: kN, MPa, mm, kN*m, kN/m, ...; US customary:
// kip, ksi, in, kip*ft, klf, ...) and falls back to the coherent SI unit
// written in base units (kg*m^-1*s^-2).
//
// Conversion factors are exact where a definition is exact (the 1959 yard
// and pound agreement, standard gravity) and follow NIST SP 811 (2008),
// Appendix B.
package units
