package sweep

import (
	"math"
	"slices"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

func splitNames(s string) []string {
	var out []string
	for _, f := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ';' || r == '\n' }) {
		if f = strings.TrimSpace(f); f != "" {
			out = append(out, f)
		}
	}
	return out
}

// prepareStrategies checks and solves every row of the Strategies sheet,
// gathering the cases of a special-cases strategy under its name.
func (p *Plan) prepareStrategies(ps *study.Problems) {
	byName := map[string]*PlanStrategy{}
	for _, r := range p.Study.Strategies {
		name := strings.TrimSpace(r.Strategy)
		if name == "" {
			ps.Add(study.At("Strategies", r.Row, "strategy"), "the strategy name is empty")
			continue
		}
		c, ok := p.strategyCase(r, name, ps)
		if !ok {
			continue
		}
		st, ok2 := byName[name]
		if !ok2 {
			st = &PlanStrategy{Name: name, Technique: c.Technique}
			byName[name] = st
			p.Strategies = append(p.Strategies, st)
		}
		for _, other := range st.Cases {
			if other.Case == c.Case {
				ps.Add(study.At("Strategies", r.Row, "case"), "strategy %q has case %q twice; name each case", name, c.Case)
			}
		}
		st.Cases = append(st.Cases, c)
	}
	if len(p.Study.Strategies) == 0 {
		ps.Add(study.Cell{Sheet: "Strategies"}, "no strategy: add at least one row")
	}
}

// strategyCase checks one row of the Strategies sheet and solves it. It
// returns false when the row has a problem that stops the solution.
func (p *Plan) strategyCase(r study.StrategyRow, name string, ps *study.Problems) (*PlanCase, bool) {
	c := &PlanCase{Strategy: name, Case: strings.TrimSpace(r.Case), Technique: strings.TrimSpace(r.Technique), Row: r.Row, Fix: map[string]float64{}}
	if !slices.Contains(study.Techniques, c.Technique) {
		ps.Add(study.At("Strategies", r.Row, "technique"), "unknown technique %q%s", c.Technique, feasibility.Suggest(c.Technique, study.Techniques))
	}
	ok := true
	names := func(col, text string, lookup func(string) error) []string {
		names := splitNames(text)
		for _, n := range names {
			if err := lookup(n); err != nil {
				ps.Add(study.At("Strategies", r.Row, col), "%v", err)
				ok = false
			}
		}
		return names
	}
	law := func(n string) error { _, err := feasibility.LookupLaw(n); return err }
	quantity := func(n string) error { _, err := feasibility.LookupQuantity(n); return err }
	relax := splitNames(r.Relax)
	if i := slices.Index(relax, "poisson"); i >= 0 {
		c.RelaxPoisson = true
		relax = slices.Delete(relax, i, i+1)
	}
	strat := feasibility.Strategy{
		Retain: names("retain", r.Retain, law), Relax: names("relax", strings.Join(relax, ","), law),
		Untie: names("untie", r.Untie, quantity), Given: names("given", r.Given, quantity), Tuned: names("tuned", r.Tuned, quantity),
	}
	if !p.strategyFix(c, &strat, r, ps) {
		ok = false
	}
	strat.PreferFree = p.preferFree(c.Fix, strat.Untie)
	c.Correction = strings.TrimSpace(r.Correction)
	if c.Correction != "" && !slices.Contains(study.Corrections, c.Correction) {
		ps.Add(study.At("Strategies", r.Row, "correction"), "unknown correction %q%s", c.Correction, feasibility.Suggest(c.Correction, study.Corrections))
	}
	c.Media = pickCandidates(p.Media, r.Media, "Media", study.At("Strategies", r.Row, "media"), ps)
	c.Materials = pickCandidates(p.Materials, r.Materials, "Materials", study.At("Strategies", r.Row, "materials"), ps)
	c.Facilities = p.pickFacilities(r.Facilities, study.At("Strategies", r.Row, "facilities"), ps)
	if !ok {
		return nil, false
	}
	sol, err := feasibility.Solve(strat)
	if err != nil {
		ps.Add(study.At("Strategies", r.Row, "retain"), "%v", err)
		return nil, false
	}
	c.Solution = sol
	for _, f := range sol.Free {
		if _, fixed := c.Fix[f]; fixed || p.Settings.Axis == f {
			continue
		}
		ps.Add(study.At("Strategies", r.Row, "fix"), "strategy %q leaves the %s scale free: fix it here (fix: %s=1) or sweep it as the second axis (Study: axis = %s)", name, f, f, f)
	}
	for q := range c.Fix {
		if !slices.Contains(sol.Free, q) {
			ps.Add(study.At("Strategies", r.Row, "fix"), "%s is not a free choice of this strategy (free: %s)", q, orNone(sol.Free))
		}
	}
	p.checkGiven(c, strat.Given, ps)
	return c, true
}

// strategyFix reads the fix cell of a Strategies row: scale factors fixed
// (QUANTITY=FACTOR) and g-level ties. It returns false when an item is
// wrong.
func (p *Plan) strategyFix(c *PlanCase, strat *feasibility.Strategy, r study.StrategyRow, ps *study.Problems) bool {
	ok := true
	for _, item := range splitNames(r.Fix) {
		if tie, isTie, err := gLevelTie(item); isTie {
			if err != nil {
				ps.Add(study.At("Strategies", r.Row, "fix"), "%v", err)
				ok = false
			}
			strat.Tied = append(strat.Tied, tie)
			continue
		}
		q, val, found := strings.Cut(item, "=")
		k, err := strconv.ParseFloat(val, 64)
		if !found || err != nil || !(k > 0) || math.IsInf(k, 0) {
			ps.Add(study.At("Strategies", r.Row, "fix"), "%q is not QUANTITY=FACTOR with a positive factor (e.g. velocity=2)", item)
			ok = false
			continue
		}
		if _, err := feasibility.LookupQuantity(q); err != nil {
			ps.Add(study.At("Strategies", r.Row, "fix"), "%v", err)
			ok = false
			continue
		}
		p.addFix(c, q, k, ps)
	}
	return ok
}

func orNone(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

// checkGiven makes sure every given quantity has a prototype value and a
// model value from each candidate the case may use.
func (p *Plan) checkGiven(c *PlanCase, given []string, ps *study.Problems) {
	cell := study.At("Strategies", c.Row, "given")
	for _, q := range given {
		if _, ok := p.Proto[q]; !ok {
			ps.Add(cell, "%s is given but the prototype has no %s: set prototype_medium or prototype_material on the Study sheet, or add an item %s (scales_as %s) to the Prototype sheet", q, q, q, q)
			continue
		}
		if q == "gravity" {
			continue
		}
		for _, m := range candidatesOrNil(c.Media) {
			for _, mat := range candidatesOrNil(c.Materials) {
				if _, ok := modelProp(q, m, mat); !ok {
					ps.Add(cell, "%s is given but %s has none: choose a medium or material that states %s", q, describePair(m, mat), q)
				}
			}
		}
	}
}
