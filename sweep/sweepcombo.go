package sweep

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"

	"scaleplan/feasibility"
)

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
	// peak is, when only the window is found and it is empty, the largest
	// margin over the grid (peak.go); NaN otherwise.
	peak float64
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
	if x.fac != nil && !x.windowOnly {
		out.anyFacility = x.anyFacility(limits, us)
	}
	win, condU, condFails, err := x.conditions(out, win, u0, u1)
	if err != nil {
		return nil, err
	}
	if _, blocked, _ := x.checks(); blocked != "" && condFails == "" {
		condFails, win = blocked, nil
	}
	out.window = toWindow(win)
	if x.windowOnly {
		out.peak = math.NaN()
		if out.window.Empty() {
			out.peak = gridPeak(limits, us, condU, condFails != "" && math.IsNaN(condU), x.peakBuf)
		}
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

// anyFacility is the largest model any facility could take (its kL): the
// window of the limits that name no capability of this facility; NaN when
// there is none.
func (x *combo) anyFacility(limits []compiled, us []float64) float64 {
	free := limitWindow(limits, us, func(l compiled) bool {
		for _, n := range l.lim.Names() {
			if _, ok := x.fac.Caps[n]; ok {
				return false
			}
		}
		return true
	})
	if len(free) > 0 {
		return math.Pow(10, free[0].lo)
	}
	return math.NaN()
}

// conditions applies the similarity conditions of the strategy at the
// combination's factors to the window win (log10 kL from u0 to u1),
// recording them in out. It returns the window, the log10 kL a condition
// pins (NaN for none) and why the conditions empty the window ("" when
// they do not).
func (x *combo) conditions(out *sweepOut, win []uInterval, u0, u1 float64) ([]uInterval, float64, string, error) {
	sol := x.cas.Solution
	checks, err := sol.Check(x.values)
	if err != nil {
		return nil, 0, "", err
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
	return win, condU, condFails, nil
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

// fill copies a sweep's findings into the combination result and works
// out the recommended scale, cost, required properties and corrections.
// It returns false when ctx is done before the cost curve is complete.
func (o *sweepOut) fill(ctx context.Context, r *ComboResult) bool {
	x := o.combo
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
	if !x.fillCosts(ctx, r) {
		return false
	}
	ln := math.Log(r.Recommended)
	if ref := x.plan.Settings.ReferenceLength; ref != "" {
		if f, err := x.form(ref); err == nil {
			r.ModelLength = f.at(ln)
		}
	}
	lo, hi := math.Log(r.Window[0].Lo), math.Log(r.Window[len(r.Window)-1].Hi)
	x.fillRequired(r, lo, hi, ln)
	x.fillFactors(r)
	x.fillMeasures(r, lo, hi, ln)
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

// fillCosts gives a combination with a window its cost curve, its
// cheapest scale in the window, its recommended scale (the largest, or
// the cheapest when the study asks for it and there is a cost) and the
// cost there. It returns false when ctx is cancelled.
func (x *combo) fillCosts(ctx context.Context, r *ComboResult) bool {
	p := x.plan
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
	return true
}

// fillRequired gives the model properties the strategy requires at the
// window's ends (log kL lo and hi) and at the recommended scale (ln), with
// the added density and mass a ballasted model needs and, for a
// substitute, the library entries that match.
func (x *combo) fillRequired(r *ComboResult, lo, hi, ln float64) {
	p := x.plan
	sol := x.cas.Solution
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
}

// fillFactors gives the scale factors of every quantity at the
// recommended scale and the mismatch of every relaxed law there.
func (x *combo) fillFactors(r *ComboResult) {
	sol := x.cas.Solution
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
}

// fillMeasures gives the study's measures at model scale at the window's
// ends and at the recommended scale.
func (x *combo) fillMeasures(r *ComboResult, lo, hi, ln float64) {
	for _, m := range x.plan.Measures {
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
