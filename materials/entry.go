package materials

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// ConditionRange is a condition an entry takes: its default, the range in
// which the entry's formulas hold (never extrapolated), and whether the
// condition is a tuning knob of the medium (water temperature, tunnel
// pressure, glycerol fraction), in which case every property reports the
// range it sweeps over [Min, Max].
type ConditionRange struct {
	Condition Condition
	Default   float64 // SI
	Min, Max  float64 // valid range, SI
	Tunable   bool
	// Composition marks the mixture fraction of a mixture (glycerol mass
	// fraction, brine salinity): a default for it is never silent, see
	// Entry.Defaulted.
	Composition bool
	Source      string // the formula whose validity sets the range
}

// Entry is one material or medium of the library.
//
// An entry either has fixed properties (solids, soils, ices, silicone oils,
// custom entries), in which case it takes no conditions, or is a fluid whose
// properties are functions of its state (temperature, pressure, salinity,
// glycerol mass fraction) within the ranges of Ranges.
type Entry struct {
	Name        string
	Kind        Kind
	Description string
	Custom      bool             // added from a study, not from the embedded data
	Ranges      []ConditionRange // the conditions it takes; empty for fixed entries

	fixed []Property                  // fixed properties, SI
	model func(Conditions) []Property // state-dependent properties; conditions resolved
}

// Takes reports whether the entry's properties depend on the condition.
func (e Entry) Takes(k Condition) bool {
	_, ok := e.rangeOf(k)
	return ok
}

func (e Entry) rangeOf(k Condition) (ConditionRange, bool) {
	for _, r := range e.Ranges {
		if r.Condition == k {
			return r, true
		}
	}
	return ConditionRange{}, false
}

// Resolve checks the conditions against the entry and fills in the
// defaults: the result gives every condition the entry takes and nothing
// else. A condition the entry does not take, or a value outside the valid
// range, is an error naming the entry.
func (e Entry) Resolve(c Conditions) (Conditions, error) {
	for _, k := range c.Given() {
		if e.Takes(k) {
			continue
		}
		if len(e.Ranges) == 0 {
			return Conditions{}, fmt.Errorf("%s: its properties are fixed (see their sources); it takes no conditions, got %s", e.Name, c)
		}
		if k == MassFraction && e.Takes(Salinity) {
			v, _ := c.Get(k)
			return Conditions{}, fmt.Errorf("%s: takes a salinity, not a glycerol mass fraction (a bare %s%% is read as w); write its salinity as S=%s%% or %sg/kg",
				e.Name, num(v*100), num(v*100), num(v*1000))
		}
		return Conditions{}, fmt.Errorf("%s: does not depend on %s; it takes %s%s", e.Name, k, e.takesList(), otherEntryHint(e.Name, k))
	}
	return e.resolve(c)
}

// Applicable returns the conditions restricted to those the entry takes,
// so that one set of conditions (a sweep's water temperature) can be given
// to every candidate: At(Applicable(c)) ignores what the entry does not
// depend on, and still refuses values outside its ranges.
func (e Entry) Applicable(c Conditions) Conditions {
	for _, k := range c.Given() {
		if !e.Takes(k) {
			c = c.Without(k)
		}
	}
	return c
}

// resolve fills in defaults and checks ranges, ignoring conditions the
// entry does not take.
func (e Entry) resolve(c Conditions) (Conditions, error) {
	var out Conditions
	for _, r := range e.Ranges {
		v, ok := c.Get(r.Condition)
		if !ok {
			v = r.Default
		}
		if !within(v, r.Min, r.Max) {
			return Conditions{}, fmt.Errorf("%s: %s %s is outside the valid range %s (%s; no extrapolation)",
				e.Name, r.Condition, FormatCondition(r.Condition, v), FormatRange(r.Condition, r.Min, r.Max), r.Source)
		}
		out = out.With(r.Condition, clamp(v, r.Min, r.Max))
	}
	return out, nil
}

// otherEntryHint names the entry that does take a condition given to a
// pure substance: glycerol with w= means the mixture.
func otherEntryHint(name string, k Condition) string {
	switch {
	case name == "glycerol" && k == MassFraction:
		return " (glycerol is pure glycerol; for a mixture name water_glycerol with w=)"
	case name == "water" && k == Salinity:
		return " (for salt water name seawater, or brine for a sodium chloride solution)"
	case name == "water" && k == MassFraction:
		return " (for a water–glycerol mixture name water_glycerol)"
	}
	return ""
}

