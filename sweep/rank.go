package sweep

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// DefaultMismatchThreshold is the size of a relaxed group's mismatch
// (π_p/π_m or its inverse, whichever is above 1) beyond which relaxing the
// law counts as a scale effect that outweighs model size: one decade. The
// README says why.
const DefaultMismatchThreshold = 10

// RankEntry is one strategy's place in the study's recommendation (§8.1,
// third bullet). Every output takes its recommendation from Result.Ranking.
type RankEntry struct {
	Strategy string
	Rank     int // 1 is recommended
	Feasible bool
	// ScaleEffect is set when a relaxed law counts against the strategy:
	// a governing law, or a mismatch beyond the threshold (or one that
	// cannot be evaluated), of a law the study does not mark weak.
	ScaleEffect bool
	// Reason says in words why the strategy stands where it does.
	Reason string
	// Recommended is the strategy's recommended kL (NaN when infeasible);
	// ModelLength and Cost are there (NaN when unknown).
	Recommended, ModelLength, Cost float64
	// WorstMismatch is the largest mismatch of a relaxed law that is not
	// weak (nil when there is none); Relaxed lists every relaxed group at
	// the recommended scale.
	WorstMismatch *Relaxed
	Relaxed       []Relaxed
	Best          *ComboResult
	Result        *StrategyResult
}

// Relaxed is a relaxed group's mismatch at a strategy's recommended scale,
// with what the study says of its law.
type Relaxed struct {
	MismatchValue
	Case            string // the case, for a strategy with several
	Weak, Governing bool
	// Missing names what is needed to evaluate it when Ratio is NaN.
	Missing []string
}

// Size is the mismatch as a factor of at least 1 (NaN when unknown).
func (r Relaxed) Size() float64 {
	if r.Ratio < 1 {
		return 1 / r.Ratio
	}
	return r.Ratio
}

// Words says how the model's group compares with the prototype's: "model
// Reynolds number 1/40 of the prototype's".
func (r Relaxed) Words() string {
	g := r.Group
	if r.Case != "" {
		g += " (case " + r.Case + ")"
	}
	switch {
	case math.IsNaN(r.Ratio) && len(r.Missing) == 0:
		return fmt.Sprintf("the %s mismatch cannot be evaluated", g)
	case math.IsNaN(r.Ratio):
		return fmt.Sprintf("the %s mismatch cannot be evaluated (give %s)", g, strings.Join(r.Missing, ", "))
	case r.Ratio >= 1:
		return fmt.Sprintf("model %s 1/%s of the prototype's", g, sig3(r.Ratio, ""))
	default:
		return fmt.Sprintf("model %s %s times the prototype's", g, sig3(1/r.Ratio, ""))
	}
}

// parseRankSettings reads weak_laws, governing_laws and mismatch_threshold.
func parseRankSettings(s *study.Study, st *Settings, ps *study.Problems) {
	laws := func(name string) []string {
		v, ok := s.Settings[name]
		if !ok {
			return nil
		}
		st.cells[name] = v.Cell
		var out []string
		for _, n := range splitNames(v.Value) {
			if _, err := feasibility.LookupLaw(n); err != nil {
				ps.Add(v.Cell, "%s: %v", name, err)
				continue
			}
			out = append(out, n)
		}
		return out
	}
	st.WeakLaws, st.GoverningLaws = laws("weak_laws"), laws("governing_laws")
	for _, w := range st.WeakLaws {
		for _, g := range st.GoverningLaws {
			if w == g {
				ps.Add(st.Cell("governing_laws"), "%s is both weak and governing: a law is one or the other", w)
			}
		}
	}
	st.MismatchThreshold = DefaultMismatchThreshold
	if v, ok := s.Settings["mismatch_threshold"]; ok && strings.TrimSpace(v.Value) != "" {
		st.cells["mismatch_threshold"] = v.Cell
		x, err := strconv.ParseFloat(strings.TrimSpace(v.Value), 64)
		if err != nil || !(x >= 1) || math.IsInf(x, 0) {
			ps.Add(v.Cell, "mismatch_threshold: %q must be a factor of at least 1 (10 for one decade)", v.Value)
		} else {
			st.MismatchThreshold = x
		}
	}
}

