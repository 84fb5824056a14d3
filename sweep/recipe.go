package sweep

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"

	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// Recipes in the sweep (spec §8.1: "at conditions it can be brought to").
//
// Which conditions a candidate may move:
//
//   - a mixture's composition (water–glycerol mass fraction, brine
//     salinity) is tunable over the entry's valid range unless the Media
//     row states it;
//   - a condition written as a range on the Media row (w=0.3..0.9,
//     T=15..30C) is tunable within that range (the candidate's stated
//     properties are taken at the entry's default brought into the range,
//     operatingPoint);
//   - every other condition (temperature, pressure) is held at the value
//     the row states, the second axis's value, or the entry's default.
//
// A tunable candidate's own value of a required property is then a
// function h(c) of its conditions c. Where the requirement also depends on
// the candidate's own properties (the required viscosity through the
// density scale, ln req = ln req₀ + Σ a_Q ln(ρ/ρ₀)), the effective value
// h(c) = value(c)·Π(Q₀/Q(c))^a_Q is compared with the requirement at the
// stated conditions, req₀(kL), which stays a product of powers of kL. The
// tunable box is connected and h continuous, so the values reachable form
// the interval [min h, max h] (intermediate value theorem), and a recipe
// exists at kL exactly when req₀(kL)·[1−tol, 1+tol] meets that interval:
// the two band limits stay linear in log kL with min h and max h in place
// of the single stated value, and their edges are exact. Only the extremes
// of h are found numerically (a sampled box refined by golden sections;
// for the usual monotone correlations they lie at the range's ends).
//
// Within the window the recipes themselves are solved by package
// materials (bracketed bisection, gonum Nelder–Mead): one recipe is solved
// at the large-model end of a band, aimed at the side of the tolerance the
// requirement moves away from, then Evaluated (microseconds) at the
// following grid points while it still meets the requirement; where it
// stops, the break is refined by bisection to 0.1 % in kL and the next
// recipe solved. Each band reports its recipe and the scales it serves.

// RecipeAt is a recipe: the conditions at which an entry has a required
// property.
type RecipeAt struct {
	Entry      string
	Conditions string  // e.g. "20 °C, w = 0.6091"
	Value      float64 // the entry's value of the property there, SI
	Required   float64 // the value required, SI
	// Reached is the largest relative deviation from a requirement at the
	// scale it was solved for: the tolerance the recipe reached.
	Reached float64
}

// RecipeBand is one recipe and the scales it serves, kL from FromKL to
// ToKL.
type RecipeBand struct {
	RecipeAt
	FromKL, ToKL float64
}

// String is the short form of a recipe: "water_glycerol: 20 °C, w = 0.61".
func (r RecipeAt) String() string {
	if r.Conditions == "" {
		return r.Entry
	}
	return r.Entry + ": " + r.Conditions
}

// recipeMemo keeps, for a plan, the extremes of tunable candidates and the
// library searches, which do not change across combinations and draws.
type recipeMemo struct {
	mu       sync.Mutex
	extremes map[string]extremeFound
	searches map[string]libSearch
	once     sync.Once
	search   *materials.Searcher
}

type extremeFound struct {
	lo, hi     float64
	loAt, hiAt materials.Conditions
}

