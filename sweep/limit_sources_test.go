package sweep

import (
	"regexp"
	"strings"
	"testing"
)

// Every default limit names where it comes from: a facility capability, a
// published guideline, handbook or paper (with a year), or common practice
// said plainly as such, so that a proposal can cite it.
func TestDefaultLimitSources(t *testing.T) {
	rows, err := readCSV("data/default_limits.csv")
	if err != nil {
		t.Fatal(err)
	}
	year := regexp.MustCompile(`\b(19|20)\d\d\b`)
	for i, r := range rows {
		src := r[3]
		switch {
		case strings.HasPrefix(src, "facility capability"):
		case year.MatchString(src):
		case strings.Contains(src, "common practice, from memory (no published threshold found)"):
		default:
			t.Errorf("default_limits.csv row %d (%s, %s): source %q names no publication and does not say it is common practice", i+2, r[0], r[1], src)
		}
		if strings.Contains(src, "common practice, from memory:") {
			t.Errorf("row %d (%s, %s): say whether a published source was looked for", i+2, r[0], r[1])
		}
	}
}
