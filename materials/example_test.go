package materials_test

import (
	"fmt"

	"scaleplan/materials"
)

// Fresh water at 20 °C, and the seawater of a towing tank at 15 °C.
func Example() {
	lib, err := materials.Default()
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, q := range []struct{ name, at string }{{"water", "20C"}, {"seawater", "15C,35g/kg"}} {
		e, err := lib.Lookup(q.name)
		if err != nil {
			fmt.Println(err)
			return
		}
		c, err := materials.ParseConditions(q.at)
		if err != nil {
			fmt.Println(err)
			return
		}
		props, err := e.At(c)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%s at %s:\n", e.Name, c)
		for _, p := range props {
			fmt.Printf("  %-20s %.5g\n", p.Quantity, p.Value)
		}
	}
	// Output:
	// water at 20 °C:
	//   density              998.21
	//   kinematic_viscosity  1.0034e-06
	//   sound_speed          1482.4
	//   surface_tension      0.072736
	//   vapour_pressure      2339.2
	//   viscosity            0.0010016
	// seawater at 15 °C, 35 g/kg:
	//   density              1026
	//   kinematic_viscosity  1.1889e-06
	//   sound_speed          1506.7
	//   surface_tension      0.074213
	//   vapour_pressure      1671
	//   viscosity            0.0012199
}
