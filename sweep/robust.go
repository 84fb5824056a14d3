package sweep

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"scaleplan/feasibility"
	"scaleplan/sweep/study"
)

// Uncertain is an input of the study that varies: its nominal value is
// multiplied, draw by draw, by a factor with a mean (or median) of one.
type Uncertain struct {
	Label        string   // as the report names it
	key          inputKey // what it multiplies
	Distribution string
	// Rel is the coefficient of variation (normal, lognormal) or the
	// relative half-width (uniform).
	Rel float64
	Row int
}

// draw returns a factor for one draw.
func (u *Uncertain) draw(src rand.Source) float64 {
	switch u.Distribution {
	case "lognormal":
		s := math.Sqrt(math.Log1p(u.Rel * u.Rel))
		return distuv.LogNormal{Mu: 0, Sigma: s, Src: src}.Rand()
	case "uniform":
		return distuv.Uniform{Min: 1 - u.Rel, Max: 1 + u.Rel, Src: src}.Rand()
	default:
		return distuv.Normal{Mu: 1, Sigma: u.Rel, Src: src}.Rand()
	}
}

// applies reports whether the input can change a combination.
func (u *Uncertain) applies(x *combo) bool {
	switch u.key.kind {
	case inputCandidate:
		return (x.medium != nil && x.medium.Name == u.key.owner) || (x.material != nil && x.material.Name == u.key.owner)
	case inputCapability:
		return x.fac != nil && x.fac.Name == u.key.owner
	}
	return true
}

// prepareUncertain reads the Uncertainty sheet.
func (p *Plan) prepareUncertain(ps *study.Problems) {
	for _, r := range p.Study.Uncertain {
		in, of := strings.TrimSpace(r.Input), strings.TrimSpace(r.Of)
		u := &Uncertain{Distribution: strings.ToLower(strings.TrimSpace(r.Distribution)), Row: r.Row}
		if !slices.Contains(study.Distributions, u.Distribution) {
			ps.Add(study.At("Uncertainty", r.Row, "distribution"), "unknown distribution %q%s", r.Distribution, feasibility.Suggest(u.Distribution, study.Distributions))
			continue
		}
		var nominal float64
		var dim feasibility.Dimension
		switch {
		case of == "":
			it, ok := p.Items[in]
			if !ok && p.failed.has(in) {
				continue // reported at its own row
			}
			if !ok {
				ps.Add(study.At("Uncertainty", r.Row, "input"), "no prototype item %q%s (name a candidate or a facility in the of column for their inputs)", in, feasibility.Suggest(in, p.ItemOrder))
				continue
			}
			u.key, u.Label, nominal, dim = inputKey{inputItem, "", in}, in, it.Value, it.Dim
		case of == "prototype":
			v, ok := p.Proto[in]
			if !ok {
				ps.Add(study.At("Uncertainty", r.Row, "input"), "the prototype has no property %q", in)
				continue
			}
			q, _ := feasibility.QuantityNamed(in)
			u.key, u.Label, nominal, dim = inputKey{inputProto, "", in}, "prototype "+in, v, q.Dim
		default:
			found := false
			for _, c := range append(append([]*Candidate2(nil), p.Media...), p.Materials...) {
				if c.Name == of {
					pr, ok := c.Props[in]
					if !ok {
						ps.Add(study.At("Uncertainty", r.Row, "input"), "%s %q has no %s", c.Role, of, in)
						found = true
						break
					}
					q, _ := feasibility.QuantityNamed(in)
					u.key, u.Label, nominal, dim, found = inputKey{inputCandidate, of, in}, in+" of "+of, pr.Value, q.Dim, true
				}
			}
			if f := p.facility(of); !found && f != nil {
				v, ok := f.Caps[in]
				if !ok {
					ps.Add(study.At("Uncertainty", r.Row, "input"), "facility %q states no %s", of, in)
					continue
				}
				cp, _ := p.Catalog.Capability(f.Type, in)
				u.key, u.Label, nominal, dim, found = inputKey{inputCapability, of, in}, in+" of "+of, v, cp.Dim, true
			}
			if !found {
				ps.Add(study.At("Uncertainty", r.Row, "of"), "%q is neither blank (a prototype item), prototype, a candidate nor a facility", of)
				continue
			}
			if u.key == (inputKey{}) {
				continue
			}
		}
		rel, err := parseSpread(r.Spread, nominal, dim)
		if err != nil {
			ps.Add(study.At("Uncertainty", r.Row, "spread"), "%v", err)
			continue
		}
		u.Rel = rel
		if refuseTwiceUncertain(p.Uncertain, u, ps) {
			continue
		}
		p.Uncertain = append(p.Uncertain, u)
	}
	if len(p.Uncertain) > 0 && p.Settings.Samples == 0 {
		p.Settings.Samples = 2000
	}
}

