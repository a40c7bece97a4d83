package catalog

import (
	"github.com/phgate/phgate/spec/suggest"
	"sort"
	"strconv"
	"strings"
)

// nearest returns up to n candidates close to s: within an edit distance
// of a third of its length (at least 2), or containing it / contained in
// it, nearest first and alphabetically among equals.
func nearest(s string, candidates []string, n int) []string {
	if n <= 0 || s == "" {
		return nil
	}
	type scored struct {
		id string
		d  int
	}
	limit := max(2, len([]rune(s))/3)
	ls := strings.ToLower(s)
	var out []scored
	seen := map[string]bool{}
	for _, c := range candidates {
		if seen[c] || c == s {
			continue
		}
		seen[c] = true
		d := suggest.Distance(ls, strings.ToLower(c))
		if len(ls) >= 3 && (strings.Contains(c, ls) || strings.Contains(ls, strings.ToLower(c))) {
			d = min(d, limit)
		}
		if d <= limit {
			out = append(out, scored{c, d})
		}
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].d != out[j].d {
			return out[i].d < out[j].d
		}
		return out[i].id < out[j].id
	})
	ids := make([]string, 0, n)
	for i := 0; i < len(out) && i < n; i++ {
		ids = append(ids, out[i].id)
	}
	return ids
}

// didYouMean formats the nearest candidate as a message suffix.
func didYouMean(s string, candidates []string) string {
	if c := nearest(s, candidates, 1); len(c) == 1 {
		return "; did you mean " + strconv.Quote(c[0]) + "?"
	}
	return ""
}
