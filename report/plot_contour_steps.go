package report

import (
	"math"
	"slices"
	"sort"

	"scaleplan/sweep"
)

// The steps of ContourData, in the order it takes them.

// contourCombo picks the combination a strategy's contour map shows and
// its margin rows thinned to the displayed columns xi: the recommended one
// when it has axis data, else the one whose margin peaks highest. It
// returns nil when none has two-axis data. Each row is thinned as it is
// swept, so the map holds axis values × displayed columns, not the grid.
func contourCombo(p *sweep.Plan, sr *sweep.StrategyResult, xi []int) (*sweep.ComboResult, [][]float64) {
	rowsOf := func(c *sweep.ComboResult) [][]float64 {
		if c == nil || len(p.AxisValues) < 2 {
			return nil
		}
		rows := make([][]float64, len(p.AxisValues))
		ok := true
		done := c.EachAxisMarginRow(func(i int, row []float64) {
			if i >= len(rows) || len(row) != len(p.Grid) {
				ok = false
				return
			}
			rows[i] = thinMargins(row, xi)
		})
		for _, r := range rows {
			ok = ok && r != nil
		}
		if !done || !ok {
			return nil
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

// thinMarginGrid thins margin rows already thinned to the displayed
// columns to the displayed rows yi: each kept row takes the smallest
// margin of the rows it stands for.
func thinMarginGrid(cols [][]float64, yi []int) [][]float64 {
	nx := 0
	if len(cols) > 0 {
		nx = len(cols[0])
	}
	z := make([][]float64, len(yi))
	for j := range z {
		z[j] = make([]float64, nx)
	}
	col := make([]float64, len(cols))
	for i := range nx {
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
	// Each measure's rows, picked at the displayed columns as they are
	// swept.
	measures := map[string][][]float64{}
	c.EachAxisMeasureRow(func(i int, rows map[string][]float64) {
		for n, row := range rows {
			if len(row) != len(p.Grid) {
				continue
			}
			if measures[n] == nil {
				measures[n] = make([][]float64, len(p.AxisValues))
			}
			if i < len(p.AxisValues) {
				measures[n][i] = pick(row, xi)
			}
		}
	})
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
		if slices.ContainsFunc(rows, func(r []float64) bool { return r == nil }) {
			continue
		}
		im := IsoMeasure{Name: n, Unit: units[n], LogZ: make([][]float64, len(yi))}
		mlo, mhi := math.Inf(1), math.Inf(-1)
		for j, yj := range yi {
			im.LogZ[j] = make([]float64, len(xi))
			for i := range xi {
				v := rows[yj][i]
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

// The steps of isolines.

// isoSeg is a piece of a contour line across one grid cell, from edge a to
// edge b (edge ids as in cellSegments).
type isoSeg struct{ a, b int }

// cellSegments marches the squares of the nx × ny grid z and returns the
// segments where z crosses level, cell by cell in the order of the grid.
func cellSegments(z [][]float64, nx, ny int, level float64) []isoSeg {
	// Edge ids: 2·(j·nx+i) for the edge from (i,j) to (i+1,j), and
	// 2·(j·nx+i)+1 for the edge from (i,j) to (i,j+1).
	hEdge := func(i, j int) int { return 2 * (j*nx + i) }
	vEdge := func(i, j int) int { return 2*(j*nx+i) + 1 }
	var segs []isoSeg
	for j := 0; j < ny-1; j++ {
		for i := 0; i < nx-1; i++ {
			z00, z10, z11, z01 := z[j][i], z[j][i+1], z[j+1][i+1], z[j+1][i]
			if math.IsNaN(z00) || math.IsNaN(z10) || math.IsNaN(z11) || math.IsNaN(z01) {
				continue
			}
			in := func(x float64) int {
				if x >= level {
					return 1
				}
				return 0
			}
			code := in(z00) | in(z10)<<1 | in(z11)<<2 | in(z01)<<3
			bottom, right, top, left := hEdge(i, j), vEdge(i+1, j), hEdge(i, j+1), vEdge(i, j)
			switch code {
			case 0, 15:
			case 1, 14:
				segs = append(segs, isoSeg{left, bottom})
			case 2, 13:
				segs = append(segs, isoSeg{bottom, right})
			case 3, 12:
				segs = append(segs, isoSeg{left, right})
			case 4, 11:
				segs = append(segs, isoSeg{right, top})
			case 6, 9:
				segs = append(segs, isoSeg{bottom, top})
			case 7, 8:
				segs = append(segs, isoSeg{left, top})
			case 5, 10:
				centre := (z00 + z10 + z11 + z01) / 4
				// Corners 00 and 11 agree; the centre says whether they
				// join across the cell.
				joined := (centre >= level) == (code == 5)
				if joined {
					segs = append(segs, isoSeg{left, top}, isoSeg{bottom, right})
				} else {
					segs = append(segs, isoSeg{left, bottom}, isoSeg{right, top})
				}
			}
		}
	}
	return segs
}

// joinSegments joins the segments end to end into lines, each given by
// the edges it passes, in the order of the segments.
func joinSegments(segs []isoSeg) [][]int {
	at := map[int][]int{}
	for k, s := range segs {
		at[s.a] = append(at[s.a], k)
		at[s.b] = append(at[s.b], k)
	}
	used := make([]bool, len(segs))
	next := func(edge, from int) (int, bool) {
		for _, k := range at[edge] {
			if k != from && !used[k] {
				return k, true
			}
		}
		return 0, false
	}
	var lines [][]int
	for k := range segs {
		if used[k] {
			continue
		}
		used[k] = true
		// walk follows the segments joined end to end from edge e of
		// segment k and returns the edges it passes.
		walk := func(e int) []int {
			var out []int
			for cur := k; ; {
				n, ok := next(e, cur)
				if !ok {
					return out
				}
				used[n] = true
				if segs[n].a == e {
					e = segs[n].b
				} else {
					e = segs[n].a
				}
				out = append(out, e)
				cur = n
			}
		}
		fwd := append([]int{segs[k].a, segs[k].b}, walk(segs[k].b)...)
		back := walk(segs[k].a)
		ids := make([]int, 0, len(back)+len(fwd))
		for b := len(back) - 1; b >= 0; b-- {
			ids = append(ids, back[b])
		}
		ids = append(ids, fwd...)
		lines = append(lines, ids)
	}
	return lines
}
