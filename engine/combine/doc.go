// Package combine holds combination rules for actions as data, each factor
// with its published source, and generates the combinations of a sheet's
// actions for each limit state.
//
// Two families of rules are built in:
//
//   - EN 1990: the fundamental combination of (6.10), or (6.10a) with
//     (6.10b), for the ultimate limit state (STR/GEO, partial factors of
//     Table A1.2(B)); static equilibrium (EQU, Table A1.2(A)); the
//     characteristic, frequent and quasi-permanent combinations for
//     serviceability; and the accidental combination (6.11b). The ψ
//     factors come from Table A1.1.
//   - ASCE/SEI 7: the basic combinations for strength design (LRFD,
//     §2.3.1) and for allowable stress design (ASD, §2.4.1), without the
//     seismic ones.
//
// A factor whose value was not confirmed against the published text is
// marked FromMemory, and every listing of it must say "(from memory)". A
// sheet may replace the factors of EN 1990 (a national annex, a client's
// brief); the replaced factor then names the sheet's line as its source.
//
// Combinations factor the actions, not their effects (EN 1990 6.3.2(1):
// Fd = γf·Frep): the sheet's cells that depend on actions are recomputed in
// each combination with every action at its factored value. Every variable
// action takes its turn as the leading one; the accompanying ones are taken
// in every subset (an action whose effect is favourable is then left out,
// EN 1990 6.4.3.2(3) and ASCE/SEI 7 §2.3.1, "effects of one or more loads
// not acting", from memory); permanent actions marked favourable are taken
// with their unfavourable and their favourable factor in turn.
//
// The package uses only the standard library.
package combine
