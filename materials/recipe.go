package materials

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
)

// Recipes: the conditions (mixture fraction, salinity, temperature,
// pressure) that bring an entry to a required property, every other
// required property holding at the same conditions.
//
// How a recipe is solved:
//
//  1. The study's preferred conditions (At, typically its water
//     temperature) are kept, and the mixture knob alone is moved (glycerol
//     fraction, salinity, gas pressure; the temperature for a fluid that
//     has no other knob). Its valid range is sampled at recipeSamples
//     points to bracket every sign change of ln(value/required), and each
//     bracket is closed by bisection. gonum v0.17 has no scalar root
//     finder; a bracketed bisection is guaranteed to converge for any
//     continuous requirement (a required value that depends on the
//     candidate's own density need not be monotone), never leaves the valid
//     range, and costs some 60 evaluations of closed-form correlations.
//  2. If no root there meets every requirement, all free conditions move
//     together (the temperature too): gonum's Nelder–Mead minimises the
//     squared excess of every requirement beyond its tolerance, over the
//     ranges mapped onto the real line (x = lo + (hi − lo)(1 + sin u)/2),
//     from the preferred point and the best points of a coarse sample; the
//     target is then re-solved by bisection at the conditions found.
//  3. If still nothing meets the requirements, the conditions that come
//     nearest (in ln(value/required), the other requirements as penalties)
//     are reported with the value reached: the recipe is "none".

// DefaultRecipeTolerance is the relative tolerance of a recipe when the
// spec gives none.
const DefaultRecipeTolerance = 0.01

// recipeSamples is the number of intervals each condition's range is
// sampled in to bracket roots and seed the optimiser.
const recipeSamples = 48

// Target is a required value of one property.
type Target struct {
	Quantity string // a quantity name of package feasibility
	// Value is the required value (SI), used when Of is nil.
	Value float64
	// Of, when set, gives the required value (SI) from the candidate's own
	// properties at the conditions tried (SI, by quantity name): the
	// viscosity a model needs depends on the model fluid's density through
	// the density scale.
	Of func(props map[string]float64) float64
	// Tolerance is the relative tolerance; 0 takes the spec's.
	Tolerance float64
}

// Range is an interval of a condition, SI.
type Range struct{ Min, Max float64 }

// RecipeSpec states what a recipe must achieve and what it may move.
type RecipeSpec struct {
	Target Target   // the property solved for
	Also   []Target // properties that must hold at the same conditions
	// Tolerance is the relative tolerance of every target that gives none;
	// 0 means DefaultRecipeTolerance.
	Tolerance float64
	// At are the preferred conditions (the study's temperature): a recipe
	// keeps them when it can, and moves them within range when it cannot.
	At Conditions
	// Hold lists conditions never moved from At (or from the entry's
	// default when At does not give them).
	Hold []Condition
	// Limits narrow the valid ranges of conditions (a tank that can be
	// held between 10 and 30 °C).
	Limits map[Condition]Range
}

// Check is one requirement evaluated at a recipe's conditions.
type Check struct {
	Quantity  string
	Value     float64 // the entry's value, SI
	Required  float64 // SI
	Deviation float64 // (Value − Required)/Required
	Tolerance float64 // relative
	Met       bool
}

// Recipe is the outcome for one entry: the conditions meeting the spec
// (Met), or those coming nearest (not Met, the recipe is "none").
type Recipe struct {
	Entry      string
	Kind       Kind
	Conditions Conditions  // every condition the entry takes
	Tuned      []Condition // conditions moved away from the preferred values
	Target     Check
	Also       []Check
	Met        bool
	Method     string // how it was found
}

// String is the short form of a recipe, e.g. "water_glycerol: 20 °C,
// w = 0.8712 (kinematic_viscosity 1e-05 m^2/s, 0.02 % off)" or, when not
// met, "none: nearest water_glycerol: ...".
func (r Recipe) String() string {
	cond := r.Conditions.String()
	if cond == "" {
		cond = "as supplied"
	}
	s := fmt.Sprintf("%s: %s (%s %s, %s %% off)", r.Entry, cond, r.Target.Quantity, withUnit(r.Target.Quantity, r.Target.Value), num(100*r.Target.Deviation))
	if !r.Met {
		return "none: nearest " + s
	}
	return s
}

// withUnit prints an SI value with the SI unit of its quantity.
func withUnit(quantity string, v float64) string {
	if q, err := feasibility.LookupQuantity(quantity); err == nil && q.SI != "" && q.SI != "1" {
		return num(v) + " " + q.SI
	}
	return num(v)
}

