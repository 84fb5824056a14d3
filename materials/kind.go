package materials

import (
	"fmt"
	"strings"
)

// Kind tells what an entry is: a solid model material, a fluid medium, a
// soil or an ice.
type Kind string

// The kinds, in the order Entries lists them.
const (
	Solid Kind = "solid"
	Fluid Kind = "fluid"
	Soil  Kind = "soil"
	Ice   Kind = "ice"
)

// Kinds returns every kind in listing order.
func Kinds() []Kind { return []Kind{Solid, Fluid, Soil, Ice} }

// rank is the position of the kind in listing order (unknown kinds last).
func (k Kind) rank() int {
	for i, x := range Kinds() {
		if x == k {
			return i
		}
	}
	return len(Kinds())
}

// ParseKind reads a kind name (case-insensitive).
func ParseKind(s string) (Kind, error) {
	k := Kind(strings.ToLower(strings.TrimSpace(s)))
	if k.rank() < len(Kinds()) {
		return k, nil
	}
	return "", fmt.Errorf("kind %q is not one of solid, fluid, soil, ice", s)
}
