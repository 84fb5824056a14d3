package materials

import (
	"math"
	"strings"
	"testing"
)

// chengByHand is Cheng's (2008, Ind. Eng. Chem. Res. 47:3285) viscosity
// of a water–glycerol mixture, written out here from the paper
// independently of glycerol.go: eqs. (21), (22) for the pure viscosities,
// (6) and (11) with a and b for the mixing exponent. Its density is Volk &
// Kähler's (2018, Exp. Fluids 59:75) model, also written out here: Cheng's
// own volume-additive density is about 1 % low near w = 0.6, which would
// move the kinematic viscosity by as much (TestGlycerolDensity).
func chengByHand(tC, cm float64) (mu, rho float64) {
	muW := 1.790 * math.Exp((-1230-tC)*tC/(36100+360*tC)) // mPa·s
	muG := 12100 * math.Exp((-1233+tC)*tC/(9900+70*tC))   // mPa·s
	a := 0.705 - 0.0017*tC
	b := (4.9 + 0.036*tC) * math.Pow(a, 2.5)
	alpha := 1 - cm + a*b*cm*(1-cm)/(a*cm+b*(1-cm))
	mu = math.Pow(muW, alpha) * math.Pow(muG, 1-alpha) * 1e-3 // Pa·s
	rhoG := 1273.3 - 0.6121*tC
	rhoW := 1000 * (1 - math.Pow(math.Abs((tC-3.98)/615), 1.71))
	cv := (cm / rhoG) / (cm/rhoG + (1-cm)/rhoW) // volume fraction of glycerol
	kappa := 1 + (1.78e-6*tC*tC-1.82e-4*tC+1.41e-2)*math.Pow(math.Sin(math.Pow(cm, 1.31)*math.Pi), 0.81)
	rho = kappa * (rhoG*cv + rhoW*(1-cv))
	return mu, rho
}

func TestRecipeWaterGlycerolAgainstCheng(t *testing.T) {
	// Required kinematic viscosity 1e-5 m²/s (10 cSt) at a study
	// temperature of 20 °C. By hand: scan Cheng's ν(w) = μ/ρ over w in
	// steps of 1e-5 and take the w nearest the requirement.
	const nuReq, tC = 1e-5, 20.0
	wHand, best := 0.0, math.Inf(1)
	for i := 0; i <= 100000; i++ {
		w := float64(i) / 100000
		mu, rho := chengByHand(tC, w)
		if d := math.Abs(mu/rho - nuReq); d < best {
			wHand, best = w, d
		}
	}
	l := defaultLibrary(t)
	e, err := l.Lookup("water_glycerol")
	if err != nil {
		t.Fatal(err)
	}
	r, err := e.Recipe(RecipeSpec{
		Target:    Target{Quantity: "kinematic_viscosity", Value: nuReq},
		Tolerance: 0.01,
		At:        Conditions{}.With(Temperature, 273.15+tC),
	})
	if err != nil {
		t.Fatal(err)
	}
	if !r.Met {
		t.Fatalf("no recipe: %s", r)
	}
	w, ok := r.Conditions.Get(MassFraction)
	T, _ := r.Conditions.Get(Temperature)
	if !ok || !near(T, 293.15, 1e-9) {
		t.Fatalf("recipe %s: want the study's 20 °C kept and a fraction named", r)
	}
	if len(r.Tuned) != 1 || r.Tuned[0] != MassFraction {
		t.Errorf("tuned %v, want only the mass fraction", r.Tuned)
	}
	// The fraction agrees with Cheng solved by hand to 1 % in viscosity.
	muAt, _ := chengByHand(tC, w)
	muHand, _ := chengByHand(tC, wHand)
	if !nearRel(muAt, muHand, 0.01) {
		t.Errorf("recipe w = %.5f gives Cheng μ %.5g; by hand w = %.5f gives %.5g (more than 1 %% apart)", w, muAt, wHand, muHand)
	}
	if math.Abs(r.Target.Deviation) > 1e-6 || r.Reached() > 1e-6 {
		t.Errorf("recipe should sit on the requirement: deviation %g", r.Target.Deviation)
	}
	if !strings.Contains(r.String(), "water_glycerol: 20 °C, w = 0.") {
		t.Errorf("short form %q", r.String())
	}
}

