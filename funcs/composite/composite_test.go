package composite

import (
	"math"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/internal/functest"
	"github.com/sheafcalc/sheaf/funcs/section"
)

var (
	relErr = functest.RelErr
	call   = functest.Call
)

// mat builds a material record as a sheet would write it.
func mat(fields map[string]float64) *funcs.RecordValue {
	r := &funcs.RecordValue{Type: &funcs.Type{Kind: funcs.Record}}
	for _, n := range []string{"E", "alpha", "f_y", "f_c"} {
		if v, ok := fields[n]; ok {
			r.Type.Fields = append(r.Type.Fields, funcs.Field{Name: n, Type: funcs.Num(Stress)})
			r.Fields = append(r.Fields, v)
		}
	}
	return r
}

const (
	mm  = 1e-3
	kN  = 1e3
	MPa = 1e6
	GPa = 1e9
)

type check struct {
	name      string
	got, want float64
	tol       float64
}

func runChecks(t *testing.T, src string, cs []check) {
	t.Helper()
	for _, c := range cs {
		if e := relErr(c.got, c.want); e > c.tol {
			t.Errorf("%s = %.10g, want %.10g (rel %.2g; %s)", c.name, c.got, c.want, e, src)
		}
	}
}

func steelAluminium(t *testing.T) funcs.Value {
	core := call(t, "circle", 40*mm)
	tube := call(t, "chs", 60*mm, 10*mm)
	steel := mat(map[string]float64{"E": 210 * GPa, "alpha": 12e-6})
	alu := mat(map[string]float64{"E": 70 * GPa, "alpha": 23e-6})
	return call(t, "composite", []funcs.Value{call(t, "part", core, steel, nil), call(t, "part", tube, alu, nil)})
}

// Source: REFERENCES.md C8a (Gere & Goodno §2.4, composite bar): N_i = N·E_iA_i/ΣEA.
func TestC8aLoadSharing(t *testing.T) {
	c := steelAluminium(t)
	r := call(t, "composite_axial", c, 200*kN, nil).(*funcs.RecordValue)
	n := r.Get("N_parts").([]float64)
	s := r.Get("sigma_parts").([]float64)
	runChecks(t, "REFERENCES C8a", []check{
		{"N_s", n[0], 141.176471 * kN, 1e-8},
		{"N_a", n[1], 58.8235294 * kN, 1e-8},
		{"σ_s", s[0], 112.344666 * MPa, 1e-8},
		{"σ_a", s[1], 37.4482219 * MPa, 1e-8},
		{"δ over 1 m", r.Num("eps", 0) * 1.0, 0.534974599 * mm, 1e-8},
	})
}

// Source: REFERENCES.md C8b (Gere & Goodno §2.5): F = (α_a − α_s)ΔT/(1/EA_s + 1/EA_a).
func TestC8bThermal(t *testing.T) {
	c := steelAluminium(t)
	r := call(t, "composite_axial", c, 0.0, 50.0).(*funcs.RecordValue)
	n := r.Get("N_parts").([]float64)
	s := r.Get("sigma_parts").([]float64)
	th := r.Get("sigma_thermal").([]float64)
	runChecks(t, "REFERENCES C8b", []check{
		{"F", n[0], 42.6887002 * kN, 1e-8},
		{"σ_s", s[0], 33.9705882 * MPa, 1e-8},
		{"σ_a", s[1], -27.1764706 * MPa, 1e-8},
		{"σ_s thermal", th[0], 33.9705882 * MPa, 1e-8},
	})
	if math.Abs(n[0]+n[1]) > 1e-9*kN {
		t.Errorf("thermal forces not self-equilibrated: %g", n[0]+n[1])
	}
}

