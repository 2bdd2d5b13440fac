package section

import "github.com/sheafcalc/sheaf/funcs"

// The spreadsheet forms of the shapes whose properties are closed forms:
// the same formulas as their Go bodies (momentsAnnulus, and the polygon
// moments of a rectangle, which are exact for it; an I section's polygon
// moments in closed form), in SI. Coordinates of
// the centroid and the product moment are zero by symmetry.

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

// boxForm are the fields of a rectangle b × h with a centred rectangular
// hole bi × hi (a solid rectangle has none: "0").
func boxForm(b, h, bi, hi, valid string) *funcs.Spreadsheet {
	area := "(" + b + ")*(" + h + ")-(" + bi + ")*(" + hi + ")"
	iy := "((" + b + ")*(" + h + ")^3-(" + bi + ")*(" + hi + ")^3)/12"
	iz := "((" + h + ")*(" + b + ")^3-(" + hi + ")*(" + bi + ")^3)/12"
	return &funcs.Spreadsheet{Valid: valid, Fields: map[string]string{
		"A": area, "y_c": "0", "z_c": "0", "I_y": iy, "I_z": iz, "I_yz": "0",
		"I_1": "MAX(" + iy + "," + iz + ")", "I_2": "MIN(" + iy + "," + iz + ")",
		"i_y": "SQRT((" + iy + ")/(" + area + "))", "i_z": "SQRT((" + iz + ")/(" + area + "))",
		"i_min": "SQRT(MIN(" + iy + "," + iz + ")/(" + area + "))",
	}}
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
	return &funcs.Spreadsheet{Valid: "AND({h}>0,{b}>0,{t_w}>0,{t_f}>0,({t_w})<({b}),2*({t_f})<({h}))", Fields: map[string]string{
		"A": area, "y_c": "0", "z_c": "0", "I_y": iy, "I_z": iz, "I_yz": "0",
		"I_1": "MAX(" + iy + "," + iz + ")", "I_2": "MIN(" + iy + "," + iz + ")",
		"i_y": "SQRT((" + iy + ")/(" + area + "))", "i_z": "SQRT((" + iz + ")/(" + area + "))",
		"i_min": "SQRT(MIN(" + iy + "," + iz + ")/(" + area + "))",
	}}
}

var (
	iSectionForm = iForm()
	circleForm   = annulusForm("({d})/2", "0", "{d}>0")
	chsForm      = annulusForm("({d})/2", "({d})/2-({t})", "AND({d}>0,{t}>0,({t})<=({d})/2)")
	rectForm     = boxForm("{b}", "{h}", "0", "0", "AND({b}>0,{h}>0)")
	rhsForm      = boxForm("{b}", "{h}", "({b})-2*({t})", "({h})-2*({t})", "AND({b}>0,{h}>0,{t}>0,2*({t})<MIN({b},{h}))")
)