func TestRecipeTargetFromOwnDensity(t *testing.T) {
	// A requirement that depends on the candidate: the dynamic viscosity
	// must be ρ_candidate × 1e-5 m²/s. It is the same as ν = 1e-5, so both
	// specs must name the same fraction.
	l := defaultLibrary(t)
	e, _ := l.Lookup("water_glycerol")
	at := Conditions{}.With(Temperature, 293.15)
	direct, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 1e-5}, At: at})
	if err != nil {
		t.Fatal(err)
	}
	viaRho, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "viscosity",
		Of: func(p map[string]float64) float64 { return p["density"] * 1e-5 }}, At: at})
	if err != nil {
		t.Fatal(err)
	}
	w1, _ := direct.Conditions.Get(MassFraction)
	w2, _ := viaRho.Conditions.Get(MassFraction)
	if !direct.Met || !viaRho.Met || !near(w1, w2, 1e-6) {
		t.Errorf("ν target w = %g (%v), μ = ρ·ν target w = %g (%v)", w1, direct.Met, w2, viaRho.Met)
	}
}

func TestRecipeBrineDensityAgainstCRC(t *testing.T) {
	// A stratified-flow recipe: brine of 1100 kg/m³ at 20 °C. By linear
	// interpolation in the CRC Handbook's NaCl table at 20 °C (10 %:
	// 1.0707, 15 %: 1.1085 g/cm³; values from memory) the salt mass
	// fraction is 13.88 %; interpolation error is below 0.3 points.
	l := defaultLibrary(t)
	e, _ := l.Lookup("brine")
	r, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "density", Value: 1100}, Tolerance: 0.001,
		At: Conditions{}.With(Temperature, 293.15)})
	if err != nil {
		t.Fatal(err)
	}
	want := 0.10 + 0.05*(1100-1070.7)/(1108.5-1070.7)
	if S, _ := r.Conditions.Get(Salinity); !r.Met || !near(S, want, 0.003) {
		t.Errorf("brine recipe %s, want S ≈ %.4f", r, want)
	}
}

func TestRecipeAirPressure(t *testing.T) {
	// A pressurised tunnel: air of ν = 5e-6 m²/s at 20 °C. By hand, ideal
	// gas and Sutherland's law with the ISO 2533 constants:
	// p = μ(T) R T/ν.
	const T, nu = 293.15, 5e-6
	mu := 1.458e-6 * math.Pow(T, 1.5) / (T + 110.4)
	pHand := mu * 287.05287 * T / nu
	l := defaultLibrary(t)
	e, _ := l.Lookup("air")
	r, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: nu}, Tolerance: 1e-4,
		At: Conditions{}.With(Temperature, T)})
	if err != nil {
		t.Fatal(err)
	}
	if p, _ := r.Conditions.Get(Pressure); !r.Met || !nearRel(p, pHand, 1e-4) {
		t.Errorf("air recipe %s, want p = %.6g Pa", r, pHand)
	}
}

func TestRecipeMovesTemperatureOnlyWhenNeeded(t *testing.T) {
	l := defaultLibrary(t)
	e, _ := l.Lookup("water_glycerol")
	at := Conditions{}.With(Temperature, 293.15)
	// 2e-3 m²/s is beyond pure glycerol at 20 °C (about 1.12e-3): the
	// recipe cools the mixture.
	r, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 2e-3}, At: at})
	if err != nil {
		t.Fatal(err)
	}
	T, _ := r.Conditions.Get(Temperature)
	if !r.Met || !(T < 293.15) || !containsCondition(r.Tuned, Temperature) {
		t.Errorf("2e-3 m²/s: %s (tuned %v), want a recipe below 20 °C", r, r.Tuned)
	}
	// Held at 20 °C it cannot: none, nearest pure glycerol.
	r, err = e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 2e-3}, At: at, Hold: []Condition{Temperature}})
	if err != nil {
		t.Fatal(err)
	}
	w, _ := r.Conditions.Get(MassFraction)
	if r.Met || !near(w, 1, 1e-3) || !strings.HasPrefix(r.String(), "none: nearest water_glycerol") {
		t.Errorf("held at 20 °C: %s, want none, nearest at w = 1", r)
	}
	// A user range that excludes the cold end also leaves none.
	r, _ = e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 2e-3}, At: at,
		Limits: map[Condition]Range{Temperature: {288.15, 303.15}}})
	if T, _ := r.Conditions.Get(Temperature); r.Met || !near(T, 288.15, 0.05) {
		t.Errorf("limited to 15–30 °C: %s, want none, nearest at 15 °C", r)
	}
}

