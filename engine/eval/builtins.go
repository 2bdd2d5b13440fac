package eval

import (
	"math"
	"strconv"

	"github.com/sheafcalc/sheaf/engine/check"
)

// builtin compiles a call of a built-in function with a Number result.
func (m *Machine) builtin(n check.Node) numFn {
	one := func(g func(float64) float64) numFn {
		a := m.numOf(n.Arg(0))
		return func(f *Frame) float64 { return g(a(f)) }
	}
	guarded := func(ok func(float64) bool, g func(float64) float64, msg string) numFn {
		a := m.numOf(n.Arg(0))
		return func(f *Frame) float64 {
			x := a(f)
			if !ok(x) {
				f.fail(n, msg, "the argument is "+strconv.FormatFloat(x, 'g', 4, 64)+" (SI) with these inputs")
				return nan
			}
			return g(x)
		}
	}
	isList := n.NArg() == 1 && n.Arg(0).Type().Kind != n.Type().Kind
	switch n.Builtin() {
	case check.BInCombo:
		return m.pin(n)
	case check.BSqrt:
		return guarded(func(x float64) bool { return x >= 0 }, math.Sqrt, "square root of a negative number")
	case check.BCbrt:
		return one(math.Cbrt)
	case check.BAbs:
		return one(math.Abs)
	case check.BExp:
		return one(math.Exp)
	case check.BLn:
		return guarded(func(x float64) bool { return x > 0 }, math.Log, "logarithm of a number that is not positive")
	case check.BLog10:
		return guarded(func(x float64) bool { return x > 0 }, math.Log10, "logarithm of a number that is not positive")
	case check.BSin:
		return one(math.Sin)
	case check.BCos:
		return one(math.Cos)
	case check.BTan:
		return one(math.Tan)
	case check.BAsin:
		return guarded(func(x float64) bool { return x >= -1 && x <= 1 }, math.Asin, "asin of a number outside -1 to 1")
	case check.BAcos:
		return guarded(func(x float64) bool { return x >= -1 && x <= 1 }, math.Acos, "acos of a number outside -1 to 1")
	case check.BAtan:
		return one(math.Atan)
	case check.BFloor:
		return one(math.Floor)
	case check.BCeil:
		return one(math.Ceil)
	case check.BAtan2:
		y, x := m.numOf(n.Arg(0)), m.numOf(n.Arg(1))
		return func(f *Frame) float64 { return math.Atan2(y(f), x(f)) }
	case check.BPow:
		return m.pow(n, n.Arg(0), n.Arg(1))
	case check.BRound:
		x := m.numOf(n.Arg(0))
		if n.NArg() == 1 {
			return func(f *Frame) float64 { return math.Round(x(f)) }
		}
		step := m.numOf(n.Arg(1))
		return func(f *Frame) float64 {
			s := step(f)
			if s <= 0 {
				f.fail(n.Arg(1), "round needs a positive step", "")
				return nan
			}
			return math.Round(x(f)/s) * s
		}
	case check.BMin, check.BMax, check.BHypot, check.BSum, check.BMean, check.BLen:
		if isList || n.Builtin() == check.BSum || n.Builtin() == check.BMean || n.Builtin() == check.BLen {
			return m.listReduce(n)
		}
		xs := m.nums(n.Args())
		g := math.Hypot
		switch n.Builtin() {
		case check.BMin:
			g = math.Min
		case check.BMax:
			g = math.Max
		}
		// Folded pairwise from the left: min(a, b, c) = min(min(a, b), c).
		return func(f *Frame) float64 {
			r := xs[0](f)
			for _, x := range xs[1:] {
				r = g(r, x(f))
			}
			return r
		}
	case check.BInterp:
		return m.interp(n)
	}
	return func(f *Frame) float64 {
		f.fail(n, "cannot evaluate "+n.Str(), "")
		return nan
	}
}

