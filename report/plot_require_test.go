package report

import (
	"context"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep"
)

// TestRequirementData checks the series behind the requirement plots
// against the sweep's requirements: only capabilities that set a window
// edge, with the values the sweep computed and each facility's own value.
func TestRequirementData(t *testing.T) {
	s, err := sweep.LoadScenario("tug")
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
			if c.Have != want.Have || len(c.Needed) != len(want.Values) {
				t.Fatalf("%s: curve %+v does not match requirement %+v", rs.Capability, c.Have, want.Have)
			}
			for i := range c.Needed {
				if c.Needed[i] != want.Values[i] {
					t.Errorf("%s at %d: %v, sweep %v", rs.Capability, i, c.Needed[i], want.Values[i])
				}
			}
		}
	}
}
