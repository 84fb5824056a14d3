package sweep

import (
	"math"
	"sort"
)

// Interval is a feasible range of the length scale, kL from Lo to Hi, with
// the limit that sets each edge ("scale range" where the sweep's own range
// ends it).
type Interval struct {
	Lo, Hi           float64
	LoLimit, HiLimit string
}

// Window is the feasible set of a combination: zero or more disjoint
// intervals in increasing kL. A window that is a single point (Lo == Hi)
// comes from a similarity condition that allows only one scale.
type Window []Interval

// Empty reports whether nothing is feasible.
func (w Window) Empty() bool { return len(w) == 0 }

// Largest returns the scale of the largest model in the window (the
// smallest kL).
func (w Window) Largest() float64 {
	if w.Empty() {
		return math.NaN()
	}
	return w[0].Lo
}

// Contains reports whether kL lies in the window.
func (w Window) Contains(kL float64) bool {
	for _, iv := range w {
		if kL >= iv.Lo*(1-1e-12) && kL <= iv.Hi*(1+1e-12) {
			return true
		}
	}
	return false
}

// RangeLimit labels an edge set by the sweep's own scale range.
const RangeLimit = "scale range"

// uInterval is an interval in u = log10 kL.
type uInterval struct {
	lo, hi   float64
	loL, hiL string
}

// intersect returns the intersection of two sorted interval lists, keeping
// the label of whichever edge is the tighter one.
func intersect(a, b []uInterval) []uInterval {
	var out []uInterval
	i, j := 0, 0
	for i < len(a) && j < len(b) {
		lo, loL := a[i].lo, a[i].loL
		if b[j].lo > lo {
			lo, loL = b[j].lo, b[j].loL
		}
		hi, hiL := a[i].hi, a[i].hiL
		if b[j].hi < hi {
			hi, hiL = b[j].hi, b[j].hiL
		}
		if lo <= hi {
			out = append(out, uInterval{lo, hi, loL, hiL})
		}
		if a[i].hi < b[j].hi {
			i++
		} else {
			j++
		}
	}
	return out
}

// halfLine is the set where A + B·u ≥ 0 within [lo, hi].
func halfLine(A, B float64, name string, lo, hi float64) []uInterval {
	switch {
	case B == 0:
		if A >= 0 {
			return []uInterval{{lo, hi, RangeLimit, RangeLimit}}
		}
		return nil
	case B > 0:
		return []uInterval{{-A / B, hi, name, RangeLimit}}
	default:
		return []uInterval{{lo, -A / B, RangeLimit, name}}
	}
}

// bisectTol is the accuracy of edges found by bisection: 0.1 % in kL.
var bisectTol = math.Log10(1.001) / 4

// sampled finds where margin(u) ≥ 0 from its values on the grid us and
// refines every sign change by bisection.
func sampled(us []float64, margin func(u float64) float64, name string) []uInterval {
	vals := make([]float64, len(us))
	for i, u := range us {
		vals[i] = margin(u)
	}
	return sampledFrom(us, vals, margin, name)
}

// sampledFrom is sampled with the margins on the grid already known.
func sampledFrom(us, vals []float64, margin func(u float64) float64, name string) []uInterval {
	var out []uInterval
	in := false
	var start float64
	var startL string
	prevU, prevM := 0.0, 0.0
	for i, u := range us {
		m := vals[i]
		ok := m >= 0
		if i == 0 {
			if ok {
				in, start, startL = true, u, RangeLimit
			}
		} else if ok != (prevM >= 0) {
			edge := bisect(prevU, u, prevM >= 0, margin)
			if ok {
				in, start, startL = true, edge, name
			} else {
				out = append(out, uInterval{start, edge, startL, name})
				in = false
			}
		}
		prevU, prevM = u, m
	}
	if in {
		out = append(out, uInterval{start, us[len(us)-1], startL, RangeLimit})
	}
	return out
}

// bisect returns the point between a and b where the sign of margin
// changes; okAtA tells which side is feasible. The returned edge lies on
// the feasible side.
func bisect(a, b float64, okAtA bool, margin func(float64) float64) float64 {
	for i := 0; i < 200 && b-a > bisectTol; i++ {
		m := (a + b) / 2
		if (margin(m) >= 0) == okAtA {
			a = m
		} else {
			b = m
		}
	}
	if okAtA {
		return a
	}
	return b
}

func toWindow(us []uInterval) Window {
	w := make(Window, 0, len(us))
	for _, iv := range us {
		w = append(w, Interval{math.Pow(10, iv.lo), math.Pow(10, iv.hi), iv.loL, iv.hiL})
	}
	sort.Slice(w, func(i, j int) bool { return w[i].Lo < w[j].Lo })
	return w
}
