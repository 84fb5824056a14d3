package report

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"scaleplan/sweep"
)

// WriteMemo writes the proposal memo of a study as Markdown: what the test
// is for, the strategies compared, the one recommended and why, the scale
// effects left, the prediction rules, the cost and the cautions. Every
// number comes from the same results as the workbook.
func WriteMemo(path string, res *sweep.Result) error {
	return WriteFileAtomic(path, func(w io.Writer) error {
		_, err := io.WriteString(w, Memo(res))
		return err
	})
}

// Memo returns the memo text.
func Memo(res *sweep.Result) string { return memoText(res, nil) }

// memoText is the memo with its figures (none for nil).
func memoText(res *sweep.Result, figures []Figure) string {
	b := &strings.Builder{}
	memoHeader(b, res)
	memoWarnings(b, res)

	keep := userNames(res)
	memoStrategies(b, res, keep)
	memoTradeoffs(b, res, figures)

	rec, recS := recommended(res)
	b.WriteString("## Recommendation\n\n")
	if rec == nil {
		b.WriteString("No strategy has a feasible scale with the media, materials and facilities of this study. " +
			"The table above says what closes each window; relax a law, choose another facility or medium, or widen the sweep.\n\n")
	} else {
		memoRecommendation(b, res, rec, recS, keep)
		memoScaleEffects(b, res, rec, recS, keep)
		memoPredictionRules(b, res, rec, recS)
	}
	memoAssumptions(b, res)
	writeFigures(b, figures)
	b.WriteString("\n## Cautions\n\n")
	for _, c := range Cautions {
		fmt.Fprintf(b, "- %s\n", c)
	}
	return b.String()
}

// memoHeader writes the memo's title, its provenance, the study's purpose
// and the scale convention.
func memoHeader(b *strings.Builder, res *sweep.Result) {
	st := res.Plan.Settings
	fmt.Fprintf(b, "# Model test proposal: %s\n\n", res.Name)
	fmt.Fprintf(b, "*Prepared with scaleplan %s from the study's inputs dated %s.*\n\n", BuildVersion(), orDash(st.InputsDate))
	if st.Purpose != "" {
		fmt.Fprintf(b, "**Purpose.** %s\n\n", st.Purpose)
	}
	fmt.Fprintf(b, "Scale factors follow k = prototype value / model value: a model at 1:25 has kL = 25. "+
		"The length scale was swept from %s to %s.\n\n", sweep.Scale(st.ScaleFrom), sweep.Scale(st.ScaleTo))
}

// memoStrategies writes the table of the strategies compared: each one's
// window, what limits it, its scale and cost.
func memoStrategies(b *strings.Builder, res *sweep.Result, keep []string) {
	st := res.Plan.Settings
	b.WriteString("## Strategies compared\n\n")
	b.WriteString("| strategy (technique) | window | limited by (large / small model) | scale | cost |\n|---|---|---|---|---|\n")
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			fmt.Fprintf(b, "| %s (%s) | none | %s | | |\n", md(sr.Name), Label(sr.Technique), md(proseText(firstFailing(sr), keep)))
			continue
		}
		large, small := Edges(c.Window)
		fmt.Fprintf(b, "| %s (%s) | %s | %s / %s | %s | %s |\n", md(sr.Name), Label(sr.Technique), WindowText(c.Window),
			md(proseText(large, keep)), md(proseText(small, keep)), sweep.Scale(c.Recommended), HumanMoney(c.Cost, st.Currency))
	}
	b.WriteString("\n")
}