// Source: REFERENCES.md C8c with E_cm from B4 (EN 1992-1-1 Table 3.1 formula, f_ck 30 MPa).
func TestC8cConcreteFilledTube(t *testing.T) {
	ecm := call(t, "concrete_ecm", 30*MPa).(float64)
	tube := call(t, "chs", 219.1*mm, 10*mm)
	core := call(t, "circle", 199.1*mm)
	c := call(t, "composite", []funcs.Value{
		call(t, "part", tube, mat(map[string]float64{"E": 210 * GPa}), nil),
		call(t, "part", core, mat(map[string]float64{"E": ecm}), nil),
	})
	r := call(t, "composite_axial", c, 1000*kN, nil).(*funcs.RecordValue)
	n := r.Get("N_parts").([]float64)
	s := r.Get("sigma_parts").([]float64)
	runChecks(t, "REFERENCES C8c, B4", []check{
		{"E_cm", ecm, 32836.5680 * MPa, 1e-9},
		{"N_steel", n[0], 574.355095 * kN, 1e-8},
		{"N_conc", n[1], 425.644905 * kN, 1e-8},
		{"σ_s", s[0], 87.4332401 * MPa, 1e-8},
		{"σ_c", s[1], 13.6714645 * MPa, 1e-8},
	})
	// Transformed area in steel: EA/E_s. Source: Gere & Goodno §6.3.
	at := call(t, "transformed_area", c, 210*GPa).(float64)
	want := c.(*funcs.RecordValue).Num("EA", 0) / (210 * GPa)
	if relErr(at, want) > 1e-15 {
		t.Errorf("transformed area %g want %g", at, want)
	}
}

// Source: REFERENCES.md B4, EN 1992-1-1 Table 3.1 formula E_cm = 22(f_cm/10)^0.3.
func TestConcreteEcm(t *testing.T) {
	for _, c := range []struct{ fck, want float64 }{{20, 29.9619511}, {40, 35.2204623}, {30, 32.8365680}} {
		got, err := EcmEN1992(c.fck * MPa)
		if err != nil || relErr(got, c.want*GPa) > 5e-9 { // values rounded to 9 figures
			t.Errorf("f_ck %g: %g, %v", c.fck, got, err)
		}
	}
	for _, bad := range []float64{0, -30 * MPa, math.NaN(), 30} {
		if _, err := EcmEN1992(bad); err == nil && bad != 30 {
			t.Errorf("f_ck %g accepted", bad)
		}
	}
	if _, err := EcmEN1992(30e9); err == nil {
		t.Error("30 GPa accepted as f_ck")
	}
}

// Source: REFERENCES.md C12: rectangle 300×500 with E(z) = E0(1 + z/h) from the bottom.
func TestC12GradedRectangle(t *testing.T) {
	rect := call(t, "rect", 300*mm, 500*mm)
	e := &funcs.FuncValue{Name: "E", Call: func(a ...float64) float64 { return 30 * GPa * (1 + (a[1]+0.25)/0.5) }}
	c := call(t, "composite", []funcs.Value{call(t, "part_graded", rect, e, nil)}).(*funcs.RecordValue)
	runChecks(t, "REFERENCES C12", []check{
		{"EA", c.Num("EA", 0), 6.75e9, 1e-12},
		{"z̄ from bottom", c.Num("z_E", 0) + 0.25, 277.777778 * mm, 1e-8},
		{"EI", c.Num("EI_y", 0), 1.35416667e14 * mm * mm, 1e-8},
	})
}

// Property: EA and the flexural rigidities about the modulus-weighted
// centroid do not depend on where the section is placed; the centroid moves
// with it (common practice: invariance of integrals under translation).
func TestPlacementInvariance(t *testing.T) {
	base := steelAluminium(t).(*funcs.RecordValue)
	for _, d := range [][2]float64{{1, 0}, {-3, 2.5}, {0.01, -40}} {
		core := call(t, "place", call(t, "circle", 40*mm), d[0], d[1], nil)
		tube := call(t, "place", call(t, "chs", 60*mm, 10*mm), d[0], d[1], nil)
		c := call(t, "composite", []funcs.Value{
			call(t, "part", core, mat(map[string]float64{"E": 210 * GPa}), nil),
			call(t, "part", tube, mat(map[string]float64{"E": 70 * GPa}), nil),
		}).(*funcs.RecordValue)
		runChecks(t, "invariance", []check{
			{"EA", c.Num("EA", 0), base.Num("EA", 0), 1e-14},
			{"EI_y", c.Num("EI_y", 0), base.Num("EI_y", 0), 1e-9},
			{"y_E", c.Num("y_E", 0), d[0], 1e-12},
			{"z_E", c.Num("z_E", 0), d[1], 1e-12},
		})
	}
}

