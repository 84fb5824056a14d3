package sweep

import (
	"context"
	"math"
	"runtime"
	"strings"
	"sync"
)

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