// parseSpread reads a relative spread ("0.1", "10%") or an absolute one
// with a unit ("0.2 m/s"), and returns it relative to the nominal value.
func parseSpread(s string, nominal float64, dim feasibility.Dimension) (float64, error) {
	t := strings.TrimSpace(s)
	if strings.HasSuffix(t, "%") {
		v, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimSuffix(t, "%")), 64)
		if err != nil || !(v > 0) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("spread %q is not a positive percentage", s)
		}
		return v / 100, nil
	}
	v, u, err := feasibility.ParseValue(t)
	if err != nil {
		return 0, err
	}
	if !(v > 0) {
		return 0, fmt.Errorf("spread %q must be positive", s)
	}
	if u.Text == "" {
		return v, nil
	}
	if !u.Dim.Equal(dim) {
		return 0, fmt.Errorf("unit %q of the spread does not fit the input (%s)", u.Text, dim)
	}
	return v / nominal, nil
}

// Robust is how likely each scale is to stay feasible when the uncertain
// inputs vary.
type Robust struct {
	Samples int
	Level   float64
	// Probability of feasibility at each grid scale, and the largest
	// standard error of those estimates.
	Probability []float64
	StdErr      float64
	// Window holds the scales whose probability reaches Level.
	Window Window
	// MostFailing names, per grid scale, the limit that most often fails
	// there ("" where nothing fails).
	MostFailing []string
	// Sensitivity ranks the inputs by how much the robust window widens
	// (in decades of kL) when the input is known exactly.
	Sensitivity []InputGain
	Note        string
}

// InputGain is an input's effect on the robust window.
type InputGain struct {
	Input string
	Gain  float64
}

// robust samples the uncertain inputs for a combination at its chosen
// axis value. The margins of products-of-powers limits are linear in the
// log of every input, so each input's effect is found once (a decade's
// change) and each draw is a sum; other limits keep their nominal set.
// It returns nil when ctx is done (checked every drawsPerCheck draws).
func (o *sweepOut) robust(ctx context.Context, us []float64, seed uint64, index int) *Robust {
	p := o.combo.plan
	R := &Robust{Samples: p.Settings.Samples, Level: p.Settings.RobustLevel}
	d := &draws{ctx: ctx, o: o, us: us, n: R.Samples}
	for _, u := range p.Uncertain {
		if u.applies(o.combo) {
			d.inputs = append(d.inputs, u)
		}
	}
	d.sensitivities()
	R.Note = d.nominalFixed()
	if !d.draw(rand.NewPCG(seed, uint64(index)+1)) {
		return nil
	}
	prob, fails := d.sample(-1)
	if prob == nil {
		return nil // interrupted
	}
	R.Probability = prob
	R.MostFailing = make([]string, len(us))
	for i := range us {
		best, arg := 0, -1
		for j := range fails {
			if fails[j][i] > best {
				best, arg = fails[j][i], j
			}
		}
		if arg >= 0 {
			R.MostFailing[i] = o.limits[arg].info.Name
		}
	}
	for _, q := range prob {
		if se := math.Sqrt(q * (1 - q) / float64(d.n)); se > R.StdErr {
			R.StdErr = se
		}
	}
	R.Window = probWindow(us, prob, R.Level)
	base := width(R.Window)
	for i, u := range d.inputs {
		if d.sens[i] == nil {
			continue
		}
		pi, _ := d.sample(i)
		if pi == nil {
			return nil // interrupted
		}
		R.Sensitivity = append(R.Sensitivity, InputGain{u.Label, width(probWindow(us, pi, R.Level)) - base})
	}
	sort.SliceStable(R.Sensitivity, func(a, b int) bool { return R.Sensitivity[a].Gain > R.Sensitivity[b].Gain })
	return R
}

