package units

import (
	"errors"
	"math"
	"math/big"
	"strings"
	"testing"
)

// FuzzParse feeds arbitrary text to the unit parser: it must never panic,
// every failure must be an *Error with a span inside the text, and every
// success must print a symbol that parses back to the same unit.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"kN", "N/mm^2", "kN·m", "mm2", "1/K", "MPa^(1/2)", "m⁻¹", "(kN/m)*m", "kn", "kN m"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		u, err := Parse(text)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("Parse(%q) error %T is not *Error", text, err)
			}
			if e.Offset < 0 || e.End < e.Offset || e.End > len(text) || e.Msg == "" {
				t.Fatalf("Parse(%q): bad error %+v", text, e)
			}
			return
		}
		back, err := Parse(u.Symbol)
		if err != nil {
			t.Fatalf("Parse(%q) = %q, which does not parse: %v", text, u.Symbol, err)
		}
		if back.Symbol != u.Symbol || back.Dim != u.Dim || back.Factor != u.Factor {
			t.Fatalf("Parse(%q) = %+v, but its symbol parses to %+v", text, u, back)
		}
		if pretty, err := Parse(u.Pretty()); err != nil || pretty.Symbol != u.Symbol {
			t.Fatalf("Parse(%q).Pretty() = %q parses to %q, %v", text, u.Pretty(), pretty.Symbol, err)
		}
	})
}

// FuzzFormat: a finite SI value in a unit of finite, non-zero factor is
// written as a finite number (never "+Inf", "-Inf", "NaN" or a lost "0"),
// and the number read back in extended precision is si/factor to the
// figures asked for.
func FuzzFormat(f *testing.F) {
	f.Add(2.36e304, 1e-6, 3)
	f.Add(-1.7e308, 1e-3, 17)
	f.Add(5e-320, 1e3, 3)
	f.Add(353.677651e6, 1e6, 4)
	f.Add(math.Pi/6, math.Pi/180, 4)
	f.Fuzz(func(t *testing.T, si, factor float64, sig int) {
		if math.IsNaN(si) || math.IsInf(si, 0) || math.IsNaN(factor) || math.IsInf(factor, 0) || factor == 0 {
			return
		}
		s := Format(si, Unit{Factor: factor, Symbol: "u"}, sig)
		num, ok := strings.CutSuffix(s, " u")
		if !ok || strings.ContainsAny(num, "IN") {
			t.Fatalf("Format(%g, factor %g, %d) = %q", si, factor, sig, s)
		}
		got, _, err := big.ParseFloat(num, 10, 64, big.ToNearestEven)
		if err != nil {
			t.Fatalf("Format(%g, factor %g, %d) = %q does not read back: %v", si, factor, sig, s, err)
		}
		want := new(big.Float).SetPrec(64).Quo(big.NewFloat(si), big.NewFloat(factor))
		if si != 0 && got.Sign() == 0 {
			t.Fatalf("Format(%g, factor %g, %d) = %q lost the value", si, factor, sig, s)
		}
		if want.Sign() == 0 {
			return
		}
		// |got - want| / |want| within half a unit in the last figure kept,
		// plus the rounding of the float64 quotient (a few ulps) where it
		// stayed in range.
		n := min(max(sig, 1), 17)
		rel, _ := new(big.Float).Quo(new(big.Float).Sub(got, want), want).Float64()
		if math.Abs(rel) > 0.51*math.Pow(10, float64(1-n))+5e-16 {
			t.Fatalf("Format(%g, factor %g, %d) = %q, want %s (relative %g)", si, factor, sig, s, want.Text('g', 20), rel)
		}
	})
}
