package report

import (
	"fmt"

	"github.com/xuri/excelize/v2"
	"math"
	"slices"
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
	return assumptionLines(res, sr, false)
}

// assumptionLines says the assumptions of sweep.Assumptions in the
// terminal's words (identifiers, Num3, Money) or, for the memo, in words
// for people (labels, HumanNumber, HumanMoney, limit names through
// proseText with the user's names kept).
func assumptionLines(res *sweep.Result, sr *sweep.StrategyResult, memo bool) []string {
	a := res.Assume(sr)
	cur := res.Plan.Settings.Currency
	name, num, limit := func(id string) string { return id }, withUnit, func(s string) string { return s }
	if memo {
		keep := userNames(res)
		name, num, limit = Label, humanWithUnit, func(s string) string { return proseText(s, keep) }
	}
	var out []string
	switch {
	case !memo:
		if s := AxisText(res, a); s != "" {
			out = append(out, "second axis at "+s+" (the value that allows the largest model)")
		}
	case a.Axis != nil && isFreeChoiceAxis(res.Plan):
		out = append(out, fmt.Sprintf("the second axis at a %s scale k = %s (the value that allows the largest model)", Label(a.Axis.Name), HumanNumber(a.Axis.Value)))
	case a.Axis != nil:
		out = append(out, fmt.Sprintf("the second axis at %s = %s (the value that allows the largest model)", Label(a.Axis.Name), humanWithUnit(a.Axis.Value, axisUnit(res.Plan))))
	}
	if len(a.Fixed) > 0 {
		var parts []string
		for _, f := range a.Fixed {
			if memo {
				parts = append(parts, fmt.Sprintf("%s scale k = %s", Label(f.Quantity), HumanNumber(f.Factor)))
			} else {
				parts = append(parts, f.Quantity+"="+strconv.FormatFloat(f.Factor, 'g', -1, 64))
			}
		}
		out = append(out, "free choice fixed: "+strings.Join(parts, ", "))
	}
	if o := a.Cheapest; o != nil {
		if memo {
			out = append(out, fmt.Sprintf("the cheapest feasible option over all its combinations is %s with %s, at %s", sweep.Scale(o.Cheapest), Candidate(o), HumanMoney(o.CheapestCost, cur)))
		} else {
			out = append(out, fmt.Sprintf("cheapest feasible option over all combinations: %s with %s, %s", sweep.Scale(o.Cheapest), Candidate(o), Money(o.CheapestCost, cur)))
		}
	}
	if !math.IsNaN(a.LargerScale) {
		// Told apart from the window's large-model edge it sits next to.
		larger := sweep.Scale(a.LargerScale)
		if c := sr.Best; c != nil && !c.Window.Empty() {
			larger = sweep.ScaleBeside(a.LargerScale, c.Window[0].Lo)
		}
		if len(a.LargerNeeds) > 0 {
			var parts []string
			for _, n := range a.LargerNeeds {
				dir := "at least"
				if !n.AtLeast {
					dir = "at most"
				}
				if memo {
					parts = append(parts, fmt.Sprintf("the %s to be %s %s (the facility has %s; limit %q)", name(n.Capability), dir, num(n.Value, n.Unit), num(n.Have, n.Unit), limit(n.Limit)))
				} else {
					parts = append(parts, fmt.Sprintf("%s %s %s (has %s; limit %q)", name(n.Capability), dir, num(n.Value, n.Unit), num(n.Have, n.Unit), limit(n.Limit)))
				}
			}
			out = append(out, fmt.Sprintf("a larger model (%s) would need %s", larger, strings.Join(parts, ", ")))
		} else if a.LargerLimit != "" {
			out = append(out, fmt.Sprintf("a larger model (%s) is stopped by %q, which no facility capability relieves", larger, limit(a.LargerLimit)))
		}
	}
	return out
}

