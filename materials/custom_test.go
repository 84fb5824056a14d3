package materials

import (
	"strings"
	"testing"
)

func TestAddValidation(t *testing.T) {
	ok := []CustomProperty{{Quantity: "density", Value: "40", Unit: "kg/m^3"}}
	with := func(p ...CustomProperty) []CustomProperty { return append(append([]CustomProperty(nil), ok...), p...) }
	cases := []struct {
		name string
		e    CustomEntry
		want string
	}{
		{"poisson", CustomEntry{Name: "my foam", Kind: "solid", Properties: with(CustomProperty{Quantity: "poisson", Value: "0.7"})},
			`material "my foam": poisson 0.7 is outside 0–0.5`},
		{"density zero", CustomEntry{Name: "void", Kind: "solid", Properties: []CustomProperty{{Quantity: "density", Value: "0"}}},
			`material "void": density 0 kg/m^3 is not positive`},
		{"modulus negative", CustomEntry{Name: "m", Kind: "solid", Properties: with(CustomProperty{Quantity: "modulus", Value: "-1", Unit: "GPa"})},
			`material "m": modulus -1e+09 Pa is not positive`},
		{"unit", CustomEntry{Name: "u", Kind: "solid", Properties: []CustomProperty{{Quantity: "density", Value: "40", Unit: "kg"}}},
			`material "u": density: unit "kg" does not fit (needs M L^-3, got M)`},
		{"bad unit", CustomEntry{Name: "u", Kind: "solid", Properties: []CustomProperty{{Quantity: "modulus", Value: "4", Unit: "Gpa"}}},
			`material "u": modulus: unit "Gpa"`},
		{"unknown quantity", CustomEntry{Name: "q", Kind: "solid", Properties: []CustomProperty{{Quantity: "densty", Value: "40"}}},
			`material "q": unknown quantity "densty" (did you mean density?)`},
		{"not a property", CustomEntry{Name: "q", Kind: "solid", Properties: []CustomProperty{{Quantity: "velocity", Value: "4"}}},
			`material "q": "velocity" is not a material property`},
		{"kind", CustomEntry{Name: "k", Kind: "metal", Properties: ok},
			`material "k": kind "metal" is not one of solid, fluid, soil, ice`},
		{"no kind", CustomEntry{Name: "k", Properties: ok}, `material "k": no kind given`},
		{"unit twice", CustomEntry{Name: "t", Kind: "solid", Properties: []CustomProperty{{Quantity: "density", Value: "40 kg/m^3", Unit: "kg/m^3"}}},
			`material "t": density: unit`},
		{"decimal comma", CustomEntry{Name: "c", Kind: "solid", Properties: []CustomProperty{{Quantity: "density", Value: "0,5", Unit: "g/cm^3"}}},
			`material "c": density: value "0,5 g/cm^3": write the decimal separator as a point`},
		{"half range", CustomEntry{Name: "h", Kind: "ice", Properties: with(CustomProperty{Quantity: "strength", Value: "50", Min: "10", Unit: "kPa"})},
			`material "h": strength: give both min and max`},
		{"no name", CustomEntry{Kind: "solid", Properties: ok}, "a custom material needs a name"},
		{"no properties", CustomEntry{Name: "e", Kind: "solid"}, `material "e": no properties given`},
		{"twice", CustomEntry{Name: "d", Kind: "solid", Properties: with(ok[0])}, `material "d": density is given twice`},
		{"range", CustomEntry{Name: "r", Kind: "ice", Properties: with(CustomProperty{Quantity: "strength", Value: "5", Min: "10", Max: "100", Unit: "kPa"})},
			`material "r": strength 5000 is outside its range 10000–100000 Pa`},
		{"empty range", CustomEntry{Name: "r", Kind: "ice", Properties: with(CustomProperty{Quantity: "strength", Value: "50", Min: "100", Max: "10", Unit: "kPa"})},
			`material "r": strength range 100000–10000 Pa is empty`},
		{"inconsistent", CustomEntry{Name: "oil", Kind: "fluid", Properties: with(
			CustomProperty{Quantity: "viscosity", Value: "1", Unit: "Pa*s"},
			CustomProperty{Quantity: "kinematic_viscosity", Value: "1", Unit: "cSt"})},
			`material "oil": kinematic_viscosity 1e-06 m^2/s disagrees with viscosity/density`},
	}
	for _, c := range cases {
		l := New()
		err := l.Add(c.e)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%s: Add = %v, want %q", c.name, err, c.want)
		}
		if len(l.Entries()) != 0 {
			t.Errorf("%s: a refused entry was added", c.name)
		}
	}
}

func TestAddCustomAndOverride(t *testing.T) {
	l := defaultLibrary(t)
	foam := CustomEntry{Name: "My Foam", Kind: "solid", Description: "the study's own foam", Properties: []CustomProperty{
		{Quantity: "density", Value: "0.04", Unit: "g/cm^3", Source: "supplier sheet"},
		{Quantity: "modulus", Value: "12", Unit: "MPa"},
		{Quantity: "poisson", Value: "0.3", Unit: "1"},
		{Quantity: "strength", Value: "0.2 MPa"},
	}}
	if err := l.Add(foam); err != nil {
		t.Fatal(err)
	}
	e, err := l.Lookup("my foam")
	if err != nil {
		t.Fatal(err)
	}
	props, err := e.At(Conditions{})
	if err != nil {
		t.Fatal(err)
	}
	if !e.Custom || len(props) != 4 || props[0].Quantity != "density" || !nearRel(props[0].Value, 40, 1e-12) ||
		props[0].Source != "supplier sheet" || props[1].Source != "study input" || !nearRel(props[1].Value, 12e6, 1e-12) {
		t.Errorf("custom entry %+v: %+v", e, props)
	}
	// Overriding a library entry by name.
	if !l.Has("Concrete") {
		t.Fatal("concrete missing")
	}
	mix := CustomEntry{Name: "concrete", Kind: "solid", Properties: []CustomProperty{
		{Quantity: "density", Value: "2300", Unit: "kg/m^3"}, {Quantity: "modulus", Value: "28", Unit: "GPa"},
	}}
	if err := l.Add(mix); err != nil {
		t.Fatal(err)
	}
	c, _ := l.Lookup("concrete")
	if p, _ := c.Property("modulus", Conditions{}); p.Value != 28e9 || !c.Custom {
		t.Errorf("override not applied: %+v", p)
	}
	if _, err := c.Property("strength", Conditions{}); err == nil {
		t.Errorf("the override should replace the whole entry")
	}
	// The default library is untouched: a fresh one still has the data value.
	d := defaultLibrary(t)
	orig, _ := d.Lookup("concrete")
	if p, _ := orig.Property("modulus", Conditions{}); p.Value != 33e9 {
		t.Errorf("a fresh library should not see another's override: %g", p.Value)
	}
}
