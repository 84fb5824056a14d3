package materials

import "testing"

func TestISO2533SeaLevel(t *testing.T) {
	// Source: ISO 2533:1975 Standard Atmosphere, sea-level values at
	// 288.15 K and 101325 Pa: ρ = 1.2250 kg/m^3, μ = 1.7894e-5 Pa·s,
	// a = 340.294 m/s (tolerance: the last printed digit).
	l, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	e, err := l.Lookup("air")
	if err != nil {
		t.Fatal(err)
	}
	c, err := ParseConditions("288.15K,101325Pa")
	if err != nil {
		t.Fatal(err)
	}
	props, err := e.At(c)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]struct{ v, tol float64 }{
		"density":     {1.2250, 0.00005},
		"viscosity":   {1.7894e-5, 0.00005e-5},
		"sound_speed": {340.294, 0.0005},
	}
	for _, p := range props {
		if w, ok := want[p.Quantity]; ok {
			if !near(p.Value, w.v, w.tol) {
				t.Errorf("ISO 2533 sea level %s = %.7g, want %g", p.Quantity, p.Value, w.v)
			}
			delete(want, p.Quantity)
		}
	}
	if len(want) != 0 {
		t.Errorf("air lacks %v", want)
	}
}

func TestGasViscosities(t *testing.T) {
	// Source: viscosities at 300 K and 1 bar of about 17.9 µPa·s
	// (nitrogen), 19.9 µPa·s (helium) and 15.0 µPa·s (carbon dioxide)
	// (typical handbook values, from memory); 2 % tolerance, the usual
	// accuracy of Sutherland's law over a moderate range.
	cases := []struct {
		g    gas
		name string
		mu   float64
	}{
		{nitrogenGas(), "nitrogen", 17.9e-6},
		{heliumGas(), "helium", 19.9e-6},
		{carbonDioxideGas(), "carbon dioxide", 15.0e-6},
	}
	for _, c := range cases {
		if got := c.g.viscosity(300); !nearRel(got, c.mu, 0.02) {
			t.Errorf("%s at 300 K: %.4g Pa·s, want about %.3g", c.name, got, c.mu)
		}
	}
}

func TestPressurisedAirDensityRange(t *testing.T) {
	// The density of air is a tunable property through the tunnel pressure
	// (1 kPa – 2 MPa): its range is p/(RT) at the ends, and viscosity does
	// not depend on pressure (ideal gas and Sutherland's law).
	l, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	e, _ := l.Lookup("air")
	c, _ := ParseConditions("20C,5bar")
	rho, err := e.Property("density", c)
	if err != nil {
		t.Fatal(err)
	}
	T := 293.15
	if !nearRel(rho.Value, 5e5/(287.05287*T), 1e-12) || !nearRel(rho.Min, 1e3/(287.05287*T), 1e-12) || !nearRel(rho.Max, 2e6/(287.05287*T), 1e-12) {
		t.Errorf("air density at 5 bar: %+v", rho)
	}
	mu, _ := e.Property("viscosity", c)
	if mu.Tunable() {
		t.Errorf("air viscosity should not be tunable by pressure: %+v", mu)
	}
}