// memoRecommendation writes the recommended strategy, scale and candidates
// with the reasons, the window under uncertain inputs and the limiting
// capability.
func memoRecommendation(b *strings.Builder, res *sweep.Result, rec *sweep.ComboResult, recS *sweep.StrategyResult, keep []string) {
	st := res.Plan.Settings
	large, small := Edges(rec.Window)
	fmt.Fprintf(b, "Use **%s** (%s) at **%s**", recS.Name, Label(recS.Technique), sweep.Scale(rec.Recommended))
	if !math.IsNaN(rec.ModelLength) {
		fmt.Fprintf(b, ", a model %s m long", HumanNumber(rec.ModelLength))
	}
	fmt.Fprintf(b, ", with %s. The feasible window is %s: the largest model is limited by %s, the smallest by %s.",
		Candidate(rec), WindowText(rec.Window), proseText(large, keep), proseText(small, keep))
	if !math.IsNaN(rec.Cost) {
		fmt.Fprintf(b, " The campaign is estimated at %s at this scale", HumanMoney(rec.Cost, st.Currency))
		if o := res.Assume(recS).Cheapest; o != nil && (o.Cheapest != rec.Recommended || o != rec) {
			fmt.Fprintf(b, "; the cheapest feasible option over all combinations of the strategy is %s with %s, at %s", sweep.Scale(o.Cheapest), Candidate(o), HumanMoney(o.CheapestCost, st.Currency))
		}
		b.WriteString(".")
	}
	b.WriteString("\n\n")
	memoWhy(b, res)
	if r := rec.Robust; r != nil {
		// The sampling error of the probability, in percentage points,
		// and never printed as zero.
		sampling := fmt.Sprintf("at most %.1f percentage points", 100*r.StdErr)
		if 100*r.StdErr < 0.05 {
			sampling = "below 0.05 percentage points"
		}
		fmt.Fprintf(b, "**Uncertain inputs.** Drawing the study's uncertain inputs %d times, the scales that stay feasible with a probability of at least %.0f %% are %s (sampling error of that probability %s), against %s on nominal values.",
			r.Samples, 100*r.Level, WindowText(r.Window), sampling, WindowText(rec.Window))
		if len(r.Sensitivity) > 0 {
			gain := fmt.Sprintf("by %.2f decades of scale", r.Sensitivity[0].Gain)
			if r.Sensitivity[0].Gain < 0.005 {
				gain = "by less than 0.01 decades of scale"
			}
			fmt.Fprintf(b, " The input that matters most is %s: knowing it exactly would widen that window %s.", Label(r.Sensitivity[0].Input), gain)
		}
		if r.Note != "" {
			fmt.Fprintf(b, " (%s.)", r.Note)
		}
		b.WriteString("\n\n")
	}
	if line := limitingCapability(res, rec); line != "" {
		b.WriteString(line + "\n\n")
	}

}

// memoScaleEffects writes the scale effects of the recommendation and
// their corrections: relaxed laws, friction, required properties and
// library matches, measures, added mass.
func memoScaleEffects(b *strings.Builder, res *sweep.Result, rec *sweep.ComboResult, recS *sweep.StrategyResult, keep []string) {
	b.WriteString("## Scale effects and corrections\n\n")
	relaxed := res.Recommended().Relaxed // every case's, also at a joint scale
	if len(relaxed) == 0 {
		b.WriteString("The strategy relaxes no law; scale effects beyond the laws modelled remain.\n")
	}
	for _, m := range relaxed {
		fmt.Fprintf(b, "- %s\n", relaxedSentence(m))
	}
	if f := rec.Friction; f != nil {
		fmt.Fprintf(b, "- Skin friction is corrected with the ITTC-1957 line: C_F = %s in the model (Re %s) and %s at full scale (Re %s), a correction of ΔC_F = %s.\n",
			HumanNumber(f.CFModel), HumanNumber(f.ReModel), HumanNumber(f.CFProto), HumanNumber(f.ReProto), HumanNumber(f.Delta))
	}
	for _, pv := range rec.Required {
		what := "required"
		if pv.Tuned {
			what = "tuned"
		}
		fmt.Fprintf(b, "- The model's %s is %s: %s %s at the recommended scale (%s to %s across the window; %s).\n",
			Label(pv.Quantity), what, HumanNumber(pv.AtRecommended), humanPowers(unitOf(pv.Quantity)), HumanNumber(pv.AtLo), HumanNumber(pv.AtHi), lawProse(pv.Law))
		if recS.Technique == "substitute" {
			if len(pv.Matches) == 0 {
				b.WriteString("  No entry of the library meets it within the study's tolerance.\n")
			} else {
				fmt.Fprintf(b, "  Library entries that meet it at the recommended scale: %s.\n", proseText(matchList(pv.Quantity, pv.Matches), keep))
			}
			if s := recipeSentence(pv); s != "" {
				fmt.Fprintf(b, "  %s\n", proseText(s, keep))
			}
		}
	}
	for _, m := range rec.Measures {
		fmt.Fprintf(b, "- %s: %s %s at the recommended scale (%s to %s across the window).\n", Label(m.Name), HumanNumber(m.AtRecommended), humanPowers(m.Unit), HumanNumber(m.AtLo), HumanNumber(m.AtHi))
	}
	if !math.IsNaN(rec.AddedMass) {
		fmt.Fprintf(b, "- Added mass: dummy weights must raise the model material's density by %s kg/m³, %s kg in total at the recommended scale.\n",
			HumanNumber(rec.AddedDensity), HumanNumber(rec.AddedMass))
	}
	if rec.PoissonFlag {
		fmt.Fprintf(b, "- %s.\n", rec.PoissonNote)
	}
}

