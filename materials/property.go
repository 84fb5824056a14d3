package materials

import (
	"math"
	"sort"
)

// Property is one property of an entry at given conditions, in SI.
//
// Min and Max give the range the property can be tuned over (model ice
// strength by tempering, water viscosity by its temperature, air density by
// the tunnel pressure, ...); both are 0 when the property is fixed. Value
// always lies within a tunable range.
type Property struct {
	Quantity string  // a quantity name of package feasibility (density, modulus, ...)
	Value    float64 // SI
	Min, Max float64 // tunable range in SI; both 0 when fixed
	Source   string  // where the value comes from
}

// Tunable reports whether the property has a tunable range.
func (p Property) Tunable() bool { return p.Min != 0 || p.Max != 0 }

// Sources of the derived viscosities.
const (
	srcKinematicDerived = "derived: viscosity / density"
	srcViscosityDerived = "derived: kinematic_viscosity × density"
	srcDensityDerived   = "derived: viscosity / kinematic_viscosity"
)

// complete adds the one of density, viscosity and kinematic_viscosity that
// follows from the other two (ν = μ/ρ), carrying tunable ranges through by
// interval arithmetic, and sorts the properties by quantity name.
func complete(props []Property) []Property {
	props = derive(props)
	sortProperties(props)
	return props
}

// derive is complete without the sorting, for callers that only read the
// values (a recipe's objective is evaluated thousands of times).
func derive(props []Property) []Property {
	idx := func(q string) int {
		for i, p := range props {
			if p.Quantity == q {
				return i
			}
		}
		return -1
	}
	rho, mu, nu := idx("density"), idx("viscosity"), idx("kinematic_viscosity")
	switch {
	case rho >= 0 && mu >= 0 && nu < 0:
		props = append(props, quotient("kinematic_viscosity", props[mu], props[rho], srcKinematicDerived))
	case rho >= 0 && nu >= 0 && mu < 0:
		props = append(props, product("viscosity", props[nu], props[rho], srcViscosityDerived))
	case mu >= 0 && nu >= 0 && rho < 0:
		props = append(props, quotient("density", props[mu], props[nu], srcDensityDerived))
	}
	return props
}

func bounds(p Property) (lo, hi float64) {
	if p.Tunable() {
		return p.Min, p.Max
	}
	return p.Value, p.Value
}

func quotient(q string, a, b Property, src string) Property {
	out := Property{Quantity: q, Value: a.Value / b.Value, Source: src}
	if a.Tunable() || b.Tunable() {
		alo, ahi := bounds(a)
		blo, bhi := bounds(b)
		out.Min, out.Max = alo/bhi, ahi/blo
	}
	return out
}

func product(q string, a, b Property, src string) Property {
	out := Property{Quantity: q, Value: a.Value * b.Value, Source: src}
	if a.Tunable() || b.Tunable() {
		alo, ahi := bounds(a)
		blo, bhi := bounds(b)
		out.Min, out.Max = alo*blo, ahi*bhi
	}
	return out
}

func sortProperties(props []Property) {
	sort.Slice(props, func(i, j int) bool { return props[i].Quantity < props[j].Quantity })
}

// sameValue reports whether two SI values agree to rounding.
func sameValue(a, b float64) bool {
	return math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b))
}
