package section

import "github.com/sheafcalc/sheaf/funcs"

// Outline returns the regions of the shape for drawings: each polygon as
// it is, each annulus as its outer circle and, when it has a bore, the bore
// as a circle of the opposite sign.
func (s *Shape) Outline() []funcs.OutlineRegion {
	var out []funcs.OutlineRegion
	for _, r := range s.Regions {
		switch {
		case r.Ring != nil:
			out = append(out, funcs.OutlineRegion{Sign: r.Sign, Y: r.Ring.Y, Z: r.Ring.Z})
		case r.Ann != nil:
			out = append(out, funcs.OutlineRegion{Sign: r.Sign, Yc: r.Ann.Yc, Zc: r.Ann.Zc, R: r.Ann.Rout})
			if r.Ann.Rin > 0 {
				out = append(out, funcs.OutlineRegion{Sign: -r.Sign, Yc: r.Ann.Yc, Zc: r.Ann.Zc, R: r.Ann.Rin})
			}
		}
	}
	return out
}
