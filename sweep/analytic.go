package sweep

import (
	"context"
	"fmt"
	"math"
)

// The analytic path of the sweep (see DEVELOPERS.md, "How a sweep is
// evaluated"). A combination's limits are compiled once: which limits
// apply, their names, and for a product of powers the constant and the
// exponents of its log-linear margin. At each second-axis value only the
// forms of the names are resolved again and A, B recomputed from them;
// the window of every axis value comes from those A, B (and the cached
// feasible sets of the limits that are not products of powers) without
// touching the grid. The grid is evaluated once per combination, at the
// chosen axis value, and for the other axis values only when an output
// asks (AxisMarginRows, AxisMeasureRows).

// limitPlan is a combination's limits compiled once for every value of
// the second axis. It applies where the axis changes values but not which
// limits apply or their text: an axis that is a facility capability or a
// free choice. (A medium condition as axis re-reads the candidate's
// properties, and with them the tuned ranges the limits are built from.)
type limitPlan struct {
	limits []compiled  // vals and set left nil
	names  [][]string  // names of each limit
	k      []float64   // constant of each products-of-powers limit
	exps   [][]float64 // exponent of each term, in the order of terms
	notes  []string
	// fresh is set when a limit is a function of its own (a joint recipe,
	// recipe_joint.go): its closure holds the requirements of the axis
	// value it was made at, so such a combination compiles its limits
	// afresh at every axis value.
	fresh bool
}

// compile records a combination's limits, as limitsFor gave them.
func (lp *limitPlan) compile(limits []compiled, notes []string) {
	lp.notes = append([]string(nil), notes...)
	lp.limits = make([]compiled, len(limits))
	lp.names = make([][]string, len(limits))
	lp.k = make([]float64, len(limits))
	lp.exps = make([][]float64, len(limits))
	for j, l := range limits {
		l.vals, l.set = nil, nil
		lp.limits[j] = l
		lp.fresh = lp.fresh || l.fn != nil
		lp.names[j] = l.lim.Names()
		if !l.info.Linear {
			continue
		}
		// A was built as k + Σ e·C/ln 10: take the constant back from
		// the limit itself so that A is recomputed in the same order.
		k, _, _ := l.lim.LogLinear()
		lp.k[j] = k
		lp.exps[j] = make([]float64, len(l.terms))
		for i, t := range l.terms {
			lp.exps[j][i] = t.Exp.Float64()
		}
	}
}

// at returns the compiled limits with the forms of combination x: the
// same arithmetic as limitsFor, without parsing or collecting again. A
// limit whose names resolve to the forms they had when compiled keeps its
// forms and A, B as they are (only the forms the axis value changes are
// re-evaluated).
func (lp *limitPlan) at(x *combo) ([]compiled, []string, error) {
	if lp.fresh {
		return x.limitsFor()
	}
	out := make([]compiled, len(lp.limits))
	var buf [8]linForm
	for j := range lp.limits {
		c := lp.limits[j]
		fs := buf[:0]
		same := true
		for _, n := range lp.names[j] {
			f, err := x.form(n)
			if err != nil {
				return nil, nil, err
			}
			fs = append(fs, f)
			if was, ok := c.forms[n]; !ok || was != f {
				same = false
			}
		}
		if !same {
			forms := make(map[string]linForm, len(fs))
			for i, n := range lp.names[j] {
				forms[n] = fs[i]
			}
			c.forms = forms
			if c.info.Linear {
				c.info.A, c.info.B = lp.k[j], 0
				for i, t := range c.terms {
					e := lp.exps[j][i]
					f := forms[t.Name]
					c.info.A += e * f.C / math.Ln10
					c.info.B += e * f.E
				}
			}
		}
		out[j] = c
	}
	return out, append([]string(nil), lp.notes...), nil
}

// compiledLimits is limitsFor, from the combination's compiled limits when
// it has them.
func (x *combo) compiledLimits() ([]compiled, []string, error) {
	lp := x.limitPlan
	if lp == nil {
		return x.limitsFor()
	}
	if lp.limits == nil {
		limits, notes, err := x.limitsFor()
		if err != nil {
			return nil, nil, err
		}
		lp.compile(limits, notes)
		return limits, notes, nil
	}
	return lp.at(x)
}