// Defaulted lists the mixture fractions (Composition conditions) the
// conditions leave to the entry's default: water_glycerol without w= is
// taken at w = 0.5, brine without S= at 35 g/kg. Callers print the
// default with the conditions (DefaultNote), so that a name never stands
// silently for a mixture at a default fraction.
func (e Entry) Defaulted(c Conditions) []Condition {
	var out []Condition
	for _, r := range e.Ranges {
		if _, ok := c.Get(r.Condition); r.Composition && !ok {
			out = append(out, r.Condition)
		}
	}
	return out
}

// DefaultNote says which mixture fractions were taken by default, e.g.
// "w = 0.5 by default: give w= for another mixture", or "" when none.
func (e Entry) DefaultNote(c Conditions) string {
	var parts []string
	for _, k := range e.Defaulted(c) {
		r, _ := e.rangeOf(k)
		key := "w="
		if k == Salinity {
			key = "S="
		}
		parts = append(parts, fmt.Sprintf("%s by default: give %s for another mixture", FormatCondition(k, r.Default), key))
	}
	return strings.Join(parts, "; ")
}

func (e Entry) takesList() string {
	var names []string
	for _, r := range e.Ranges {
		names = append(names, string(r.Condition))
	}
	return strings.Join(names, " and ")
}

// within allows a rounding error at the ends of a range (20C parses to
// 293.15 K exactly, but 0 °C - 273.15 K arithmetic may not).
func within(v, lo, hi float64) bool {
	eps := 1e-9 * math.Max(math.Abs(lo), math.Abs(hi))
	return v >= lo-eps && v <= hi+eps
}

func clamp(v, lo, hi float64) float64 { return math.Min(math.Max(v, lo), hi) }

// At returns the entry's properties in SI at the conditions (defaults for
// those not given: 20 °C, 101325 Pa, 35 g/kg, w = 0.5, as the entry's
// Ranges say), sorted by quantity name. Tunable properties carry their
// range in Min and Max.
func (e Entry) At(c Conditions) ([]Property, error) {
	rc, err := e.Resolve(c)
	if err != nil {
		return nil, err
	}
	return e.eval(rc), nil
}

// Property returns one property at the conditions; an entry that lacks it
// is an error.
func (e Entry) Property(quantity string, c Conditions) (Property, error) {
	props, err := e.At(c)
	if err != nil {
		return Property{}, err
	}
	for _, p := range props {
		if p.Quantity == quantity {
			return p, nil
		}
	}
	return Property{}, fmt.Errorf("%s has no %s (it has %s)", e.Name, quantity, quantityList(props))
}

// Quantities lists the quantities the entry gives, sorted.
func (e Entry) Quantities() []string {
	var c Conditions
	for _, r := range e.Ranges {
		c = c.With(r.Condition, r.Default)
	}
	// The values alone: the tunable ranges eval adds cost a sweep of
	// every knob and do not change which quantities there are.
	v := e.values(c)
	out := make([]string, 0, len(v))
	for q := range v {
		out = append(out, q)
	}
	sort.Strings(out)
	return out
}

func quantityList(props []Property) string {
	names := make([]string, len(props))
	for i, p := range props {
		names[i] = p.Quantity
	}
	return strings.Join(names, ", ")
}

// tuningSteps is the number of intervals each tunable condition's range is
// sampled in to find the range of every property (the ends included; a
// property with an extremum inside the range, water density near 4 °C, is
// found to within the step).
const tuningSteps = 40

// eval computes the properties at resolved conditions.
func (e Entry) eval(rc Conditions) []Property {
	if e.model == nil {
		return complete(append([]Property(nil), e.fixed...))
	}
	props := complete(e.model(rc))
	var knobs []ConditionRange
	for _, r := range e.Ranges {
		if r.Tunable {
			knobs = append(knobs, r)
		}
	}
	if len(knobs) == 0 {
		return props
	}
	lo := make(map[string]float64, len(props))
	hi := make(map[string]float64, len(props))
	for _, p := range props {
		lo[p.Quantity], hi[p.Quantity] = p.Value, p.Value
	}
	var sweep func(i int, c Conditions)
	sweep = func(i int, c Conditions) {
		if i == len(knobs) {
			for _, p := range derive(e.model(c)) {
				lo[p.Quantity] = math.Min(lo[p.Quantity], p.Value)
				hi[p.Quantity] = math.Max(hi[p.Quantity], p.Value)
			}
			return
		}
		r := knobs[i]
		for s := 0; s <= tuningSteps; s++ {
			v := r.Min + (r.Max-r.Min)*float64(s)/tuningSteps
			sweep(i+1, c.With(r.Condition, v))
		}
	}
	sweep(0, rc)
	for i, p := range props {
		if !sameValue(lo[p.Quantity], hi[p.Quantity]) {
			props[i].Min, props[i].Max = lo[p.Quantity], hi[p.Quantity]
		}
	}
	return props
}
