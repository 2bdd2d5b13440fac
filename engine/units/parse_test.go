package units

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite golden files")

// TestParseNormalises checks the spellings engineers use against the
// normalised symbol and the dimension. The dimensions follow from the SI
// definitions of the units (SI Brochure, BIPM 2019, Table 4): common practice.
func TestParseNormalises(t *testing.T) {
	tests := []struct {
		in, sym string
		dim     Dim
	}{
		{"kN", "kN", dForce},
		{" kN ", "kN", dForce},
		{"kN*m", "kN*m", dEnergy},
		{"kN·m", "kN*m", dEnergy},
		{"kN⋅m", "kN*m", dEnergy},
		{"kN × m", "kN*m", dEnergy},
		{"N/mm^2", "N/mm^2", dStress},
		{"N/mm²", "N/mm^2", dStress},
		{"N/mm2", "N/mm^2", dStress},
		{"N / mm ^ 2", "N/mm^2", dStress},
		{"N/mm**2", "N/mm^2", dStress},
		{"mm2", "mm^2", dimOf(2, 0, 0, 0, 0, 0, 0)},
		{"mm4", "mm^4", dimOf(4, 0, 0, 0, 0, 0, 0)},
		{"kg/m^3", "kg/m^3", dimOf(-3, 1, 0, 0, 0, 0, 0)},
		{"1/K", "1/K", dimOf(0, 0, 0, 0, -1, 0, 0)},
		{"K^-1", "K^-1", dimOf(0, 0, 0, 0, -1, 0, 0)},
		{"K⁻¹", "K^-1", dimOf(0, 0, 0, 0, -1, 0, 0)},
		{"K^−1", "K^-1", dimOf(0, 0, 0, 0, -1, 0, 0)},
		{"m/s^2", "m/s^2", dimOf(1, 0, -2, 0, 0, 0, 0)},
		{"kN/m^3", "kN/m^3", dWeightD},
		{"W/m*K", "W/m*K", dimOf(1, 1, -3, 0, -1, 0, 0)},     // everything after / divides
		{"W/(m*K)", "W/(m*K)", dimOf(1, 1, -3, 0, -1, 0, 0)}, // same, grouped
		{"N/mm/s", "N/mm/s", dimOf(0, 1, -3, 0, 0, 0, 0)},    // N/(mm·s)
		{"(kN/m)*m", "(kN/m)*m", dForce},                     // parentheses end the quotient
		{"MPa^0.5", "MPa^(1/2)", Dim{-1, 1, -2, 0, 0, 0, 0}}, // half exponents are exact
		{"MPa^(1/2)", "MPa^(1/2)", Dim{-1, 1, -2, 0, 0, 0, 0}},
		{"m^(-3/2)", "m^(-3/2)", Dim{-3, 0, 0, 0, 0, 0, 0}},
		{"m^1.0", "m^1", dLength},
		{"um", "µm", dLength},
		{"μm", "µm", dLength}, // Greek mu
		{"ue", "µε", None},
		{"microstrain", "µε", None},
		{"uε", "µε", None},
		{"°C", "degC", dTemp},
		{"℉", "degF", dTemp},
		{"°", "deg", dAngle},
		{"tonne", "t", dMass},
		{"kips", "kip", dForce},
		{"%", "%", None},
		{"1", "1", None},
		{"GN", "GN", dForce}, // any SI prefix on an SI unit
		{"nm", "nm", dLength},
		{"kg*m^-1*s^-2", "kg*m^-1*s^-2", dStress},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			u, err := Parse(tc.in)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tc.in, err)
			}
			if u.Symbol != tc.sym || u.Dim != tc.dim {
				t.Errorf("Parse(%q) = %q %v, want %q %v", tc.in, u.Symbol, u.Dim, tc.sym, tc.dim)
			}
			again, err := Parse(u.Symbol)
			if err != nil || again.Symbol != u.Symbol || again.Dim != u.Dim || again.Factor != u.Factor {
				t.Errorf("Parse(%q) does not read back its own symbol: %+v, %v", u.Symbol, again, err)
			}
		})
	}
}

// TestParseSystemAndQuantity checks the labels a parsed unit carries.
func TestParseSystemAndQuantity(t *testing.T) {
	tests := []struct {
		in       string
		system   System
		quantity string
	}{
		{"kN", Metric, "force"},
		{"kip", US, "force"},
		{"kip/ft", US, "force per length"},
		{"kN/m^2", Metric, "area load"},
		{"pcf", US, "weight density"},
		{"lb/ft^3", US, "mass density"},
		{"s", Neutral, "time"},
		{"kip/mm", Neutral, "force per length"}, // mixed practice
		{"kN*m^2", Metric, "flexural rigidity"},
		{"µε", Neutral, "strain"},
		{"kg*m", Metric, ""}, // no name for this dimension
		{"deg", Neutral, "angle"},
		{"°", Neutral, "angle"},
		{"mrad", Neutral, "angle"},
		{"gon", Neutral, "angle"},
		{"%", Neutral, "dimensionless"},
	}
	for _, tc := range tests {
		u, err := Parse(tc.in)
		if err != nil {
			t.Fatalf("Parse(%q): %v", tc.in, err)
		}
		if u.System != tc.system || u.Quantity != tc.quantity {
			t.Errorf("Parse(%q) = system %v quantity %q, want %v %q", tc.in, u.System, u.Quantity, tc.system, tc.quantity)
		}
	}
}