// axisSweep is what a combination needs to sweep any of its second-axis
// values again: the margins of the axis values not chosen are computed
// when an output asks for them, not kept.
type axisSweep struct {
	plan     *Plan
	cas      *PlanCase
	medium   *Candidate2
	material *Candidate2
	fac      *Facility
	axes     []float64
	us       []float64
	lp       *limitPlan // nil when the limits are compiled per axis value
	// peak is the largest margin over the grid and the axis, found by
	// choose when no axis value has a window (NaN when one has: swept on
	// demand); buf is choose's scratch for it, made when a peak needs a
	// pass over the grid (peak.go).
	peak float64
	buf  []float64
}

// newAxisCombo is the combination at one axis value, sharing the compiled
// limits.
func (a *axisSweep) combo(v float64) (*combo, error) {
	x, err := a.plan.newCombo(a.cas, a.medium, a.material, a.fac, v)
	if err != nil {
		return nil, err
	}
	x.limitPlan = a.lp
	return x, nil
}

// each sweeps the grid at every axis value and hands the margins to fn
// (the slice is fn's to keep); false if a value fails.
func (a *axisSweep) each(fn func(i int, margins []float64)) bool {
	cache := sampleCache{}
	limiting := make([]int, len(a.us))
	for i, v := range a.axes {
		x, err := a.combo(v)
		if err != nil {
			return false
		}
		out, err := x.sweep(context.Background(), a.us, cache, limiting)
		if err != nil {
			return false
		}
		fn(i, out.margins)
	}
	return true
}

// margins sweeps the grid at every axis value and returns the margins,
// one row per axis value (nil if a value fails).
func (a *axisSweep) margins() [][]float64 {
	rows := make([][]float64, len(a.axes))
	if !a.each(func(i int, m []float64) { rows[i] = m }) {
		return nil
	}
	return rows
}

// eachMeasures evaluates every study measure over the grid at every axis
// value and hands them to fn, by measure name (the slices are fn's to
// keep); false if a value fails.
func (a *axisSweep) eachMeasures(fn func(i int, rows map[string][]float64)) bool {
	for i, v := range a.axes {
		x, err := a.combo(v)
		if err != nil {
			return false
		}
		rows := make(map[string][]float64, len(a.plan.Measures))
		for _, m := range a.plan.Measures {
			rows[m.Name] = x.measureGrid(m, a.us)
		}
		fn(i, rows)
	}
	return true
}

// measures evaluates every study measure over the grid at every axis
// value.
func (a *axisSweep) measures() map[string][][]float64 {
	if len(a.plan.Measures) == 0 {
		return nil
	}
	out := map[string][][]float64{}
	ok := a.eachMeasures(func(_ int, rows map[string][]float64) {
		for n, r := range rows {
			out[n] = append(out[n], r)
		}
	})
	if !ok {
		return nil
	}
	return out
}

// AxisMarginRows returns, with a second axis, the margin of every grid
// point at every axis value, one row per axis value (nil without an axis).
// The rows are computed on each call from the combination's compiled
// limits, not kept: call it for the combinations an output shows.
func (c *ComboResult) AxisMarginRows() [][]float64 {
	if c.AxisMargins != nil || c.axis == nil {
		return c.AxisMargins
	}
	return c.axis.margins()
}

// EachAxisMarginRow hands fn, with a second axis, the margin of every grid
// point at each axis value in turn (the row is fn's to keep), sweeping the
// axis again without keeping the rows: a map thins each row to what it
// shows as it comes, so its memory does not grow with the grid. It
// returns false without a second axis or when a value fails.
func (c *ComboResult) EachAxisMarginRow(fn func(i int, row []float64)) bool {
	if c.AxisMargins != nil {
		for i, row := range c.AxisMargins {
			fn(i, row)
		}
		return true
	}
	if c.axis == nil {
		return false
	}
	return c.axis.each(fn)
}

// EachAxisMeasureRow is EachAxisMarginRow for the study's measures at
// model scale: fn gets each measure's row by name. It returns false
// without a second axis, without measures, or when a value fails.
func (c *ComboResult) EachAxisMeasureRow(fn func(i int, rows map[string][]float64)) bool {
	if c.AxisMeasures != nil {
		n := 0
		for _, rows := range c.AxisMeasures {
			n = max(n, len(rows))
		}
		for i := range n {
			at := map[string][]float64{}
			for name, rows := range c.AxisMeasures {
				if i < len(rows) {
					at[name] = rows[i]
				}
			}
			fn(i, at)
		}
		return true
	}
	if c.axis == nil || len(c.axis.plan.Measures) == 0 {
		return false
	}
	return c.axis.eachMeasures(fn)
}

