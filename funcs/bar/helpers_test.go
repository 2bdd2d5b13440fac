package bar

import (
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

// Unit factors for writing test data in engineering units (SI values).
const (
	mm  = 1e-3
	mm2 = 1e-6
	kN  = 1e3
	MPa = 1e6
	GPa = 1e9
)

// relErr returns |got − want| / |want| (absolute error when want is 0).
var relErr = functest.RelErr

func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if e := relErr(got, want); !(e <= tol) {
		t.Errorf("%s = %.12g, want %.12g (relative error %.3g > %.3g)", what, got, want, e, tol)
	}
}

// table builds a table value with the given columns (name, dimension) in SI.
func table(cols []string, data ...[]float64) *funcs.TableValue {
	t := &funcs.Type{Kind: funcs.Table}
	for _, c := range cols {
		i := segmentTable.Field(c)
		typ := numPure
		if i >= 0 {
			typ = segmentTable.Fields[i].Type
		} else if j := pointTable.Field(c); j >= 0 {
			typ = pointTable.Fields[j].Type
		}
		t.Fields = append(t.Fields, funcs.Field{Name: c, Type: typ})
	}
	return &funcs.TableValue{Type: t, Cols: data}
}

// call invokes a registered function as the evaluator would.
var call = functest.Call

// tryCall is call for code without a test at hand (benchmarks' setup,
// fuzz bodies that accept an error).
func tryCall(name string, args ...funcs.Value) (funcs.Value, error) {
	d, ok := funcs.Lookup(name)
	if !ok {
		panic("not registered: " + name)
	}
	for len(args) < len(d.Params) {
		args = append(args, nil)
	}
	return d.Call(args)
}

// field returns a numeric field of a record value.
func field(t *testing.T, v funcs.Value, name string) float64 {
	t.Helper()
	r := v.(*funcs.RecordValue)
	x, ok := r.Get(name).(float64)
	if !ok {
		t.Fatalf("record %s has no number %s", r.Type.Name, name)
	}
	return x
}

func mustSolve(t *testing.T, b *Bar, s0, s1 Support) *Result {
	t.Helper()
	r, err := Solve(b, s0, s1)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

var (
	fixed = Support{Kind: Fixed}
	free  = Support{Kind: Free}
)