// tunableConditions splits a Media row's conditions into those stated and
// those given as ranges (KEY=LO..HI). A range stands, for the candidate's
// stated properties (those a strategy that does not tune it sees), at the
// value at(condition, lo, hi) picks: operatingPoint's, or the middle when
// at is nil.
func tunableConditions(text string, at func(k materials.Condition, lo, hi float64) float64) (string, map[materials.Condition]materials.Range, error) {
	if at == nil {
		at = func(_ materials.Condition, lo, hi float64) float64 { return (lo + hi) / 2 }
	}
	if !strings.Contains(text, "..") {
		return text, nil, nil
	}
	parts := strings.FieldsFunc(text, func(r rune) bool { return r == ',' || r == ';' })
	var keep []string
	tune := map[materials.Condition]materials.Range{}
	for _, part := range parts {
		part = strings.TrimSpace(part)
		if !strings.Contains(part, "..") {
			keep = append(keep, part)
			continue
		}
		key, val, ok := strings.Cut(part, "=")
		lo, hi, _ := strings.Cut(val, "..")
		lo, hi = strings.TrimSpace(lo), strings.TrimSpace(hi)
		if !ok || lo == "" || hi == "" {
			return "", nil, fmt.Errorf("conditions %q, part %q: write a tunable range as KEY=LO..HI, e.g. w=0.3..0.9 or T=15..30C", text, part)
		}
		// A unit written once, after the upper end, applies to both.
		if _, err := strconv.ParseFloat(lo, 64); err == nil {
			if n := numericPrefix(hi); n < len(hi) {
				lo += hi[n:]
			}
		}
		cl, err := materials.ParseConditions(key + "=" + lo)
		if err != nil {
			return "", nil, fmt.Errorf("conditions %q, part %q: %v", text, part, err)
		}
		ch, err := materials.ParseConditions(key + "=" + hi)
		if err != nil {
			return "", nil, fmt.Errorf("conditions %q, part %q: %v", text, part, err)
		}
		k := cl.Given()[0]
		a, _ := cl.Get(k)
		b, _ := ch.Get(k)
		if !(a < b) {
			return "", nil, fmt.Errorf("conditions %q, part %q: the lower end must come first and be below the upper", text, part)
		}
		tune[k] = materials.Range{Min: a, Max: b}
		keep = append(keep, key+"="+writeCondition(k, at(k, a, b)))
	}
	return strings.Join(keep, ", "), tune, nil
}

// operatingPoint is where a library entry's condition given as a range
// stands when nothing tunes it: the entry's default (a gas at atmospheric
// pressure, a liquid at 20 °C) brought into the range, so that a
// strategy that does not need a pressurised tunnel is not judged in one;
// the middle of the range for a condition the entry does not describe.
func operatingPoint(e materials.Entry) func(k materials.Condition, lo, hi float64) float64 {
	return func(k materials.Condition, lo, hi float64) float64 {
		for _, r := range e.Ranges {
			if r.Condition == k {
				return math.Min(math.Max(r.Default, lo), hi)
			}
		}
		return (lo + hi) / 2
	}
}

func numericPrefix(s string) int {
	for n := len(s); n > 0; n-- {
		if _, err := strconv.ParseFloat(s[:n], 64); err == nil {
			return n
		}
	}
	return 0
}

// writeCondition writes a condition's SI value back in a form
// ParseConditions reads: kelvin, pascal, g/kg, a bare mass fraction.
func writeCondition(k materials.Condition, v float64) string {
	switch k {
	case materials.Temperature:
		return strconv.FormatFloat(v, 'g', 12, 64) + "K"
	case materials.Pressure:
		return strconv.FormatFloat(v, 'g', 12, 64) + "Pa"
	case materials.Salinity:
		return strconv.FormatFloat(v*1e3, 'g', 12, 64) + "g/kg"
	}
	return strconv.FormatFloat(v, 'g', 12, 64)
}

// warnDefaultedMixture says, once per row, that a mixture named without
// its fraction is tuned where a strategy requires a property of it, while
// its stated properties (its density, in the scale factors) are taken at
// the default fraction.
func (p *Plan) warnDefaultedMixture(sheet string, row int, name string, e materials.Entry, cond materials.Conditions) {
	if note := e.DefaultNote(cond); note != "" {
		p.Warnings.Add(study.At(sheet, row, "conditions"), "%s (%s): %s; the fraction is tuned where a strategy requires a property of it, and its other properties (its density in the scale factors) are taken at the default; state the fraction, or give the range it may take (w=0.3..0.9)",
			name, e.Name, note)
	}
}

