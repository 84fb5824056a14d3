package sweep

import (
	"fmt"
	"math"
	"runtime"
	"runtime/debug"
	"strconv"

	"scaleplan/sweep/study"
)

// Bounds of what a sweep may span. A model 1000 times the prototype or a
// millionth of it is a typing mistake, and numbers beyond these bounds
// lose the window to rounding (a range of 1e-200 to 1e200 overflows the
// scale laws; 5e-324 is below the smallest normal number).
const (
	// MinScale and MaxScale bound kL.
	MinScale = 1e-3
	MaxScale = 1e6
	// MaxAxisMagnitude bounds the values of a second axis, in SI.
	MaxAxisMagnitude = 1e12
	// MaxAxisRatio bounds axis_to / axis_from of a log-spaced axis.
	MaxAxisRatio = 1e12
)

// DefaultMemoryBudget is the soft memory limit `scaleplan run` sets
// (GOMEMLIMIT unless the environment sets it); a study whose sweep would
// need more is refused up front. When the process has a soft limit of its
// own, that limit is the budget.
const DefaultMemoryBudget = 768 << 20

// The memory a study's sweep and outputs need, measured as the peak RSS
// of `scaleplan run` writing every output on synthetic studies (see
// DEVELOPERS.md, "Inputs as people type them") and rounded up:
// bytesPerPoint per kL point and combination (margins, limiting limits,
// costs, requirements not kept as forms); bytesPerGridPoint per kL point
// whatever the number of combinations (the grid, its labels, the
// workbook's map rows, the row a contour map is sweeping); bytesPerAxisValue
// per axis value and combination (its window there, and the thinned rows
// of the contour maps); baseBytes the program, the library, the fonts, the
// images of the maps being drawn and the garbage collector's headroom. The
// margins at every axis value are not kept (a contour map thins each row
// as it is swept), so the need grows with the axis only through the
// windows.
const (
	bytesPerPoint     = 80
	bytesPerGridPoint = 160
	bytesPerAxisValue = 96
	baseBytes         = 96 << 20
	// bytesPerDraw is what a draw of the uncertain inputs holds besides 8
	// bytes per input (a slice header).
	bytesPerDraw = 24
)

// memoryBudget is the soft memory limit of the process, or
// DefaultMemoryBudget when it has none.
func memoryBudget() int64 {
	if l := debug.SetMemoryLimit(-1); l > 0 && l < math.MaxInt64 {
		return l
	}
	return DefaultMemoryBudget
}

// checkDomain refuses settings outside the values a sweep can take: a
// scale range beyond MinScale to MaxScale, an axis beyond its bounds, a
// capability or scale-factor axis that is not positive.
func (p *Plan) checkDomain(ps *study.Problems) {
	st := p.Settings
	if st.ScaleFrom > 0 && st.ScaleTo > st.ScaleFrom && (st.ScaleFrom < MinScale || st.ScaleTo > MaxScale) {
		ps.Add(st.Cell("scale_from"), "the scale range %v to %v reaches beyond kL = %g to %g (a model a thousand times the prototype to a millionth of it): give the range you mean to test, e.g. 5 to 100", st.ScaleFrom, st.ScaleTo, MinScale, MaxScale)
	}
	if st.Axis != "" && st.AxisFrom < st.AxisTo {
		cell := st.Cell("axis_from")
		from, to := st.AxisUnit.ToSI(st.AxisFrom), st.AxisUnit.ToSI(st.AxisTo)
		switch {
		case math.IsInf(from, 0) || math.IsInf(to, 0) || math.IsInf(to-from, 0) || math.Abs(from) > MaxAxisMagnitude || math.Abs(to) > MaxAxisMagnitude:
			ps.Add(cell, "the axis %s from %v to %v reaches beyond ±%g (SI): give the range you mean to sweep", st.Axis, st.AxisFrom, st.AxisTo, MaxAxisMagnitude)
		case !st.AxisLinear && from > 0 && to/from > MaxAxisRatio:
			ps.Add(cell, "the axis %s spans %.3g decades; a log-spaced axis spans at most %g: narrow axis_from to axis_to", st.Axis, math.Log10(to/from), math.Log10(MaxAxisRatio))
		case !(from > 0) && p.positiveAxis(st.Axis):
			ps.Add(cell, "the axis %s must be positive (%s), got %v to %v: start it above 0", st.Axis, p.axisRole(st.Axis), st.AxisFrom, st.AxisTo)
		}
	}
}

// positiveAxis reports whether the second axis must be positive: a
// facility capability (a tank depth, a speed, a g-level) or a scale
// factor left free by a strategy; a medium condition (a temperature in
// °C) may be negative.
func (p *Plan) positiveAxis(ax string) bool {
	return p.axisRole(ax) != ""
}

func (p *Plan) axisRole(ax string) string {
	if isCondition(ax) {
		return ""
	}
	for _, t := range p.Catalog.Types() {
		if _, ok := p.Catalog.Capability(t, ax); ok {
			return "a facility capability"
		}
	}
	for _, s := range p.Strategies {
		for _, c := range s.Cases {
			if c.Solution == nil {
				continue
			}
			for _, f := range c.Solution.Free {
				if f == ax {
					return "a scale factor, prototype/model"
				}
			}
		}
	}
	return ""
}

