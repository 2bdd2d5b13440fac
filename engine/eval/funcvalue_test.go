package eval_test

import (
	"math"
	"sync"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// heldType is the result of the test plugin evaltest_hold: a record with
// no fields whose Payload is the function value it was given, so that a
// test can reach the *funcs.FuncValue a plugin receives.
var heldType = funcs.RecordOf("evaltest_held")

func init() {
	plain := funcs.Num(units.None)
	funcs.Register(&funcs.Def{
		Name: "evaltest_hold", Family: "test",
		Params: []funcs.Param{{Name: "f", Type: funcs.FuncOf(plain, plain)}},
		Result: heldType,
		Call: func(args []funcs.Value) (funcs.Value, error) {
			return &funcs.RecordValue{Type: heldType, Payload: args[0]}, nil
		},
		Summary: "test only: keeps a function value",
		Doc:     "test only: returns a record whose payload is the function value it was given",
		Source:  "none (test plugin)",
	})
}

// held evaluates src and returns the function value handed to
// evaltest_hold in the cell name.
func held(t *testing.T, src, name string) *funcs.FuncValue {
	t.Helper()
	m := compile(t, src)
	st := m.NewState()
	st.Eval()
	c := cell(t, m, name)
	if !st.Known(c.Index) {
		t.Fatalf("%s: %v", name, st.Problem(c.Index))
	}
	fv, ok := st.F.Val[c.Index].(*funcs.RecordValue).Payload.(*funcs.FuncValue)
	if !ok {
		t.Fatalf("%s holds %T", name, st.F.Val[c.Index].(*funcs.RecordValue).Payload)
	}
	return fv
}

// TestFuncValueConcurrent calls one function value from several
// goroutines at once (run with -race), as a plugin integrating over a
// section on every core would. The function reads a cell and calls other
// user functions, one of which fails for some arguments: each call gets
// its own result, a failure gives NaN to that call only, and no failure
// leaks into the next call on the same pooled frame.
//
// Closed form: f(x) = k·x² + g(x) with g(x) = 1/(x - 3) and k = 2.5, so
// f(x) = 2.5·x² + 1/(x - 3), undefined (NaN) at x = 3.
func TestFuncValueConcurrent(t *testing.T) {
	src := "k = 2.5\ng(x) = 1 / (x - 3)\nf(x) = k * x^2 + g(x)\nh = evaltest_hold(f)\n"
	fv := held(t, src, "h")
	if fv.Name != "f" || fv.Type.Kind != funcs.Func {
		t.Fatalf("function value %q of type %v", fv.Name, fv.Type)
	}
	want := func(x float64) float64 {
		if x == 3 {
			return math.NaN()
		}
		return 2.5*x*x + 1/(x-3)
	}
	const workers, calls = 8, 2000
	var wg sync.WaitGroup
	errs := make(chan string, workers)
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			arg := make([]float64, 1)
			for i := range calls {
				// Every third call of worker 0 fails; the others interleave
				// with them on the shared pool of frames.
				x := float64(w) + float64(i)/calls
				if w == 0 && i%3 == 0 {
					x = 3
				}
				arg[0] = x
				got, exp := fv.Call(arg...), want(x)
				// The two terms nearly cancel near x = 0.39: the tolerance
				// is relative to their size, not to the sum's.
				scale := 2.5*x*x + math.Abs(1/(x-3))
				if math.IsNaN(exp) != math.IsNaN(got) || (!math.IsNaN(exp) && math.Abs(got-exp) > 1e-14*scale) {
					errs <- "f(" + units.FormatNumber(x, 6) + ") = " + units.FormatNumber(got, 17) + ", want " + units.FormatNumber(exp, 17)
					return
				}
			}
		}()
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}

// TestFuncValueArgs: a function value whose body calls a user
// function with several arguments leaves the caller's argument slice
// alone and gives the same result every time (Source: closed form
// f(x) = m(x, 2x) = x + 2x = 3x).
func TestFuncValueArgs(t *testing.T) {
	fv := held(t, "m(a, b) = a + b\nf(x) = m(x, 2 * x)\nh = evaltest_hold(f)\n", "h")
	args := []float64{1.5}
	for range 3 {
		if got := fv.Call(args...); got != 4.5 || args[0] != 1.5 {
			t.Fatalf("f(1.5) = %g, args now %v; want 4.5 and [1.5]", got, args)
		}
	}
}