// draws are the draws of the uncertain inputs of one combination and what
// sampling them needs.
type draws struct {
	ctx    context.Context
	o      *sweepOut
	us     []float64 // the grid, log10 kL
	n      int       // the number of draws
	inputs []*Uncertain
	sens   [][]float64 // [input][limit] change of A per decade (nil: the input is not used)
	fixed  []uInterval // the nominal feasible set of the limits that are not products of powers
	deltas [][]float64 // [draw][input] log10 of the drawn factor
}

// sensitivities finds each input's effect on the linear limits: the change
// of their A when the input is ten times its nominal value.
func (d *draws) sensitivities() {
	x, limits := d.o.combo, d.o.limits
	d.sens = make([][]float64, len(d.inputs))
	for i, u := range d.inputs {
		y, err := x.plan.newComboDrawn(x.cas, x.medium, x.material, x.fac, x.axis, map[inputKey]float64{u.key: 10})
		if err != nil {
			continue
		}
		lim, _, err := y.limitsFor()
		if err != nil || len(lim) != len(limits) {
			continue
		}
		d.sens[i] = make([]float64, len(limits))
		for j := range lim {
			if lim[j].info.Linear && limits[j].info.Linear {
				d.sens[i][j] = lim[j].info.A - limits[j].info.A
			}
		}
	}
}

// nominalFixed keeps the nominal set of the limits that are not products
// of powers, and returns the note that says what sampling does not vary.
func (d *draws) nominalFixed() string {
	d.fixed = []uInterval{{d.us[0], d.us[len(d.us)-1], RangeLimit, RangeLimit}}
	var notes []string
	hasNonlinear := false
	for _, l := range d.o.limits {
		if !l.info.Linear && l.set != nil {
			d.fixed = intersect(d.fixed, l.set)
			hasNonlinear = true
		}
	}
	if hasNonlinear {
		notes = append(notes, "limits that are not products of powers keep their nominal feasible set")
	}
	if len(d.o.conditions) > 0 {
		notes = append(notes, "similarity conditions are taken at their nominal values")
	}
	return strings.Join(notes, "; ")
}

// draw draws every input n times. It returns false when ctx is done.
func (d *draws) draw(src rand.Source) bool {
	d.deltas = make([][]float64, d.n)
	for s := range d.deltas {
		if s%drawsPerCheck == 0 && d.ctx.Err() != nil {
			return false
		}
		d.deltas[s] = make([]float64, len(d.inputs))
		for i, u := range d.inputs {
			f := u.draw(src)
			if f <= 0 {
				f = 1e-300
			}
			d.deltas[s][i] = math.Log10(f)
		}
	}
	return true
}

