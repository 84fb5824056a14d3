package feasibility

import (
	"strings"
)

// Groups named and combined after the analysis: the free-convection groups,
// and the buoyancy and surf-similarity groups built from the plain ones.

// convectionName names the groups of free convection (Incropera & DeWitt,
// Fundamentals of Heat and Mass Transfer, ch. 9; from memory): the Grashof
// number g·β·ΔT·L³/ν² and the Rayleigh number g·β·ΔT·L³/(ν·α), α a thermal
// diffusivity, each up to a power. ok is false when the group does not
// have their dimensions; a group of that shape built on α alone
// (g·β·ΔT·L³/α² = Ra/Pr) is left unnamed.
func convectionName(g PiGroup, dimOf func(VarExp) Dimension) (string, bool) {
	var k Rat
	sum := map[Dimension]Rat{}
	var kin []VarExp
	for _, e := range g.Exponents {
		d := dimOf(e)
		sum[d] = sum[d].Add(e.Exp)
		if d == pdKinematic {
			kin = append(kin, e)
		}
	}
	k = sum[pdAccel]
	if k.IsZero() || len(sum) != 5 || sum[pdExpansion].Cmp(k) != 0 || sum[pdTemperature].Cmp(k) != 0 ||
		sum[pdLength].Cmp(k.Mul(Int(3))) != 0 || sum[pdKinematic].Cmp(k.Mul(Int(-2))) != 0 {
		return "", false
	}
	var alpha, nu []VarExp
	for _, e := range kin {
		if matchHints(e.Name, diffusionHints) {
			alpha = append(alpha, e)
		} else {
			nu = append(nu, e)
		}
	}
	switch {
	case len(alpha) == 0:
		return powName("Grashof number", k), true
	case len(alpha) == 1 && len(nu) == 1 && alpha[0].Exp.Cmp(k.Neg()) == 0 && nu[0].Exp.Cmp(k.Neg()) == 0:
		return powName("Rayleigh number", k), true
	}
	return "", true
}

// combineBuoyancy multiplies a Galileo-type group g·L³/ν² (or g·L³/α²) by
// the group β·ΔT of a thermal expansion and a temperature difference when
// both are in the basis, giving the Grashof number (or the Rayleigh number
// with a thermal diffusivity), the groups of free convection.
func combineBuoyancy(groups []PiGroup, index map[string]int, dims []Dimension) {
	var bt []VarExp // the β·ΔT group
	for _, g := range groups {
		if len(g.Exponents) != 2 {
			continue
		}
		d0, d1 := dims[index[g.Exponents[0].Name]], dims[index[g.Exponents[1].Name]]
		if (d0 == pdExpansion && d1 == pdTemperature) || (d0 == pdTemperature && d1 == pdExpansion) {
			bt = g.Exponents
			break
		}
	}
	if bt == nil {
		return
	}
	k := bt[0].Exp // β·ΔT raised to k
	for i, g := range groups {
		var m Rat // exponent of the acceleration
		for _, e := range g.Exponents {
			if dims[index[e.Name]] == pdAccel {
				m = e.Exp
			}
		}
		if m.IsZero() {
			continue
		}
		p := m.Div(k)
		out := PiGroup{Dim: g.Dim}
		for _, e := range bt {
			out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
		}
		out.Exponents = append(out.Exponents, g.Exponents...)
		if n := recogniseGroup(out, index, dims); strings.Contains(n, "Grashof") || strings.Contains(n, "Rayleigh") {
			out.Name = n
			groups[i] = out
		}
	}
	// With a Prandtl group ν/α in the basis as well, Gr·Pr = Ra is the
	// group free convection is characterised by.
	for i, g := range groups {
		if !strings.HasPrefix(g.Name, "Grashof number") {
			continue
		}
		for _, pr := range groups {
			if !strings.Contains(pr.Name, "Prandtl number") || len(pr.Exponents) != 2 {
				continue
			}
			var prPow Rat // pr is Pr^prPow; the α exponent is −prPow
			for _, e := range pr.Exponents {
				if matchHints(e.Name, diffusionHints) {
					prPow = e.Exp.Neg()
				}
			}
			if prPow.IsZero() {
				continue
			}
			var k Rat // g is Gr^k: the acceleration exponent
			for _, e := range g.Exponents {
				if dims[index[e.Name]] == pdAccel {
					k = e.Exp
				}
			}
			p := k.Div(prPow)
			out := PiGroup{Dim: g.Dim, Exponents: append([]VarExp(nil), g.Exponents...)}
			for _, e := range pr.Exponents {
				merged := false
				for j := range out.Exponents {
					if out.Exponents[j].Name == e.Name {
						out.Exponents[j].Exp = out.Exponents[j].Exp.Add(e.Exp.Mul(p))
						merged = true
					}
				}
				if !merged {
					out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
				}
			}
			if n := recogniseGroup(out, index, dims); strings.HasPrefix(n, "Rayleigh number") {
				out.Name = n
				groups[i] = out
			}
			break
		}
	}
}

// combineIribarren replaces the group of a lone slope (a dimensionless
// variable named tan_a, slope, …) by the Iribarren number when another
// group is a wave steepness: slope · steepness^(-1/2k) for a steepness
// raised to k. The basis stays a basis (one group times a power of
// another), and it is the group coastal engineers use.
func combineIribarren(groups []PiGroup, index map[string]int, dims []Dimension) {
	for i, g := range groups {
		if len(g.Exponents) != 1 || !dims[index[g.Exponents[0].Name]].IsDimensionless() || !matchHints(g.Exponents[0].Name, slopeHints) {
			continue
		}
		for _, st := range groups {
			k, ok := steepnessPower(st.Name)
			if !ok {
				continue
			}
			p := R(-1, 2).Div(k)
			out := PiGroup{Exponents: []VarExp{g.Exponents[0]}, Dim: g.Dim}
			for _, e := range st.Exponents {
				out.Exponents = append(out.Exponents, VarExp{e.Name, e.Exp.Mul(p)})
			}
			out.Name = recogniseGroup(out, index, dims)
			if out.Name != "" {
				groups[i] = out
			}
			break
		}
	}
}

// steepnessPower returns k of a group named "wave steepness" raised to k.
func steepnessPower(name string) (Rat, bool) {
	switch {
	case name == "wave steepness":
		return Int(1), true
	case name == "inverse wave steepness":
		return Int(-1), true
	}
	if r, ok := strings.CutPrefix(name, "wave steepness^"); ok {
		k, err := ParseRat(r)
		return k, err == nil && !k.IsZero()
	}
	return Rat{}, false
}