// recipeMatch is a tunable library entry's recipe at ln kL, for a match
// list: the recipe of the check of q, or of the check q is judged through
// (ν for μ), with the entry's value of q there. tuned is false when the
// entry has no tunable check.
func recipeMatch(checks []check, q string, ln float64) (m Match, tuned, ok bool) {
	ch, found := checkFor(checks, q)
	if !found || ch.tune == nil {
		found = false
		for _, c := range checks {
			if c.kind == "match" && c.tune != nil {
				ch, found = c, true
				break
			}
		}
	}
	if !found {
		return Match{}, false, false
	}
	r, met := ch.tune.solveAt(ch.req, ln, false)
	if !met {
		return Match{}, true, false
	}
	m = Match{Entry: r.Entry, Conditions: r.Conditions.String(), Value: math.NaN()}
	if ch.q == q {
		m.Value = ch.tune.recipeAt(r).Value
	} else if v, err := ch.tune.entry.ValuesAt(r.Conditions); err == nil {
		if x, has := v[q]; has {
			m.Value = x
		}
	}
	return m, true, true
}

// checkFor finds the check of a required property.
func checkFor(checks []check, q string) (check, bool) {
	for _, ch := range checks {
		if ch.kind == "match" && ch.q == q {
			return ch, true
		}
	}
	return check{}, false
}

// recipesFor fills a required property's recipes: per band over the window
// and at the recommended scale. It returns a note when the recipe moves a
// given property the candidate supplies (its density) by more than 1 %.
func (x *combo) recipesFor(pv *PropertyValue, w Window, recommended float64) string {
	checks, _, _ := x.checks()
	ch, ok := checkFor(checks, pv.Quantity)
	if !ok || ch.tune == nil {
		return ""
	}
	pv.Recipes = ch.tune.bands(ch.req, w, x.plan.Grid)
	r, ok := ch.tune.solveAt(ch.req, math.Log(recommended), false)
	if !ok {
		return ""
	}
	ra := ch.tune.recipeAt(r)
	pv.Recipe = &ra
	// The rest of the combination keeps the candidate's stated
	// properties; say so where the recipe moves one it supplies.
	var notes []string
	v, err := ch.tune.entry.ValuesAt(r.Conditions)
	if err != nil {
		return ""
	}
	for _, par := range x.cas.Solution.Params {
		Q := par.Quantity
		if par.Role != "given" || x.supplier(Q) != ch.cand || Q == pv.Quantity {
			continue
		}
		own, ok := ch.tune.own0[Q]
		if !ok || !(own > 0) || math.Abs(v[Q]/own-1) <= 0.01 {
			continue
		}
		unit := quantityUnit(Q)
		notes = append(notes, fmt.Sprintf("%s of %s is %s at the recipe (%s) and %s at its stated conditions, which the scale factors use (k_%s changes by a factor %.3g)",
			Q, ch.who, sig3(v[Q], unit), ra.Conditions, sig3(own, unit), Q, own/v[Q]))
	}
	return strings.Join(notes, "; ")
}

// ownText is what a check's candidate has: its value at its conditions,
// or the range its tunable conditions reach.
func (ch check) ownText(unit string) string {
	if ch.tune == nil {
		return fmt.Sprintf("%s has %s at %s", ch.who, sig3(ch.own, unit), ch.conds)
	}
	return fmt.Sprintf("%s can be brought from %s to %s (%s)", ch.who, sig3(ch.tune.lo, unit), sig3(ch.tune.hi, unit), ch.tune.knobsText)
}

// ownLow and ownHigh bound the candidate's own value: its value, or the
// range its tunable conditions reach.
func (ch check) ownLow() float64 {
	if ch.tune != nil {
		return ch.tune.lo
	}
	return ch.own
}

func (ch check) ownHigh() float64 {
	if ch.tune != nil {
		return ch.tune.hi
	}
	return ch.own
}
