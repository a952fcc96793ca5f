package manuscript

import "strings"

// closest returns the candidate nearest to s by edit distance
// (case-insensitive), or "" when none is reasonably close.
func closest(s string, candidates []string) string {
	best, bestD := "", 1<<30
	ls := strings.ToLower(s)
	for _, c := range candidates {
		d := editDistance(ls, strings.ToLower(c))
		if d < bestD {
			best, bestD = c, d
		}
	}
	if bestD > len(s)/2+1 {
		return ""
	}
	return best
}

// DidYouMean formats a suggestion suffix, or "".
func DidYouMean(s string, candidates []string) string {
	if c := closest(s, candidates); c != "" {
		return " (did you mean " + c + "?)"
	}
	return ""
}

func editDistance(a, b string) int {
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
