package materials

import "testing"

// TestITTCWaterTable compares fresh water and seawater with the ITTC
// Recommended Procedure 7.5-02-01-03 (2011), Fresh Water and Seawater
// Properties, which tabulates density and kinematic viscosity at 0.101325
// MPa, seawater at the standard absolute salinity 35.16504 g/kg.
//
// Tolerances: the ITTC fresh-water columns come from the IAPWS
// formulations themselves, so fresh water must agree to the table's
// rounding (1e-3 kg/m^3 in density, 1e-4 relative in ν: five digits).
// Seawater is by the Sharqawy et al. 2010 correlations, whose stated
// accuracy is ±0.1 % in density and ±1.5 % in viscosity; those are the
// tolerances.
func TestITTCWaterTable(t *testing.T) {
	l, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	const s = 35.16504e-3
	cases := []struct {
		entry      string
		tc, sal    float64
		rho, nu    float64
		rhoTol     float64 // absolute, kg/m^3
		nuRel      float64
		tableEntry string
	}{
		{"water", 15, 0, 999.1026, 1.1386e-6, 1e-3, 1e-4, "ITTC 7.5-02-01-03 (2011) fresh water, 15 °C"},
		{"water", 20, 0, 998.2067, 1.0034e-6, 1e-3, 1e-4, "ITTC 7.5-02-01-03 (2011) fresh water, 20 °C"},
		{"seawater", 15, s, 1026.0210, 1.1892e-6, 1.026, 0.015, "ITTC 7.5-02-01-03 (2011) seawater, 15 °C"},
		{"seawater", 20, s, 1024.8103, 1.0508e-6, 1.025, 0.015, "ITTC 7.5-02-01-03 (2011) seawater, 20 °C"},
	}
	for _, c := range cases {
		e, err := l.Lookup(c.entry)
		if err != nil {
			t.Fatal(err)
		}
		cond := Conditions{}.With(Temperature, c.tc+273.15)
		if c.entry == "seawater" {
			cond = cond.With(Salinity, c.sal)
		}
		rho, err := e.Property("density", cond)
		if err != nil {
			t.Fatal(err)
		}
		nu, err := e.Property("kinematic_viscosity", cond)
		if err != nil {
			t.Fatal(err)
		}
		if !near(rho.Value, c.rho, c.rhoTol) {
			t.Errorf("%s: density %.4f kg/m^3, table %.4f", c.tableEntry, rho.Value, c.rho)
		}
		if !nearRel(nu.Value, c.nu, c.nuRel) {
			t.Errorf("%s: kinematic viscosity %.5e m^2/s, table %.4e", c.tableEntry, nu.Value, c.nu)
		}
	}
}