// TestCatalogueRoundTrip formats a value in every catalogue unit, parses the
// printed number and unit back and expects the same SI value and dimension.
func TestCatalogueRoundTrip(t *testing.T) {
	for _, u := range Catalogue() {
		for _, si := range []float64{1, -2.5e-3, 123456.789, 7.0735530e-9} {
			text := Format(si, u, 12)
			num, sym, found := strings.Cut(text, " ")
			if !found {
				sym = "1" // a plain number prints no unit
			}
			var x float64
			if _, err := fmt.Sscan(num, &x); err != nil {
				t.Fatalf("Format(%g, %s) = %q: number does not scan: %v", si, u.Symbol, text, err)
			}
			back, err := Parse(sym)
			if err != nil {
				t.Fatalf("Format(%g, %s) = %q: unit does not parse: %v", si, u.Symbol, text, err)
			}
			if back.Dim != u.Dim || back.Symbol != u.Symbol {
				t.Errorf("%q parses as %s %v, want %s %v", text, back.Symbol, back.Dim, u.Symbol, u.Dim)
			}
			if got := back.ToSI(x); math.Abs(got-si) > 1e-11*math.Abs(si) {
				t.Errorf("%q reads back as %.15g SI, want %.15g", text, got, si)
			}
		}
	}
}

// TestLookup covers catalogue names, aliases and prefixed forms.
func TestLookup(t *testing.T) {
	tests := []struct {
		in, sym string
		ok      bool
	}{
		{"kN", "kN", true},
		{"N/mm^2", "N/mm^2", true},
		{"kip*ft", "kip*ft", true},
		{"tonne", "t", true},
		{"°F", "degF", true},
		{"uε", "µε", true},
		{"GN", "GN", true},
		{"um", "µm", true},
		{"kN·m", "", false}, // not the catalogue spelling: use Parse
		{"kft", "", false},
		{"kn", "", false},
		{"", "", false},
	}
	for _, tc := range tests {
		u, ok := Lookup(tc.in)
		if ok != tc.ok || u.Symbol != tc.sym {
			t.Errorf("Lookup(%q) = %q, %v; want %q, %v", tc.in, u.Symbol, ok, tc.sym, tc.ok)
		}
	}
	for _, u := range Catalogue() {
		if got, ok := Lookup(u.Symbol); !ok || got != u {
			t.Errorf("Lookup(%q) = %+v, %v; want the catalogue entry %+v", u.Symbol, got, ok, u)
		}
	}
}

// TestCatalogueDistinct keeps the listing free of duplicates.
func TestCatalogueDistinct(t *testing.T) {
	seen := map[string]bool{}
	for _, u := range Catalogue() {
		if seen[u.Symbol] {
			t.Errorf("%q listed twice", u.Symbol)
		}
		seen[u.Symbol] = true
		if u.Factor <= 0 || math.IsInf(u.Factor, 0) || math.IsNaN(u.Factor) {
			t.Errorf("%q has factor %g", u.Symbol, u.Factor)
		}
	}
}

// errorInputs are the unit texts whose errors are golden-tested.
var errorInputs = []string{
	"",
	"   ",
	"kn",
	"KN",
	"mpa",
	"kNm",
	"Nmm",
	"kipft",
	"lbs",
	"kft",
	"kpsi",
	"xyzzy",
	"kN m",
	"kN.m",
	"kN-m",
	"N/",
	"N/mm^",
	"m^x",
	"m^(1/3)",
	"m^0.25",
	"m^0",
	"m^99",
	"m^(1/2",
	"(kN/m",
	"kN)",
	"2/K",
	"*m",
	"m*/s",
	"m⁻",
	"(m^(1/2))^(1/2)",
	"pcf_m",
	"N/mm^2 --",
	"°X",
	"µ",
	"kN\x00",
	"m\xff",
	"((((((((((((((((((m))))))))))))))))))",
	strings.Repeat("m*", 200) + "m",
	"m^24*m^24*m^24",
}

// TestParseErrorsGolden renders each error with a caret under its span.
func TestParseErrorsGolden(t *testing.T) {
	var b strings.Builder
	for _, in := range errorInputs {
		_, err := Parse(in)
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("Parse(%q) = %v, want an *Error", in, err)
			continue
		}
		if e.Offset < 0 || e.End < e.Offset || e.End > len(in) {
			t.Errorf("Parse(%q): span %d..%d outside the text", in, e.Offset, e.End)
		}
		if e.Msg == "" || e.Hint == "" {
			t.Errorf("Parse(%q): message %q and hint %q must both be set", in, e.Msg, e.Hint)
		}
		shown := fmt.Sprintf("%q", in)
		if len(shown) > 60 {
			shown = shown[:57] + "..."
		}
		fmt.Fprintf(&b, "unit:  %s\n", shown)
		if len(in) < 60 && utf8.ValidString(in) && !strings.ContainsRune(in, 0) {
			col := utf8.RuneCountInString(in[:min(e.Offset, len(in))])
			width := max(1, utf8.RuneCountInString(in[min(e.Offset, len(in)):min(e.End, len(in))]))
			fmt.Fprintf(&b, "        %s%s\n", strings.Repeat(" ", col), strings.Repeat("^", width))
		}
		fmt.Fprintf(&b, "span:  %d..%d\nerror: %s\nhint:  %s\n\n", e.Offset, e.End, e.Msg, e.Hint)
	}
	golden.Check(t, filepath.Join("testdata", "errors.golden"), []byte(b.String()), *update)
}
