package report

import (
	"fmt"
	"math"
	"reflect"
	"testing"

	"scaleplan/sweep"
	"scaleplan/sweep/study"
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

// The contour map thins each margin row as it is swept; its grid must be
// the one thinning the full rows gives (columns from the whole rows, then
// rows, each kept point taking the smallest margin it stands for; the
// rows as thinMarginGrid does), and its iso-lines the
// measures at the displayed points, for the scenarios with a second axis
// and a synthetic study whose strategies have no window.
func TestContourThinnedAsSwept(t *testing.T) {
	results := []*sweep.Result{scenarioResult(t, "conductor"), scenarioResult(t, "estuary"), runStudy(t, study.Synthetic(301, 9, 3, 4))}
	drawn := 0
	for _, res := range results {
		p := res.Plan
		for _, sr := range res.Strategies {
			cm := ContourData(res, sr)
			if cm == nil {
				continue
			}
			drawn++
			xi, yi := displayIndices(len(p.Grid)), displayIndices(len(p.AxisValues))
			full := cm.Combo.AxisMarginRows()
			cols := make([][]float64, len(full))
			for j, row := range full {
				cols[j] = thinMargins(row, xi)
			}
			if want := thinMarginGrid(cols, yi); !reflect.DeepEqual(cm.Z, want) {
				t.Errorf("%s %s: contour grid differs from thinning the full rows", res.Name, sr.Name)
			}
			measures := cm.Combo.AxisMeasureRows()
			for _, im := range cm.Iso {
				rows := measures[im.Name]
				for j, yj := range yi {
					for i, xk := range xi {
						v, got := rows[yj][xk], im.LogZ[j][i]
						if v > 0 && !math.IsInf(v, 0) && got != math.Log10(v) || !(v > 0 && !math.IsInf(v, 0)) && !math.IsNaN(got) {
							t.Fatalf("%s %s: measure %s at (%d, %d) is %v, the full rows give %v", res.Name, sr.Name, im.Name, j, i, got, v)
						}
					}
				}
			}
		}
	}
	if drawn < 4 {
		t.Errorf("only %d contour maps drawn", drawn)
	}
}
