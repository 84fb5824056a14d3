package materials

import "testing"

// Soil permeability, consolidation coefficient and stiffness (library,
// second edition). The values are typical handbook values, from memory;
// these tests check them against the published relations and classes
// they must obey.
func TestSoilDrainageProperties(t *testing.T) {
	l := defaultLibrary(t)
	get := func(name, q string) float64 {
		t.Helper()
		e, err := l.Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		props, err := e.At(Conditions{})
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range props {
			if p.Quantity == q {
				return p.Value
			}
		}
		t.Fatalf("%s has no %s", name, q)
		return 0
	}
	// Terzaghi's definition of the coefficient of consolidation
	// (Terzaghi 1943, Theoretical Soil Mechanics; any soil-mechanics text):
	// c_v = k·M/γ_w with the constrained modulus M = E(1−ν)/((1+ν)(1−2ν)),
	// here with ν = 0.3 (M = 1.346 E) and γ_w = 9810 N/m³. The library's
	// k, E and c_v of each clay must agree within a factor of 2.
	for _, name := range []string{"soft_clay", "lab_kaolin"} {
		k, E, cv := get(name, "permeability"), get(name, "modulus"), get(name, "consolidation_coefficient")
		nu := 0.3
		M := E * (1 - nu) / ((1 + nu) * (1 - 2*nu))
		implied := k * M / 9810
		if r := cv / implied; r < 0.5 || r > 2 {
			t.Errorf("%s: c_v %.3g m²/s but k·M/γ_w = %.3g m²/s (ratio %.2f)", name, cv, implied, r)
		}
	}
	// Permeability classes of the classic chart (Terzaghi & Peck, Soil
	// Mechanics in Engineering Practice; from memory): clean sands
	// 1e-5–1e-2 m/s, clays below 1e-8 m/s.
	for _, c := range []struct {
		name   string
		lo, hi float64
	}{{"dry_dense_sand", 1e-5, 1e-2}, {"dry_loose_sand", 1e-5, 1e-2}, {"soft_clay", 1e-12, 1e-8}, {"lab_kaolin", 1e-12, 1e-8}} {
		if k := get(c.name, "permeability"); k < c.lo || k > c.hi {
			t.Errorf("%s: permeability %g m/s outside %g–%g", c.name, k, c.lo, c.hi)
		}
	}
	// Sand is stiffer and drains far faster than clay.
	if get("dry_dense_sand", "modulus") <= get("soft_clay", "modulus") {
		t.Error("dense sand must be stiffer than soft clay")
	}
}
