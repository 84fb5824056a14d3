package sweep

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"scaleplan/sweep/study"
)

// closedFormStudy has one products-of-powers limit and one log-normal
// input, so the probability of feasibility has a closed form.
func closedFormStudy(samples string) *study.Study {
	s := &study.Study{Name: "closed-form", Settings: map[string]study.Setting{}}
	for i, kv := range [][2]string{{"scale_from", "1"}, {"scale_to", "100"}, {"points", "60"}, {"samples", samples}, {"seed", "7"},
		{"prototype_medium", "water"}} {
		s.Settings[kv[0]] = study.Setting{Name: kv[0], Value: kv[1], Cell: study.Cell{Sheet: "Study", Row: i + 2, Col: 2}}
	}
	s.Prototype = []study.Item{{Name: "hull_length", Value: "20", Unit: "m", ScalesAs: "length", Row: 2},
		{Name: "design_speed", Value: "5", Unit: "m/s", ScalesAs: "velocity", Row: 3}}
	s.Media = []study.Candidate{{Name: "water", Entry: "water", Row: 2}}
	s.Strategies = []study.StrategyRow{{Strategy: "Froude", Technique: "dominant", Retain: "inertia, gravity", Given: "density, gravity", Row: 2}}
	s.Limits = []study.LimitRow{{AppliesTo: "all", Limit: "speed cap", Expression: "design_speed <= 1 m/s", Row: 2}}
	s.Uncertain = []study.UncertainRow{{Input: "design_speed", Distribution: "lognormal", Spread: "20%", Row: 2}}
	return s
}

// TestRobustClosedForm: with margin m(kL) = log10(1 m/s / V_model) and a
// log-normal factor on the speed (median 1, CoV 20 %), the probability of
// feasibility is Φ(m / σ), σ = √ln(1 + 0.2²) / ln 10 (log-normal
// definition); the sampled probability must agree within its error.
func TestRobustClosedForm(t *testing.T) {
	res := runStudy(t, closedFormStudy("20000"))
	c := res.Strategies[0].Combos[0]
	if c.Robust == nil {
		t.Fatal("no robust result")
	}
	sigma := math.Sqrt(math.Log1p(0.04)) / math.Ln10
	std := distuv.Normal{Mu: 0, Sigma: 1}
	checked := 0
	for i, kL := range res.Plan.Grid {
		m := math.Log10(1 / (5 / math.Sqrt(kL)))
		want := std.CDF(m / sigma)
		got := c.Robust.Probability[i]
		se := math.Sqrt(want*(1-want)/20000) + 1e-12
		if math.Abs(got-want) > 4*se+1e-9 {
			t.Errorf("kL %.3g: P = %.4f, closed form %.4f (4 SE = %.4f)", kL, got, want, 4*se)
		}
		if want > 0.05 && want < 0.95 {
			checked++
		}
	}
	if checked < 3 {
		t.Errorf("only %d grid points in the transition; the test would not bite", checked)
	}
	// The robust window starts where Φ(m/σ) = 0.95, above the nominal edge.
	nominal := c.Window[0].Lo
	robust := c.Robust.Window[0].Lo
	wantRobust := math.Pow(5*math.Pow(10, 1.6449*sigma), 2) // m = 1.6449 σ
	if !(robust > nominal) || math.Abs(math.Log10(robust/wantRobust)) > 0.02 {
		t.Errorf("robust edge %v, nominal %v, closed form %v", robust, nominal, wantRobust)
	}
	if c.Robust.MostFailing[0] != "speed cap" {
		t.Errorf("most failing limit at the large-model end %q, want speed cap", c.Robust.MostFailing[0])
	}
}

func TestRobustDeterministic(t *testing.T) {
	a := runStudy(t, closedFormStudy("3000")).Strategies[0].Combos[0].Robust.Probability
	b := runStudy(t, closedFormStudy("3000")).Strategies[0].Combos[0].Robust.Probability
	for i := range a {
		if a[i] != b[i] {
			t.Fatalf("same seed, different probabilities at %d: %v %v", i, a[i], b[i])
		}
	}
}

// TestPierRobustWindow: with a coefficient of variation on the model
// ice's strength, the robust window of the tuned-ice strategy is narrower
// than the nominal one, and the ice strength is the input that matters
// most.
func TestPierRobustWindow(t *testing.T) {
	res := runStudy(t, scenario(t, "pier"))
	b := strategy(t, res, "tuned model ice").Best
	if b == nil || b.Robust == nil {
		t.Fatal("no robust result for the tuned model ice")
	}
	if b.Robust.Window.Empty() || width(b.Robust.Window) >= width(b.Window) {
		t.Errorf("robust window %v not narrower than nominal %v", b.Robust.Window, b.Window)
	}
	if len(b.Robust.Sensitivity) == 0 || b.Robust.Sensitivity[0].Input != "strength of model ice" {
		t.Errorf("sensitivity ranking %+v, want the model ice strength first", b.Robust.Sensitivity)
	}
}
