package materials

import (
	"math"
	"sort"
	"strings"
)

// The steps of a recipe's solution (see recipe.go): the mixture knob alone
// by bracketed bisection, all free conditions together by Nelder–Mead, along
// the temperature, and the nearest conditions where nothing meets.

// solveFixed handles an entry with fixed properties: a property with a
// tunable range (model ice strength) meets any value within it.
func (s *solver) solveFixed() Recipe {
	props := s.e.values(Conditions{})
	ranges := map[string][2]float64{}
	for _, p := range s.e.fixed {
		if p.Tunable() {
			ranges[p.Quantity] = [2]float64{p.Min, p.Max}
		}
	}
	method := "fixed properties"
	for _, t := range s.reqs {
		if rg, ok := ranges[t.Quantity]; ok && t.Of == nil {
			props[t.Quantity] = clamp(t.Value, rg[0], rg[1])
			method = "fixed properties; tuned within the entry's stated range by its preparation"
		}
	}
	r := Recipe{Entry: s.e.Name, Kind: s.e.Kind, Method: method, Target: s.check(0, props)}
	r.Met = r.Target.Met
	for i := 1; i < len(s.reqs); i++ {
		ch := s.check(i, props)
		r.Also = append(r.Also, ch)
		r.Met = r.Met && ch.Met
	}
	return r
}

// roots brackets and bisects the target on knob ki with the other
// conditions as in base, returning the roots found, nearest the preferred
// value first.
func (s *solver) roots(ki int, base Conditions) []Conditions {
	k := s.knobs[ki]
	f := func(x float64) float64 { return s.logDev(0, s.e.values(base.With(k.cond, x))) }
	var out []Conditions
	xPrev, fPrev := k.lo, f(k.lo)
	if fPrev == 0 {
		out = append(out, base.With(k.cond, xPrev))
	}
	for i := 1; i <= recipeSamples; i++ {
		x := k.lo + (k.hi-k.lo)*float64(i)/recipeSamples
		fx := f(x)
		switch {
		case math.IsInf(fx, 0) || math.IsNaN(fx) || math.IsInf(fPrev, 0) || math.IsNaN(fPrev):
		case fx == 0:
			out = append(out, base.With(k.cond, x))
		case (fPrev < 0) != (fx < 0) && fPrev != 0:
			out = append(out, base.With(k.cond, bisect(f, xPrev, x, fPrev)))
		}
		xPrev, fPrev = x, fx
	}
	sort.SliceStable(out, func(i, j int) bool {
		a, _ := out[i].Get(k.cond)
		b, _ := out[j].Get(k.cond)
		return math.Abs(a-k.prefer) < math.Abs(b-k.prefer)
	})
	return out
}

