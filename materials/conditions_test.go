package materials

import (
	"strings"
	"testing"
)

func TestParseConditions(t *testing.T) {
	cases := []struct {
		in   string
		want Conditions
	}{
		{"", Conditions{}},
		{"20C", Conditions{}.With(Temperature, 293.15)},
		{"288.15K,101325Pa", Conditions{}.With(Temperature, 288.15).With(Pressure, 101325)},
		{"15C,35g/kg", Conditions{}.With(Temperature, 288.15).With(Salinity, 0.035)},
		{"3bar", Conditions{}.With(Pressure, 3e5)},
		{"50%", Conditions{}.With(MassFraction, 0.5)},
		{"35‰", Conditions{}.With(Salinity, 0.035)},
		{"T=20C; p=1atm", Conditions{}.With(Temperature, 293.15).With(Pressure, 101325)},
		{"S=35", Conditions{}.With(Salinity, 0.035)},
		{"w=0.5, 25 °C", Conditions{}.With(MassFraction, 0.5).With(Temperature, 298.15)},
		{"glycerol=60%", Conditions{}.With(MassFraction, 0.6)},
	}
	for _, c := range cases {
		got, err := ParseConditions(c.in)
		if err != nil {
			t.Errorf("ParseConditions(%q): %v", c.in, err)
			continue
		}
		for _, k := range AllConditions() {
			gv, gok := got.Get(k)
			wv, wok := c.want.Get(k)
			if gok != wok || !nearRel(gv, wv, 1e-12) {
				t.Errorf("ParseConditions(%q) %s = %v,%v want %v,%v", c.in, k, gv, gok, wv, wok)
			}
		}
	}
}

func TestParseConditionsErrors(t *testing.T) {
	cases := []struct{ in, want string }{
		{"-3bar", "not positive (give the absolute pressure)"},
		{"20", "a bare number is ambiguous"},
		{"20C,25C", "temperature is given twice"},
		{"3 m/s", "is not a condition"},
		{"0.5", "ambiguous"},
		{"x=3", `unknown condition "x"`},
		{"T=20", "give the temperature with its unit"},
		{"p=3", "give the absolute pressure with its unit"},
		{"-300C", "not above absolute zero"},
		{"w=1.5", "mass fraction 1.5 is outside 0–1"},
		{"20C,,3bar", "empty part"},
		{"3 furlongs", "unknown symbol"},
		{"S=3bar", "salinity is dimensionless"},
	}
	for _, c := range cases {
		_, err := ParseConditions(c.in)
		if err == nil {
			t.Errorf("ParseConditions(%q): no error, want %q", c.in, c.want)
			continue
		}
		if !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("ParseConditions(%q) = %q, want one line containing %q", c.in, err, c.want)
		}
	}
}

func TestConditionsString(t *testing.T) {
	c, err := ParseConditions("15C,35g/kg,3bar,w=0.25")
	if err != nil {
		t.Fatal(err)
	}
	if got, want := c.String(), "15 °C, 300 kPa, 35 g/kg, w = 0.25"; got != want {
		t.Errorf("String() = %q, want %q", got, want)
	}
}
