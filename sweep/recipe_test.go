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

// nuGlycerolByHand is the kinematic viscosity (m²/s) of a water–glycerol
// mixture of glycerol mass fraction cm at tC °C, written out from the
// published formulas: viscosity from Cheng 2008 (Ind. Eng. Chem. Res.
// 47:3285, eqs. for μw, μg, a, b and α), density from Volk & Kähler 2018
// (Exp. Fluids 59:75: ρw, ρg and the contraction κ).
func nuGlycerolByHand(tC, cm float64) float64 {
	muW := 1.790 * math.Exp((-1230-tC)*tC/(36100+360*tC)) // mPa·s
	muG := 12100 * math.Exp((-1233+tC)*tC/(9900+70*tC))   // mPa·s
	a := 0.705 - 0.0017*tC
	b := (4.9 + 0.036*tC) * math.Pow(a, 2.5)
	alpha := 1 - cm + a*b*cm*(1-cm)/(a*cm+b*(1-cm))
	mu := math.Pow(muW, alpha) * math.Pow(muG, 1-alpha) * 1e-3
	rhoG := 1273.3 - 0.6121*tC
	rhoW := 1000 * (1 - math.Pow(math.Abs((tC-3.98)/615), 1.71))
	cv := (cm / rhoG) / (cm/rhoG + (1-cm)/rhoW)
	kappa := 1 + (1.78e-6*tC*tC-1.82e-4*tC+1.41e-2)*math.Pow(math.Sin(math.Pow(cm, 1.31)*math.Pi), 0.81)
	return mu / (kappa * (rhoG*cv + rhoW*(1-cv)))
}

