package report

import (
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

var extremeRE = regexp.MustCompile(`<svg[^>]*class="plot (\w+)"[\s\S]*?<circle class="extreme" cx="[^"]+" cy="([^"]+)" r="4" data-x="([^"]+)" data-v="([^"]+)"/>`)

// TestHangingBarExtremes draws a bar hanging under its own weight: it is
// drawn vertical, x downward from the support; the axial force and the
// stress are largest at the fixed top end, the displacement at the free
// lower end.
// Source: REFERENCES C3 (bar hanging under own weight, σ_max = γL at the
// support, δ = γL²/(2E)); γ = 78.5 kN/m³, L = 100 m, E = 210 GPa.
func TestHangingBarExtremes(t *testing.T) {
	const gamma, L, A, E = 78.5e3, 100.0, 1e-4, 210e9
	s, r := compile(t, "hang.sheaf", `
gamma [kN/m^3] = 78.5 kN/m^3
L     [m]      = 100 m
A     [mm^2]   = 100 mm^2
E     [GPa]    = 210 GPa
rod            = with_self_weight(bar_uniform(L, A, E), gamma)
res            = solve_bar(rod, "fixed", "free")
`)
	html := Render(s, r, testOptions)
	if !strings.Contains(html, `<figure class="bar vertical">`) {
		t.Error("a bar under its own weight is not drawn vertical")
	}
	got := map[string][3]float64{}
	for _, m := range extremeRE.FindAllStringSubmatch(html, -1) {
		var v [3]float64
		for i := range v {
			f, err := strconv.ParseFloat(m[i+2], 64)
			if err != nil {
				t.Fatalf("marker %q: %v", m[0], err)
			}
			v[i] = f
		}
		got[m[1]] = v
	}
	tests := []struct {
		plot    string
		x, v    float64 // SI
		atStart bool
		anyX    bool // a constant: its largest value is anywhere
	}{
		{"n", 0, gamma * A * L, true, false}, // N = γAL at the top
		{"sigma", 0, gamma * L, true, false}, // σ_max = γL = 7.85 MPa
		{"u", L, gamma * L * L / (2 * E), false, false},
		// b = −dN/dx = γA along the whole bar (dN/dx + b = 0).
		{"b", 0, gamma * A, true, true},
	}
	for _, tt := range tests {
		m, ok := got[tt.plot]
		if !ok {
			t.Errorf("no marked extreme in the %s diagram", tt.plot)
			continue
		}
		if math.Abs(m[2]-tt.v) > 1e-6*math.Abs(tt.v) {
			t.Errorf("%s: extreme value %g, want %g (relative 1e-6)", tt.plot, m[2], tt.v)
		}
		if tt.anyX {
			continue
		}
		if math.Abs(m[1]-tt.x) > 1e-9*L {
			t.Errorf("%s: extreme at x = %g m, want %g m", tt.plot, m[1], tt.x)
		}
		wantPx := vpadT // x downward: the start at the top
		if !tt.atStart {
			wantPx = vplotH - vpadB
		}
		if math.Abs(m[0]-wantPx) > 0.01 {
			t.Errorf("%s: marker drawn at %g px, want the %s end of the axis at %g px", tt.plot, m[0], map[bool]string{true: "fixed", false: "free"}[tt.atStart], wantPx)
		}
	}
}

var regionRE = regexp.MustCompile(`<path class="[^"]*" data-sign="(-?1)" vector-effect="non-scaling-stroke" d="([^"]+)"/>`)

// outlineArea sums the signed areas of the regions drawn in the section
// drawings of html: the shoelace formula over each polygon path, πr² over
// each circle drawn as two arcs (mm²).
func outlineArea(t *testing.T, svg string) float64 {
	t.Helper()
	total := 0.0
	for _, m := range regionRE.FindAllStringSubmatch(svg, -1) {
		sign, _ := strconv.ParseFloat(m[1], 64)
		f := strings.Fields(strings.NewReplacer("M", " M ", "L", " L ", "A", " A ", "Z", " Z ").Replace(m[2]))
		var ys, zs []float64
		area := 0.0
		for i := 0; i < len(f); i++ {
			switch f[i] {
			case "M", "L":
				y, _ := strconv.ParseFloat(f[i+1], 64)
				z, _ := strconv.ParseFloat(f[i+2], 64)
				ys, zs = append(ys, y), append(zs, z)
				i += 2
			case "A":
				r, _ := strconv.ParseFloat(f[i+1], 64)
				area = math.Pi * r * r
				i += 7
			}
		}
		if area == 0 {
			for i := range ys {
				j := (i + 1) % len(ys)
				area += ys[i]*zs[j] - ys[j]*zs[i]
			}
			area = math.Abs(area) / 2
		}
		total += sign * area
	}
	return total
}

// TestSectionOutlineArea checks that each section drawing has the area of
// its section: the drawing is the shape itself, not a picture of it.
func TestSectionOutlineArea(t *testing.T) {
	s, r := compile(t, "sections.sheaf", `
box  = rhs(200 mm, 120 mm, 8 mm)
tube = chs(273 mm, 10 mm)
tee  = polygon([-100 mm, 100 mm, 100 mm, 10 mm, 10 mm, -10 mm, -10 mm, -100 mm], [0 mm, 0 mm, 15 mm, 15 mm, 300 mm, 300 mm, 15 mm, 15 mm])
`)
	html := Render(s, r, testOptions)
	for _, name := range []string{"box", "tube", "tee"} {
		t.Run(name, func(t *testing.T) {
			i := strings.Index(html, `id="c-`+name+`"`)
			if i < 0 {
				t.Fatal("cell not in the report")
			}
			rest := html[i:]
			j := strings.Index(rest, `<svg xmlns="http://www.w3.org/2000/svg" class="section"`)
			k := strings.Index(rest, "</figure>")
			if j < 0 || k < j {
				t.Fatal("no section drawing")
			}
			got := outlineArea(t, rest[j:k])
			want := r.Cell(name).Value.(*funcs.RecordValue).Num("A", math.NaN()) * 1e6
			if math.Abs(got-want) > 1e-9*want {
				t.Errorf("drawn area %.12g mm², section area %.12g mm² (relative 1e-9)", got, want)
			}
		})
	}
}

// TestSteppedBarLies draws a stepped bar with two point loads, which
// carries no weight along its axis: it lies along x, the point loads are
// drawn, and N is largest on the first step.
// Source: REFERENCES C5 (stepped bar fixed at A: N1 = 70 kN on AB,
// N2 = 30 kN on BC; δ_C = 0.6875 mm at the free end).
func TestSteppedBarLies(t *testing.T) {
	s, r := compile(t, "step.sheaf", `
table steps
    L [m]  E [GPa]  A [mm^2]
      1.5      200      1200
      1.0      200       600
rod = with_point_load(with_point_load(bar(steps), 1.5 m, 40 kN), 2.5 m, 30 kN)
res = solve_bar(rod, "fixed", "free")
`)
	html := Render(s, r, testOptions)
	if !strings.Contains(html, `<figure class="bar">`) || strings.Contains(html, "bar vertical") {
		t.Error("a bar without its own weight is not drawn lying along x")
	}
	if n := strings.Count(html, `class="load"`); n != 2 {
		t.Errorf("%d point loads drawn, want 2", n)
	}
	re := regexp.MustCompile(`class="plot (\w+)"[\s\S]*?<circle class="extreme" cx="([^"]+)" cy="[^"]+" r="4" data-x="([^"]+)" data-v="([^"]+)"/>`)
	for _, m := range re.FindAllStringSubmatch(html, -1) {
		x, _ := strconv.ParseFloat(m[3], 64)
		v, _ := strconv.ParseFloat(m[4], 64)
		switch m[1] {
		case "n":
			if x > 1.5 || math.Abs(v-70e3) > 1e-6*70e3 {
				t.Errorf("N extreme %g N at x = %g m, want 70 kN on the first step", v, x)
			}
		case "u":
			if math.Abs(x-2.5) > 1e-9 || math.Abs(v-0.6875e-3) > 1e-6*0.6875e-3 {
				t.Errorf("u extreme %g m at x = %g m, want 0.6875 mm at the free end", v, x)
			}
		}
	}
}