// memoWarnings lists the study's warnings, in the memo's words.
func memoWarnings(b *strings.Builder, res *sweep.Result) {
	lines := WarningLines(res)
	if len(lines) == 0 {
		return
	}
	keep := userNames(res)
	fmt.Fprintf(b, "## Warnings (%d)\n\n", len(lines))
	for _, l := range lines {
		fmt.Fprintf(b, "- %s\n", md(proseText(l, keep)))
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
	keep := userNames(res)
	feasible := 0
	for _, e := range res.Ranking {
		if e.Feasible {
			feasible++
		}
	}
	switch {
	case len(res.Ranking) == 1:
		fmt.Fprintf(b, "**Why this strategy.** It is the study's only strategy: it %s.", memoReason(res, *rec, keep))
	case feasible == 1:
		fmt.Fprintf(b, "**Why this strategy.** It is the only one of the %d strategies with a feasible scale: it %s.", len(res.Ranking), memoReason(res, *rec, keep))
	default:
		fmt.Fprintf(b, "**Why this strategy.** It ranks first of %d (%d with a feasible scale): it %s.", len(res.Ranking), feasible, memoReason(res, *rec, keep))
	}
	for _, e := range res.Ranking {
		if e.Strategy == rec.Strategy {
			continue
		}
		switch {
		case !e.Feasible:
			fmt.Fprintf(b, " %s ranks %d: %s.", e.Strategy, e.Rank, memoReason(res, e, keep))
		case e.ScaleEffect && !rec.ScaleEffect && e.Recommended < rec.Recommended:
			fmt.Fprintf(b, " %s ranks %d although its model is larger (%s): it %s, and a strategy without such a scale effect ranks first whatever the model sizes (mark the law weak on the Study sheet, weak_laws, if it does not matter for this test).",
				e.Strategy, e.Rank, sweep.Scale(e.Recommended), memoReason(res, e, keep))
		case e.ScaleEffect == rec.ScaleEffect && res.Plan.Settings.Recommend != "cheapest" && e.Recommended > rec.Recommended:
			fmt.Fprintf(b, " %s ranks %d (%s, a smaller model): it %s.", e.Strategy, e.Rank, sweep.Scale(e.Recommended), memoReason(res, e, keep))
		default:
			fmt.Fprintf(b, " %s ranks %d (%s): it %s.", e.Strategy, e.Rank, sweep.Scale(e.Recommended), memoReason(res, e, keep))
		}
	}
	b.WriteString("\n\n")
}

// memoReason says in the memo's words why a strategy stands where it does,
// from the ranking's fields: the failing reason of an infeasible one; the
// relaxed laws of a feasible one, those that count against it when there
// are some (RankEntry.ScaleEffect), else those within the threshold, else
// the weak ones.
func memoReason(res *sweep.Result, e sweep.RankEntry, keep []string) string {
	if !e.Feasible {
		s := "no feasible scale"
		if why := firstFailing(e.Result); why != "" {
			s += ": " + proseText(why, keep)
		}
		return s
	}
	th := HumanNumber(res.Plan.Settings.MismatchThreshold)
	var counted, within, weak []string
	for _, r := range e.Relaxed {
		law := LawLabel(r.Law)
		switch {
		case r.Weak:
			if !slices.Contains(weak, law) {
				weak = append(weak, law)
			}
		case r.Governing:
			counted = append(counted, fmt.Sprintf("relaxes the %s, which the study marks governing (%s)", law, relaxedWords(r)))
		case math.IsNaN(r.Ratio):
			counted = append(counted, fmt.Sprintf("relaxes the %s (%s)", law, relaxedWords(r)))
		case r.Size() > res.Plan.Settings.MismatchThreshold:
			counted = append(counted, fmt.Sprintf("relaxes the %s (%s, beyond the threshold %s)", law, relaxedWords(r), th))
		default:
			within = append(within, fmt.Sprintf("relaxes the %s (%s, within the threshold %s)", law, relaxedWords(r), th))
		}
	}
	switch {
	case len(counted) > 0:
		return strings.Join(counted, "; ")
	case len(within) > 0:
		return strings.Join(within, "; ")
	case len(weak) > 0:
		return "relaxes only laws the study marks weak (the " + strings.Join(weak, ", the ") + ")"
	}
	return "relaxes no law"
}

// relaxedWords says how the model's group compares with the prototype's:
// "the model's Reynolds number is 1/34.2 of the prototype's".
func relaxedWords(r sweep.Relaxed) string {
	g := r.Group
	if r.Case != "" {
		g += " of case " + r.Case
	}
	switch {
	case math.IsNaN(r.Ratio) && len(r.Missing) == 0:
		return fmt.Sprintf("the %s mismatch cannot be evaluated", g)
	case math.IsNaN(r.Ratio):
		missing := make([]string, len(r.Missing))
		for i, m := range r.Missing {
			missing[i] = Label(m)
		}
		return fmt.Sprintf("the %s mismatch cannot be evaluated: give the %s", g, strings.Join(missing, ", the "))
	case r.Ratio >= 1:
		return fmt.Sprintf("the model's %s is 1/%s of the prototype's", g, HumanNumber(r.Ratio))
	default:
		return fmt.Sprintf("the model's %s is %s times the prototype's", g, HumanNumber(1/r.Ratio))
	}
}

// memoAssumptions states, per strategy with a window, what its best option
// assumes.
func memoAssumptions(b *strings.Builder, res *sweep.Result) {
	var lines []string
	for _, sr := range res.Strategies {
		if sr.Best == nil {
			continue
		}
		for _, l := range assumptionLines(res, sr, true) {
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

// humanWithUnit is a value for people with its unit ("9.07 m").
func humanWithUnit(x float64, unit string) string {
	if unit == "" || unit == "1" {
		return HumanNumber(x)
	}
	return HumanNumber(x) + " " + humanPowers(unit)
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
		return fmt.Sprintf("The %s (%s relaxed) is not matched; %s.", g, LawLabel(m.Law), relaxedWords(m))
	}
	s := fmt.Sprintf("The %s (%s relaxed) is not matched: prototype / model = %s.", g, LawLabel(m.Law), HumanNumber(m.Ratio))
	if m.Weak {
		s += " The study marks the law weak."
	}
	return s
}
