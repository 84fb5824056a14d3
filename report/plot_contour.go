package report

import (
	"fmt"
	"image"
	"image/color"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/feasibility"
	"scaleplan/sweep"
)

// ContourMap is the data behind the contour map of a two-axis sweep: the
// margin of one combination over scale and the second axis.
type ContourMap struct {
	Strategy string
	Label    string
	Combo    *sweep.ComboResult
	// X holds kL (the grid, thinned to DisplayColumns) and Y the second
	// axis values in SI (thinned likewise).
	X, Y []float64
	// Z[j][i] is the margin (decades) at Y[j], X[i].
	Z [][]float64
	// Levels are the contour levels drawn: the palette edges within the
	// range of Z, and always 0 (drawn bold).
	Levels []float64
	// Axis names the second axis and Unit gives its SI unit ("" when
	// dimensionless); YLog is set for a log-spaced axis.
	Axis, Unit string
	YLog       bool
	// Iso are the study's measures drawn as iso-lines (dotted), each with
	// log10 of its value on the same points as Z and the values drawn.
	Iso []IsoMeasure
	// Edges are the window's exact edges traced across the axis (white
	// dashes).
	Edges []EdgeLine
}

// IsoMeasure is a study measure over the contour map.
type IsoMeasure struct {
	Name, Unit string
	LogZ       [][]float64 // log10 of the measure, Z's shape
	Levels     []float64   // values (not logs) of the iso-lines
}

// ContourData returns the contour map of a strategy, or nil when it has no
// two-axis data. One combination is mapped per strategy: the recommended
// one when it has axis data, else the one whose margin peaks highest.
func ContourData(res *sweep.Result, sr *sweep.StrategyResult) *ContourMap {
	p := res.Plan
	xi := displayIndices(len(p.Grid))
	yi := displayIndices(len(p.AxisValues))
	pickC, pickRows := contourCombo(p, sr, xi)
	if pickC == nil {
		return nil
	}
	cm := &ContourMap{Strategy: sr.Name, Label: comboLabel(pickC), Combo: pickC,
		X: pick(p.Grid, xi), Y: pick(p.AxisValues, yi), Axis: p.Settings.Axis, Unit: axisUnit(p),
		YLog: !p.Settings.AxisLinear}
	for _, v := range cm.Y {
		cm.YLog = cm.YLog && v > 0
	}
	cm.Edges = windowEdgeLines(pickC.AxisWindows, p.AxisValues, yi)
	cm.Z = thinMarginGrid(pickRows, yi)
	cm.Levels = marginLevels(cm.Z)
	cm.Iso = isoMeasures(p, pickC, xi, yi)
	return cm
}

// isFreeChoiceAxis reports whether the second axis sweeps a free choice:
// its values are then scale factors, not physical values.
func isFreeChoiceAxis(p *sweep.Plan) bool {
	for _, st := range p.Strategies {
		for _, c := range st.Cases {
			for _, f := range c.Solution.Free {
				if f == p.Settings.Axis {
					return true
				}
			}
		}
	}
	return false
}

// axisUnit is the SI unit of the second axis.
func axisUnit(p *sweep.Plan) string {
	ax := p.Settings.Axis
	unit := ""
	if isFreeChoiceAxis(p) {
		return "k = prototype/model"
	}
	if ax == "salinity" {
		unit = "kg/kg"
	} else if q, err := feasibility.LookupQuantity(ax); err == nil {
		unit = q.SI
	} else if p.Catalog != nil {
		for _, f := range p.Facilities {
			if cp, ok := p.Catalog.Capability(f.Type, ax); ok {
				unit = cp.Unit
				break
			}
		}
	}
	if unit == "" && !p.Settings.AxisUnit.Dim.IsDimensionless() {
		unit = p.Settings.AxisUnit.Dim.String()
	}
	if unit == "1" {
		unit = ""
	}
	return unit
}

// clampMargin bounds a margin for contouring: ±Inf (a condition that
// cannot hold) becomes ±10 decades, beyond every level.
func clampMargin(v float64) float64 {
	return math.Max(-10, math.Min(10, v))
}

const (
	contourHeight = 6 * vg.Inch
	contourBarW   = 0.95 * vg.Inch
)

