package main

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// angleSheet is our own scenario: a flat bar stood on edge by `place`, a
// hanger at a slope, and an arc on a tube.
const angleSheet = `title: angles (test scenario)
alpha [deg] = 35 deg                 -- slope of a hanger from the horizontal
T [kN] = 10 kN / sin(alpha)          -- tension for a 10 kN vertical load
s30 = sin(30 deg)
w = atan2(1 m, 1 m)                  -- a 1:1 brace, shown in the preferred unit
r = 80 mm
arc [mm] = r * alpha / (1 rad)       -- arc length
n_deg = alpha / (1 deg)              -- the number of degrees, a plain number
q [gon] = 100 gon
q_deg [deg] = q
flat = rect(100 mm, 12 mm)
up = place(flat, 0 mm, 0 mm, 90 deg)
half = place(flat, 0 mm, 0 mm, 0.5 rad)
tilt = place(flat, 0 mm, 0 mm, 30 °)
`

// TestAnglesEvaluate runs a sheet with angle quantities and compares its
// SI results (angles in radians) with closed forms computed here.
func TestAnglesEvaluate(t *testing.T) {
	path := filepath.Join(t.TempDir(), "angles.sheaf")
	if err := os.WriteFile(path, []byte(angleSheet), 0o644); err != nil {
		t.Fatal(err)
	}
	r := runExample(t, path)
	deg := math.Pi / 180 // Source: SI Brochure (BIPM 2019) Table 8: 1° = (π/180) rad.
	// Rectangle b = 100 mm along y, h = 12 mm along z: I_y = b h³/12,
	// I_z = h b³/12, I_yz = 0 (Source: Gere & Goodno, App. E). Rotating the
	// shape by θ gives I_y(θ) = (I_y + I_z)/2 + (I_y − I_z)/2 · cos 2θ
	// (Source: Gere & Goodno §12.8, transformation equations, with I_yz = 0).
	b, h := 0.100, 0.012
	iy, iz := b*h*h*h/12, h*b*b*b/12
	rotIy := func(th float64) float64 { return (iy+iz)/2 + (iy-iz)/2*math.Cos(2*th) }
	tests := []struct {
		what      string
		got, want float64
	}{
		{"alpha in rad", r.v("alpha"), 35 * deg},
		{"T = 10 kN / sin 35°", r.v("T"), 10e3 / math.Sin(35*deg)},
		{"sin 30° = 1/2 (closed form)", r.v("s30"), 0.5},
		{"atan2 of a 1:1 brace = π/4", r.v("w"), math.Pi / 4},
		{"arc = r·α", r.v("arc"), 0.080 * 35 * deg},
		{"alpha / (1 deg)", r.v("n_deg"), 35},
		// Source: 400 gon make a full turn: 100 gon = 90° = π/2 rad.
		{"100 gon", r.v("q_deg"), math.Pi / 2},
		{"flat on edge: I_y = I_z of the flat", r.f("up", "I_y"), iz},
		{"flat on edge: I_z = I_y of the flat", r.f("up", "I_z"), iy},
		{"0.5 rad is 0.5 rad, not 0.5°", r.f("half", "I_y"), rotIy(0.5)},
		{"30 ° rotation", r.f("tilt", "I_y"), rotIy(30 * deg)},
	}
	for _, tc := range tests {
		r.near(tc.what, tc.got, tc.want, relExact)
	}

	// The listing shows angles in degrees unless a display unit says
	// otherwise, and a number of degrees as a plain number.
	out, errs, code := sheaf(t, "run", path)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"alpha  35 deg", "w      45 deg", "n_deg  35 ", "q      100 gon", "q_deg  90 deg"} {
		if !strings.Contains(out, want) {
			t.Errorf("the listing lacks %q:\n%s", want, out)
		}
	}
}

// TestAngleInputs: an angle input takes an angle from --set and refuses a
// plain number, which would otherwise be read as radians.
func TestAngleInputs(t *testing.T) {
	path := filepath.Join(t.TempDir(), "angles.sheaf")
	if err := os.WriteFile(path, []byte(angleSheet), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		set  string
		code int
		want string // in stdout for a run, in stderr for a refusal
	}{
		{"alpha=40deg", exitOK, "alpha  40 deg"},
		{"alpha=0.5 rad", exitOK, "alpha  28.65 deg"},
		{"alpha=50gon", exitOK, "alpha  45 deg"},
		{"alpha=35", exitInput, "`alpha` must be an angle (deg), but \"35\" is a plain number; write the unit, e.g. 35 deg"},
		{"alpha=35 mm", exitInput, "`alpha` must be an angle (deg)"},
	}
	for _, tc := range tests {
		t.Run(tc.set, func(t *testing.T) {
			out, errs, code := sheaf(t, "run", path, "--set", tc.set)
			if code != tc.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, tc.code, out, errs)
			}
			got := out
			if tc.code != exitOK {
				got = errs
			}
			if !strings.Contains(got, tc.want) {
				t.Errorf("output lacks %q:\n%s", tc.want, got)
			}
		})
	}
}

// TestAngleCaseTable: a case table gives angles with a unit in the header
// or in the field; a bare number under a header without one is refused at
// the field.
func TestAngleCaseTable(t *testing.T) {
	dir := t.TempDir()
	sheet := filepath.Join(dir, "angles.sheaf")
	if err := os.WriteFile(sheet, []byte(angleSheet), 0o644); err != nil {
		t.Fatal(err)
	}
	good := filepath.Join(dir, "good.csv")
	if err := os.WriteFile(good, []byte("alpha [deg],r\n30,80 mm\n0.5 rad,80 mm\n50 gon,80 mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := sheaf(t, "batch", sheet, good)
	if code != exitOK {
		t.Fatalf("exit %d: %s%s", code, out, errs)
	}
	// 0.5 rad is 28.6479°; 50 gon is 45°.
	for _, want := range []string{"\n1,30,80,", "\n2,28.6479,80,", "\n3,45,80,"} {
		if !strings.Contains(out, want) {
			t.Errorf("batch output lacks %q:\n%s", want, out)
		}
	}
	bad := filepath.Join(dir, "bad.csv")
	if err := os.WriteFile(bad, []byte("alpha,r\n30,80 mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, errs, _ = sheaf(t, "batch", sheet, bad)
	if want := "bad.csv:2:1: case 1, column `alpha`: `alpha` must be an angle (deg), but \"30\" has no unit"; !strings.Contains(errs, want) {
		t.Errorf("batch of a bare angle: want %q in\n%s", want, errs)
	}
}
