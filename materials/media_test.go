package materials

import (
	"math"
	"strings"
	"testing"
)

func TestBrineAgainstCRC(t *testing.T) {
	// Source: CRC Handbook of Chemistry and Physics, "Concentrative
	// properties of aqueous solutions", sodium chloride at 20 °C (mass %,
	// density g/cm³, viscosity mPa·s; values from memory). Laliberté's
	// models are fitted to such data: density within 0.1 %, viscosity
	// within 1.5 %.
	table := []struct{ pct, rho, mu float64 }{
		{1, 1.0053, 1.020},
		{5, 1.0340, 1.090},
		{10, 1.0707, 1.193},
		{20, 1.1478, 1.557},
		{26, 1.1972, 1.990},
	}
	l := defaultLibrary(t)
	b, err := l.Lookup("brine")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range table {
		at := Conditions{}.With(Temperature, 293.15).With(Salinity, c.pct/100)
		rho, err := b.Property("density", at)
		if err != nil {
			t.Fatal(err)
		}
		mu, _ := b.Property("viscosity", at)
		if !nearRel(rho.Value, c.rho*1000, 0.001) {
			t.Errorf("brine %g %% at 20 °C: density %.2f, want %.1f", c.pct, rho.Value, c.rho*1000)
		}
		if !nearRel(mu.Value, c.mu*1e-3, 0.015) {
			t.Errorf("brine %g %% at 20 °C: viscosity %.4g, want %.4g", c.pct, mu.Value, c.mu*1e-3)
		}
	}
	// Pure water limit: Kell's density 998.20 kg/m³ at 20 °C (Kell 1975,
	// J. Chem. Eng. Data 20:97) and 1.002 mPa·s (IAPWS R12-08 gives 1.0016).
	if got := brineDensity(20, 0); !near(got, 998.20, 0.01) {
		t.Errorf("brine at S = 0: %.3f kg/m³", got)
	}
	if got := brineViscosity(20, 0); !nearRel(got, 1.0016e-3, 0.002) {
		t.Errorf("brine viscosity at S = 0: %.5g", got)
	}
}

func TestSiliconeOilOverTemperature(t *testing.T) {
	l := defaultLibrary(t)
	// The grade is the kinematic viscosity at 25 °C (how the oils are
	// sold); the viscosity–temperature coefficient VTC = 1 − ν(210 °F)/ν(100
	// °F) is about 0.60 for the 100 cSt grade (manufacturer data sheets for
	// PDMS fluids, from memory), and viscosity falls with temperature.
	oil, err := l.Lookup("silicone oil 100 cSt")
	if err != nil {
		t.Fatal(err)
	}
	nu := func(celsius float64) float64 {
		p, err := oil.Property("kinematic_viscosity", Conditions{}.With(Temperature, 273.15+celsius))
		if err != nil {
			t.Fatal(err)
		}
		return p.Value
	}
	if got := nu(25); !nearRel(got, 100e-6, 1e-9) {
		t.Errorf("100 cSt grade at 25 °C: %g", got)
	}
	if vtc := 1 - nu((210-32)/1.8)/nu((100-32)/1.8); !near(vtc, 0.60, 0.005) {
		t.Errorf("VTC of the 100 cSt grade %.3f, want 0.60", vtc)
	}
	if !(nu(10) > nu(25) && nu(25) > nu(60)) {
		t.Errorf("viscosity should fall with temperature")
	}
	// Default conditions are the grade's 25 °C, shown in the conditions.
	rc, _ := oil.Resolve(Conditions{})
	if got := rc.String(); got != "25 °C" {
		t.Errorf("silicone oil default conditions %q", got)
	}
	// The 1 cSt grade is kept below its flash point.
	one, _ := l.Lookup("silicone_oil_1cst")
	if _, err := one.At(Conditions{}.With(Temperature, 333.15)); err == nil {
		t.Errorf("1 cSt oil at 60 °C should be refused")
	}
}

func TestMixtureDefaultIsVisible(t *testing.T) {
	l := defaultLibrary(t)
	cases := []struct {
		name, at, note, resolved string
	}{
		{"water_glycerol", "20C", "w = 0.5 by default: give w= for another mixture", "20 °C, w = 0.5"},
		{"water_glycerol", "w=0.6", "", "20 °C, w = 0.6"},
		{"brine", "", "35 g/kg by default: give S= for another mixture", "20 °C, 35 g/kg"},
		{"glycerol", "", "", "20 °C"},
		{"water", "", "", "20 °C"},
	}
	for _, c := range cases {
		e, err := l.Lookup(c.name)
		if err != nil {
			t.Fatal(err)
		}
		cond, _ := ParseConditions(c.at)
		if got := e.DefaultNote(cond); got != c.note {
			t.Errorf("%s at %q: note %q, want %q", c.name, c.at, got, c.note)
		}
		rc, err := e.Resolve(cond)
		if err != nil {
			t.Fatal(err)
		}
		if rc.String() != c.resolved {
			t.Errorf("%s at %q resolves to %q, want %q", c.name, c.at, rc, c.resolved)
		}
	}
}