// Rank orders the strategies of a result. A feasible strategy comes before
// an infeasible one; among feasible ones, one without a scale effect
// (it relaxes no law, only weak ones, or none beyond the threshold unless
// governing) comes before one with; within a class the larger model wins
// (the cheaper with recommend = cheapest), then the smaller worst
// mismatch, then the order of the Strategies sheet.
func (p *Plan) Rank(srs []*StrategyResult) []RankEntry {
	out := make([]RankEntry, 0, len(srs))
	for _, sr := range srs {
		out = append(out, p.rankEntry(sr))
	}
	cheapest := p.Settings.Recommend == "cheapest"
	sort.SliceStable(out, func(i, j int) bool { return rankedBefore(out[i], out[j], cheapest) })
	for i := range out {
		out[i].Rank = i + 1
	}
	return out
}

// rankEntry is a strategy's entry before ranking: feasible or not, the
// laws it relaxes at its best scale, its worst mismatch and whether it
// has a scale effect, with the reason in words.
func (p *Plan) rankEntry(sr *StrategyResult) RankEntry {
	st := p.Settings
	e := RankEntry{Strategy: sr.Name, Result: sr, Best: sr.Best, Recommended: math.NaN(), ModelLength: math.NaN(), Cost: math.NaN()}
	c := sr.Best
	if c == nil {
		e.Reason = "no feasible scale"
		if why := FailingReason(sr); why != "" {
			e.Reason += ": " + why
		}
		return e
	}
	e.Feasible = true
	e.Recommended, e.ModelLength, e.Cost = c.Recommended, c.ModelLength, c.Cost
	e.Relaxed = p.relaxedAt(sr, c)
	var counted, within, weak []string
	for i := range e.Relaxed {
		r := &e.Relaxed[i]
		r.Weak, r.Governing = slices.Contains(st.WeakLaws, r.Law), slices.Contains(st.GoverningLaws, r.Law)
		if r.Weak {
			weak = append(weak, r.Law)
			continue
		}
		if e.WorstMismatch == nil || worse(*r, *e.WorstMismatch) {
			e.WorstMismatch = r
		}
		switch {
		case r.Governing:
			counted = append(counted, fmt.Sprintf("relaxes %s, which the study marks governing: %s", r.Law, r.Words()))
		case math.IsNaN(r.Ratio):
			counted = append(counted, fmt.Sprintf("relaxes %s: %s", r.Law, r.Words()))
		case r.Size() > st.MismatchThreshold:
			counted = append(counted, fmt.Sprintf("relaxes %s: %s, beyond the threshold %s", r.Law, r.Words(), sig3(st.MismatchThreshold, "")))
		default:
			within = append(within, fmt.Sprintf("relaxes %s: %s, within the threshold %s", r.Law, r.Words(), sig3(st.MismatchThreshold, "")))
		}
	}
	var parts []string
	switch {
	case len(counted) > 0:
		e.ScaleEffect = true
		parts = counted
	case len(within) > 0:
		parts = within
	case len(weak) > 0:
		parts = []string{"relaxes only laws the study marks weak (" + strings.Join(uniq(weak), ", ") + ")"}
	default:
		parts = []string{"relaxes no law"}
	}
	e.Reason = strings.Join(parts, "; ")
	return e
}

