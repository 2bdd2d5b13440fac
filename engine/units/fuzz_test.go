package units

import (
	"errors"
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
