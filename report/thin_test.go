package report

import (
	"fmt"
	"math"
	"testing"

	"scaleplan/sweep"
)

// TestThinMargins checks the buckets by hand: 9 points to 3 samples at
// indices 0, 4 and 8 stand for points [0,2), [2,6) and [6,9); each takes
// the smallest margin it stands for, NaN only where it has nothing else.
func TestThinMargins(t *testing.T) {
	nan := math.NaN()
	vals := []float64{3, 1, 2, -1, 5, nan, nan, nan, nan}
	idx := sampleIndices(len(vals), 3)
	if fmt.Sprint(idx) != "[0 4 8]" {
		t.Fatalf("indices %v, want [0 4 8]", idx)
	}
	got := thinMargins(vals, idx)
	if got[0] != 1 || got[1] != -1 || !math.IsNaN(got[2]) {
		t.Errorf("thinned to %v, want [1 -1 NaN]", got)
	}
	// A short series is kept whole.
	if idx := displayIndices(DisplayColumns); len(idx) != DisplayColumns || idx[len(idx)-1] != DisplayColumns-1 {
		t.Errorf("a series of %d points is thinned to %d", DisplayColumns, len(idx))
	}
	if idx := displayIndices(10 * DisplayColumns); len(idx) != DisplayColumns || idx[0] != 0 || idx[len(idx)-1] != 10*DisplayColumns-1 {
		t.Errorf("a long series keeps %d samples from %d to %d", len(idx), idx[0], idx[len(idx)-1])
	}
}

// TestWindowEdgeLines traces hand-made windows over four axis values: the
// large-model edge set by one limit at the first two values and another
// at the third makes two lines; the small-model edge set by the sweep's
// range is left out; an empty window breaks the lines.
func TestWindowEdgeLines(t *testing.T) {
	w := func(lo, hi float64, loL, hiL string) sweep.Window {
		return sweep.Window{{Lo: lo, Hi: hi, LoLimit: loL, HiLimit: hiL}}
	}
	windows := []sweep.Window{
		w(2, 50, "blockage", sweep.RangeLimit),
		w(3, 40, "blockage", "speed"),
		w(4, 30, "depth", "speed"),
		nil,
	}
	axis := []float64{1, 2, 3, 4}
	got := windowEdgeLines(windows, axis, []int{0, 1, 2, 3})
	want := "[{blockage [2 3] [1 2]} {depth [4] [3]} {speed [40 30] [2 3]}]"
	if fmt.Sprint(got) != want {
		t.Errorf("edge lines %v, want %s", got, want)
	}
	if got := windowEdgeLines(windows[:2], axis, []int{0, 1}); got != nil {
		t.Errorf("windows not one per axis value give %v, want none", got)
	}
}