// sample evaluates the draws, every input but skip (-1: none) varying: the
// probability that each grid scale is feasible, and for each limit how
// many draws it fails at each scale. It returns nil when ctx is done.
func (d *draws) sample(skip int) (prob []float64, fails [][]int) {
	us, nl := d.us, len(d.o.limits)
	count := make([]int, len(us)+1) // differences: +1 where a draw's window starts, -1 past its end
	fails = make([][]int, nl)
	for j := range fails {
		fails[j] = make([]int, len(us)+1)
	}
	condOK := !d.o.window.Empty() || len(d.o.conditions) == 0
	A := make([]float64, nl)
	for s := 0; s < d.n; s++ {
		if s%drawsPerCheck == 0 && d.ctx.Err() != nil {
			return nil, nil
		}
		d.margins(A, s, skip)
		lo, hi, loL, hiL, empty := d.edges(A)
		// Grid points inside [lo, hi] and the nominal fixed set are
		// feasible; the rest fail at the edge's limit.
		first := sort.SearchFloat64s(us, lo)
		last := sort.Search(len(us), func(i int) bool { return us[i] > hi }) - 1
		if empty >= 0 || !condOK || lo > hi {
			j := empty
			if j < 0 {
				j = loL
			}
			if j >= 0 {
				fails[j][0]++
				fails[j][len(us)]--
			}
			continue
		}
		if first <= last {
			count[first]++
			count[last+1]--
		}
		if loL >= 0 && first > 0 {
			fails[loL][0]++
			fails[loL][first]--
		}
		if hiL >= 0 && last+1 < len(us) {
			fails[hiL][last+1]++
			fails[hiL][len(us)]--
		}
	}
	return d.probability(count), cumulate(fails, len(us))
}

// margins sets A to every limit's intercept in draw s, input skip kept
// at its nominal value.
func (d *draws) margins(A []float64, s, skip int) {
	for j, l := range d.o.limits {
		A[j] = l.info.A
		for i := range d.inputs {
			if i != skip && d.sens[i] != nil {
				A[j] += d.sens[i][j] * d.deltas[s][i]
			}
		}
	}
}

// edges finds a draw's window [lo, hi] of the linear limits (margin A +
// B·u ≥ 0) with the limits at its edges (-1: the grid's end), or a limit
// that fails everywhere (empty ≥ 0).
func (d *draws) edges(A []float64) (lo, hi float64, loL, hiL, empty int) {
	lo, hi, loL, hiL, empty = d.us[0], d.us[len(d.us)-1], -1, -1, -1
	for j, l := range d.o.limits {
		if !l.info.Linear {
			continue
		}
		b := l.info.B
		switch {
		case b == 0:
			if A[j] < 0 && empty < 0 {
				empty = j
			}
		case b > 0:
			if e := -A[j] / b; e > lo {
				lo, loL = e, j
			}
		default:
			if e := -A[j] / b; e < hi {
				hi, hiL = e, j
			}
		}
	}
	return lo, hi, loL, hiL, empty
}

// probability turns the counts (differences) into the share of draws
// feasible at each scale; scales outside the nominal fixed set never count
// as feasible.
func (d *draws) probability(count []int) []float64 {
	prob := make([]float64, len(d.us))
	c := 0
	for i, u := range d.us {
		c += count[i]
		prob[i] = float64(c) / float64(d.n)
		in := false
		for _, iv := range d.fixed {
			if u >= iv.lo && u <= iv.hi {
				in = true
			}
		}
		if !in {
			prob[i] = 0
		}
	}
	return prob
}

// cumulate turns each row of differences into running sums over the n
// grid points.
func cumulate(diffs [][]int, n int) [][]int {
	for j := range diffs {
		f := 0
		for i := 0; i < n; i++ {
			f += diffs[j][i]
			diffs[j][i] = f
		}
	}
	return diffs
}

// probWindow returns the scales whose probability reaches level, with
// edges interpolated between grid points.
func probWindow(us, prob []float64, level float64) Window {
	var out []uInterval
	in := false
	var start float64
	for i, u := range us {
		ok := prob[i] >= level
		switch {
		case ok && !in:
			start = u
			if i > 0 {
				start = interp(us[i-1], u, prob[i-1], prob[i], level)
			}
			in = true
		case !ok && in:
			out = append(out, uInterval{start, interp(us[i-1], u, prob[i-1], prob[i], level), "robust", "robust"})
			in = false
		}
	}
	if in {
		out = append(out, uInterval{start, us[len(us)-1], "robust", RangeLimit})
	}
	return toWindow(out)
}

func interp(u0, u1, p0, p1, level float64) float64 {
	if p1 == p0 {
		return u0
	}
	return u0 + (level-p0)/(p1-p0)*(u1-u0)
}

// drawsPerCheck is how many draws are sampled between two checks for an
// interrupt.
const drawsPerCheck = 1 << 15