func drawContour(dc draw.Canvas, res *sweep.Result, cm *ContourMap) {
	title := fmt.Sprintf("%s: %s, margin over scale and %s\n%s; bold line: margin 0, the edge of the feasible region; dot: recommended point",
		res.Name, cm.Strategy, cm.Axis, clip(cm.Label, 80))
	if cm.Combo.Window.Empty() {
		// No window anywhere: the map shows the combination that comes
		// closest, and has neither an edge nor a recommended point.
		title = fmt.Sprintf("%s: %s, margin over scale and %s\n%s, the combination that comes closest: no scale is feasible at any %s",
			res.Name, cm.Strategy, cm.Axis, clip(cm.Label, 80), cm.Axis)
	}
	if len(cm.Iso) > 0 {
		title += "\ndotted: iso-lines of the study's measures at model scale, each labelled with its value"
	}
	if len(cm.Edges) > 0 {
		title += "\nwhite dashes: the window's edges at their exact scales"
	}
	p := newPlot(title, cm.X[0], cm.X[len(cm.X)-1])
	p.Y.Label.Text = cm.Axis
	if cm.Unit == "k = prototype/model" {
		p.Y.Label.Text = cm.Axis + " scale"
	}
	if cm.Unit != "" {
		p.Y.Label.Text += " [" + cm.Unit + "]"
	}
	ylo, yhi := cm.Y[0], cm.Y[len(cm.Y)-1]
	if !(yhi > ylo) {
		ylo, yhi = ylo-1, yhi+1
	}
	p.Y.Min, p.Y.Max = ylo, yhi
	if cm.YLog {
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = logTicks{format: plainNumber}
	}
	p.Add(&contourPlotter{cm: cm}, edgeLinesPlotter{cm.Edges})
	main, strip := splitRight(inset(dc), contourBarW)
	p.Draw(main)
	data := p.DataCanvas(main)
	noData := false
	for _, row := range cm.Z {
		for _, v := range row {
			noData = noData || math.IsNaN(v)
		}
	}
	bottom := math.Max(float64(data.Min.Y), float64(data.Max.Y-3.4*vg.Inch))
	drawMarginBar(strip, vg.Rectangle{Min: vg.Point{X: strip.Min.X, Y: vg.Length(bottom)}, Max: vg.Point{X: strip.Max.X, Y: data.Max.Y}}, noData)
}

// contourPlotter fills the margin classes (a raster, bilinear between
// grid points) and strokes the contour lines on top.
type contourPlotter struct{ cm *ContourMap }

func (cp *contourPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	cm := cp.cm
	return cm.X[0], cm.X[len(cm.X)-1], cm.Y[0], cm.Y[len(cm.Y)-1]
}

func (cp *contourPlotter) coords() (u, v []float64) {
	cm := cp.cm
	u = make([]float64, len(cm.X))
	for i, x := range cm.X {
		u[i] = math.Log10(x)
	}
	v = make([]float64, len(cm.Y))
	for j, y := range cm.Y {
		v[j] = y
		if cm.YLog {
			v[j] = math.Log10(y)
		}
	}
	return u, v
}

func (cp *contourPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	cm := cp.cm
	u, v := cp.coords()
	z := make([][]float64, len(cm.Z))
	for j, row := range cm.Z {
		z[j] = make([]float64, len(row))
		for i, m := range row {
			z[j][i] = clampMargin(m)
		}
	}
	cp.fill(c, plt, u, v, z)
	trX, trY := plt.Transforms(&c)
	toCanvas := func(line []contourPoint) []vg.Point {
		pts := make([]vg.Point, len(line))
		for k, q := range line {
			y := q.v
			if cm.YLog {
				y = math.Pow(10, y)
			}
			pts[k] = vg.Point{X: trX(math.Pow(10, q.u)), Y: trY(y)}
		}
		return pts
	}
	thin := draw.LineStyle{Color: color.NRGBA{0x30, 0x30, 0x30, 0xFF}, Width: 0.6}
	bold := draw.LineStyle{Color: color.Black, Width: 2.4}
	for _, lvl := range cm.Levels {
		sty := thin
		if lvl == 0 {
			continue
		}
		for _, line := range isolines(u, v, z, lvl) {
			c.StrokeLines(sty, toCanvas(line))
		}
	}
	for _, line := range isolines(u, v, z, 0) {
		c.StrokeLines(bold, toCanvas(line))
	}
	// Iso-lines of the study's measures, dotted, each labelled where its
	// label fits: inside the map, clear of the other labels and of the
	// recommended point.
	pl := newLabelPlacer(c.Rectangle)
	rec := vg.Point{X: -1e9, Y: -1e9}
	if k, a := cm.Combo.Recommended, cm.Combo.Axis; !math.IsNaN(k) && !math.IsNaN(a) {
		rec = vg.Point{X: trX(k), Y: trY(a)}
		pl.avoid(vg.Rectangle{Min: vg.Point{X: rec.X - 6, Y: rec.Y - 6}, Max: vg.Point{X: rec.X + 6, Y: rec.Y + 6}})
	}
	cp.measureLines(c, pl, u, v, toCanvas)
	if rec.X > -1e9 {
		c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 5, Shape: draw.CircleGlyph{}}, rec)
		c.DrawGlyph(draw.GlyphStyle{Color: color.Black, Radius: 3.5, Shape: draw.CircleGlyph{}}, rec)
	}
}

