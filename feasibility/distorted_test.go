package feasibility

import (
	"math"
	"slices"
	"strings"
	"testing"
)

// The reference cases of spec §3.6 (distorted, diffusive and cavitating
// models), each with the source of its expected result. Expected values are
// computed here from the published scale relations, not from the solver.
func TestSolveSecondEditionCases(t *testing.T) {
	t.Run("distorted river model", func(t *testing.T) {
		// Hughes 1993, Physical Models and Laboratory Techniques in Coastal
		// Engineering, ch. 2 (distorted Froude models: N_V = N_h^1/2,
		// N_Q = N_L·N_h^3/2, N_t = N_L/N_h^1/2, N_n = N_h^2/3/N_L^1/2);
		// Chanson 2004, The Hydraulics of Open Channel Flow, 2nd ed.,
		// ch. 14 (distorted models) — section numbers from memory.
		sol, err := Solve(Strategy{Retain: []string{"inertia", "hydrostatic", "bed_friction"},
			Given: []string{"density", "gravity", "thickness"}, Untie: []string{"thickness"}})
		if err != nil {
			t.Fatal(err)
		}
		f, err := sol.Factors(Values{"length": 500, "density": 1, "gravity": 1, "thickness": 50})
		if err != nil {
			t.Fatal(err)
		}
		want := map[string]float64{
			"velocity":  math.Sqrt(50),                        // 7.0711
			"discharge": 500 * math.Pow(50, 1.5),              // 176 776.7
			"time":      500 / math.Sqrt(50),                  // 70.711
			"roughness": math.Pow(50, 2.0/3) / math.Sqrt(500), // 0.6070
			"pressure":  50,                                   // ρ g h
			"force":     50 * 500 * 500,                       // ρ g h L²
			"thickness": 50,                                   //
			"mass":      500 * 500 * 500,                      // ρ L³ (not the water volume L² h)
			"frequency": math.Sqrt(50) / 500,                  //
		}
		for q, w := range want {
			if got, ok := f[q]; !ok || math.Abs(got-w) > 1e-9*w {
				t.Errorf("k_%s = %v (known %v), want %v [%s]", q, got, ok, w, sol.LawString(q))
			}
		}
		for q, w := range map[string]float64{"velocity": 7.071, "discharge": 176777, "time": 70.71, "roughness": 0.6070} {
			if math.Abs(f[q]-w) > 5e-4*w {
				t.Errorf("k_%s = %v, spec states %v", q, f[q], w)
			}
		}
		if !slices.Contains(sol.Required, "roughness") {
			t.Errorf("required = %v, want roughness among them", sol.Required)
		}
		if len(sol.Conditions) != 0 || len(sol.Free) != 0 {
			t.Errorf("conditions %v, free %v: want none", sol.Conditions, sol.Free)
		}
	})
	t.Run("undistorted Manning model", func(t *testing.T) {
		// Chanson 2004, ch. 14 (from memory): in an undistorted Froude
		// model Manning's n scales as kL^1/6.
		sol, err := Solve(Strategy{Retain: []string{"inertia", "hydrostatic", "bed_friction"}, Given: []string{"density", "gravity"}})
		if err != nil {
			t.Fatal(err)
		}
		if got := lengthExp(t, sol, "roughness"); got != "1/6" {
			t.Errorf("roughness exponent %s, want 1/6", got)
		}
		if got := lengthExp(t, sol, "discharge"); got != "5/2" {
			t.Errorf("discharge exponent %s, want 5/2", got)
		}
	})
	t.Run("centrifuge consolidation, same soil", func(t *testing.T) {
		// Garnier et al. 2007, Catalogue of scaling laws and similitude
		// questions in geotechnical centrifuge modelling, IJPMG 7(3), §2
		// table 1 (from memory): dynamic time scales as N, consolidation
		// time as N² — the same soil cannot satisfy both.
		sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "consolidation"},
			Given: []string{"density", "gravity", "consolidation_coefficient"}})
		if err != nil {
			t.Fatal(err)
		}
		if len(sol.Conditions) != 1 || sol.Conditions[0].Protects != "time factor" || sol.Conditions[0].Law != "consolidation" {
			t.Fatalf("conditions = %+v, want one protecting the time factor", sol.Conditions)
		}
		const N = 50.0
		checks, err := sol.Check(Values{"length": N, "density": 1, "gravity": 1 / N, "consolidation_coefficient": 1})
		if err != nil {
			t.Fatal(err)
		}
		// The same soil at N g has c_v,p/c_v,m = 1, but similarity needs N.
		if checks[0].Holds || math.Abs(checks[0].Off-1/N) > 1e-9 {
			t.Errorf("check: holds %v off %v, want fails with off 1/%v", checks[0].Holds, checks[0].Off, N)
		}
	})
	t.Run("centrifuge, viscous pore fluid", func(t *testing.T) {
		// Garnier et al. 2007 (from memory, §3 on pore fluids): with a pore
		// fluid N times more viscous, c_v,m = c_v,p/N, so consolidation and
		// dynamic times both scale as N.
		sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "consolidation"}, Given: []string{"density", "gravity"}})
		if err != nil {
			t.Fatal(err)
		}
		const N = 50.0
		f, err := sol.Factors(Values{"length": N, "density": 1, "gravity": 1 / N})
		if err != nil {
			t.Fatal(err)
		}
		for q, w := range map[string]float64{"consolidation_coefficient": N, "time": N, "velocity": 1, "pressure": 1, "force": N * N} {
			if math.Abs(f[q]-w) > 1e-9*w {
				t.Errorf("k_%s = %v, want %v [%s]", q, f[q], w, sol.LawString(q))
			}
		}
		if !slices.Contains(sol.Required, "consolidation_coefficient") {
			t.Errorf("required = %v, want consolidation_coefficient", sol.Required)
		}
	})
	t.Run("depressurised tank", func(t *testing.T) {
		// ITTC Recommended Procedure 7.5-02-03-03.1, Model-Scale Cavitation Test (number and
		// section from memory): the cavitation number σ = (p − p_v)/(½ρV²) is kept,
		// so in a Froude model of the same liquid (p − p_v) scales as kL.
		sol, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "cavitation"}, Given: []string{"density", "gravity"}})
		if err != nil {
			t.Fatal(err)
		}
		f, err := sol.Factors(Values{"length": 25, "density": 1, "gravity": 1})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(f["pressure"]-25) > 1e-9 {
			t.Errorf("k_pressure = %v, want 25", f["pressure"])
		}
		if !slices.Contains(sol.Required, "pressure") {
			t.Errorf("required = %v, want pressure (the tank's ambient pressure)", sol.Required)
		}
	})
}

