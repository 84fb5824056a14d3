package report

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"text/tabwriter"

	"scaleplan/feasibility"
)

// Convention is the one-line statement of the scale-factor convention that
// heads every table.
const Convention = "k = prototype value / model value; scale 1:25 means kL = 25"

// RulesReport is the data behind `scaleplan rules`: a solved strategy,
// optionally evaluated at numeric scale factors.
type RulesReport struct {
	Retain     []string                     `json:"retain"`
	Relax      []string                     `json:"relax"`
	Untie      []string                     `json:"untie"`
	Given      map[string]float64           `json:"given"`
	Consistent bool                         `json:"consistent"`
	Conditions []string                     `json:"conditions"`
	Explained  []string                     `json:"explanations"`
	Pinned     *float64                     `json:"only_length,omitempty"`
	Free       []string                     `json:"free"`
	Exponents  map[string]map[string]string `json:"exponents"`
	Laws       map[string]string            `json:"laws"`
	Factors    map[string]float64           `json:"factors,omitempty"`
	Required   []string                     `json:"required"`
	Unset      []string                     `json:"unset"`
	Relaxed    []RelaxedGroup               `json:"relaxed"`
	Warnings   []string                     `json:"warnings,omitempty"`

	sol    *feasibility.Solution
	length float64
	// broken lists the definitions or ties the given numbers break.
	broken []string
}

// RelaxedGroup is a relaxed law's group mismatch π_prototype/π_model.
type RelaxedGroup struct {
	Law      string   `json:"law"`
	Group    string   `json:"group"`
	ScaleLaw string   `json:"scale_law"`
	Ratio    *float64 `json:"ratio"`
	Missing  []string `json:"missing,omitempty"`
}

// NewRulesReport lays out a solution evaluated at the given scale factors
// (feasibility.EvaluateRules) for rendering.
func NewRulesReport(ev *feasibility.RulesEvaluation) *RulesReport {
	sol, given, length := ev.Solution, ev.Given, ev.Length
	s := sol.Strategy
	r := &RulesReport{
		Retain: nonNil(s.Retain), Relax: nonNil(s.Relax), Untie: nonNil(s.Untie), Given: given,
		Conditions: []string{}, Explained: []string{}, Free: nonNil(sol.Free),
		Exponents: map[string]map[string]string{}, Laws: map[string]string{},
		Required: nonNil(sol.Required), Unset: []string{}, Relaxed: []RelaxedGroup{},
		Consistent: true, sol: sol, length: length, Warnings: sol.Warnings,
	}
	for _, l := range sol.Laws {
		if l.Status == feasibility.Unset {
			r.Unset = append(r.Unset, l.Quantity)
			continue
		}
		m := map[string]string{}
		for j, e := range l.Exp {
			if !e.IsZero() {
				m[sol.Params[j].Quantity] = e.String()
			}
		}
		r.Exponents[l.Quantity] = m
		r.Laws[l.Quantity] = feasibility.FormatProduct(sol.Params, l.Exp)
	}
	if ev.Factors != nil {
		f := make(map[string]float64, len(ev.Factors))
		for q, x := range ev.Factors {
			f[q] = Round(x)
		}
		r.Factors = f
	}
	for _, c := range ev.Checks {
		eq := c.Equation(sol.Params)
		r.Conditions = append(r.Conditions, c.Protects+": "+eq)
		r.Explained = append(r.Explained, c.Sentence(sol.Params))
		if c.Known && !c.Holds {
			r.Consistent = false
			if c.Law == "" {
				r.broken = append(r.broken, fmt.Sprintf("%s (%s)", c.Protects, eq))
			}
		}
		if c.PinsLength && c.Law != "" {
			p := c.Length
			r.Pinned = &p
		}
	}
	for i, m := range sol.Relaxed {
		g := RelaxedGroup{Law: m.Law, Group: m.Group, Missing: m.Missing}
		if len(m.Missing) == 0 {
			g.ScaleLaw = feasibility.FormatProduct(sol.Params, m.Exp)
			if at := ev.Mismatches[i]; at.Known {
				x := Round(at.Value)
				g.Ratio = &x
			}
		}
		r.Relaxed = append(r.Relaxed, g)
	}
	return r
}

