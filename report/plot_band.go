package report

import (
	"fmt"
	"image/color"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
)

// BandChart is the data behind the band chart of a strategy.
type BandChart struct {
	Strategy, Technique string
	// X holds the kL of the drawn samples: the grid, thinned to
	// DisplayColumns (first and last grid values kept).
	X []float64
	// Rows are the combinations shown, top first: every combination of
	// the strategy in sweep order, then its joint (all-cases) windows.
	Rows []BandRow
	// More counts the combinations left out beyond MaxBandRows.
	More int
}

// BandRow is one combination of a band chart.
type BandRow struct {
	Label string
	Combo *sweep.ComboResult
	// Margin is the combination's margin at X (decades), nil for a row
	// without margins (a joint window, or a combination that failed).
	Margin []float64
	// Edges are the window's edges with the limits that set them.
	Edges []Edge
	Best  bool // the strategy's recommended combination
	// Robust is the window whose scales stay feasible with the study's
	// robust level of probability, nil without uncertain inputs; it is
	// drawn as a dark band under the row.
	Robust sweep.Window
}

// BandData returns the band chart of a strategy.
func BandData(res *sweep.Result, sr *sweep.StrategyResult) BandChart {
	bc := BandChart{Strategy: sr.Name, Technique: sr.Technique}
	grid := res.Plan.Grid
	idx := displayIndices(len(grid))
	bc.X = pick(grid, idx)
	all := append(append([]*sweep.ComboResult(nil), sr.Combos...), sr.Joint...)
	keep := bandRowsKept(all, sr.Best)
	bc.More = len(all) - len(keep)
	for _, i := range keep {
		c := all[i]
		row := BandRow{Label: comboLabel(c), Combo: c, Edges: WindowEdges(c.Window), Best: c == sr.Best}
		if c.Robust != nil {
			row.Robust = c.Robust.Window
		}
		if len(c.Margins) == len(grid) {
			row.Margin = thinMargins(c.Margins, idx)
		}
		bc.Rows = append(bc.Rows, row)
	}
	return bc
}

// bandRowsKept chooses at most MaxBandRows combinations, keeping the
// recommended one and then those with the largest feasible model, then
// those closest to feasible; it returns their indices in sweep order.
func bandRowsKept(all []*sweep.ComboResult, best *sweep.ComboResult) []int {
	idx := make([]int, len(all))
	for i := range idx {
		idx[i] = i
	}
	if len(all) <= MaxBandRows {
		return idx
	}
	peak := func(c *sweep.ComboResult) float64 {
		m := math.Inf(-1)
		for _, v := range c.Margins {
			if v > m {
				m = v
			}
		}
		return m
	}
	sort.SliceStable(idx, func(a, b int) bool {
		ca, cb := all[idx[a]], all[idx[b]]
		if (ca == best) != (cb == best) {
			return ca == best
		}
		fa, fb := !ca.Window.Empty(), !cb.Window.Empty()
		if fa != fb {
			return fa
		}
		if fa {
			return ca.Window.Largest() < cb.Window.Largest()
		}
		return peak(ca) > peak(cb)
	})
	idx = idx[:MaxBandRows]
	sort.Ints(idx)
	return idx
}

// Band chart geometry.
const (
	bandBarW      = 0.95 * vg.Inch // colour-bar strip
	bandFixedH    = 2.1 * vg.Inch  // title, axis and margins
	bandRowH      = 0.36 * vg.Inch
	bandRowHDense = 0.30 * vg.Inch // above 20 rows
)

func bandSize(bc BandChart) (w, h vg.Length) {
	rh := bandRowH
	if len(bc.Rows) > 20 {
		rh = bandRowHDense
	}
	h = bandFixedH + vg.Length(len(bc.Rows))*rh
	if h < 3.6*vg.Inch {
		h = 3.6 * vg.Inch
	}
	return plotWidth, h
}

