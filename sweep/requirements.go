package sweep

import (
	"context"
	"math"
	"slices"

	"scaleplan/feasibility"
)

// Requirement is a facility capability read the other way: the value a
// limit needs at each scale for the model to fit.
type Requirement struct {
	Capability, Unit string
	Limit            string // the limit it comes from
	// AtLeast is true when the capability must be at least the required
	// value (a carriage speed, a tank depth), false when at most (a
	// minimum carriage speed, a minimum ice thickness).
	AtLeast bool
	// Have is the facility's own value.
	Have float64
	// Exact is true when the requirement comes from inverting a
	// products-of-powers limit, or a limit where the capability stands
	// alone in a side that is a product of powers; otherwise it was
	// found by bisection.
	Exact bool
	// The required capability at each grid scale (At): from the limit's
	// log-linear form, log10 required = log10 Have − (A + B·u)/e at u =
	// log10 kL of the grid (us, the plan's, shared), or, for a limit that
	// is not a product of powers, stored.
	values []float64
	us     []float64
	a, b   float64
	e      float64
}

// Len is the number of grid scales.
func (r Requirement) Len() int {
	if r.values != nil {
		return len(r.values)
	}
	return len(r.us)
}

// At is the required capability at grid point i (NaN where it could not
// be found).
func (r Requirement) At(i int) float64 {
	if r.values != nil {
		return r.values[i]
	}
	// margin moves by e·Δlog10(capability): solve margin = 0.
	return r.Have * math.Pow(10, -(r.a+r.b*r.us[i])/r.e)
}

// All is the required capability at every grid scale.
func (r Requirement) All() []float64 {
	out := make([]float64, r.Len())
	for i := range out {
		out[i] = r.At(i)
	}
	return out
}

// Shortfall returns how far the facility falls short at grid point i, as
// a ratio: 0.12 means the capability is 12 % short (a carriage 12 % too
// slow); 0 or less means it fits.
func (r Requirement) Shortfall(i int) float64 {
	v := r.At(i)
	if math.IsNaN(v) || v <= 0 {
		return math.NaN()
	}
	if r.AtLeast {
		return v/r.Have - 1
	}
	return r.Have/v - 1
}

// requirements inverts every limit that names a capability of the
// combination's facility, at every grid scale. It stops, returning nil,
// when ctx is done.
func (x *combo) requirements(ctx context.Context, limits []compiled, us []float64) []Requirement {
	forms := x.requirementForms(limits)
	if forms == nil {
		return nil
	}
	var out []Requirement
	for _, rf := range forms {
		req := rf.req
		switch rf.how {
		case solvedLinear:
			// Kept as its form, not as values at every grid scale.
			req.us, req.a, req.b, req.e = us, rf.l.info.A, rf.l.info.B, rf.e
		case solvedIsolated:
			req.values = make([]float64, len(us))
			x.invertIsolated(rf.l, rf.e, req.Have, us, &req)
		default:
			req.values = make([]float64, len(us))
			if !x.invertSampled(ctx, rf.l, req.Capability, req.Have, us, &req) {
				continue
			}
		}
		if ctx.Err() != nil {
			return nil
		}
		out = append(out, req)
	}
	return out
}

// How a requirement is solved.
const (
	solvedLinear   = iota // a products-of-powers limit: log-linear in log kL
	solvedIsolated        // the capability alone in a side that is a product of powers
	solvedBisected        // otherwise, by bisection at every scale
)

// requirementForm is a requirement before it is evaluated on the grid:
// which limit and capability, and how it is solved (for a products-of-
// powers limit, log10 required = log10 have − (A + B·log10 kL)/e).
type requirementForm struct {
	req Requirement // without its values
	l   compiled
	how int
	e   float64 // the capability's exponent in the margin
}

// requirementForms finds, from the compiled limits alone (without the
// grid), every capability requirement and how it is solved.
func (x *combo) requirementForms(limits []compiled) []requirementForm {
	if x.fac == nil {
		return nil
	}
	out := []requirementForm{}
	for _, l := range limits {
		for _, n := range l.lim.Names() {
			have, ok := x.fac.Caps[n]
			if !ok {
				continue
			}
			rf := requirementForm{req: Requirement{Capability: n, Unit: x.fac.CapUnits[n], Limit: l.info.Name, Have: have}, l: l, how: solvedBisected}
			if l.info.Linear {
				e := 0.0
				for _, t := range l.terms {
					if t.Name == n {
						e = t.Exp.Float64()
					}
				}
				if e == 0 {
					continue
				}
				rf.how, rf.e = solvedLinear, e
				rf.req.Exact, rf.req.AtLeast = true, e > 0
			} else if eff, ok := isolated(l, n); ok {
				rf.how, rf.e = solvedIsolated, eff
				rf.req.Exact, rf.req.AtLeast = true, eff > 0
			}
			out = append(out, rf)
		}
	}
	return out
}

