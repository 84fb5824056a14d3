package report

import (
	"testing"

	"scaleplan/feasibility"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// TestLabelsCoverEveryName: every quantity, law, facility type and
// capability has an entry in the label table, so no raw name reaches a
// document for people through the fallback.
func TestLabelsCoverEveryName(t *testing.T) {
	for _, q := range feasibility.QuantityNames() {
		if _, ok := labels[q]; !ok {
			t.Errorf("quantity %s has no label", q)
		}
	}
	for _, l := range feasibility.LawNames() {
		if _, ok := lawLabels[l]; !ok {
			t.Errorf("law %s has no label", l)
		}
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	for _, ty := range cat.Types() {
		if _, ok := labels[ty]; !ok && ty != "any" {
			t.Errorf("facility type %s has no label", ty)
		}
		for _, c := range cat.CapabilityNames(ty) {
			if _, ok := labels[c]; !ok {
				t.Errorf("capability %s (%s) has no label", c, ty)
			}
		}
	}
	for _, tech := range study.Techniques {
		if l := Label(tech); l != tech && tech != "special_cases" {
			t.Errorf("technique %s reads %q", tech, l)
		}
	}
	if Label("special_cases") != "special cases" || Label("my_input") != "my input" {
		t.Error("Label does not read technique or typed names")
	}
}
