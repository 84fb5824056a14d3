package materials

import (
	"errors"
	"fmt"
	"strings"

	"scaleplan/feasibility"
)

// CustomEntry is a material or medium a study defines itself, with fixed
// properties, as read from a study sheet. Library.Add validates it.
type CustomEntry struct {
	Name        string
	Kind        string // solid, fluid, soil or ice
	Description string
	Properties  []CustomProperty
}

// CustomProperty is one property of a custom entry, as text. Value, Min
// and Max are numbers, either bare with the unit in Unit ("40" and
// "kg/m^3") or carrying their unit when Unit is empty ("40 kg/m^3"); with
// no unit at all they are SI (write nothing or "1" for a dimensionless
// property).
type CustomProperty struct {
	Quantity string // a material property of package feasibility (density, modulus, ...)
	Value    string
	Unit     string
	Min, Max string // tunable range; both empty when fixed
	Source   string // "" is recorded as "study input"
}

// build validates the entry and converts it to a library entry. Errors name
// the entry and the property: `material "my foam": poisson 0.7 is outside
// 0–0.5`.
func (c CustomEntry) build() (Entry, error) {
	name := strings.TrimSpace(c.Name)
	if name == "" {
		return Entry{}, errors.New("a custom material needs a name")
	}
	fail := func(err error) (Entry, error) {
		return Entry{}, fmt.Errorf("material %q: %v", name, err)
	}
	if strings.TrimSpace(c.Kind) == "" {
		return fail(errors.New("no kind given (solid, fluid, soil or ice)"))
	}
	kind, err := ParseKind(c.Kind)
	if err != nil {
		return fail(err)
	}
	if len(c.Properties) == 0 {
		return fail(errors.New("no properties given"))
	}
	props := make([]Property, 0, len(c.Properties))
	for _, cp := range c.Properties {
		p, err := cp.build()
		if err != nil {
			return fail(err)
		}
		props = append(props, p)
	}
	if err := checkSet(props); err != nil {
		return fail(err)
	}
	sortProperties(props)
	return Entry{Name: name, Kind: kind, Description: strings.TrimSpace(c.Description), Custom: true, fixed: props}, nil
}

func (cp CustomProperty) build() (Property, error) {
	q, err := materialQuantity(strings.TrimSpace(cp.Quantity))
	if err != nil {
		return Property{}, err
	}
	v, err := customValue(q, "value", cp.Value, cp.Unit)
	if err != nil {
		return Property{}, err
	}
	var lo, hi float64
	hasRange := strings.TrimSpace(cp.Min) != "" || strings.TrimSpace(cp.Max) != ""
	if hasRange {
		if strings.TrimSpace(cp.Min) == "" || strings.TrimSpace(cp.Max) == "" {
			return Property{}, fmt.Errorf("%s: give both min and max of the tunable range, or neither", q.Name)
		}
		if lo, err = customValue(q, "min", cp.Min, cp.Unit); err != nil {
			return Property{}, err
		}
		if hi, err = customValue(q, "max", cp.Max, cp.Unit); err != nil {
			return Property{}, err
		}
	}
	src := strings.TrimSpace(cp.Source)
	if src == "" {
		src = "study input"
	}
	return checkedProperty(q, v, lo, hi, hasRange, src)
}

// customValue reads one number of a custom property in SI, with its unit
// in the text or in unit, checked against the quantity's dimension.
func customValue(q feasibility.Quantity, field, text, unit string) (float64, error) {
	text, unit = strings.TrimSpace(text), strings.TrimSpace(unit)
	if text == "" {
		return 0, fmt.Errorf("%s: no %s given", q.Name, field)
	}
	if unit == "1" && q.Dim.IsDimensionless() {
		unit = ""
	}
	v, u, err := feasibility.ParseValue(strings.TrimSpace(text + " " + unit))
	if err != nil {
		return 0, fmt.Errorf("%s: %v", q.Name, err)
	}
	if u.Text != "" && !u.Dim.Equal(q.Dim) {
		return 0, fmt.Errorf("%s: unit %q does not fit (needs %s, got %s)", q.Name, u.Text, q.Dim, u.Dim)
	}
	return v, nil
}
