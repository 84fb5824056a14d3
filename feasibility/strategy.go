package feasibility

import (
	"fmt"
	"slices"
)

// Strategy is the scale-law problem of one relaxation strategy (or one case
// of the special-cases technique): the laws it retains (all must scale
// alike), the laws it relaxes (monitored, not matched), the geometric
// quantities it unties, and the quantities it is given. The length scale is
// always a parameter. Every quantity that is not given is solved for.
type Strategy struct {
	Retain []string
	Relax  []string
	Untie  []string
	// Given quantities have a scale factor fixed by the chosen material,
	// medium, facility or test: each becomes a parameter of the scale laws.
	Given []string
	// Tuned quantities are solved for like any other and then checked
	// against the range a device or medium can reach.
	Tuned []string
	// Tied quantities have a scale factor that is a power of the length
	// scale, set by the test rather than by a material: a centrifuge run
	// at N = kL times gravity has k_gravity = kL^-1.
	Tied []LengthTie
	// PreferFree names quantities to leave as the free choices where the
	// retained laws leave a direction undetermined (a study sweeping the
	// vertical scale of a distorted model prefers thickness to velocity).
	// It changes which quantity is named free, never the solution space.
	PreferFree []string
}

// LengthTie ties a quantity's scale factor to the length scale:
// k_Quantity = kL^Exp.
type LengthTie struct {
	Quantity string
	Exp      Rat
}

// validate checks every name and the consistency of the request.
func (s Strategy) validate() error {
	if len(s.Retain) == 0 {
		return fmt.Errorf("no law retained: retain at least one (known: %s)", joinNames(LawNames()))
	}
	seenLaw := map[string]string{}
	for _, group := range []struct {
		role  string
		names []string
	}{{"retained", s.Retain}, {"relaxed", s.Relax}} {
		for _, n := range group.names {
			if _, err := LookupLaw(n); err != nil {
				return err
			}
			if prev, ok := seenLaw[n]; ok {
				if prev == group.role {
					return fmt.Errorf("law %q is %s twice", n, prev)
				}
				return fmt.Errorf("law %q is both retained and relaxed: choose one", n)
			}
			seenLaw[n] = group.role
		}
	}
	seenQ := map[string]string{}
	check := func(role string, names []string) error {
		for _, n := range names {
			if _, err := LookupQuantity(n); err != nil {
				return err
			}
			if prev, ok := seenQ[n]; ok {
				if prev == role {
					return fmt.Errorf("quantity %q is %s twice", n, role)
				}
				return fmt.Errorf("quantity %q is both %s and %s: choose one", n, prev, role)
			}
			seenQ[n] = role
		}
		return nil
	}
	for _, n := range s.Untie {
		if !slices.Contains(Untieable(), n) {
			if _, err := LookupQuantity(n); err != nil {
				return err
			}
			return fmt.Errorf("quantity %q cannot be untied: only %s are tied to the length", n, joinNames(Untieable()))
		}
		if slices.Contains(s.Untie[:slices.Index(s.Untie, n)], n) {
			return fmt.Errorf("quantity %q is untied twice", n)
		}
	}
	if err := check("given", s.Given); err != nil {
		return err
	}
	for _, n := range s.PreferFree {
		if _, err := LookupQuantity(n); err != nil {
			return err
		}
	}
	if err := check("tuned", s.Tuned); err != nil {
		return err
	}
	tied := make([]string, len(s.Tied))
	for i, t := range s.Tied {
		tied[i] = t.Quantity
	}
	if err := check("tied to the length scale", tied); err != nil {
		return err
	}
	for _, n := range tied {
		if n == "length" {
			return fmt.Errorf("the length scale cannot be tied to itself")
		}
	}
	return nil
}

func joinNames(names []string) string {
	out := ""
	for i, n := range names {
		if i > 0 {
			out += ", "
		}
		out += n
	}
	return out
}
