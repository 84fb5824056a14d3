package materials

import (
	"reflect"
	"strings"
	"testing"
)

func defaultLibrary(t *testing.T) *Library {
	t.Helper()
	l, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestSpecEntries checks that the library holds every entry spec §5 asks
// for, with the properties it names, each with a source.
func TestSpecEntries(t *testing.T) {
	l := defaultLibrary(t)
	solidProps := []string{"density", "modulus", "poisson", "strength"}
	want := map[string][]string{
		"water":          {"density", "kinematic_viscosity", "sound_speed", "surface_tension", "vapour_pressure", "viscosity"},
		"seawater":       {"density", "kinematic_viscosity", "sound_speed", "surface_tension", "vapour_pressure", "viscosity"},
		"air":            {"density", "kinematic_viscosity", "sound_speed", "viscosity"},
		"nitrogen":       {"density", "kinematic_viscosity", "sound_speed", "viscosity"},
		"helium":         {"density", "kinematic_viscosity", "sound_speed", "viscosity"},
		"carbon_dioxide": {"density", "kinematic_viscosity", "sound_speed", "viscosity"},
		"water_glycerol": {"density", "kinematic_viscosity", "viscosity"},
		"glycerol":       {"density", "kinematic_viscosity", "viscosity"},
		"brine":          {"density", "kinematic_viscosity", "viscosity"},
		"dry_dense_sand": {"cohesion", "density", "friction", "modulus", "permeability"},
		"dry_loose_sand": {"cohesion", "density", "friction", "modulus", "permeability"},
		"soft_clay":      {"cohesion", "consolidation_coefficient", "density", "friction", "modulus", "permeability"},
		"lab_kaolin":     {"cohesion", "consolidation_coefficient", "density", "friction", "modulus", "permeability"},
		"sea_ice":        solidProps,
		"freshwater_ice": solidProps,
		"model_ice":      solidProps,
	}
	for _, n := range []string{"structural_steel", "stainless_steel", "aluminium_6061_t6", "aluminium_5083",
		"brass", "copper", "titanium_ti6al4v", "lead", "pmma", "polycarbonate", "abs", "hdpe", "pvc",
		"nylon_66", "epoxy", "silicone_rubber", "natural_rubber", "balsa", "spruce", "plywood", "concrete",
		"micro_concrete", "gypsum_plaster", "rigid_pu_foam", "pvc_foam", "glass", "glass_fibre_laminate",
		"carbon_fibre_laminate"} {
		want[n] = solidProps
	}
	for _, g := range []string{"1", "5", "10", "50", "100", "1000"} {
		want["silicone_oil_"+g+"cst"] = []string{"density", "kinematic_viscosity", "surface_tension", "viscosity"}
	}
	for name, qs := range want {
		e, err := l.Lookup(name)
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		if got := e.Quantities(); !reflect.DeepEqual(got, qs) {
			t.Errorf("%s gives %v, want %v", name, got, qs)
		}
	}
	for _, e := range l.Entries() {
		props, err := e.At(Conditions{})
		if err != nil {
			t.Errorf("%s at default conditions: %v", e.Name, err)
		}
		for _, p := range props {
			if p.Source == "" {
				t.Errorf("%s %s has no source", e.Name, p.Quantity)
			}
		}
		if e.Description == "" {
			t.Errorf("%s has no description", e.Name)
		}
	}
}

func TestEntriesDeterministic(t *testing.T) {
	a, b := defaultLibrary(t), defaultLibrary(t)
	names := func(l *Library) []string {
		var out []string
		for _, e := range l.Entries() {
			out = append(out, string(e.Kind)+"/"+e.Name)
		}
		return out
	}
	first := names(a)
	for i := 0; i < 20; i++ {
		if got := names(a); !reflect.DeepEqual(got, first) {
			t.Fatalf("Entries order changed between calls")
		}
	}
	if !reflect.DeepEqual(names(b), first) {
		t.Fatalf("two Default libraries list differently")
	}
	// by kind (solid, fluid, soil, ice) then name
	es := a.Entries()
	for i := 1; i < len(es); i++ {
		p, q := es[i-1], es[i]
		if p.Kind.rank() > q.Kind.rank() || (p.Kind == q.Kind && p.Name >= q.Name) {
			t.Errorf("out of order: %s/%s before %s/%s", p.Kind, p.Name, q.Kind, q.Name)
		}
	}
	if es[0].Kind != Solid || es[len(es)-1].Kind != Ice {
		t.Errorf("kinds not in listing order: first %s, last %s", es[0].Kind, es[len(es)-1].Kind)
	}
}

func TestLookup(t *testing.T) {
	l := defaultLibrary(t)
	for _, name := range []string{"water", "Water", "fresh water", "sea-water", "Structural Steel", "CO2"} {
		if _, err := l.Lookup(name); err != nil {
			t.Errorf("Lookup(%q): %v", name, err)
		}
	}
	cases := []struct{ in, want string }{
		{"watr", `unknown material or medium "watr" (did you mean water?)`},
		{"seawatr", "(did you mean seawater?)"},
		{"balza", "(did you mean balsa?)"},
		{"unobtainium", `unknown material or medium "unobtainium"`},
	}
	for _, c := range cases {
		_, err := l.Lookup(c.in)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Lookup(%q) = %v, want %q", c.in, err, c.want)
		}
	}
}

