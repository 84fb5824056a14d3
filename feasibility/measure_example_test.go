package feasibility_test

import (
	"fmt"
	"math"

	"scaleplan/feasibility"
)

// A towing-tank limit: the model Reynolds number must be at least 2e6.
func ExampleParseLimit() {
	l, err := feasibility.ParseLimit("design_speed * hull_length / kinematic_viscosity >= 2e6")
	if err != nil {
		fmt.Println(err)
		return
	}
	dims := map[string]feasibility.Dimension{
		"design_speed":        feasibility.Dim(0, 1, -1, 0),
		"hull_length":         feasibility.Dim(0, 1, 0, 0),
		"kinematic_viscosity": feasibility.Dim(0, 2, -1, 0),
	}
	err = l.Check(func(name string) (feasibility.Dimension, error) {
		if d, ok := dims[name]; ok {
			return d, nil
		}
		return feasibility.Dimension{}, fmt.Errorf("unknown name %q", name)
	})
	fmt.Println("check:", err)

	// A 2 m model at 1.5 m/s in fresh water at about 20 °C.
	values := map[string]float64{"design_speed": 1.5, "hull_length": 2, "kinematic_viscosity": 1e-6}
	m := l.Margin(func(name string) float64 { return values[name] })
	fmt.Printf("%s: margin %.5f decades (log10 1.5 = %.5f)\n", l, m, math.Log10(1.5))

	c, terms, ok := l.LogLinear()
	fmt.Printf("log-linear: %v, margin = %.4f", ok, c)
	for _, t := range terms {
		fmt.Printf(" + %s·log10(%s)", t.Exp, t.Name)
	}
	fmt.Println()

	// A bound with a unit, and a misspelt one.
	p, _ := feasibility.ParseLimit("wave_period >= 0.35 s")
	fmt.Println(p.Right, "=", p.Right.Eval(nil), "s")
	_, err = feasibility.ParseLimit("wave_period >= 0.35 sec")
	fmt.Println(err)
	// Output:
	// check: <nil>
	// design_speed * hull_length / kinematic_viscosity >= 2e6: margin 0.17609 decades (log10 1.5 = 0.17609)
	// log-linear: true, margin = -6.3010 + 1·log10(design_speed) + 1·log10(hull_length) + -1·log10(kinematic_viscosity)
	// 0.35 [s] = 0.35 s
	// limit "wave_period >= 0.35 sec": the value "0.35 sec" at column 16: unit "sec": unknown symbol "sec" at column 1 (did you mean s?)
}

// A depth Froude number as a product of powers.
func ExampleExpr_Product() {
	e, err := feasibility.ParseExpr("design_speed / (gravity * depth)^(1/2)")
	if err != nil {
		fmt.Println(err)
		return
	}
	coef, powers, ok := e.Product()
	fmt.Println(e, ok, coef)
	for _, p := range powers {
		fmt.Printf("%s^%s\n", p.Name, p.Exp)
	}
	_, err = feasibility.ParseExpr("design_speed * / depth")
	fmt.Println(err)
	// Output:
	// design_speed / (gravity * depth)^(1/2) true 1
	// design_speed^1
	// gravity^-1/2
	// depth^-1/2
	// expression "design_speed * / depth": unexpected "/" at column 16
}
