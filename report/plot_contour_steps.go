package report

import (
	"math"
	"sort"

	"scaleplan/sweep"
)

// The steps of ContourData, in the order it takes them.

// contourCombo picks the combination a strategy's contour map shows and
// its margin rows: the recommended one when it has axis data, else the one
// whose margin peaks highest. It returns nil when none has two-axis data.
func contourCombo(p *sweep.Plan, sr *sweep.StrategyResult) (*sweep.ComboResult, [][]float64) {
	// The margin rows are computed on demand, for the combinations drawn.
	rowsOf := func(c *sweep.ComboResult) [][]float64 {
		if c == nil {
			return nil
		}
		rows := c.AxisMarginRows()
		if len(rows) < 2 || len(rows) != len(p.AxisValues) {
			return nil
		}
		for _, row := range rows {
			if len(row) != len(p.Grid) {
				return nil
			}
		}
		return rows
	}
	var pickC *sweep.ComboResult
	pickRows := rowsOf(sr.Best)
	if pickRows != nil {
		pickC = sr.Best
	} else {
		// The combination that comes closest to feasible; its rows are
		// swept again only once it is chosen.
		bestPeak := math.Inf(-1)
		for _, c := range sr.Combos {
			if c == nil || len(c.AxisWindows) < 2 && len(c.AxisMargins) < 2 {
				continue
			}
			if pk := c.AxisMarginPeak(); pickC == nil || pk > bestPeak {
				pickC, bestPeak = c, pk
			}
		}
		if pickRows = rowsOf(pickC); pickRows == nil {
			pickC = nil
		}
	}
	return pickC, pickRows
}

// thinMarginGrid thins the margin rows to the displayed columns xi and
// rows yi.
func thinMarginGrid(pickRows [][]float64, xi, yi []int) [][]float64 {
	// Thin the rows like the columns: each kept row takes the smallest
	// margin of the rows it stands for.
	cols := make([][]float64, len(pickRows))
	for j, row := range pickRows {
		cols[j] = thinMargins(row, xi)
	}
	z := make([][]float64, len(yi))
	for j := range z {
		z[j] = make([]float64, len(xi))
	}
	col := make([]float64, len(cols))
	for i := range xi {
		for j := range cols {
			col[j] = cols[j][i]
		}
		for j, v := range thinMargins(col, yi) {
			z[j][i] = v
		}
	}
	return z
}

// marginLevels returns the margin class edges strictly inside the range of
// z, and margin 0 always.
func marginLevels(z [][]float64) []float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, row := range z {
		for _, v := range row {
			v = clampMargin(v)
			if !math.IsNaN(v) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	var levels []float64
	for _, e := range MarginEdges {
		if e == 0 || (e > lo && e < hi) {
			levels = append(levels, e)
		}
	}
	return levels
}

// isoMeasures returns the study's measures of combination c over the
// displayed grid, by name, each with its iso-line levels; measures without
// a level inside their range are left out.
func isoMeasures(p *sweep.Plan, c *sweep.ComboResult, xi, yi []int) []IsoMeasure {
	measures := c.AxisMeasureRows()
	names := make([]string, 0, len(measures))
	for n := range measures {
		names = append(names, n)
	}
	sort.Strings(names)
	units := map[string]string{}
	for _, m := range p.Measures {
		units[m.Name] = m.Unit.Text
	}
	var iso []IsoMeasure
	for _, n := range names {
		rows := measures[n]
		if len(rows) != len(p.AxisValues) {
			continue
		}
		im := IsoMeasure{Name: n, Unit: units[n], LogZ: make([][]float64, len(yi))}
		mlo, mhi := math.Inf(1), math.Inf(-1)
		for j, yj := range yi {
			im.LogZ[j] = make([]float64, len(xi))
			for i, xk := range xi {
				v := rows[yj][xk]
				if v > 0 && !math.IsInf(v, 0) {
					im.LogZ[j][i] = math.Log10(v)
					mlo, mhi = math.Min(mlo, im.LogZ[j][i]), math.Max(mhi, im.LogZ[j][i])
				} else {
					im.LogZ[j][i] = math.NaN()
				}
			}
		}
		im.Levels = isoLevels(mlo, mhi)
		if len(im.Levels) > 0 {
			iso = append(iso, im)
		}
	}
	return iso
}

// isoLevels returns the iso-line values for a measure whose log10 spans
// (mlo, mhi).
func isoLevels(mlo, mhi float64) []float64 {
	var levels []float64
	// Iso-lines at 1, 2 and 5 times the powers of ten inside the range,
	// at most three of them.
	for d := math.Floor(mlo); d <= math.Ceil(mhi); d++ {
		for _, k := range []float64{1, 2, 5} {
			if l := d + math.Log10(k); l > mlo && l < mhi {
				levels = append(levels, math.Pow(10, l))
			}
		}
	}
	for len(levels) > 3 {
		var kept []float64
		for i := 0; i < len(levels); i += 2 {
			kept = append(kept, levels[i])
		}
		levels = kept
	}
	return levels
}
