package report

import (
	"fmt"
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
)

// costCurve is the campaign cost of a combination at every grid point
// (NaN where it cannot be evaluated), or nil without costs. The maps read
// sweep.ComboResult.CostCurve only through this accessor, the one place
// to change should the field move or be renamed.
func costCurve(c *sweep.ComboResult) []float64 { return c.CostCurve }

// CostSeries is the data behind the cost plot of a strategy: the campaign
// cost across the scale range of one combination, with its window.
type CostSeries struct {
	Strategy string
	Label    string
	Combo    *sweep.ComboResult
	// X holds kL (the grid, thinned to MaxPlotPoints by picking grid
	// points) and Cost the cost there (NaN where unavailable).
	X, Cost  []float64
	Window   sweep.Window
	Currency string
}

// CostData returns the cost plot of a strategy, or nil when no
// combination has a cost curve. It shows the recommended combination when
// it has costs (a joint window has none of its own), else the combination
// with the largest feasible model among those with costs.
func CostData(res *sweep.Result, sr *sweep.StrategyResult) *CostSeries {
	grid := res.Plan.Grid
	has := func(c *sweep.ComboResult) bool {
		if c == nil {
			return false
		}
		cc := costCurve(c)
		if len(cc) != len(grid) {
			return false
		}
		for _, v := range cc {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				return true
			}
		}
		return false
	}
	var pickC *sweep.ComboResult
	if has(sr.Best) {
		pickC = sr.Best
	} else {
		for _, c := range sr.Combos {
			if !has(c) || c.Window.Empty() {
				continue
			}
			if pickC == nil || c.Window.Largest() < pickC.Window.Largest() {
				pickC = c
			}
		}
	}
	if pickC == nil {
		return nil
	}
	idx := sampleIndices(len(grid), MaxPlotPoints)
	return &CostSeries{Strategy: sr.Name, Label: comboLabel(pickC), Combo: pickC,
		X: pick(grid, idx), Cost: pick(costCurve(pickC), idx), Window: pickC.Window,
		Currency: res.Plan.Settings.Currency}
}

const costHeight = 5.5 * vg.Inch

var (
	costInColor  = color.NRGBA{0x0D, 0x34, 0x66, 0xFF} // darkest feasible blue
	costOutColor = color.NRGBA{0x80, 0x80, 0x80, 0xFF}
	windowShade  = color.NRGBA{0xC9, 0xE1, 0xF5, 0xFF} // palette class 0 … 0.1
)

func drawCost(dc draw.Canvas, res *sweep.Result, cs *CostSeries) {
	title := fmt.Sprintf("%s: %s, campaign cost against scale\n%s; shaded: feasible window, named by the limit at each edge",
		res.Name, cs.Strategy, clip(cs.Label, 80))
	p := newPlot(title, cs.X[0], cs.X[len(cs.X)-1])
	cur := cs.Currency
	p.Y.Label.Text = "campaign cost"
	if cur != "" {
		p.Y.Label.Text += " [" + cur + "]"
	}
	costYAxis(p, cs.Cost)
	pl := &labelPlacer{}
	shade := &windowPlotter{window: cs.Window, pl: pl}
	p.Add(shade)
	in, out := costRuns(cs)
	firstIn, firstOut := addCostLines(p, in, out)
	marks := &costMarks{series: cs, currency: cur, pl: pl}
	p.Add(marks)
	var legend []legendEntry
	if firstIn != nil {
		legend = append(legend, legendEntry{"cost in the window", firstIn})
	}
	if firstOut != nil {
		legend = append(legend, legendEntry{"cost outside it", firstOut})
	}
	legend = append(legend, legendEntry{"feasible window", shade})
	if marks.hasRecommended() {
		legend = append(legend, legendEntry{"recommended scale", glyphThumb{draw.PyramidGlyph{}}})
	}
	if marks.hasCheapest() {
		legend = append(legend, legendEntry{"cheapest feasible scale", glyphThumb{draw.RingGlyph{}}})
	}
	area := inset(dc)
	rows := legendRows(legend, area.Size().X)
	h := vg.Length(len(rows)) * legendRowH
	p.Draw(draw.Crop(area, 0, 0, h, 0))
	for i, row := range rows {
		top := h - vg.Length(i)*legendRowH
		drawLegendRow(draw.Crop(area, 0, 0, top-legendRowH, top-area.Size().Y), row)
	}
}

