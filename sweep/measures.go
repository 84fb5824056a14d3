package sweep

import (
	"fmt"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// prepareMeasures checks the Measures sheet: each measure's expression
// and the unit it is reported in.
func (p *Plan) prepareMeasures(ps *study.Problems) {
	for _, r := range p.Study.Measures {
		m := &PlanMeasure{Name: strings.TrimSpace(r.Measure), Row: r.Row, Unit: feasibility.Unit{Factor: 1}}
		if m.Name == "" {
			ps.Add(study.At("Measures", r.Row, "measure"), "the measure has no name")
			continue
		}
		e, err := feasibility.ParseExpr(r.Expression)
		if err != nil {
			ps.Add(study.At("Measures", r.Row, "expression"), "%v", err)
			continue
		}
		m.Expr = e
		if u := strings.TrimSpace(r.Unit); u != "" && u != "1" {
			pu, err := feasibility.ParseUnit(u)
			if err != nil {
				ps.Add(study.At("Measures", r.Row, "unit"), "%v", err)
				continue
			}
			m.Unit = pu
		}
		targets := p.Facilities
		if len(targets) == 0 {
			targets = []*Facility{nil}
		}
		p.checkDim(ps, e, targets, m.Unit.Dim, study.At("Measures", r.Row, "expression"), study.At("Measures", r.Row, "unit"),
			func(d feasibility.Dimension) string {
				return fmt.Sprintf("the measure has dimension %s but the unit %q is %s", d, r.Unit, m.Unit.Dim)
			})
		p.Measures = append(p.Measures, m)
	}
}
