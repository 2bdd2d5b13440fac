// Package stability is the family of buckling of compression members: the
// Euler critical load with an effective-length factor, slenderness, radius of
// gyration, the non-dimensional slenderness λ̄ = √(A·f_y/N_cr), and the
// application of a code's buckling curve that the user gives as a table.
//
// Sheaf ships no buckling curve as an authority: the curve values, like the
// partial factors, come from the local code the engineer works to, and the
// sheet states them in a table with its reference beside it.
package stability
