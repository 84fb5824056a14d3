package feasibility

import (
	"fmt"
	"strings"
)

// Term is one factor of a product of powers: a quantity raised to an exact
// exponent.
type Term struct {
	Quantity string
	Exp      Rat
}

// Product is a product of powers of quantities.
type Product []Term

// Dim returns the dimension of the product.
func (p Product) Dim() Dimension {
	var d Dimension
	for _, t := range p {
		d = d.Mul(quantities[quantityIndex[t.Quantity]].Dim.Pow(t.Exp))
	}
	return d
}

// String prints the product as "density · velocity^2 · length^2".
func (p Product) String() string {
	parts := make([]string, 0, len(p))
	for _, t := range p {
		if t.Exp.Cmp(Int(1)) == 0 {
			parts = append(parts, t.Quantity)
		} else {
			parts = append(parts, t.Quantity+"^"+t.Exp.String())
		}
	}
	return strings.Join(parts, " · ")
}

// Law is a physical effect represented by its characteristic force. A
// strategy retains a law (its force must scale like every other retained
// one) or relaxes it (its group is monitored, not matched).
type Law struct {
	Name string
	// Force is the characteristic force as a product of powers.
	Force Product
	// Group is the trade name of the dimensionless group the law forms
	// against inertia.
	Group string
	// GroupPower gives the group from the force ratio:
	// group = (F_inertia / F_law)^GroupPower. Froude and Mach numbers are
	// square roots of their force ratios; the Euler number and the
	// strength-type groups are inverse ones.
	GroupPower Rat
	// Effect says in a few plain words what the law represents.
	Effect string
}

func prod(pairs ...any) Product {
	p := make(Product, 0, len(pairs)/2)
	for i := 0; i < len(pairs); i += 2 {
		e, ok := pairs[i+1].(Rat)
		if !ok {
			e = Int(int64(pairs[i+1].(int)))
		}
		p = append(p, Term{pairs[i].(string), e})
	}
	return p
}

var laws = []Law{
	{"inertia", prod("density", 1, "velocity", 2, "length", 2), "", Int(1), "inertia of the moving mass"},
	{"gravity", prod("density", 1, "gravity", 1, "length", 3), "Froude number", R(1, 2), "weight and gravity waves"},
	{"viscosity", prod("viscosity", 1, "velocity", 1, "length", 1), "Reynolds number", Int(1), "viscous friction"},
	{"surface_tension", prod("surface_tension", 1, "length", 1), "Weber number", Int(1), "surface tension"},
	{"elasticity", prod("modulus", 1, "strain", 1, "length", 2), "Cauchy number", Int(1), "elastic deformation"},
	{"compressibility", prod("density", 1, "sound_speed", 2, "length", 2), "Mach number", R(1, 2), "compressibility of the medium"},
	{"pressure", prod("pressure", 1, "length", 2), "Euler (cavitation) number", Int(-1), "ambient or vapour pressure"},
	{"cohesion", prod("cohesion", 1, "length", 2), "cohesion number", Int(-1), "soil cohesion"},
	{"friction", prod("friction", 1, "force", 1), "friction coefficient", Int(-1), "Coulomb friction"},
	{"bending", prod("flexural_rigidity", 1, "length", -2), "bending number", Int(1), "bending stiffness of a beam"},
	{"flexure", prod("strength", 1, "thickness", 2), "plate-flexure number", Int(-1), "flexural failure of a layer"},
	{"strength", prod("strength", 1, "length", 2), "strength number", Int(-1), "material failure"},
	{"spring", prod("stiffness", 1, "length", 1), "reduced stiffness", Int(-1), "springs or restraints"},
	// The laws of distorted, diffusive and cavitating models (spec §3.6).
	// hydrostatic: the pressure head ρ·g·h over the vertical scale h
	// (thickness) acting over length²; against inertia it forms
	// V²/(g·h), the square of the depth Froude number.
	{"hydrostatic", prod("density", 1, "gravity", 1, "thickness", 1, "length", 2), "depth Froude number", R(1, 2), "pressure head over the vertical scale"},
	// bed_friction: Manning's friction slope S_f = n²V²/h^4/3 must scale as
	// the geometric slope h/L. Written as a force that scales like inertia
	// exactly when it does: ρV²L² · g·n²·L/h^4/3 (the bed shear force
	// ρ·g·n²V²·h^-1/3·L² over the slope h/L).
	{"bed_friction", prod("density", 1, "gravity", 1, "roughness", 2, "velocity", 2, "length", 3, "thickness", R(-4, 3)), "roughness number", Int(1), "bed friction (Manning)"},
	// consolidation: the time factor T_v = c_v·t/L² with t = L/V, i.e. the
	// force ρ·c_v·V·L; its group against inertia is T_v itself.
	{"consolidation", prod("density", 1, "consolidation_coefficient", 1, "velocity", 1, "length", 1), "time factor", Int(-1), "consolidation (pore-pressure diffusion)"},
	// cavitation: the margin of the ambient pressure above the vapour
	// pressure, (p − p_v)·L², against inertia: the cavitation number σ.
	// Here pressure stands for that margin; the ambient pressure a model
	// needs is p_v,m + (p_p − p_v,p)/k_pressure (see CavitationPressure).
	{"cavitation", prod("pressure", 1, "length", 2), "cavitation number", Int(-1), "cavitation (ambient pressure above vapour pressure)"},
}

var lawIndex = func() map[string]int {
	m := make(map[string]int, len(laws))
	for i, l := range laws {
		m[l.Name] = i
	}
	return m
}()

// Laws returns every law, inertia first.
func Laws() []Law { return append([]Law(nil), laws...) }

// LawNames returns the law names in table order.
func LawNames() []string {
	names := make([]string, len(laws))
	for i, l := range laws {
		names[i] = l.Name
	}
	return names
}

// LookupLaw returns the law of that name, or an error with a suggestion.
func LookupLaw(name string) (Law, error) {
	if i, ok := lawIndex[name]; ok {
		return laws[i], nil
	}
	return Law{}, fmt.Errorf("unknown law %q%s", name, Suggest(name, LawNames()))
}

// definition is a derived quantity's relation to others (§3.2 of the spec).
type definition struct {
	Quantity string
	Of       Product
}

var definitions = []definition{
	{"time", prod("length", 1, "velocity", -1)},
	{"frequency", prod("time", -1)},
	{"acceleration", prod("length", 1, "time", -2)},
	{"mass", prod("density", 1, "length", 3)},
	{"moment", prod("force", 1, "length", 1)},
	{"pressure", prod("force", 1, "length", -2)},
	{"power", prod("force", 1, "velocity", 1)},
	{"energy", prod("force", 1, "length", 1)},
	{"stiffness", prod("force", 1, "length", -1)},
	{"kinematic_viscosity", prod("viscosity", 1, "density", -1)},
	{"flexural_rigidity", prod("modulus", 1, "area_moment", 1)},
}

// lateDefinitions define quantities that no law names. They are solved
// after every law and pivot on the quantity they define, so adding them
// changes no other quantity's law and never makes another quantity a
// free choice.
var lateDefinitions = []definition{
	{"discharge", prod("velocity", 1, "length", 1, "thickness", 1)},
}

// ties are the geometric relations that hold unless a strategy unties the
// quantity.
var ties = []definition{
	{"thickness", prod("length", 1)},
	{"area_moment", prod("length", 4)},
	{"strain", Product{}},
}

// Untieable returns the quantities a strategy may untie.
func Untieable() []string {
	out := make([]string, len(ties))
	for i, t := range ties {
		out[i] = t.Quantity
	}
	return out
}