// rankedBefore is the order of Rank: feasible first, then without a scale
// effect, then (cheapest) the lower cost, then the larger model, then the
// smaller worst mismatch.
func rankedBefore(a, b RankEntry, cheapest bool) bool {
	if a.Feasible != b.Feasible {
		return a.Feasible
	}
	if !a.Feasible {
		return false
	}
	if a.ScaleEffect != b.ScaleEffect {
		return !a.ScaleEffect
	}
	if cheapest && !math.IsNaN(a.Cost) && !math.IsNaN(b.Cost) && a.Cost != b.Cost {
		return a.Cost < b.Cost
	}
	if cheapest && math.IsNaN(a.Cost) != math.IsNaN(b.Cost) {
		return !math.IsNaN(a.Cost)
	}
	if a.Recommended != b.Recommended {
		return a.Recommended < b.Recommended
	}
	return worstSize(a) < worstSize(b)
}

// worse reports whether a is a worse mismatch than b; one that cannot be
// evaluated is the worst.
func worse(a, b Relaxed) bool {
	if math.IsNaN(b.Ratio) {
		return false
	}
	return math.IsNaN(a.Ratio) || a.Size() > b.Size()
}

func worstSize(e RankEntry) float64 {
	if e.WorstMismatch == nil {
		return 1
	}
	if s := e.WorstMismatch.Size(); !math.IsNaN(s) {
		return s
	}
	return math.Inf(1)
}

func uniq(s []string) []string {
	var out []string
	for _, x := range s {
		if !slices.Contains(out, x) {
			out = append(out, x)
		}
	}
	return out
}

// Recommended returns the first feasible entry of the ranking (nil when
// no strategy is feasible).
func (r *Result) Recommended() *RankEntry {
	for i := range r.Ranking {
		if r.Ranking[i].Feasible {
			return &r.Ranking[i]
		}
	}
	return nil
}

// RankOf returns a strategy's entry of the ranking (nil when absent).
func (r *Result) RankOf(strategy string) *RankEntry {
	for i := range r.Ranking {
		if r.Ranking[i].Strategy == strategy {
			return &r.Ranking[i]
		}
	}
	return nil
}

// relaxedAt lists the relaxed groups of a strategy at the scale of its
// recommended combination c: c's own mismatches, or, for a joint window
// of several cases, each case's at the joint scale (from the case's
// combination in the same facility whose window holds it).
func (p *Plan) relaxedAt(sr *StrategyResult, c *ComboResult) []Relaxed {
	var out []Relaxed
	for _, cs := range sr.Cases {
		if cs.Solution == nil {
			continue
		}
		src := c
		if c.Factors == nil { // a joint window
			src = nil
			for _, o := range sr.Combos {
				if o.Case == cs.Case && o.Facility == c.Facility && o.Window.Contains(c.Recommended) && o.Params != nil {
					src = o
					break
				}
			}
		} else if c.Case != cs.Case && len(sr.Cases) > 1 {
			continue
		}
		caseName := ""
		if len(sr.Cases) > 1 {
			caseName = cs.Case
		}
		v := feasibility.Values{}
		if src != nil {
			for k, x := range src.Params {
				v[k] = x
			}
		}
		v["length"] = c.Recommended
		for _, m := range cs.Solution.Relaxed {
			r := Relaxed{MismatchValue: MismatchValue{Law: m.Law, Group: m.Group, Ratio: math.NaN()}, Case: caseName, Missing: m.Missing}
			if src != nil {
				if ratio, ok, err := cs.Solution.MismatchValue(m, v); err == nil && ok {
					r.Ratio = ratio
				} else if ratio, ok := p.gravityMismatch(cs, m, v, c); ok {
					r.Ratio, r.Missing = ratio, nil
				}
			}
			out = append(out, r)
		}
	}
	return out
}

// FailingReason is what closes the window of a strategy: the reason of
// the combination that comes closest to a window (Closest), named by its
// candidates and facility when the strategy's combinations give different
// reasons, or else the first combination's error.
func FailingReason(sr *StrategyResult) string {
	pool := sr.failingPool()
	if c := sr.Closest(); c != nil {
		same := true
		for _, o := range pool {
			same = same && o.Err == "" && o.Failing == c.Failing
		}
		if len(pool) > 1 && !same {
			return c.Label() + ": " + c.Failing
		}
		return c.Failing
	}
	for _, c := range pool {
		if c.Err != "" {
			return c.Err
		}
	}
	return ""
}

