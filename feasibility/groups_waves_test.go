package feasibility

import "testing"

// Coastal and free-convection groups. Definitions: wave steepness H/λ and
// Iribarren number ξ = tan α/√(H/λ0) (Hughes 1993, Physical Models and
// Laboratory Techniques in Coastal Engineering, ch. 2, from memory;
// Battjes 1974 for the name surf similarity); Grashof g·β·ΔT·L³/ν² and
// Rayleigh g·β·ΔT·L³/(ν·α) (Incropera & DeWitt, Fundamentals of Heat and
// Mass Transfer, ch. 9, from memory).
func TestPiGroupsWavesAndConvection(t *testing.T) {
	expansion := Dim(0, 0, 0, -1)
	temp := Dim(0, 0, 0, 1)
	cases := []struct {
		vars   []Variable
		repeat []string
		group  int
		str    string
		name   string
	}{
		{[]Variable{{"H", piLength}, {"lambda", piLength}}, nil, 0, "H · lambda^-1", "wave steepness"},
		{[]Variable{{"lambda", piLength}, {"H", piLength}}, nil, 0, "lambda · H^-1", "inverse wave steepness"},
		{[]Variable{{"H", piLength}, {"g", piAccel}, {"T", piTime}}, nil, 0, "H · g^-1 · T^-2", "wave steepness"},
		// A depth h over a wavelength is not a steepness.
		{[]Variable{{"h", piLength}, {"lambda", piLength}}, nil, 0, "h · lambda^-1", "length ratio"},
		{[]Variable{{"tan_a", piNone}, {"H", piLength}, {"lambda", piLength}}, nil, 0, "tan_a · H^-1/2 · lambda^1/2", "Iribarren number"},
		{[]Variable{{"tan_a", piNone}, {"H", piLength}, {"g", piAccel}, {"T", piTime}}, nil, 0, "tan_a · H^-1/2 · g^1/2 · T", "Iribarren number"},
		// β·ΔT and g·L³/ν² come out of the basis apart; their product is
		// the Grashof number.
		{[]Variable{{"beta", expansion}, {"g", piAccel}, {"dT", temp}, {"L", piLength}, {"nu", piKinematic}}, []string{"dT", "L", "nu"}, 1,
			"beta · dT · g · L^3 · nu^-2", "Grashof number"},
		{[]Variable{{"beta", expansion}, {"g", piAccel}, {"dT", temp}, {"L", piLength}, {"nu", piKinematic}}, nil, 1,
			"beta^-1/2 · dT^-1/2 · g^-1/2 · L^-3/2 · nu", "Grashof number^-1/2"},
		// With a Prandtl group too, Gr·Pr: the Rayleigh number.
		{[]Variable{{"beta", expansion}, {"g", piAccel}, {"dT", temp}, {"L", piLength}, {"nu", piKinematic}, {"alpha", piKinematic}}, []string{"dT", "L", "nu"}, 1,
			"beta · dT · g · L^3 · nu^-1 · alpha^-1", "Rayleigh number"},
		{[]Variable{{"beta", expansion}, {"g", piAccel}, {"dT", temp}, {"L", piLength}, {"nu", piKinematic}, {"alpha", piKinematic}}, []string{"dT", "L", "nu"}, 2,
			"nu^-1 · alpha", "inverse Prandtl number"},
		// On α alone the product is Ra/Pr, which has no name of its own.
		{[]Variable{{"beta", expansion}, {"g", piAccel}, {"dT", temp}, {"L", piLength}, {"alpha", piKinematic}}, []string{"dT", "L", "alpha"}, 1,
			"g · L^3 · alpha^-2", ""},
		// g·L³/α² with a thermal diffusivity is not a Galileo number.
		{[]Variable{{"g", piAccel}, {"L", piLength}, {"alpha", piKinematic}}, nil, 0, "g · L^3 · alpha^-2", ""},
		{[]Variable{{"g", piAccel}, {"L", piLength}, {"nu", piKinematic}}, nil, 0, "g · L^3 · nu^-2", "Galileo number"},
	}
	for _, c := range cases {
		res, err := PiGroups(c.vars, c.repeat)
		if err != nil {
			t.Errorf("%v: %v", c.vars, err)
			continue
		}
		g := res.Groups[c.group]
		checkDimensionless(t, c.vars, g)
		if g.String() != c.str || g.Name != c.name {
			t.Errorf("%v: group %q named %q, want %q named %q", c.vars, g.String(), g.Name, c.str, c.name)
		}
	}
}
