package sweep

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"

	"scaleplan/feasibility"
)

// Result is the outcome of one study.
type Result struct {
	Plan       *Plan
	Name       string
	Strategies []*StrategyResult
	// Ranking orders the strategies, recommended first (rank.go);
	// Warnings are the study's (warnings.go).
	Ranking  []RankEntry
	Warnings Warnings
}

// StrategyResult gathers the combinations of one strategy.
type StrategyResult struct {
	Name, Technique string
	Cases           []*PlanCase
	Combos          []*ComboResult // one per case × candidate × facility
	// Joint holds, for a strategy with several cases, the scales at which
	// one model serves every case, per facility.
	Joint []*ComboResult
	// Best is the combination recommended for the strategy (nil when none
	// is feasible): the largest model, or the cheapest when the study asks.
	Best *ComboResult
}

// ComboResult is the result of one combination of a case, a candidate pair
// and a facility.
type ComboResult struct {
	Strategy, Case, Technique  string
	Medium, Material, Facility string
	Axis                       float64 // best second-axis value; NaN without an axis
	Window                     Window
	Recommended                float64 // NaN when the window is empty
	Largest                    float64
	Cheapest, CheapestCost     float64
	Cost                       float64 // at the recommended scale; NaN without costs
	ModelLength                float64 // reference length of the model at the recommended scale, m
	// Failing says what empties the window.
	Failing    string
	Conditions []string
	Notes      []string
	Limits     []LimitInfo
	Required   []PropertyValue
	Mismatches []MismatchValue
	Friction   *Friction
	// AddedMass is the mass dummy weights must add to the model at the
	// recommended scale, kg (NaN when no density is required), and
	// AddedDensity the same per unit volume of the model material.
	AddedMass, AddedDensity float64
	// PoissonFlag is set when the model material's Poisson's ratio differs
	// from the prototype's beyond the study's tolerance and the strategy
	// does not relax transverse deformation; PoissonNote (also in Notes)
	// says so.
	PoissonFlag bool
	PoissonNote string
	// Requirements are the facility capabilities the model needs at each
	// grid scale, one per capability a limit names.
	Requirements []Requirement
	// AnyFacility is the scale of the largest model the limits that name
	// no facility capability allow: what a facility big and fast enough
	// would hold (NaN without a facility).
	AnyFacility float64
	// Robust is the probability of feasibility when the study's uncertain
	// inputs vary (nil without an Uncertainty sheet).
	Robust *Robust
	// Measures are the study's measures at model scale.
	Measures []MeasureValue
	// CostCurve is the campaign cost at every grid point (nil without
	// costs).
	CostCurve []float64
	// Factors holds the scale factor k of every quantity the strategy
	// sets, at the recommended scale: the prediction rules.
	Factors map[string]float64
	// Params holds the scale factors of the solution's parameters other
	// than the length scale (given properties, fixed free choices).
	Params feasibility.Values
	// Margins holds the margin of every grid point (decades) and Limiting
	// the index into Limits of the limit that gives it (LimitingSimilarity
	// for a similarity condition, LimitingNone for none), at the chosen
	// axis value. With a second axis, AxisMarginRows gives one row per
	// axis value, computed on demand: the sweep leaves AxisMargins and
	// AxisMeasures nil (a result built by hand may set them).
	Margins     []float64
	Limiting    []int
	AxisMargins [][]float64
	AxisWindows []Window
	// AxisMeasures holds, with a second axis, each study measure at model
	// scale over the grid, one row per axis value (in the measure's unit).
	AxisMeasures map[string][][]float64
	// Unmet is, for an empty window a required property empties, what it
	// needs and the library recipes that could meet it (recipe_search.go).
	Unmet *Unmet
	Err   string
	// axis sweeps the second axis again on demand (AxisMarginRows).
	axis *axisSweep
}

// LimitInfo describes a limit applied to a combination.
type LimitInfo struct {
	Name, Expression, Source string
	Linear                   bool
	// For a products-of-powers limit, margin = A + B·log10 kL.
	A, B float64
}