func (m *Machine) listReduce(n check.Node) numFn {
	if n.Builtin() == check.BLen {
		v := m.valOf(n.Arg(0))
		return func(f *Frame) float64 {
			switch l := v(f).(type) {
			case []float64:
				return float64(len(l))
			case []any:
				return float64(len(l))
			}
			return 0
		}
	}
	xs := m.listOf(n.Arg(0))
	id := n.Builtin()
	return func(f *Frame) float64 {
		l := xs(f)
		if len(l) == 0 {
			if id == check.BSum {
				return 0
			}
			f.fail(n, n.Str()+" of an empty list", "")
			return nan
		}
		r := l[0]
		switch id {
		case check.BMin:
			for _, x := range l[1:] {
				r = math.Min(r, x)
			}
		case check.BMax:
			for _, x := range l[1:] {
				r = math.Max(r, x)
			}
		case check.BSum, check.BMean:
			for _, x := range l[1:] {
				r += x
			}
			if id == check.BMean {
				r /= float64(len(l))
			}
		}
		return r
	}
}

// interp interpolates linearly in (xs, ys); xs must increase strictly. A
// lookup outside [xs[0], xs[n-1]] is an error: tables are not extrapolated.
func (m *Machine) interp(n check.Node) numFn {
	xsF, ysF, xF := m.listOf(n.Arg(0)), m.listOf(n.Arg(1)), m.numOf(n.Arg(2))
	return func(f *Frame) float64 {
		xs, ys, x := xsF(f), ysF(f), xF(f)
		y, msg := Interp(xs, ys, x)
		if msg != "" {
			f.fail(n, msg, "interp does not extrapolate; extend the table or check the value looked up")
			return nan
		}
		return y
	}
}

// Interp is the linear interpolation of interp(xs, ys, x). It returns a
// message instead of a value when the lookup is not possible.
func Interp(xs, ys []float64, x float64) (float64, string) {
	if len(xs) != len(ys) {
		return 0, "interp needs lists of equal length (" + strconv.Itoa(len(xs)) + " and " + strconv.Itoa(len(ys)) + ")"
	}
	if len(xs) == 0 {
		return 0, "interp needs at least one point"
	}
	for i := 1; i < len(xs); i++ {
		if !(xs[i] > xs[i-1]) {
			return 0, "interp needs xs in increasing order (entry " + strconv.Itoa(i) + " is not greater than the one before)"
		}
	}
	if math.IsNaN(x) || x < xs[0] || x > xs[len(xs)-1] {
		return 0, "interp looks up " + strconv.FormatFloat(x, 'g', 4, 64) + " outside the table (" +
			strconv.FormatFloat(xs[0], 'g', 4, 64) + " to " + strconv.FormatFloat(xs[len(xs)-1], 'g', 4, 64) + ", SI)"
	}
	lo, hi := 0, len(xs)-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if xs[mid] <= x {
			lo = mid
		} else {
			hi = mid
		}
	}
	if x == xs[lo] || lo == hi {
		return ys[lo], ""
	}
	t := (x - xs[lo]) / (xs[hi] - xs[lo])
	return ys[lo] + t*(ys[hi]-ys[lo]), ""
}

// pin compiles in_combination(cell, "label"): the value the engine set in
// Frame.Pins for this call (the cell evaluated in that combination).
func (m *Machine) pin(n check.Node) numFn {
	k, ok := m.pinSlot[n]
	if !ok {
		if m.pinSlot == nil {
			m.pinSlot = map[check.Node]int{}
		}
		k = len(m.Pins)
		m.pinSlot[n] = k
		m.Pins = append(m.Pins, n)
	}
	return func(f *Frame) float64 {
		if k >= len(f.Pins) || math.IsNaN(f.Pins[k]) {
			f.fail(n, "the cell has no value in the combination "+n.Arg(1).Str(), "see the problems of that combination (`sheaf run --combinations`)")
			return nan
		}
		return f.Pins[k]
	}
}
