package materials

import "testing"

func TestChengGlycerolViscosity(t *testing.T) {
	// Source: the tables Cheng (2008, Ind. Eng. Chem. Res. 47:3285) fits
	// (Segur & Oberstar 1951, as quoted there): pure glycerol about 1410
	// mPa·s and 50 % by mass about 6.0 mPa·s at 20 °C. Tolerance 1 %, below
	// Cheng's reported scatter against those data.
	cases := []struct{ w, mu float64 }{
		{1, 1410e-3},
		{0.5, 6.0e-3},
	}
	for _, c := range cases {
		if got := glycerolViscosity(20, c.w); !nearRel(got, c.mu, 0.01) {
			t.Errorf("Cheng viscosity at 20 °C, w = %g: %.4g Pa·s, want about %g", c.w, got, c.mu)
		}
	}
	// Pure water limit: Cheng's μw at 20 °C, about 1.002 mPa·s (IAPWS gives
	// 1.0016; 0.5 %).
	if got := glycerolViscosity(20, 0); !nearRel(got, 1.0016e-3, 0.005) {
		t.Errorf("Cheng viscosity of water at 20 °C: %.4g Pa·s", got)
	}
}

func TestGlycerolDensity(t *testing.T) {
	// Source: density of glycerol 1261 kg/m^3 and of 50 % glycerol by mass
	// 1126 kg/m^3 at 20 °C (Glycerine Producers' Association tables,
	// typical handbook values, from memory). Pure glycerol within 0.5 %;
	// the mixture within 1.5 %, since ideal mixing leaves out the volume
	// contraction (about 1 %).
	if got := glycerolDensity(20, 1); !nearRel(got, 1261, 0.005) {
		t.Errorf("glycerol density at 20 °C: %.1f", got)
	}
	if got := glycerolDensity(20, 0.5); !nearRel(got, 1126, 0.015) {
		t.Errorf("50 %% glycerol density at 20 °C: %.1f", got)
	}
}
