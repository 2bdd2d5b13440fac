package functest

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

// TryCall calls the registered function name with args, padding missing
// trailing arguments with nil as the evaluator passes omitted optional
// parameters. It fails t when no function has that name.
func TryCall(t testing.TB, name string, args ...funcs.Value) (funcs.Value, error) {
	t.Helper()
	d, ok := funcs.Lookup(name)
	if !ok {
		t.Fatalf("%s is not registered", name)
	}
	for len(args) < len(d.Params) {
		args = append(args, nil)
	}
	return d.Call(args)
}

// Call is TryCall for a call that must succeed: an error fails t.
func Call(t testing.TB, name string, args ...funcs.Value) funcs.Value {
	t.Helper()
	v, err := TryCall(t, name, args...)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return v
}

// RelErr returns |got − want| / |want|, or |got| when want is 0.
func RelErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}
