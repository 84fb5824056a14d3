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