// memoryNeed estimates the bytes a study's sweep and outputs need
// (sweep), and those its draws of the uncertain inputs need (draws).
func (p *Plan) memoryNeed() (sweep, draws float64, points, combos int) {
	st := p.Settings
	points = st.Points
	if st.Axis != "" {
		points *= max(1, st.AxisPoints)
	}
	for _, s := range p.Strategies {
		for _, c := range s.Cases {
			combos += max(1, len(c.Media)) * max(1, len(c.Materials)) * max(1, len(c.Facilities))
		}
	}
	perCombo := float64(st.Points) * bytesPerPoint
	sweep = baseBytes + float64(combos)*perCombo + float64(st.Points)*bytesPerGridPoint
	if st.Axis != "" {
		axis := float64(max(1, st.AxisPoints))
		sweep += float64(combos) * axis * bytesPerAxisValue
	}
	if st.Samples > 0 && len(p.Uncertain) > 0 {
		// Held by each combination being sampled at once (one per core).
		perDraw := float64(bytesPerDraw + 8*len(p.Uncertain))
		draws = perDraw * float64(st.Samples) * float64(min(runtime.GOMAXPROCS(0), max(combos, 1)))
	}
	return sweep, draws, points, combos
}

// checkMemory refuses a sweep that would need more memory than the soft
// limit, with the figure it would need, before the grid is made.
// A sweep beyond max_points is left to buildGrid, which says so.
func (p *Plan) checkMemory(ps *study.Problems) {
	sweep, draws, points, combos := p.memoryNeed()
	st := p.Settings
	if float64(points)*float64(combos) > float64(st.MaxPoints) {
		return
	}
	budget := float64(memoryBudget())
	need := sweep + draws
	if need <= budget {
		return
	}
	if draws > sweep {
		fit := max(0, int(float64(st.Samples)*(budget-sweep)/draws))
		ps.Add(st.Cell("samples"), "the draws of the uncertain inputs would need about %s of memory (%d draws × %d inputs), more than the soft limit of %s with the sweep: reduce samples to at most %d, or raise the limit with GOMEMLIMIT",
			mib(need), st.Samples, len(p.Uncertain), mib(budget), fit)
		return
	}
	ps.Add(st.Cell("points"), "the sweep would need about %s of memory (%d grid points × %d combinations), more than the soft limit of %s: reduce points to at most %d (or axis_points, or the candidates and strategies), or raise the limit with GOMEMLIMIT",
		mib(need), points, combos, mib(budget), max(2, int(float64(st.Points)*(budget-baseBytes)/(need-baseBytes))))
}

func mib(b float64) string {
	return strconv.FormatFloat(math.Ceil(b/(1<<20)), 'f', 0, 64) + " MiB"
}

// checkLimitsFinite evaluates every limit of the study sheet for every
// combination at the ends and the middle of the scale range (and of the
// axis): a margin that is not a finite number (a division by zero, the
// root of a negative number) would close every window, so the limit is
// refused at its expression with the place it fails.
func (p *Plan) checkLimitsFinite(ps *study.Problems) {
	if len(p.Limits) == 0 || len(p.Grid) == 0 {
		return
	}
	bad := map[int]bool{} // limit rows already reported
	us := []float64{math.Log10(p.Grid[0]), math.Log10(p.Grid[len(p.Grid)/2]), math.Log10(p.Grid[len(p.Grid)-1])}
	axes := []float64{math.NaN()}
	if n := len(p.AxisValues); n > 0 {
		axes = []float64{p.AxisValues[0], p.AxisValues[n/2], p.AxisValues[n-1]}
	}
	checked := 0
	for _, s := range p.Strategies {
		for _, c := range s.Cases {
			for _, m := range candidatesOrNil(c.Media) {
				for _, mat := range candidatesOrNil(c.Materials) {
					for _, f := range facilitiesOrNil(c.Facilities) {
						for _, a := range axes {
							if checked++; checked > 2000 {
								return // enough: the rest are alike
							}
							p.checkComboLimits(c, m, mat, f, a, us, bad, ps)
						}
					}
				}
			}
		}
	}
}

func (p *Plan) checkComboLimits(c *PlanCase, m, mat *Candidate2, f *Facility, a float64, us []float64, bad map[int]bool, ps *study.Problems) {
	x, err := p.newCombo(c, m, mat, f, a)
	if err != nil {
		return // the sweep reports it for the combination
	}
	lims, _, err := x.limitsFor()
	if err != nil {
		return
	}
	for _, pl := range p.Limits {
		if bad[pl.Row] {
			continue
		}
		for _, l := range lims {
			if l.lim != pl.Limit {
				continue
			}
			for _, u := range us {
				if v := l.margin(u); !math.IsNaN(v) && !math.IsInf(v, 0) {
					continue
				}
				bad[pl.Row] = true
				where := "kL = " + strconv.FormatFloat(math.Pow(10, u), 'g', 4, 64)
				if !math.IsNaN(a) {
					where += ", " + p.Settings.Axis + " = " + strconv.FormatFloat(a, 'g', 4, 64)
				}
				ps.Add(study.At("Limits", pl.Row, "expression"), "limit %q has no finite value at %s (%s): it divides by zero or takes the root of a negative number there; check the expression and the values it names", pl.Name, where, describeCombo(c, m, mat, f))
				break
			}
			break
		}
	}
}

func describeCombo(c *PlanCase, m, mat *Candidate2, f *Facility) string {
	s := fmt.Sprintf("strategy %q", c.Strategy)
	if c.Case != "" {
		s += fmt.Sprintf(", case %q", c.Case)
	}
	if m != nil || mat != nil {
		s += ", " + describePair(m, mat)
	}
	if f != nil {
		s += fmt.Sprintf(", facility %q", f.Name)
	}
	return s
}
