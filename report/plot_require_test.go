package report

import (
	"context"
	"math"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// scenarioResult runs a built-in scenario.
func scenarioResult(t *testing.T, name string) *sweep.Result {
	t.Helper()
	s, err := study.LoadScenario(name)
	if err != nil {
		t.Fatal(err)
	}
	lib, _ := materials.Default()
	cat, _ := sweep.NewFacilityCatalog()
	p, err := sweep.Prepare(s, lib, cat)
	if err != nil {
		t.Fatal(err)
	}
	res, err := p.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// TestRequirementData checks the series behind the requirement plots
// against the sweep's requirements: only capabilities that set a window
// edge, with the values the sweep computed and each facility's own value.
func TestRequirementData(t *testing.T) {
	res := scenarioResult(t, "tug")
	var sr *sweep.StrategyResult
	for _, x := range res.Strategies {
		if x.Name == "Froude scaling" {
			sr = x
		}
	}
	series := RequirementData(res, sr)
	if len(series) == 0 {
		t.Fatal("no requirement series")
	}
	for _, rs := range series {
		if rs.Limit != "blockage" {
			t.Errorf("series for %s from %q: only edge-setting limits should be plotted", rs.Capability, rs.Limit)
		}
		for k, c := range rs.Curves {
			combo := sr.Combos[k]
			var want sweep.Requirement
			for _, r := range combo.Requirements {
				if r.Capability == rs.Capability && r.Limit == rs.Limit {
					want = r
				}
			}
			if c.Have != want.Have || len(c.Needed) != want.Len() {
				t.Fatalf("%s: curve %+v does not match requirement %+v", rs.Capability, c.Have, want.Have)
			}
			for i := range c.Needed {
				if c.Needed[i] != want.At(i) {
					t.Errorf("%s at %d: %v, sweep %v", rs.Capability, i, c.Needed[i], want.At(i))
				}
			}
		}
	}
}

// TestContourIsoLines: the iso-lines drawn on the conductor's contour map
// come from the study's measures, at values inside their range on the map.
func TestContourIsoLines(t *testing.T) {
	res := scenarioResult(t, "conductor")
	p := res.Plan
	cm := ContourData(res, res.Strategies[0])
	if cm == nil || len(cm.Iso) != len(p.Measures) {
		t.Fatalf("contour map %v with %d measures, want one iso set per measure (%d)", cm != nil, len(cm.Iso), len(p.Measures))
	}
	for _, im := range cm.Iso {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, row := range im.LogZ {
			for _, v := range row {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
		for _, l := range im.Levels {
			if lg := math.Log10(l); lg <= lo || lg >= hi {
				t.Errorf("%s: iso-line %v outside the map's range %v–%v", im.Name, l, math.Pow(10, lo), math.Pow(10, hi))
			}
		}
	}
}

// TestJointScaleLaws: for a special-cases strategy recommended at a joint
// scale, the prediction rules of each case are given at that scale (the
// sand case's force multiplier is kL³, the clay case's kL²).
func TestJointScaleLaws(t *testing.T) {
	res := scenarioResult(t, "tine")
	sr := res.Strategies[0]
	kL := sr.Best.Recommended
	want := map[string]float64{"dry sand": math.Pow(kL, 3), "soft clay": kL * kL}
	for _, cs := range sr.Cases {
		f, _ := sr.CaseFactors(cs, sr.Best)
		if f == nil || math.Abs(f["force"]/want[cs.Case]-1) > 1e-9 {
			t.Errorf("case %s: force multiplier %v, want %v", cs.Case, f["force"], want[cs.Case])
		}
	}
}
