// Package section is the family of cross-section functions: the shapes an
// engineer draws (solid and hollow circles and rectangles, I/H shapes, angles,
// polygons with holes, placed and rotated copies), their geometric properties
// (area, centroid, second moments, radii of gyration) and section integrals
// ∫ f(y, z) dA of a field the sheet defines.
//
// Coordinates: y is horizontal and z vertical in the plane of the section, as
// in EN 1993-1-1 §1.7; I_y = ∫(z − z_c)² dA is the second moment about the
// axis parallel to y through the centroid, I_z = ∫(y − y_c)² dA, and
// I_yz = ∫(y − y_c)(z − z_c) dA. Values are in SI (m, m², m⁴).
//
// A Shape keeps its exact boundary: polygons as vertex rings and circles as
// annuli, never as polygons, so that properties of circles are exact and
// section integrals over them converge spectrally. Holes are regions with a
// negative sign. Polygon integrals use Green's theorem edge by edge, which
// needs no triangulation and is exact for polynomials up to the degree the
// Gauss–Legendre rule resolves; circular regions use polar coordinates with
// the trapezoidal rule in angle (exact for trigonometric polynomials) and
// Gauss–Legendre in radius.
//
// The package registers its functions with the funcs registry in init; the
// Go API (Shape, Integrate, Props) is also used by the composite and plastic
// families.
package section