// Reached is the largest |deviation| over the target and the other
// requirements: the tolerance the recipe reached.
func (r Recipe) Reached() float64 {
	worst := math.Abs(r.Target.Deviation)
	for _, c := range r.Also {
		worst = math.Max(worst, math.Abs(c.Deviation))
	}
	return worst
}

// ValuesAt returns the entry's property values (SI, by quantity) at the
// conditions, defaults filled in and ranges checked. Unlike At it does not
// compute tunable ranges, so it is cheap enough to call in a loop.
func (e Entry) ValuesAt(c Conditions) (map[string]float64, error) {
	rc, err := e.Resolve(e.Applicable(c))
	if err != nil {
		return nil, err
	}
	return e.values(rc), nil
}

func (e Entry) values(rc Conditions) map[string]float64 {
	var props []Property
	if e.model == nil {
		props = derive(append([]Property(nil), e.fixed...))
	} else {
		props = derive(e.model(rc))
	}
	out := make(map[string]float64, len(props))
	for _, p := range props {
		out[p.Quantity] = p.Value
	}
	return out
}

// knob is a condition a recipe may move, within [lo, hi].
type knob struct {
	cond     Condition
	lo, hi   float64
	prefer   float64
	moveable bool
}

// solver holds one entry's recipe problem.
type solver struct {
	e     Entry
	spec  RecipeSpec
	knobs []knob
	base  Conditions // every condition at its preferred value
	reqs  []Target   // target first, then Also, tolerances filled in
}

// Recipe finds conditions within the entry's valid ranges (narrowed by
// spec.Limits) at which the target holds within tolerance together with
// every Also requirement, preferring spec.At. An unmet requirement is not
// an error: the recipe comes back with Met false and the nearest
// conditions. Errors are for a spec that cannot be tried: a quantity the
// entry lacks, a required value that is not positive and finite, a held
// condition outside the valid range, limits that exclude the valid range.
func (e Entry) Recipe(spec RecipeSpec) (Recipe, error) {
	s, err := newSolver(e, spec)
	if err != nil {
		return Recipe{}, err
	}
	return s.solve()
}

// Evaluate checks the spec's requirements at given conditions without
// solving: whether a recipe found at one scale also serves another, or
// what a candidate gives at the study's conditions. The conditions are
// resolved like At's (defaults filled in, ranges checked; those the entry
// does not take are ignored).
func (e Entry) Evaluate(spec RecipeSpec, c Conditions) (Recipe, error) {
	s, err := newSolver(e, spec)
	if err != nil {
		return Recipe{}, err
	}
	rc, err := e.Resolve(e.Applicable(c))
	if err != nil {
		return Recipe{}, err
	}
	if e.model == nil {
		return s.solveFixed(), nil
	}
	return s.recipe(rc, "evaluated at given conditions"), nil
}

func newSolver(e Entry, spec RecipeSpec) (*solver, error) {
	tol := spec.Tolerance
	if tol == 0 {
		tol = DefaultRecipeTolerance
	}
	if !(tol > 0) || math.IsInf(tol, 0) {
		return nil, fmt.Errorf("%s: recipe tolerance %v is not a positive number", e.Name, spec.Tolerance)
	}
	have := map[string]bool{}
	for _, q := range e.Quantities() {
		have[q] = true
	}
	s := &solver{e: e, spec: spec}
	for _, t := range append([]Target{spec.Target}, spec.Also...) {
		if !have[t.Quantity] {
			return nil, fmt.Errorf("%s has no %s (it has %s)", e.Name, t.Quantity, strings.Join(e.Quantities(), ", "))
		}
		if t.Of == nil && !(t.Value > 0 && !math.IsInf(t.Value, 0)) {
			return nil, fmt.Errorf("%s: required %s %v is not a positive finite value", e.Name, t.Quantity, t.Value)
		}
		if t.Tolerance == 0 {
			t.Tolerance = tol
		}
		if !(t.Tolerance > 0) {
			return nil, fmt.Errorf("%s: tolerance of %s %v is not positive", e.Name, t.Quantity, t.Tolerance)
		}
		s.reqs = append(s.reqs, t)
	}
	held := map[Condition]bool{}
	for _, k := range spec.Hold {
		held[k] = true
	}
	for _, r := range e.Ranges {
		lo, hi := r.Min, r.Max
		if lim, ok := spec.Limits[r.Condition]; ok {
			lo, hi = math.Max(lo, lim.Min), math.Min(hi, lim.Max)
			if !(lo <= hi) {
				return nil, fmt.Errorf("%s: the limits %s leave nothing of its valid range %s of %s",
					e.Name, FormatRange(r.Condition, lim.Min, lim.Max), FormatRange(r.Condition, r.Min, r.Max), r.Condition)
			}
		}
		v, given := spec.At.Get(r.Condition)
		if !given {
			v = r.Default
		}
		if held[r.Condition] && !within(v, lo, hi) {
			return nil, fmt.Errorf("%s: %s is held at %s, outside %s (%s)",
				e.Name, r.Condition, FormatCondition(r.Condition, v), FormatRange(r.Condition, lo, hi), r.Source)
		}
		v = clamp(v, lo, hi)
		s.base = s.base.With(r.Condition, v)
		s.knobs = append(s.knobs, knob{cond: r.Condition, lo: lo, hi: hi, prefer: v, moveable: !held[r.Condition] && lo < hi})
	}
	return s, nil
}

