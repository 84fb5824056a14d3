package materials

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/optimize"
)

// box maps the free knobs onto the real line and back.
type box struct {
	s   *solver
	idx []int
}

func (b box) conditions(u []float64) Conditions {
	c := b.s.base
	for j, ki := range b.idx {
		k := b.s.knobs[ki]
		c = c.With(k.cond, k.lo+(k.hi-k.lo)*(1+math.Sin(u[j]))/2)
	}
	return c
}

func (b box) point(c Conditions) []float64 {
	u := make([]float64, len(b.idx))
	for j, ki := range b.idx {
		k := b.s.knobs[ki]
		v, _ := c.Get(k.cond)
		u[j] = math.Asin(clamp(2*(v-k.lo)/(k.hi-k.lo)-1, -1, 1))
	}
	return u
}

// seeds are the preferred point and the best few points of a coarse
// sample of the box by the objective.
func (b box) seeds(obj func(Conditions) float64, n, steps int) []Conditions {
	type pt struct {
		c Conditions
		f float64
	}
	pts := []pt{{b.s.base, obj(b.s.base)}}
	idx := make([]int, len(b.idx))
	for {
		c := b.s.base
		for j, ki := range b.idx {
			k := b.s.knobs[ki]
			c = c.With(k.cond, k.lo+(k.hi-k.lo)*float64(idx[j])/float64(steps))
		}
		pts = append(pts, pt{c, obj(c)})
		j := 0
		for ; j < len(idx); j++ {
			idx[j]++
			if idx[j] <= steps {
				break
			}
			idx[j] = 0
		}
		if j == len(idx) {
			break
		}
	}
	sort.SliceStable(pts[1:], func(i, j int) bool { return pts[1+i].f < pts[1+j].f })
	out := make([]Conditions, 0, n)
	for i := 0; i < len(pts) && len(out) < n; i++ {
		out = append(out, pts[i].c)
	}
	return out
}

// minimize runs gonum's Nelder–Mead on obj over the box from each seed and
// returns the best conditions found.
func (b box) minimize(obj func(Conditions) float64, seeds []Conditions) (Conditions, float64) {
	best, bestF := b.s.base, math.Inf(1)
	for _, seed := range seeds {
		if f := obj(seed); f < bestF {
			best, bestF = seed, f
		}
		p := optimize.Problem{Func: func(u []float64) float64 { return obj(b.conditions(u)) }}
		settings := &optimize.Settings{
			FuncEvaluations: 1500,
			Converger:       &optimize.FunctionConverge{Absolute: 1e-14, Iterations: 50},
		}
		res, err := optimize.Minimize(p, b.point(seed), settings, &optimize.NelderMead{SimplexSize: 0.3})
		if err != nil && res == nil {
			continue
		}
		if c := b.conditions(res.X); res.F < bestF {
			best, bestF = c, res.F
		}
		if bestF == 0 {
			break
		}
	}
	return best, bestF
}
