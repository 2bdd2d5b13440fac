package bar

import (
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Dimensions of the quantities this family takes and returns.
var (
	dimLength  = units.Base(units.Length)
	dimArea    = dimLength.Mul(dimLength)
	dimVolume  = dimArea.Mul(dimLength)
	dimForce   = units.Base(units.Mass).Mul(dimLength).Div(units.Base(units.Time)).Div(units.Base(units.Time))
	dimStress  = dimForce.Div(dimArea)
	dimPerLen  = dimForce.Div(dimLength) // N/m: line loads and spring stiffness
	dimWeight  = dimForce.Div(dimVolume) // N/m³
	dimTemp    = units.Base(units.Temperature)
	dimPerKelv = dimTemp.Inv()
	numLength  = funcs.Num(dimLength)
	numArea    = funcs.Num(dimArea)
	numForce   = funcs.Num(dimForce)
	numStress  = funcs.Num(dimStress)
	numPerLen  = funcs.Num(dimPerLen)
	numWeight  = funcs.Num(dimWeight)
	numTemp    = funcs.Num(dimTemp)
	numPerKelv = funcs.Num(dimPerKelv)
	numPure    = funcs.Num(units.None)
	areaFnType = funcs.FuncOf(numArea, numLength)
	stressFn   = funcs.FuncOf(numStress, numLength)
	lineLoadFn = funcs.FuncOf(numPerLen, numLength)
)

// barType is the record a builder returns: a few fields a sheet may read and
// the *Bar behind it as the payload.
var barType = funcs.RecordOf("bar",
	funcs.Field{Name: "L", Type: numLength, Doc: "total length [m]"},
	funcs.Field{Name: "segments", Type: numPure, Doc: "number of segments"},
	funcs.Field{Name: "point_loads", Type: numPure, Doc: "number of point loads"},
)

// barParam accepts any record named "bar".
var barParam = &funcs.Type{Kind: funcs.Record, Name: "bar"}

// supportType is an end support other than the plain "fixed" and "free".
var supportType = funcs.RecordOf("bar_support",
	funcs.Field{Name: "k", Type: numPerLen, Doc: "stiffness of the spring or stop [N/m]; 0 for a rigid stop"},
	funcs.Field{Name: "gap", Type: numLength, Doc: "clearance to the stop [m]; 0 for a spring"},
)

// samplesType is the table of values along the bar; the workbook exporter
// charts every table of this name.
var samplesType = &funcs.Type{Kind: funcs.Table, Name: "bar_samples", Fields: []funcs.Field{
	{Name: "x", Type: numLength, Doc: "position from the start [m]"},
	{Name: "N", Type: numForce, Doc: "axial force, tension positive [N]"},
	{Name: "sigma", Type: numStress, Doc: "axial stress N/A [Pa]"},
	{Name: "u", Type: numLength, Doc: "displacement in +x [m]"},
}}

// resultType is what solve_bar returns.
var resultType = funcs.RecordOf("bar_result",
	funcs.Field{Name: "R_start", Type: numForce, Doc: "reaction of the start support on the bar, +x positive [N]"},
	funcs.Field{Name: "R_end", Type: numForce, Doc: "reaction of the end support on the bar, +x positive [N]"},
	funcs.Field{Name: "u_start", Type: numLength, Doc: "displacement of the start [m]"},
	funcs.Field{Name: "u_end", Type: numLength, Doc: "displacement of the end [m]"},
	funcs.Field{Name: "elongation", Type: numLength, Doc: "u_end − u_start, lengthening positive [m]"},
	funcs.Field{Name: "N_max", Type: numForce, Doc: "largest |N| [N]"},
	funcs.Field{Name: "x_N_max", Type: numLength, Doc: "where |N| is largest [m]"},
	funcs.Field{Name: "sigma_max", Type: numStress, Doc: "largest |σ| [Pa]"},
	funcs.Field{Name: "x_sigma_max", Type: numLength, Doc: "where |σ| is largest [m]"},
	funcs.Field{Name: "u_max", Type: numLength, Doc: "largest |u| [m]"},
	funcs.Field{Name: "x_u_max", Type: numLength, Doc: "where |u| is largest [m]"},
	funcs.Field{Name: "gap_closed", Type: numPure, Doc: "1 when a gap closed, else 0"},
	funcs.Field{Name: "gap_closed_start", Type: numPure, Doc: "1 when the gap at the start closed"},
	funcs.Field{Name: "gap_closed_end", Type: numPure, Doc: "1 when the gap at the end closed"},
	funcs.Field{Name: "samples", Type: samplesType, Doc: "N, σ, u along the bar for plots"},
)

// segmentTable lists the columns bar() understands; the area columns are
// checked as an either/or group by validateSegments.
var segmentTable = &funcs.Type{Kind: funcs.Table, Fields: []funcs.Field{
	{Name: "L", Type: numLength, Doc: "segment length [m]"},
	{Name: "E", Type: numStress, Doc: "modulus [Pa]"},
	{Name: "A", Type: numArea, Optional: true, Doc: "constant area [m²]"},
	{Name: "d", Type: numLength, Optional: true, Doc: "solid circle diameter [m]"},
	{Name: "d1", Type: numLength, Optional: true, Doc: "diameter at the segment start [m] (taper)"},
	{Name: "d2", Type: numLength, Optional: true, Doc: "diameter at the segment end [m] (taper)"},
	{Name: "A1", Type: numArea, Optional: true, Doc: "area at the segment start [m²] (taper)"},
	{Name: "A2", Type: numArea, Optional: true, Doc: "area at the segment end [m²] (taper)"},
	{Name: "dT", Type: numTemp, Optional: true, Doc: "temperature change [K]"},
	{Name: "alpha", Type: numPerKelv, Optional: true, Doc: "coefficient of thermal expansion [1/K]"},
}}

// pointTable is the table of point loads.
var pointTable = &funcs.Type{Kind: funcs.Table, Fields: []funcs.Field{
	{Name: "x", Type: numLength, Doc: "position from the start [m]"},
	{Name: "P", Type: numForce, Doc: "force, positive in +x [N]"},
}}
