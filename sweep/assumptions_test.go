package sweep

import (
	"math"
	"testing"
)

// TestAssumptionsTugLargerModel: Froude scaling of the tug in the
// Deepwater tank is limited by blockage, beam·draft/(kL²·w·d) ≤ 0.01. At
// the grid scale just larger than the window (the grid is 4·15^(j/399)),
// both the tank's width and its depth fall short, each by the same
// factor; a larger model needs both, not only the first.
func TestAssumptionsTugLargerModel(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	sr := strategy(t, res, "Froude scaling")
	a := res.Assume(sr)
	lo := math.Sqrt(11 * 4.8 / (0.01 * 9 * 4.5)) // 11.418
	j := int(math.Floor(399 * math.Log(lo/4) / math.Log(15)))
	k := 4 * math.Pow(15, float64(j)/399)
	if !relClose(a.LargerScale, k, 1e-9) || a.LargerLimit != "blockage" {
		t.Fatalf("larger scale %v (%s), want %v (blockage)", a.LargerScale, a.LargerLimit, k)
	}
	want := map[string]float64{
		"tank_width": 11 * 4.8 / (0.01 * k * k * 4.5),
		"tank_depth": 11 * 4.8 / (0.01 * k * k * 9),
	}
	if len(a.LargerNeeds) != len(want) {
		t.Fatalf("needs %+v, want tank_width and tank_depth", a.LargerNeeds)
	}
	for _, n := range a.LargerNeeds {
		if !relClose(n.Value, want[n.Capability], 1e-9) || !n.AtLeast || n.Limit != "blockage" {
			t.Errorf("%+v, want %v", n, want[n.Capability])
		}
	}
	if a.Axis != nil || len(a.Fixed) != 0 {
		t.Errorf("the tug has no axis and fixes nothing: %+v", a)
	}
}

// TestAssumptionsCheapestOverAllCombinations: the recommended Froude
// option is in the Deepwater tank, but the Estuary tank (380 against 620
// EUR an hour) is cheaper. Its window, by hand: blockage gives kL ≥
// √(52.8/(0.01·6·3)) = 17.13, the carriage (1.6 m/s) kL ≥ (6.173/1.6)² =
// 14.9, and a model Reynolds number of 2e6 the small-model edge shared
// with the Deepwater tank. The cost is 2600 EUR/m² · 28·11 m²/kL² +
// 380 EUR/h · 80 runs · (120 m / (V/√kL) + 600 s).
func TestAssumptionsCheapestOverAllCombinations(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	sr := strategy(t, res, "Froude scaling")
	a := res.Assume(sr)
	if a.Cheapest == nil || a.Cheapest.Facility != "Estuary tank" || sr.Best.Facility != "Deepwater tank" {
		t.Fatalf("cheapest %+v, best in %s", a.Cheapest, sr.Best.Facility)
	}
	o := a.Cheapest
	if !relClose(o.Window[0].Lo, math.Sqrt(52.8/(0.01*6*3)), 1e-9) {
		t.Errorf("Estuary window %v", o.Window)
	}
	v := 12 * 1852.0 / 3600
	cost := func(kL float64) float64 {
		return 2600*28*11/(kL*kL) + 380*80*(120/(v/math.Sqrt(kL))+600)/3600
	}
	if !relClose(o.CheapestCost, cost(o.Cheapest), 1e-9) {
		t.Errorf("cheapest cost %v at %v, by hand %v", o.CheapestCost, o.Cheapest, cost(o.Cheapest))
	}
	for _, c := range sr.Combos {
		if !c.Window.Empty() && c.CheapestCost < o.CheapestCost {
			t.Errorf("%s is cheaper: %v", c.Facility, c.CheapestCost)
		}
	}
	if !(o.CheapestCost < sr.Best.CheapestCost) {
		t.Errorf("the Estuary option %v is not cheaper than the recommended combination's %v", o.CheapestCost, sr.Best.CheapestCost)
	}
}

// TestAssumptionsAxisValue: the conductor sweeps its velocity scale; the
// recommendation names the value it assumes, and a case that fixes the
// velocity names the fix and no axis value.
func TestAssumptionsAxisValue(t *testing.T) {
	res := runStudy(t, scenario(t, "conductor"))
	a := res.Assume(res.Strategies[0])
	if a.Axis == nil || a.Axis.Name != "velocity" || a.Axis.Value != res.Strategies[0].Best.Axis {
		t.Errorf("axis %+v", a.Axis)
	}
	res = runStudy(t, conductorFixed(t, "velocity=2", true))
	a = res.Assume(res.Strategies[0])
	if a.Axis != nil || len(a.Fixed) != 1 || a.Fixed[0] != (FixedChoice{"velocity", 2}) {
		t.Errorf("fixed case: %+v", a)
	}
}