// TestTunableCandidateWindowAndRecipes: the invented slurry pipe
// (sweep/study/testdata/scenarios/slurry) keeps Froude and Reynolds, so the loop
// fluid needs ν_m = ν_p/kL^3/2 with ν_p = 2e-4 m²/s (textbook similitude;
// White, Fluid Mechanics, ch. 5), within the study's 10 %.
//
//   - The 10 cSt silicone oil held at 25 °C (its grade's value, 1e-5 m²/s)
//     meets it only from (ν_p·0.9/1e-5)^2/3 to (ν_p·1.1/1e-5)^2/3, about
//     1:6.87 to 1:7.85: a fixed candidate keeps its narrow band.
//   - Water–glycerol held at 20 °C with its fraction free reaches every ν
//     between water's (w = 0) and glycerol's (w = 1) at 20 °C, so its window
//     runs from the loop's largest bore (0.5 m / 0.2 m = 1:2.5) to where the
//     need falls below ν(w=0)/1.1: kL = (ν_p·1.1/ν(w=0))^2/3, about 1:36.3.
//   - The recipe at the recommended scale (1:2.5) has, by Cheng 2008, the
//     viscosity needed within 1 %; every band's recipe meets the need
//     within the tolerance at both its ends, and the bands are contiguous.
func TestTunableCandidateWindowAndRecipes(t *testing.T) {
	const nuP, tol = 2e-4, 0.1
	res := runStudy(t, scenario(t, "slurry"))
	sr := strategy(t, res, "Froude and Reynolds")
	var oil, mix *ComboResult
	for _, c := range sr.Combos {
		switch c.Medium {
		case "loop oil":
			oil = c
		case "loop mix":
			mix = c
		}
	}
	if oil == nil || mix == nil {
		t.Fatalf("combinations %v, want loop oil and loop mix", sr.Combos)
	}
	oneInterval(t, oil, math.Pow(nuP*(1-tol)/1e-5, 2.0/3), math.Pow(nuP*(1+tol)/1e-5, 2.0/3), "loop oil no more than 10 % below", "loop oil no more than 10 % above")
	nu0 := nuGlycerolByHand(20, 0)
	if len(mix.Window) != 1 {
		t.Fatalf("loop mix window %v (%s), want one interval", mix.Window, mix.Failing)
	}
	iv := mix.Window[0]
	if !relClose(iv.Lo, 2.5, 1e-9) || !relClose(iv.Hi, math.Pow(nuP*(1+tol)/nu0, 2.0/3), 1e-6) {
		t.Errorf("loop mix window %v–%v, want 2.5–%v", iv.Lo, iv.Hi, math.Pow(nuP*(1+tol)/nu0, 2.0/3))
	}
	if !strings.Contains(iv.HiLimit, "loop mix no more than 10 % above") {
		t.Errorf("small-model edge set by %q, want the mixture's band", iv.HiLimit)
	}
	var pv *PropertyValue
	for i := range mix.Required {
		if mix.Required[i].Quantity == "kinematic_viscosity" {
			pv = &mix.Required[i]
		}
	}
	if pv == nil || pv.Recipe == nil {
		t.Fatalf("required %+v: want a recipe for kinematic_viscosity", mix.Required)
	}
	w := fraction(t, pv.Recipe.Conditions)
	need := nuP / math.Pow(mix.Recommended, 1.5)
	if got := nuGlycerolByHand(20, w); math.Abs(got-need) > 0.01*need {
		t.Errorf("recipe %s at %s: Cheng 2008 gives ν %v, need %v (1 %%)", pv.Recipe, Scale(mix.Recommended), got, need)
	}
	if len(pv.Recipes) < 2 {
		t.Fatalf("recipe bands %v, want several across 1:2.5–1:36", pv.Recipes)
	}
	for i, b := range pv.Recipes {
		w := fraction(t, b.Conditions)
		for _, k := range []float64{b.FromKL, b.ToKL} {
			n := nuP / math.Pow(k, 1.5)
			if got := nuGlycerolByHand(20, w); math.Abs(got-n) > tol*n*(1+1e-6) {
				t.Errorf("band %d (%s, %s–%s): ν %v at %s, need %v ± 10 %%", i, b.Conditions, Scale(b.FromKL), Scale(b.ToKL), got, Scale(k), n)
			}
		}
		if i > 0 && b.FromKL > pv.Recipes[i-1].ToKL*1.01 {
			t.Errorf("gap between bands %d and %d: %v to %v", i-1, i, pv.Recipes[i-1].ToKL, b.FromKL)
		}
	}
	first, last := pv.Recipes[0], pv.Recipes[len(pv.Recipes)-1]
	if !relClose(first.FromKL, iv.Lo, 1e-9) || last.ToKL < iv.Hi*0.999 {
		t.Errorf("bands cover %v–%v, want the window %v–%v", first.FromKL, last.ToKL, iv.Lo, iv.Hi)
	}
	// The larger model wins: the mixture at 1:2.5.
	if sr.Best == nil || sr.Best.Medium != "loop mix" || !relClose(sr.Best.Recommended, 2.5, 1e-9) {
		t.Errorf("best %+v, want loop mix at 1:2.5", sr.Best)
	}
}

// fraction reads w from a recipe's conditions ("20 °C, w = 0.8").
func fraction(t *testing.T, conds string) float64 {
	t.Helper()
	_, after, ok := strings.Cut(conds, "w = ")
	if !ok {
		t.Fatalf("conditions %q name no mass fraction", conds)
	}
	var w float64
	if _, err := fmtSscan(after, &w); err != nil {
		t.Fatalf("conditions %q: %v", conds, err)
	}
	return w
}

// TestTugSubstituteNamesLeastViscousLiquid: the tug's Reynolds-matched
// fluid needs about 1e-8 m²/s; no liquid of the library can be brought
// there at tank temperatures, and the reason says so and names the least
// viscous one it can make (water's viscosity falls with temperature, so it
// is found at the warm end of 5–40 °C: about 6.6e-7 m²/s at 40 °C, IAPWS
// 2008 μ = 0.653 mPa·s over ρ = 992 kg/m³, from memory).
func TestTugSubstituteNamesLeastViscousLiquid(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	sr := strategy(t, res, "substitute fluid")
	for _, c := range sr.Combos {
		if !c.Window.Empty() {
			t.Fatalf("%s: window %v, want none", c.Facility, c.Window)
		}
		for _, want := range []string{"no recipe in the library reaches it", "least viscous liquid the library can make", "40 °C"} {
			if !strings.Contains(c.Failing, want) {
				t.Errorf("%s: reason %q lacks %q", c.Facility, c.Failing, want)
			}
		}
		if c.Unmet == nil || len(c.Unmet.Matches) != 0 || c.Unmet.Quantity != "kinematic_viscosity" || c.Unmet.Required > 3.5e-8 {
			t.Errorf("%s: unmet %+v, want kinematic_viscosity below 3.5e-8 with no match", c.Facility, c.Unmet)
		}
	}
}

