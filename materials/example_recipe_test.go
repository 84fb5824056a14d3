package materials_test

import (
	"fmt"

	"scaleplan/materials"
)

// A water–glycerol mixture of 10 cSt for a tank held at 20 °C: the recipe
// keeps the temperature and names the glycerol mass fraction.
func ExampleEntry_Recipe() {
	lib, err := materials.Default()
	if err != nil {
		fmt.Println(err)
		return
	}
	e, err := lib.Lookup("water_glycerol")
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := e.Recipe(materials.RecipeSpec{
		Target:    materials.Target{Quantity: "kinematic_viscosity", Value: 1e-5},
		Tolerance: 0.01,
		At:        materials.Conditions{}.With(materials.Temperature, 293.15),
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	w, _ := r.Conditions.Get(materials.MassFraction)
	fmt.Printf("met: %v, w = %.3f at %s, within 1e-6: %v\n", r.Met, w, materials.FormatCondition(materials.Temperature, r.Conditions.Temperature), r.Reached() < 1e-6)
	// Output:
	// met: true, w = 0.609 at 20 °C, within 1e-6: true
}

// A Reynolds-matched model fluid of 3e-8 m²/s: no liquid of the library
// can be brought there, and the least viscous one it can make says how far
// off it is.
func ExampleLibrary_FindRecipes() {
	lib, err := materials.Default()
	if err != nil {
		fmt.Println(err)
		return
	}
	spec := materials.RecipeSpec{
		Target:    materials.Target{Quantity: "kinematic_viscosity", Value: 3e-8},
		Tolerance: 0.05,
		At:        materials.Conditions{}.With(materials.Temperature, 288.15),
	}
	found := lib.FindRecipes(spec, materials.Liquids)
	fmt.Printf("recipes: %d\n", len(found.Met))
	least, err := lib.Extreme("kinematic_viscosity", true, nil, materials.Liquids)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("least viscous liquid: %s at %s, %.2g m²/s\n", least.Entry, least.Conditions, least.Target.Value)
	// Output:
	// recipes: 0
	// least viscous liquid: brine at 100 °C, 0 g/kg, 2.9e-07 m²/s
}
