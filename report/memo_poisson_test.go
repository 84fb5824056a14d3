package report_test

import (
	"strings"
	"testing"

	"scaleplan/report"
)

// TestMemoPoissonNote: the memo states the Poisson's-ratio mismatch from
// the recommended combination's flag (PoissonFlag, PoissonNote), not by
// looking for a note that starts with "Poisson". In the pontoon scenario
// the recommended aluminium backbone has ν 0.33 against the prototype's
// 0.2: (0.33 − 0.2) / 0.2 = 65 %.
func TestMemoPoissonNote(t *testing.T) {
	res := wbRunScenario(t, "pontoon")
	rec := res.Strategies[0].Best
	if rec == nil || !rec.PoissonFlag {
		t.Fatalf("pontoon: the recommended combination has no Poisson flag")
	}
	const line = "- Poisson's ratio of aluminium backbone (0.33) differs from the prototype's (0.2) by 65 %"
	if memo := report.Memo(res); !strings.Contains(memo, line) {
		t.Errorf("the memo lacks %q", line)
	}
	// Without the flag, no line, whatever the notes say.
	rec.PoissonFlag = false
	if memo := report.Memo(res); strings.Contains(memo, "- Poisson's ratio") {
		t.Error("the memo states a Poisson's-ratio mismatch the combination is not flagged for")
	}
}
