package diag

import (
	"fmt"
	"strings"
	"testing"
)

func TestDistance(t *testing.T) {
	cases := []struct {
		a, b string
		want int
	}{
		{"", "", 0},
		{"", "abc", 3},
		{"abc", "", 3},
		{"f_yd", "f_yd", 0},
		{"f_yk", "f_yd", 1},    // one substitution
		{"sigam", "sigma", 1},  // one swap of neighbours
		{"stres", "stress", 1}, // one insertion
		{"kN", "kn", 1},        // case-sensitive
		// Source: the standard worked example of edit distance, kitten ->
		// sitting, 3 edits (common practice; found in every text on the
		// Levenshtein distance).
		{"kitten", "sitting", 3},
		// Source: the optimal-string-alignment distance edits no substring
		// twice, so "ca" -> "abc" costs 3 where the unrestricted
		// Damerau-Levenshtein distance is 2 (the textbook example of the
		// difference; from memory).
		{"ca", "abc", 3},
		{"σ_Ed", "σ_Rd", 1}, // runes, not bytes: σ is two bytes
		{"N/mm²", "N/mm2", 1},
	}
	for _, c := range cases {
		t.Run(c.a+"_"+c.b, func(t *testing.T) {
			if got := Distance(c.a, c.b); got != c.want {
				t.Errorf("Distance(%q, %q) = %d, want %d", c.a, c.b, got, c.want)
			}
			if got := Distance(c.b, c.a); got != c.want {
				t.Errorf("Distance(%q, %q) = %d, want %d (symmetric)", c.b, c.a, got, c.want)
			}
		})
	}
}

// TestDistanceLong covers texts longer than the stack tables.
func TestDistanceLong(t *testing.T) {
	a := strings.Repeat("a", 100)
	b := strings.Repeat("b", 100)
	if got := Distance(a, b); got != 100 {
		t.Errorf("Distance = %d, want 100 substitutions", got)
	}
	// A shift by one is a deletion at the front and an insertion at the end.
	if got := Distance(strings.Repeat("ab", 50), strings.Repeat("ba", 50)); got != 2 {
		t.Errorf("Distance = %d, want 2", got)
	}
	if got := Distance(a, a+"x"); got != 1 {
		t.Errorf("Distance = %d, want 1", got)
	}
}

// TestNearest holds the cases the threshold was tuned on: the suggestions
// the goldens of the sheet reader, the checker, the unit parser and the CLI
// rely on must stay, and the unrelated ones must go.
func TestNearest(t *testing.T) {
	cells := []string{"P", "L", "A", "d", "f_yd", "N_Rd", "sigma", "A_s", "gamma_M0", "section_area"}
	cases := []struct {
		name       string
		in         string
		candidates []string
		want       string
	}{
		// Offered.
		{"one substitution", "f_yk", cells, "f_yd"},
		{"case only", "n_rd", cells, "N_Rd"},
		{"case only, one letter", "p", cells, "P"},
		{"a swap of neighbours", "sigam", cells, "sigma"},
		{"a doubled letter", "PP", cells, "P"},
		{"a doubled letter in a short name", "dd", cells, "d"},
		{"a dropped letter", "gamma_M", cells, "gamma_M0"},
		{"two edits in a long name", "sectoin_aera", cells, "section_area"},
		{"header key", "titel", []string{"title", "project", "basis", "author", "checker", "date", "revision", "units"}, "title"},
		{"header key in capitals", "Title", []string{"title", "project"}, "title"},
		{"function", "sqr", []string{"sqrt", "cbrt", "abs"}, "sqrt"},
		{"family", "sections", []string{"bar", "composite", "plastic", "section", "stability"}, "section"},
		{"template file", "mezzanine-hangar", []string{"mezzanine-hanger", "strut"}, "mezzanine-hanger"},
		{"unit with a letter too many", "kNN", []string{"N", "kN", "MN"}, "kN"},
		{"Greek names count runes", "σ_Ek", []string{"σ_Ed", "τ_Ed"}, "σ_Ed"},

		// Not offered.
		{"a one-letter name suggests no other one-letter name", "y", cells, ""},
		{"another one-letter name", "Q", cells, ""},
		{"a column of a table", "E", []string{"L", "A"}, ""},
		{"two edits in a short name", "sgma", []string{"gamma"}, ""},
		{"too far", "xyzzy", cells, ""},
		{"the name itself", "sigma", []string{"sigma"}, ""},
		{"no candidates", "sigma", nil, ""},
		{"empty name", "", cells, ""},
		{"empty candidate", "a", []string{""}, ""},

		// Ties.
		{"a case-only match beats a closer spelling", "kn", []string{"km", "kN"}, "kN"},
		{"ties go to the smaller exact-case distance", "Lb", []string{"lbf", "lb"}, "lb"},
		{"then to the earlier candidate", "lbs", []string{"lb", "lbf"}, "lb"},
		{"then to the earlier candidate, reversed", "lbs", []string{"lbf", "lb"}, "lbf"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := Nearest(c.in, c.candidates); got != c.want {
				t.Errorf("Nearest(%q, %q) = %q, want %q", c.in, c.candidates, got, c.want)
			}
		})
	}
}

// TestNearestThreshold walks names of growing length, each a given number
// of substitutions away from the one candidate, against the rule
// d <= max(1, n/3) and d < n.
func TestNearestThreshold(t *testing.T) {
	for n := 1; n <= 12; n++ {
		target := strings.Repeat("a", n)
		for d := 1; d <= n; d++ {
			name := strings.Repeat("b", d) + target[d:]
			want := d <= max(1, n/3) && d < n
			if got := Nearest(name, []string{target}) != ""; got != want {
				t.Errorf("n=%d d=%d: offered %v, want %v", n, d, got, want)
			}
		}
	}
}

func ExampleNearest() {
	names := []string{"P", "A", "f_yd", "sigma"}
	fmt.Printf("%q\n", Nearest("f_yk", names))
	fmt.Printf("%q\n", Nearest("SIGMA", names))
	fmt.Printf("%q\n", Nearest("y", names)) // any letter is one edit from A
	// Output:
	// "f_yd"
	// "sigma"
	// ""
}

func BenchmarkNearest(b *testing.B) {
	names := make([]string, 1000)
	for i := range names {
		names[i] = fmt.Sprintf("cell_%03d", i)
	}
	b.ReportAllocs()
	for b.Loop() {
		if Nearest("cell_5OO", names) == "" {
			b.Fatal("no suggestion")
		}
	}
}
