package report

import "math"

// Maps are drawn at display resolution: a margin series is reduced to
// about one sample per pixel column before drawing, whatever the size of
// the sweep's grid. The exact window edges do not come from the thinned
// samples: the band chart marks them with ticks at their exact scales,
// and the sweep keeps every grid point for the workbook.

// DisplayColumns is the most samples a band chart or contour map keeps
// along one axis: about one per pixel of the data area (a 9-inch map at
// 120 dots per inch, less its labels and colour bar).
const DisplayColumns = 800

// displayIndices returns at most DisplayColumns indices into n points,
// evenly spread, with the first and the last.
func displayIndices(n int) []int { return sampleIndices(n, DisplayColumns) }

// thinMargins reduces a margin series to the samples idx: each sample
// stands for the points nearest to it and takes their smallest margin,
// so thinning never hides an infeasible point (a feasible stretch
// narrower than a sample still shows by its exact edge ticks). NaN (no
// data) counts only where a sample has nothing else.
func thinMargins(vals []float64, idx []int) []float64 {
	return bucketReduce(vals, idx, func(v, m float64) bool { return v < m })
}

// bucketReduce gives each sample of idx the value of the points nearest
// to it that wins by better (NaN ignored unless every point is NaN).
func bucketReduce(vals []float64, idx []int, better func(v, m float64) bool) []float64 {
	out := make([]float64, len(idx))
	for k, i := range idx {
		a, b := i, i+1
		if k > 0 {
			a = (idx[k-1] + i + 1) / 2
		}
		if k < len(idx)-1 {
			b = (i + idx[k+1] + 1) / 2
		} else {
			b = len(vals)
		}
		m := math.NaN()
		for j := a; j < b && j < len(vals); j++ {
			if v := vals[j]; !math.IsNaN(v) && (math.IsNaN(m) || better(v, m)) {
				m = v
			}
		}
		out[k] = m
	}
	return out
}
