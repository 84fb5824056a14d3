package report

import (
	"math"
	"strings"

	"scaleplan/sweep"
)

// matchList prints the library entries that meet a required property:
// "hdpe (9e+08 Pa), abs (2.2e+09 Pa)".
func matchList(q string, ms []sweep.Match) string {
	parts := make([]string, len(ms))
	for i, m := range ms {
		parts[i] = m.Entry
		if !math.IsNaN(m.Value) {
			parts[i] += " (" + Num3(m.Value) + " " + unitOf(q) + ")"
		}
	}
	return strings.Join(parts, ", ")
}
