package section

import (
	"math"
	"strings"
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

// TestRegisteredAssemblies: join_all, cut_all, bars_on_circle, core and
// rolled_i through the registry, as a sheet calls them.
// Source: plane geometry (areas add and subtract); Gere & Goodno App. E.
func TestRegisteredAssemblies(t *testing.T) {
	sq := func(dy float64) funcs.Value { return call(t, "place", call(t, "rect", 0.1, 0.1), dy, 0.0, nil) }
	row := call(t, "join_all", []funcs.Value{sq(0), sq(0.1), sq(0.2), sq(0.3)}).(*funcs.RecordValue)
	if relErr(row.Num("A", 0), 0.04) > 1e-14 || relErr(row.Num("y_c", 0), 0.15) > 1e-14 {
		t.Errorf("four touching squares: %v", row.Fields)
	}
	if _, err := functest.TryCall(t, "join_all", []funcs.Value{sq(0), sq(0.05)}); err == nil || !strings.Contains(err.Error(), "sections 1 and 2 overlap") {
		t.Errorf("overlapping squares: %v", err)
	}
	plate := call(t, "rect", 0.5, 0.5)
	holes := call(t, "cut_all", plate, []funcs.Value{call(t, "circle", 0.1), call(t, "place", call(t, "circle", 0.1), 0.1, 0.0, nil)}).(*funcs.RecordValue)
	if relErr(holes.Num("A", 0), 0.25-2*math.Pi*0.0025) > 1e-14 {
		t.Errorf("two touching holes: A = %g", holes.Num("A", 0))
	}
	if _, err := functest.TryCall(t, "cut_all", plate, []funcs.Value{call(t, "circle", 0.1), call(t, "place", call(t, "circle", 0.1), 0.05, 0.0, nil)}); err == nil || !strings.Contains(err.Error(), "hole 2") {
		t.Errorf("overlapping holes: %v", err)
	}
	if _, err := functest.TryCall(t, "bars_on_circle", 2.5, 0.016, 0.3); err == nil {
		t.Error("2.5 bars must be refused")
	}
	core := call(t, "core", call(t, "chs", 0.2191, 0.010)).(*funcs.RecordValue)
	if relErr(core.Num("A", 0), math.Pi*0.1991*0.1991/4) > 1e-14 {
		t.Errorf("core of CHS 219.1x10: A = %g", core.Num("A", 0))
	}
	if _, err := functest.TryCall(t, "core", plate); err == nil {
		t.Error("a solid rectangle has no core")
	}
	// Source: REFERENCES.md D10, HEB 200 (200×200×9×15, r 18): A ≈ 7808 mm² (from memory).
	heb := call(t, "rolled_i", 0.2, 0.2, 0.009, 0.015, 0.018).(*funcs.RecordValue)
	if a := heb.Num("A", 0) * 1e6; math.Abs(a-7808) > 0.5 {
		t.Errorf("HEB 200 A = %.2f mm², table 7808", a)
	}
}