func TestCompositeErrors(t *testing.T) {
	d, _ := funcs.Lookup("composite_axial")
	core := call(t, "circle", 40*mm)
	noAlpha := call(t, "composite", []funcs.Value{call(t, "part", core, mat(map[string]float64{"E": 210 * GPa}), nil)})
	if _, err := d.Call([]funcs.Value{noAlpha, 0.0, 10.0}); err == nil {
		t.Error("ΔT without alpha accepted")
	}
	if _, err := d.Call([]funcs.Value{noAlpha, math.Inf(1), nil}); err == nil {
		t.Error("infinite N accepted")
	}
	p, _ := funcs.Lookup("part")
	if _, err := p.Call([]funcs.Value{core, mat(map[string]float64{"E": -1}), nil}); err == nil {
		t.Error("negative E accepted")
	}
	c, _ := funcs.Lookup("composite")
	if _, err := c.Call([]funcs.Value{[]funcs.Value{}}); err == nil {
		t.Error("empty composite accepted")
	}
	if _, err := c.Call([]funcs.Value{[]funcs.Value{core}}); err == nil {
		t.Error("a section accepted as a part")
	}
	big := call(t, "circle", 60*mm)
	if _, err := c.Call([]funcs.Value{[]funcs.Value{call(t, "part", core, mat(map[string]float64{"E": 1}), nil), call(t, "part", big, mat(map[string]float64{"E": 1}), nil)}}); err == nil {
		t.Error("overlapping parts accepted")
	}
	g, _ := funcs.Lookup("part_graded")
	neg := &funcs.FuncValue{Call: func(a ...float64) float64 { return -1 }}
	if _, err := g.Call([]funcs.Value{core, neg, nil}); err == nil {
		t.Error("negative modulus field accepted")
	}
}

// The material parameter matches sheet records structurally.
func TestMaterialParamAccepts(t *testing.T) {
	sheetRec := funcs.RecordOf("", funcs.Field{Name: "E", Type: funcs.Num(Stress)}, funcs.Field{Name: "alpha", Type: funcs.Num(PerK)})
	if !MaterialParam.Accepts(sheetRec) {
		t.Error("a {E, alpha} record is not accepted")
	}
	if MaterialParam.Accepts(funcs.RecordOf("", funcs.Field{Name: "alpha", Type: funcs.Num(PerK)})) {
		t.Error("a record without E is accepted")
	}
}

// TestCFTResistance: REFERENCES.md C11 without confinement (λ̄ > 0.5), and
// the confined case at λ̄ = 0.3, e = 0 and e/d = 0.05 with the factors of
// §6.7.3.2(6) written out.
// Source: EN 1994-1-1:2004 §6.7.3.2 (from memory); REFERENCES.md C11.
func TestCFTResistance(t *testing.T) {
	const d, tw, fyd, fy, fcd, fck = 0.2191, 0.010, 355e6, 355e6, 20e6, 30e6
	r, err := CFTResistance(d, tw, fyd, fy, fcd, fck, 0.6, 0)
	if err != nil || math.Abs(r.NplRd-2954.69632e3)/2954.69632e3 > 1e-9 || r.EtaC != 0 {
		t.Errorf("C11: N_pl,Rd = %.9g N (%v), want 2954.69632 kN", r.NplRd, err)
	}
	aa := math.Pi * (d*d - (d-2*tw)*(d-2*tw)) / 4
	ac := math.Pi * (d - 2*tw) * (d - 2*tw) / 4
	for _, ed := range []float64{0, 0.05} {
		ea0 := 0.25 * (3 + 2*0.3)
		ec0 := 4.9 - 18.5*0.3 + 17*0.09
		ea, ec := ea0+(1-ea0)*10*ed, ec0*(1-10*ed)
		want := ea*aa*fyd + ac*fcd*(1+ec*tw/d*fy/fck)
		r, err := CFTResistance(d, tw, fyd, fy, fcd, fck, 0.3, ed*d)
		if err != nil || math.Abs(r.NplRd-want)/want > 1e-12 {
			t.Errorf("e/d = %g: N_pl,Rd = %.9g, want %.9g (%v)", ed, r.NplRd, want, err)
		}
	}
}

