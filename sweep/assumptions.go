package sweep

import (
	"math"
	"sort"
)

// Assumptions are what a strategy's recommendation rests on (§8.1, last
// bullet): the second-axis value chosen, the free choices fixed, the
// cheapest option over all its combinations, and what a facility would
// need for a larger model.
type Assumptions struct {
	// Axis is the second-axis value of the best combination (nil without
	// an axis, or when the strategy fixes the axis quantity).
	Axis *AxisChoice
	// Fixed lists the free choices the strategy fixes, by quantity.
	Fixed []FixedChoice
	// Cheapest is the combination with the cheapest feasible option over
	// every combination of the strategy (nil without costs); its
	// Cheapest and CheapestCost give the scale and the cost.
	Cheapest *ComboResult
	// LargerScale is the grid scale next to the large-model edge of the
	// best combination, outside its window (NaN when the window reaches
	// the start of the sweep); LargerNeeds lists every facility capability
	// that stops a model there, with the value it would need, and
	// LargerLimit the limit that closes it there.
	LargerScale float64
	LargerNeeds []Need
	LargerLimit string
}

// AxisChoice is a second-axis value, in SI (a scale factor for a free
// choice).
type AxisChoice struct {
	Name  string
	Value float64
}

// FixedChoice is a free choice fixed on the Strategies sheet.
type FixedChoice struct {
	Quantity string
	Factor   float64
}

// Need is a capability a larger model would need.
type Need struct {
	Capability, Unit, Limit string
	AtLeast                 bool
	Value, Have             float64
}

// Assume works out the assumptions of a strategy's recommendation.
func (r *Result) Assume(sr *StrategyResult) Assumptions {
	a := Assumptions{LargerScale: math.NaN()}
	st := r.Plan.Settings
	c := sr.Best
	fixed := map[string]float64{}
	for _, cs := range sr.Cases {
		if c != nil && c.Factors != nil && len(sr.Cases) > 1 && cs.Case != c.Case {
			continue
		}
		for q, k := range cs.Fix {
			fixed[q] = k
		}
	}
	for q, k := range fixed {
		a.Fixed = append(a.Fixed, FixedChoice{q, k})
	}
	sort.Slice(a.Fixed, func(i, j int) bool { return a.Fixed[i].Quantity < a.Fixed[j].Quantity })
	if c != nil && st.Axis != "" && !math.IsNaN(c.Axis) {
		a.Axis = &AxisChoice{Name: st.Axis, Value: c.Axis}
	}
	for _, o := range sr.Combos {
		if o.Window.Empty() || o.Err != "" || math.IsNaN(o.CheapestCost) {
			continue
		}
		if a.Cheapest == nil || o.CheapestCost < a.Cheapest.CheapestCost {
			a.Cheapest = o
		}
	}
	if c == nil || c.Window.Empty() {
		return a
	}
	grid := r.Plan.Grid
	i := -1
	for j, k := range grid {
		if k < c.Window[0].Lo*(1-1e-12) {
			i = j
		}
	}
	if i < 0 {
		return a
	}
	a.LargerScale = grid[i]
	if i < len(c.Limiting) && c.Limiting[i] >= 0 && c.Limiting[i] < len(c.Limits) {
		a.LargerLimit = c.Limits[c.Limiting[i]].Name
	}
	for _, q := range c.Requirements {
		if i >= q.Len() || !(q.Shortfall(i) > 0) {
			continue
		}
		a.LargerNeeds = append(a.LargerNeeds, Need{Capability: q.Capability, Unit: q.Unit, Limit: q.Limit, AtLeast: q.AtLeast, Value: q.At(i), Have: q.Have})
	}
	return a
}