// TestTunableConditionRanges: a Media row's KEY=LO..HI makes a condition
// tunable within that range.
func TestTunableConditionRanges(t *testing.T) {
	stated, tune, err := tunableConditions("20C, w=0.3..0.9", nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(tune) != 1 || !strings.Contains(stated, "w=0.6") {
		t.Errorf("stated %q, ranges %v; want w=0.6 stated and one range", stated, tune)
	}
	for _, r := range tune {
		if r.Min != 0.3 || r.Max != 0.9 {
			t.Errorf("range %v, want 0.3–0.9", r)
		}
	}
	if _, tune, err := tunableConditions("T=15..30C", nil); err != nil || len(tune) != 1 {
		t.Errorf("T=15..30C: %v %v", tune, err)
	} else {
		for _, r := range tune {
			if math.Abs(r.Min-288.15) > 1e-9 || math.Abs(r.Max-303.15) > 1e-9 {
				t.Errorf("T range %v, want 288.15–303.15 K", r)
			}
		}
	}
	if stated, tune, err := tunableConditions("S=10..30g/kg, 15C", nil); err != nil || len(tune) != 1 {
		t.Errorf("S=10..30g/kg: %v %v", tune, err)
	} else {
		for _, r := range tune {
			if math.Abs(r.Min-0.01) > 1e-12 || math.Abs(r.Max-0.03) > 1e-12 {
				t.Errorf("S range %v, want 0.01–0.03 kg/kg", r)
			}
		}
		if c, err := materials.ParseConditions(stated); err != nil || math.Abs(c.Salinity-0.02) > 1e-12 || math.Abs(c.Temperature-288.15) > 1e-9 {
			t.Errorf("stated %q reads as %+v (%v), want S = 20 g/kg at 15 °C", stated, c, err)
		}
	}
	if _, _, err := tunableConditions("w=0.9..0.3", nil); err == nil {
		t.Error("a reversed range is accepted")
	}
}

func fmtSscan(s string, w *float64) (int, error) { return fmt.Sscan(s, w) }

// glycerolStudy is an invented study of a viscous prototype liquid (ν_p,
// ρ 1200) under Froude and Reynolds, with one candidate medium given by
// its library entry and conditions.
func glycerolStudy(t *testing.T, nuP, entry, conditions string) *study.Study {
	t.Helper()
	return liquidStudy(t, "1200", nuP, entry, conditions, "density, gravity", "")
}

// liquidStudy is glycerolStudy with the prototype density, the strategy's
// given properties and its fix stated.
func liquidStudy(t *testing.T, rhoP, nuP, entry, conditions, given, fix string) *study.Study {
	t.Helper()
	return studyOf(t, map[string]string{
		"Study": `setting,value,unit,note
scale_from,1.5,,
scale_to,3000,,
points,200,,
tolerance,0.1,,
prototype_medium,thick liquid,,`,
		"Prototype": `item,value,unit,scales_as,note
barge_length,10,m,length,`,
		"Custom": `entry,kind,property,value,unit,source
thick liquid,fluid,density,` + rhoP + `,kg/m^3,invented
thick liquid,fluid,kinematic_viscosity,` + nuP + `,m^2/s,invented
model liquid,fluid,density,1000,kg/m^3,invented
model liquid,fluid,kinematic_viscosity,1e-3,m^2/s,invented`,
		"Media": `name,library_entry,conditions,note
test liquid,` + entry + `,"` + conditions + `",`,
		"Strategies": `strategy,case,technique,retain,relax,untie,given,tuned,fix,media,materials,facilities,correction,note
substitute,,substitute,"inertia, gravity, viscosity",,,"` + given + `",,` + fix + `,test liquid,,,,`,
	})
}

// TestTunableWindowBothEnds: water–glycerol held at 20 °C reaches every ν
// from water's to glycerol's at 20 °C (Cheng 2008 and Volk & Kähler 2018,
// written out in nuGlycerolByHand), so with ν_m = ν_p/kL^3/2 (Froude and
// Reynolds together) its window is
//
//	(ν_p(1−tol)/ν(w=1))^2/3 ≤ kL ≤ (ν_p(1+tol)/ν(w=0))^2/3;
//
// a row that limits the fraction to w=0.3..0.9 narrows it to ν(0.3) and
// ν(0.9); stating w=0.5 pins the fraction and leaves the narrow band of
// one fixed value.
func TestTunableWindowBothEnds(t *testing.T) {
	const nuP, tol = 0.05, 0.1
	for _, tc := range []struct {
		conditions string
		wLo, wHi   float64
	}{
		{"20C", 0, 1},
		{"20C, w=0.3..0.9", 0.3, 0.9},
		{"20C, w=0.5", 0.5, 0.5},
	} {
		res := runStudy(t, glycerolStudy(t, "0.05", "water_glycerol", tc.conditions))
		c := onlyCombo(t, res, "substitute")
		lo := math.Pow(nuP*(1-tol)/nuGlycerolByHand(20, tc.wHi), 2.0/3)
		hi := math.Pow(nuP*(1+tol)/nuGlycerolByHand(20, tc.wLo), 2.0/3)
		if len(c.Window) != 1 || !relClose(c.Window[0].Lo, lo, 1e-6) || !relClose(c.Window[0].Hi, hi, 1e-6) {
			t.Errorf("%s: window %v (%s), want %v–%v", tc.conditions, c.Window, c.Failing, lo, hi)
			continue
		}
		pv := c.Required[0]
		if tc.wLo == tc.wHi {
			if pv.Recipe != nil || len(pv.Recipes) != 0 {
				t.Errorf("%s: a pinned fraction has recipes %v", tc.conditions, pv.Recipes)
			}
			continue
		}
		for _, b := range pv.Recipes {
			if w := fraction(t, b.Conditions); w < tc.wLo-1e-9 || w > tc.wHi+1e-9 {
				t.Errorf("%s: recipe %s outside w %v–%v", tc.conditions, b.RecipeAt, tc.wLo, tc.wHi)
			}
		}
	}
}

// TestLibraryRecipesWhenCandidateFails: a fixed model liquid of 1e-3 m²/s
// never meets ν_p/kL^3/2 with ν_p = 1e-4 (it needs 1e-4 at 1:1 and less
// beyond), so the window is none; the library search then names recipes
// that meet the need at the nearest scale, among them a water–glycerol
// fraction, each within the tolerance of the need (it does not depend on
// the density here).
func TestLibraryRecipesWhenCandidateFails(t *testing.T) {
	const tol = 0.1
	res := runStudy(t, glycerolStudy(t, "1e-4", "model liquid", ""))
	c := onlyCombo(t, res, "substitute")
	if !c.Window.Empty() || c.Unmet == nil {
		t.Fatalf("window %v, unmet %+v: want none with a library search", c.Window, c.Unmet)
	}
	need := 1e-4 / math.Pow(c.Unmet.KL, 1.5)
	if !relClose(c.Unmet.Required, need, 1e-9) {
		t.Errorf("unmet requirement %v at %s, want %v", c.Unmet.Required, Scale(c.Unmet.KL), need)
	}
	glycerol := false
	for _, m := range c.Unmet.Matches {
		if math.Abs(m.Value-need) > tol*need*(1+1e-9) {
			t.Errorf("match %s (%s) has %v, need %v ± 10 %%", m.Entry, m.Conditions, m.Value, need)
		}
		if m.Entry == "water_glycerol" {
			glycerol = true
			if got := nuGlycerolByHand(20, fraction(t, m.Conditions)); math.Abs(got-need) > tol*need {
				t.Errorf("water_glycerol %s: Cheng 2008 gives %v, need %v", m.Conditions, got, need)
			}
		}
	}
	if !glycerol || !strings.Contains(c.Failing, "the library can make it") {
		t.Errorf("matches %+v, reason %q: want a water_glycerol recipe named", c.Unmet.Matches, c.Failing)
	}
}

// rhoGlycerolByHand is the density (kg/m³) of a water–glycerol mixture at
// tC °C by Volk & Kähler 2018 (Exp. Fluids 59:75), written out.
func rhoGlycerolByHand(tC, cm float64) float64 {
	rhoG := 1273.3 - 0.6121*tC
	rhoW := 1000 * (1 - math.Pow(math.Abs((tC-3.98)/615), 1.71))
	cv := (cm / rhoG) / (cm/rhoG + (1-cm)/rhoW)
	kappa := 1 + (1.78e-6*tC*tC-1.82e-4*tC+1.41e-2)*math.Pow(math.Sin(math.Pow(cm, 1.31)*math.Pi), 0.81)
	return kappa * (rhoG*cv + rhoW*(1-cv))
}

// TestJointRecipeTwoRequirements: with the density scale fixed at 1
// (fix: density=1), Froude and Reynolds need both ν_m = ν_p/kL^3/2 and
// μ_m = ρ_p·ν_m of the model liquid, within 10 % each, at the same
// mixture. For water–glycerol at 20 °C (ν and ρ both rise with w; Cheng
// 2008, Volk & Kähler 2018) against ρ_p = 1300 kg/m³:
//
//   - large-model end: the need is highest, met at w = 1 only while
//     req ≤ min(ν(1)/0.9, ρ(1)ν(1)/(0.9·ρ_p)) = ρ(1)ν(1)/1170 (ρ(1) < ρ_p),
//     so kL ≥ (ν_p·1170/(ρ(1)ν(1)))^2/3;
//   - small-model end: ν/req ≤ 1.1 and ρν/(ρ_p req) ≥ 0.9 together need
//     ρ(w) ≥ ρ_p·0.9/1.1, so the thinnest mixture allowed is w* with
//     ρ(w*) = ρ_p·0.9/1.1 (found here by bisection on the density formula),
//     and kL ≤ (ν_p·1.1/ν(w*))^2/3.
//
// Each property's own band alone would reach further (w = 0 for ν), so
// the joint limit sets the small-model edge; the recipes per band meet
// both properties.
func TestJointRecipeTwoRequirements(t *testing.T) {
	const nuP, rhoP, tol = 5e-3, 1300.0, 0.1
	s := liquidStudy(t, "1300", "5e-3", "water_glycerol", "20C", "gravity", "density=1")
	res := runStudy(t, s)
	c := onlyCombo(t, res, "substitute")
	rho1, nu1 := rhoGlycerolByHand(20, 1), nuGlycerolByHand(20, 1)
	lo := math.Pow(nuP*rhoP*(1-tol)/(rho1*nu1), 2.0/3)
	a, b := 0.0, 1.0 // ρ rises with w
	for b-a > 1e-12 {
		m := (a + b) / 2
		if rhoGlycerolByHand(20, m) < rhoP*(1-tol)/(1+tol) {
			a = m
		} else {
			b = m
		}
	}
	hi := math.Pow(nuP*(1+tol)/nuGlycerolByHand(20, a), 2.0/3)
	if len(c.Window) != 1 || !relClose(c.Window[0].Lo, lo, 3e-3) || !relClose(c.Window[0].Hi, hi, 3e-3) {
		t.Fatalf("window %v (%s), want %v–%v (0.3 %%)", c.Window, c.Failing, lo, hi)
	}
	if !strings.Contains(c.Window[0].HiLimit, "at once") {
		t.Errorf("small-model edge set by %q, want the joint recipe", c.Window[0].HiLimit)
	}
	for _, pv := range c.Required {
		for _, band := range pv.Recipes {
			w := fraction(t, band.Conditions)
			nu, rho := nuGlycerolByHand(20, w), rhoGlycerolByHand(20, w)
			for _, k := range []float64{band.FromKL, band.ToKL} {
				need := nuP / math.Pow(k, 1.5)
				if math.Abs(nu-need) > tol*need*1.001 || math.Abs(rho*nu-rhoP*need) > tol*rhoP*need*1.001 {
					t.Errorf("%s band %s at %s: ν %v (need %v), μ %v (need %v)", pv.Quantity, band.Conditions, Scale(k), nu, need, rho*nu, rhoP*need)
				}
			}
		}
	}
}

// TestDefaultedMixtureWarned: a mixture named without its fraction is
// tuned, but its other properties are taken at the default fraction: the
// study says so once, at the row (spec §5: a name never stands silently
// for a mixture at a default fraction); a stated range says nothing.
func TestDefaultedMixtureWarned(t *testing.T) {
	for _, tc := range []struct {
		conditions string
		warned     bool
	}{{"20C", true}, {"20C, w=0..1", false}, {"20C, w=0.6", false}} {
		plan, err := prepare(t, glycerolStudy(t, "0.05", "water_glycerol", tc.conditions))
		if err != nil {
			t.Fatal(err)
		}
		n := 0
		for _, w := range plan.Warnings {
			if strings.Contains(w.String(), "w = 0.5 by default") && strings.Contains(w.String(), "Media!C2") {
				n++
			}
		}
		if (n == 1) != tc.warned || n > 1 {
			t.Errorf("%s: %d warnings of the default fraction (%v), want warned %v", tc.conditions, n, plan.Warnings.Strings(), tc.warned)
		}
	}
}

// BenchmarkSlurryRecipes runs the slurry scenario: two candidates, one of
// them tuned per band of scales.
func BenchmarkSlurryRecipes(b *testing.B) {
	s, err := study.LoadScenario("slurry")
	if err != nil {
		b.Fatal(err)
	}
	lib, err := materials.Default()
	if err != nil {
		b.Fatal(err)
	}
	cat, err := NewFacilityCatalog()
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		plan, err := Prepare(s, lib, cat)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := plan.Run(context.Background()); err != nil {
			b.Fatal(err)
		}
	}
}

