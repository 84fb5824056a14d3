package report

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"scaleplan/sweep"
)

// WindowText prints a window as "1:a–1:b" intervals; a single scale as
// "only 1:a".
func WindowText(w sweep.Window) string {
	if w.Empty() {
		return "none"
	}
	parts := make([]string, len(w))
	for i, iv := range w {
		if iv.Lo == iv.Hi {
			parts[i] = "only " + sweep.Scale(iv.Lo)
		} else {
			parts[i] = sweep.Scale(iv.Lo) + "–" + sweep.Scale(iv.Hi)
		}
	}
	return strings.Join(parts, ", ")
}

// Edges names the limits at the large-model edge (small kL) and the
// small-model edge (large kL) of a window.
func Edges(w sweep.Window) (large, small string) {
	if w.Empty() {
		return "", ""
	}
	return w[0].LoLimit, w[len(w)-1].HiLimit
}

// Candidate names a combination's candidate pair and facility.
func Candidate(c *sweep.ComboResult) string { return c.Label() }

// Money prints a cost with its currency, or "-" when there is none.
func Money(x float64, currency string) string {
	if math.IsNaN(x) {
		return "-"
	}
	return fmt.Sprintf("%.0f %s", math.Round(x), currency)
}

// WriteRunText writes the short terminal table of a study.
func WriteRunText(w io.Writer, res *sweep.Result) error {
	b := &strings.Builder{}
	st := res.Plan.Settings
	fmt.Fprintf(b, "Study %s (%s)\n", res.Name, Convention)
	tw := tabwriter.NewWriter(b, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "rank\tstrategy\ttechnique\twindow\tlarge-model edge\tsmall-model edge\trecommended\tmodel length\tcost\tbest candidate")
	var none []string
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			// The reason goes below the table, which it would widen.
			reason := "no feasible scale"
			if why := firstFailing(sr); why != "" {
				reason = why
			}
			none = append(none, fmt.Sprintf("No window for %s: %s\n", sr.Name, reason))
			fmt.Fprintf(tw, "%s\t%s\t%s\tnone\t(below)\t\t\t\t\t\n", rankText(res, sr), sr.Name, sr.Technique)
			continue
		}
		large, small := Edges(c.Window)
		length := "-"
		if !math.IsNaN(c.ModelLength) {
			length = Num3(c.ModelLength) + " m"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", rankText(res, sr), sr.Name, sr.Technique, WindowText(c.Window), large, small,
			sweep.Scale(c.Recommended), length, Money(c.Cost, st.Currency), Candidate(c))
	}
	tw.Flush()
	for _, l := range none {
		b.WriteString(l)
	}
	for _, l := range recipeLines(res) {
		b.WriteString(l + "\n")
	}
	runTextVerdicts(b, res)
	b.WriteString("A planning aid: scale effects remain; the test plan rests with qualified engineers, facility rules and codes.\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// rankText is a strategy's rank in the study's recommendation.
func rankText(res *sweep.Result, sr *sweep.StrategyResult) string {
	if e := res.RankOf(sr.Name); e != nil {
		return strconv.Itoa(e.Rank)
	}
	return "-"
}

// firstFailing is the reason a strategy has no window (sweep.FailingReason).
func firstFailing(sr *sweep.StrategyResult) string { return sweep.FailingReason(sr) }

// Num3 prints a number to three significant figures.
func Num3(x float64) string { return fmt.Sprintf("%.3g", x) }

// WriteRunJSON writes the results of a batch as a JSON array.
func WriteRunJSON(w io.Writer, data []any) error { return writeJSON(w, data) }
