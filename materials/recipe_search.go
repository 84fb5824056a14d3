package materials

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// Search is the outcome of a search of the whole library.
type Search struct {
	Met     []Recipe // entries meeting the spec, best first
	Nearest []Recipe // when none meets: each entry's nearest, nearest first
	Skipped []string // entries not tried, with the reason
	// When none meets: the extreme the searched entries can make on the
	// side of the requirement (the least viscous liquid, for a viscosity
	// below all of them), and a sentence saying so.
	Extreme *Recipe
	Reason  string
}

// FindRecipes tries every entry that has the target's quantity and that
// the filter accepts (nil: all), each at its own conditions (spec.At
// applies where the entry takes the condition). Met lists the recipes
// meeting the spec by the tolerance reached, then by the number of
// conditions moved, then by name; when none meets, Nearest lists each
// entry's nearest recipe by |ln(value/required)|. An entry whose range
// shows it cannot meet a constant target is not solved (see Searcher).
func (l *Library) FindRecipes(spec RecipeSpec, filter func(Entry) bool) Search {
	return l.Searcher().FindRecipes(spec, filter)
}

// extremeFunc is one entry's extreme of a property (extremeOf, or a
// Searcher's remembered one). findRecipes with a nil extremeFunc solves
// every entry, screening none.
type extremeFunc func(e Entry, quantity string, sign float64, limits map[Condition]Range) (Recipe, error)

func (l *Library) findRecipes(spec RecipeSpec, filter func(Entry) bool, extreme extremeFunc) Search {
	var out Search
	for _, e := range l.Entries() {
		if filter != nil && !filter(e) || !hasQuantity(e, spec.Target.Quantity) {
			continue
		}
		sp := spec
		sp.At = e.Applicable(spec.At)
		if r, ok := screened(e, sp, extreme); ok {
			out.Nearest = append(out.Nearest, r)
			continue
		}
		r, err := e.Recipe(sp)
		if err != nil {
			out.Skipped = append(out.Skipped, err.Error())
			continue
		}
		if r.Met {
			out.Met = append(out.Met, r)
		} else {
			out.Nearest = append(out.Nearest, r)
		}
	}
	sort.SliceStable(out.Met, func(i, j int) bool {
		a, b := out.Met[i], out.Met[j]
		if x, y := a.Reached(), b.Reached(); x != y {
			return x < y
		}
		if len(a.Tuned) != len(b.Tuned) {
			return len(a.Tuned) < len(b.Tuned)
		}
		return a.Entry < b.Entry
	})
	if len(out.Met) > 0 {
		out.Nearest = nil
		return out
	}
	logOff := func(r Recipe) float64 { return math.Abs(math.Log1p(r.Target.Deviation)) }
	sort.SliceStable(out.Nearest, func(i, j int) bool {
		if x, y := logOff(out.Nearest[i]), logOff(out.Nearest[j]); x != y {
			return x < y
		}
		return out.Nearest[i].Entry < out.Nearest[j].Entry
	})
	q := spec.Target.Quantity
	if len(out.Nearest) == 0 {
		out.Reason = fmt.Sprintf("no entry searched has %s", q)
		return out
	}
	best := out.Nearest[0]
	lowest := best.Target.Value > best.Target.Required
	side := "highest"
	if lowest {
		side = "lowest"
	}
	out.Reason = fmt.Sprintf("%s %s: no entry searched can be brought to it within its tolerance", q, withUnit(q, best.Target.Required))
	if extreme == nil {
		extreme = extremeOf
	}
	if ext, err := l.extreme(q, lowest, spec.Limits, filter, extreme); err == nil {
		out.Extreme = &ext
		out.Reason += fmt.Sprintf("; the %s %s they can make is %s (%s at %s)", side, q, withUnit(q, ext.Target.Value), ext.Entry, ext.Conditions)
	}
	return out
}

func hasQuantity(e Entry, q string) bool {
	for _, x := range e.Quantities() {
		if x == q {
			return true
		}
	}
	return false
}

