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
// A Shape keeps its exact boundary: polygons as vertex rings, circles as
// annuli and circular arcs (root fillets of rolled profiles, rounded tube
// corners) as sectors, never as polygons, so that their properties are exact
// and section integrals over them converge spectrally. Holes are regions with a
// negative sign. Polygon integrals use Green's theorem edge by edge, which
// needs no triangulation and is exact for polynomials up to the degree the
// Gauss–Legendre rule resolves; circular regions use polar coordinates with
// the trapezoidal rule in angle (exact for trigonometric polynomials) and
// Gauss–Legendre in radius.
//
// Whether two shapes overlap (join, cut, the parts of a composite) is decided
// by their common area, computed by clipping boundary against boundary:
// exact for polygons, with circles and arcs through inscribed polygons at
// fixed angles, so that shapes sharing a boundary (a profile and the block
// cut around it) touch exactly.
//
// The package registers its functions with the funcs registry in init; the
// Go API (Shape, Integrate, Props) is also used by the composite and plastic
// families.
package section
