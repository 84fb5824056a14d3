package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRulesRequiredOnlyWhenUndetermined: a property the given quantities
// determine through a definition (μ = ν·ρ; E = E·I / I with I tied to the
// length) is not listed as required; one the laws alone fix is.
func TestRulesRequiredOnlyWhenUndetermined(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"--retain", "inertia,gravity", "--relax", "viscosity", "--given", "density=1,gravity=1,kinematic_viscosity=1"}, "Required properties: none"},
		{[]string{"--retain", "inertia,gravity", "--relax", "viscosity", "--given", "density=1,gravity=1,viscosity=1"}, "Required properties: none"},
		{[]string{"--retain", "inertia,gravity,bending", "--given", "density=1,gravity=1,flexural_rigidity=1"}, "Required properties: none"},
		// Froude and Reynolds with only the density given: both viscosities
		// must be found (textbook similitude).
		{[]string{"--retain", "inertia,gravity,viscosity", "--given", "density=1,gravity=1"}, "Required properties: kinematic_viscosity, viscosity"},
	}
	for _, c := range cases {
		var stdout, stderr bytes.Buffer
		args := append([]string{"scaleplan", "rules"}, c.args...)
		if code := run(args, &stdout, &stderr); code != 0 {
			t.Fatalf("%v: exit %d: %s", args, code, stderr.String())
		}
		if !strings.Contains(stdout.String(), c.want) {
			t.Errorf("%v: output lacks %q:\n%s", args, c.want, stdout.String())
		}
	}
}
