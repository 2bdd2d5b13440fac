package check

import "strings"

// nearest returns the candidate closest to name by edit distance (case
// differences cost little), or "" if none is close enough to be a likely
// slip.
func nearest(name string, candidates []string) string {
	best, bestD := "", 1<<30
	limit := max(1, len([]rune(name))/3)
	for _, c := range candidates {
		if c == name {
			continue
		}
		d := distance(strings.ToLower(name), strings.ToLower(c))*2 + b2i(!strings.EqualFold(c, name))
		if d < bestD || (d == bestD && c < best) {
			best, bestD = c, d
		}
	}
	if bestD > 2*limit+1 {
		return ""
	}
	return best
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// distance is the Levenshtein distance over runes.
func distance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
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
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

// Nearest returns the candidate closest to name by edit distance, or "" if
// none is close enough to be a likely slip.
func Nearest(name string, candidates []string) string { return nearest(name, candidates) }