// bisect closes a bracket [a, b] with f(a) of sign fa and f(b) of the
// other sign, to a width of 1e-12 of the bracket or 200 halvings.
func bisect(f func(float64) float64, a, b, fa float64) float64 {
	width := 1e-12 * math.Max(math.Abs(b-a), math.Max(math.Abs(a), math.Abs(b))*1e-3)
	for i := 0; i < 200 && b-a > width; i++ {
		m := a + (b-a)/2
		fm := f(m)
		if fm == 0 {
			return m
		}
		if (fm < 0) == (fa < 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return a + (b-a)/2
}

// solve1D solves the target on one knob; ok when a root meets every
// requirement.
func (s *solver) solve1D(ki int, base Conditions) (Recipe, bool) {
	for _, c := range s.roots(ki, base) {
		if r := s.recipe(c, "bracketed bisection on "+string(s.knobs[ki].cond)); r.Met {
			return r, true
		}
	}
	return Recipe{}, false
}

// solveJoint moves every free condition; ok when every requirement is met.
func (s *solver) solveJoint(all []int) (Recipe, bool) {
	if r, ok, tried := s.solveAlongTemperature(all); tried {
		return r, ok
	}
	b := box{s: s, idx: all}
	obj := func(c Conditions) float64 {
		props := s.e.values(c)
		var f float64
		for i := range s.reqs {
			e := s.excessWithin(i, props, 0.5)
			if math.IsInf(e, 0) || math.IsNaN(e) {
				return math.MaxFloat64
			}
			f += e * e
		}
		// A pull towards the preferred conditions, small enough not to
		// push a requirement past its tolerance (it aims at half of it):
		// among the conditions that meet, prefer the nearest to the
		// study's.
		var d float64
		for _, ki := range all {
			k := s.knobs[ki]
			v, _ := c.Get(k.cond)
			d += ((v - k.prefer) / (k.hi - k.lo)) * ((v - k.prefer) / (k.hi - k.lo))
		}
		return f + 1e-8*d
	}
	c, _ := b.minimize(obj, b.seeds(obj, 4, 6))
	// Polish: re-solve the target on the mixture knob at the conditions
	// found, so that the recipe sits on the requirement, not at the edge of
	// its tolerance.
	for _, ki := range all {
		if s.knobs[ki].cond == Temperature && len(all) > 1 {
			continue
		}
		if r, ok := s.solve1D(ki, c); ok {
			r.Method = "gonum Nelder–Mead over " + s.knobList(all) + ", then bracketed bisection on " + string(s.knobs[ki].cond)
			return r, true
		}
		break
	}
	r := s.recipe(c, "gonum Nelder–Mead over "+s.knobList(all))
	return r, r.Met
}

// solveAlongTemperature handles the usual joint case, one mixture knob
// and the temperature: at every temperature tried the target is solved on
// the mixture knob (bracketed bisection), so gonum's Nelder–Mead searches
// the temperature alone for the one nearest the study's at which the other
// requirements hold (aiming inside half their tolerance). tried is false
// when the knobs are not of that shape.
func (s *solver) solveAlongTemperature(all []int) (r Recipe, ok, tried bool) {
	if len(all) != 2 {
		return Recipe{}, false, false
	}
	ti, mi := all[0], all[1]
	if s.knobs[mi].cond == Temperature {
		ti, mi = mi, ti
	}
	if s.knobs[ti].cond != Temperature || s.knobs[mi].cond == Temperature {
		return Recipe{}, false, false
	}
	tk := s.knobs[ti]
	// at returns the best root at temperature T and its objective.
	at := func(T float64) (Conditions, float64) {
		base := s.base.With(Temperature, T)
		roots := s.roots(mi, base)
		if len(roots) == 0 {
			return base, math.MaxFloat64
		}
		best, bestF := roots[0], math.Inf(1)
		for _, c := range roots {
			props := s.e.values(c)
			var f float64
			for i := 1; i < len(s.reqs); i++ {
				e := s.excessWithin(i, props, 0.5)
				f += e * e
			}
			if f < bestF {
				best, bestF = c, f
			}
		}
		d := (T - tk.prefer) / (tk.hi - tk.lo)
		return best, bestF + 1e-8*d*d
	}
	b := box{s: s, idx: []int{ti}}
	obj := func(c Conditions) float64 {
		T, _ := c.Get(Temperature)
		_, f := at(T)
		return f
	}
	// No temperature of a 24-interval sample has a root: the target lies
	// outside what the mixture knob reaches over the whole range (the
	// nearest search reports how near it comes).
	seeds := b.seeds(obj, 3, 24)
	rooted := false
	for _, c := range seeds {
		rooted = rooted || obj(c) < math.MaxFloat64
	}
	if !rooted {
		return Recipe{}, false, true
	}
	c, f := b.minimize(obj, seeds)
	if f == math.MaxFloat64 {
		return Recipe{}, false, true
	}
	T, _ := c.Get(Temperature)
	root, _ := at(T)
	r = s.recipe(root, "gonum Nelder–Mead over temperature, with bracketed bisection on "+string(s.knobs[mi].cond)+" at each temperature")
	return r, r.Met, true
}

// nearest finds the conditions bringing the target nearest its required
// value, the other requirements as penalties: the recipe "none".
func (s *solver) nearest(all []int) Recipe {
	b := box{s: s, idx: all}
	obj := func(c Conditions) float64 {
		props := s.e.values(c)
		d := s.logDev(0, props)
		if math.IsInf(d, 0) || math.IsNaN(d) {
			return math.MaxFloat64
		}
		f := d * d
		for i := 1; i < len(s.reqs); i++ {
			e := s.excess(i, props)
			if math.IsInf(e, 0) || math.IsNaN(e) {
				return math.MaxFloat64
			}
			f += e * e
		}
		return f
	}
	c, _ := b.minimize(obj, b.seeds(obj, 3, 6))
	return s.recipe(c, "nearest: gonum Nelder–Mead over "+s.knobList(all))
}

func (s *solver) knobList(idx []int) string {
	var names []string
	for _, i := range idx {
		names = append(names, string(s.knobs[i].cond))
	}
	return strings.Join(names, " and ")
}
