package units

import (
	"strings"
	"unicode/utf8"
)

// Error is a problem in a unit text. Offset and End are byte offsets into the
// text given to Parse (End exclusive), so a caller that knows where the unit
// text sits in a sheet can point a caret at the exact spot.
type Error struct {
	Offset, End int
	Msg         string // what is wrong, e.g. "unknown unit `kn`"
	Hint        string // how to fix it, e.g. "did you mean `kN`?"; may be empty
}

// Error joins the message and the hint: "unknown unit `kn`; did you mean `kN`?".
func (e *Error) Error() string {
	if e.Hint == "" {
		return e.Msg
	}
	return e.Msg + "; " + e.Hint
}

// suggest returns the known spelling nearest to name, or "" when nothing is
// close. A match that differs only in letter case wins outright ("kn" ->
// "kN"), then a listed product whose operator was left out ("kNm" ->
// "kN*m"); otherwise the smallest edit distance (with transpositions) on the
// lower-cased spellings, at most 2 and less than the length of name, with
// ties broken by the exact-case distance and then by listing order.
func suggest(name string) string {
	if name == "" {
		return ""
	}
	lower := strings.ToLower(name)
	for _, s := range suggestions {
		if strings.ToLower(s) == lower {
			return s
		}
	}
	// A product written without its operator: kNm, Nmm, kipft.
	for _, s := range suggestions {
		if strings.Contains(s, "*") && strings.ToLower(strings.ReplaceAll(s, "*", "")) == lower {
			return s
		}
	}
	best, bestD, bestCase := "", 3, 0
	n := utf8.RuneCountInString(name)
	for _, s := range suggestions {
		d := editDistance(lower, strings.ToLower(s))
		if d >= n || d > bestD {
			continue
		}
		c := editDistance(name, s)
		if d < bestD || c < bestCase {
			best, bestD, bestCase = s, d, c
		}
	}
	return best
}

// editDistance is the optimal-string-alignment distance between a and b in
// runes: insertions, deletions, substitutions and swaps of neighbours cost 1.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	if len(ra) > 64 || len(rb) > 64 {
		return 1 << 10 // not a typo of a unit symbol
	}
	prev2 := make([]int, len(rb)+1)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(rb)]
}
