package diag

import (
	"strings"
	"unicode/utf8"
)

// maxNearRunes bounds the names Nearest compares: a longer text is not a
// mistyped name, and the bound keeps the distance tables on the stack.
const maxNearRunes = 64

// Nearest returns the candidate that name most likely misspells, for a
// "did you mean" hint, or "" when none is close enough to offer.
//
// A candidate that differs from name only in letter case wins outright
// (`n_rd` -> `N_Rd`). Otherwise the distance is counted on the lower-cased
// texts as the optimal-string-alignment distance (insertions, deletions,
// substitutions and swaps of two neighbours cost one each; a swap is the
// commonest slip of the hand), and a candidate is offered when
//
//	distance <= max(1, n/3)  and  distance < n
//
// where n is the number of runes in name. The first bound lets one edit
// through in short names and one per three runes in long ones (`sectoin_area`
// may be four edits off); the second keeps a one-letter name from
// suggesting another one-letter name: `x` undefined in a sheet with a cell
// `A` says nothing, since any letter is one edit from any other. Ties go to
// the candidate whose exact-case distance is smaller, then to the earlier
// one in candidates, so callers list them in a fixed order of preference.
// name itself is never offered.
func Nearest(name string, candidates []string) string {
	n := utf8.RuneCountInString(name)
	if n == 0 || n > maxNearRunes {
		return ""
	}
	lower := strings.ToLower(name)
	limit := max(1, n/3)
	best, bestD, bestCase := "", limit+1, 0
	for _, c := range candidates {
		if c == name || c == "" {
			continue
		}
		m := utf8.RuneCountInString(c)
		if m > maxNearRunes || m-n > limit || n-m > limit {
			continue // the lengths alone differ by more edits than allowed
		}
		d := Distance(lower, strings.ToLower(c))
		if d > limit || (d > 0 && d >= n) || d > bestD {
			continue
		}
		cd := Distance(name, c)
		if d < bestD || cd < bestCase {
			best, bestD, bestCase = c, d, cd
		}
	}
	return best
}

// Distance is the optimal-string-alignment distance between a and b,
// counted in runes: the fewest insertions, deletions, substitutions and
// swaps of neighbouring runes that turn a into b, where no rune is edited
// twice. It is case-sensitive. Names of ordinary length need no heap.
func Distance(a, b string) int {
	var bufA, bufB [maxNearRunes]rune
	ra, rb := runes(a, bufA[:0]), runes(b, bufB[:0])
	if len(rb) > maxNearRunes {
		return osa(ra, rb, make([]int, 3*(len(rb)+1)))
	}
	var rows [3 * (maxNearRunes + 1)]int
	return osa(ra, rb, rows[:3*(len(rb)+1)])
}

// osa computes the distance row by row in three rows of len(rb)+1 cells
// taken from rows: the swap of neighbours looks two rows back.
func osa(ra, rb []rune, rows []int) int {
	w := len(rb) + 1
	prev2, prev, cur := rows[:w], rows[w:2*w], rows[2*w:3*w]
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

// runes appends the runes of s to buf.
func runes(s string, buf []rune) []rune {
	for _, r := range s {
		buf = append(buf, r)
	}
	return buf
}
