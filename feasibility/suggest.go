package feasibility

import (
	"fmt"
	"strings"
)

// Suggest returns " (did you mean X?)" when one of the known names is close
// to name, and otherwise a short list of what is known.
func Suggest(name string, known []string) string {
	best, bestD := "", 1<<30
	lower := strings.ToLower(name)
	for _, k := range known {
		d := editDistance(lower, strings.ToLower(k))
		if d < bestD {
			best, bestD = k, d
		}
	}
	limit := len(name)/3 + 1
	if limit > 3 {
		limit = 3
	}
	if best != "" && (bestD <= limit || strings.HasPrefix(strings.ToLower(best), lower) && len(lower) >= 3) {
		return fmt.Sprintf(" (did you mean %s?)", best)
	}
	if len(known) <= 16 {
		return " (known: " + strings.Join(known, ", ") + ")"
	}
	return ""
}

// editDistance is the Levenshtein distance between a and b, over runes.
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