func TestRecipeDensityAndViscosityTogether(t *testing.T) {
	// ν = 1e-5 m²/s with density 1200 kg/m³ ± 0.5 %: at 20 °C the
	// viscosity needs w ≈ 0.61 (about 1163 kg/m³), so the recipe must move
	// the temperature and the fraction together.
	l := defaultLibrary(t)
	e, _ := l.Lookup("water_glycerol")
	r, err := e.Recipe(RecipeSpec{
		Target:    Target{Quantity: "kinematic_viscosity", Value: 1e-5},
		Also:      []Target{{Quantity: "density", Value: 1200, Tolerance: 0.005}},
		Tolerance: 0.01,
		At:        Conditions{}.With(Temperature, 293.15),
	})
	if err != nil {
		t.Fatal(err)
	}
	if !r.Met {
		t.Fatalf("no recipe: %s", r)
	}
	// Check the recipe independently of the solver: the library's values at
	// its conditions.
	v, err := e.ValuesAt(r.Conditions)
	if err != nil {
		t.Fatal(err)
	}
	if !nearRel(v["kinematic_viscosity"], 1e-5, 0.01) || !nearRel(v["density"], 1200, 0.005) {
		t.Errorf("recipe %s gives ν %g, ρ %g", r, v["kinematic_viscosity"], v["density"])
	}
	if !containsCondition(r.Tuned, Temperature) || !containsCondition(r.Tuned, MassFraction) {
		t.Errorf("tuned %v, want temperature and mass fraction", r.Tuned)
	}
}

func TestRecipeFixedEntries(t *testing.T) {
	l := defaultLibrary(t)
	ice, _ := l.Lookup("model_ice")
	// Model ice is tuned to 40 kPa within its stated 10–100 kPa.
	r, err := ice.Recipe(RecipeSpec{Target: Target{Quantity: "strength", Value: 40e3}})
	if err != nil || !r.Met {
		t.Errorf("model ice 40 kPa: %v %v", r, err)
	}
	steel, _ := l.Lookup("structural_steel")
	r, _ = steel.Recipe(RecipeSpec{Target: Target{Quantity: "density", Value: 7000}, Tolerance: 0.02})
	if r.Met || !near(r.Target.Value, 7850, 1e-9) {
		t.Errorf("steel at 7000 kg/m³: %v, want none at its 7850", r)
	}
	// Errors: a quantity the entry lacks, a bad value, a held condition
	// outside the range.
	water, _ := l.Lookup("water")
	for _, spec := range []RecipeSpec{
		{Target: Target{Quantity: "modulus", Value: 1}},
		{Target: Target{Quantity: "density", Value: -1}},
		{Target: Target{Quantity: "density", Value: 1000}, At: Conditions{}.With(Temperature, 373.15), Hold: []Condition{Temperature}},
		{Target: Target{Quantity: "density", Value: 1000}, Limits: map[Condition]Range{Temperature: {400, 500}}},
	} {
		if _, err := water.Recipe(spec); err == nil {
			t.Errorf("spec %+v: no error", spec)
		}
	}
}