func TestRangeRefusals(t *testing.T) {
	l := defaultLibrary(t)
	cases := []struct{ entry, at, want string }{
		{"water", "500C", "water: temperature 500 °C is outside the valid range 0–40 °C"},
		{"water", "-5C", "outside the valid range 0–40 °C"},
		{"water", "20C,3bar", "water: does not depend on pressure; it takes temperature"},
		{"seawater", "20C,50g/kg", "seawater: salinity 50 g/kg is outside the valid range 0–40 g/kg"},
		{"air", "20C,50bar", "air: pressure 5 MPa is outside the valid range 1 kPa – 2 MPa"},
		{"air", "1000K", "air: temperature 726.85 °C is outside the valid range -20 to 120 °C"},
		{"water_glycerol", "120C,w=0.5", "water_glycerol: temperature 120 °C is outside the valid range 0–100 °C"},
		{"structural_steel", "20C", "structural_steel: its properties are fixed"},
		{"air", "20C,35g/kg", "air: does not depend on salinity"},
		{"glycerol", "w=0.6", "glycerol is pure glycerol; for a mixture name water_glycerol with w="},
		{"water", "35g/kg", "for salt water name seawater, or brine"},
		{"brine", "20C,S=300", "brine: salinity 300 g/kg is outside the valid range 0–260 g/kg"},
		{"silicone_oil_100cst", "120C", "outside the valid range 0–100 °C"},
	}
	for _, c := range cases {
		e, err := l.Lookup(c.entry)
		if err != nil {
			t.Fatal(err)
		}
		cond, err := ParseConditions(c.at)
		if err != nil {
			t.Fatalf("%s: %v", c.at, err)
		}
		_, err = e.At(cond)
		if err == nil || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%s at %s: %v, want one line containing %q", c.entry, c.at, err, c.want)
		}
	}
}

func TestTunableRanges(t *testing.T) {
	l := defaultLibrary(t)
	// Model ice: strength 10–100 kPa and modulus 20–300 MPa (data/ices.csv).
	ice, _ := l.Lookup("model_ice")
	s, err := ice.Property("strength", Conditions{})
	if err != nil {
		t.Fatal(err)
	}
	if s.Min != 10e3 || s.Max != 100e3 || !s.Tunable() {
		t.Errorf("model ice strength range %+v", s)
	}
	// Water viscosity through its temperature range 0–40 °C: the ends are
	// the IAPWS values at 40 °C and 0 °C (0.653 and 1.792 mPa·s, IAPWS
	// R12-08 at the Tanaka density; 0.5 % tolerance on these handbook
	// figures, from memory).
	w, _ := l.Lookup("water")
	mu, err := w.Property("viscosity", Conditions{}.With(Temperature, 293.15))
	if err != nil {
		t.Fatal(err)
	}
	if !nearRel(mu.Min, 0.653e-3, 0.005) || !nearRel(mu.Max, 1.792e-3, 0.005) {
		t.Errorf("water viscosity range %g–%g", mu.Min, mu.Max)
	}
	// Water density peaks near 4 °C inside the range.
	rho, _ := w.Property("density", Conditions{})
	if !near(rho.Max, 999.975, 1e-3) {
		t.Errorf("water density max %g, want the 4 °C maximum", rho.Max)
	}
	// Steel is fixed.
	st, _ := l.Lookup("structural_steel")
	if p, _ := st.Property("modulus", Conditions{}); p.Tunable() {
		t.Errorf("steel modulus should be fixed")
	}
}

func TestDerivedKinematicViscosity(t *testing.T) {
	l := defaultLibrary(t)
	for _, e := range l.Entries() {
		props, err := e.At(Conditions{})
		if err != nil {
			t.Fatal(err)
		}
		m := map[string]float64{}
		for _, p := range props {
			m[p.Quantity] = p.Value
		}
		rho, ok1 := m["density"]
		mu, ok2 := m["viscosity"]
		nu, ok3 := m["kinematic_viscosity"]
		if ok2 || ok3 {
			if !(ok1 && ok2 && ok3) || !nearRel(nu, mu/rho, 1e-12) {
				t.Errorf("%s: ν = %g, μ/ρ = %g", e.Name, nu, mu/rho)
			}
		}
	}
}

func TestPropertiesSorted(t *testing.T) {
	l := defaultLibrary(t)
	for _, e := range l.Entries() {
		props, _ := e.At(Conditions{})
		for i := 1; i < len(props); i++ {
			if props[i-1].Quantity >= props[i].Quantity {
				t.Errorf("%s: %s before %s", e.Name, props[i-1].Quantity, props[i].Quantity)
			}
		}
	}
}

func TestApplicable(t *testing.T) {
	l := defaultLibrary(t)
	c, _ := ParseConditions("15C,3bar,35g/kg")
	steel, _ := l.Lookup("structural_steel")
	if _, err := steel.At(steel.Applicable(c)); err != nil {
		t.Errorf("steel at applicable conditions: %v", err)
	}
	sea, _ := l.Lookup("seawater")
	got := sea.Applicable(c)
	if got.HasPressure || !got.HasTemperature || !got.HasSalinity {
		t.Errorf("seawater applicable conditions: %+v", got)
	}
	hot, _ := ParseConditions("60C")
	if _, err := sea.At(sea.Applicable(hot)); err == nil {
		t.Errorf("seawater at 60 °C should still be refused")
	}
}
