package sweep

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// Result is the outcome of one study.
type Result struct {
	Plan       *Plan
	Name       string
	Strategies []*StrategyResult
	// Ranking orders the strategies, recommended first (rank.go);
	// Warnings are the study's (warnings.go).
	Ranking  []RankEntry
	Warnings study.Warnings
}

// StrategyResult gathers the combinations of one strategy.
type StrategyResult struct {
	Name, Technique string
	Cases           []*PlanCase
	Combos          []*ComboResult // one per case × candidate × facility
	// Joint holds, for a strategy with several cases, the scales at which
	// one model serves every case, per facility.
	Joint []*ComboResult
	// Best is the combination recommended for the strategy (nil when none
	// is feasible): the largest model, or the cheapest when the study asks.
	Best *ComboResult
}

// ComboResult is the result of one combination of a case, a candidate pair
// and a facility.
type ComboResult struct {
	Strategy, Case, Technique  string
	Medium, Material, Facility string
	Axis                       float64 // best second-axis value; NaN without an axis
	Window                     Window
	Recommended                float64 // NaN when the window is empty
	Largest                    float64
	Cheapest, CheapestCost     float64
	Cost                       float64 // at the recommended scale; NaN without costs
	ModelLength                float64 // reference length of the model at the recommended scale, m
	// Failing says what empties the window.
	Failing    string
	Conditions []string
	Notes      []string
	Limits     []LimitInfo
	Required   []PropertyValue
	Mismatches []MismatchValue
	Friction   *Friction
	// AddedMass is the mass dummy weights must add to the model at the
	// recommended scale, kg (NaN when no density is required), and
	// AddedDensity the same per unit volume of the model material.
	AddedMass, AddedDensity float64
	// PoissonFlag is set when the model material's Poisson's ratio differs
	// from the prototype's beyond the study's tolerance and the strategy
	// does not relax transverse deformation; PoissonNote (also in Notes)
	// says so.
	PoissonFlag bool
	PoissonNote string
	// Requirements are the facility capabilities the model needs at each
	// grid scale, one per capability a limit names.
	Requirements []Requirement
	// AnyFacility is the scale of the largest model the limits that name
	// no facility capability allow: what a facility big and fast enough
	// would hold (NaN without a facility).
	AnyFacility float64
	// Robust is the probability of feasibility when the study's uncertain
	// inputs vary (nil without an Uncertainty sheet).
	Robust *Robust
	// Measures are the study's measures at model scale.
	Measures []MeasureValue
	// CostCurve is the campaign cost at every grid point (nil without
	// costs).
	CostCurve []float64
	// Factors holds the scale factor k of every quantity the strategy
	// sets, at the recommended scale: the prediction rules.
	Factors map[string]float64
	// Params holds the scale factors of the solution's parameters other
	// than the length scale (given properties, fixed free choices).
	Params feasibility.Values
	// Margins holds the margin of every grid point (decades) and Limiting
	// the index into Limits of the limit that gives it (LimitingSimilarity
	// for a similarity condition, LimitingNone for none), at the chosen
	// axis value. With a second axis, AxisMarginRows gives one row per
	// axis value, computed on demand: the sweep leaves AxisMargins and
	// AxisMeasures nil (a result built by hand may set them).
	Margins     []float64
	Limiting    []int
	AxisMargins [][]float64
	AxisWindows []Window
	// AxisMeasures holds, with a second axis, each study measure at model
	// scale over the grid, one row per axis value (in the measure's unit).
	AxisMeasures map[string][][]float64
	// Unmet is, for an empty window a required property empties, what it
	// needs and the library recipes that could meet it (recipe_search.go).
	Unmet *Unmet
	Err   string
	// axis sweeps the second axis again on demand (AxisMarginRows).
	axis *axisSweep
}

// LimitInfo describes a limit applied to a combination.
type LimitInfo struct {
	Name, Expression, Source string
	Linear                   bool
	// For a products-of-powers limit, margin = A + B·log10 kL.
	A, B float64
}

// MarginAt is the margin of a products-of-powers limit at scale kL, in
// decades (A + B·log10 kL); NaN for another limit or a missing scale.
func (l LimitInfo) MarginAt(kL float64) float64 {
	if !l.Linear || math.IsNaN(kL) {
		return math.NaN()
	}
	return l.A + l.B*math.Log10(kL)
}

