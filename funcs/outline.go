package funcs

// Outliner is implemented by the payload of a record that has a shape to
// draw: a cross-section, or a composite of several. Exporters draw the
// outline (the report's section drawings) without importing the family
// that made it, so the engine keeps its one direction of imports.
type Outliner interface {
	Outline() []OutlineRegion
}

// OutlineRegion is one signed piece of a drawn shape, in the section's own
// coordinates (y to the right, z up; metres). Exactly one of the polygon
// (Y, Z) and the circle (R > 0) is set.
type OutlineRegion struct {
	Sign float64   // +1 for material, −1 for a hole cut from the regions before it
	Part int       // index of the part of a composite (0 for a plain section)
	Y, Z []float64 // polygon vertices in order around the boundary, not closed
	Yc   float64   // circle: centre and radius
	Zc   float64
	R    float64
}

// BarLayouter is implemented by the payload of a solved bar: what a
// drawing of its diagrams shows besides the values along it.
type BarLayouter interface {
	Layout() BarLayout
}

// BarLayout is how a solved bar sits and what holds and loads it.
type BarLayout struct {
	// Gravity is the weight density of the bar's own weight along +x
	// (N/m³): a bar that carries its own weight is vertical, with x
	// downward when it is positive and upward when it is negative; zero
	// for a bar drawn lying along x.
	Gravity     float64
	Start, End  string      // supports: "fixed", "free", "spring" or "stop"
	Points      []PointLoad // point loads, +x positive
	Distributed bool        // a load along the length (own weight, line load, b(x))
}

// PointLoad is a force P (N, +x positive) at x (m) from the start.
type PointLoad struct{ X, P float64 }
