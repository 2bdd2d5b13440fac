package section

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
)

var call = functest.Call

func TestRegisteredCalls(t *testing.T) {
	// Source: REFERENCES.md C9, CHS 168.3×8: I = 1.29727118e7 mm⁴.
	chs := call(t, "chs", 0.1683, 0.008).(*funcs.RecordValue)
	if relErr(chs.Num("I_y", 0), 1.29727118e7*1e-12) > 1e-8 {
		t.Errorf("chs I_y = %g", chs.Num("I_y", 0))
	}
	// Source: Gere & Goodno App. E, rectangle I_y = bh³/12.
	r := call(t, "rect", 0.3, 0.5)
	// The rotation is an angle held in SI (radians): 90° is π/2.
	moved := call(t, "place", r, 0.1, 0.2, math.Pi/2).(*funcs.RecordValue)
	if relErr(moved.Num("I_z", 0), 0.3*0.5*0.5*0.5/12) > 1e-12 || relErr(moved.Num("y_c", 0), 0.1) > 1e-12 {
		t.Errorf("placed rect %v", moved.Fields)
	}
	poly := call(t, "polygon", []float64{0, 1, 1, 0}, []float64{0, 0, 2, 2}).(*funcs.RecordValue)
	if relErr(poly.Num("A", 0), 2) > 1e-15 {
		t.Errorf("polygon A %g", poly.Num("A", 0))
	}
	hole := call(t, "place", call(t, "circle", 0.5), 0.5, 1.0, nil)
	holed := call(t, "cut", poly, hole).(*funcs.RecordValue)
	// Source: rectangle minus a centred disc keeps its centroid; A = 2 − π/16.
	if relErr(holed.Num("A", 0), 2-math.Pi/16) > 1e-14 || relErr(holed.Num("z_c", 0), 1) > 1e-14 {
		t.Errorf("cut %v", holed.Fields)
	}
	f := &funcs.FuncValue{Name: "w", Call: func(a ...float64) float64 { return a[0] * a[0] }}
	// Source: ∫y² dA over the rectangle 0.3 × 0.5 = h·b³/12 (Gere & Goodno App. E).
	v := call(t, "section_integral", r, f, nil).(float64)
	if relErr(v, 0.5*0.3*0.3*0.3/12) > 1e-13 {
		t.Errorf("section_integral %g", v)
	}
	e := call(t, "section_integral_err", r, f, 1e-12).(float64)
	if !(e >= 0 && e < 1e-12*v) {
		t.Errorf("section_integral_err %g", e)
	}
	// A failing user function turns into an error.
	bad := &funcs.FuncValue{Name: "bad", Call: func(a ...float64) float64 { return math.NaN() }}
	d, _ := funcs.Lookup("section_integral")
	if _, err := d.Call([]funcs.Value{r, bad, nil}); err == nil {
		t.Error("NaN field gave no error")
	}
	if _, err := d.Call([]funcs.Value{3.0, f, nil}); err == nil {
		t.Error("a number passed as section gave no error")
	}
}

func TestIntegralValidate(t *testing.T) {
	d, _ := funcs.Lookup("section_integral")
	pa := units.Base(units.Mass).Div(units.Base(units.Length)).Div(units.Base(units.Time).Mul(units.Base(units.Time)))
	fn := funcs.FuncOf(funcs.Num(pa), funcs.Num(L), funcs.Num(L))
	got, err := d.Validate([]*funcs.Type{Type, fn, nil})
	if err != nil || got.Dim != pa.Mul(L2) {
		t.Fatalf("got %v, %v; want force", got, err)
	}
	wrong := funcs.FuncOf(funcs.Num(pa), funcs.Num(units.None), funcs.Num(L))
	if _, err := d.Validate([]*funcs.Type{Type, wrong, nil}); err == nil {
		t.Error("a field of a plain number was accepted")
	}
	if _, err := d.Validate([]*funcs.Type{Type, funcs.Num(L)}); err == nil {
		t.Error("a number was accepted as the field")
	}
}