func TestCavitationPressure(t *testing.T) {
	// Propeller 4 m below a calm sea at 15 °C: p_p = 101 325 + 1025·9.81·4
	// = 141 546 Pa, p_v,p = 1 705 Pa (IAPWS saturation, 15 °C); model in
	// fresh water at 20 °C, p_v,m = 2 339 Pa, kL = 25 (hand computation).
	pp := 101325 + 1025*9.81*4.0
	got, err := CavitationPressure(pp, 1705, 2339, 25)
	if err != nil {
		t.Fatal(err)
	}
	want := 2339 + (141546.0-1705)/25 // 7 932.6 Pa
	if math.Abs(got-want) > 0.1 {
		t.Errorf("tank pressure = %v, want %v", got, want)
	}
	// The cavitation number then matches at a Froude speed (V_m = V_p/5).
	sp := CavitationNumber(pp, 1705, 1025, 10)
	sm := CavitationNumber(got, 2339, 1025, 2)
	if math.Abs(sp-sm) > 1e-12*sp {
		t.Errorf("σ prototype %v, model %v", sp, sm)
	}
	if _, err := CavitationPressure(1000, 2339, 2339, 25); err == nil {
		t.Error("prototype below vapour pressure: want an error")
	}
	if _, err := CavitationPressure(1e5, 2339, 2339, 0); err == nil {
		t.Error("zero pressure scale: want an error")
	}
}