// memoPredictionRules writes the multipliers from model measurements to
// prototype values, one table per case at a joint scale.
func memoPredictionRules(b *strings.Builder, res *sweep.Result, rec *sweep.ComboResult, recS *sweep.StrategyResult) {
	b.WriteString("\n## Prediction rules\n\n")
	b.WriteString("A model measurement times the multiplier gives the prototype value.\n")
	keep := measuredQuantities(res.Plan)
	if rec.Factors != nil {
		predictionTable(b, caseSolution(recS, rec), rec.Factors, keep)
	} else {
		// A joint window: one table per case, at the joint scale.
		for _, cs := range recS.Cases {
			if f, c := recS.CaseFactors(cs, rec); f != nil {
				fmt.Fprintf(b, "\nCase %s (%s), at %s:\n", cs.Case, Candidate(c), sweep.Scale(rec.Recommended))
				predictionTable(b, cs.Solution, f, keep)
			}
		}
	}
}

// recommended is the first feasible strategy of the study's ranking
// (sweep.Plan.Rank), with its best combination.
func recommended(res *sweep.Result) (*sweep.ComboResult, *sweep.StrategyResult) {
	e := res.Recommended()
	if e == nil {
		return nil, nil
	}
	return e.Best, e.Result
}

// caseSolution finds the solution of a combination's case.
func caseSolution(sr *sweep.StrategyResult, c *sweep.ComboResult) interface{ LawString(string) string } {
	for _, cs := range sr.Cases {
		if cs.Case == c.Case {
			return cs.Solution
		}
	}
	return sr.Cases[0].Solution
}

// md escapes the characters that would break a Markdown table cell.
func md(s string) string {
	return strings.NewReplacer("|", "\\|", "\n", " ").Replace(s)
}

// limitingCapability says which facility capability limits the largest
// model, and what a facility would need to hold a larger one.
func limitingCapability(res *sweep.Result, c *sweep.ComboResult) string {
	if c.Window.Empty() || c.Facility == "" {
		return ""
	}
	edge := c.Window[0].LoLimit
	for _, r := range c.Requirements {
		if r.Limit != edge {
			continue
		}
		s := fmt.Sprintf("**Facility.** The largest model is limited by the %s of %s (limit %q): at %s it needs %s %s, which the facility has.",
			Label(r.Capability), c.Facility, proseText(r.Limit, userNames(res)), sweep.Scale(c.Window[0].Lo), HumanNumber(r.Have), r.Unit)
		if !math.IsNaN(c.AnyFacility) && c.AnyFacility < c.Window[0].Lo {
			i := nearest(res.Plan.Grid, c.AnyFacility)
			s += fmt.Sprintf(" A model as large as %s, which the other limits allow, would need %s %s (the other capabilities as they are).",
				sweep.Scale(c.AnyFacility), HumanNumber(r.At(i)), r.Unit)
		}
		return s
	}
	return fmt.Sprintf("**Facility.** The largest model is limited by %q, not by a capability of %s.", proseText(edge, userNames(res)), c.Facility)
}

// predictionTable writes the prediction rules of a solution for the
// quantities in keep (all when keep is empty), with readable names; a
// factor the medium or material gives (a law that only names itself) says
// so instead of repeating itself.
func predictionTable(b *strings.Builder, sol interface{ LawString(string) string }, factors map[string]float64, keep map[string]bool) {
	b.WriteString("\n| quantity | scale law | multiplier |\n|---|---|---|\n")
	keys := make([]string, 0, len(factors))
	for q := range factors {
		if len(keep) == 0 || keep[q] {
			keys = append(keys, q)
		}
	}
	sort.Strings(keys)
	for _, q := range keys {
		law := ReadableLaw(sol.LawString(q))
		if law == "" {
			law = "given by the model medium or material"
		}
		fmt.Fprintf(b, "| %s | %s | %s |\n", md(Label(q)), md(law), HumanNumber(factors[q]))
	}
}