// PropertyValue is a property the model must have, in SI.
type PropertyValue struct {
	Quantity      string
	Law           string  // its scale law
	AtLo, AtHi    float64 // at the window edges (model values)
	AtRecommended float64
	Matches       []Match // library entries that meet it within tolerance at the recommended scale
	// Recipes are, for a candidate brought to the requirement by its
	// tunable conditions (recipe.go), the recipe of each scale band, and
	// Recipe the one at the recommended scale (nil when none is solved).
	Recipes []RecipeBand
	Recipe  *RecipeAt
	Tuned   bool
	// Own is the candidate's own value of the property (NaN if it has
	// none); a device (added mass, springs, a backbone beam) supplies the
	// difference.
	Own float64
}

// MeasureValue is a study measure at model scale, in its unit, at the
// window edges and at the recommended scale.
type MeasureValue struct {
	Name, Unit                string
	AtLo, AtHi, AtRecommended float64
}

// MismatchValue is a relaxed group's mismatch π_p/π_m at the recommended
// scale.
type MismatchValue struct {
	Law, Group string
	Ratio      float64
}

// Friction is the ITTC-1957 skin-friction correction at the recommended
// scale: C_F = 0.075 / (log10 Re − 2)².
type Friction struct {
	ReModel, ReProto, CFModel, CFProto, Delta float64
}

// ITTC1957 returns the ITTC-1957 model–ship correlation line's friction
// coefficient at Reynolds number re.
func ITTC1957(re float64) float64 {
	d := math.Log10(re) - 2
	return 0.075 / (d * d)
}

// Run sweeps every strategy of the plan. It stops early when ctx is done.
func (p *Plan) Run(ctx context.Context) (*Result, error) {
	res := &Result{Plan: p, Name: p.Settings.Name}
	us := make([]float64, len(p.Grid))
	for i, k := range p.Grid {
		us[i] = math.Log10(k)
	}
	// Every combination is independent: run them across the cores, and
	// put the results back in their fixed order so that output is
	// deterministic.
	type task struct {
		c        *PlanCase
		m, mat   *Candidate2
		f        *Facility
		strategy int
	}
	var tasks []task
	results := make([]*StrategyResult, len(p.Strategies))
	for si, st := range p.Strategies {
		results[si] = &StrategyResult{Name: st.Name, Technique: st.Technique, Cases: st.Cases}
		for _, c := range st.Cases {
			for _, m := range candidatesOrNil(c.Media) {
				for _, mat := range candidatesOrNil(c.Materials) {
					for _, f := range facilitiesOrNil(c.Facilities) {
						tasks = append(tasks, task{c, m, mat, f, si})
					}
				}
			}
		}
	}
	out := make([]*ComboResult, len(tasks))
	workers := max(1, min(runtime.GOMAXPROCS(0), len(tasks)))
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				t := tasks[i]
				out[i] = p.runCombo(ctx, i, t.c, t.m, t.mat, t.f, us)
			}
		}()
	}
	var err error
feed:
	for i := range tasks {
		select {
		case <-ctx.Done():
			err = ctx.Err()
			break feed
		case next <- i:
		}
	}
	close(next)
	wg.Wait()
	if err == nil {
		err = ctx.Err()
	}
	if err != nil {
		return nil, err
	}
	for i, t := range tasks {
		results[t.strategy].Combos = append(results[t.strategy].Combos, out[i])
	}
	for si, st := range p.Strategies {
		sr := results[si]
		if len(st.Cases) > 1 {
			sr.Joint = p.joint(st, sr.Combos)
		}
		sr.Best = p.best(sr)
		res.Strategies = append(res.Strategies, sr)
	}
	res.Ranking, res.Warnings = p.Rank(res.Strategies), p.Warnings
	return res, nil
}

func facilitiesOrNil(fs []*Facility) []*Facility {
	if len(fs) == 0 {
		return []*Facility{nil}
	}
	return fs
}

func name(c *Candidate2) string {
	if c == nil {
		return ""
	}
	return c.Name
}

