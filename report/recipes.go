package report

import (
	"fmt"
	"strings"

	"scaleplan/materials"
	"scaleplan/sweep"
)

// Recipes in the outputs: the conditions a tunable candidate is brought to
// per scale band (sweep/recipe.go), in the short form of the terminal, as
// a sentence for the memo, a column of the Windows sheet and in --json.

// recipeLines are the terminal's lines under the table: per strategy with
// a window, the recipe at the recommended scale and the number of bands.
func recipeLines(res *sweep.Result) []string {
	var out []string
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			continue
		}
		for _, pv := range c.Required {
			if pv.Recipe == nil {
				continue
			}
			s := fmt.Sprintf("  %s: %s at %s: %s", sr.Name, pv.Quantity, sweep.Scale(c.Recommended), pv.Recipe)
			if n := len(pv.Recipes); n > 1 {
				s += fmt.Sprintf(" (%d recipes across the window, one per band of scales: see the memo)", n)
			}
			out = append(out, s)
		}
	}
	return out
}

// recipeAction splits what to do to make a recipe into the part every
// band shares ("mix water and glycerol (w: mass fraction of glycerol) at
// 20 °C") and the part a band sets ("w = 0.8").
func recipeAction(r sweep.RecipeAt) (lead, knob string) {
	conds, err := materials.ParseConditions(strings.ReplaceAll(strings.ReplaceAll(r.Conditions, " = ", "="), "°C", "C"))
	if err != nil {
		return "bring " + r.Entry + " to", r.Conditions
	}
	var rest []string
	for _, k := range conds.Given() {
		if k == materials.MassFraction || k == materials.Salinity {
			continue
		}
		v, _ := conds.Get(k)
		rest = append(rest, materials.FormatCondition(k, v))
	}
	tail := ""
	if len(rest) > 0 {
		tail = " at " + strings.Join(rest, ", ")
	}
	if w, ok := conds.Get(materials.MassFraction); ok {
		return "mix water and glycerol (w: mass fraction of glycerol)" + tail, fmt.Sprintf("w = %.3g", w)
	}
	if s, ok := conds.Get(materials.Salinity); ok {
		return "dissolve salt (NaCl) in " + r.Entry + tail, fmt.Sprintf("%.3g g/kg", s*1e3)
	}
	return "use " + r.Entry, strings.Join(rest, ", ")
}

// recipeSentence is the memo's sentence a proposal writer can paste: the
// recipe of every band of scales, large models first.
func recipeSentence(pv sweep.PropertyValue) string {
	if len(pv.Recipes) == 0 {
		return ""
	}
	lead0, _ := recipeAction(pv.Recipes[0].RecipeAt)
	same := true
	for _, b := range pv.Recipes {
		lead, _ := recipeAction(b.RecipeAt)
		same = same && lead == lead0
	}
	parts := make([]string, len(pv.Recipes))
	for i, b := range pv.Recipes {
		lead, knob := recipeAction(b.RecipeAt)
		if same {
			parts[i] = fmt.Sprintf("%s for scales %s to %s", knob, sweep.Scale(b.FromKL), sweep.Scale(b.ToKL))
		} else {
			parts[i] = fmt.Sprintf("%s, %s, for scales %s to %s", lead, knob, sweep.Scale(b.FromKL), sweep.Scale(b.ToKL))
		}
	}
	s := strings.Join(parts, "; ") + "."
	if same {
		s = lead0 + ": " + s
	}
	s = strings.ToUpper(s[:1]) + s[1:]
	if pv.Recipe != nil {
		s += fmt.Sprintf(" Each recipe meets the need within the study's tolerance over its band. At the recommended scale: %s (%s %s; %s %s required; met within %.1g %%).",
			pv.Recipe, Num3(pv.Recipe.Value), unitOf(pv.Quantity), Num3(pv.Recipe.Required), unitOf(pv.Quantity), 100*pv.Recipe.Reached)
	}
	return s
}

