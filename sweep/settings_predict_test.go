package sweep

import (
	"slices"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

// TestPredictSetting: the predict setting lists quantities; an unknown
// one is a problem at the setting's cell with a suggestion.
func TestPredictSetting(t *testing.T) {
	at := study.Cell{Sheet: "Study", Row: 30, Col: 2}
	var ps study.Problems
	if got := parsePredict("force; power ,, ", at, &ps); !slices.Equal(got, []string{"force", "power"}) || ps.Err() != nil {
		t.Errorf("parsePredict: %v, %v", got, ps.Err())
	}
	got := parsePredict("force, powr", at, &ps)
	if !slices.Equal(got, []string{"force"}) {
		t.Errorf("parsePredict kept %v", got)
	}
	err := ps.Err()
	if err == nil || !strings.Contains(err.Error(), "Study!B30") || !strings.Contains(err.Error(), `"powr"`) || !strings.Contains(err.Error(), "power") {
		t.Errorf("an unknown quantity gives %v, want a problem at Study!B30 suggesting power", err)
	}
}
