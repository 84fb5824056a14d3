package sweep

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"scaleplan/materials"
)

// Searching the whole library when no candidate can be brought to a
// requirement (spec §8.1): once per requirement, at the scale nearest to
// meeting it, every entry of the candidate's kind and phase is tried with
// its own tunable conditions (materials.FindRecipes). A liquid is searched
// at tank temperatures, 5–40 °C (common practice for a laboratory tank
// that is neither chilled nor heated beyond what a hall can hold; from
// memory), so that "the least viscous liquid" is one a tank can hold, not
// water near boiling.

// tankTemperature is the temperature range a liquid medium is searched in.
var tankTemperature = materials.Range{Min: 278.15, Max: 313.15}

// Unmet is a required property no candidate meets: what it needs at the
// scale nearest to meeting it, and what the library can do about it.
type Unmet struct {
	Quantity string
	Required float64 // SI, at KL
	KL       float64
	Matches  []Match // library recipes that meet it, best first
	Reason   string
}

// libSearch is a memoised library search.
type libSearch struct {
	matches []Match
	text    string
}

// searchLibrary searches the library for entries that can be brought to
// the check's requirement req (SI) at kL.
func (x *combo) searchLibrary(ch check, req float64) libSearch {
	if ch.cand == nil {
		return libSearch{}
	}
	exps := x.ownExps(ch.cand, ch.q)
	own0, err := ch.cand.entry.ValuesAt(ch.cand.cond)
	if err != nil {
		return libSearch{}
	}
	at := ch.cand.cond
	limits := map[materials.Condition]materials.Range{}
	where := ""
	if kindWord(ch.cand.entry) == "liquid" {
		limits[materials.Temperature] = tankTemperature
		where = fmt.Sprintf(" (liquids at %s)", materials.FormatRange(materials.Temperature, tankTemperature.Min, tankTemperature.Max))
		if T, ok := at.Get(materials.Temperature); ok && (T < tankTemperature.Min || T > tankTemperature.Max) {
			at = at.Without(materials.Temperature)
		}
	}
	target := materials.Target{Quantity: ch.q, Value: req}
	ownKey := ""
	if len(exps) > 0 {
		// The requirement follows the entry's own properties (its density,
		// through the density scale).
		target.Of = func(v map[string]float64) float64 {
			r := req
			for Q, a := range exps {
				r *= math.Pow(v[Q]/own0[Q], a)
			}
			return r
		}
		ownKey = fmt.Sprintf("%v|%v", exps, own0)
	}
	key := fmt.Sprintf("%s|%s|%s|%v|%s", ch.q, strconv.FormatFloat(req, 'g', 6, 64), kindWord(ch.cand.entry), at, ownKey)
	memo := x.plan.recipes
	if memo != nil {
		memo.mu.Lock()
		if s, ok := memo.searches[key]; ok {
			memo.mu.Unlock()
			return s
		}
		memo.mu.Unlock()
	}
	spec := materials.RecipeSpec{
		Target:    target,
		Tolerance: x.plan.Settings.Tolerance,
		At:        at,
		Limits:    limits,
	}
	filter := func(e materials.Entry) bool { return compatible(ch.cand, e) }
	search := x.plan.searcher()
	found := search.FindRecipes(spec, filter)
	var out libSearch
	unit := quantityUnit(ch.q)
	word := kindWord(ch.cand.entry)
	if len(found.Met) > 0 {
		var names []string
		for _, r := range found.Met {
			m := Match{Entry: r.Entry, Conditions: r.Conditions.String(), Value: r.Target.Value}
			out.matches = append(out.matches, m)
			if len(names) < 3 {
				names = append(names, RecipeAt{Entry: m.Entry, Conditions: m.Conditions}.String())
			}
		}
		out.text = fmt.Sprintf("the library can make it%s: %s (add one as a candidate)", where, strings.Join(names, "; "))
	} else {
		side := "most"
		lowest := false
		if len(found.Nearest) > 0 && found.Nearest[0].Target.Value > found.Nearest[0].Target.Required {
			side, lowest = "least", true
		}
		out.text = fmt.Sprintf("no recipe in the library reaches it%s", where)
		if ext, err := search.Extreme(ch.q, lowest, limits, filter); err == nil {
			what := fmt.Sprintf("the %s viscous %s the library can make", side, word)
			if ch.q != "kinematic_viscosity" && ch.q != "dynamic_viscosity" {
				side = map[bool]string{true: "lowest", false: "highest"}[lowest]
				what = fmt.Sprintf("the %s %s of a %s the library can make", side, strings.ReplaceAll(ch.q, "_", " "), word)
			}
			out.text += fmt.Sprintf("; %s is %s at %s (%s)", what, ext.Entry, ext.Conditions, sig3(ext.Target.Value, unit))
		}
	}
	if memo != nil {
		memo.mu.Lock()
		if memo.searches == nil {
			memo.searches = map[string]libSearch{}
		}
		memo.searches[key] = out
		memo.mu.Unlock()
	}
	return out
}

// searcher is the plan's library searcher, made on first use (after the
// study's custom entries were added to the library).
func (p *Plan) searcher() *materials.Searcher {
	if p.recipes == nil {
		return p.Library.Searcher()
	}
	p.recipes.once.Do(func() { p.recipes.search = p.Library.Searcher() })
	return p.recipes.search
}