// recipeCell is the Windows sheet's cell of one required property's
// recipes: "1:2.5–1:2.6 water_glycerol: 20 °C, w = 0.8; …".
func recipeCell(c *sweep.ComboResult, q string) string {
	if c.Unmet != nil && c.Unmet.Quantity == q {
		if len(c.Unmet.Matches) > 0 {
			return fmt.Sprintf("none among the candidates; at %s the library can make it: %s", sweep.Scale(c.Unmet.KL), matchList(q, c.Unmet.Matches))
		}
		return fmt.Sprintf("none: needs %s %s at %s; %s", Num3(c.Unmet.Required), unitOf(q), sweep.Scale(c.Unmet.KL), c.Unmet.Reason)
	}
	for _, pv := range c.Required {
		if pv.Quantity != q || len(pv.Recipes) == 0 {
			continue
		}
		parts := make([]string, len(pv.Recipes))
		for i, b := range pv.Recipes {
			parts[i] = fmt.Sprintf("%s–%s %s", sweep.Scale(b.FromKL), sweep.Scale(b.ToKL), b.RecipeAt)
		}
		return strings.Join(parts, "; ")
	}
	return ""
}

// recipeQuantities are the required properties of a study that have a
// recipe or an unmet requirement in some combination: one Windows column
// each.
func recipeQuantities(res *sweep.Result) []string {
	var out []string
	seen := map[string]bool{}
	add := func(q string) {
		if !seen[q] {
			seen[q] = true
			out = append(out, q)
		}
	}
	for _, sr := range res.Strategies {
		for _, c := range append(append([]*sweep.ComboResult(nil), sr.Combos...), sr.Joint...) {
			if c.Unmet != nil {
				add(c.Unmet.Quantity)
			}
			for _, pv := range c.Required {
				if len(pv.Recipes) > 0 {
					add(pv.Quantity)
				}
			}
		}
	}
	return out
}

type recipeJSON struct {
	Entry      string   `json:"entry"`
	Conditions string   `json:"conditions"`
	Value      *float64 `json:"value"`
	FromKL     *float64 `json:"from_kL,omitempty"`
	ToKL       *float64 `json:"to_kL,omitempty"`
}

type unmetJSON struct {
	Quantity string      `json:"quantity"`
	Unit     string      `json:"unit"`
	Required *float64    `json:"required"`
	KL       *float64    `json:"kL"`
	Matches  []matchJSON `json:"matches"`
	Reason   string      `json:"reason"`
}

// recipesJSON gives a required property's recipe bands.
func recipesJSON(pv sweep.PropertyValue) ([]recipeJSON, *recipeJSON) {
	out := []recipeJSON{}
	for _, b := range pv.Recipes {
		out = append(out, recipeJSON{Entry: b.Entry, Conditions: b.Conditions, Value: optional(b.Value), FromKL: optional(b.FromKL), ToKL: optional(b.ToKL)})
	}
	var at *recipeJSON
	if r := pv.Recipe; r != nil {
		at = &recipeJSON{Entry: r.Entry, Conditions: r.Conditions, Value: optional(r.Value)}
	}
	return out, at
}

// unmetsJSON lists, for a strategy without a window, the requirements no
// candidate meets and the library recipes that could.
func unmetsJSON(sr *sweep.StrategyResult) []unmetJSON {
	out := []unmetJSON{}
	seen := map[string]bool{}
	for _, c := range sr.Combos {
		u := c.Unmet
		if u == nil || seen[u.Quantity] {
			continue
		}
		seen[u.Quantity] = true
		m := []matchJSON{}
		for _, x := range u.Matches {
			m = append(m, matchJSON{Entry: x.Entry, Conditions: x.Conditions, Value: optional(x.Value)})
		}
		out = append(out, unmetJSON{Quantity: u.Quantity, Unit: unitOf(u.Quantity), Required: optional(u.Required), KL: optional(u.KL), Matches: m, Reason: u.Reason})
	}
	return out
}