// PropertyValue is a property the model must have, in SI.
type PropertyValue struct {
	Quantity      string
	Law           string  // its scale law
	AtLo, AtHi    float64 // at the window edges (model values)
	AtRecommended float64
	Matches       []Match // library entries that meet it within tolerance at the recommended scale
	// Recipes are, for a candidate brought to the requirement by its
	// tunable conditions (recipe.go), the recipe of each scale band, and
	// Recipe the one at the recommended scale (nil when none is solved).
	Recipes []RecipeBand
	Recipe  *RecipeAt
	Tuned   bool
	// Own is the candidate's own value of the property (NaN if it has
	// none); a device (added mass, springs, a backbone beam) supplies the
	// difference.
	Own float64
}

// MeasureValue is a study measure at model scale, in its unit, at the
// window edges and at the recommended scale.
type MeasureValue struct {
	Name, Unit                string
	AtLo, AtHi, AtRecommended float64
}

// MismatchValue is a relaxed group's mismatch π_p/π_m at the recommended
// scale.
type MismatchValue struct {
	Law, Group string
	Ratio      float64
}

// Friction is the ITTC-1957 skin-friction correction at the recommended
// scale: C_F = 0.075 / (log10 Re − 2)².
type Friction struct {
	ReModel, ReProto, CFModel, CFProto, Delta float64
}

// Scale prints a length scale the way the trade writes it: "1:25".
func Scale(kL float64) string {
	if math.IsNaN(kL) {
		return "-"
	}
	if kL >= 10 {
		return fmt.Sprintf("1:%.4g", math.Round(kL*10)/10)
	}
	return fmt.Sprintf("1:%.3g", kL)
}

// ScaleBeside is Scale of kL with as many more figures (up to six) as it
// takes to read differently from Scale of ref: a larger model next to a
// window's edge is not printed as the edge's own scale.
func ScaleBeside(kL, ref float64) string {
	s := Scale(kL)
	if math.IsNaN(kL) || math.IsNaN(ref) || kL == ref || s != Scale(ref) {
		return s
	}
	for digits := 4; digits <= 6; digits++ {
		a, b := fmt.Sprintf("1:%.*g", digits, kL), fmt.Sprintf("1:%.*g", digits, ref)
		if a != b {
			return a
		}
	}
	return s
}

func caseLabel(c, l string) string {
	if l == RangeLimit {
		return l
	}
	return c + ": " + l
}

// CaseFactors returns the scale factors of a case of a strategy at the
// scale recommended by rec, with the combination they come from: rec's own
// factors for its case, or, for a joint (all-cases) recommendation, those
// of the case's combination in the same facility whose window holds that
// scale. It returns nil when there is none.
func (sr *StrategyResult) CaseFactors(cs *PlanCase, rec *ComboResult) (map[string]float64, *ComboResult) {
	if rec == nil || math.IsNaN(rec.Recommended) {
		return nil, nil
	}
	if rec.Factors != nil {
		if rec.Case == cs.Case || len(sr.Cases) == 1 {
			return rec.Factors, rec
		}
		return nil, nil
	}
	for _, c := range sr.Combos {
		if c.Case != cs.Case || c.Facility != rec.Facility || !c.Window.Contains(rec.Recommended) || c.Params == nil {
			continue
		}
		v := feasibility.Values{"length": rec.Recommended}
		for k, x := range c.Params {
			v[k] = x
		}
		if f, err := cs.Solution.Factors(v); err == nil {
			return f, c
		}
	}
	return nil, nil
}

// Label names a combination by its candidate pair and facility: "tank
// water / model ice in Polar basin", "-" when it has none.
func (c *ComboResult) Label() string {
	var parts []string
	for _, s := range []string{c.Medium, c.Material} {
		if s != "" {
			parts = append(parts, s)
		}
	}
	s := strings.Join(parts, " / ")
	if c.Facility != "" {
		if s != "" {
			s += " in "
		}
		s += c.Facility
	}
	if s == "" {
		s = "-"
	}
	return s
}
