package feasibility

import (
	"math"
	"slices"
	"testing"
)

// lengthExp returns the exponent of kL in a quantity's scale law.
func lengthExp(t *testing.T, sol *Solution, q string) string {
	t.Helper()
	l, ok := sol.Law(q)
	if !ok || l.Status == Unset || l.Status == Free {
		t.Fatalf("%s: no scale law (status %v)", q, l.Status)
	}
	return l.Exp[0].String()
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b)) }

// The reference cases of the specification (§3.5) and further cases, each
// with the source of its expected result.
func TestSolveReferenceCases(t *testing.T) {
	ones := func(kL float64, qs ...string) Values {
		v := Values{"length": kL}
		for _, q := range qs {
			v[q] = 1
		}
		return v
	}
	cases := []struct {
		name, source string
		s            Strategy
		at           Values
		factors      map[string]float64 // expected numeric scale factors at `at`
		exps         map[string]string  // expected exponent of kL
		required     []string
		free         []string
		pinsLength   float64 // >0: a condition allows only this kL
	}{
		{
			name:   "Froude, same fluid",
			source: "Froude scaling, textbook similitude (e.g. White, Fluid Mechanics, ch. 5, model testing)",
			s:      Strategy{Retain: []string{"inertia", "gravity"}, Given: []string{"density", "gravity"}},
			at:     ones(25, "density", "gravity"),
			factors: map[string]float64{"velocity": 5, "time": 5, "force": 15625, "mass": 15625,
				"pressure": 25, "power": 78125, "frequency": 0.2, "acceleration": 1, "moment": 390625, "energy": 390625},
			exps: map[string]string{"velocity": "1/2", "time": "1/2", "force": "3", "power": "7/2"},
		},
		{
			name:    "Reynolds, same fluid",
			source:  "Reynolds scaling, textbook similitude (e.g. White, Fluid Mechanics, ch. 5)",
			s:       Strategy{Retain: []string{"inertia", "viscosity"}, Given: []string{"density", "viscosity"}},
			at:      ones(10, "density", "viscosity"),
			factors: map[string]float64{"velocity": 0.1, "force": 1, "time": 100},
			exps:    map[string]string{"velocity": "-1", "time": "2", "force": "0"},
		},
		{
			name:     "Froude + Reynolds, viscosity required",
			source:   "textbook similitude: Froude and Reynolds together need ν_p/ν_m = kL^3/2 (White, Fluid Mechanics, ch. 5)",
			s:        Strategy{Retain: []string{"inertia", "gravity", "viscosity"}, Given: []string{"density", "gravity"}},
			at:       ones(25, "density", "gravity"),
			factors:  map[string]float64{"viscosity": 125, "kinematic_viscosity": 125},
			exps:     map[string]string{"viscosity": "3/2"},
			required: []string{"kinematic_viscosity", "viscosity"},
		},
		{
			name:       "layer flexure, geometric",
			source:     "common practice (similitude of ice-structure tests: same-strength ice cannot be Froude scaled)",
			s:          Strategy{Retain: []string{"inertia", "gravity", "strength"}, Given: []string{"density", "gravity", "strength"}},
			at:         ones(1, "density", "gravity", "strength"),
			pinsLength: 1,
		},
		{
			name:    "layer flexure, distorted thickness",
			source:  "common practice (distorted-variable similitude: layer thickness kL^3/2)",
			s:       Strategy{Retain: []string{"inertia", "gravity", "flexure"}, Given: []string{"density", "gravity", "strength"}, Untie: []string{"thickness"}},
			at:      ones(50, "density", "gravity", "strength"),
			factors: map[string]float64{"thickness": math.Pow(50, 1.5)},
			exps:    map[string]string{"thickness": "3/2", "velocity": "1/2"},
		},
		{
			name:     "beam bending, same material",
			source:   "common practice (segmented model with a backbone beam: I scales as kL^5)",
			s:        Strategy{Retain: []string{"inertia", "gravity", "bending"}, Given: []string{"density", "gravity", "modulus"}, Untie: []string{"area_moment"}},
			at:       ones(20, "density", "gravity", "modulus"),
			factors:  map[string]float64{"area_moment": math.Pow(20, 5), "flexural_rigidity": math.Pow(20, 5)},
			exps:     map[string]string{"area_moment": "5", "flexural_rigidity": "5"},
			required: []string{"flexural_rigidity"},
		},
		{
			name:    "cohesive soil, same soil",
			source:  "common practice (soil-tool similitude, cohesive case: velocity 1, force kL^2)",
			s:       Strategy{Retain: []string{"inertia", "cohesion"}, Given: []string{"density", "cohesion"}},
			at:      ones(4, "density", "cohesion"),
			factors: map[string]float64{"velocity": 1, "force": 16},
			exps:    map[string]string{"velocity": "0", "force": "2"},
		},
		{
			name:    "frictional soil, same soil",
			source:  "common practice (soil-tool similitude, frictional case: velocity kL^1/2, force kL^3)",
			s:       Strategy{Retain: []string{"inertia", "gravity", "friction"}, Given: []string{"density", "gravity", "friction"}},
			at:      ones(4, "density", "gravity", "friction"),
			factors: map[string]float64{"velocity": 2, "force": 64},
			exps:    map[string]string{"velocity": "1/2", "force": "3"},
		},
		{
			name:     "self-weight elastic, same modulus",
			source:   "textbook similitude of gravity-loaded elastic structures (density must scale as 1/kL), common practice",
			s:        Strategy{Retain: []string{"gravity", "elasticity"}, Given: []string{"modulus", "gravity"}},
			at:       ones(10, "modulus", "gravity"),
			factors:  map[string]float64{"density": 0.1},
			exps:     map[string]string{"density": "-1"},
			required: []string{"density"},
			free:     []string{"velocity"},
		},
		{
			name:     "centrifuge: same soil at raised gravity",
			source:   "geotechnical centrifuge scaling, model at N g for kL = N (Schofield 1980, Géotechnique 30(3); common practice)",
			s:        Strategy{Retain: []string{"inertia", "gravity", "friction", "cohesion"}, Given: []string{"density", "friction", "cohesion"}},
			at:       ones(50, "density", "friction", "cohesion"),
			factors:  map[string]float64{"gravity": 1.0 / 50, "velocity": 1, "time": 50, "force": 2500, "pressure": 1},
			exps:     map[string]string{"gravity": "-1"},
			required: []string{"gravity"},
		},
		{
			name:     "pressurised gas: Reynolds and Mach in the same gas",
			source:   "common practice (pressurised wind tunnels raise density to recover Reynolds number)",
			s:        Strategy{Retain: []string{"inertia", "viscosity", "compressibility"}, Given: []string{"viscosity", "sound_speed"}},
			at:       ones(8, "viscosity", "sound_speed"),
			factors:  map[string]float64{"density": 1.0 / 8, "velocity": 1},
			exps:     map[string]string{"density": "-1"},
			required: []string{"kinematic_viscosity", "density"},
		},
		{
			name:    "surface tension with gravity, same liquid",
			source:  "textbook similitude: Froude and Weber in one liquid only at full scale (White, Fluid Mechanics, ch. 5)",
			s:       Strategy{Retain: []string{"inertia", "gravity", "surface_tension"}, Given: []string{"density", "gravity", "surface_tension"}},
			at:      ones(1, "density", "gravity", "surface_tension"),
			factors: map[string]float64{"velocity": 1},
			// kL^2 = k_surface_tension/(k_density k_gravity)
			pinsLength: 1,
		},
		{
			name:    "Weber alone, same liquid",
			source:  "textbook similitude: We = ρV²L/σ fixed gives V ∝ L^-1/2",
			s:       Strategy{Retain: []string{"inertia", "surface_tension"}, Given: []string{"density", "surface_tension"}},
			at:      ones(4, "density", "surface_tension"),
			factors: map[string]float64{"velocity": 0.5},
			exps:    map[string]string{"velocity": "-1/2"},
		},
		{
			name:     "spring-mounted section, velocity free",
			source:   "common practice (section-model tests: the reduced stiffness k/(ρV²L) is kept, the speed scale is chosen)",
			s:        Strategy{Retain: []string{"inertia", "spring"}, Given: []string{"density"}},
			at:       Values{"length": 10, "density": 1, "velocity": 2},
			factors:  map[string]float64{"stiffness": 10 * 4, "frequency": 0.2, "mass": 1000},
			required: []string{"stiffness"},
			free:     []string{"velocity"},
		},
		{
			name:    "elastic + Froude, modulus required",
			source:  "textbook similitude of hydroelastic models: E scales as kL in Froude scaling with the same density (common practice)",
			s:       Strategy{Retain: []string{"inertia", "gravity", "elasticity"}, Given: []string{"density", "gravity"}},
			at:      ones(30, "density", "gravity"),
			factors: map[string]float64{"modulus": 30, "velocity": math.Sqrt(30)},
			exps:    map[string]string{"modulus": "1"},
			// E·I follows E because the area moment stays tied.
			required: []string{"flexural_rigidity", "modulus"},
		},
		{
			// A medium known by its kinematic viscosity and density fixes
			// its dynamic viscosity: μ = ν·ρ (definition of kinematic
			// viscosity, any fluid-mechanics text, e.g. White ch. 1), so
			// nothing is required of the model.
			name:     "Froude, medium given by density and kinematic viscosity",
			source:   "definition ν = μ/ρ (White, Fluid Mechanics, ch. 1)",
			s:        Strategy{Retain: []string{"inertia", "gravity"}, Relax: []string{"viscosity"}, Given: []string{"density", "gravity", "kinematic_viscosity"}},
			at:       Values{"length": 25, "density": 1, "gravity": 1, "kinematic_viscosity": 2},
			factors:  map[string]float64{"viscosity": 2, "velocity": 5},
			required: []string{},
		},
		{
			name:     "Froude, medium given by density and viscosity",
			source:   "definition ν = μ/ρ (White, Fluid Mechanics, ch. 1)",
			s:        Strategy{Retain: []string{"inertia", "gravity"}, Relax: []string{"viscosity"}, Given: []string{"density", "gravity", "viscosity"}},
			at:       Values{"length": 25, "density": 2, "gravity": 1, "viscosity": 3},
			factors:  map[string]float64{"kinematic_viscosity": 1.5},
			required: []string{},
		},
		{
			// Given E·I and a tied area moment fix E = E·I / I.
			name:     "beam bending, flexural rigidity given",
			source:   "definition of flexural rigidity E·I (Timoshenko & Gere, Mechanics of Materials)",
			s:        Strategy{Retain: []string{"inertia", "gravity", "bending"}, Given: []string{"density", "gravity", "flexural_rigidity"}},
			at:       Values{"length": 10, "density": 1, "gravity": 1, "flexural_rigidity": 1e5},
			factors:  map[string]float64{"modulus": 10},
			required: []string{},
			// Bending similarity then needs k_EI = kL^5: 1e5 pins kL = 10.
			pinsLength: 10,
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sol, err := Solve(c.s)
			if err != nil {
				t.Fatalf("Solve: %v", err)
			}
			f, err := sol.Factors(c.at)
			if err != nil {
				t.Fatal(err)
			}
			for q, want := range c.factors {
				got, ok := f[q]
				if !ok || !near(got, want) {
					t.Errorf("k_%s = %v (known %v), want %v [%s]", q, got, ok, want, sol.LawString(q))
				}
			}
			for q, want := range c.exps {
				if got := lengthExp(t, sol, q); got != want {
					t.Errorf("exponent of kL in k_%s = %s, want %s", q, got, want)
				}
			}
			if c.required != nil && !slices.Equal(sol.Required, c.required) {
				t.Errorf("required = %v, want %v", sol.Required, c.required)
			}
			if !slices.Equal(sol.Free, c.free) {
				t.Errorf("free = %v, want %v", sol.Free, c.free)
			}
			checks, err := sol.Check(c.at)
			if err != nil {
				t.Fatal(err)
			}
			pinned := 0.0
			for _, cc := range checks {
				if cc.PinsLength {
					pinned = cc.Length
				}
				if !cc.Holds {
					t.Errorf("condition %s does not hold at %v", cc.Equation(sol.Params), c.at)
				}
			}
			if c.pinsLength > 0 {
				if !near(pinned, c.pinsLength) {
					t.Errorf("pinned kL = %v, want %v", pinned, c.pinsLength)
				}
				// Away from the pinned scale the condition fails.
				away := Values{}
				for k, v := range c.at {
					away[k] = v
				}
				away["length"] = 2 * c.pinsLength
				checks, _ := sol.Check(away)
				failed := false
				for _, cc := range checks {
					failed = failed || (cc.Known && !cc.Holds)
				}
				if !failed {
					t.Errorf("no condition fails at kL = %v", away["length"])
				}
			} else if pinned != 0 {
				t.Errorf("unexpected condition pins kL = %v", pinned)
			}
		})
	}
}

