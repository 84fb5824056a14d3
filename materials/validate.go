package materials

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
)

// materialQuantity checks that a quantity name is a material property
// (a quantity of kind Property in package feasibility).
func materialQuantity(name string) (feasibility.Quantity, error) {
	q, err := feasibility.LookupQuantity(name)
	if err != nil {
		return q, err
	}
	if q.Kind != feasibility.Property {
		var props []string
		for _, x := range feasibility.Quantities() {
			if x.Kind == feasibility.Property {
				props = append(props, x.Name)
			}
		}
		return q, fmt.Errorf("%q is not a material property (properties: %s)", name, strings.Join(props, ", "))
	}
	return q, nil
}

// checkValue refuses a value a property cannot have: a message such as
// "poisson 0.7 is outside 0–0.5".
func checkValue(q feasibility.Quantity, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%s %v is not a finite number", q.Name, v)
	}
	switch q.Name {
	case "poisson":
		if v < 0 || v > 0.5 {
			return fmt.Errorf("poisson %s is outside 0–0.5", num(v))
		}
	case "friction", "cohesion":
		if v < 0 {
			return fmt.Errorf("%s %s %s is negative", q.Name, num(v), q.SI)
		}
	default:
		if v <= 0 {
			return fmt.Errorf("%s %s %s is not positive", q.Name, num(v), q.SI)
		}
	}
	return nil
}

// toSI converts a value in the named unit ("" or "1" for SI or
// dimensionless) to SI, checking the unit fits the quantity.
func toSI(q feasibility.Quantity, v float64, unit string) (float64, error) {
	unit = strings.TrimSpace(unit)
	if unit == "" || (unit == "1" && q.Dim.IsDimensionless()) {
		return v, nil
	}
	u, err := feasibility.ParseUnit(unit)
	if err != nil {
		return 0, fmt.Errorf("%s: %v", q.Name, err)
	}
	if !u.Dim.Equal(q.Dim) {
		return 0, fmt.Errorf("%s: unit %q does not fit (needs %s, got %s)", q.Name, unit, q.Dim, u.Dim)
	}
	return u.ToSI(v), nil
}

// buildProperty converts and checks one property given in a unit: value
// and optional tunable range [lo, hi] (hasRange false: fixed).
func buildProperty(quantity string, v, lo, hi float64, hasRange bool, unit, source string) (Property, error) {
	q, err := materialQuantity(quantity)
	if err != nil {
		return Property{}, err
	}
	if v, err = toSI(q, v, unit); err != nil {
		return Property{}, err
	}
	if hasRange {
		if lo, err = toSI(q, lo, unit); err != nil {
			return Property{}, err
		}
		if hi, err = toSI(q, hi, unit); err != nil {
			return Property{}, err
		}
	}
	return checkedProperty(q, v, lo, hi, hasRange, source)
}

// checkedProperty checks a property in SI: the value, and the range if any
// (valid at both ends, not empty, holding the value).
func checkedProperty(q feasibility.Quantity, v, lo, hi float64, hasRange bool, source string) (Property, error) {
	p := Property{Quantity: q.Name, Value: v, Source: source}
	if err := checkValue(q, p.Value); err != nil {
		return Property{}, err
	}
	if !hasRange {
		return p, nil
	}
	p.Min, p.Max = lo, hi
	for _, x := range []float64{p.Min, p.Max} {
		if err := checkValue(q, x); err != nil {
			return Property{}, fmt.Errorf("range: %v", err)
		}
	}
	if !(p.Min < p.Max) {
		return Property{}, fmt.Errorf("%s range %s–%s %s is empty (min must be below max)", q.Name, num(p.Min), num(p.Max), q.SI)
	}
	if !within(p.Value, p.Min, p.Max) {
		return Property{}, fmt.Errorf("%s %s is outside its range %s–%s %s", q.Name, num(p.Value), num(p.Min), num(p.Max), q.SI)
	}
	return p, nil
}

// checkSet checks a set of properties of one entry: no quantity twice, and
// density, viscosity and kinematic viscosity consistent when all three are
// given (ν = μ/ρ within 1 %).
func checkSet(props []Property) error {
	seen := map[string]Property{}
	for _, p := range props {
		if _, dup := seen[p.Quantity]; dup {
			return fmt.Errorf("%s is given twice", p.Quantity)
		}
		seen[p.Quantity] = p
	}
	rho, ok1 := seen["density"]
	mu, ok2 := seen["viscosity"]
	nu, ok3 := seen["kinematic_viscosity"]
	if ok1 && ok2 && ok3 {
		if want := mu.Value / rho.Value; math.Abs(nu.Value-want) > 0.01*want {
			return fmt.Errorf("kinematic_viscosity %s m^2/s disagrees with viscosity/density = %s m^2/s (give two of the three)", num(nu.Value), num(want))
		}
	}
	return nil
}
