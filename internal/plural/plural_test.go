package plural

import "testing"

// TestCount checks the regular English plural (common practice; the
// rules as any English grammar states them) on the nouns Sheaf counts.
func TestCount(t *testing.T) {
	cases := []struct {
		n    int
		noun string
		want string
	}{
		{1, "problem", "1 problem"},
		{0, "problem", "0 problems"},
		{2, "problem", "2 problems"},
		{1, "entry", "1 entry"},
		{3, "entry", "3 entries"},
		{2, "day", "2 days"}, // a vowel before the y: just s
		{2, "design check", "2 design checks"},
		{5, "bad row", "5 bad rows"},
		{2, "box", "2 boxes"},
		{2, "class", "2 classes"},
		{2, "batch", "2 batches"},
		{-1, "case", "-1 cases"},
		{2, "y", "2 ys"},
		{2, "", "2 "},
	}
	for _, c := range cases {
		if got := Count(c.n, c.noun); got != c.want {
			t.Errorf("Count(%d, %q) = %q, want %q", c.n, c.noun, got, c.want)
		}
	}
}

func TestGrouped(t *testing.T) {
	// Common practice: digits grouped by threes with a comma, as in the
	// limits of SPEC.md ("65,535 bytes", "10,000 terms").
	for _, c := range []struct {
		n    int
		want string
	}{{0, "0"}, {999, "999"}, {1000, "1,000"}, {65535, "65,535"}, {1234567, "1,234,567"}, {-1200, "-1,200"}, {-999, "-999"}} {
		if got := Grouped(c.n); got != c.want {
			t.Errorf("Grouped(%d) = %q, want %q", c.n, got, c.want)
		}
	}
}
