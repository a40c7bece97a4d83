package units

import (
	"strings"
	"unicode"
)

// suggest returns the canonical spelling of the known unit closest to text,
// or "" when none is close. Closeness is the optimal string alignment
// distance between lower-cased spellings with white space removed, so
// "mm" → "mM" (case alone differs) and "mgs" → "mg" (one extra letter).
// Ties go to the candidate that also matches case better, then to the
// earlier entry of unitTable. When allowed is not empty only units of those
// kinds are candidates.
func suggest(text string, allowed []Kind) string {
	in := []rune(normalize(text))
	if len(in) == 0 {
		return ""
	}
	folded := []rune(strings.ToLower(string(in)))
	// Short inputs get less slack, or every one-letter typo would be "close"
	// to some other one- or two-letter symbol.
	limit := 2
	switch {
	case len(in) == 1:
		limit = 0 // only a change of case: "m" → "M", but "u" → nothing
	case len(in) <= 3:
		limit = 1
	}
	var best *unit
	bestDist, bestCase := limit+1, 0
	for _, sp := range spellings {
		if len(allowed) > 0 && !contains(allowed, sp.u.kind) {
			continue
		}
		cand := []rune(normalize(sp.text))
		if abs(len(cand)-len(in)) > limit {
			continue // the distance is at least the difference in length
		}
		d := distance(folded, []rune(strings.ToLower(string(cand))))
		if d > limit || (d > 0 && d >= max(len(in), len(cand))) {
			continue
		}
		c := distance(in, cand)
		if d < bestDist || (d == bestDist && c < bestCase) {
			best, bestDist, bestCase = sp.u, d, c
		}
	}
	if best == nil {
		return ""
	}
	return best.canon
}

// normalize removes white space and writes the micro sign for the Greek mu,
// so that spellings compare by their letters only.
func normalize(s string) string {
	return strings.Map(func(c rune) rune {
		switch {
		case unicode.IsSpace(c):
			return -1
		case c == 'μ':
			return 'µ'
		}
		return c
	}, s)
}

// distance is the optimal string alignment distance: insertions, deletions,
// substitutions and transpositions of adjacent runes each cost 1.
func distance(a, b []rune) int {
	prev2 := make([]int, len(b)+1)
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}
