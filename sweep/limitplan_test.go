package sweep

import (
	"context"
	"math"
	"testing"

	"scaleplan/sweep/study"
)

// A combination's limits are compiled once and only the names' forms are
// resolved again at each second-axis value (limitPlan). The windows found
// that way must be those of compiling the limits afresh at every axis
// value, for every combination of every built-in scenario with a second
// axis that is not a medium condition (a condition compiles per value
// anyway) and of a synthetic study with a substitute strategy.
func TestCompiledOnceEqualsCompiledPerAxisValue(t *testing.T) {
	scenarios, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	var studies []*study.Study
	for _, sc := range scenarios {
		s, err := study.LoadScenario(sc.Name)
		if err != nil {
			t.Fatal(err)
		}
		studies = append(studies, s)
	}
	studies = append(studies, study.Synthetic(301, 7, 2, 4))
	checked := 0
	for _, s := range studies {
		p, err := prepare(t, s)
		if err != nil {
			t.Fatal(err)
		}
		if len(p.AxisValues) < 2 || isCondition(p.Settings.Axis) {
			continue
		}
		us := make([]float64, len(p.Grid))
		for i, k := range p.Grid {
			us[i] = math.Log10(k)
		}
		for _, st := range p.Strategies {
			for _, c := range st.Cases {
				if !p.axisApplies(c, nil) && len(c.Facilities) == 0 {
					continue
				}
				for _, m := range candidatesOrNil(c.Media) {
					for _, mat := range candidatesOrNil(c.Materials) {
						for _, f := range facilitiesOrNil(c.Facilities) {
							if !p.axisApplies(c, f) {
								continue
							}
							once := &axisSweep{plan: p, cas: c, medium: m, material: mat, fac: f, axes: p.AxisValues, us: us, lp: &limitPlan{}}
							fresh := &axisSweep{plan: p, cas: c, medium: m, material: mat, fac: f, axes: p.AxisValues, us: us}
							_, w1, _, err1 := once.choose(context.Background(), sampleCache{})
							_, w2, _, err2 := fresh.choose(context.Background(), sampleCache{})
							if (err1 == nil) != (err2 == nil) {
								t.Fatalf("%s %s: errors %v and %v", s.Name, st.Name, err1, err2)
							}
							for i := range w1 {
								if !sameWindow(w1[i], w2[i]) {
									t.Errorf("%s %s (%s, %s): at axis value %v the window is %v compiled once, %v compiled afresh",
										s.Name, st.Name, name(m), f.Name, p.AxisValues[i], w1[i], w2[i])
								}
							}
							checked++
						}
					}
				}
			}
		}
	}
	if checked < 10 {
		t.Errorf("only %d combinations checked", checked)
	}
}

func sameWindow(a, b Window) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Abs(a[i].Lo-b[i].Lo) > 1e-9*b[i].Lo || math.Abs(a[i].Hi-b[i].Hi) > 1e-9*b[i].Hi || a[i].LoLimit != b[i].LoLimit || a[i].HiLimit != b[i].HiLimit {
			return false
		}
	}
	return true
}

// A joint recipe's limit is a closure over the requirements of the axis
// value it was made at: a combination with one is compiled afresh at
// every axis value, one without keeps its compiled limits.
func TestJointRecipeCompiledAfresh(t *testing.T) {
	slurry, err := study.LoadScenario("slurry")
	if err != nil {
		t.Fatal(err)
	}
	// A liquid whose density and viscosity are both required
	// (TestJointRecipeTwoRequirements), and the slurry's, whose viscosity
	// alone is.
	studies := []*study.Study{liquidStudy(t, "1300", "5e-3", "water_glycerol", "20C", "gravity", "density=1"), slurry}
	seen := map[bool]bool{}
	for _, s := range studies {
		p, err := prepare(t, s)
		if err != nil {
			t.Fatal(err)
		}
		for _, st := range p.Strategies {
			for _, c := range st.Cases {
				for _, m := range candidatesOrNil(c.Media) {
					for _, f := range facilitiesOrNil(c.Facilities) {
						x, err := p.newCombo(c, m, nil, f, math.NaN())
						if err != nil {
							t.Fatal(err)
						}
						x.limitPlan = &limitPlan{}
						limits, _, err := x.compiledLimits()
						if err != nil {
							t.Fatal(err)
						}
						joint := false
						for _, l := range limits {
							joint = joint || l.fn != nil
						}
						if x.limitPlan.fresh != joint {
							t.Errorf("%s %s: joint recipe %v, compiled afresh %v", s.Name, name(m), joint, x.limitPlan.fresh)
						}
						seen[joint] = true
					}
				}
			}
		}
	}
	if !seen[true] || !seen[false] {
		t.Errorf("want combinations with and without a joint recipe: %v", seen)
	}
}