func TestConditionNamedByGroup(t *testing.T) {
	// Froude + Reynolds in one fluid (source: textbook similitude, White,
	// Fluid Mechanics ch. 5): the model fluid needs ν scaled by kL^3/2.
	sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "viscosity"}, Given: []string{"density", "gravity", "kinematic_viscosity"}})
	if err != nil {
		t.Fatal(err)
	}
	if len(sol.Conditions) != 1 {
		t.Fatalf("conditions = %d, want 1", len(sol.Conditions))
	}
	c := sol.Conditions[0]
	if c.Protects != "Reynolds number" || c.Law != "viscosity" {
		t.Errorf("condition protects %q (law %q), want Reynolds number", c.Protects, c.Law)
	}
	if got, want := c.Equation(sol.Params), "k_kinematic_viscosity = kL^3/2 · k_gravity^1/2"; got != want {
		t.Errorf("equation = %q, want %q", got, want)
	}
	checks, _ := sol.Check(Values{"length": 25, "density": 1, "gravity": 1, "kinematic_viscosity": 1})
	if checks[0].Holds || !near(checks[0].Off, 1/125.0) {
		t.Errorf("check at kL 25 in water: holds %v off %v, want off 1/125", checks[0].Holds, checks[0].Off)
	}
}

func TestRelaxedMismatch(t *testing.T) {
	// Froude model in the same water: the Reynolds number of the model is
	// kL^3/2 times smaller (textbook similitude, e.g. White ch. 5).
	sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity"}, Relax: []string{"viscosity", "surface_tension"},
		Given: []string{"density", "gravity", "viscosity", "surface_tension"}})
	if err != nil {
		t.Fatal(err)
	}
	v := Values{"length": 25, "density": 1, "gravity": 1, "viscosity": 1, "surface_tension": 1}
	want := map[string]float64{"Reynolds number": 125, "Weber number": 625}
	for _, m := range sol.Relaxed {
		got, ok, err := sol.MismatchValue(m, v)
		if err != nil || !ok || !near(got, want[m.Group]) {
			t.Errorf("%s mismatch = %v (%v, %v), want %v", m.Group, got, ok, err, want[m.Group])
		}
	}
	// Without the viscosity given, the mismatch cannot be evaluated and
	// the solver says what is missing.
	sol, _ = Solve(Strategy{Retain: []string{"inertia", "gravity"}, Relax: []string{"viscosity"}, Given: []string{"density", "gravity"}})
	if m := sol.Relaxed[0]; !slices.Equal(m.Missing, []string{"viscosity"}) {
		t.Errorf("missing = %v, want [viscosity]", m.Missing)
	}
}