// failingPool is what a strategy's verdict is drawn from: the joint
// windows of a strategy with several cases, else its combinations.
func (sr *StrategyResult) failingPool() []*ComboResult {
	if len(sr.Joint) > 0 {
		return sr.Joint
	}
	return sr.Combos
}

// Closest is, of the combinations of a strategy that say why they have no
// window, the one that comes closest to a window: the largest margin over
// the grid (and the second axis), the first in order among equals. It is
// nil when none says why.
func (sr *StrategyResult) Closest() *ComboResult {
	var best *ComboResult
	bestPeak := math.Inf(-1)
	for _, c := range sr.failingPool() {
		if c == nil || c.Err != "" || c.Failing == "" {
			continue
		}
		if pk := c.marginPeak(); best == nil || pk > bestPeak {
			best, bestPeak = c, pk
		}
	}
	return best
}

// marginPeak is the largest margin of a combination over the grid and the
// second axis (−Inf when it has no margins).
func (c *ComboResult) marginPeak() float64 {
	if c.axis != nil || c.AxisMargins != nil {
		return c.AxisMarginPeak()
	}
	pk := math.Inf(-1)
	for _, v := range c.Margins {
		if v > pk {
			pk = v
		}
	}
	return pk
}

// gravityMismatch evaluates a relaxed group that needs the gravity scale
// when the strategy does not give it: the model's gravity is the
// facility's (standard gravity, times its g_level), so the case is solved
// once more with gravity given, and the group taken from that solution.
func (p *Plan) gravityMismatch(cs *PlanCase, m feasibility.Mismatch, v feasibility.Values, c *ComboResult) (float64, bool) {
	if len(m.Missing) != 1 || m.Missing[0] != "gravity" {
		return 0, false
	}
	strat := cs.Solution.Strategy
	strat.Given = append(append([]string(nil), strat.Given...), "gravity")
	sol, err := feasibility.Solve(strat)
	if err != nil {
		return 0, false
	}
	g := StandardGravity
	if f := p.facility(c.Facility); f != nil {
		if n, ok := f.Caps["g_level"]; ok {
			g *= n
		}
		if p.Settings.Axis == "g_level" && !math.IsNaN(c.Axis) {
			g = StandardGravity * c.Axis
		}
	}
	w := feasibility.Values{"gravity": p.Proto["gravity"] / g}
	for k, x := range v {
		w[k] = x
	}
	for _, mm := range sol.Relaxed {
		if mm.Law == m.Law {
			if ratio, ok, err := sol.MismatchValue(mm, w); err == nil && ok {
				return ratio, true
			}
		}
	}
	return 0, false
}

// better prefers a window that allows a larger model, then a wider one.
func better(a, b Window) bool {
	if a.Empty() {
		return false
	}
	if b.Empty() {
		return true
	}
	if a.Largest() != b.Largest() {
		return a.Largest() < b.Largest()
	}
	return width(a) > width(b)
}

func width(w Window) float64 {
	s := 0.0
	for _, iv := range w {
		s += math.Log10(iv.Hi / iv.Lo)
	}
	return s
}

// best picks the recommended combination of a strategy.
func (p *Plan) best(sr *StrategyResult) *ComboResult {
	pool := sr.Combos
	if len(sr.Joint) > 0 {
		pool = sr.Joint
	}
	var b *ComboResult
	for _, c := range pool {
		if c.Window.Empty() || c.Err != "" {
			continue
		}
		if b == nil {
			b = c
			continue
		}
		if p.Settings.Recommend == "cheapest" && !math.IsNaN(c.Cost) && !math.IsNaN(b.Cost) {
			if c.Cost < b.Cost {
				b = c
			}
			continue
		}
		if c.Recommended < b.Recommended {
			b = c
		}
	}
	return b
}