// Broken returns an error when the given numbers contradict a definition
// or a geometric tie: the request itself is inconsistent.
func (r *RulesReport) Broken() error {
	if len(r.broken) == 0 {
		return nil
	}
	return fmt.Errorf("inconsistent request: the given scale factors break %s", strings.Join(r.broken, "; "))
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// WriteJSON writes the report as indented JSON.
func (r *RulesReport) WriteJSON(w io.Writer) error { return writeJSON(w, r) }

// writeJSON writes any data the commands print as indented JSON.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// WriteText writes the report as readable tables.
func (r *RulesReport) WriteText(w io.Writer) error {
	b := &strings.Builder{}
	r.writeRequest(b)
	r.writeLaws(b)
	r.writeConditions(b)
	fmt.Fprintf(b, "Free choices: %s\n", orNone(r.Free))
	fmt.Fprintf(b, "Required properties: %s\n", orNone(r.Required))
	r.writeRelaxed(b)
	for _, warn := range r.Warnings {
		fmt.Fprintf(b, "\nWarning: %s.\n", warn)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// writeRequest writes the heading: the convention, the strategy and the
// factors given.
func (r *RulesReport) writeRequest(b *strings.Builder) {
	fmt.Fprintf(b, "Scale laws (%s)\n", Convention)
	fmt.Fprintf(b, "retain: %s", strings.Join(r.Retain, ", "))
	if len(r.Relax) > 0 {
		fmt.Fprintf(b, "   relax: %s", strings.Join(r.Relax, ", "))
	}
	if len(r.Untie) > 0 {
		fmt.Fprintf(b, "   untie: %s", strings.Join(r.Untie, ", "))
	}
	b.WriteString("\n")
	if len(r.Given) > 0 {
		keys := sortedKeys(r.Given)
		parts := make([]string, len(keys))
		for i, k := range keys {
			parts[i] = fmt.Sprintf("k_%s = %s", k, Num(r.Given[k]))
		}
		fmt.Fprintf(b, "given: %s\n", strings.Join(parts, ", "))
	}
	b.WriteString("\n")
}

// writeLaws writes the table of scale laws, with the factors at the
// length scale when one was given, and the quantities left unset.
func (r *RulesReport) writeLaws(b *strings.Builder) {
	sol := r.sol
	tw := tabwriter.NewWriter(b, 2, 4, 2, ' ', 0)
	header := "quantity\tstatus\tscale law k ="
	if r.Factors != nil {
		header += "\tk at kL = " + Num(r.length)
	}
	fmt.Fprintln(tw, header)
	for _, l := range sol.Laws {
		if l.Status == feasibility.Unset {
			continue
		}
		line := fmt.Sprintf("%s\t%s\t%s", l.Quantity, l.Status, r.Laws[l.Quantity])
		if r.Factors != nil {
			if f, ok := r.Factors[l.Quantity]; ok {
				line += "\t" + Num(f)
			} else {
				line += "\t(choose " + strings.Join(sol.Free, ", ") + ")"
			}
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
	if len(r.Unset) > 0 {
		fmt.Fprintf(b, "not set by this strategy: %s\n", strings.Join(r.Unset, ", "))
	}
}

// writeConditions writes the compatibility conditions in words, and
// whether the given factors meet them.
func (r *RulesReport) writeConditions(b *strings.Builder) {
	b.WriteString("\nCompatibility conditions:")
	if len(r.Conditions) == 0 {
		b.WriteString(" none\n")
		return
	}
	b.WriteString("\n")
	for _, s := range r.Explained {
		fmt.Fprintf(b, "  - %s\n", s)
	}
	if !r.Consistent {
		b.WriteString("  The given values do not satisfy every condition: complete similarity is not possible as requested.\n")
	}
	if r.Pinned != nil {
		fmt.Fprintf(b, "  With the given properties only kL = %s satisfies them.\n", Num(*r.Pinned))
	}
}

// writeRelaxed writes the table of relaxed laws and their mismatches.
func (r *RulesReport) writeRelaxed(b *strings.Builder) {
	if len(r.Relaxed) == 0 {
		return
	}
	b.WriteString("\nRelaxed laws (mismatch = group in prototype / group in model):\n")
	tw := tabwriter.NewWriter(b, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "  law\tgroup\tmismatch\tvalue")
	for _, g := range r.Relaxed {
		val := "-"
		if g.Ratio != nil {
			val = Num(*g.Ratio)
		}
		law := g.ScaleLaw
		if len(g.Missing) > 0 {
			law = "give " + strings.Join(g.Missing, ", ") + " to evaluate"
		}
		fmt.Fprintf(tw, "  %s\t%s\t%s\t%s\n", g.Law, g.Group, law, val)
	}
	tw.Flush()
}

func orNone(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

func sortedKeys(m map[string]float64) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// Round drops the floating-point noise of exp(log) arithmetic: it keeps
// twelve significant figures, far more than any input carries.
func Round(x float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) || x == 0 {
		return x
	}
	y, err := strconv.ParseFloat(strconv.FormatFloat(x, 'g', 12, 64), 64)
	if err != nil {
		return x
	}
	return y
}

// Num prints a number with up to six significant figures, without
// trailing zeros, the way an engineer writes it (125, 0.2, 353.553,
// 1.5625e+07).
func Num(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return strconv.FormatFloat(x, 'g', -1, 64)
	}
	if x == math.Trunc(x) && math.Abs(x) < 1e9 {
		return strconv.FormatFloat(x, 'f', -1, 64)
	}
	return strconv.FormatFloat(x, 'g', 6, 64)
}
