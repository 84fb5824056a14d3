package sweep

import (
	"math"
	"strconv"

	"scaleplan/sweep/study"
)

func (p *Plan) buildGrid(ps *study.Problems) {
	st := p.Settings
	total := st.Points
	if st.Axis != "" {
		total *= st.AxisPoints
	}
	combos := 0
	for _, s := range p.Strategies {
		for _, c := range s.Cases {
			combos += max(1, len(c.Media)) * max(1, len(c.Materials)) * max(1, len(c.Facilities))
		}
	}
	if n := float64(total) * float64(combos); n > float64(st.MaxPoints) {
		ps.Add(st.Cell("points"), "the sweep has %.3g points (%d grid points × %d combinations), more than %d: %s", n, total, combos, st.MaxPoints, tooManyPoints(n))
		return
	}
	p.Grid = geomGrid(st.ScaleFrom, st.ScaleTo, st.Points)
	if st.Axis != "" {
		from, to := st.AxisUnit.ToSI(st.AxisFrom), st.AxisUnit.ToSI(st.AxisTo)
		if st.AxisLinear {
			p.AxisValues = make([]float64, st.AxisPoints)
			for i := range p.AxisValues {
				p.AxisValues[i] = from + (to-from)*float64(i)/float64(st.AxisPoints-1)
			}
		} else {
			p.AxisValues = geomGrid(from, to, st.AxisPoints)
		}
	}
}

// geomGrid returns n log-spaced values from a to b, stepped by
// multiplication, with the end points exact.
func geomGrid(a, b float64, n int) []float64 {
	g := make([]float64, n)
	r := math.Pow(b/a, 1/float64(n-1))
	x := a
	for i := range g {
		g[i] = x
		x *= r
	}
	g[n-1] = b
	return g
}

// rangeMiddle is the geometric middle of a tunable range written as two
// numbers with the same unit, as text; the bounds as given when either is
// not a bare positive number (the range check then names the cell).
func rangeMiddle(lo, hi string) string {
	a, errA := strconv.ParseFloat(lo, 64)
	b, errB := strconv.ParseFloat(hi, 64)
	if errA != nil || errB != nil || !(a > 0) || !(b > 0) {
		return lo
	}
	return strconv.FormatFloat(math.Sqrt(a*b), 'g', 6, 64)
}
