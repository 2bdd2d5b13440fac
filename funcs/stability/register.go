package stability

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

var (
	dimLength = units.Base(units.Length)
	dimArea   = dimLength.Mul(dimLength)
	dimForce  = units.Base(units.Mass).Mul(dimLength).Div(units.Base(units.Time)).Div(units.Base(units.Time))
	dimStress = dimForce.Div(dimArea)
	numLength = funcs.Num(dimLength)
	numArea   = funcs.Num(dimArea)
	numI      = funcs.Num(dimArea.Mul(dimArea))
	numForce  = funcs.Num(dimForce)
	numStress = funcs.Num(dimStress)
	numPure   = funcs.Num(units.None)
)

// curveTable is a buckling curve as the user writes it.
var curveTable = &funcs.Type{Kind: funcs.Table, Fields: []funcs.Field{
	{Name: "lambda", Type: numPure, Doc: "non-dimensional slenderness λ̄, increasing"},
	{Name: "chi", Type: numPure, Doc: "reduction factor χ"},
}}

const family = "stability"

func p(name string, t *funcs.Type, doc string) funcs.Param {
	return funcs.Param{Name: name, Type: t, Doc: doc}
}

// num returns a number argument, NaN when the value is not a number (the
// checker prevents that; NaN then fails the range checks instead of panicking).
func num(v funcs.Value) float64 {
	if x, ok := v.(float64); ok {
		return x
	}
	return math.NaN()
}

func init() {
	for _, d := range append(defs(), codeDefs()...) {
		funcs.Register(d)
	}
}