// required is a requirement's value at the given properties.
func (t Target) required(props map[string]float64) float64 {
	if t.Of != nil {
		return t.Of(props)
	}
	return t.Value
}

// logDev is ln(value/required) of requirement i at conditions c; +Inf when
// the required value is not positive and finite.
func (s *solver) logDev(i int, props map[string]float64) float64 {
	req := s.reqs[i].required(props)
	v := props[s.reqs[i].Quantity]
	if !(req > 0) || math.IsInf(req, 0) || !(v > 0) {
		return math.Inf(1)
	}
	return math.Log(v / req)
}

// excess is how far requirement i is beyond its tolerance, in ln terms
// (0 when met).
func (s *solver) excess(i int, props map[string]float64) float64 {
	return s.excessWithin(i, props, 1)
}

// excessWithin is excess against a fraction of the tolerance (the joint
// search aims inside the band, so that re-solving the target afterwards
// keeps the others met).
func (s *solver) excessWithin(i int, props map[string]float64, share float64) float64 {
	tol := s.reqs[i].Tolerance * share
	d := s.logDev(i, props)
	band := math.Log(1 + tol)
	if d < 0 {
		band = -math.Log(1 - math.Min(tol, 0.999999))
	}
	return math.Max(0, math.Abs(d)-band)
}

func (s *solver) check(i int, props map[string]float64) Check {
	t := s.reqs[i]
	req := t.required(props)
	v := props[t.Quantity]
	c := Check{Quantity: t.Quantity, Value: v, Required: req, Tolerance: t.Tolerance}
	if req != 0 {
		c.Deviation = (v - req) / math.Abs(req)
	}
	c.Met = math.Abs(v-req) <= t.Tolerance*math.Abs(req)*(1+1e-9)
	return c
}

func (s *solver) recipe(c Conditions, method string) Recipe {
	props := s.e.values(c)
	r := Recipe{Entry: s.e.Name, Kind: s.e.Kind, Conditions: c, Method: method, Target: s.check(0, props), Met: true}
	r.Met = r.Target.Met
	for i := 1; i < len(s.reqs); i++ {
		ch := s.check(i, props)
		r.Also = append(r.Also, ch)
		r.Met = r.Met && ch.Met
	}
	for _, k := range s.knobs {
		if v, _ := c.Get(k.cond); !sameValue(v, k.prefer) {
			r.Tuned = append(r.Tuned, k.cond)
		}
	}
	return r
}

func (s *solver) solve() (Recipe, error) {
	if s.e.model == nil {
		return s.solveFixed(), nil
	}
	var primary []int
	var all []int
	for i, k := range s.knobs {
		if !k.moveable {
			continue
		}
		all = append(all, i)
		if k.cond != Temperature {
			primary = append(primary, i)
		}
	}
	if len(primary) == 0 {
		primary = all
	}
	// Nothing to move: the preferred conditions are the recipe, or none.
	if len(all) == 0 {
		r := s.recipe(s.base, "fixed conditions")
		return r, nil
	}
	// Stage 1: the mixture knob alone at the preferred conditions.
	if len(primary) == 1 {
		if r, ok := s.solve1D(primary[0], s.base); ok {
			return r, nil
		}
	}
	// Stage 2: every free condition together.
	if len(all) > 1 || len(primary) > 1 {
		if r, ok := s.solveJoint(all); ok {
			return r, nil
		}
	}
	return s.nearest(all), nil
}