func drawBand(dc draw.Canvas, res *sweep.Result, bc BandChart) {
	title := fmt.Sprintf("%s: %s (%s), margin to the tightest limit", res.Name, bc.Strategy, Label(bc.Technique))
	feasible := false
	for _, row := range bc.Rows {
		feasible = feasible || !row.Combo.Window.Empty()
	}
	if !feasible {
		title += ": no feasible scale"
	}
	if bc.More > 0 {
		title += fmt.Sprintf(" (+%d more combinations not shown)", bc.More)
	}
	title += "\nblue: feasible, orange: short of a limit; ticks: window edges named by their limit; ▲ recommended scale"
	for _, row := range bc.Rows {
		if row.Combo.Robust != nil {
			title += fmt.Sprintf("\ndark band under a row: scales feasible with a probability of at least %.0f %% when the uncertain inputs vary", 100*row.Combo.Robust.Level)
			break
		}
	}
	p := newPlot(title, bc.X[0], bc.X[len(bc.X)-1])
	n := len(bc.Rows)
	p.Y.Min, p.Y.Max = -0.5, float64(n)-0.5
	var ticks plot.ConstantTicks
	noData := false
	for r, row := range bc.Rows {
		label := row.Label
		if row.Best {
			label += " [recommended]"
		}
		if row.Combo.Err != "" {
			label += " [error]"
		}
		// Row names take two lines of at most a quarter of the width,
		// leaving the scale axis room for its labels.
		label = rowLabel(textStyle(8.5, inkColor), label, plotWidth/4)
		ticks = append(ticks, plot.Tick{Value: float64(n-1-r) + (barLo+barHi)/2, Label: label})
		noData = noData || row.Margin == nil
		for _, m := range row.Margin {
			noData = noData || math.IsNaN(m)
		}
	}
	sort.Slice(ticks, func(i, j int) bool { return ticks[i].Value < ticks[j].Value })
	p.Y.Tick.Marker = ticks
	// The scale axis gets what the row names and the colour bar leave.
	widest := vg.Length(0)
	for _, tk := range ticks {
		widest = max(widest, textStyle(8.5, inkColor).Width(tk.Label))
	}
	if d := math.Log10(bc.X[len(bc.X)-1] / bc.X[0]); d > 0 {
		p.X.Tick.Marker = logTicks{format: scaleLabel, perDecade: (plotWidth - bandBarW - widest - 40) / vg.Length(d)}
	}
	p.Y.Tick.Label.Font.Size = 8.5
	p.Y.Tick.Length = 0
	p.Y.LineStyle.Width = 0
	p.Add(&bandPlotter{chart: bc})
	main, strip := splitRight(inset(dc), bandBarW)
	p.Draw(main)
	// The colour bar sits beside the top of the data area.
	data := p.DataCanvas(main)
	top := data.Max.Y
	bottom := math.Max(float64(data.Min.Y), float64(top-3.4*vg.Inch))
	drawMarginBar(strip, vg.Rectangle{Min: vg.Point{X: strip.Min.X, Y: vg.Length(bottom)}, Max: vg.Point{X: strip.Max.X, Y: top}}, noData)
}

// bandPlotter draws the rows of a band chart.
type bandPlotter struct{ chart BandChart }

// Row geometry in row units (a row is 1 high, centred on its index).
const (
	barLo, barHi   = -0.42, 0.02
	tickLo, tickHi = -0.47, 0.34
	edgeBaseline   = 0.09
)