// costYAxis sets the cost axis's range, scale and ticks from the finite
// costs: logarithmic when they span more than a factor of 20.
func costYAxis(p *plot.Plot, cost []float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range cost {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if lo > 0 && hi/lo > 20 {
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = logTicks{format: moneyTick}
		p.Y.Min, p.Y.Max = lo/1.15, hi*math.Pow(hi/lo, 0.12)
	} else {
		pad := (hi - lo) * 0.06
		if pad == 0 {
			pad = math.Max(math.Abs(hi)*0.1, 1)
		}
		// Headroom at the top keeps the edge labels clear of the curve.
		p.Y.Min, p.Y.Max = lo-pad, hi+2.5*pad
		if lo >= 0 && p.Y.Min < 0 {
			p.Y.Min = 0
		}
		p.Y.Tick.Marker = moneyTicks{}
	}
}

// costRuns cuts the cost curve into runs inside and outside the window,
// broken where the cost is not finite; runs that meet share their point.
func costRuns(cs *CostSeries) (in, out []plotter.XYs) {
	var cur1 plotter.XYs
	curIn := false
	flush := func() {
		if len(cur1) > 0 {
			if curIn {
				in = append(in, cur1)
			} else {
				out = append(out, cur1)
			}
		}
		cur1 = nil
	}
	for i, x := range cs.X {
		v := cs.Cost[i]
		if math.IsNaN(v) || math.IsInf(v, 0) {
			flush()
			continue
		}
		inside := cs.Window.Contains(x)
		if len(cur1) > 0 && inside != curIn {
			// Join the two parts at this point so the curve is unbroken.
			cur1 = append(cur1, plotter.XY{X: x, Y: v})
			flush()
		}
		curIn = inside
		cur1 = append(cur1, plotter.XY{X: x, Y: v})
	}
	flush()
	return in, out
}

// addCostLines adds the runs to p, dashed grey outside the window and
// solid blue inside, and returns the first line of each kind for the
// legend (nil when there is none).
func addCostLines(p *plot.Plot, in, out []plotter.XYs) (firstIn, firstOut *plotter.Line) {
	outStyle := draw.LineStyle{Color: costOutColor, Width: 1.2, Dashes: []vg.Length{4, 3}}
	inStyle := draw.LineStyle{Color: costInColor, Width: 2.2}
	for _, xy := range out {
		l := &plotter.Line{XYs: xy, LineStyle: outStyle}
		p.Add(l)
		if firstOut == nil {
			firstOut = l
		}
	}
	for _, xy := range in {
		l := &plotter.Line{XYs: xy, LineStyle: inStyle}
		p.Add(l)
		if firstIn == nil {
			firstIn = l
		}
	}
	return firstIn, firstOut
}

// Legend row geometry.
const legendThumbW, legendThumbH, legendGap = vg.Length(22), vg.Length(8), vg.Length(16)

// legendWidth is the width of a row of legend entries.
func legendWidth(entries []legendEntry) vg.Length {
	sty := textStyle(8.5, inkColor)
	total := vg.Length(0)
	for i, e := range entries {
		if i > 0 {
			total += legendGap
		}
		total += legendThumbW + 4 + sty.Width(e.text)
	}
	return total
}

// legendRows splits legend entries into rows no wider than w.
func legendRows(entries []legendEntry, w vg.Length) [][]legendEntry {
	var rows [][]legendEntry
	var cur []legendEntry
	for _, e := range entries {
		if len(cur) > 0 && legendWidth(append(append([]legendEntry(nil), cur...), e)) > w {
			rows = append(rows, cur)
			cur = nil
		}
		cur = append(cur, e)
	}
	if len(cur) > 0 {
		rows = append(rows, cur)
	}
	return rows
}

type legendEntry struct {
	text  string
	thumb plot.Thumbnailer
}

const legendRowH = vg.Length(20)

// drawLegendRow draws legend entries side by side, centred in c.
func drawLegendRow(c draw.Canvas, entries []legendEntry) {
	sty := textStyle(8.5, inkColor)
	total := legendWidth(entries)
	x := (c.Min.X+c.Max.X)/2 - total/2
	y := (c.Min.Y + c.Max.Y) / 2
	for _, e := range entries {
		tc := c
		tc.Rectangle = vg.Rectangle{Min: vg.Point{X: x, Y: y - legendThumbH/2}, Max: vg.Point{X: x + legendThumbW, Y: y + legendThumbH/2}}
		e.thumb.Thumbnail(&tc)
		x += legendThumbW + 4
		s := sty
		s.YAlign = draw.YCenter
		c.FillText(s, vg.Point{X: x, Y: y}, e.text)
		x += sty.Width(e.text) + legendGap
	}
}

// windowPlotter shades the window over the whole height of the plot and
// names the limit at each edge.
type windowPlotter struct {
	window sweep.Window
	pl     *labelPlacer // shared with the cost marks
}

func (w *windowPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, _ := plt.Transforms(&c)
	edge := draw.LineStyle{Color: inkColor, Width: 1.1}
	for _, iv := range w.window {
		a, b := trX(iv.Lo), trX(iv.Hi)
		if b-a < 1 {
			a, b = a-0.5, b+0.5
		}
		c.FillPolygon(windowShade, rectPoints(vg.Rectangle{Min: vg.Point{X: a, Y: c.Min.Y}, Max: vg.Point{X: b, Y: c.Max.Y}}))
		c.StrokeLine2(edge, trX(iv.Lo), c.Min.Y, trX(iv.Lo), c.Max.Y)
		c.StrokeLine2(edge, trX(iv.Hi), c.Min.Y, trX(iv.Hi), c.Max.Y)
	}
	w.pl.area = c.Rectangle
	for _, iv := range w.window {
		w.pl.avoidVertical(trX(iv.Lo))
		w.pl.avoidVertical(trX(iv.Hi))
	}
	lab := edgeLabeller{c: c, sty: textStyle(8, inkColor), pl: w.pl}
	lab.labelEdges(w.window, trX, c.Max.Y-5-lab.sty.Height("M"))
}

func (w *windowPlotter) Thumbnail(c *draw.Canvas) {
	c.FillPolygon(windowShade, rectPoints(c.Rectangle))
}

// costMarks marks the recommended and the cheapest scale on the curve.
type costMarks struct {
	series   *CostSeries
	currency string
	pl       *labelPlacer // shared with the window's edge labels
}

func (m *costMarks) hasRecommended() bool {
	c := m.series.Combo
	return !math.IsNaN(c.Recommended) && !math.IsNaN(c.Cost)
}

func (m *costMarks) hasCheapest() bool {
	c := m.series.Combo
	return !math.IsNaN(c.Cheapest) && !math.IsNaN(c.CheapestCost) &&
		!(m.hasRecommended() && c.Cheapest == c.Recommended)
}

func (m *costMarks) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	co := m.series.Combo
	sty := textStyle(8, inkColor)
	glyphs := map[string]vg.Point{}
	if m.hasRecommended() {
		glyphs["recommended"] = vg.Point{X: trX(co.Recommended), Y: trY(co.Cost)}
	}
	if m.hasCheapest() {
		glyphs["cheapest"] = vg.Point{X: trX(co.Cheapest), Y: trY(co.CheapestCost)}
	}
	for _, pt := range glyphs {
		m.pl.avoid(vg.Rectangle{Min: vg.Point{X: pt.X - 5, Y: pt.Y - 5}, Max: vg.Point{X: pt.X + 5, Y: pt.Y + 5}})
	}
	mark := func(k, cost float64, g draw.GlyphDrawer, name string, right, above bool) {
		pt := glyphs[name]
		c.DrawGlyph(draw.GlyphStyle{Color: inkColor, Radius: 4.5, Shape: g}, pt)
		txt := fmt.Sprintf("%s %s: %s", name, sweep.Scale(k), HumanMoney(cost, m.currency))
		w, h := sty.Width(txt), sty.Height(txt)
		// Candidates pointing into the plot first, on the preferred side;
		// none may cross a window edge or another label.
		var corners []vg.Point
		for _, at := range around(pt, w, h, 7) {
			if (at.X > pt.X) == right && (at.Y > pt.Y) == above {
				corners = append(corners, at)
			}
		}
		corners = append(corners, around(pt, w, h, 7)...)
		// A veil behind the text keeps it legible over the curve.
		m.pl.place(c, sty, txt, corners, true)
	}
	// Labels point into the plot: rightwards from the left half.
	mid := (c.Min.X + c.Max.X) / 2
	if m.hasRecommended() {
		mark(co.Recommended, co.Cost, draw.PyramidGlyph{}, "recommended", trX(co.Recommended) < mid, true)
	}
	if m.hasCheapest() {
		mark(co.Cheapest, co.CheapestCost, draw.RingGlyph{}, "cheapest", trX(co.Cheapest) < mid, false)
	}
}

type glyphThumb struct{ shape draw.GlyphDrawer }

func (g glyphThumb) Thumbnail(c *draw.Canvas) {
	c.DrawGlyph(draw.GlyphStyle{Color: inkColor, Radius: 4, Shape: g.shape}, c.Center())
}

// moneyTicks are the default linear ticks labelled with grouped digits.
type moneyTicks struct{}

func (moneyTicks) Ticks(min, max float64) []plot.Tick {
	ticks := plot.DefaultTicks{}.Ticks(min, max)
	for i := range ticks {
		if !ticks[i].IsMinor() {
			ticks[i].Label = moneyTick(ticks[i].Value)
		}
	}
	return ticks
}

// moneyTick prints an amount with its thousands grouped by commas, as
// the memo prints money: "120,000".
func moneyTick(v float64) string {
	if math.Abs(v) < 100 && v != math.Round(v) {
		return strconv.FormatFloat(v, 'g', 3, 64)
	}
	s := thousands(strconv.FormatFloat(math.Abs(math.Round(v)), 'f', 0, 64))
	if v < 0 && s != "0" {
		return "−" + s
	}
	return s
}
