package feasibility

import "testing"

// BenchmarkSolve measures the exact solver, which runs once per strategy.
func BenchmarkSolve(b *testing.B) {
	s := Strategy{Retain: []string{"inertia", "gravity", "flexure"}, Relax: []string{"viscosity", "surface_tension"},
		Untie: []string{"thickness"}, Given: []string{"density", "gravity", "strength", "viscosity", "surface_tension"}}
	for i := 0; i < b.N; i++ {
		if _, err := Solve(s); err != nil {
			b.Fatal(err)
		}
	}
}
