package report

import (
	"math"

	"scaleplan/sweep"
)

// JSON shapes of `scaleplan run --json` (spec §10). Every key is written,
// null where there is no value (NaN is never written: JSON has none).
type runJSON struct {
	Study      string         `json:"study"`
	Convention string         `json:"convention"`
	Axis       *axisJSON      `json:"axis"`
	Warnings   []string       `json:"warnings"`
	Strategies []strategyJSON `json:"strategies"`
	Ranking    []rankJSON     `json:"ranking"`
	Outputs    []string       `json:"outputs"`
}

// runErrorJSON is a study that could not run.
type runErrorJSON struct {
	Study string `json:"study"`
	Error string `json:"error"`
}

type axisJSON struct {
	Name string `json:"name"`
	Unit string `json:"unit"`
}

type strategyJSON struct {
	Name      string        `json:"name"`
	Technique string        `json:"technique"`
	Feasible  bool          `json:"feasible"`
	Rank      int           `json:"rank"`
	Reason    string        `json:"reason"`
	Warnings  []string      `json:"warnings"`
	Relaxed   []relaxedJSON `json:"relaxed"`
	Fixed     []fixedJSON   `json:"fixed"`
	Best      *comboJSON    `json:"best"`
	Unmet     []unmetJSON   `json:"unmet,omitempty"`
}

type relaxedJSON struct {
	Law   string   `json:"law"`
	Group string   `json:"group"`
	Ratio *float64 `json:"ratio"`
	Case  string   `json:"case,omitempty"`
	Weak  bool     `json:"weak"`
}

type fixedJSON struct {
	Quantity string  `json:"quantity"`
	Factor   float64 `json:"factor"`
}

type comboJSON struct {
	Case           string         `json:"case"`
	Medium         string         `json:"medium"`
	Material       string         `json:"material"`
	Facility       string         `json:"facility"`
	Axis           *float64       `json:"axis_value"`
	Window         []intervalJSON `json:"window"`
	Recommended    float64        `json:"recommended_kL"`
	RecommendedTxt string         `json:"recommended_scale"`
	ModelLength    *float64       `json:"model_length_m"`
	Cost           *float64       `json:"cost"`
	Cheapest       *float64       `json:"cheapest_kL"`
	CheapestCost   *float64       `json:"cheapest_cost"`
	CheapestOption *optionJSON    `json:"cheapest_option"`
	RobustWindow   []intervalJSON `json:"robust_window"`
	Required       []requiredJSON `json:"required"`
	LargerModel    *largerJSON    `json:"larger_model"`
}

type intervalJSON struct {
	From      float64 `json:"from_kL"`
	To        float64 `json:"to_kL"`
	FromLimit string  `json:"large_model_edge"`
	ToLimit   string  `json:"small_model_edge"`
}

type requiredJSON struct {
	Quantity      string       `json:"quantity"`
	Unit          string       `json:"unit"`
	AtRecommended *float64     `json:"at_recommended"`
	Matches       []matchJSON  `json:"matches"`
	Recipe        *recipeJSON  `json:"recipe"`
	Recipes       []recipeJSON `json:"recipes"`
}

type matchJSON struct {
	Entry      string   `json:"entry"`
	Conditions string   `json:"conditions"`
	Value      *float64 `json:"value"`
}

// optionJSON is the cheapest feasible option over every combination of a
// strategy.
type optionJSON struct {
	Medium   string  `json:"medium"`
	Material string  `json:"material"`
	Facility string  `json:"facility"`
	KL       float64 `json:"kL"`
	Scale    string  `json:"scale"`
	Cost     float64 `json:"cost"`
}

type largerJSON struct {
	KL    float64    `json:"kL"`
	Scale string     `json:"scale"`
	Limit string     `json:"limit"`
	Needs []needJSON `json:"needs"`
}

type needJSON struct {
	Capability string  `json:"capability"`
	Unit       string  `json:"unit"`
	AtLeast    bool    `json:"at_least"`
	Value      float64 `json:"value"`
	Have       float64 `json:"have"`
	Limit      string  `json:"limit"`
}

type rankJSON struct {
	Strategy string `json:"strategy"`
	Rank     int    `json:"rank"`
	Reason   string `json:"reason"`
}

func optional(x float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	r := Round(x)
	return &r
}

func windowJSON(w sweep.Window) []intervalJSON {
	out := []intervalJSON{}
	for _, iv := range w {
		out = append(out, intervalJSON{Round(iv.Lo), Round(iv.Hi), iv.LoLimit, iv.HiLimit})
	}
	return out
}

