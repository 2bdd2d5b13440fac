package bar

import "github.com/sheafcalc/sheaf/funcs"

// Layout tells a drawing how the solved bar sits and what holds and loads
// it (funcs.BarLayouter): the report draws a bar that carries its own
// weight along its axis vertical, x downward when the weight acts in +x.
func (r *Result) Layout() funcs.BarLayout { return r.layout }

func layoutOf(b *Bar, start, end Support) funcs.BarLayout {
	l := funcs.BarLayout{Gravity: b.Gamma, Start: start.Kind.name(), End: end.Kind.name(),
		Distributed: b.B0 != 0 || b.B1 != 0 || len(b.LoadFns) > 0 || len(b.Patches) > 0 || b.Gamma != 0}
	for _, p := range b.Points {
		l.Points = append(l.Points, funcs.PointLoad{X: p.X, P: p.P})
	}
	return l
}

func (k SupportKind) name() string {
	switch k {
	case Fixed:
		return "fixed"
	case Spring:
		return "spring"
	case Gap:
		return "stop"
	}
	return "free"
}