func (b *bandPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	x := b.chart.X
	n := len(b.chart.Rows)
	// Cell boundaries: geometric midpoints between samples.
	bounds := make([]vg.Length, len(x)+1)
	bounds[0], bounds[len(x)] = trX(x[0]), trX(x[len(x)-1])
	for i := 1; i < len(x); i++ {
		bounds[i] = trX(math.Sqrt(x[i-1] * x[i]))
	}
	rule := draw.LineStyle{Color: ruleColor, Width: 0.5}
	tick := draw.LineStyle{Color: inkColor, Width: 1.3}
	lab := edgeLabeller{c: c, sty: textStyle(8, inkColor), pl: newLabelPlacer(c.Rectangle)}
	for r, row := range b.chart.Rows {
		yc := float64(n - 1 - r)
		if r > 0 {
			c.StrokeLine2(rule, c.Min.X, trY(yc+0.5), c.Max.X, trY(yc+0.5))
		}
		y0, y1 := trY(yc+barLo), trY(yc+barHi)
		box := func(a, b vg.Length, clr color.Color) {
			if b <= a {
				return
			}
			c.FillPolygon(clr, rectPoints(vg.Rectangle{Min: vg.Point{X: a, Y: y0}, Max: vg.Point{X: b, Y: y1}}))
		}
		if row.Margin != nil {
			// Runs of one class are drawn as one rectangle.
			start := 0
			for i := 1; i <= len(row.Margin); i++ {
				if i < len(row.Margin) && MarginClass(row.Margin[i]) == MarginClass(row.Margin[start]) {
					continue
				}
				box(bounds[start], bounds[i], MarginColor(row.Margin[start]))
				start = i
			}
		} else {
			// Without margins only the window is known.
			box(bounds[0], bounds[len(x)], noDataColor)
			for _, iv := range row.Combo.Window {
				a, b := trX(iv.Lo), trX(iv.Hi)
				if b-a < 3 { // a single scale stays visible
					a, b = (a+b)/2-1.5, (a+b)/2+1.5
				}
				box(a, b, MarginColor(0.2))
			}
		}
		c.StrokeLines(draw.LineStyle{Color: faintColor, Width: 0.4}, []vg.Point{
			{X: bounds[0], Y: y0}, {X: bounds[len(x)], Y: y0}, {X: bounds[len(x)], Y: y1}, {X: bounds[0], Y: y1}, {X: bounds[0], Y: y0}})
		for _, iv := range row.Robust {
			yb := trY(yc + barLo - 0.035)
			c.StrokeLine2(draw.LineStyle{Color: inkColor, Width: 2.4}, trX(iv.Lo), yb, trX(iv.Hi), yb)
		}
		for _, e := range row.Edges {
			xe := trX(e.KL)
			c.StrokeLine2(tick, xe, trY(yc+tickLo), xe, trY(yc+tickHi))
			// No edge label may run over a tick.
			lab.pl.avoid(vg.Rectangle{Min: vg.Point{X: xe - 1, Y: trY(yc + tickLo)}, Max: vg.Point{X: xe + 1, Y: trY(yc + tickHi)}})
		}
		lab.taken = lab.taken[:0]
		lab.labelEdges(row.Combo.Window, trX, trY(yc+edgeBaseline))
		if why := row.Combo.Err; why != "" || row.Combo.Window.Empty() {
			if why == "" {
				why = row.Combo.Failing
			}
			if why != "" {
				lab.place(c.Min.X, trY(yc+edgeBaseline), fitText(lab.sty, "no window: "+why, c.Size().X-3*edgeGap), +1, faintColor)
			}
		}
		if k := row.Combo.Recommended; !row.Combo.Window.Empty() && !math.IsNaN(k) && k > 0 {
			c.DrawGlyph(draw.GlyphStyle{Color: inkColor, Radius: 3.2, Shape: draw.PyramidGlyph{}}, vg.Point{X: trX(k), Y: trY(yc+barLo) + 1})
		}
	}
}

func (b *bandPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	x := b.chart.X
	return x[0], x[len(x)-1], -0.5, float64(len(b.chart.Rows)) - 0.5
}

// rowLabel wraps a band-chart row name into at most two lines of width w,
// shortening the second with "…" when the name is longer.
func rowLabel(sty text.Style, s string, w vg.Length) string {
	lines := strings.Split(wrapText(sty, s, w), "\n")
	if len(lines) <= 2 {
		for i := range lines {
			lines[i] = fitText(sty, lines[i], w)
		}
		return strings.Join(lines, "\n")
	}
	return fitText(sty, lines[0], w) + "\n" + fitText(sty, strings.Join(lines[1:], " "), w)
}