// matchesJSON gives the library entries that meet a required property.
func matchesJSON(pv sweep.PropertyValue) []matchJSON {
	out := []matchJSON{}
	for _, m := range pv.Matches {
		out = append(out, matchJSON{Entry: m.Entry, Conditions: m.Conditions, Value: optional(m.Value)})
	}
	return out
}

func orEmpty(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// RunErrorData returns the JSON form of a study that could not run.
func RunErrorData(name string, err error) any {
	return runErrorJSON{Study: name, Error: err.Error()}
}

// RunData returns the JSON form of a study's result.
func RunData(res *sweep.Result, outputs []string) any {
	st := res.Plan.Settings
	out := runJSON{Study: res.Name, Convention: Convention, Warnings: orEmpty(res.Warnings.Study().Strings()),
		Strategies: []strategyJSON{}, Ranking: []rankJSON{}, Outputs: orEmpty(outputs)}
	if st.Axis != "" {
		out.Axis = &axisJSON{Name: st.Axis, Unit: axisUnit(res.Plan)}
	}
	for _, sr := range res.Strategies {
		s := strategyJSON{Name: sr.Name, Technique: sr.Technique, Feasible: sr.Best != nil,
			Warnings: orEmpty(res.Warnings.Of(sr.Name).Strings()), Relaxed: []relaxedJSON{}, Fixed: []fixedJSON{}}
		if e := res.RankOf(sr.Name); e != nil {
			s.Rank, s.Reason = e.Rank, e.Reason
			for _, r := range e.Relaxed {
				s.Relaxed = append(s.Relaxed, relaxedJSON{Law: r.Law, Group: r.Group, Ratio: optional(r.Ratio), Case: r.Case, Weak: r.Weak})
			}
		}
		a := res.Assume(sr)
		for _, f := range a.Fixed {
			s.Fixed = append(s.Fixed, fixedJSON{f.Quantity, Round(f.Factor)})
		}
		if c := sr.Best; c != nil {
			cj := &comboJSON{Case: c.Case, Medium: c.Medium, Material: c.Material, Facility: c.Facility, Window: windowJSON(c.Window),
				Recommended: Round(c.Recommended), RecommendedTxt: sweep.Scale(c.Recommended),
				ModelLength: optional(c.ModelLength), Cost: optional(c.Cost), Cheapest: optional(c.Cheapest), CheapestCost: optional(c.CheapestCost),
				Required: []requiredJSON{}}
			if a.Axis != nil {
				cj.Axis = optional(a.Axis.Value)
			}
			if c.Robust != nil {
				cj.RobustWindow = windowJSON(c.Robust.Window)
			}
			for _, pv := range c.Required {
				rj := requiredJSON{Quantity: pv.Quantity, Unit: unitOf(pv.Quantity), AtRecommended: optional(pv.AtRecommended), Matches: matchesJSON(pv)}
				rj.Recipes, rj.Recipe = recipesJSON(pv)
				cj.Required = append(cj.Required, rj)
			}
			if o := a.Cheapest; o != nil {
				cj.CheapestOption = &optionJSON{Medium: o.Medium, Material: o.Material, Facility: o.Facility, KL: Round(o.Cheapest), Scale: sweep.Scale(o.Cheapest), Cost: Round(o.CheapestCost)}
			}
			if !math.IsNaN(a.LargerScale) {
				scale := sweep.Scale(a.LargerScale)
				if !c.Window.Empty() {
					scale = sweep.ScaleBeside(a.LargerScale, c.Window[0].Lo)
				}
				l := &largerJSON{KL: Round(a.LargerScale), Scale: scale, Limit: a.LargerLimit, Needs: []needJSON{}}
				for _, n := range a.LargerNeeds {
					l.Needs = append(l.Needs, needJSON{n.Capability, n.Unit, n.AtLeast, Round(n.Value), Round(n.Have), n.Limit})
				}
				cj.LargerModel = l
			}
			s.Best = cj
		} else {
			if s.Reason == "" {
				s.Reason = firstFailing(sr)
			}
			if u := unmetsJSON(sr); len(u) > 0 {
				s.Unmet = u
			}
		}
		out.Strategies = append(out.Strategies, s)
	}
	for _, e := range res.Ranking {
		out.Ranking = append(out.Ranking, rankJSON{e.Strategy, e.Rank, e.Reason})
	}
	return out
}