// A centrifuge whose g-level follows the scale (N = kL): gravity tied to
// kL^-1 rather than given. Garnier et al. 2007 (from memory): dynamic time
// N, consolidation time N²; so the same soil is similar only at kL = 1.
func TestSolveGravityTiedToScale(t *testing.T) {
	tie := []LengthTie{{"gravity", Int(-1)}}
	same, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "consolidation"},
		Given: []string{"density", "consolidation_coefficient"}, Tied: tie})
	if err != nil {
		t.Fatal(err)
	}
	if len(same.Conditions) != 1 || same.Conditions[0].Protects != "time factor" {
		t.Fatalf("conditions = %+v, want one protecting the time factor", same.Conditions)
	}
	if got, want := same.Conditions[0].Equation(same.Params), "k_consolidation_coefficient = kL"; got != want {
		t.Errorf("condition %q, want %q", got, want)
	}
	checks, _ := same.Check(Values{"density": 1, "consolidation_coefficient": 1})
	if len(checks) != 1 || !checks[0].PinsLength || math.Abs(checks[0].Length-1) > 1e-12 {
		t.Errorf("checks = %+v, want kL pinned at 1", checks)
	}
	viscous, err := Solve(Strategy{Retain: []string{"inertia", "gravity", "consolidation"}, Given: []string{"density"}, Tied: tie})
	if err != nil {
		t.Fatal(err)
	}
	for q, want := range map[string]string{"gravity": "-1", "time": "1", "velocity": "0", "consolidation_coefficient": "1"} {
		if got := lengthExp(t, viscous, q); got != want {
			t.Errorf("exponent of kL in k_%s = %s, want %s", q, got, want)
		}
	}
	if !slices.Equal(viscous.Required, []string{"consolidation_coefficient"}) || len(viscous.Free) != 0 {
		t.Errorf("required %v free %v, want [consolidation_coefficient] and none", viscous.Required, viscous.Free)
	}
	if _, err := Solve(Strategy{Retain: []string{"inertia", "gravity"}, Given: []string{"gravity"}, Tied: tie}); err == nil {
		t.Error("gravity both given and tied: want an error")
	}
}

// An untied thickness that no retained law uses is said, with the law a
// distorted open-channel model needs; an untied quantity a law uses
// (flexure, or bending through E·I) is not.
func TestUntieWarnings(t *testing.T) {
	cases := []struct {
		s    Strategy
		want int
	}{
		{Strategy{Retain: []string{"inertia", "gravity"}, Untie: []string{"thickness"}, Given: []string{"density", "gravity", "thickness"}}, 1},
		{Strategy{Retain: []string{"inertia", "hydrostatic", "bed_friction"}, Untie: []string{"thickness"}, Given: []string{"density", "gravity"}}, 0},
		{Strategy{Retain: []string{"inertia", "gravity", "flexure"}, Untie: []string{"thickness"}, Given: []string{"density", "gravity", "strength"}}, 0},
		{Strategy{Retain: []string{"inertia", "gravity", "bending"}, Untie: []string{"area_moment"}, Given: []string{"density", "gravity", "modulus"}}, 0},
		{Strategy{Retain: []string{"inertia", "gravity"}, Untie: []string{"area_moment"}, Given: []string{"density", "gravity"}}, 1},
	}
	for _, c := range cases {
		sol, err := Solve(c.s)
		if err != nil {
			t.Fatal(err)
		}
		if len(sol.Warnings) != c.want {
			t.Errorf("%v untie %v: warnings %q, want %d", c.s.Retain, c.s.Untie, sol.Warnings, c.want)
		}
	}
	sol, _ := Solve(cases[0].s)
	if !strings.Contains(sol.Warnings[0], "retain hydrostatic") {
		t.Errorf("warning %q does not name the hydrostatic law", sol.Warnings[0])
	}
}

// Manning friction relaxed in an undistorted Froude model that keeps the
// prototype's roughness: n should scale as kL^1/6 (Chanson 2004, ch. 14,
// from memory), so the model is kL^1/6 too rough and the roughness number
// h^4/3/(g·n²·L) is off by (kL^1/6)² = kL^1/3 — hand computation.
func TestRelaxedBedFriction(t *testing.T) {
	sol, err := Solve(Strategy{Retain: []string{"inertia", "hydrostatic"}, Relax: []string{"bed_friction"}, Given: []string{"density", "gravity", "roughness"}})
	if err != nil {
		t.Fatal(err)
	}
	m := sol.Relaxed[0]
	if m.Group != "roughness number" || len(m.Missing) != 0 {
		t.Fatalf("mismatch %+v", m)
	}
	got, ok, err := sol.MismatchValue(m, Values{"length": 50, "density": 1, "gravity": 1, "roughness": 1})
	if err != nil || !ok || math.Abs(got-math.Cbrt(50)) > 1e-9*got {
		t.Errorf("roughness-number mismatch %v (%v, %v), want 50^1/3 = %v", got, ok, err, math.Cbrt(50))
	}
}
