package composite

import "github.com/sheafcalc/sheaf/funcs"

// Outline returns the regions of every part, each tagged with its part's
// index, so a drawing can tone each material differently.
func (c *Composite) Outline() []funcs.OutlineRegion {
	var out []funcs.OutlineRegion
	for i, p := range c.Parts {
		if p.Shape == nil {
			continue
		}
		for _, r := range p.Shape.Outline() {
			r.Part = i
			out = append(out, r)
		}
	}
	return out
}
