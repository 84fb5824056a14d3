package sweep

import (
	"math"
	"testing"

	"scaleplan/sweep/study"
)

func requirement(t *testing.T, c *ComboResult, capability, limit string) Requirement {
	t.Helper()
	for _, r := range c.Requirements {
		if r.Capability == capability && r.Limit == limit {
			return r
		}
	}
	t.Fatalf("no requirement for %s from %q", capability, limit)
	return Requirement{}
}

// TestTugRequirementsByHand checks the required carriage speed and tank
// depth of the Froude-scaled tug at three scales against hand values: the
// model speed is V_p/kL^1/2 (Froude scaling), and the depth Froude limit
// V/√(g h) ≤ 0.5 needs h ≥ V²/(0.25 g).
func TestTugRequirementsByHand(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	c := comboIn(t, strategy(t, res, "Froude scaling"), "Deepwater tank")
	speed := requirement(t, c, "carriage_speed_max", "carriage speed max")
	depth := requirement(t, c, "tank_depth", "depth Froude number")
	if !speed.AtLeast || !depth.AtLeast || !speed.Exact {
		t.Errorf("requirements should be minimum capabilities found exactly: %+v %+v", speed.AtLeast, depth.AtLeast)
	}
	vp := 12 * 1852.0 / 3600
	grid := res.Plan.Grid
	for _, i := range []int{0, len(grid) / 2, len(grid) - 1} {
		kL := grid[i]
		vm := vp / math.Sqrt(kL)
		if !relClose(speed.At(i), vm, 1e-9) {
			t.Errorf("kL %.4g: required carriage speed %v, want %v", kL, speed.At(i), vm)
		}
		if want := vm * vm / (0.25 * StandardGravity); !relClose(depth.At(i), want, 1e-9) {
			t.Errorf("kL %.4g: required depth %v, want %v", kL, depth.At(i), want)
		}
	}
}

// TestFacilityStopsFittingWhereInverted changes the carriage speed and
// checks that the scale where the tank stops fitting moves exactly as the
// inverted limit predicts: kL = (V_p / V_carriage)².
func TestFacilityStopsFittingWhereInverted(t *testing.T) {
	vp := 12 * 1852.0 / 3600
	for _, v := range []string{"2.2", "1.5"} {
		s := scenario(t, "tug")
		setCapability(s, "Deepwater tank", "carriage_speed_max", v)
		res := runStudy(t, s)
		c := comboIn(t, strategy(t, res, "Froude scaling"), "Deepwater tank")
		r := requirement(t, c, "carriage_speed_max", "carriage speed max")
		edges := r.FitEdges(res.Plan.Grid)
		var speed float64
		for _, f := range res.Plan.Facilities {
			if f.Name == "Deepwater tank" {
				speed = f.Caps["carriage_speed_max"]
			}
		}
		want := math.Pow(vp/speed, 2)
		if len(edges) != 1 || !relClose(edges[0], want, 1e-9) {
			t.Errorf("carriage %s m/s: stops fitting at %v, want kL %v", v, edges, want)
		}
		// The form gives the edge the grid's values give by
		// interpolation.
		stored := r
		stored.values = r.All()
		if e := stored.FitEdges(res.Plan.Grid); len(e) != 1 || !relClose(e[0], edges[0], 1e-9) {
			t.Errorf("carriage %s m/s: from the values %v, from the form %v", v, e, edges)
		}
	}
}

func TestAnyFacilityLargestModel(t *testing.T) {
	res := runStudy(t, scenario(t, "tug"))
	c := comboIn(t, strategy(t, res, "Froude scaling"), "Deepwater tank")
	// Without the tank the model is bounded only by the sweep range.
	if !relClose(c.AnyFacility, res.Plan.Grid[0], 1e-12) {
		t.Errorf("largest model for any facility at kL %v, want the sweep's %v", c.AnyFacility, res.Plan.Grid[0])
	}
}

// TestRunLengthRequirementExact checks the tank length the run-length
// limit needs, a sum solved exactly for the capability that stands alone
// on its side, against the hand value for Froude scaling (time and speed
// scale as kL^1/2, so V_m·T_m = V_p·T_p/kL): L_tank = (V_p·T_p + 3 L_p)/kL,
// 12 kn = 12·1852/3600 m/s (the international knot).
func TestRunLengthRequirementExact(t *testing.T) {
	res := runStudy(t, study.Synthetic(50, 0, 2, 1))
	c := comboIn(t, res.Strategies[0], "Deepwater tank")
	r := requirement(t, c, "tank_length", "run length")
	if !r.Exact || !r.AtLeast {
		t.Errorf("run length requirement: exact %v, at least %v; want both", r.Exact, r.AtLeast)
	}
	need := 12*1852.0/3600*60 + 3*28
	for i, kL := range res.Plan.Grid {
		if want := need / kL; !relClose(r.At(i), want, 1e-12) {
			t.Errorf("kL %.4g: tank length %v, want %v", kL, r.At(i), want)
		}
	}
}
