package feasibility

import "slices"

// fixedByGiven returns the quantities whose values the given quantities
// determine without any law: the given ones, the length and the geometric
// quantities still tied to it, and, repeatedly, the one member of a
// definition (ν = μ/ρ, E·I = E·I, m = ρ·L³, ...) left when every other
// member is already fixed. A property in this set is not required of the
// model: the chosen material or medium supplies it.
func (sol *Solution) fixedByGiven() map[string]bool {
	fixed := map[string]bool{"length": true}
	for _, p := range sol.Params {
		if p.Role == "given" {
			fixed[p.Quantity] = true
		}
	}
	for _, t := range ties {
		if !slices.Contains(sol.Strategy.Untie, t.Quantity) {
			fixed[t.Quantity] = true
		}
	}
	for changed := true; changed; {
		changed = false
		for _, d := range definitions {
			members := []string{d.Quantity}
			for _, t := range d.Of {
				members = append(members, t.Quantity)
			}
			open := ""
			n := 0
			for _, m := range members {
				if !fixed[m] {
					open, n = m, n+1
				}
			}
			if n != 1 {
				continue
			}
			if l, _ := sol.Law(open); l.Status != Determined {
				continue
			}
			fixed[open], changed = true, true
		}
	}
	return fixed
}

// IsDefined reports whether a quantity is defined from others (kinematic
// viscosity = viscosity / density, flexural rigidity = modulus · area
// moment, mass = density · length³, ...).
func IsDefined(q string) bool {
	for _, d := range definitions {
		if d.Quantity == q {
			return true
		}
	}
	return false
}

// FollowsFrom reports whether a quantity is defined from quantities that
// are each given, geometric (tied to the length, or untied and so set by
// the model's design) or known as the caller says: E·I of a known modulus,
// ν of a known viscosity and a given density.
func (sol *Solution) FollowsFrom(q string, known func(string) bool) bool {
	for _, d := range definitions {
		if d.Quantity != q {
			continue
		}
		all := true
		for _, t := range d.Of {
			l, _ := sol.Law(t.Quantity)
			if l.Status == Given || slices.Contains(Untieable(), t.Quantity) || known(t.Quantity) {
				continue
			}
			all = false
		}
		if all {
			return true
		}
	}
	return false
}

// Linked reports whether one definition joins a and b with every other
// member fixed by the given quantities (ν and μ with ρ given; E·I and E
// with the area moment tied): the model meets one exactly when it meets
// the other.
func (sol *Solution) Linked(a, b string) bool {
	fixed := sol.fixedByGiven()
	for _, d := range definitions {
		members := []string{d.Quantity}
		for _, t := range d.Of {
			members = append(members, t.Quantity)
		}
		if !slices.Contains(members, a) || !slices.Contains(members, b) || a == b {
			continue
		}
		ok := true
		for _, m := range members {
			if m != a && m != b && !fixed[m] {
				ok = false
			}
		}
		if ok {
			return true
		}
	}
	return false
}