func defs() []*funcs.Def {
	return []*funcs.Def{
		{
			Name: "euler_load", Family: family,
			Params: []funcs.Param{p("E", numStress, "modulus [Pa], > 0"), p("I", numI, "second moment of area about the buckling axis [m⁴], > 0"),
				p("L", numLength, "system length [m], > 0"),
				{Name: "K", Type: numPure, Optional: true, Doc: "effective-length factor, > 0; omitted: 1 (pinned at both ends)"}},
			Result: numForce,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				k := 1.0
				if len(a) > 3 && a[3] != nil {
					k = num(a[3])
				}
				return EulerLoad(num(a[0]), num(a[1]), num(a[2]), k)
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "PI()^2*({E})*({I})/(({K=1})*({L}))^2", Valid: "AND({E}>0,{I}>0,{L}>0,{K=1}>0)"},
			Summary:     "elastic critical load π²EI/(KL)²",
			Doc: "The Euler critical load N_cr [N] of an ideal straight elastic column: E the modulus, I the " +
				"second moment of area about the axis of buckling, L the system length and K the effective-" +
				"length factor (theoretical values: 1 pinned–pinned, 2 fixed–free, 0.7 fixed–pinned, 0.5 " +
				"fixed–fixed; codes recommend larger design values). Valid while the stress stays elastic.",
			Formula: "N_cr = π²·E·I/(K·L)²",
			Source:  "Timoshenko & Gere, Theory of Elastic Stability, §2.1; Gere & Goodno, Mechanics of Materials, §11.3–11.4",
		},
		{
			Name: "slenderness", Family: family,
			Params: []funcs.Param{p("K", numPure, "effective-length factor, > 0"), p("L", numLength, "system length [m]"), p("i", numLength, "radius of gyration [m]")},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return Slenderness(num(a[0]), num(a[1]), num(a[2]))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "({K})*({L})/({i})", Valid: "AND({K}>0,{L}>0,{i}>0)"},
			Summary:     "slenderness ratio K·L/i",
			Doc:         "The geometric slenderness λ = K·L/i of a compression member: K the effective-length factor, L the system length [m], i the radius of gyration [m].",
			Formula:     "λ = K·L/i",
			Source:      "Gere & Goodno, Mechanics of Materials, §11.6",
		},
		{
			Name: "radius_of_gyration", Family: family,
			Params: []funcs.Param{p("I", numI, "second moment of area [m⁴], > 0"), p("A", numArea, "area [m²], > 0")},
			Result: numLength,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return RadiusOfGyration(num(a[0]), num(a[1]))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "SQRT(({I})/({A}))", Valid: "AND({I}>0,{A}>0)"},
			Summary:     "radius of gyration √(I/A)",
			Doc:         "The radius of gyration i [m] of a section from its second moment of area I [m⁴] and area A [m²].",
			Formula:     "i = √(I/A)",
			Source:      "Gere & Goodno, Mechanics of Materials, §12.4",
		},
		{
			Name: "relative_slenderness", Family: family,
			Params: []funcs.Param{p("A", numArea, "area [m²]"), p("f_y", numStress, "yield strength [Pa]"), p("N_cr", numForce, "elastic critical load [N]")},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return RelativeSlenderness(num(a[0]), num(a[1]), num(a[2]))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "SQRT(({A})*({f_y})/({N_cr}))", Valid: "AND({A}>0,{f_y}>0,{N_cr}>0)"},
			Summary:     "non-dimensional slenderness √(A·f_y/N_cr)",
			Doc: "The non-dimensional slenderness λ̄ = √(A·f_y/N_cr) [1] that buckling curves take, from the " +
				"area A, the yield strength f_y and the elastic critical load N_cr (e.g. from euler_load). " +
				"Codes replace A by an effective area for slender sections: pass that area then.",
			Formula: "λ̄ = √(A·f_y/N_cr)",
			Source:  "EN 1993-1-1 §6.3.1.2(1), Eq. (6.49) (from memory)",
		},
		{
			Name: "euler_stress", Family: family,
			Params: []funcs.Param{p("E", numStress, "modulus [Pa]"), p("lambda", numPure, "slenderness K·L/i, > 0")},
			Result: numStress,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				return EulerStress(num(a[0]), num(a[1]))
			},
			Spreadsheet: &funcs.Spreadsheet{Formula: "PI()^2*({E})/({lambda})^2", Valid: "AND({E}>0,{lambda}>0)"},
			Summary:     "elastic critical stress π²E/λ²",
			Doc:         "The Euler critical stress σ_cr [Pa] for the slenderness λ = K·L/i; the column is elastic only while σ_cr is below the proportional limit.",
			Formula:     "σ_cr = π²·E/λ²",
			Source:      "Gere & Goodno, Mechanics of Materials, §11.6",
		},
		{
			Name: "buckling_factor", Family: family,
			Params: []funcs.Param{p("curve", curveTable, "table with columns lambda [1] and chi [1], lambda increasing"), p("lambda_bar", numPure, "non-dimensional slenderness")},
			Result: numPure,
			Call: func(a []funcs.Value) (funcs.Value, error) {
				tv, ok := a[0].(*funcs.TableValue)
				if !ok || tv == nil || tv.Type == nil {
					return nil, fmt.Errorf("expected a curve table with columns lambda and chi")
				}
				l, c := tv.Col("lambda"), tv.Col("chi")
				if l == nil || c == nil {
					return nil, fmt.Errorf("the curve table needs columns lambda and chi")
				}
				cv, err := NewCurve(l, c)
				if err != nil {
					return nil, err
				}
				return cv.At(num(a[1]))
			},
			Spreadsheet: &funcs.Spreadsheet{
				// Linear interpolation between the rows around lambda_bar; MATCH gives
				// an error below the first row, Valid one above the last.
				Formula: "INDEX({curve.chi},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1))+" +
					"(({lambda_bar})-INDEX({curve.lambda},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1)))/" +
					"(INDEX({curve.lambda},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1)+1)-" +
					"INDEX({curve.lambda},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1)))*" +
					"(INDEX({curve.chi},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1)+1)-" +
					"INDEX({curve.chi},MIN(MATCH({lambda_bar},{curve.lambda},1),ROWS({curve.lambda})-1)))",
				Valid: "AND(ROWS({curve.lambda})>=2,{lambda_bar}>=INDEX({curve.lambda},1),{lambda_bar}<=MAX({curve.lambda})," +
					"MIN({curve.lambda})>=0,MIN({curve.chi})>0,MAX({curve.chi})<=1.5,{curve.lambda:increasing})",
			},
			Summary: "reduction factor χ from a buckling curve table",
			Doc: "Reads the reduction factor χ at λ̄ from a buckling curve that the sheet gives as a table of " +
				"lambda and chi (values taken from the local code, with its reference beside the table), by " +
				"linear interpolation between rows. Rows must be sorted by lambda; a λ̄ outside the table is " +
				"an error, never an extrapolation. Sheaf ships no curve values.",
			Formula: "χ = χ_i + (χ_{i+1} − χ_i)·(λ̄ − λ_i)/(λ_{i+1} − λ_i)",
			Source:  "linear interpolation of a code's tabulated buckling curve (common practice)",
		},
	}
}
