// Package composite is the family of multi-material (composite) sections:
// parts made of a shape and a material, with a uniform modulus or a modulus
// field E(y, z) written in the sheet; the axial rigidity EA = ∫E dA, the
// modulus-weighted centroid and the flexural rigidities about it; the
// transformed area for a reference modulus; and the elastic response to an
// axial force and a temperature change.
//
// The theory is that of the bar: plane sections stay plane, so the axial
// strain ε is uniform over the section when the force acts at the
// modulus-weighted centroid and the section does not curve; each point
// carries σ = E(ε − α·ΔT) and the parts share N = ∫σ dA. A thermal change
// with unequal α leaves self-equilibrated stresses (their resultant is zero).
// An unsymmetric composite would also curve under ΔT; that curvature is
// taken as restrained (or absent by symmetry) and is not reported.
//
// Sign convention: tension and lengthening positive. Units are SI: Pa, N,
// m, 1/K.
package composite
