// Package suggest finds the nearest of a set of known names to a
// misspelt one, for "did you mean" hints in messages.
package suggest

import "strings"

// Distance is the Levenshtein edit distance between a and b, in runes.
func Distance(a, b string) int {
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

// Nearest returns the candidate closest to s, ignoring case, when it is
// close enough to be a plausible typo (within a third of the length of s,
// and at least 2 edits), or "".
func Nearest(s string, candidates []string) string {
	best, bestD := "", 1<<30
	for _, c := range candidates {
		if d := Distance(strings.ToLower(s), strings.ToLower(c)); d < bestD {
			best, bestD = c, d
		}
	}
	if best == "" || bestD > max(2, len([]rune(s))/3) {
		return ""
	}
	return best
}
