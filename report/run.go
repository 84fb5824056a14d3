package report

import (
	"fmt"
	"io"
	"math"
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
func Candidate(c *sweep.ComboResult) string {
	var parts []string
	for _, s := range []string{c.Medium, c.Material} {
		if s != "" {
			parts = append(parts, s)
		}
	}
	s := strings.Join(parts, " / ")
	if c.Facility != "" {
		if s != "" {
			s += " in "
		}
		s += c.Facility
	}
	if s == "" {
		s = "-"
	}
	return s
}

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
	fmt.Fprintln(tw, "strategy\ttechnique\twindow\tlarge-model edge\tsmall-model edge\trecommended\tmodel length\tcost\tbest candidate")
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			reason := "no feasible scale"
			if why := firstFailing(sr); why != "" {
				reason = why
			}
			fmt.Fprintf(tw, "%s\t%s\tnone\t%s\t\t\t\t\t\n", sr.Name, sr.Technique, reason)
			continue
		}
		large, small := Edges(c.Window)
		length := "-"
		if !math.IsNaN(c.ModelLength) {
			length = Num3(c.ModelLength) + " m"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", sr.Name, sr.Technique, WindowText(c.Window), large, small,
			sweep.Scale(c.Recommended), length, Money(c.Cost, st.Currency), Candidate(c))
	}
	tw.Flush()
	b.WriteString("A planning aid: scale effects remain; the test plan rests with qualified engineers, facility rules and codes.\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// firstFailing is the reason the first combination of a strategy has no
// window.
func firstFailing(sr *sweep.StrategyResult) string {
	pool := sr.Combos
	if len(sr.Joint) > 0 {
		pool = sr.Joint
	}
	for _, c := range pool {
		if c.Err != "" {
			return c.Err
		}
		if c.Failing != "" {
			return c.Failing
		}
	}
	return ""
}

// Num3 prints a number to three significant figures.
func Num3(x float64) string { return fmt.Sprintf("%.3g", x) }

// JSON shapes of `scaleplan run --json`.
type runJSON struct {
	Study      string         `json:"study"`
	Convention string         `json:"convention"`
	Strategies []strategyJSON `json:"strategies"`
	Outputs    []string       `json:"outputs,omitempty"`
}

type strategyJSON struct {
	Name      string     `json:"name"`
	Technique string     `json:"technique"`
	Feasible  bool       `json:"feasible"`
	Reason    string     `json:"reason,omitempty"`
	Best      *comboJSON `json:"best,omitempty"`
}

type comboJSON struct {
	Case           string         `json:"case,omitempty"`
	Medium         string         `json:"medium,omitempty"`
	Material       string         `json:"material,omitempty"`
	Facility       string         `json:"facility,omitempty"`
	Window         []intervalJSON `json:"window"`
	Recommended    float64        `json:"recommended_kL"`
	RecommendedTxt string         `json:"recommended_scale"`
	ModelLength    *float64       `json:"model_length_m,omitempty"`
	Cost           *float64       `json:"cost,omitempty"`
	Axis           *float64       `json:"axis_value,omitempty"`
}

type intervalJSON struct {
	From      float64 `json:"from_kL"`
	To        float64 `json:"to_kL"`
	FromLimit string  `json:"large_model_edge"`
	ToLimit   string  `json:"small_model_edge"`
}

func optional(x float64) *float64 {
	if math.IsNaN(x) {
		return nil
	}
	r := Round(x)
	return &r
}

// RunData returns the JSON form of a study's result.
func RunData(res *sweep.Result, outputs []string) any {
	out := runJSON{Study: res.Name, Convention: Convention, Strategies: []strategyJSON{}, Outputs: outputs}
	for _, sr := range res.Strategies {
		s := strategyJSON{Name: sr.Name, Technique: sr.Technique, Feasible: sr.Best != nil}
		if c := sr.Best; c != nil {
			cj := &comboJSON{Case: c.Case, Medium: c.Medium, Material: c.Material, Facility: c.Facility, Window: []intervalJSON{},
				Recommended: Round(c.Recommended), RecommendedTxt: sweep.Scale(c.Recommended),
				ModelLength: optional(c.ModelLength), Cost: optional(c.Cost), Axis: optional(c.Axis)}
			for _, iv := range c.Window {
				cj.Window = append(cj.Window, intervalJSON{Round(iv.Lo), Round(iv.Hi), iv.LoLimit, iv.HiLimit})
			}
			s.Best = cj
		} else {
			s.Reason = firstFailing(sr)
		}
		out.Strategies = append(out.Strategies, s)
	}
	return out
}

// WriteRunJSON writes the results of a batch as a JSON array.
func WriteRunJSON(w io.Writer, data []any) error { return writeJSON(w, data) }
