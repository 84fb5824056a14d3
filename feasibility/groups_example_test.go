package feasibility_test

import (
	"fmt"

	"scaleplan/feasibility"
)

// Drag on a sphere: F = f(ρ, V, D, μ). The repeating variables are chosen
// automatically (a length, a velocity, a density); the force comes first and
// is taken as the dependent variable.
func ExamplePiGroups() {
	vars := []feasibility.Variable{
		{Name: "F", Dim: feasibility.Dim(1, 1, -2, 0)},
		{Name: "rho", Dim: feasibility.Dim(1, -3, 0, 0)},
		{Name: "V", Dim: feasibility.Dim(0, 1, -1, 0)},
		{Name: "D", Dim: feasibility.Dim(0, 1, 0, 0)},
		{Name: "mu", Dim: feasibility.Dim(1, -1, -1, 0)},
	}
	res, err := feasibility.PiGroups(vars, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("rank", res.Rank, "over", res.Dimensions)
	fmt.Println("repeating", res.Repeating)
	for _, g := range res.Groups {
		fmt.Printf("%s  (%s, dimension %s)\n", g, g.Name, g.Dim)
	}

	// The user's choice: viscosity instead of density.
	_, err = feasibility.PiGroups(vars, []string{"mu", "V"})
	fmt.Println(err)
	// Output:
	// rank 3 over [M L T]
	// repeating [rho V D]
	// F · rho^-1 · V^-2 · D^-2  (force coefficient, dimension 1)
	// rho^-1 · V^-1 · D^-1 · mu  (inverse Reynolds number, dimension 1)
	// 3 repeating variables are needed: the matrix has rank 3 (2 given: mu and V)
}

// A fractional exponent and a classic group recognised up to a power.
func ExamplePiGroup_String() {
	vars := []feasibility.Variable{
		{Name: "c", Dim: feasibility.Dim(0, 1, -1, 0)},
		{Name: "g", Dim: feasibility.Dim(0, 1, -2, 0)},
		{Name: "lambda", Dim: feasibility.Dim(0, 1, 0, 0)},
	}
	auto, _ := feasibility.PiGroups(vars, nil)
	chosen, _ := feasibility.PiGroups(vars, []string{"c", "lambda"})
	fmt.Println(auto.Groups[0], "=", auto.Groups[0].Name)
	fmt.Println(chosen.Groups[0], "=", chosen.Groups[0].Name)
	// Output:
	// c · g^-1/2 · lambda^-1/2 = Froude number
	// c^-2 · g · lambda = Froude number^-2
}