// runCombo sweeps one combination over the grid (and the second axis).
func (p *Plan) runCombo(ctx context.Context, index int, c *PlanCase, m, mat *Candidate2, f *Facility, us []float64) *ComboResult {
	r := &ComboResult{Strategy: c.Strategy, Case: c.Case, Technique: c.Technique,
		Medium: name(m), Material: name(mat), Axis: math.NaN(), Recommended: math.NaN(), Largest: math.NaN(),
		Cheapest: math.NaN(), CheapestCost: math.NaN(), Cost: math.NaN(), ModelLength: math.NaN(),
		AddedMass: math.NaN(), AddedDensity: math.NaN(), AnyFacility: math.NaN()}
	if f != nil {
		r.Facility = f.Name
	}
	axes := []float64{math.NaN()}
	if p.AxisValues != nil && p.axisApplies(c, f) {
		axes = p.AxisValues
	}
	// Every axis value's window from the compiled limits; the grid is
	// swept at the chosen value only (analytic.go).
	ax := &axisSweep{plan: p, cas: c, medium: m, material: mat, fac: f, axes: axes, us: us}
	if len(axes) > 1 && !isCondition(p.Settings.Axis) {
		ax.lp = &limitPlan{}
	}
	cache := sampleCache{}
	bestI, windows, best, err := ax.choose(ctx, cache)
	if err != nil {
		r.Err = err.Error()
		return r
	}
	if len(axes) > 1 {
		r.AxisWindows = windows
	}
	if best == nil {
		x, err := ax.combo(axes[bestI])
		if err == nil {
			best, err = x.sweep(ctx, us, cache, make([]int, len(us)))
		}
		if err != nil {
			r.Err = err.Error()
			return r
		}
	}
	if len(axes) > 1 {
		r.Axis = axes[bestI]
		r.axis = ax
	}
	best.requirements = best.combo.requirements(ctx, best.limits, us)
	if err := ctx.Err(); err != nil {
		r.Err = err.Error()
		return r
	}
	if !best.fill(ctx, r) {
		r.Err = ctx.Err().Error()
		return r
	}
	if p.Settings.Samples > 0 && len(p.Uncertain) > 0 {
		r.Robust = best.robust(ctx, us, p.Settings.Seed, index)
	}
	return r
}

