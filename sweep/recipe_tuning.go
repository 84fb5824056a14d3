package sweep

import (
	"fmt"
	"math"
	"strings"

	"scaleplan/materials"
)

// How a tunable candidate is brought to a required property: the box of
// conditions it may move over, the extremes of its effective value there,
// and the recipes solved along the window (the method is described in
// recipe.go).

// tuning says how a candidate can be brought to one required property.
type tuning struct {
	entry  materials.Entry
	q      string
	spec   materials.RecipeSpec // At, Hold and Limits; the target is set per scale
	free   []materials.Condition
	exps   map[string]float64 // a_Q of the candidate's own properties in the requirement
	own0   map[string]float64 // the entry's values at the stated conditions (SI)
	factor float64            // the draw's factor on the candidate's own value
	// lo and hi bound the effective value (times factor) over the box.
	lo, hi       float64
	loAt, hiAt   materials.Conditions
	knobsText    string // "w 0–1 at 20 °C"
	statedValue  float64
	tol          float64
	reqDecreases bool // the requirement falls as kL grows
	// also are the candidate's other requirements, met at the same
	// conditions (recipe_joint.go).
	also []alsoReq
}

// tuningOf returns how candidate c can be brought to the required q, or
// nil when it cannot be moved (fixed properties, every condition held).
func (x *combo) tuningOf(c *Candidate2, q string, own float64) *tuning {
	if c == nil || len(c.entry.Ranges) == 0 {
		return nil
	}
	e := c.entry
	at := c.cond
	axisCond := ""
	if !math.IsNaN(x.axis) && isCondition(x.plan.Settings.Axis) && c.Role == "medium" {
		axisCond = x.plan.Settings.Axis
		_ = setCondition(&at, axisCond, x.axis)
	}
	at = e.Applicable(at)
	t := &tuning{entry: e, q: q, exps: map[string]float64{}, tol: x.plan.Settings.Tolerance}
	t.spec = materials.RecipeSpec{At: at, Tolerance: t.tol, Limits: map[materials.Condition]materials.Range{}}
	for _, r := range e.Ranges {
		_, stated := c.cond.Get(r.Condition)
		rg, ranged := c.tune[r.Condition]
		switch {
		case string(r.Condition) == axisCond:
			t.spec.Hold = append(t.spec.Hold, r.Condition)
		case ranged:
			t.free = append(t.free, r.Condition)
			t.spec.Limits[r.Condition] = rg
		case r.Composition && !stated:
			t.free = append(t.free, r.Condition)
		default:
			t.spec.Hold = append(t.spec.Hold, r.Condition)
		}
	}
	if len(t.free) == 0 {
		return nil
	}
	t.exps = x.ownExps(c, q)
	if k, ok := x.lnK(q); ok {
		t.reqDecreases = k.E > 0
	}
	v0, err := e.ValuesAt(at)
	if err != nil || !(v0[q] > 0) {
		return nil
	}
	t.own0, t.statedValue = v0, v0[q]
	t.factor = own / v0[q]
	if !(t.factor > 0) || math.IsInf(t.factor, 0) {
		t.factor = 1
	}
	lo, hi, loAt, hiAt, ok := x.plan.extremes(t)
	if !ok {
		return nil
	}
	t.lo, t.hi, t.loAt, t.hiAt = lo*t.factor, hi*t.factor, loAt, hiAt
	var ks []string
	for _, k := range t.free {
		lo, hi := t.rangeOf(k)
		ks = append(ks, strings.ReplaceAll(materials.FormatRange(k, lo, hi), "w = ", "w "))
	}
	s := strings.Join(ks, ", ")
	var held []string
	for _, k := range t.spec.Hold {
		if v, ok := t.own0Cond(k); ok {
			held = append(held, materials.FormatCondition(k, v))
		}
	}
	if len(held) > 0 {
		s += " at " + strings.Join(held, ", ")
	}
	t.knobsText = s
	return t
}

// ownExps are the exponents a_Q with which the candidate's own properties
// enter the requirement of q: the given parameters it supplies (its
// density, through the density scale): req ∝ Π Q^a_Q.
func (x *combo) ownExps(c *Candidate2, q string) map[string]float64 {
	out := map[string]float64{}
	sol := x.cas.Solution
	law, ok := sol.Law(q)
	if !ok {
		return out
	}
	for j := 1; j < len(law.Exp) && j < len(sol.Params); j++ {
		par := sol.Params[j]
		if par.Role != "given" || law.Exp[j].Float64() == 0 || par.Quantity == q {
			continue
		}
		if x.supplier(par.Quantity) == c {
			out[par.Quantity] = law.Exp[j].Float64()
		}
	}
	return out
}

// rangeOf is the range a free condition moves in: the entry's valid range
// narrowed by the row's.
func (t *tuning) rangeOf(k materials.Condition) (float64, float64) {
	for _, r := range t.entry.Ranges {
		if r.Condition == k {
			lo, hi := r.Min, r.Max
			if lim, ok := t.spec.Limits[k]; ok {
				lo, hi = math.Max(lo, lim.Min), math.Min(hi, lim.Max)
			}
			return lo, hi
		}
	}
	return 0, 0
}

