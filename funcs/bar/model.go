package bar

import "math"

// Shape says how the area of a segment varies along it.
type Shape uint8

const (
	// Constant area A1 over the segment (a prismatic segment).
	Constant Shape = iota
	// TaperDiameter: a solid circle whose diameter varies linearly from D1 at
	// the start of the segment to D2 at its end, A = π·d²/4.
	TaperDiameter
	// TaperArea: the area itself varies linearly from A1 to A2.
	TaperArea
	// AreaFunc: the area is AreaFn(x), x measured from the start of the bar.
	AreaFunc
)

// Fn is a user function of the position x [m] measured from the start of the
// bar. Name is used in messages. F returns NaN when it fails.
type Fn struct {
	Name string
	F    func(x float64) float64
}

// Segment is one part of the bar between joints. Values are SI.
type Segment struct {
	L      float64 // length [m], > 0
	Shape  Shape
	A1, A2 float64 // area [m²]: Constant uses A1; TaperArea A1 → A2
	D1, D2 float64 // diameter [m] for TaperDiameter
	AreaFn *Fn     // area [m²] for AreaFunc
	E      float64 // modulus [Pa], > 0, unless EFn is set
	EFn    *Fn     // modulus [Pa] as a function of x; replaces E when set
	Alpha  float64 // coefficient of thermal expansion [1/K]
	DT     float64 // temperature change [K]; the thermal strain is Alpha·DT
}

// Prismatic returns a segment of constant area and modulus.
func Prismatic(l, a, e float64) Segment { return Segment{L: l, Shape: Constant, A1: a, A2: a, E: e} }

// TaperedDiameter returns a solid circular segment whose diameter varies
// linearly from d1 to d2.
func TaperedDiameter(l, d1, d2, e float64) Segment {
	return Segment{L: l, Shape: TaperDiameter, D1: d1, D2: d2, E: e}
}

// TaperedArea returns a segment whose area varies linearly from a1 to a2.
func TaperedArea(l, a1, a2, e float64) Segment {
	return Segment{L: l, Shape: TaperArea, A1: a1, A2: a2, E: e}
}

// PointLoad is a concentrated force P [N] (positive in +x) at X [m].
type PointLoad struct{ X, P float64 }

// Bar is a straight bar with its loads. The zero value has no segments.
// Builders in a sheet copy a Bar before changing it; the Go API treats a Bar
// as a plain value that Solve does not modify.
type Bar struct {
	Segments []Segment
	Points   []PointLoad
	// B0 and B1 [N/m] describe a distributed load varying linearly from B0 at
	// the start of the bar to B1 at its end (uniform when equal).
	B0, B1 float64
	// Gamma [N/m³] is the weight density of a self-weight load b = γ·A(x),
	// acting in +x (give it negative for a bar whose x axis points up).
	Gamma float64
	// LoadFns are distributed loads b(x) [N/m] given as user functions.
	LoadFns []Fn
	// Patches are distributed loads over part of the bar (a soil layer's
	// skin friction), zero outside their stretch.
	Patches []Patch
	// Breaks are positions [m] where a load function may jump (a layer
	// boundary): the solver ends a piece there, so quadrature never spans
	// the step.
	Breaks []float64
}

// Patch is a distributed load [N/m] varying linearly from B0 at X0 to B1 at
// X1 (0 ≤ X0 < X1 ≤ L), zero elsewhere; positive in +x.
type Patch struct{ X0, X1, B0, B1 float64 }

// at returns the load of the patch at x inside it.
func (p *Patch) at(x float64) float64 { return p.B0 + (p.B1-p.B0)*(x-p.X0)/(p.X1-p.X0) }

// integral returns ∫ b over [a, x] ∩ [X0, X1] (exact: b is linear there).
func (p *Patch) integral(a, x float64) float64 {
	lo, hi := math.Max(a, p.X0), math.Min(x, p.X1)
	if hi <= lo {
		return 0
	}
	return (p.at(lo) + p.at(hi)) / 2 * (hi - lo)
}

// Length returns the total length of the bar.
func (b *Bar) Length() float64 {
	l := 0.0
	for _, s := range b.Segments {
		l += s.L
	}
	return l
}

// Clone returns a copy that shares no slices with b.
func (b *Bar) Clone() *Bar {
	c := *b
	c.Segments = append([]Segment(nil), b.Segments...)
	c.Points = append([]PointLoad(nil), b.Points...)
	c.LoadFns = append([]Fn(nil), b.LoadFns...)
	c.Patches = append([]Patch(nil), b.Patches...)
	c.Breaks = append([]float64(nil), b.Breaks...)
	return &c
}

// SupportKind is the kind of restraint at an end of the bar.
type SupportKind uint8

const (
	// Free: no restraint; the end reaction is zero.
	Free SupportKind = iota
	// Fixed: the end does not move.
	Fixed
	// Spring: an elastic support of stiffness K [N/m]; R = −K·u.
	Spring
	// Gap: a stop at a clearance Gap [m] beyond the end (in +x at the end of
	// the bar, in −x at its start). While the end has not moved through the
	// clearance the end is free; once it has, the stop holds it: rigidly when
	// K is 0, else through a spring of stiffness K.
	Gap
)

// Support is the restraint at one end.
type Support struct {
	Kind SupportKind
	K    float64 // stiffness [N/m] for Spring, and for Gap when > 0
	Gap  float64 // clearance [m] for Gap, ≥ 0
}

// String names the support for messages.
func (s Support) String() string {
	switch s.Kind {
	case Fixed:
		return "fixed"
	case Spring:
		return "spring"
	case Gap:
		return "gap"
	}
	return "free"
}

// finite reports whether v is a finite number.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