// axisApplies reports whether the second axis changes this combination.
// A case that fixes the axis quantity keeps its own factor, so the axis
// does not apply to it.
func (p *Plan) axisApplies(c *PlanCase, f *Facility) bool {
	ax := p.Settings.Axis
	if _, fixed := c.Fix[ax]; fixed {
		return false
	}
	if isCondition(ax) {
		return true
	}
	for _, fr := range c.Solution.Free {
		if fr == ax {
			return true
		}
	}
	return f != nil && p.isCapability(f, ax)
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

// compiled is a limit ready to evaluate for one combination.
type compiled struct {
	info  LimitInfo
	lim   *feasibility.Limit
	forms map[string]linForm
	terms []feasibility.NameCoef // of a products-of-powers limit
	// vals and set are, for a limit that is not a product of powers, its
	// margin at every grid point and its feasible set.
	vals []float64
	set  []uInterval
	// lower/upper range limits of a tuned property are built directly.
	// band is set on a limit that checks a candidate's own value against
	// the value the strategy requires (substitute.go).
	band *band
	// fn, when set, gives the margin of a limit that is no expression (a
	// joint recipe, recipe_joint.go).
	fn func(u float64) float64
}

// newCompiled readies a limit whose names resolve to forms; a product of
// powers gets its linear margin A + B·log10 kL.
func newCompiled(info LimitInfo, l *feasibility.Limit, forms map[string]linForm) compiled {
	c := compiled{info: info, lim: l, forms: forms}
	if k, terms, ok := l.LogLinear(); ok {
		c.terms = terms
		c.info.Linear = true
		c.info.A = k
		for _, t := range terms {
			e := t.Exp.Float64()
			f := forms[t.Name]
			c.info.A += e * f.C / math.Ln10
			c.info.B += e * f.E
		}
	}
	return c
}

// sweepOut is what one combination at one axis value gives.
type sweepOut struct {
	combo        *combo
	limits       []compiled
	window       Window
	margins      []float64
	limiting     []int
	failing      string
	conditions   []string
	notes        []string
	requirements []Requirement
	anyFacility  float64
	// us and condU (the log10 kL a similarity condition pins, or NaN)
	// let fill say why the checks of substitute.go empty the window.
	us    []float64
	condU float64
}

// limitsFor collects the limits that apply to a combination: the facility
// type's defaults (unless the study overrides them by name), the study's
// limits, and the ranges of tuned properties.
func (x *combo) limitsFor() (out []compiled, notes []string, err error) {
	p := x.plan
	var skipped []string
	notes = append(notes, x.cas.Solution.Warnings...)
	defer func() {
		if len(skipped) > 0 {
			notes = append(notes, "default limits not applied, their names are not in the study: "+strings.Join(skipped, ", "))
		}
	}()
	applies := func(a string) bool {
		return a == "all" || (x.fac != nil && (a == x.fac.Type || a == x.fac.Name))
	}
	overridden := map[string]bool{}
	for _, l := range p.Limits {
		if applies(l.AppliesTo) {
			overridden[l.Name] = true
		}
	}
	resolve := func(l *feasibility.Limit) (map[string]linForm, error) {
		forms := map[string]linForm{}
		for _, n := range l.Names() {
			f, err := x.form(n)
			if err != nil {
				return nil, err
			}
			forms[n] = f
		}
		return forms, nil
	}
	add := func(info LimitInfo, l *feasibility.Limit, forms map[string]linForm) {
		out = append(out, newCompiled(info, l, forms))
	}
	if x.fac != nil {
		for _, d := range p.Catalog.DefaultLimits(x.fac.Type) {
			if overridden[d.Name] {
				continue
			}
			forms, err := resolve(d.Limit)
			if err != nil {
				var un unknownNameError
				if errors.As(err, &un) {
					skipped = append(skipped, fmt.Sprintf("%s (needs %s)", d.Name, un.name))
				} else {
					skipped = append(skipped, fmt.Sprintf("%s (%v)", d.Name, err))
				}
				continue
			}
			add(LimitInfo{Name: d.Name, Expression: d.Expression, Source: d.Source}, d.Limit, forms)
		}
	}
	for _, l := range p.Limits {
		if !applies(l.AppliesTo) {
			continue
		}
		forms, err := resolve(l.Limit)
		if err != nil {
			return nil, nil, fmt.Errorf("Limits!C%d: %v", l.Row, err)
		}
		add(LimitInfo{Name: l.Name, Expression: l.Limit.Text, Source: l.Source}, l.Limit, forms)
	}
	for _, q := range x.cas.Solution.Strategy.Tuned {
		pr, ok := x.props[q]
		if !ok || !(pr.Max > pr.Min) {
			notes = append(notes, fmt.Sprintf("tuned %s: the candidate states no range, so none is checked", q))
			continue
		}
		unit := quantityUnit(q)
		for _, side := range []struct {
			op, what string
			v        float64
		}{{">=", "min", pr.Min}, {"<=", "max", pr.Max}} {
			text := fmt.Sprintf("%s %s %s", q, side.op, formatSI(side.v, unit))
			l, err := feasibility.ParseLimit(text)
			if err != nil {
				return nil, nil, err
			}
			forms, err := resolve(l)
			if err != nil {
				return nil, nil, err
			}
			add(LimitInfo{Name: "tuned " + q + " " + side.what, Expression: text, Source: "range of " + describePair(x.medium, x.material)}, l, forms)
		}
	}
	bands, bandNotes, err := x.bandLimits()
	if err != nil {
		return nil, nil, err
	}
	return append(out, bands...), append(notes, bandNotes...), nil
}

func quantityUnit(q string) string {
	if qq, ok := feasibility.QuantityNamed(q); ok {
		return qq.SI
	}
	return ""
}

func formatSI(v float64, unit string) string {
	s := fmt.Sprintf("%.6g", v)
	if unit != "" && unit != "1" {
		s += " " + unit
	}
	return s
}

// sweep evaluates every limit over the grid and finds the window.
func (x *combo) sweep(ctx context.Context, us []float64, cache sampleCache, limiting []int) (*sweepOut, error) {
	limits, notes, err := x.compiledLimits()
	if err != nil {
		return nil, err
	}
	if err := sample(ctx, limits, us, cache); err != nil {
		return nil, err
	}
	out := &sweepOut{combo: x, limits: limits, notes: notes}
	u0, u1 := us[0], us[len(us)-1]
	win := limitWindow(limits, us, nil)
	// The largest model any facility could take: the window of the limits
	// that name no capability of this facility.
	if x.fac != nil && !x.windowOnly {
		free := limitWindow(limits, us, func(l compiled) bool {
			for _, n := range l.lim.Names() {
				if _, ok := x.fac.Caps[n]; ok {
					return false
				}
			}
			return true
		})
		out.anyFacility = math.NaN()
		if len(free) > 0 {
			out.anyFacility = math.Pow(10, free[0].lo)
		}
	}
	// Similarity conditions of the strategy at these factors.
	sol := x.cas.Solution
	checks, err := sol.Check(x.values)
	if err != nil {
		return nil, err
	}
	condU := math.NaN()
	condFails := ""
	for _, cc := range checks {
		out.conditions = append(out.conditions, cc.Protects+": "+cc.Equation(sol.Params))
		switch {
		case cc.PinsLength:
			u := math.Log10(cc.Length)
			if !math.IsNaN(condU) && math.Abs(condU-u) > 1e-9 {
				condFails = "two similarity conditions ask for different scales"
			}
			condU = u
			label := "similarity: " + cc.Protects
			win = intersect(win, []uInterval{{u, u, label, label}})
			if u < u0 || u > u1 {
				condFails = fmt.Sprintf("%s holds only at %s, outside the sweep", cc.Protects, Scale(cc.Length))
			}
		case cc.Known && !cc.Holds:
			condFails = fmt.Sprintf("%s cannot be met with %s (off by a factor %.3g)", cc.Protects, describePair(x.medium, x.material), cc.Off)
			win = nil
		}
	}
	if _, blocked, _ := x.checks(); blocked != "" && condFails == "" {
		condFails, win = blocked, nil
	}
	out.window = toWindow(win)
	if x.windowOnly {
		return out, nil
	}
	// Margins on the grid, for the maps: one pass per limit over the grid,
	// a linear form for products of powers, so the inner loop is a
	// multiply-add with no allocation.
	out.margins = make([]float64, len(us))
	out.limiting = limiting
	marginGrid(limits, us, out.margins, out.limiting)
	for i, u := range us {
		if condFails != "" && math.IsNaN(condU) {
			out.margins[i], out.limiting[i] = math.Inf(-1), LimitingSimilarity
		} else if !math.IsNaN(condU) {
			if v := -math.Abs(u - condU); v < out.margins[i] {
				out.margins[i], out.limiting[i] = v, LimitingSimilarity
			}
		}
	}
	if out.window.Empty() {
		out.failing = condFails
		if out.failing == "" {
			// fill may name a substitute check instead (substitute.go).
			out.us, out.condU = us, condU
		}
		if out.failing == "" {
			bi := 0
			for i := range out.margins {
				if out.margins[i] > out.margins[bi] {
					bi = i
				}
			}
			if j := out.limiting[bi]; j >= 0 {
				out.failing = fmt.Sprintf("no scale satisfies every limit: at best (%s) %q is short by %.2f decades", Scale(math.Pow(10, us[bi])), limits[j].info.Name, -out.margins[bi])
			} else {
				out.failing = "no scale satisfies every limit"
			}
		}
	}
	return out, nil
}

// marginGrid sets m[i] to the smallest margin of the limits at us[i] and
// arg[i] to the index of the limit that gives it (LimitingNone when there
// is none).
func marginGrid(limits []compiled, us, m []float64, arg []int) {
	for i := range m {
		m[i], arg[i] = math.Inf(1), LimitingNone
	}
	for j := range limits {
		l := &limits[j]
		if l.info.Linear {
			a, b := l.info.A, l.info.B
			for i, u := range us {
				if v := a + b*u; v < m[i] {
					m[i], arg[i] = v, j
				}
			}
			continue
		}
		for i, u := range us {
			if v := l.marginAt(i, u); v < m[i] {
				m[i], arg[i] = v, j
			}
		}
	}
}

// limitWindow intersects the feasible sets of the limits (those keep
// accepts, or all) over the sweep range.
func limitWindow(limits []compiled, us []float64, keep func(compiled) bool) []uInterval {
	u0, u1 := us[0], us[len(us)-1]
	win := []uInterval{{u0, u1, RangeLimit, RangeLimit}}
	for _, l := range limits {
		if keep != nil && !keep(l) {
			continue
		}
		switch {
		case l.info.Linear:
			win = intersect(win, halfLine(l.info.A, l.info.B, l.info.Name, u0, u1))
		case l.set != nil || l.vals != nil:
			win = intersect(win, l.set)
		default:
			l := l
			win = intersect(win, sampled(us, func(u float64) float64 { return l.margin(u) }, l.info.Name))
		}
	}
	return win
}

// sampleCache keeps, across the second axis, the grid margins of limits
// that are not products of powers: when a limit's names resolve to the same
// forms at the next axis value, nothing is evaluated again.
type sampleCache map[string]*compiled

func sameForms(a, b map[string]linForm) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

// sample fills vals and set of every limit that is not a product of
// powers, from the cache where it can.
func sample(ctx context.Context, limits []compiled, us []float64, cache sampleCache) error {
	for j := range limits {
		l := &limits[j]
		if l.info.Linear {
			continue
		}
		if c, ok := cache[l.info.Name]; ok && sameForms(c.forms, l.forms) {
			l.vals, l.set = c.vals, c.set
			continue
		}
		lc := *l
		margin := func(u float64) float64 { return lc.margin(u) }
		l.vals = make([]float64, len(us))
		for i, u := range us {
			if i%65536 == 0 {
				if err := ctx.Err(); err != nil {
					return err
				}
			}
			l.vals[i] = margin(u)
		}
		l.set = sampledFrom(us, l.vals, margin, l.info.Name)
		if l.set == nil {
			l.set = []uInterval{}
		}
		cache[l.info.Name] = l
	}
	return nil
}

// margin evaluates a limit's margin at u = log10 kL.
func (l compiled) margin(u float64) float64 {
	if l.info.Linear {
		return l.info.A + l.info.B*u
	}
	if l.fn != nil {
		return l.fn(u)
	}
	ln := u * math.Ln10
	return l.lim.Margin(func(n string) float64 { return l.forms[n].at(ln) })
}

// Scale prints a length scale the way the trade writes it: "1:25".
func Scale(kL float64) string {
	if math.IsNaN(kL) {
		return "-"
	}
	if kL >= 10 {
		return fmt.Sprintf("1:%.4g", math.Round(kL*10)/10)
	}
	return fmt.Sprintf("1:%.3g", kL)
}

// fill copies a sweep's findings into the combination result and works
// out the recommended scale, cost, required properties and corrections.
// It returns false when ctx is done before the cost curve is complete.
func (o *sweepOut) fill(ctx context.Context, r *ComboResult) bool {
	x := o.combo
	p := x.plan
	r.Window, r.Failing, r.Conditions, r.Notes = o.window, o.failing, o.conditions, o.notes
	if o.window.Empty() && o.us != nil {
		if s := x.bandFailing(o.limits, o.us, o.condU); s != "" {
			r.Failing, r.Unmet = s, x.unmet
		}
	}
	r.Margins, r.Limiting = o.margins, o.limiting
	r.Requirements = o.requirements
	r.AnyFacility = o.anyFacility
	for _, l := range o.limits {
		r.Limits = append(r.Limits, l.info)
	}
	if r.Window.Empty() {
		return true
	}
	r.Largest = r.Window.Largest()
	costAt := x.costFunc()
	hasCost := len(x.costs()) > 0
	if hasCost {
		r.CostCurve = make([]float64, len(p.Grid))
		for i, k := range p.Grid {
			if i%pointsPerCheck == 0 && ctx.Err() != nil {
				return false
			}
			c, err := costAt(k)
			if err != nil {
				c = math.NaN()
			}
			r.CostCurve[i] = c
		}
		cands := []float64{}
		for _, iv := range r.Window {
			cands = append(cands, iv.Lo, iv.Hi)
		}
		for _, k := range p.Grid {
			if r.Window.Contains(k) {
				cands = append(cands, k)
			}
		}
		sort.Float64s(cands)
		for _, k := range cands {
			c, err := costAt(k)
			if err != nil {
				r.Err = err.Error()
				break
			}
			if math.IsNaN(r.CheapestCost) || c < r.CheapestCost {
				r.Cheapest, r.CheapestCost = k, c
			}
		}
	}
	r.Recommended = r.Largest
	if p.Settings.Recommend == "cheapest" && hasCost && !math.IsNaN(r.Cheapest) {
		r.Recommended = r.Cheapest
	}
	if hasCost {
		if c, err := costAt(r.Recommended); err == nil {
			r.Cost = c
		}
	}
	ln := math.Log(r.Recommended)
	if ref := p.Settings.ReferenceLength; ref != "" {
		if f, err := x.form(ref); err == nil {
			r.ModelLength = f.at(ln)
		}
	}
	sol := x.cas.Solution
	lo, hi := math.Log(r.Window[0].Lo), math.Log(r.Window[len(r.Window)-1].Hi)
	for _, q := range sol.Required {
		pv := PropertyValue{Quantity: q, Law: sol.LawString(q)}
		for _, t := range sol.Strategy.Tuned {
			pv.Tuned = pv.Tuned || t == q
		}
		f, err := x.form(q)
		if err != nil {
			r.Notes = append(r.Notes, fmt.Sprintf("required %s: %v", q, err))
			continue
		}
		pv.AtLo, pv.AtHi, pv.AtRecommended = f.at(lo), f.at(hi), f.at(ln)
		pv.Own = math.NaN()
		if own, ok := x.modelProperty(q); ok {
			pv.Own = own
		}
		if q == "density" && !math.IsNaN(pv.Own) {
			r.AddedDensity = pv.AtRecommended - pv.Own
			for _, n := range p.ItemOrder {
				if it := p.Items[n]; it.ScalesAs == "mass" {
					if fm, err := x.form(n); err == nil {
						r.AddedMass = fm.at(ln) * (1 - pv.Own/pv.AtRecommended)
					}
					break
				}
			}
		}
		if x.cas.Technique == "substitute" {
			pv.Matches = x.libraryMatches(q, r.Recommended)
			if note := x.recipesFor(&pv, r.Window, r.Recommended); note != "" {
				r.Notes = append(r.Notes, note)
			}
		}
		r.Required = append(r.Required, pv)
	}
	v := feasibility.Values{}
	for k, val := range x.values {
		v[k] = val
	}
	r.Params = feasibility.Values{}
	for k, val := range x.values {
		r.Params[k] = val
	}
	v["length"] = r.Recommended
	if f, err := sol.Factors(v); err == nil {
		r.Factors = f
	}
	for _, m := range sol.Relaxed {
		if ratio, ok, err := sol.MismatchValue(m, v); err == nil && ok {
			r.Mismatches = append(r.Mismatches, MismatchValue{m.Law, m.Group, ratio})
		} else {
			r.Notes = append(r.Notes, fmt.Sprintf("relaxed %s: give %s to evaluate the %s mismatch", m.Law, strings.Join(m.Missing, ", "), m.Group))
		}
	}
	for _, m := range p.Measures {
		mv := MeasureValue{Name: m.Name, Unit: m.Unit.Text}
		var ferr error
		at := func(l float64) float64 {
			return m.Expr.Eval(func(n string) float64 {
				f, err := x.form(n)
				if err != nil && ferr == nil {
					ferr = err
				}
				return f.at(l)
			}) / m.Unit.Factor
		}
		mv.AtLo, mv.AtHi, mv.AtRecommended = at(lo), at(hi), at(ln)
		if ferr != nil {
			r.Notes = append(r.Notes, fmt.Sprintf("measure %s: %v", m.Name, ferr))
			continue
		}
		r.Measures = append(r.Measures, mv)
	}
	if note := x.poissonNote(); note != "" {
		r.Notes = append(r.Notes, note)
		r.PoissonFlag, r.PoissonNote = true, note
	}
	if x.cas.Correction == "ittc1957" {
		r.Friction = x.friction(ln)
		if r.Friction == nil {
			r.Notes = append(r.Notes, "ITTC-1957 correction needs reference_length, reference_speed and the kinematic viscosity of prototype and model")
		}
	}
	return true
}

// friction computes the ITTC-1957 correction at ln kL.
func (x *combo) friction(ln float64) *Friction {
	p := x.plan
	L, V := p.Settings.ReferenceLength, p.Settings.ReferenceSpeed
	nuP, ok := p.Proto["kinematic_viscosity"]
	if L == "" || V == "" || !ok {
		return nil
	}
	fl, err1 := x.form(L)
	fv, err2 := x.form(V)
	fn, err3 := x.form("kinematic_viscosity")
	if err1 != nil || err2 != nil || err3 != nil {
		return nil
	}
	f := &Friction{
		ReModel: fl.at(ln) * fv.at(ln) / fn.at(ln),
		ReProto: p.Items[L].Value * p.Items[V].Value / nuP,
	}
	f.CFModel, f.CFProto = ITTC1957(f.ReModel), ITTC1957(f.ReProto)
	f.Delta = f.CFModel - f.CFProto
	return f
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

// joint intersects, per facility, the windows of every case: the scales at
// which one model serves all of them (with any of each case's candidates).
func (p *Plan) joint(st *PlanStrategy, combos []*ComboResult) []*ComboResult {
	byFac := map[string][]*ComboResult{}
	var facs []string
	for _, c := range combos {
		if _, ok := byFac[c.Facility]; !ok {
			facs = append(facs, c.Facility)
		}
		byFac[c.Facility] = append(byFac[c.Facility], c)
	}
	var out []*ComboResult
	for _, f := range facs {
		var win []uInterval
		first := true
		var parts []string
		for _, cs := range st.Cases {
			var union []uInterval
			for _, c := range byFac[f] {
				if c.Case != cs.Case {
					continue
				}
				for _, iv := range c.Window {
					union = append(union, uInterval{math.Log10(iv.Lo), math.Log10(iv.Hi), caseLabel(cs.Case, iv.LoLimit), caseLabel(cs.Case, iv.HiLimit)})
				}
			}
			union = unionOf(union)
			if first {
				win, first = union, false
			} else {
				win = intersect(win, union)
			}
			parts = append(parts, cs.Case)
		}
		j := &ComboResult{Strategy: st.Name, Case: "all cases (" + strings.Join(parts, " + ") + ")", Technique: st.Technique,
			Facility: f, Axis: math.NaN(), Window: toWindow(win), Recommended: math.NaN(), Largest: math.NaN(),
			Cheapest: math.NaN(), CheapestCost: math.NaN(), Cost: math.NaN(), ModelLength: math.NaN(),
			AddedMass: math.NaN(), AddedDensity: math.NaN(), AnyFacility: math.NaN()}
		if j.Window.Empty() {
			j.Failing = "no scale serves every case in this facility"
		} else {
			j.Largest = j.Window.Largest()
			j.Recommended = j.Largest
			if it, ok := p.Items[p.Settings.ReferenceLength]; ok && it.ScalesAs == "length" {
				j.ModelLength = it.Value / j.Recommended
			}
		}
		out = append(out, j)
	}
	return out
}

func caseLabel(c, l string) string {
	if l == RangeLimit {
		return l
	}
	return c + ": " + l
}

// unionOf merges overlapping intervals.
func unionOf(a []uInterval) []uInterval {
	if len(a) == 0 {
		return nil
	}
	sort.Slice(a, func(i, j int) bool { return a[i].lo < a[j].lo })
	out := []uInterval{a[0]}
	for _, iv := range a[1:] {
		last := &out[len(out)-1]
		if iv.lo <= last.hi {
			if iv.hi > last.hi {
				last.hi, last.hiL = iv.hi, iv.hiL
			}
			continue
		}
		out = append(out, iv)
	}
	return out
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

// poissonNote flags a model material whose Poisson's ratio differs from
// the prototype's beyond the study's tolerance, unless the strategy
// relaxes transverse deformation (relax: poisson).
func (x *combo) poissonNote() string {
	if x.cas.RelaxPoisson || x.material == nil {
		return ""
	}
	pm, ok := x.material.Props["poisson"]
	pp, ok2 := x.plan.Proto["poisson"]
	if !ok || !ok2 || pp == 0 {
		return ""
	}
	if d := math.Abs(pm.Value-pp) / pp; d > x.plan.Settings.Tolerance {
		return fmt.Sprintf("Poisson's ratio of %s (%.3g) differs from the prototype's (%.3g) by %.0f %%: transverse deformation is not similar; relax it (relax: poisson) or choose a material closer in Poisson's ratio", x.material.Name, pm.Value, pp, 100*d)
	}
	return ""
}

// measureGrid evaluates a study measure over the grid (NaN where a name
// does not resolve).
func (x *combo) measureGrid(m *PlanMeasure, us []float64) []float64 {
	out := make([]float64, len(us))
	forms := map[string]linForm{}
	for _, n := range m.Expr.Names() {
		f, err := x.form(n)
		if err != nil {
			for i := range out {
				out[i] = math.NaN()
			}
			return out
		}
		forms[n] = f
	}
	for i, u := range us {
		ln := u * math.Ln10
		out[i] = m.Expr.Eval(func(n string) float64 { return forms[n].at(ln) }) / m.Unit.Factor
	}
	return out
}
