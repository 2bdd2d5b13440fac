package eval

import (
	"math"
	"sync"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

// userCall calls a user function with a Number result.
func (m *Machine) userCall(n check.Node) numFn {
	args, idx := m.nums(n.Args()), int(n.Index())
	return func(f *Frame) float64 { return call(m, f, args, idx, m.numAt(idx), nan) }
}

// userCallVal calls a user function whose result is not a number.
func (m *Machine) userCallVal(n check.Node) valFn {
	args, idx := m.nums(n.Args()), int(n.Index())
	return func(f *Frame) funcs.Value { return call(m, f, args, idx, m.valAt(idx), nil) }
}

// call runs body, the compiled body of user function idx (read at run
// time: bodies compile in parallel), with the values of args as its
// parameters; none when the function has no body. The arguments go on the
// frame's stack, so a call allocates nothing once the stack has grown.
func call[T any](m *Machine, f *Frame, args []numFn, idx int, body func(*Frame) T, none T) T {
	base := len(f.Stack)
	for _, a := range args {
		v := a(f)
		f.Stack = append(f.Stack, v)
	}
	saved := f.Args
	f.Args = f.Stack[base : base+len(args)]
	r := none
	if body != nil {
		r = body(f)
	}
	m.inFunc(f, idx)
	f.Args = saved
	f.Stack = f.Stack[:base]
	return r
}

// inFunc records that a failure met while running the body of user
// function idx lies in that function (the innermost one, when functions
// call functions), so that it is reported at the calling cell.
func (m *Machine) inFunc(f *Frame, idx int) {
	if f.Fail != nil && f.Fail.Func == "" {
		f.Fail.Func = m.P.Cells[idx].Name
	}
}

var framePool = sync.Pool{New: func() any { return &Frame{Stack: make([]float64, 0, 16)} }}

// funcRef makes a function value of a user function for a plugin. Its
// Call runs the compiled body on a pooled frame: safe for concurrent use
// and free of allocation on our side (a variadic call through a function
// value may still allocate its argument slice at the caller; plugins that
// call in a loop should pass a reused slice with args...).
func (m *Machine) funcRef(n check.Node) valFn {
	idx, name, ty := int(n.Index()), n.Str(), n.Type()
	return func(f *Frame) funcs.Value {
		num, val := f.Num, f.Val
		body := m.numAt(idx)
		return &funcs.FuncValue{Type: ty, Name: name, Call: func(args ...float64) float64 {
			if body == nil {
				return nan
			}
			fr := framePool.Get().(*Frame)
			fr.Num, fr.Val, fr.Args, fr.Fail = num, val, args, nil
			r := body(fr)
			if fr.Fail != nil {
				r = nan
			}
			fr.Num, fr.Val, fr.Args, fr.Fail = nil, nil, nil, nil
			fr.Stack = fr.Stack[:0]
			framePool.Put(fr)
			return r
		}}
	}
}

// plugin calls a registered function on the general path.
func (m *Machine) plugin(n check.Node) valFn {
	args := m.vals(n.Args())
	def := n.Def()
	return func(f *Frame) funcs.Value {
		vs := make([]funcs.Value, len(def.Params))
		if len(args) > len(vs) {
			vs = make([]funcs.Value, len(args))
		}
		for i, a := range args {
			vs[i] = a(f)
			if f.Fail != nil {
				return nil
			}
		}
		r, err := def.Call(vs)
		if err != nil {
			f.fail(n, def.Name+": "+err.Error(), "")
			return nil
		}
		if x, ok := r.(float64); ok && (math.IsNaN(x) || math.IsInf(x, 0)) {
			f.fail(n, def.Name+" gave no finite result for these arguments", "")
		}
		return r
	}
}
