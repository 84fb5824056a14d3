package materials

import "testing"

func TestIF97SaturationPressure(t *testing.T) {
	// Source: IAPWS-IF97 (2007 revision), Table 35, computer-program
	// verification values of the saturation-pressure equation (MPa, 9
	// significant digits).
	cases := []struct{ T, pMPa float64 }{
		{300, 0.353658941e-2},
		{500, 0.263889776e1},
		{600, 0.123443146e2},
	}
	for _, c := range cases {
		if got := waterVapourPressure(c.T) / 1e6; !nearRel(got, c.pMPa, 1e-8) {
			t.Errorf("p_sat(%g K) = %.9e MPa, want %.9e", c.T, got, c.pMPa)
		}
	}
	// Steam-table values at round temperatures (e.g. the IAPWS-95 based
	// tables of Wagner & Pruß 2002; 4 significant digits, from memory):
	// 20 °C 2.339 kPa, 100 °C 101.42 kPa.
	for _, c := range []struct{ tc, p, tol float64 }{{20, 2339, 1}, {100, 101418, 10}} {
		if got := waterVapourPressure(c.tc + 273.15); !near(got, c.p, c.tol) {
			t.Errorf("p_sat(%g °C) = %.1f Pa, want %.0f", c.tc, got, c.p)
		}
	}
}

func TestSeawaterVapourPressure(t *testing.T) {
	// Source: Sharqawy et al. 2010, Raoult-law correlation (coefficient
	// from memory, not checked against the paper)
	// p_v,sw/p_v,w = 1/(1 + 0.57357·S/(1000 − S)); hand computation at
	// S = 35 g/kg: 1/(1 + 0.57357·35/965) = 0.979622. Seawater's vapour
	// pressure is about 2 % below that of pure water (common
	// oceanographic knowledge).
	for _, tc := range []float64{10, 20, 30} {
		ratio := seawaterVapourPressure(tc, 0.035) / waterVapourPressure(tc+273.15)
		if !nearRel(ratio, 0.979622, 2e-6) {
			t.Errorf("ratio at %g °C = %.6f, want 0.979622", tc, ratio)
		}
	}
	if got, want := seawaterVapourPressure(20, 0), waterVapourPressure(293.15); got != want {
		t.Errorf("fresh limit %v, want %v", got, want)
	}
}

func TestMackenzieSoundSpeed(t *testing.T) {
	// Source: Mackenzie 1981, J. Acoust. Soc. Am. 70:807, check value
	// 1550.744 m/s at 25 °C, 35 g/kg, 1000 m; and the check value of the
	// MBARI implementation of the same equation, 1718.774 m/s at 40 °C,
	// 40 g/kg, 10 000 m (outside the fitted range, a check of the terms).
	cases := []struct{ t, S, D, c float64 }{
		{25, 0.035, 1000, 1550.744},
		{40, 0.040, 10000, 1718.774},
	}
	for _, c := range cases {
		if got := seawaterSoundSpeed(c.t, c.S, c.D); !near(got, c.c, 5e-4) {
			t.Errorf("c(%g °C, %g, %g m) = %.4f m/s, want %.3f", c.t, c.S, c.D, got, c.c)
		}
	}
}