// fill paints the margin classes of the clamped margins z over the data
// canvas, bilinear between the grid points at coordinates u, v.
func (cp *contourPlotter) fill(c draw.Canvas, plt *plot.Plot, u, v []float64, z [][]float64) {
	cm := cp.cm
	// The fill, at the resolution of the output (at least 2 px per point
	// for vector formats).
	size := c.Size()
	dpi := 144.0
	if d, ok := c.Canvas.(interface{ DPI() float64 }); ok {
		dpi = math.Max(d.DPI(), dpi)
	}
	scale := dpi / 72
	w := int(math.Min(2400, math.Ceil(float64(size.X)*scale)))
	h := int(math.Min(2400, math.Ceil(float64(size.Y)*scale)))
	if w > 0 && h > 0 {
		img := image.NewNRGBA(image.Rect(0, 0, w, h))
		ulo, uhi := u[0], u[len(u)-1]
		vlo, vhi := v[0], v[len(v)-1]
		if !cm.YLog {
			vlo, vhi = plt.Y.Min, plt.Y.Max
		}
		ci, cw := cellWeights(u, ulo, uhi, w)
		rj, rw := cellWeights(v, vlo, vhi, h)
		for py := 0; py < h; py++ {
			jr := h - 1 - py // image rows run top down
			j, b := rj[jr], rw[jr]
			for px := 0; px < w; px++ {
				i, a := ci[px], cw[px]
				m := bilinear(z, i, j, a, b)
				img.SetNRGBA(px, py, MarginColor(m))
			}
		}
		c.DrawImage(c.Rectangle, img)
	}
}

// measureLines strokes the dotted iso-lines of the study's measures and
// places their labels with pl; toCanvas maps a line onto the canvas.
func (cp *contourPlotter) measureLines(c draw.Canvas, pl *labelPlacer, u, v []float64, toCanvas func([]contourPoint) []vg.Point) {
	cm := cp.cm
	isoSty := draw.LineStyle{Color: color.NRGBA{0x20, 0x20, 0x20, 0xFF}, Width: 1, Dashes: []vg.Length{1.5, 2.5}}
	lab := textStyle(8, color.NRGBA{0x20, 0x20, 0x20, 0xFF})
	for _, im := range cm.Iso {
		for _, lvl := range im.Levels {
			txt := fmt.Sprintf("%s %s %s", Label(im.Name), HumanNumber(lvl), im.Unit)
			w, h := lab.Width(txt), lab.Height(txt)
			for _, line := range isolines(u, v, im.LogZ, math.Log10(lvl)) {
				pts := toCanvas(line)
				if len(pts) < 2 {
					continue
				}
				c.StrokeLines(isoSty, pts)
				var corners []vg.Point
				for _, f := range []float64{0.5, 0.35, 0.65, 0.2, 0.8, 0.1, 0.9} {
					corners = append(corners, around(pts[int(f*float64(len(pts)-1))], w, h, 2)...)
				}
				pl.place(c, lab, txt, corners, true)
			}
		}
	}
}

// cellWeights maps n pixel centres spread over [lo, hi] onto the sample
// coordinates s: the index of the sample at or before each pixel and the
// weight of the next one.
func cellWeights(s []float64, lo, hi float64, n int) ([]int, []float64) {
	idx := make([]int, n)
	wt := make([]float64, n)
	for p := 0; p < n; p++ {
		t := lo + (float64(p)+0.5)/float64(n)*(hi-lo)
		i := sort.SearchFloat64s(s, t) - 1
		switch {
		case i < 0:
			i, wt[p] = 0, 0
		case i >= len(s)-1:
			i, wt[p] = len(s)-2, 1
		default:
			wt[p] = (t - s[i]) / (s[i+1] - s[i])
		}
		idx[p] = i
	}
	return idx, wt
}

func bilinear(z [][]float64, i, j int, a, b float64) float64 {
	z00, z10 := z[j][i], z[j][i+1]
	z01, z11 := z[j+1][i], z[j+1][i+1]
	return (1-b)*((1-a)*z00+a*z10) + b*((1-a)*z01+a*z11)
}

// contourPoint is a point of a contour line in (log10 kL, axis) space.
type contourPoint struct{ u, v float64 }

// isolines traces the lines where z crosses level by marching squares,
// with linear interpolation along cell edges (the same as the bilinear
// fill) and saddles settled by the cell's mean. Segments are joined into
// lines in the order of the grid, so the result is deterministic.
func isolines(u, v []float64, z [][]float64, level float64) [][]contourPoint {
	nx, ny := len(u), len(v)
	if nx < 2 || ny < 2 {
		return nil
	}
	point := map[int]contourPoint{}
	cross := func(id int) contourPoint {
		if q, ok := point[id]; ok {
			return q
		}
		k := id / 2
		i, j := k%nx, k/nx
		var q contourPoint
		if id%2 == 0 {
			t := (level - z[j][i]) / (z[j][i+1] - z[j][i])
			q = contourPoint{u[i] + t*(u[i+1]-u[i]), v[j]}
		} else {
			t := (level - z[j][i]) / (z[j+1][i] - z[j][i])
			q = contourPoint{u[i], v[j] + t*(v[j+1]-v[j])}
		}
		point[id] = q
		return q
	}
	var lines [][]contourPoint
	for _, ids := range joinSegments(cellSegments(z, nx, ny, level)) {
		line := make([]contourPoint, len(ids))
		for m, id := range ids {
			line[m] = cross(id)
		}
		lines = append(lines, line)
	}
	return lines
}
