package sweep

import (
	"slices"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

// TestUncertainCapabilityOfAFacilityWithAColon: an uncertain capability
// of a facility whose name holds a colon ("Polar:basin") is applied like
// any other (it was once left out silently: the input's key was a string
// joined with colons and split again). The pier scenario is run with its
// ice tank renamed: its robust results must equal those under the
// original name, and must differ from a run without the uncertain
// capability (so the capability really is part of them).
func TestUncertainCapabilityOfAFacilityWithAColon(t *testing.T) {
	rename := func(s *study.Study, to string) *study.Study {
		for i := range s.Facilities {
			if s.Facilities[i].Facility == "Polar basin" {
				s.Facilities[i].Facility = to
			}
		}
		for i := range s.Uncertain {
			if s.Uncertain[i].Of == "Polar basin" {
				s.Uncertain[i].Of = to
			}
		}
		return s
	}
	robust := func(s *study.Study) *Robust {
		t.Helper()
		b := strategy(t, runStudy(t, s), "tuned model ice").Best
		if b == nil || b.Robust == nil {
			t.Fatal("no robust result for the tuned model ice")
		}
		return b.Robust
	}
	plain := robust(scenario(t, "pier"))
	colon := robust(rename(scenario(t, "pier"), "Polar:basin"))
	without := rename(scenario(t, "pier"), "Polar:basin")
	without.Uncertain = slices.DeleteFunc(without.Uncertain, func(u study.UncertainRow) bool { return u.Of == "Polar:basin" })
	if len(without.Uncertain) != 2 {
		t.Fatalf("%d uncertain inputs left, want the two that are not the tank's", len(without.Uncertain))
	}
	none := robust(without)

	if !slices.Equal(plain.Probability, colon.Probability) {
		t.Error("renaming the facility Polar:basin changes the probabilities of feasibility")
	}
	var labels []string
	for _, g := range colon.Sensitivity {
		labels = append(labels, g.Input)
	}
	if !slices.Contains(labels, "ice_strength_max of Polar:basin") {
		t.Errorf("the ranked inputs %q lack ice_strength_max of Polar:basin", strings.Join(labels, "; "))
	}
	if slices.Equal(colon.Probability, none.Probability) {
		t.Error("the uncertain ice_strength_max of Polar:basin changes nothing: it is not applied")
	}
}