// A condition given as a range stands, for the properties a strategy that
// does not tune it sees, at the entry's default brought into the range:
// tunnel air at atmospheric pressure when the tunnel may be pressurised
// up to 8 bar, not at the middle, 4.5 bar (defaults: 101.325 kPa for a gas,
// 20 °C for water, w = 0.5 for water–glycerol, read from the library's
// entries).
func TestRangedConditionAtOperatingPoint(t *testing.T) {
	for _, tc := range []struct {
		scenario, entry, conditions string
		k                           materials.Condition
		want                        float64
	}{
		{"conductor", "air", "15C, p=1..8bar", materials.Pressure, 101325},
		{"conductor", "air", "15C, p=2..8bar", materials.Pressure, 200000}, // the default is below: the range's low end
		{"tug", "water", "T=15..30C", materials.Temperature, 293.15},
		{"tug", "water", "T=25..30C", materials.Temperature, 298.15},
		{"slurry", "water_glycerol", "20C, w=0.3..0.9", materials.MassFraction, 0.5},
	} {
		s, err := study.LoadScenario(tc.scenario)
		if err != nil {
			t.Fatal(err)
		}
		s.Media[0].Entry, s.Media[0].Conditions = tc.entry, tc.conditions
		plan, err := prepare(t, s)
		if err != nil {
			t.Fatalf("%s %q: %v", tc.entry, tc.conditions, err)
		}
		c := plan.Media[0]
		if got, ok := c.cond.Get(tc.k); !ok || math.Abs(got-tc.want) > 1e-9*tc.want {
			t.Errorf("%s %q: stated %s %v, want %v", tc.entry, tc.conditions, tc.k, got, tc.want)
		}
		if len(c.tune) != 1 {
			t.Errorf("%s %q: tunable %v, want the range", tc.entry, tc.conditions, c.tune)
		}
	}
}
