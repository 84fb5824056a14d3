package report

import (
	"fmt"

	"github.com/xuri/excelize/v2"
	"math"
	"strconv"
	"strings"

	"scaleplan/sweep"
)

// WarningLines returns every warning of a study once, a strategy's own
// prefixed with its name.
func WarningLines(res *sweep.Result) []string {
	var out []string
	for _, w := range res.Warnings {
		out = append(out, w.Text())
	}
	return out
}

// AxisText states the second-axis value a strategy's recommendation
// assumes: "velocity scale k = 2.1", "tank_length = 150 m".
func AxisText(res *sweep.Result, a sweep.Assumptions) string {
	if a.Axis == nil {
		return ""
	}
	if isFreeChoiceAxis(res.Plan) {
		return fmt.Sprintf("%s scale k = %s", a.Axis.Name, Num3(a.Axis.Value))
	}
	s := fmt.Sprintf("%s = %s", a.Axis.Name, Num3(a.Axis.Value))
	if u := axisUnit(res.Plan); u != "" {
		s += " " + u
	}
	return s
}

// AssumptionLines states what a strategy's recommendation assumes: the
// second-axis value, the free choices fixed, the cheapest feasible option
// over all its combinations, and what a larger model would need.
func AssumptionLines(res *sweep.Result, sr *sweep.StrategyResult) []string {
	a := res.Assume(sr)
	cur := res.Plan.Settings.Currency
	var out []string
	if s := AxisText(res, a); s != "" {
		out = append(out, "second axis at "+s+" (the value that allows the largest model)")
	}
	if len(a.Fixed) > 0 {
		var parts []string
		for _, f := range a.Fixed {
			parts = append(parts, f.Quantity+"="+strconv.FormatFloat(f.Factor, 'g', -1, 64))
		}
		out = append(out, "free choice fixed: "+strings.Join(parts, ", "))
	}
	if o := a.Cheapest; o != nil {
		out = append(out, fmt.Sprintf("cheapest feasible option over all combinations: %s with %s, %s", sweep.Scale(o.Cheapest), Candidate(o), Money(o.CheapestCost, cur)))
	}
	if !math.IsNaN(a.LargerScale) {
		if len(a.LargerNeeds) > 0 {
			var parts []string
			for _, n := range a.LargerNeeds {
				dir := "at least"
				if !n.AtLeast {
					dir = "at most"
				}
				parts = append(parts, fmt.Sprintf("%s %s %s (has %s; limit %q)", n.Capability, dir, withUnit(n.Value, n.Unit), withUnit(n.Have, n.Unit), n.Limit))
			}
			out = append(out, fmt.Sprintf("a larger model (%s) would need %s", sweep.Scale(a.LargerScale), strings.Join(parts, ", ")))
		} else if a.LargerLimit != "" {
			out = append(out, fmt.Sprintf("a larger model (%s) is stopped by %q, which no facility capability relieves", sweep.Scale(a.LargerScale), a.LargerLimit))
		}
	}
	return out
}

// memoWarnings lists the study's warnings.
func memoWarnings(b *strings.Builder, res *sweep.Result) {
	lines := WarningLines(res)
	if len(lines) == 0 {
		return
	}
	fmt.Fprintf(b, "## Warnings (%d)\n\n", len(lines))
	for _, l := range lines {
		fmt.Fprintf(b, "- %s\n", md(l))
	}
	b.WriteString("\n")
}

