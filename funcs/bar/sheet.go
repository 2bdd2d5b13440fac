package bar

import (
	"fmt"
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/funcs"
)

// This file converts between sheet values (funcs.Value) and the Go model.

// areaGroups are the either/or sets of area columns of a segment table.
var areaGroups = [][]string{{"A"}, {"d"}, {"d1", "d2"}, {"A1", "A2"}}

// validateSegments checks the columns of a segment table statically: exactly
// one complete group of area columns and no unknown column.
func validateSegments(t *funcs.Type) error {
	if t == nil || t.Kind != funcs.Table {
		return fmt.Errorf("expected a segment table with columns L [m], E [Pa] and one of A | d | d1, d2 | A1, A2")
	}
	for _, f := range t.Fields {
		if segmentTable.Field(f.Name) < 0 {
			return fmt.Errorf("unknown column %q in the segment table; hint: the columns are L, E, one of A | d | d1, d2 | A1, A2, and optionally dT, alpha", f.Name)
		}
	}
	var found []string
	for _, g := range areaGroups {
		n := 0
		for _, c := range g {
			if t.Field(c) >= 0 {
				n++
			}
		}
		switch {
		case n == len(g):
			found = append(found, strings.Join(g, ", "))
		case n > 0:
			return fmt.Errorf("the segment table has %s but not all of %s; hint: a taper needs the value at both ends", g[0], strings.Join(g, ", "))
		}
	}
	switch len(found) {
	case 0:
		return fmt.Errorf("the segment table gives no area; hint: add a column A [mm^2], d [mm], or d1 and d2, or A1 and A2")
	case 1:
	default:
		return fmt.Errorf("the segment table gives the area twice (%s); hint: keep one way of giving the area", strings.Join(found, " and "))
	}
	if (t.Field("dT") >= 0) != (t.Field("alpha") >= 0) {
		return fmt.Errorf("the segment table has one of dT and alpha but not the other; hint: a temperature change needs both columns")
	}
	return nil
}

// segmentsFromTable builds segments from a segment table value.
func segmentsFromTable(tv *funcs.TableValue) ([]Segment, error) {
	if tv == nil || tv.Type == nil {
		return nil, fmt.Errorf("expected a segment table")
	}
	if err := validateSegments(tv.Type); err != nil {
		return nil, err
	}
	n := tv.Rows()
	if n == 0 {
		return nil, fmt.Errorf("the segment table has no rows; hint: give one row per segment")
	}
	for i, c := range tv.Cols {
		if len(c) != n {
			return nil, fmt.Errorf("the segment table column %s has %d values, the others %d", tv.Type.Fields[i].Name, len(c), n)
		}
	}
	col := func(name string) []float64 { return tv.Col(name) }
	l, e := col("L"), col("E")
	segs := make([]Segment, n)
	for i := range n {
		s := Segment{L: l[i], E: e[i]}
		switch {
		case col("A") != nil:
			s.Shape, s.A1, s.A2 = Constant, col("A")[i], col("A")[i]
		case col("d") != nil:
			d := col("d")[i]
			s.Shape, s.A1 = Constant, math.Pi*d*d/4
			s.A2 = s.A1
			if !finite(d) || d <= 0 {
				return nil, fmt.Errorf("segment %d: d = %s must be a positive number", i+1, funcs.Length(d))
			}
		case col("d1") != nil:
			s.Shape, s.D1, s.D2 = TaperDiameter, col("d1")[i], col("d2")[i]
		default:
			s.Shape, s.A1, s.A2 = TaperArea, col("A1")[i], col("A2")[i]
		}
		if c := col("dT"); c != nil {
			s.DT, s.Alpha = c[i], col("alpha")[i]
		}
		if err := checkSegment(i, &s); err != nil {
			return nil, err
		}
		segs[i] = s
	}
	return segs, nil
}

// barValue wraps a bar as a sheet record.
func barValue(b *Bar) *funcs.RecordValue {
	return &funcs.RecordValue{Type: barType, Payload: b,
		Fields: []funcs.Value{b.Length(), float64(len(b.Segments)), float64(len(b.Points))}}
}

// barArg returns the bar behind a record argument.
func barArg(v funcs.Value) (*Bar, error) {
	if r, ok := v.(*funcs.RecordValue); ok {
		if b, ok := r.Payload.(*Bar); ok {
			return b, nil
		}
	}
	return nil, fmt.Errorf("expected a bar made by bar(...), bar_uniform(...) or bar_fn(...)")
}

// resultArg returns the solved bar behind a record argument.
func resultArg(v funcs.Value) (*Result, error) {
	if r, ok := v.(*funcs.RecordValue); ok {
		if res, ok := r.Payload.(*Result); ok {
			return res, nil
		}
	}
	return nil, fmt.Errorf("expected a solved bar made by solve_bar(...)")
}

// fnArg wraps a user function value.
func fnArg(v funcs.Value) (*Fn, error) {
	f, ok := v.(*funcs.FuncValue)
	if !ok || f == nil || f.Call == nil {
		return nil, fmt.Errorf("expected a function of x [m]")
	}
	return &Fn{Name: f.Name, F: func(x float64) float64 { return f.Call(x) }}, nil
}

// numArg returns a number argument.
func numArg(v funcs.Value, what string) (float64, error) {
	x, ok := v.(float64)
	if !ok {
		return 0, fmt.Errorf("expected a number for %s", what)
	}
	if !finite(x) {
		return 0, fmt.Errorf("%s is %g; it must be a finite number", what, x)
	}
	return x, nil
}

// supportArg reads "fixed", "free" or a bar_support record.
func supportArg(v funcs.Value, which string) (Support, error) {
	switch s := v.(type) {
	case string:
		switch strings.ToLower(strings.TrimSpace(s)) {
		case "fixed":
			return Support{Kind: Fixed}, nil
		case "free":
			return Support{Kind: Free}, nil
		}
		return Support{}, fmt.Errorf("unknown support %q at the %s; hint: write \"fixed\", \"free\", spring_support(k) or gap_support(g)", s, which)
	case *funcs.RecordValue:
		if sp, ok := s.Payload.(Support); ok {
			return sp, nil
		}
	}
	return Support{}, fmt.Errorf("expected a support at the %s: \"fixed\", \"free\", spring_support(k) or gap_support(g)", which)
}

// validateSupport is the static rule for a support argument.
func validateSupport(t *funcs.Type, which string) error {
	if t == nil {
		return fmt.Errorf("missing the support at the %s", which)
	}
	if t.Kind == funcs.String || (t.Kind == funcs.Record && t.Name == "bar_support") {
		return nil
	}
	return fmt.Errorf("the support at the %s must be \"fixed\", \"free\", spring_support(k) or gap_support(g), not %s", which, t)
}

// resultValue builds the bar_result record, samples included.
func resultValue(r *Result) (*funcs.RecordValue, error) {
	s, err := r.Samples()
	if err != nil {
		return nil, err
	}
	b2f := func(b bool) float64 {
		if b {
			return 1
		}
		return 0
	}
	tab := &funcs.TableValue{Type: samplesType, Cols: [][]float64{s.X, s.N, s.Sigma, s.U}}
	return &funcs.RecordValue{Type: resultType, Payload: r, Fields: []funcs.Value{
		r.RStart, r.REnd, r.UStart, r.UEnd, r.Elongation,
		r.NMax, r.XNMax, r.SigmaMax, r.XSigmaMax, r.UMax, r.XUMax,
		b2f(r.GapClosedStart || r.GapClosedEnd), b2f(r.GapClosedStart), b2f(r.GapClosedEnd), tab,
	}}, nil
}