func (t *tuning) own0Cond(k materials.Condition) (float64, bool) {
	rc, err := t.entry.Resolve(t.spec.At)
	if err != nil {
		return 0, false
	}
	return rc.Get(k)
}

// effective is h(c) without the draw's factor.
func (t *tuning) effective(v map[string]float64) float64 {
	h := v[t.q]
	for Q, a := range t.exps {
		if !(v[Q] > 0) || !(t.own0[Q] > 0) {
			return math.NaN()
		}
		h *= math.Pow(t.own0[Q]/v[Q], a)
	}
	return h
}

// extremes are min h and max h over the tunable box, memoised per plan.
func (p *Plan) extremes(t *tuning) (float64, float64, materials.Conditions, materials.Conditions, bool) {
	key := fmt.Sprintf("%s|%s|%v|%v|%v|%v", t.entry.Name, t.q, t.spec.At, t.free, t.spec.Limits, t.exps)
	if p.recipes != nil {
		p.recipes.mu.Lock()
		if v, ok := p.recipes.extremes[key]; ok {
			p.recipes.mu.Unlock()
			return v.lo, v.hi, v.loAt, v.hiAt, true
		}
		p.recipes.mu.Unlock()
	}
	lo, hi, loAt, hiAt, ok := t.findExtremes()
	if ok && p.recipes != nil {
		p.recipes.mu.Lock()
		if p.recipes.extremes == nil {
			p.recipes.extremes = map[string]extremeFound{}
		}
		p.recipes.extremes[key] = extremeFound{lo, hi, loAt, hiAt}
		p.recipes.mu.Unlock()
	}
	return lo, hi, loAt, hiAt, ok
}

// findExtremes finds min h and max h over the tunable box.
func (t *tuning) findExtremes() (lo, hi float64, loAt, hiAt materials.Conditions, ok bool) {
	eval := func(c materials.Conditions) float64 {
		v, err := t.entry.ValuesAt(c)
		if err != nil {
			return math.NaN()
		}
		return t.effective(v)
	}
	nlo, loAt := t.boxBest(func(c materials.Conditions) float64 { return -eval(c) })
	hi, hiAt = t.boxBest(eval)
	lo = -nlo
	if !(lo > 0) || math.IsInf(hi, 0) || math.IsNaN(hi) {
		return 0, 0, loAt, hiAt, false
	}
	return lo, hi, loAt, hiAt, true
}

// boxBest is the largest value of f over the tunable box and where: the
// box is sampled (every corner included) and the best sample refined along
// each free condition by golden sections. NaN values count as −Inf.
func (t *tuning) boxBest(f func(materials.Conditions) float64) (float64, materials.Conditions) {
	n := []int{0, 256, 64, 16, 8}[min(len(t.free), 4)]
	g := func(c materials.Conditions) float64 {
		v := f(c)
		if math.IsNaN(v) {
			return math.Inf(-1)
		}
		return v
	}
	best, at := math.Inf(-1), t.spec.At
	first := true
	idx := make([]int, len(t.free))
	for {
		c := t.spec.At
		for i, k := range t.free {
			a, b := t.rangeOf(k)
			c = c.With(k, a+(b-a)*float64(idx[i])/float64(n))
		}
		if v := g(c); v > best || first {
			best, at, first = v, c, false
		}
		i := 0
		for ; i < len(idx); i++ {
			if idx[i]++; idx[i] <= n {
				break
			}
			idx[i] = 0
		}
		if i == len(idx) {
			break
		}
	}
	phi := (math.Sqrt(5) - 1) / 2
	for _, k := range t.free {
		a, b := t.rangeOf(k)
		v0, _ := at.Get(k)
		step := (b - a) / float64(n)
		l, r := math.Max(a, v0-step), math.Min(b, v0+step)
		for it := 0; it < 60 && r-l > 1e-12*(b-a); it++ {
			m1, m2 := r-phi*(r-l), l+phi*(r-l)
			if g(at.With(k, m1)) < g(at.With(k, m2)) {
				l = m1
			} else {
				r = m2
			}
		}
		if v := g(at.With(k, (l+r)/2)); v > best {
			best, at = v, at.With(k, (l+r)/2)
		}
	}
	return best, at
}

// jointMargin is, at ln kL, the largest over the box of the smallest
// margin of the requirements (log10(1 + tol) − log10(value/required) above
// the need, log10(value/required) − log10(1 − tol) below it):
// non-negative exactly where one recipe meets them all.
func (t *tuning) jointMargin(req linForm, ln float64) (float64, materials.Conditions) {
	sp := t.specAt(req, ln, 1, t.tol)
	above, below := math.Log10(1+t.tol), math.Log10(1-math.Min(t.tol, 0.999999))
	targets := append([]materials.Target{sp.Target}, sp.Also...)
	return t.boxBest(func(c materials.Conditions) float64 {
		v, err := t.entry.ValuesAt(c)
		if err != nil {
			return math.NaN()
		}
		m := math.Inf(1)
		for _, tg := range targets {
			r := tg.Of(v)
			if !(r > 0) || !(v[tg.Quantity] > 0) {
				return math.NaN()
			}
			d := math.Log10(v[tg.Quantity] / r)
			if d >= 0 {
				m = math.Min(m, above-d)
			} else {
				m = math.Min(m, d-below)
			}
		}
		return m
	})
}

