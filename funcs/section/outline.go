package section

import (
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

// sectorSides is the number of sides a quarter of a circle gets in a
// drawing of a sector (a root fillet, a rounded tube corner).
const sectorSides = 16

// Outline returns the regions of the shape for drawings (its Draw regions
// where it has them, so arcs show without construction edges): each polygon as
// it is, each annulus as its outer circle and, when it has a bore, the bore
// as a circle of the opposite sign, and each sector as a polygon through its
// centre and points along its arc.
func (s *Shape) Outline() []funcs.OutlineRegion {
	var out []funcs.OutlineRegion
	for _, r := range s.drawRegions() {
		switch {
		case r.Ring != nil:
			out = append(out, funcs.OutlineRegion{Sign: r.Sign, Y: r.Ring.Y, Z: r.Ring.Z})
		case r.Sec != nil:
			sc := r.Sec
			n := max(2, int(math.Ceil(sc.Phi/(math.Pi/2)*sectorSides)))
			y, z := []float64{sc.Yc}, []float64{sc.Zc}
			for k := range n + 1 {
				sn, cs := math.Sincos(sc.Th0 + sc.Phi*float64(k)/float64(n))
				y, z = append(y, sc.Yc+sc.R*cs), append(z, sc.Zc+sc.R*sn)
			}
			out = append(out, funcs.OutlineRegion{Sign: r.Sign, Y: y, Z: z})
		case r.Ann != nil:
			out = append(out, funcs.OutlineRegion{Sign: r.Sign, Yc: r.Ann.Yc, Zc: r.Ann.Zc, R: r.Ann.Rout})
			if r.Ann.Rin > 0 {
				out = append(out, funcs.OutlineRegion{Sign: -r.Sign, Yc: r.Ann.Yc, Zc: r.Ann.Zc, R: r.Ann.Rin})
			}
		}
	}
	return out
}
