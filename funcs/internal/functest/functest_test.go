package functest

import (
	"fmt"
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

func init() {
	funcs.Register(&funcs.Def{
		Name: "functest_pad", Family: "test",
		Params: []funcs.Param{{Name: "a", Type: funcs.Num(units.None)}, {Name: "b", Type: funcs.Num(units.None), Optional: true}},
		Result: funcs.Num(units.None),
		Call: func(args []funcs.Value) (funcs.Value, error) {
			if len(args) != 2 {
				return nil, fmt.Errorf("%d arguments, want 2", len(args))
			}
			if args[1] == nil {
				return args[0], nil
			}
			return args[0].(float64) + args[1].(float64), nil
		},
		Summary: "a + b, b optional", Doc: "adds b to a when b is given", Source: "closed form",
	})
}

// TestCall: an omitted trailing argument reaches the function as nil.
func TestCall(t *testing.T) {
	if got := Call(t, "functest_pad", 2.0); got != 2.0 {
		t.Errorf("one argument: %v, want 2", got)
	}
	if got := Call(t, "functest_pad", 2.0, 3.0); got != 5.0 {
		t.Errorf("two arguments: %v, want 5", got)
	}
}

// TestRelErr: relative error, absolute when the wanted value is zero
// (closed form).
func TestRelErr(t *testing.T) {
	for _, c := range []struct{ got, want, err float64 }{{1.1, 1, 0.1}, {-2, 0, 2}, {0, 0, 0}, {-9, -10, 0.1}, {9, -10, 1.9}} {
		if e := RelErr(c.got, c.want); math.Abs(e-c.err) > 1e-15 {
			t.Errorf("RelErr(%g, %g) = %g, want %g", c.got, c.want, e, c.err)
		}
	}
}