// specAt is the recipe spec at ln kL: the requirement from the check's
// form, scaled by the candidate's own properties at the conditions tried,
// over the draw's factor; aim moves the target within the tolerance.
func (t *tuning) specAt(req linForm, ln, aim, tol float64) materials.RecipeSpec {
	sp := t.spec
	r0 := req.at(ln) / t.factor * aim
	exps, own0 := t.exps, t.own0
	sp.Target = materials.Target{Quantity: t.q, Tolerance: tol, Of: func(v map[string]float64) float64 {
		r := r0
		for Q, a := range exps {
			r *= math.Pow(v[Q]/own0[Q], a)
		}
		return r
	}}
	sp.Also = nil
	for _, a := range t.also {
		sp.Also = append(sp.Also, a.target(ln, t.tol))
	}
	return sp
}

// solveAt solves a recipe at ln kL, aimed (so that it serves the
// following scales as long as it can) or on the requirement.
func (t *tuning) solveAt(req linForm, ln float64, aimed bool) (materials.Recipe, bool) {
	if aimed {
		aim := 1 + 0.9*t.tol
		if t.reqDecreases {
			aim = 1 - 0.9*t.tol
		}
		if r, err := t.entry.Recipe(t.specAt(req, ln, aim, 0.02*t.tol)); err == nil && r.Met {
			if t.meetsAt(req, ln, r.Conditions) {
				return r, true
			}
		}
	}
	r, err := t.entry.Recipe(t.specAt(req, ln, 1, t.tol))
	if err != nil {
		return materials.Recipe{}, false
	}
	if !r.Met && len(t.also) > 0 {
		// The solver puts the target on its requirement; where the
		// others hold only with the target off it (within its
		// tolerance), take the conditions of the best joint margin.
		if m, c := t.jointMargin(req, ln); m >= 0 {
			if e, err := t.entry.Evaluate(t.specAt(req, ln, 1, t.tol), c); err == nil && e.Met {
				e.Method = "the conditions where every requirement has the most margin (sampled box, golden sections)"
				return e, true
			}
		}
	}
	return r, r.Met
}

// meetsAt evaluates a recipe's conditions against the requirement at ln.
func (t *tuning) meetsAt(req linForm, ln float64, c materials.Conditions) bool {
	r, err := t.entry.Evaluate(t.specAt(req, ln, 1, t.tol), c)
	return err == nil && r.Met
}

func (t *tuning) recipeAt(r materials.Recipe) RecipeAt {
	return RecipeAt{Entry: r.Entry, Conditions: r.Conditions.String(), Value: r.Target.Value * t.factor, Required: r.Target.Required * t.factor, Reached: r.Reached()}
}

// bands solves the recipes over the window: at the large-model end of each
// band, then Evaluated at the following grid points while it serves.
func (t *tuning) bands(req linForm, w Window, grid []float64) []RecipeBand {
	var out []RecipeBand
	for _, iv := range w {
		pts := []float64{iv.Lo}
		for _, k := range grid {
			if k > iv.Lo && k < iv.Hi {
				pts = append(pts, k)
			}
		}
		if iv.Hi > iv.Lo {
			pts = append(pts, iv.Hi)
		}
		var cur *RecipeBand
		var conds materials.Conditions
		// end closes the current band where its recipe stops serving,
		// between ln a (served) and ln b (not), to 0.1 % in kL, and
		// returns where the next band starts.
		end := func(a, b float64) float64 {
			for b-a > math.Log(1.001)/4 {
				m := (a + b) / 2
				if t.meetsAt(req, m, conds) {
					a = m
				} else {
					b = m
				}
			}
			cur.ToKL = math.Exp(a)
			out = append(out, *cur)
			cur = nil
			return math.Exp(b)
		}
		for _, k := range pts {
			ln := math.Log(k)
			if cur != nil && t.meetsAt(req, ln, conds) {
				cur.ToKL = k
				continue
			}
			from := k
			if cur != nil {
				from = end(math.Log(cur.ToKL), ln)
			}
			for tries := 0; tries < 50 && cur == nil; tries++ {
				r, ok := t.solveAt(req, math.Log(from), true)
				if !ok && from != k {
					r, ok = t.solveAt(req, ln, true)
					from = k
				}
				if !ok {
					break
				}
				conds = r.Conditions
				cur = &RecipeBand{RecipeAt: t.recipeAt(r), FromKL: from, ToKL: from}
				if t.meetsAt(req, ln, conds) {
					cur.ToKL = k
				} else {
					from = end(math.Log(from), ln)
				}
			}
		}
		if cur != nil {
			out = append(out, *cur)
		}
	}
	return out
}
