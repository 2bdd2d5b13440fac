package section

import "github.com/sheafcalc/sheaf/funcs"

// The spreadsheet forms of the shapes whose properties are closed forms:
// the same formulas as their Go bodies (momentsAnnulus, and the polygon
// moments of a rectangle, which are exact for it; an I section's or an
// angle's polygon moments in closed form; the quarter sectors of root
// fillets and rounded corners in closed form), in SI. Every field of these
// shapes has one: none stays Sheaf's only. Coordinates of the centroid and
// the product moment of the doubly symmetric ones are zero by symmetry.

// annulusForm are the fields of a ring of outer radius ro and inner
// radius ri (spreadsheet expressions), centred at the origin.
func annulusForm(ro, ri, valid string) *funcs.Spreadsheet {
	area := "PI()*((" + ro + ")^2-(" + ri + ")^2)"
	i := "PI()*((" + ro + ")^4-(" + ri + ")^4)/4"
	rad := "SQRT((" + i + ")/(" + area + "))"
	return &funcs.Spreadsheet{Valid: valid, Fields: map[string]string{
		"A": area, "y_c": "0", "z_c": "0", "I_y": i, "I_z": i, "I_yz": "0", "I_1": i, "I_2": i,
		"i_y": rad, "i_z": rad, "i_min": rad,
	}}
}

// piText is π as a number: excelize's calculator evaluates some long
// formulas that call PI() inside another function wrongly (SQRT of an
// expression with PI() and cell references gives 0). The shortest form of
// math.Pi reads back as math.Pi, which is PI() in both engines.
const piText = "3.141592653589793"

// symmetricForm are the fields of a doubly symmetric shape centred at the
// origin from its area and second moments (spreadsheet expressions): the
// centroid and the product moment are zero, the principal moments I_y and
// I_z.
func symmetricForm(area, iy, iz, valid string) *funcs.Spreadsheet {
	return &funcs.Spreadsheet{Valid: valid, Fields: map[string]string{
		"A": area, "y_c": "0", "z_c": "0", "I_y": iy, "I_z": iz, "I_yz": "0",
		"I_1": "MAX(" + iy + "," + iz + ")", "I_2": "MIN(" + iy + "," + iz + ")",
		"i_y": "SQRT((" + iy + ")/(" + area + "))", "i_z": "SQRT((" + iz + ")/(" + area + "))",
		"i_min": "SQRT(MIN(" + iy + "," + iz + ")/(" + area + "))",
	}}
}

// boxForm are the fields of a rectangle b × h with a centred rectangular
// hole bi × hi (a solid rectangle has none: "0").
func boxForm(b, h, bi, hi, valid string) *funcs.Spreadsheet {
	area := "(" + b + ")*(" + h + ")-(" + bi + ")*(" + hi + ")"
	iy := "((" + b + ")*(" + h + ")^3-(" + bi + ")*(" + hi + ")^3)/12"
	iz := "((" + h + ")*(" + b + ")^3-(" + hi + ")*(" + bi + ")^3)/12"
	return symmetricForm(area, iy, iz, valid)
}

// iForm are the fields of a doubly symmetric I section (two flanges b × t_f,
// a web t_w between them): I_y as the outer rectangle less the two
// rectangles beside the web taken together (they share their z range),
// I_z as the two flanges and the web about their common centre line.
func iForm() *funcs.Spreadsheet {
	hw := "(({h})-2*({t_f}))"
	area := "({b})*({h})-(({b})-({t_w}))*" + hw
	iy := "(({b})*({h})^3-(({b})-({t_w}))*" + hw + "^3)/12"
	iz := "(2*({t_f})*({b})^3+" + hw + "*({t_w})^3)/12"
	return symmetricForm(area, iy, iz, "AND({h}>0,{b}>0,{t_w}>0,{t_f}>0,({t_w})<({b}),2*({t_f})<({h}))")
}

// corner is ∫z² dA over the r × r square [z0 − r, z0] (in z) less the
// quarter disc of radius r centred at z0 − r on the side of z0: a root
// fillet of a rolled profile (z0 the inside face of the flange), or the
// material a rounded corner takes off a rectangle (z0 its edge). The square
// gives r·(z0³ − (z0 − r)³)/3; the quarter disc, with its centre at
// c = z0 − r, π·r²·c²/4 + 2·c·r³/3 + π·r⁴/16 (its area πr²/4, its first
// moment r³/3 and its second moment πr⁴/16 about the centre's axis).
// The same formula in y gives ∫y² dA when z0 is the edge in y; a fillet on
// the other side of its centre (towards the web) is the mirror, z0 → −z0.
// Source: Gere & Goodno, Mechanics of Materials, Appendix E, cases 1 and
// 10 (rectangle, quarter circle) with the parallel-axis theorem, from memory;
// the corner terms of EN 10210-2:2006 Annex B and of the steel tables'
// formula for rolled I sections (0.2146·r² per fillet) are this in closed form
// (from memory).
func corner(z0, r string) string {
	c := "((" + z0 + ")-(" + r + "))"
	return "((" + r + ")*((" + z0 + ")^3-" + c + "^3)/3-(" + piText + "*(" + r + ")^2*" + c + "^2/4+2*" + c + "*(" + r + ")^3/3+" + piText + "*(" + r + ")^4/16))"
}