// TestEncasedHEB: an HEB 260 (root radius 24 mm) encased in a 450 × 450 mm
// concrete block, the profile 30 mm above the block's centre, and the same
// profile partially encased (concrete between the flanges only). EA, the
// modulus-weighted centroid and EI_y against the hand sum of the steel and
// the net concrete, with the profile's A and I from its plates plus four
// fillets (each an r × r square less a quarter circle: area (1 − π/4)r²,
// centroid r(10 − 3π)/(12 − 3π) from the flange and web faces, second
// moment r⁴(1 − 5π/16) about the flange face), relative 1e-12.
// Source: parallel-axis theorem and the quarter-circle properties of Gere &
// Goodno, Mechanics of Materials, App. E (cases 1 and 10); REFERENCES.md D10
// for the profile's dimensions (from memory).
func TestEncasedHEB(t *testing.T) {
	const h, b, tw, tf, r = 0.260, 0.260, 0.010, 0.0175, 0.024
	const Es, Ec, dz = 210e9, 33e9, 0.030
	z2 := h/2 - tf
	af := (1 - math.Pi/4) * r * r
	xb := r * (10 - 3*math.Pi) / (12 - 3*math.Pi)
	As := 2*b*tf + (h-2*tf)*tw + 4*af
	Is := (b*h*h*h-(b-tw)*math.Pow(h-2*tf, 3))/12 + 4*(r*r*r*r*(1-5*math.Pi/16)-af*xb*xb+af*(z2-xb)*(z2-xb))
	heb, err := section.RolledI(h, b, tw, tf, r)
	if err != nil {
		t.Fatal(err)
	}
	if p := heb.Props(); functest.RelErr(p.A, As) > 1e-13 || functest.RelErr(p.Iy, Is) > 1e-12 {
		t.Fatalf("HEB 260: A = %.15g, I_y = %.15g; hand %.15g, %.15g", p.A, p.Iy, As, Is)
	}
	steel := heb.Transform(0, dz, 0)
	// Fully encased: the block less the whole profile.
	block, _ := section.Rect(0.45, 0.45)
	full, err := section.Cut(block, steel)
	if err != nil {
		t.Fatal(err)
	}
	// Partially encased: the space between the flanges less the web and
	// fillets (the profile less its flanges).
	web := h - 2*tf
	between, _ := section.Rect(b, web)
	flange, _ := section.Rect(b, tf)
	core, err := section.CutAll(steel, []*section.Shape{flange.Transform(0, dz+z2+tf/2, 0), flange.Transform(0, dz-z2-tf/2, 0)})
	if err != nil {
		t.Fatal(err)
	}
	partial, err := section.Cut(between.Transform(0, dz, 0), core)
	if err != nil {
		t.Fatal(err)
	}
	flangeI := 2 * (b*tf*tf*tf/12 + b*tf*(z2+tf/2)*(z2+tf/2))
	cases := []struct {
		name          string
		conc          *section.Shape
		Ab, Ib, zb    float64 // the concrete outline: area, own I_y, centroid z
		inA, inI, inZ float64 // the steel inside that outline
	}{
		{"fully encased", full, 0.45 * 0.45, math.Pow(0.45, 4) / 12, 0, As, Is, dz},
		{"partially encased", partial, b * web, b * web * web * web / 12, dz, As - 2*b*tf, Is - flangeI, dz},
	}
	for _, c := range cases {
		comp, err := New([]*Part{{Shape: steel, E: Es}, {Shape: c.conc, E: Ec}})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		ea := Es*As + Ec*(c.Ab-c.inA)
		zE := (Es*As*dz + Ec*(c.Ab*c.zb-c.inA*c.inZ)) / ea
		eiS := Es * (Is + As*(dz-zE)*(dz-zE))
		eiC := Ec * (c.Ib + c.Ab*(c.zb-zE)*(c.zb-zE) - c.inI - c.inA*(c.inZ-zE)*(c.inZ-zE))
		if functest.RelErr(comp.EA, ea) > 1e-12 || functest.RelErr(comp.ZE, zE) > 1e-12 || functest.RelErr(comp.EIy, eiS+eiC) > 1e-12 {
			t.Errorf("%s: EA %.15g z_E %.15g EI_y %.15g; hand %.15g %.15g %.15g", c.name, comp.EA, comp.ZE, comp.EIy, ea, zE, eiS+eiC)
		}
	}
}