// memoWhy says why the recommended strategy ranks first and why each
// other one ranks where it does.
func memoWhy(b *strings.Builder, res *sweep.Result) {
	rec := res.Recommended()
	if rec == nil {
		return
	}
	fmt.Fprintf(b, "**Why this strategy.** It ranks first of %d: it %s.", len(res.Ranking), rec.Reason)
	for _, e := range res.Ranking {
		if e.Strategy == rec.Strategy {
			continue
		}
		switch {
		case !e.Feasible:
			fmt.Fprintf(b, " %s ranks %d: %s.", e.Strategy, e.Rank, e.Reason)
		case e.ScaleEffect && !rec.ScaleEffect && e.Recommended < rec.Recommended:
			fmt.Fprintf(b, " %s ranks %d although its model is larger (%s): it %s, and a strategy without such a scale effect ranks first whatever the model sizes (mark the law weak on the Study sheet, weak_laws, if it does not matter for this test).",
				e.Strategy, e.Rank, sweep.Scale(e.Recommended), e.Reason)
		default:
			fmt.Fprintf(b, " %s ranks %d (%s): %s.", e.Strategy, e.Rank, sweep.Scale(e.Recommended), e.Reason)
		}
	}
	b.WriteString("\n\n")
}

// memoAssumptions states, per strategy with a window, what its best option
// assumes.
func memoAssumptions(b *strings.Builder, res *sweep.Result) {
	var lines []string
	for _, sr := range res.Strategies {
		if sr.Best == nil {
			continue
		}
		for _, l := range AssumptionLines(res, sr) {
			lines = append(lines, fmt.Sprintf("- %s: %s.\n", md(sr.Name), md(l)))
		}
	}
	if len(lines) == 0 {
		return
	}
	b.WriteString("\n## Assumptions\n\n")
	for _, l := range lines {
		b.WriteString(l)
	}
}

func withUnit(x float64, unit string) string {
	if unit == "" || unit == "1" {
		return Num3(x)
	}
	return Num3(x) + " " + unit
}

// runTextVerdicts writes, below the terminal table, the recommendation
// with its reason, each strategy's assumptions and the warnings.
func runTextVerdicts(b *strings.Builder, res *sweep.Result) {
	if rec := res.Recommended(); rec != nil {
		fmt.Fprintf(b, "Recommended: %s at %s (%s)\n", rec.Strategy, sweep.Scale(rec.Recommended), rec.Reason)
	} else {
		b.WriteString("Recommended: none (no strategy has a feasible scale)\n")
	}
	for _, sr := range res.Strategies {
		if sr.Best == nil {
			continue
		}
		for _, l := range AssumptionLines(res, sr) {
			fmt.Fprintf(b, "  %s: %s\n", sr.Name, l)
		}
	}
	if lines := WarningLines(res); len(lines) > 0 {
		fmt.Fprintf(b, "Warnings (%d):\n", len(lines))
		for _, l := range lines {
			fmt.Fprintf(b, "  %s\n", l)
		}
	}
}

// summaryVerdicts are the rows of the workbook summary below the strategy
// table: the recommendation with its reason, and the warnings.
func summaryVerdicts(res *sweep.Result, bold int) [][]any {
	rows := [][]any{{}}
	if rec := res.Recommended(); rec != nil {
		rows = append(rows, []any{excelize.Cell{StyleID: bold, Value: "Recommended"},
			fmt.Sprintf("%s at %s: ranks first, it %s", rec.Strategy, sweep.Scale(rec.Recommended), rec.Reason)})
	} else {
		rows = append(rows, []any{excelize.Cell{StyleID: bold, Value: "Recommended"}, "none: no strategy has a feasible scale"})
	}
	lines := WarningLines(res)
	if len(lines) > 0 {
		rows = append(rows, []any{}, []any{excelize.Cell{StyleID: bold, Value: fmt.Sprintf("Warnings (%d)", len(lines))}})
		for _, l := range lines {
			rows = append(rows, []any{"", l})
		}
	}
	return rows
}

// relaxedSentence says how a relaxed group is off at the recommended scale.
func relaxedSentence(m sweep.Relaxed) string {
	g := m.Group
	if m.Case != "" {
		g += " of case " + m.Case
	}
	if math.IsNaN(m.Ratio) {
		return fmt.Sprintf("The %s (law %s relaxed) is not matched; %s.", g, m.Law, m.Words())
	}
	s := fmt.Sprintf("The %s (law %s relaxed) is not matched: prototype / model = %s.", g, m.Law, Num3(m.Ratio))
	if m.Weak {
		s += " The study marks the law weak."
	}
	return s
}