func TestFindRecipesAndLeastViscousLiquid(t *testing.T) {
	l := defaultLibrary(t)
	at := Conditions{}.With(Temperature, 288.15)
	// A tug's Reynolds-matched model fluid needs about 3e-8 m²/s: no
	// liquid of the library can be brought there.
	s := l.FindRecipes(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 3e-8}, Tolerance: 0.05, At: at}, Liquids)
	if len(s.Met) != 0 || len(s.Nearest) == 0 {
		t.Fatalf("3e-8 m²/s: met %v, nearest %d", s.Met, len(s.Nearest))
	}
	least, err := l.Extreme("kinematic_viscosity", true, nil, Liquids)
	if err != nil {
		t.Fatal(err)
	}
	// The least viscous liquid it can make is hot water (pure, or a
	// mixture at zero fraction): water at 100 °C has ν = 0.294e-6 m²/s
	// (IAPWS R12-08 viscosity 0.2818 mPa·s at 958.4 kg/m³; handbook values
	// from memory), within 3 % (the correlations' pure-water ends).
	if !nearRel(least.Target.Value, 0.294e-6, 0.03) {
		t.Errorf("least viscous liquid %s: %g m²/s", least.Entry, least.Target.Value)
	}
	e, _ := l.Lookup(least.Entry)
	v, err := e.ValuesAt(least.Conditions)
	if err != nil || !Liquids(e) || !nearRel(v["kinematic_viscosity"], least.Target.Value, 1e-12) {
		t.Errorf("least viscous: %s at %s (%v)", least.Entry, least.Conditions, err)
	}
	// The search says why: what is needed and the least viscous liquid.
	if s.Extreme == nil || s.Extreme.Entry != least.Entry || !strings.HasPrefix(s.Reason, "kinematic_viscosity 3e-08 m^2/s: no entry searched") ||
		!strings.Contains(s.Reason, "the lowest kinematic_viscosity they can make is 2.9") {
		t.Errorf("reason %q", s.Reason)
	}
	// The nearest recipe to 3e-8 is no closer than the least viscous liquid.
	if s.Nearest[0].Target.Value < least.Target.Value*(1-1e-6) {
		t.Errorf("nearest %s is below the library's least viscous liquid %g", s.Nearest[0], least.Target.Value)
	}
	// At a tank held between 10 and 30 °C, the least viscous liquid is
	// water at 30 °C or a mixture near it: 0.80e-6 m²/s (IAPWS, from
	// memory), within 3 %.
	least30, err := l.Extreme("kinematic_viscosity", true, map[Condition]Range{Temperature: {283.15, 303.15}}, Liquids)
	if err != nil || !nearRel(least30.Target.Value, 0.801e-6, 0.03) {
		t.Errorf("least viscous liquid at 10–30 °C: %v (%v)", least30, err)
	}
	// Near-equal extremes name the liquid moved on fewer conditions: pure
	// water at 30 °C, not brine or a water–glycerol mixture brought to zero
	// fraction (above 40 °C, the end of the library's water entry, only
	// the solutions reach hot water).
	if least30.Entry != "water" {
		t.Errorf("least viscous liquid at 10–30 °C named %s, want water (pure)", least30.Entry)
	}
	// A requirement inside the water–glycerol range finds recipes, the
	// mixture among them, the study's 15 °C kept.
	s = l.FindRecipes(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 1e-5}, At: at}, Liquids)
	var found bool
	for _, r := range s.Met {
		if r.Entry == "water_glycerol" {
			T, _ := r.Conditions.Get(Temperature)
			found = near(T, 288.15, 1e-9)
		}
		if !r.Met || r.Reached() > 0.01 {
			t.Errorf("listed as met: %s", r)
		}
	}
	if !found {
		t.Errorf("1e-5 m²/s at 15 °C: water_glycerol missing from %v", s.Met)
	}
	if _, err := l.Extreme("no_such_quantity", true, nil, nil); err == nil {
		t.Errorf("Extreme of an unknown quantity: no error")
	}
}

func containsCondition(list []Condition, k Condition) bool {
	for _, x := range list {
		if x == k {
			return true
		}
	}
	return false
}

func TestEvaluateServesNeighbouringRequirement(t *testing.T) {
	// A recipe for 1e-5 m²/s also serves 1.005e-5 within 1 %, not 1.05e-5.
	l := defaultLibrary(t)
	e, _ := l.Lookup("water_glycerol")
	at := Conditions{}.With(Temperature, 293.15)
	r, err := e.Recipe(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 1e-5}, At: at})
	if err != nil || !r.Met {
		t.Fatalf("%v %v", r, err)
	}
	for _, c := range []struct {
		nu    float64
		serve bool
	}{{1.005e-5, true}, {0.995e-5, true}, {1.05e-5, false}} {
		got, err := e.Evaluate(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: c.nu}}, r.Conditions)
		if err != nil {
			t.Fatal(err)
		}
		if got.Met != c.serve || !nearRel(got.Target.Deviation, (1e-5-c.nu)/c.nu, 1e-6) {
			t.Errorf("recipe for 1e-5 at %g: met %v, deviation %g", c.nu, got.Met, got.Target.Deviation)
		}
	}
	if _, err := e.Evaluate(RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 1e-5}}, at.With(Temperature, 400)); err == nil {
		t.Errorf("conditions outside the valid range should be refused")
	}
}

func BenchmarkRecipeWaterGlycerol(b *testing.B) {
	l, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	e, _ := l.Lookup("water_glycerol")
	spec := RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 1e-5}, At: Conditions{}.With(Temperature, 293.15)}
	for b.Loop() {
		if _, err := e.Recipe(spec); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFindRecipesUnreachable(b *testing.B) {
	l, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	spec := RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 3e-8}, Tolerance: 0.05, At: Conditions{}.With(Temperature, 288.15)}
	for b.Loop() {
		l.FindRecipes(spec, Liquids)
	}
}
