package xlsxout

import (
	"strings"
	"testing"
	"unicode"
)

// FuzzDefinedName: whatever the sheet name, the defined name is valid:
// it starts with a letter or underscore, holds only letters, digits,
// underscores and periods, and is no cell reference or constant.
func FuzzDefinedName(f *testing.F) {
	for _, s := range []string{"A1", "d1", "R", "RC", "R1C1", "TRUE", "σ_Rd", "N_Ed", "", "1a", "x.y", "XFD1048576"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		n := DefinedName(s)
		if n == "" || !startsWell(n) || misread(n) {
			t.Fatalf("DefinedName(%q) = %q is not a valid name", s, n)
		}
		for _, r := range n {
			if !(r == '_' || r == '.' || unicode.IsLetter(r) || unicode.IsDigit(r)) {
				t.Fatalf("DefinedName(%q) = %q holds %q", s, n, r)
			}
		}
		if s != "" && !misread(s) && startsWell(s) && !strings.ContainsFunc(s, func(r rune) bool {
			return !(r == '_' || r == '.' || unicode.IsLetter(r) || unicode.IsDigit(r))
		}) && n != s {
			t.Fatalf("a valid name %q was changed to %q", s, n)
		}
	})
}
