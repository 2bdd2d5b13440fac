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