func TestSolveErrors(t *testing.T) {
	cases := []struct {
		s    Strategy
		want string
	}{
		{Strategy{}, "no law retained: retain at least one (known: inertia, gravity, viscosity, surface_tension, elasticity, compressibility, pressure, cohesion, friction, bending, flexure, strength, spring, hydrostatic, bed_friction, consolidation, cavitation)"},
		{Strategy{Retain: []string{"inertia", "gravty"}}, `unknown law "gravty" (did you mean gravity?)`},
		{Strategy{Retain: []string{"inertia"}, Given: []string{"densty"}}, `unknown quantity "densty" (did you mean density?)`},
		{Strategy{Retain: []string{"inertia", "gravity"}, Relax: []string{"gravity"}}, `law "gravity" is both retained and relaxed: choose one`},
		{Strategy{Retain: []string{"inertia"}, Untie: []string{"velocity"}}, `quantity "velocity" cannot be untied: only thickness, area_moment, strain are tied to the length`},
		{Strategy{Retain: []string{"inertia"}, Given: []string{"density", "density"}}, `quantity "density" is given twice`},
		{Strategy{Retain: []string{"inertia"}, Given: []string{"density"}, Tuned: []string{"density"}}, `quantity "density" is both given and tuned: choose one`},
		{Strategy{Retain: []string{"inertia", "gravity"}, Tuned: []string{"strength"}}, `tuned quantity "strength" is not fixed by the retained laws (inertia, gravity): give it, or retain a law that involves it`},
	}
	for _, c := range cases {
		_, err := Solve(c.s)
		if err == nil || err.Error() != c.want {
			t.Errorf("Solve(%+v) error = %v, want %q", c.s, err, c.want)
		}
	}
}

// TestEvalMatchesFactors checks that the matrix–vector evaluation used by
// the sweep gives the same factors as the exact laws.
func TestEvalMatchesFactors(t *testing.T) {
	sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "flexure"}, Given: []string{"density", "gravity", "strength"}, Untie: []string{"thickness"}})
	if err != nil {
		t.Fatal(err)
	}
	v := Values{"length": 37, "density": 1.02, "gravity": 1, "strength": 17}
	want, _ := sol.Factors(v)
	logp := make([]float64, len(sol.Params))
	for j, p := range sol.Params {
		logp[j] = math.Log(v[p.Quantity])
	}
	logk := make([]float64, len(sol.Laws))
	sol.Eval(logp, logk)
	for i, l := range sol.Laws {
		if w, ok := want[l.Quantity]; ok && !near(math.Exp(logk[i]), w) {
			t.Errorf("%s: Eval %v, Factors %v", l.Quantity, math.Exp(logk[i]), w)
		}
	}
}
