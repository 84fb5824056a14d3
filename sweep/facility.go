package sweep

import (
	"bytes"
	"embed"
	"encoding/csv"
	"fmt"
	"slices"
	"sort"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

//go:embed data/capabilities.csv data/default_limits.csv
var facilityData embed.FS

// Capability is a named capability a facility type may state.
type Capability struct {
	Type, Name, Unit, Meaning string
	Dim                       feasibility.Dimension
}

// DefaultLimit is a limit every facility of a type brings unless the study
// overrides it by name.
type DefaultLimit struct {
	Type, Name, Expression, Source string
	Limit                          *feasibility.Limit
}

// FacilityCatalog is the facility types with their capabilities and
// default limits, read from the embedded data. Build one with
// NewFacilityCatalog; it is read-only afterwards.
type FacilityCatalog struct {
	types        []string
	capabilities map[string][]Capability // by type ("any" for every type)
	limits       map[string][]DefaultLimit
}

// AnyType is the pseudo-type whose capabilities and limits apply to every
// facility.
const AnyType = "any"

func readCSV(name string) ([][]string, error) {
	b, err := facilityData.ReadFile(name)
	if err != nil {
		return nil, err
	}
	rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil {
		return nil, fmt.Errorf("%s: %v", name, err)
	}
	return rows[1:], nil
}

// NewFacilityCatalog reads the embedded facility data.
func NewFacilityCatalog() (*FacilityCatalog, error) {
	c := &FacilityCatalog{capabilities: map[string][]Capability{}, limits: map[string][]DefaultLimit{}}
	rows, err := readCSV("data/capabilities.csv")
	if err != nil {
		return nil, err
	}
	seen := map[string]bool{}
	for i, r := range rows {
		u, err := feasibility.ParseUnit(r[2])
		if err != nil {
			return nil, fmt.Errorf("capabilities.csv row %d: %v", i+2, err)
		}
		c.capabilities[r[0]] = append(c.capabilities[r[0]], Capability{r[0], r[1], r[2], r[3], u.Dim})
		if r[0] != AnyType && !seen[r[0]] {
			seen[r[0]] = true
			c.types = append(c.types, r[0])
		}
	}
	sort.Strings(c.types)
	rows, err = readCSV("data/default_limits.csv")
	if err != nil {
		return nil, err
	}
	for i, r := range rows {
		l, err := feasibility.ParseLimit(r[2])
		if err != nil {
			return nil, fmt.Errorf("default_limits.csv row %d: %v", i+2, err)
		}
		c.limits[r[0]] = append(c.limits[r[0]], DefaultLimit{r[0], r[1], r[2], r[3], l})
	}
	return c, nil
}

// Types returns the facility types, sorted.
func (c *FacilityCatalog) Types() []string { return append([]string(nil), c.types...) }

// HasType reports whether t is a known facility type.
func (c *FacilityCatalog) HasType(t string) bool {
	_, ok := c.capabilities[t]
	return ok && t != AnyType
}

// Capabilities returns the capabilities of a type, those of every type
// included.
func (c *FacilityCatalog) Capabilities(t string) []Capability {
	return append(append([]Capability(nil), c.capabilities[t]...), c.capabilities[AnyType]...)
}

// Capability returns one capability of a type.
func (c *FacilityCatalog) Capability(t, name string) (Capability, bool) {
	for _, cp := range c.Capabilities(t) {
		if cp.Name == name {
			return cp, true
		}
	}
	return Capability{}, false
}

// CapabilityNames returns the names of a type's capabilities.
func (c *FacilityCatalog) CapabilityNames(t string) []string {
	var names []string
	for _, cp := range c.Capabilities(t) {
		names = append(names, cp.Name)
	}
	return names
}

// DefaultLimits returns the default limits of a type, those of every type
// included.
func (c *FacilityCatalog) DefaultLimits(t string) []DefaultLimit {
	return append(append([]DefaultLimit(nil), c.limits[t]...), c.limits[AnyType]...)
}

// prepareFacilities checks the Facilities sheet: each facility's type
// and capabilities, gathered by facility name.
func (p *Plan) prepareFacilities(ps *study.Problems) {
	byName := map[string]*Facility{}
	for _, r := range p.Study.Facilities {
		name := strings.TrimSpace(r.Facility)
		if name == "" {
			ps.Add(study.At("Facilities", r.Row, "facility"), "the facility name is empty")
			continue
		}
		f, ok := byName[name]
		typ := strings.TrimSpace(r.Type)
		if !ok {
			if !p.Catalog.HasType(typ) {
				ps.Add(study.At("Facilities", r.Row, "type"), "unknown facility type %q%s", typ, feasibility.Suggest(typ, p.Catalog.Types()))
				byName[name] = &Facility{Name: name}
				continue
			}
			f = &Facility{Name: name, Type: typ, Caps: map[string]float64{}, CapUnits: map[string]string{}, Row: r.Row}
			byName[name] = f
			p.Facilities = append(p.Facilities, f)
		} else if f.Type == "" {
			continue
		} else if typ != "" && typ != f.Type {
			ps.Add(study.At("Facilities", r.Row, "type"), "facility %q is a %s on row %d; one facility has one type", name, f.Type, f.Row)
			continue
		}
		capName := strings.TrimSpace(r.Capability)
		cp, ok := p.Catalog.Capability(f.Type, capName)
		if !ok {
			ps.Add(study.At("Facilities", r.Row, "capability"), "a %s has no capability %q%s", f.Type, capName, feasibility.Suggest(capName, p.Catalog.CapabilityNames(f.Type)))
			continue
		}
		if _, dup := f.Caps[capName]; dup {
			ps.Add(study.At("Facilities", r.Row, "capability"), "capability %s of %q is set twice", capName, name)
			continue
		}
		value, unit, err := study.TimeValue(r.Value, r.Unit, cp.Dim)
		if err != nil {
			ps.Add(study.At("Facilities", r.Row, "value"), "%v", err)
			p.failed.add(name, capName)
			continue
		}
		v, u, err := feasibility.ParseValue(strings.TrimSpace(value + " " + unit))
		if err != nil {
			ps.Add(study.At("Facilities", r.Row, "value"), "%v", err)
			p.failed.add(name, capName)
			continue
		}
		if u.Text != "" && !u.Dim.Equal(cp.Dim) {
			ps.Add(study.At("Facilities", r.Row, "unit"), "unit %q does not fit %s (needs %s, got %s; e.g. %s)", u.Text, capName, cp.Dim, u.Dim, cp.Unit)
			p.failed.add(name, capName)
			continue
		}
		if !(v > 0) {
			ps.Add(study.At("Facilities", r.Row, "value"), "%s must be positive, got %v", capName, v)
			p.failed.add(name, capName)
			continue
		}
		f.Caps[capName] = v
		f.CapUnits[capName] = cp.Unit
	}
}

func (p *Plan) pickFacilities(list string, cell study.Cell, ps *study.Problems) []*Facility {
	names := splitNames(list)
	if len(names) == 0 {
		return p.Facilities
	}
	known := make([]string, len(p.Facilities))
	for i, f := range p.Facilities {
		known[i] = f.Name
	}
	var out []*Facility
	for _, n := range names {
		i := slices.Index(known, n)
		if i < 0 {
			ps.Add(cell, "no facility named %q on the Facilities sheet%s", n, feasibility.Suggest(n, known))
			continue
		}
		out = append(out, p.Facilities[i])
	}
	return out
}

func (p *Plan) facility(name string) *Facility {
	for _, f := range p.Facilities {
		if f.Name == name {
			return f
		}
	}
	return nil
}
