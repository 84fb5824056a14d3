package sweep

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// prepare checks a study against a fresh library and the catalogue.
func prepare(t *testing.T, s *study.Study) (*Plan, error) {
	t.Helper()
	lib, err := materials.Default()
	if err != nil {
		t.Fatal(err)
	}
	cat, err := NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	return Prepare(s, lib, cat)
}

// runStudy prepares and runs a study with a fresh library.
func runStudy(t *testing.T, s *study.Study) *Result {
	t.Helper()
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatalf("Prepare: %v", err)
	}
	res, err := plan.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func scenario(t *testing.T, name string) *study.Study {
	t.Helper()
	s, err := study.LoadScenario(name)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func strategy(t *testing.T, res *Result, name string) *StrategyResult {
	t.Helper()
	for _, sr := range res.Strategies {
		if sr.Name == name {
			return sr
		}
	}
	t.Fatalf("no strategy %q", name)
	return nil
}

func comboIn(t *testing.T, sr *StrategyResult, facility string) *ComboResult {
	t.Helper()
	for _, c := range sr.Combos {
		if c.Facility == facility {
			return c
		}
	}
	t.Fatalf("no combination in %q", facility)
	return nil
}

func relClose(a, b, tol float64) bool { return math.Abs(a-b) <= tol*math.Abs(b) }

// setCapability changes one facility capability of a study.
func setCapability(s *study.Study, facility, capability, value string) {
	for i, r := range s.Facilities {
		if r.Facility == facility && r.Capability == capability {
			s.Facilities[i].Value = value
		}
	}
}

// TestTugWindowEdgesByHand computes the Froude strategy's window edges by
// hand from the limits and the Froude scale laws (velocity kL^1/2, lengths
// kL) and compares them with the sweep's exact edges.
func TestTugWindowEdgesByHand(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	c := comboIn(t, strategy(t, res, "Froude scaling"), "Deepwater tank")
	if len(c.Window) != 1 {
		t.Fatalf("window %v, want one interval", c.Window)
	}
	iv := c.Window[0]
	// Blockage (common practice, 1 %): beam·draft/kL² ≤ 0.01·width·depth.
	wantLo := math.Sqrt(11 * 4.8 / (0.01 * 9 * 4.5))
	// Minimum model Reynolds number 2e6: V_p L_p/kL^3/2 / ν_model ≥ 2e6,
	// with ν of the library's fresh water at 18 °C.
	lib, _ := materials.Default()
	water, err := lib.Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	cond, _ := materials.ParseConditions("18C")
	nu, err := water.Property("kinematic_viscosity", cond)
	if err != nil {
		t.Fatal(err)
	}
	vp := 12 * 1852.0 / 3600 // 12 kn (NIST SP 811: 1 kn = 1852/3600 m/s)
	wantHi := math.Pow(vp*28/(nu.Value*2e6), 2.0/3)
	if !relClose(iv.Lo, wantLo, 1e-9) || iv.LoLimit != "blockage" {
		t.Errorf("large-model edge %v set by %q, want %v set by blockage", iv.Lo, iv.LoLimit, wantLo)
	}
	if !relClose(iv.Hi, wantHi, 1e-9) || iv.HiLimit != "model Reynolds number" {
		t.Errorf("small-model edge %v set by %q, want %v set by model Reynolds number", iv.Hi, iv.HiLimit, wantHi)
	}
	if c.Friction == nil || !(c.Friction.Delta > 0) {
		t.Errorf("ITTC-1957 correction missing or not positive: %+v", c.Friction)
	}
	// ITTC-1957 line at Re = 1e7: 0.075/(7-2)² = 0.003 (ITTC 1957 formula).
	if got := ITTC1957(1e7); !relClose(got, 0.003, 1e-12) {
		t.Errorf("ITTC1957(1e7) = %v, want 0.003", got)
	}
}

// TestTugCarriageEdgeFollowsFroude slows the carriage until it limits the
// largest model, then slows it again: the edge must move as the Froude law
// predicts, kL = (V_p / V_carriage)², to 0.1 %.
func TestTugCarriageEdgeFollowsFroude(t *testing.T) {
	edge := func(speed string) Interval {
		s := scenario(t, "tug")
		setCapability(s, "Deepwater tank", "carriage_speed_max", speed)
		c := comboIn(t, strategy(t, runStudy(t, s), "Froude scaling"), "Deepwater tank")
		if c.Window.Empty() {
			t.Fatalf("carriage %s m/s: empty window", speed)
		}
		return c.Window[0]
	}
	a, b := edge("1.7"), edge("1.6")
	for _, iv := range []Interval{a, b} {
		if iv.LoLimit != "carriage speed max" {
			t.Fatalf("large-model edge set by %q, want carriage speed max", iv.LoLimit)
		}
	}
	if got, want := b.Lo/a.Lo, math.Pow(1.7/1.6, 2); !relClose(got, want, 1e-3) {
		t.Errorf("edge ratio %v, want (1.7/1.6)² = %v", got, want)
	}
	vp := 12 * 1852.0 / 3600
	if want := math.Pow(vp/1.6, 2); !relClose(b.Lo, want, 1e-3) {
		t.Errorf("edge at 1.6 m/s: kL %v, want %v", b.Lo, want)
	}
}

func TestTugCompleteAndSubstitute(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	if sr := strategy(t, res, "complete similarity"); sr.Best != nil {
		t.Errorf("complete similarity in water has a window: %v", sr.Best.Window)
	} else if f := sr.Combos[0].Failing; !strings.Contains(f, "Reynolds number holds only at") {
		t.Errorf("failing = %q, want the Reynolds condition", f)
	}
	// Froude + Reynolds: ν_m = ν_p / kL^3/2 (textbook similitude). No
	// liquid comes near that, so the substitute has no window, and the
	// reason names the need at the nearest scale the other limits allow
	// (the blockage edge, common practice 1 %: kL = √(B·T / (0.01·W·D))),
	// tank water's own value and the least viscous liquid of the library.
	sr := strategy(t, res, "substitute fluid")
	if sr.Best != nil {
		t.Fatalf("substitute fluid has a window %v with %s; no liquid meets the viscosity", sr.Best.Window, sr.Best.Medium)
	}
	c := comboIn(t, sr, "Deepwater tank")
	kL := math.Sqrt(11 * 4.8 / (0.01 * 9 * 4.5))
	nuP := res.Plan.Proto["kinematic_viscosity"]
	lib, _ := materials.Default()
	water, _ := lib.Lookup("water")
	at18, _ := materials.ParseConditions("18C")
	nuW, err := water.Property("kinematic_viscosity", at18)
	if err != nil {
		t.Fatal(err)
	}
	least, leastNu := "", math.Inf(1)
	for _, e := range lib.Entries() {
		if e.Kind != materials.Fluid {
			continue
		}
		rho, err1 := e.Property("density", materials.Conditions{})
		nu, err2 := e.Property("kinematic_viscosity", materials.Conditions{})
		if err1 != nil || err2 != nil || rho.Value < 100 { // a gas
			continue
		}
		if nu.Value < leastNu {
			least, leastNu = e.Name, nu.Value
		}
	}
	for _, want := range []string{
		fmt.Sprintf("needs kinematic viscosity %.3g m^2/s at 1:11.4", nuP/math.Pow(kL, 1.5)),
		fmt.Sprintf("tank water has %.3g m^2/s", nuW.Value),
		fmt.Sprintf("the closest liquid in the library at its default conditions, %s, has %.3g m^2/s", least, leastNu),
	} {
		if !strings.Contains(c.Failing, want) {
			t.Errorf("failing = %q, want it to say %q", c.Failing, want)
		}
	}
	if !c.Window.Empty() {
		t.Errorf("window %v, want none", c.Window)
	}
}

func TestPierConclusions(t *testing.T) {
	res := runStudy(t, scenario(t, "pier"))
	geo := strategy(t, res, "geometric")
	if geo.Best != nil {
		t.Errorf("geometric similarity has a window %v; only kL = 1 works", geo.Best.Window)
	}
	if f := geo.Combos[0].Failing; !strings.Contains(f, "holds only at 1:1,") {
		t.Errorf("geometric failing = %q, want only 1:1", f)
	}
	dist := strategy(t, res, "distorted thickness")
	law, _ := dist.Cases[0].Solution.Law("thickness")
	if law.Exp[0].String() != "3/2" {
		t.Errorf("distorted thickness exponent of kL = %s, want 3/2", law.Exp[0])
	}
	tuned := strategy(t, res, "tuned model ice").Best
	if tuned == nil {
		t.Fatal("tuned model ice: no window")
	}
	iv := tuned.Window[0]
	if iv.LoLimit != "ice strength max" || iv.HiLimit != "ice strength min" {
		t.Errorf("tuned window edges set by %q and %q, want the tank's ice strength range", iv.LoLimit, iv.HiLimit)
	}
	// Froude + strength number: σ_m = σ_p / kL, so the tank's range 15–80
	// kPa cuts the window at kL = σ_p/80 kPa and σ_p/15 kPa.
	sp := res.Plan.Proto["strength"]
	if !relClose(iv.Lo, sp/80e3, 1e-9) || !relClose(iv.Hi, sp/15e3, 1e-9) {
		t.Errorf("window %v–%v, want %v–%v", iv.Lo, iv.Hi, sp/80e3, sp/15e3)
	}
	var strength *PropertyValue
	for i := range tuned.Required {
		if tuned.Required[i].Quantity == "strength" {
			strength = &tuned.Required[i]
		}
	}
	if strength == nil || !strength.Tuned || !relClose(strength.AtLo, 80e3, 1e-9) || !relClose(strength.AtHi, 15e3, 1e-9) {
		t.Errorf("required strength %+v, want tuned 80 kPa to 15 kPa across the window", strength)
	}
}
