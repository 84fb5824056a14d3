package sweep

import (
	"math"
	"testing"

	"scaleplan/sweep/study"
)

// TestAxisChoiceByHand checks the second-axis value the sweep chooses for
// the synthetic tug (Froude scaling, tank depth as axis) against a hand
// calculation. The large-model edge is the carriage limit V_p/√kL ≤ 2.2
// m/s, kL ≥ (V_p/2.2)², unless the tank is too shallow: the blockage limit
// beam·draft/(width·depth) ≤ 0.01 with model lengths 11/kL and 4.8/kL gives
// kL² ≥ 11·4.8/(0.01·9·depth). The largest model is therefore had in every
// tank at least 11·4.8/(0.09·kL²) deep (with the same window), and the
// sweep keeps the first of them. 12 kn = 12·1852/3600 m/s.
func TestAxisChoiceByHand(t *testing.T) {
	res := runStudy(t, study.Synthetic(40, 41, 1, 1))
	c := comboIn(t, res.Strategies[0], "Deepwater tank")
	vp := 12 * 1852.0 / 3600
	kLo := math.Pow(vp/2.2, 2)
	deep := 11 * 4.8 / (0.09 * kLo * kLo)
	want := math.NaN()
	for _, d := range res.Plan.AxisValues {
		if d >= deep {
			want = d
			break
		}
	}
	if c.Axis != want {
		t.Errorf("chosen tank depth %v m, want the first axis value from %.4g m: %v", c.Axis, deep, want)
	}
	if c.Window.Empty() || !relClose(c.Window[0].Lo, kLo, 1e-12) || c.Window[0].LoLimit != "carriage speed max" {
		t.Errorf("window %+v, want it to start at kL %v (carriage speed max)", c.Window, kLo)
	}
	// At every shallower depth the blockage edge is the larger kL; where
	// it passes the small-model edge (set by a limit that does not involve
	// the depth) the window is empty.
	hi := c.Window[0].Hi
	for i, d := range res.Plan.AxisValues {
		if d >= deep {
			break
		}
		w := c.AxisWindows[i]
		b := math.Sqrt(11 * 4.8 / (0.09 * d))
		if b > hi {
			if !w.Empty() {
				t.Errorf("depth %.4g m: window %+v, want none (blockage needs kL %v > %v)", d, w, b, hi)
			}
			continue
		}
		if w.Empty() || !relClose(w[0].Lo, b, 1e-12) || w[0].LoLimit != "blockage" {
			t.Errorf("depth %.4g m: window %+v, want it to start at kL %v (blockage)", d, w, b)
		}
	}
}

// TestAxisRowsOnDemand checks that a two-axis sweep keeps no margins per
// axis value and computes them on demand: one row per axis value, the row
// at the chosen value equal to the margins kept for the map sheets.
func TestAxisRowsOnDemand(t *testing.T) {
	res := runStudy(t, study.Synthetic(30, 6, 2, 1))
	checkAxisRows(t, res, res.Strategies[0].Combos)
}

// The peak found with the windows equals the largest margin of the rows
// swept on demand, also for strategies with no window anywhere (those a
// contour map picks from by their peak).
func TestAxisPeakOfInfeasibleStrategies(t *testing.T) {
	res := runStudy(t, study.Synthetic(301, 9, 3, 4))
	var combos []*ComboResult
	empty := 0
	for _, sr := range res.Strategies {
		for _, c := range sr.Combos {
			combos = append(combos, c)
			if c.Window.Empty() {
				empty++
			}
		}
	}
	if empty == 0 {
		t.Fatalf("the study has no combination without a window")
	}
	checkAxisRows(t, res, combos)
}

func checkAxisRows(t *testing.T, res *Result, combos []*ComboResult) {
	t.Helper()
	for _, c := range combos {
		if c.AxisMargins != nil || c.AxisMeasures != nil {
			t.Fatalf("%s: margins kept at every axis value", c.Medium)
		}
		rows := c.AxisMarginRows()
		if len(rows) != len(res.Plan.AxisValues) {
			t.Fatalf("%s: %d rows, want %d", c.Medium, len(rows), len(res.Plan.AxisValues))
		}
		chosen := -1
		for i, a := range res.Plan.AxisValues {
			if a == c.Axis {
				chosen = i
			}
		}
		if chosen < 0 {
			t.Fatalf("%s: chosen axis value %v is not on the axis", c.Medium, c.Axis)
		}
		peak := math.Inf(-1)
		for i, row := range rows {
			for k, v := range row {
				if i == chosen && v != c.Margins[k] {
					t.Fatalf("%s: row %d point %d is %v, the kept margin %v", c.Medium, i, k, v, c.Margins[k])
				}
				peak = math.Max(peak, v)
			}
		}
		if p := c.AxisMarginPeak(); p != peak {
			t.Errorf("%s: peak %v, want %v", c.Medium, p, peak)
		}
	}
}
