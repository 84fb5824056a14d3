package sweep

import (
	"math"
	"strings"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// lawExp returns the exponent of kL in a quantity's scale law for a case.
func lawExp(t *testing.T, c *PlanCase, q string) string {
	t.Helper()
	l, ok := c.Solution.Law(q)
	if !ok {
		t.Fatalf("no quantity %s", q)
	}
	return l.Exp[0].String()
}

func caseNamed(t *testing.T, sr *StrategyResult, name string) *PlanCase {
	t.Helper()
	for _, c := range sr.Cases {
		if c.Case == name {
			return c
		}
	}
	t.Fatalf("no case %q", name)
	return nil
}

// Each scenario's conclusion is asserted from its results, not from stored
// numbers.

func TestScenarioTine(t *testing.T) {
	res := runStudy(t, scenario(t, "tine"))
	sr := strategy(t, res, "sand and clay cases")
	// Soil-tool similitude (common practice): frictional soil at 1 g gives
	// force ∝ kL³ and speed ∝ kL^1/2; cohesive soil gives force ∝ kL² and
	// the same speed.
	sand, clay := caseNamed(t, sr, "dry sand"), caseNamed(t, sr, "soft clay")
	if e := lawExp(t, sand, "force"); e != "3" {
		t.Errorf("sand case force exponent %s, want 3", e)
	}
	if e := lawExp(t, sand, "velocity"); e != "1/2" {
		t.Errorf("sand case velocity exponent %s, want 1/2", e)
	}
	if e := lawExp(t, clay, "force"); e != "2" {
		t.Errorf("clay case force exponent %s, want 2", e)
	}
	if e := lawExp(t, clay, "velocity"); e != "0" {
		t.Errorf("clay case velocity exponent %s, want 0", e)
	}
	// The joint window is the intersection of the case windows.
	var sandW, clayW Window
	for _, c := range sr.Combos {
		if c.Case == "dry sand" {
			sandW = c.Window
		} else {
			clayW = c.Window
		}
	}
	if len(sr.Joint) != 1 || sr.Joint[0].Window.Empty() || sandW.Empty() || clayW.Empty() {
		t.Fatalf("joint %+v, sand %v, clay %v", sr.Joint, sandW, clayW)
	}
	j := sr.Joint[0].Window[0]
	if !relClose(j.Lo, math.Max(sandW[0].Lo, clayW[0].Lo), 1e-12) || !relClose(j.Hi, math.Min(sandW[0].Hi, clayW[0].Hi), 1e-12) {
		t.Errorf("joint window %v, want the intersection of %v and %v", j, sandW, clayW)
	}
	// Centrifuge: raised gravity makes the clay model similar at g-level
	// N = kL (geotechnical centrifuge scaling, Schofield 1980).
	cf := strategy(t, res, "centrifuge")
	if e := lawExp(t, cf.Cases[0], "gravity"); e != "-1" {
		t.Errorf("centrifuge gravity exponent %s, want -1 (g-level N = kL)", e)
	}
	best := cf.Best
	if best == nil {
		t.Fatal("centrifuge: no window")
	}
	for _, pv := range best.Required {
		if pv.Quantity == "gravity" {
			if n := pv.AtRecommended / StandardGravity; !relClose(n, best.Recommended, 1e-9) {
				t.Errorf("g-level %v at kL %v, want N = kL", n, best.Recommended)
			}
		}
	}
	if best.Window[0].LoLimit != "bucket length" {
		t.Errorf("centrifuge large-model edge %q, want bucket length", best.Window[0].LoLimit)
	}
}

func TestScenarioConductor(t *testing.T) {
	res := runStudy(t, scenario(t, "conductor"))
	sr := strategy(t, res, "spring-mounted section")
	c := sr.Cases[0]
	if len(c.Solution.Free) != 1 || c.Solution.Free[0] != "velocity" {
		t.Fatalf("free choices %v, want velocity", c.Solution.Free)
	}
	b := sr.Best
	if b == nil {
		t.Fatal("no window")
	}
	if rows := b.AxisMarginRows(); len(rows) != len(res.Plan.AxisValues) {
		t.Errorf("axis margins %d rows, want one per axis value (%d)", len(rows), len(res.Plan.AxisValues))
	}
	// Reduced stiffness k/(ρV²L) kept (common practice): the model's
	// stiffness per spring is k_p/(k_ρ kV² kL)/springs.
	var perSpring, massPerLength float64
	for _, m := range b.Measures {
		switch m.Name {
		case "stiffness per spring":
			perSpring = m.AtRecommended
		case "mass per unit length":
			massPerLength = m.AtRecommended
		}
	}
	var rhoModel float64
	for _, m := range res.Plan.Media {
		rhoModel = m.Props["density"].Value
	}
	kr := res.Plan.Proto["density"] / rhoModel
	want := 29.8 / (kr * b.Axis * b.Axis * b.Recommended) / 4
	if !relClose(perSpring, want, 1e-9) {
		t.Errorf("stiffness per spring %v, want %v", perSpring, want)
	}
	if want := 2.1 / (kr * b.Recommended * b.Recommended); !relClose(massPerLength, want, 1e-9) {
		t.Errorf("mass per unit length %v, want %v", massPerLength, want)
	}
}

func TestScenarioMast(t *testing.T) {
	res := runStudy(t, scenario(t, "mast"))
	added := strategy(t, res, "added mass")
	// Gravity and elasticity with the same steel: the density must be kL
	// times the prototype's (textbook similitude of gravity-loaded elastic
	// models, common practice).
	if e := lawExp(t, added.Cases[0], "density"); e != "-1" {
		t.Errorf("density exponent %s, want -1 (model density kL times the prototype's)", e)
	}
	b := added.Best
	if b == nil {
		t.Fatal("added mass: no window")
	}
	steel := res.Plan.Proto["density"]
	if want := steel * (b.Recommended - 1); !relClose(b.AddedDensity, want, 1e-9) {
		t.Errorf("added density %v, want ρ (kL − 1) = %v", b.AddedDensity, want)
	}
	if b.PoissonFlag {
		t.Error("steel on steel flagged for Poisson's ratio")
	}
	soft := strategy(t, res, "softer material").Best
	if soft == nil || !soft.PoissonFlag {
		t.Errorf("polycarbonate model not flagged for Poisson's ratio")
	}
	// The polycarbonate model is a substitute: nothing adds mass, so its
	// own density must be the one the laws require, ρ_m = ρ_p·kL/k_E
	// (k_E = E_steel/E_pc), within the study's 10 %: kL from
	// ρ_pc k_E/(ρ_p (1+tol)) to ρ_pc k_E/(ρ_p (1−tol)), about 1:12–1:15.
	rho := func(entry, q string) float64 {
		e, err := defaultLib(t).Lookup(entry)
		if err != nil {
			t.Fatal(err)
		}
		p, err := e.Property(q, materials.Conditions{})
		if err != nil {
			t.Fatal(err)
		}
		return p.Value
	}
	kE := rho("structural_steel", "modulus") / rho("polycarbonate", "modulus")
	c := rho("polycarbonate", "density") * kE / rho("structural_steel", "density")
	if soft != nil {
		if len(soft.Window) != 1 || !relClose(soft.Window[0].Lo, c/1.1, 1e-9) || !relClose(soft.Window[0].Hi, c/0.9, 1e-9) {
			t.Errorf("softer material window %v, want %v–%v", soft.Window, c/1.1, c/0.9)
		}
	}
	// Relaxing transverse deformation removes the flag.
	s := scenario(t, "mast")
	s.Strategies[1].Relax = "poisson"
	if b := strategy(t, runStudy(t, s), "softer material").Best; b == nil || b.PoissonFlag {
		t.Errorf("flag not removed by relax: poisson")
	}
}

func TestScenarioPontoon(t *testing.T) {
	res := runStudy(t, scenario(t, "pontoon"))
	seg := strategy(t, res, "segmented with backbone")
	// Hydroelastic Froude model with a backbone: E·I ∝ kL^5 (common
	// practice).
	if e := lawExp(t, seg.Cases[0], "flexural_rigidity"); e != "5" {
		t.Errorf("backbone flexural rigidity exponent %s, want 5", e)
	}
	b := seg.Best
	if b == nil {
		t.Fatal("segmented: no window")
	}
	found := false
	for _, pv := range b.Required {
		if pv.Quantity == "flexural_rigidity" {
			found = true
			kr := res.Plan.Proto["density"] / res.Plan.Media[0].Props["density"].Value
			if want := 4.5e10 / (kr * math.Pow(b.Recommended, 5)); !relClose(pv.AtRecommended, want, 1e-9) {
				t.Errorf("backbone EI %v, want %v", pv.AtRecommended, want)
			}
		}
	}
	if !found {
		t.Errorf("required = %+v, want flexural_rigidity", b.Required)
	}
	poly := strategy(t, res, "one-piece polymer")
	if e := lawExp(t, poly.Cases[0], "modulus"); e != "1" {
		t.Errorf("one-piece modulus exponent %s, want 1", e)
	}
	// The polymer's modulus must be E_p/(k_ρ·kL) (Froude with bending
	// stiffness from the material, k_ρ = ρ_seawater/ρ_basin water): HDPE
	// meets it within the study's 15 % only for kL from
	// E_p (1−tol)/(k_ρ E_hdpe) to E_p (1+tol)/(k_ρ E_hdpe), around 1:32.
	prop := func(entry, conds, q string) float64 {
		e, err := defaultLib(t).Lookup(entry)
		if err != nil {
			t.Fatal(err)
		}
		c, _ := materials.ParseConditions(conds)
		p, err := e.Property(q, c)
		if err != nil {
			t.Fatal(err)
		}
		return p.Value
	}
	kRho := prop("seawater", "10C,35g/kg", "density") / prop("water", "18C", "density")
	center := prop("concrete", "", "modulus") / (kRho * prop("hdpe", "", "modulus"))
	pb := poly.Best
	if pb == nil || len(pb.Window) != 1 {
		t.Fatalf("one-piece polymer window %+v, want one interval around 1:%.3g", pb, center)
	}
	if !relClose(pb.Window[0].Lo, center*0.85, 1e-9) || !relClose(pb.Window[0].Hi, center*1.15, 1e-9) {
		t.Errorf("one-piece polymer window %v, want %v–%v", pb.Window, center*0.85, center*1.15)
	}
	// The wavemaker and the capillary limits are applied.
	names := map[string]bool{}
	for _, l := range b.Limits {
		names[l.Name] = true
	}
	for _, want := range []string{"wave period min", "wave period max", "wave height max", "capillary wave period", "capillary water depth"} {
		if !names[want] {
			t.Errorf("limit %q not applied", want)
		}
	}
}

func TestScenarioIndex(t *testing.T) {
	list, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	if len(list) != 9 {
		t.Errorf("%d scenarios, want 9", len(list))
	}
	for _, s := range list {
		if strings.TrimSpace(s.Description) == "" {
			t.Errorf("scenario %s has no description", s.Name)
		}
		res := runStudy(t, scenario(t, s.Name))
		feasible := false
		for _, sr := range res.Strategies {
			feasible = feasible || sr.Best != nil
		}
		if !feasible {
			t.Errorf("scenario %s: no strategy is feasible", s.Name)
		}
	}
}

func defaultLib(t *testing.T) *materials.Library {
	t.Helper()
	lib, err := materials.Default()
	if err != nil {
		t.Fatal(err)
	}
	return lib
}
