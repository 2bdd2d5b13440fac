package report

import (
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// sectionWidthMM is the printed width of a section drawing: the drawing
// is to scale, and the caption gives the scale at this width.
const sectionWidthMM = 60.0

// sectionFigure draws the outline of a section (or of every part of a
// composite, each toned apart) to scale in millimetres: y to the right, z
// up, holes as holes, the centroid marked and the overall width and depth
// dimensioned. The path coordinates are the section's own, exact, so the
// drawn outline has the section's area (TestSectionOutlineArea).
func (d *doc) sectionFigure(c *engine.Cell, r *funcs.RecordValue, regions []funcs.OutlineRegion) {
	if len(regions) == 0 {
		return
	}
	const mm = 1000.0
	y0, y1, z0, z1 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, g := range regions {
		if g.R > 0 {
			y0, y1 = math.Min(y0, (g.Yc-g.R)*mm), math.Max(y1, (g.Yc+g.R)*mm)
			z0, z1 = math.Min(z0, (g.Zc-g.R)*mm), math.Max(z1, (g.Zc+g.R)*mm)
		}
		for i := range g.Y {
			y0, y1 = math.Min(y0, g.Y[i]*mm), math.Max(y1, g.Y[i]*mm)
			z0, z1 = math.Min(z0, g.Z[i]*mm), math.Max(z1, g.Z[i]*mm)
		}
	}
	w, h := y1-y0, z1-z0
	if !(w > 0 && h > 0) || math.IsInf(w, 0) || math.IsInf(h, 0) {
		return
	}
	ext := math.Max(w, h)
	pad := 0.22 * ext
	vx, vy, vw, vh := y0-pad, -z1-pad*0.5, w+1.5*pad, h+1.5*pad
	fs := ext / 16 // label size, a fixed share of the drawing
	var b strings.Builder
	b.WriteString("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"section\" viewBox=\"" + g(vx) + " " + g(vy) + " " + g(vw) + " " + g(vh) +
		"\" width=\"" + f1(sectionWidthMM*vw/vw) + "mm\" height=\"" + f1(sectionWidthMM*vh/vw) + "mm\" role=\"img\" style=\"font-size:" + g(fs) + "px\">")
	b.WriteString("<g transform=\"scale(1,-1)\">")
	for _, rg := range regions {
		class := "reg p" + itoa(rg.Part%4)
		sign := "1"
		if rg.Sign < 0 {
			class, sign = "hole", "-1"
		}
		b.WriteString("<path class=\"" + class + "\" data-sign=\"" + sign + "\" vector-effect=\"non-scaling-stroke\" d=\"")
		if rg.R > 0 {
			cy, cz, rr := rg.Yc*mm, rg.Zc*mm, rg.R*mm
			b.WriteString("M" + g(cy+rr) + " " + g(cz) + " A" + g(rr) + " " + g(rr) + " 0 1 0 " + g(cy-rr) + " " + g(cz) +
				" A" + g(rr) + " " + g(rr) + " 0 1 0 " + g(cy+rr) + " " + g(cz) + " Z")
		} else {
			for i := range rg.Y {
				if i == 0 {
					b.WriteString("M")
				} else {
					b.WriteString(" L")
				}
				b.WriteString(g(rg.Y[i]*mm) + " " + g(rg.Z[i]*mm))
			}
			b.WriteString(" Z")
		}
		b.WriteString("\"/>")
	}
	b.WriteString("</g>")
	// centroid: of the area for a section, modulus-weighted for a composite
	yc, zc, ok := r.Num("y_c", math.NaN()), r.Num("z_c", math.NaN()), true
	cname := "centroid"
	if math.IsNaN(yc) {
		yc, zc = r.Num("y_E", math.NaN()), r.Num("z_E", math.NaN())
		cname = "modulus-weighted centroid"
	}
	if math.IsNaN(yc) || math.IsNaN(zc) {
		ok = false
	}
	if ok {
		cy, cz := yc*mm, -zc*mm
		q := ext / 30
		b.WriteString("<g class=\"centroid\"><circle cx=\"" + g(cy) + "\" cy=\"" + g(cz) + "\" r=\"" + g(q) + "\" vector-effect=\"non-scaling-stroke\"/>" +
			"<path vector-effect=\"non-scaling-stroke\" d=\"M" + g(cy-2*q) + " " + g(cz) + " H" + g(cy+2*q) + " M" + g(cy) + " " + g(cz-2*q) + " V" + g(cz+2*q) + "\"/></g>")
		b.WriteString("<text class=\"dim\" x=\"" + g(cy+2.2*q) + "\" y=\"" + g(cz-1.2*q) + "\">C</text>")
	}
	// overall width below, depth to the left
	lu, _ := units.Parse("mm")
	dy := z0 - pad*0.45
	b.WriteString("<g class=\"dims\"><path vector-effect=\"non-scaling-stroke\" d=\"M" + g(y0) + " " + g(-dy) + " H" + g(y1) +
		" M" + g(y0) + " " + g(-dy-fs*0.4) + " V" + g(-dy+fs*0.4) + " M" + g(y1) + " " + g(-dy-fs*0.4) + " V" + g(-dy+fs*0.4) + "\"/>")
	b.WriteString("<text class=\"dim\" text-anchor=\"middle\" x=\"" + g((y0+y1)/2) + "\" y=\"" + g(-dy+fs*1.2) + "\">" + esc(d.formatSI(w/mm, lu)) + "</text>")
	dz := y0 - pad*0.45
	b.WriteString("<path vector-effect=\"non-scaling-stroke\" d=\"M" + g(dz) + " " + g(-z0) + " V" + g(-z1) +
		" M" + g(dz-fs*0.4) + " " + g(-z0) + " H" + g(dz+fs*0.4) + " M" + g(dz-fs*0.4) + " " + g(-z1) + " H" + g(dz+fs*0.4) + "\"/>")
	b.WriteString("<text class=\"dim\" text-anchor=\"middle\" transform=\"rotate(-90 " + g(dz-fs*0.5) + " " + g(-(z0+z1)/2) + ")\" x=\"" + g(dz-fs*0.5) + "\" y=\"" + g(-(z0+z1)/2) + "\">" + esc(d.formatSI(h/mm, lu)) + "</text></g>")
	b.WriteString("</svg>")
	scale := vw / sectionWidthMM
	d.w("<figure class=\"sectionfig\">", b.String())
	what := "Section outline to scale, about 1:" + units.FormatNumber(scale, 2) + " on the printed page"
	if ok {
		what += "; C marks the " + cname + " (" + esc(d.formatSI(yc, lu)) + ", " + esc(d.formatSI(zc, lu)) + ")"
	}
	parts := map[int]bool{}
	for _, rg := range regions {
		parts[rg.Part] = true
	}
	if len(parts) > 1 {
		what += "; each part in its own tone, in part order"
	}
	d.caption(c, what)
	d.w("</figure>\n")
}
