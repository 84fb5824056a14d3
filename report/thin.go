package report

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
)

// Maps are drawn at display resolution: a margin series is reduced to
// about one sample per pixel column before drawing, whatever the size of
// the sweep's grid. The exact window edges do not come from the thinned
// samples: the band chart marks them with ticks at their exact scales,
// the contour map traces them across the second axis (windowEdgeLines),
// and the workbook keeps every grid point.

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
		a, b := i, len(vals)
		if k > 0 {
			a = (idx[k-1] + i + 1) / 2
		}
		if k < len(idx)-1 {
			b = (i + idx[k+1] + 1) / 2
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

// EdgeLine is a window edge of a two-axis map traced across the second
// axis: the exact kL of the edge at each axis value Y it is drawn at.
type EdgeLine struct {
	Limit string
	KL, Y []float64
}

// windowEdgeLines traces the exact window edges of a combination across
// the axis values at indices yi: the n-th interval's large-model and
// small-model edges each make a line, broken where an axis value has no
// such interval or another limit sets the edge. Edges set by the sweep's
// own range are left out (they are the map's border).
func windowEdgeLines(windows []sweep.Window, axis []float64, yi []int) []EdgeLine {
	if len(windows) != len(axis) {
		return nil
	}
	var out []EdgeLine
	for side := 0; side < 2; side++ {
		for k := 0; ; k++ {
			more := false
			var cur *EdgeLine
			for _, j := range yi {
				if k >= len(windows[j]) {
					cur = nil
					continue
				}
				more = true
				iv := windows[j][k]
				kl, lim := iv.Lo, iv.LoLimit
				if side == 1 {
					kl, lim = iv.Hi, iv.HiLimit
				}
				if lim == sweep.RangeLimit || (cur != nil && cur.Limit != lim) {
					cur = nil
				}
				if lim == sweep.RangeLimit {
					continue
				}
				if cur == nil {
					out = append(out, EdgeLine{Limit: lim})
					cur = &out[len(out)-1]
				}
				cur.KL = append(cur.KL, kl)
				cur.Y = append(cur.Y, axis[j])
			}
			if !more {
				break
			}
		}
	}
	return out
}

// edgeLinesPlotter strokes the exact window edges of a contour map as
// white dashes (over the bold zero contour where the two agree).
type edgeLinesPlotter struct{ lines []EdgeLine }

func (e edgeLinesPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	sty := draw.LineStyle{Color: color.White, Width: 0.9, Dashes: []vg.Length{4, 3}}
	for _, l := range e.lines {
		pts := make([]vg.Point, len(l.KL))
		for i := range l.KL {
			pts[i] = vg.Point{X: trX(l.KL[i]), Y: trY(l.Y[i])}
		}
		if len(pts) == 1 {
			c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 1.2, Shape: draw.CircleGlyph{}}, pts[0])
			continue
		}
		c.StrokeLines(sty, c.ClipLinesXY(pts)...)
	}
}