func TestNamesPeopleType(t *testing.T) {
	l := defaultLibrary(t)
	resolve := []struct{ in, want string }{
		{"acrylic", "pmma"}, {"Perspex", "pmma"}, {"plexiglas", "pmma"}, {"Plexiglass", "pmma"},
		{"glycerine", "glycerol"}, {"glycerol", "glycerol"}, {"Glycerin", "glycerol"},
		{"glycerol-water", "water_glycerol"}, {"water glycerine", "water_glycerol"},
		{"lake ice", "freshwater_ice"}, {"fresh water", "water"}, {"freshwater", "water"},
		{"silicone oil 100 cSt", "silicone_oil_100cst"}, {"silicone_oil_100cst", "silicone_oil_100cst"},
		{"PDMS 10 cSt", "silicone_oil_10cst"}, {"silicone oil 1000", "silicone_oil_1000cst"},
		{"mild steel", "structural_steel"}, {"stainless", "stainless_steel"},
		{"aluminum 6061", "aluminium_6061_t6"}, {"kaolin", "lab_kaolin"}, {"plaster of Paris", "gypsum_plaster"},
		{"NaCl solution", "brine"}, {"sea water", "seawater"}, {"CO2", "carbon_dioxide"},
	}
	for _, c := range resolve {
		e, err := l.Lookup(c.in)
		if err != nil || e.Name != c.want {
			t.Errorf("Lookup(%q) = %q, %v; want %s", c.in, e.Name, err, c.want)
		}
	}
	refuse := []struct {
		in   string
		want []string // in the message
		not  []string // never in the message
	}{
		{"steel", []string{"names several entries", "structural_steel", "stainless_steel"}, nil},
		{"aluminum", []string{"aluminium_6061_t6", "aluminium_5083"}, nil},
		{"aluminium", []string{"aluminium_6061_t6", "aluminium_5083"}, nil},
		{"sand", []string{"dry_dense_sand", "dry_loose_sand"}, nil},
		{"clay", []string{"soft_clay", "lab_kaolin"}, nil},
		{"ice", []string{"sea_ice", "freshwater_ice", "model_ice"}, nil},
		{"oil", []string{"silicone_oil_1cst", "silicone_oil_1000cst", "silicone oils"}, []string{"air"}},
		{"mineral oil", []string{"silicone_oil_100cst"}, []string{"air"}},
		{"plaster", []string{"gypsum_plaster"}, []string{"water"}},
		{"salt water", []string{"seawater", "brine"}, nil},
		{"titanium", []string{"titanium_ti6al4v", "not pure titanium"}, nil},
		{"silicone oil 20 cSt", []string{"no 20 cSt grade", "silicone_oil_100cst"}, nil},
		{"oil 100 cSt", []string{"did you mean silicone_oil_100cst"}, nil},
		{"watr", []string{"did you mean water?"}, nil},
		{"balza", []string{"did you mean balsa?"}, nil},
		{"lard", []string{`unknown material or medium "lard"`}, []string{"lead", "did you mean"}},
		{"unobtainium", []string{`unknown material or medium "unobtainium"`}, []string{"did you mean"}},
	}
	for _, c := range refuse {
		_, err := l.Lookup(c.in)
		if err == nil {
			t.Errorf("Lookup(%q) resolved; want a refusal", c.in)
			continue
		}
		msg := err.Error()
		for _, w := range c.want {
			if !strings.Contains(msg, w) {
				t.Errorf("Lookup(%q) = %q, want it to contain %q", c.in, msg, w)
			}
		}
		for _, w := range c.not {
			if strings.Contains(msg, w) {
				t.Errorf("Lookup(%q) = %q, must not contain %q", c.in, msg, w)
			}
		}
	}
}

func TestSalinityWrittenAsFraction(t *testing.T) {
	l := defaultLibrary(t)
	sea, _ := l.Lookup("seawater")
	cases := []struct {
		at   string
		want float64 // kg/kg; 0: refused
		msg  string
	}{
		{"S=35", 0.035, ""},
		{"S=3.5%", 0.035, ""},
		{"S=0.035kg/kg", 0.035, ""},
		{"35g/kg", 0.035, ""},
		{"S=0.035", 0, "S=3.5% or S=35g/kg"},
		{"0.035", 0, "a bare number is ambiguous"},
		{"3.5%", 0, "write its salinity as S=3.5% or 35g/kg"},
	}
	for _, c := range cases {
		cond, err := ParseConditions(c.at)
		if err == nil {
			_, err = sea.At(cond)
		}
		if c.want == 0 {
			if err == nil || !strings.Contains(err.Error(), c.msg) {
				t.Errorf("seawater at %q: %v, want a refusal containing %q", c.at, err, c.msg)
			}
			continue
		}
		if err != nil {
			t.Errorf("seawater at %q: %v", c.at, err)
			continue
		}
		if v, _ := cond.Get(Salinity); math.Abs(v-c.want) > 1e-12 {
			t.Errorf("seawater at %q: salinity %g, want %g", c.at, v, c.want)
		}
	}
	if _, err := ParseConditions("w=50"); err == nil || !strings.Contains(err.Error(), "w=0.5 or w=50%") {
		t.Errorf("w=50: %v", err)
	}
}
