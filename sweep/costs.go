package sweep

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// prepareCosts checks the Costs sheet: each item's coefficient, the unit
// it is per and its measure, and the facility it applies to.
func (p *Plan) prepareCosts(ps *study.Problems) {
	for _, r := range p.Study.Costs {
		c := &PlanCost{Item: strings.TrimSpace(r.Item), Facility: strings.TrimSpace(r.Facility), Row: r.Row}
		k, err := strconv.ParseFloat(strings.TrimSpace(r.Coefficient), 64)
		if err != nil || math.IsNaN(k) || math.IsInf(k, 0) || k < 0 {
			ps.Add(study.At("Costs", r.Row, "coefficient"), "%q is not a non-negative number", r.Coefficient)
			continue
		}
		c.Coefficient = k
		c.Per = feasibility.Unit{Factor: 1}
		if s := strings.TrimSpace(r.Per); s != "" && s != "1" {
			u, err := feasibility.ParseUnit(s)
			if err != nil {
				ps.Add(study.At("Costs", r.Row, "per"), "%v", err)
				continue
			}
			c.Per = u
		}
		e, err := feasibility.ParseExpr(r.Measure)
		if err != nil {
			ps.Add(study.At("Costs", r.Row, "measure"), "%v", err)
			continue
		}
		c.Measure = e
		var f *Facility
		if c.Facility != "" {
			if f = p.facility(c.Facility); f == nil {
				ps.Add(study.At("Costs", r.Row, "facility"), "no facility named %q", c.Facility)
				continue
			}
		}
		targets := []*Facility{f}
		if f == nil && len(p.Facilities) > 0 {
			targets = p.Facilities
		}
		p.checkDim(ps, e, targets, c.Per.Dim, study.At("Costs", r.Row, "measure"), study.At("Costs", r.Row, "per"),
			func(d feasibility.Dimension) string {
				return fmt.Sprintf("the measure has dimension %s but per is %q (%s)", d, r.Per, c.Per.Dim)
			})
		p.Costs = append(p.Costs, c)
	}
}

// costs returns the cost items that apply to the combination's facility.
func (x *combo) costs() []*PlanCost {
	var out []*PlanCost
	for _, c := range x.plan.Costs {
		if c.Facility == "" || (x.fac != nil && c.Facility == x.fac.Name) {
			out = append(out, c)
		}
	}
	return out
}