// rolledIForm are the fields of rolled_i: the I section of plates with
// four root fillets, each (1 − π/4)·r² of area at a corner of web and
// flange (z0 = h/2 − t_f about y, y0 = t_w/2 mirrored about z). r = 0 gives
// the plates' values exactly (every fillet term is 0).
func rolledIForm() *funcs.Spreadsheet {
	hw := "(({h})-2*({t_f}))"
	area := "({b})*({h})-(({b})-({t_w}))*" + hw + "+(4-" + piText + ")*({r})^2"
	iy := "(({b})*({h})^3-(({b})-({t_w}))*" + hw + "^3)/12+4*" + corner("({h})/2-({t_f})", "{r}")
	iz := "(2*({t_f})*({b})^3+" + hw + "*({t_w})^3)/12+4*" + corner("-({t_w})/2", "{r}")
	return symmetricForm(area, iy, iz, "AND({h}>0,{b}>0,{t_w}>0,{t_f}>0,({t_w})<({b}),2*({t_f})<({h}),"+
		"OR({r}=0,AND({r}>0,({t_w})/2+({r})<=({b})/2,2*(({t_f})+({r}))<({h}))))")
}

// roundedRHSForm are the fields of rhs_rounded: the b × h rectangle with
// corners of radius r_o less the (b − 2t) × (h − 2t) rectangle with
// corners of radius r_i, each corner taking off (1 − π/4)·r² of area.
// Source: the geometry of EN 10210-2:2006 Annex B (from memory), by corner.
func roundedRHSForm() *funcs.Spreadsheet {
	bi, hi := "(({b})-2*({t}))", "(({h})-2*({t}))"
	rounded := func(b, h, r string) (area, iy, iz string) {
		area = "(" + b + ")*(" + h + ")-(4-" + piText + ")*(" + r + ")^2"
		iy = "((" + b + ")*(" + h + ")^3/12-4*" + corner("("+h+")/2", r) + ")"
		iz = "((" + h + ")*(" + b + ")^3/12-4*" + corner("("+b+")/2", r) + ")"
		return
	}
	ao, iyo, izo := rounded("{b}", "{h}", "{r_o}")
	ai, iyi, izi := rounded(bi, hi, "{r_i}")
	return symmetricForm("("+ao+")-("+ai+")", iyo+"-"+iyi, izo+"-"+izi,
		"AND({b}>0,{h}>0,{t}>0,2*({t})<MIN({b},{h}),{r_o}>=0,{r_i}>=0,2*({r_o})<MIN({b},{h}),2*({r_i})<MIN({b},{h})-2*({t}))")
}

// angleForm are the fields of angle: the leg b × t along y and the leg
// t × (h − t) above it along z, the heel at the origin, each rectangle's
// own moments moved to the common centroid (parallel-axis theorem); the
// principal moments from Mohr's circle, as Props computes them.
// Source: Gere & Goodno, Mechanics of Materials, Appendix E, case 1, and
// §12.8–12.9 (parallel axes, principal axes), from memory.
func angleForm() *funcs.Spreadsheet {
	a1, a2 := "(({b})*({t}))", "(({t})*(({h})-({t})))"
	area := "(" + a1 + "+" + a2 + ")"
	yc := "((" + a1 + "*({b})/2+" + a2 + "*({t})/2)/" + area + ")"
	zc := "((" + a1 + "*({t})/2+" + a2 + "*(({h})+({t}))/2)/" + area + ")"
	dy1, dy2 := "(({b})/2-"+yc+")", "(({t})/2-"+yc+")"
	dz1, dz2 := "(({t})/2-"+zc+")", "((({h})+({t}))/2-"+zc+")"
	iy := "(({b})*({t})^3/12+" + a1 + "*" + dz1 + "^2+({t})*(({h})-({t}))^3/12+" + a2 + "*" + dz2 + "^2)"
	iz := "(({t})*({b})^3/12+" + a1 + "*" + dy1 + "^2+(({h})-({t}))*({t})^3/12+" + a2 + "*" + dy2 + "^2)"
	iyz := "(" + a1 + "*" + dy1 + "*" + dz1 + "+" + a2 + "*" + dy2 + "*" + dz2 + ")"
	mid := "((" + iy + "+" + iz + ")/2)"
	rad := "SQRT(((" + iy + "-" + iz + ")/2)^2+" + iyz + "^2)"
	i2 := "(" + mid + "-" + rad + ")"
	return &funcs.Spreadsheet{Valid: "AND({h}>0,{b}>0,{t}>0,({t})<MIN({h},{b}))", Fields: map[string]string{
		"A": area, "y_c": yc, "z_c": zc, "I_y": iy, "I_z": iz, "I_yz": iyz,
		"I_1": mid + "+" + rad, "I_2": i2,
		"i_y": "SQRT(" + iy + "/" + area + ")", "i_z": "SQRT(" + iz + "/" + area + ")",
		"i_min": "SQRT(MAX(" + i2 + ",0)/" + area + ")",
	}}
}

var (
	iSectionForm   = iForm()
	rolledISection = rolledIForm()
	roundedRHS     = roundedRHSForm()
	angleShape     = angleForm()
	circleForm     = annulusForm("({d})/2", "0", "{d}>0")
	chsForm        = annulusForm("({d})/2", "({d})/2-({t})", "AND({d}>0,{t}>0,({t})<=({d})/2)")
	rectForm       = boxForm("{b}", "{h}", "0", "0", "AND({b}>0,{h}>0)")
	rhsForm        = boxForm("{b}", "{h}", "({b})-2*({t})", "({h})-2*({t})", "AND({b}>0,{h}>0,{t}>0,2*({t})<MIN({b},{h}))")
)