// isolated reports whether capability n stands in one side of a limit
// that is not a product of powers, with that side a product of powers and
// n nowhere else ("a·b + c·d <= tank_length"). The margin then moves by
// eff·Δlog10 n exactly, whatever the other side: eff is n's exponent,
// with the sign that makes it grow the margin.
func isolated(l compiled, n string) (eff float64, ok bool) {
	for _, side := range []struct {
		e, other *feasibility.Expr
		sign     float64 // +1 where a larger side grows the margin
	}{{l.lim.Right, l.lim.Left, 1}, {l.lim.Left, l.lim.Right, -1}} {
		if slices.Contains(side.other.Names(), n) {
			continue
		}
		_, powers, ok := side.e.Product()
		if !ok {
			continue
		}
		for _, p := range powers {
			if p.Name == n {
				if !l.lim.Upper {
					side.sign = -side.sign
				}
				return side.sign * p.Exp.Float64(), true
			}
		}
	}
	return 0, false
}

// invertIsolated solves an isolated capability's margin for zero at every
// grid point: required = have · 10^(−margin/eff). Like the bisection it
// replaces, it gives NaN where the requirement lies beyond six decades of
// the facility's value or the margin is not finite.
func (x *combo) invertIsolated(l compiled, eff, have float64, us []float64, req *Requirement) {
	for i, u := range us {
		t := -l.marginAt(i, u) / eff // log10(required / have)
		if math.IsNaN(t) || t < -6 || t > 6 {
			req.values[i] = math.NaN()
			continue
		}
		req.values[i] = have * math.Pow(10, t)
	}
}

// invertSampled finds the required capability of a limit that is not a
// product of powers by bisection on the capability, in log, to 0.1 %.
// It checks ctx every pointsPerCheck points and gives up when it is done.
func (x *combo) invertSampled(ctx context.Context, l compiled, n string, have float64, us []float64, req *Requirement) bool {
	forms := make(map[string]linForm, len(l.forms))
	for k, v := range l.forms {
		forms[k] = v
	}
	margin := func(u, capability float64) float64 {
		forms[n] = linForm{C: math.Log(capability)}
		ln := u * math.Ln10
		return l.lim.Margin(func(name string) float64 { return forms[name].at(ln) })
	}
	u0 := us[len(us)/2]
	up := margin(u0, have*2) > margin(u0, have/2)
	req.AtLeast = up
	for i, u := range us {
		if i%pointsPerCheck == 0 && ctx.Err() != nil {
			return false
		}
		lo, hi := math.Log(have)-math.Log(1e6), math.Log(have)+math.Log(1e6)
		okLo, okHi := margin(u, math.Exp(lo)) >= 0, margin(u, math.Exp(hi)) >= 0
		if okLo == okHi {
			req.values[i] = math.NaN()
			continue
		}
		for k := 0; k < 100 && hi-lo > 1e-3/4; k++ {
			mid := (lo + hi) / 2
			if (margin(u, math.Exp(mid)) >= 0) == okLo {
				lo = mid
			} else {
				hi = mid
			}
		}
		req.values[i] = math.Exp((lo + hi) / 2)
	}
	return true
}

// FitEdges returns, for a requirement, the scales where the facility's
// capability is just enough: the kL at which it stops fitting, found
// exactly for a products-of-powers limit. It returns NaN when the
// facility fits everywhere or nowhere on the grid.
func (r Requirement) FitEdges(grid []float64) []float64 {
	if r.values == nil && len(r.us) == len(grid) && len(grid) > 1 {
		// Kept as its form: the capability is just enough where the
		// margin A + B·u is zero, inside the grid.
		if r.b == 0 {
			return nil
		}
		if u := -r.a / r.b; u > r.us[0] && u < r.us[len(r.us)-1] {
			return []float64{math.Pow(10, u)}
		}
		return nil
	}
	var out []float64
	for i := 1; i < len(grid); i++ {
		a, b := r.Shortfall(i-1), r.Shortfall(i)
		if math.IsNaN(a) || math.IsNaN(b) || (a <= 0) == (b <= 0) {
			continue
		}
		// log of the shortfall ratio is linear in log kL for an exact
		// requirement; interpolate in logs.
		la, lb := math.Log(1+a), math.Log(1+b)
		t := la / (la - lb)
		out = append(out, math.Exp(math.Log(grid[i-1])+t*(math.Log(grid[i])-math.Log(grid[i-1]))))
	}
	return out
}

// pointsPerCheck is how many grid points a bisection over the grid solves
// between two checks for an interrupt (a few milliseconds of work).
const pointsPerCheck = 4096