// AxisMarginPeak returns, with a second axis, the largest margin over the
// grid and the axis (-Inf without an axis), keeping no rows: how close to
// feasible the combination comes. It was found with the windows, without
// sweeping the grid again (peak.go).
func (c *ComboResult) AxisMarginPeak() float64 {
	pk := math.Inf(-1)
	if c.AxisMargins != nil || c.axis == nil {
		for _, row := range c.AxisMargins {
			for _, v := range row {
				if v > pk {
					pk = v
				}
			}
		}
		return pk
	}
	if !math.IsNaN(c.axis.peak) {
		return c.axis.peak
	}
	c.axis.each(func(_ int, m []float64) {
		for _, v := range m {
			if v > pk {
				pk = v
			}
		}
	})
	return pk
}

// AxisMeasureRows returns, with a second axis, each study measure at model
// scale over the grid, one row per axis value (nil without an axis or
// without measures); computed on each call like AxisMarginRows.
func (c *ComboResult) AxisMeasureRows() map[string][][]float64 {
	if c.AxisMeasures != nil || c.axis == nil {
		return c.AxisMeasures
	}
	return c.axis.measures()
}

// costFunc is cost with the forms of every cost measure resolved once:
// the same arithmetic, without resolving names at every scale.
func (x *combo) costFunc() func(kL float64) (float64, error) {
	type term struct {
		c     *PlanCost
		forms map[string]linForm
		err   error
	}
	var terms []term
	for _, c := range x.costs() {
		t := term{c: c, forms: map[string]linForm{}}
		for _, n := range c.Measure.Names() {
			f, err := x.form(n)
			if err != nil {
				t.err = fmt.Errorf("Costs!D%d: %v", c.Row, err)
				break
			}
			t.forms[n] = f
		}
		terms = append(terms, t)
	}
	return func(kL float64) (float64, error) {
		ln := math.Log(kL)
		total := 0.0
		for i := range terms {
			t := &terms[i]
			if t.err != nil {
				return 0, t.err
			}
			v := t.c.Measure.Eval(func(n string) float64 { return t.forms[n].at(ln) })
			total += t.c.Coefficient * v / t.c.Per.Factor
		}
		return total, nil
	}
}

// choose finds the window at every axis value and picks the one that
// allows the largest model (then the widest window). With one axis value
// the grid is swept at once and best is that sweep; with several, only
// windows are found and best is nil (sweep the chosen value after).
func (a *axisSweep) choose(ctx context.Context, cache sampleCache) (bestI int, windows []Window, best *sweepOut, err error) {
	bestI = -1
	var bestWindow Window
	for i, v := range a.axes {
		if err := ctx.Err(); err != nil {
			return 0, nil, nil, err
		}
		x, err := a.combo(v)
		if err != nil {
			return 0, nil, nil, err
		}
		x.windowOnly = len(a.axes) > 1
		if x.windowOnly {
			x.peakBuf = &a.buf
		}
		var scratch []int
		if !x.windowOnly {
			scratch = make([]int, len(a.us))
		}
		out, err := x.sweep(ctx, a.us, cache, scratch)
		if err != nil {
			return 0, nil, nil, err
		}
		windows = append(windows, out.window)
		if x.windowOnly {
			switch {
			case i == 0, math.IsNaN(out.peak):
				a.peak = out.peak
			case !math.IsNaN(a.peak) && out.peak > a.peak:
				a.peak = out.peak
			}
		}
		if bestI < 0 || better(out.window, bestWindow) {
			bestI, bestWindow = i, out.window
		}
		if !x.windowOnly {
			best = out
		}
	}
	a.buf = nil
	return bestI, windows, best, nil
}

// marginAt is a limit's margin at grid point i (u = log10 kL there), from
// its sampled margins when it has them.
func (l *compiled) marginAt(i int, u float64) float64 {
	if l.vals != nil {
		return l.vals[i]
	}
	return l.margin(u)
}