// Liquids accepts the fluids that are liquids: fluids that take no
// pressure (the gases do) and are denser than 200 kg/m³ at their defaults.
func Liquids(e Entry) bool {
	if e.Kind != Fluid || e.Takes(Pressure) {
		return false
	}
	v, err := e.ValuesAt(Conditions{})
	if err != nil {
		return false
	}
	rho, ok := v["density"]
	return !ok || rho > 200
}

// ErrNoEntry is returned by Extreme when no entry has the quantity.
var ErrNoEntry = errors.New("no entry of the library has that property")

// Extreme finds the lowest (or, with lowest false, the highest) value of a
// property that the entries accepted by filter (nil: all) can be brought
// to within their valid ranges narrowed by limits, and the recipe giving
// it: "the least viscous liquid the library can make". Fixed entries count
// with their value (or the end of a tunable range).
func (l *Library) Extreme(quantity string, lowest bool, limits map[Condition]Range, filter func(Entry) bool) (Recipe, error) {
	return l.extreme(quantity, lowest, limits, filter, extremeOf)
}

func (l *Library) extreme(quantity string, lowest bool, limits map[Condition]Range, filter func(Entry) bool, extremeOf extremeFunc) (Recipe, error) {
	var best Recipe
	found := false
	sign := 1.0
	if !lowest {
		sign = -1
	}
	for _, e := range l.Entries() {
		if filter != nil && !filter(e) || !hasQuantity(e, quantity) {
			continue
		}
		r, err := extremeOf(e, quantity, sign, limits)
		if err != nil {
			continue
		}
		if !found || extremeBetter(r, best, sign) {
			best, found = r, true
		}
	}
	if !found {
		return Recipe{}, fmt.Errorf("%s: %w", quantity, ErrNoEntry)
	}
	return best, nil
}

// extremeBetter says whether r beats best as the extreme. Values within
// 0.5 % of each other are the same for a planner; then the recipe that
// moves fewer conditions wins, so a pure liquid is named rather than a
// mixture or solution brought to its pure end (water, not brine with no
// salt).
func extremeBetter(r, best Recipe, sign float64) bool {
	if math.Abs(r.Target.Value-best.Target.Value) <= 0.005*math.Abs(best.Target.Value) {
		return len(r.Tuned) < len(best.Tuned)
	}
	return sign*r.Target.Value < sign*best.Target.Value
}

// extremeOf is one entry's extreme of a property over its free conditions.
func extremeOf(e Entry, quantity string, sign float64, limits map[Condition]Range) (Recipe, error) {
	s, err := newSolver(e, RecipeSpec{Target: Target{Quantity: quantity, Of: func(p map[string]float64) float64 { return p[quantity] }}, Limits: limits})
	if err != nil {
		return Recipe{}, err
	}
	if e.model == nil {
		v := s.e.values(Conditions{})
		for _, p := range e.fixed {
			if p.Quantity == quantity && p.Tunable() {
				v[quantity] = p.Min
				if sign < 0 {
					v[quantity] = p.Max
				}
			}
		}
		return Recipe{Entry: e.Name, Kind: e.Kind, Method: "fixed properties",
			Target: Check{Quantity: quantity, Value: v[quantity], Required: v[quantity], Met: true}, Met: true}, nil
	}
	var all []int
	for i, k := range s.knobs {
		if k.moveable {
			all = append(all, i)
		}
	}
	c := s.base
	if len(all) > 0 {
		b := box{s: s, idx: all}
		obj := func(c Conditions) float64 {
			v := s.e.values(c)[quantity]
			if !(v > 0) {
				return math.MaxFloat64
			}
			return sign * math.Log(v)
		}
		c, _ = b.minimize(obj, b.seeds(obj, 3, 6))
	}
	v := s.e.values(c)[quantity]
	r := Recipe{Entry: e.Name, Kind: e.Kind, Conditions: c, Method: "extreme: gonum Nelder–Mead over " + s.knobList(all),
		Target: Check{Quantity: quantity, Value: v, Required: v, Met: true}, Met: true}
	for _, k := range s.knobs {
		if x, _ := c.Get(k.cond); !sameValue(x, k.prefer) {
			r.Tuned = append(r.Tuned, k.cond)
		}
	}
	return r, nil
}
