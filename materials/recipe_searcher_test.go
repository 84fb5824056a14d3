package materials

import (
	"math"
	"testing"
)

// The searcher skips the solve of an entry whose range shows it cannot
// meet a constant target. Its outcome must be the one solving every entry
// gives: the same entries met, and for the others a nearest value no
// farther from the requirement than the solver's own nearest (the extreme
// is the nearest any condition can come). The comparison is with the
// solver of recipe.go, an independent path through bisection and
// Nelder–Mead.
func TestSearcherAgreesWithSolvingEveryEntry(t *testing.T) {
	l := defaultLibrary(t)
	at := Conditions{}.With(Temperature, 293.15)
	tank := map[Condition]Range{Temperature: {278.15, 313.15}}
	cases := []struct {
		name   string
		q      string
		value  float64
		limits map[Condition]Range
	}{
		{"below every liquid", "kinematic_viscosity", 2e-8, tank},
		{"just below hot water", "kinematic_viscosity", 5e-7, tank},
		{"inside the mixtures", "kinematic_viscosity", 1e-5, tank},
		{"above every liquid", "kinematic_viscosity", 10, tank},
		{"dense brine", "density", 1150, nil},
		{"denser than any liquid", "density", 5000, nil},
	}
	for _, tc := range cases {
		spec := RecipeSpec{Target: Target{Quantity: tc.q, Value: tc.value}, Tolerance: 0.02, At: at, Limits: tc.limits}
		got := l.Searcher().FindRecipes(spec, Liquids)
		want := l.findRecipes(spec, Liquids, nil) // nil: every entry solved
		if len(got.Met) != len(want.Met) {
			t.Errorf("%s: met %d entries screened, %d solved", tc.name, len(got.Met), len(want.Met))
			continue
		}
		for i := range got.Met {
			if got.Met[i].Entry != want.Met[i].Entry {
				t.Errorf("%s: met #%d %s screened, %s solved", tc.name, i, got.Met[i].Entry, want.Met[i].Entry)
			}
		}
		if len(got.Nearest) != len(want.Nearest) {
			t.Errorf("%s: %d nearest screened, %d solved", tc.name, len(got.Nearest), len(want.Nearest))
			continue
		}
		solved := map[string]Recipe{}
		for _, r := range want.Nearest {
			solved[r.Entry] = r
		}
		off := func(r Recipe) float64 { return math.Abs(math.Log(r.Target.Value / r.Target.Required)) }
		for _, r := range got.Nearest {
			w, ok := solved[r.Entry]
			if !ok || r.Met || off(r) > off(w)+1e-3 {
				t.Errorf("%s: %s nearest %g screened against %g solved", tc.name, r.Entry, r.Target.Value, w.Target.Value)
			}
		}
		if len(got.Nearest) > 0 && got.Nearest[0].Entry != want.Nearest[0].Entry &&
			math.Abs(off(got.Nearest[0])-off(want.Nearest[0])) > 1e-3 {
			t.Errorf("%s: nearest entry %s screened, %s solved", tc.name, got.Nearest[0].Entry, want.Nearest[0].Entry)
		}
		if got.Reason != want.Reason {
			t.Errorf("%s: reason\n%q screened\n%q solved", tc.name, got.Reason, want.Reason)
		}
	}
}

// A requirement with a condition held, another requirement, or a target
// that follows the entry's own properties is always solved.
func TestSearcherSolvesWhatItCannotScreen(t *testing.T) {
	l := defaultLibrary(t)
	e, err := l.Lookup("water_glycerol")
	if err != nil {
		t.Fatal(err)
	}
	s := l.Searcher()
	base := RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 2e-8}}
	held := base
	held.Hold = []Condition{Temperature}
	also := base
	also.Also = []Target{{Quantity: "density", Value: 1000}}
	of := base
	of.Target.Of = func(map[string]float64) float64 { return 2e-8 }
	if _, ok := screened(e, base, s.extremeOf); !ok {
		t.Errorf("a constant target far below the range was not screened")
	}
	for name, spec := range map[string]RecipeSpec{"held": held, "also": also, "of": of} {
		if _, ok := screened(e, spec, s.extremeOf); ok {
			t.Errorf("%s: screened", name)
		}
	}
}

func BenchmarkSearcherUnreachable(b *testing.B) {
	l, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	s := l.Searcher()
	spec := RecipeSpec{Target: Target{Quantity: "kinematic_viscosity", Value: 3e-8}, Tolerance: 0.05, At: Conditions{}.With(Temperature, 288.15)}
	for b.Loop() {
		s.FindRecipes(spec, Liquids)
	}
}
