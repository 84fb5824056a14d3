package feasibility

import (
	"fmt"
	"sort"
)

// Kind tells what part a quantity plays in a test.
type Kind int

const (
	// Geometry quantities describe the model's shape: length and the
	// lengths tied to it.
	Geometry Kind = iota
	// Response quantities describe the motion and loads of the test; most
	// are defined from others (time = length/velocity, ...).
	Response
	// Property quantities belong to a material, a medium, a device or the
	// facility (density, viscosity, gravity, ...). Those not given are
	// reported as required.
	Property
)

func (k Kind) String() string {
	switch k {
	case Geometry:
		return "geometry"
	case Response:
		return "response"
	default:
		return "property"
	}
}

// Quantity is a named physical quantity with its dimension. The names are
// the interface of the tool: they appear unchanged on the command line, in
// study sheets and in JSON.
type Quantity struct {
	Name    string
	Meaning string
	Dim     Dimension
	SI      string // SI unit used in headers and JSON
	Kind    Kind
}

// The quantities, in the column order of the solver: when a strategy leaves
// a direction undetermined, the solver names the quantity that comes last in
// this order as the free choice, so the test speed (velocity) is preferred,
// then density and gravity.
var quantities = []Quantity{
	{"length", "characteristic length", Dim(0, 1, 0, 0), "m", Geometry},
	{"thickness", "a second length scaled apart (layer thickness, vertical scale)", Dim(0, 1, 0, 0), "m", Geometry},
	{"area_moment", "second moment of area", Dim(0, 4, 0, 0), "m^4", Geometry},
	{"strain", "strain", Dim(0, 0, 0, 0), "1", Geometry},
	{"time", "time", Dim(0, 0, 1, 0), "s", Response},
	{"frequency", "frequency", Dim(0, 0, -1, 0), "Hz", Response},
	{"acceleration", "acceleration", Dim(0, 1, -2, 0), "m/s^2", Response},
	{"force", "force", Dim(1, 1, -2, 0), "N", Response},
	{"moment", "bending moment or torque", Dim(1, 2, -2, 0), "N*m", Response},
	{"pressure", "pressure or stress", Dim(1, -1, -2, 0), "Pa", Response},
	{"mass", "mass", Dim(1, 0, 0, 0), "kg", Response},
	{"power", "power", Dim(1, 2, -3, 0), "W", Response},
	{"energy", "energy or work", Dim(1, 2, -2, 0), "J", Response},
	{"stiffness", "spring rate (force/length)", Dim(1, 0, -2, 0), "N/m", Response},
	{"discharge", "volume flow rate (velocity·length·thickness)", Dim(0, 3, -1, 0), "m^3/s", Response},
	{"kinematic_viscosity", "kinematic viscosity", Dim(0, 2, -1, 0), "m^2/s", Property},
	{"flexural_rigidity", "flexural rigidity E·I", Dim(1, 3, -2, 0), "N*m^2", Property},
	{"viscosity", "dynamic viscosity", Dim(1, -1, -1, 0), "Pa*s", Property},
	{"surface_tension", "surface tension", Dim(1, 0, -2, 0), "N/m", Property},
	{"sound_speed", "speed of sound", Dim(0, 1, -1, 0), "m/s", Property},
	{"modulus", "Young's modulus", Dim(1, -1, -2, 0), "Pa", Property},
	{"strength", "ultimate or flexural strength", Dim(1, -1, -2, 0), "Pa", Property},
	{"cohesion", "soil cohesion", Dim(1, -1, -2, 0), "Pa", Property},
	{"friction", "friction coefficient (tan φ)", Dim(0, 0, 0, 0), "1", Property},
	{"poisson", "Poisson's ratio", Dim(0, 0, 0, 0), "1", Property},
	{"roughness", "Manning roughness coefficient n", Dimension{Int(0), R(-1, 3), Int(1), Int(0)}, "s*m^(-1/3)", Property},
	{"consolidation_coefficient", "coefficient of consolidation c_v", Dim(0, 2, -1, 0), "m^2/s", Property},
	{"permeability", "hydraulic conductivity (coefficient of permeability)", Dim(0, 1, -1, 0), "m/s", Property},
	{"vapour_pressure", "vapour pressure of the liquid", Dim(1, -1, -2, 0), "Pa", Property},
	{"temperature", "temperature", Dim(0, 0, 0, 1), "K", Property},
	{"gravity", "gravitational acceleration", Dim(0, 1, -2, 0), "m/s^2", Property},
	{"density", "density", Dim(1, -3, 0, 0), "kg/m^3", Property},
	{"velocity", "characteristic speed", Dim(0, 1, -1, 0), "m/s", Response},
}

var quantityIndex = func() map[string]int {
	m := make(map[string]int, len(quantities))
	for i, q := range quantities {
		m[q.Name] = i
	}
	return m
}()

// Quantities returns every quantity, in the solver's column order.
func Quantities() []Quantity {
	return append([]Quantity(nil), quantities...)
}

// QuantityNames returns the quantity names sorted alphabetically.
func QuantityNames() []string {
	names := make([]string, len(quantities))
	for i, q := range quantities {
		names[i] = q.Name
	}
	sort.Strings(names)
	return names
}

// LookupQuantity returns the quantity of that name, or an error with a
// suggestion when the name is close to a known one.
func LookupQuantity(name string) (Quantity, error) {
	if i, ok := quantityIndex[name]; ok {
		return quantities[i], nil
	}
	return Quantity{}, fmt.Errorf("unknown quantity %q%s", name, Suggest(name, QuantityNames()))
}

// QuantityNamed returns the quantity of that name without building an
// error: for hot paths that only ask whether a name is a quantity.
func QuantityNamed(name string) (Quantity, bool) {
	i, ok := quantityIndex[name]
	if !ok {
		return Quantity{}, false
	}
	return quantities[i], true
}
