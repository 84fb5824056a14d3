package feasibility

import "fmt"

func ExampleParseValue() {
	for _, s := range []string{"25 kn", "20 °C", "3bar", "1.2e-6 m2/s", "35g/kg", "-3 bar", "25"} {
		v, u, err := ParseValue(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-12s = %.6g SI (%s)\n", s, v, u.Dim)
	}
	_, _, err := ParseValue("20 kg/mx^3")
	fmt.Println(err)
	_, err = ParseValueFor("3 m/s", "force")
	fmt.Println(err)
	// Output:
	// 25 kn        = 12.8611 SI (L T^-1)
	// 20 °C        = 293.15 SI (Θ)
	// 3bar         = 300000 SI (M L^-1 T^-2)
	// 1.2e-6 m2/s  = 1.2e-06 SI (L^2 T^-1)
	// 35g/kg       = 0.035 SI (1)
	// -3 bar       = -300000 SI (M L^-1 T^-2)
	// 25           = 25 SI (1)
	// unit "kg/mx^3": unknown symbol "mx" at column 4 (did you mean m?)
	// unit "m/s" does not fit force (needs M L T^-2, got L T^-1)
}
