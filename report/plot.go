package report

import (
	"bytes"
	"context"
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"

	"scaleplan/sweep"
)

// Plot formats.
const (
	PlotPNG = "png"
	PlotSVG = "svg"
	PlotPDF = "pdf"
)

// PlotFormats lists the formats WritePlots can write; the first is the
// default.
var PlotFormats = []string{PlotPNG, PlotSVG, PlotPDF}

// ParsePlotFormat checks a plot format: png (the default, also for ""),
// svg or pdf, in any case, with or without a leading dot.
func ParsePlotFormat(s string) (string, error) {
	f := strings.ToLower(strings.TrimPrefix(strings.TrimSpace(s), "."))
	if f == "" {
		return PlotPNG, nil
	}
	for _, ok := range PlotFormats {
		if f == ok {
			return f, nil
		}
	}
	return "", fmt.Errorf("unknown plot format %q: use png, svg or pdf", s)
}

const (
	// MaxPlotPoints is the most samples a map draws along one axis;
	// larger grids are thinned for drawing (the sweep keeps every point).
	MaxPlotPoints = 2000
	// MaxBandRows is the most rows a band chart shows; the title says how
	// many more combinations there are.
	MaxBandRows = 60
	// plotDPI is the resolution of PNG maps.
	plotDPI = 120
	// plotWidth is the width of every map: the text width of a portrait
	// A4 or Letter page (6.3 in), so a map placed in a document keeps its
	// text at the size it was set (8 pt and more).
	plotWidth = 6.3 * vg.Inch
)

// ScaleAxisLabel is the label of every scale axis.
const ScaleAxisLabel = "scale 1:x (kL = prototype/model)"

// WritePlots writes the feasibility maps of a study into dir, with file
// names starting with base (already sanitised), and returns the paths
// written in a stable order: for each strategy in turn, its band chart,
// then its contour map (two-axis sweeps) and its cost curve (studies with
// costs) where there is one. The names are
//
//	<base>.band-<n>-<strategy>.<format>
//	<base>.contour-<n>-<strategy>.<format>
//	<base>.cost-<n>-<strategy>.<format>
//
// with n the strategy's position in the study (from 1) and the strategy
// name sanitised like a study name. Each file is written atomically, and the
// same result gives byte-identical files.
func WritePlots(dir, base string, res *sweep.Result, format string) ([]string, error) {
	return WritePlotsContext(context.Background(), dir, base, res, format)
}

// WritePlotsContext is WritePlots that stops before each map when ctx is
// done.
func WritePlotsContext(ctx context.Context, dir, base string, res *sweep.Result, format string) ([]string, error) {
	format, err := ParsePlotFormat(format)
	if err != nil {
		return nil, err
	}
	if res == nil || res.Plan == nil || len(res.Plan.Grid) < 2 {
		return nil, nil
	}
	date := pdfDate(res.Plan.Settings.InputsDate)
	// The strategies' maps are drawn concurrently (plotStrategies); the
	// trade-off plot, drawn from all of them, follows.
	files, err := plotStrategies(ctx, res, func(ctx context.Context, i int, sr *sweep.StrategyResult) ([]string, error) {
		return writeStrategyPlots(ctx, dir, base, format, date, res, i, sr)
	})
	if err != nil {
		return files, err
	}
	if rows := TradeoffData(res); rows != nil {
		if err := ctx.Err(); err != nil {
			return files, err
		}
		f, err := writeTradeoffPlot(dir, base, format, date, res, rows)
		if err != nil {
			return files, err
		}
		files = append(files, f)
	}
	return files, nil
}

// writeStrategyPlots writes the maps of one strategy, the i-th, in their
// order: band chart, contour map, cost curve, requirement curves.
func writeStrategyPlots(ctx context.Context, dir, base, format, date string, res *sweep.Result, i int, sr *sweep.StrategyResult) ([]string, error) {
	var files []string
	write := func(kind string, i int, sr *sweep.StrategyResult, w, h vg.Length, draw func(draw.Canvas)) error {
		if err := ctx.Err(); err != nil {
			return err
		}
		name := fmt.Sprintf("%s.%s-%d-%s.%s", base, kind, i+1, FileName(sr.Name), format)
		path := filepath.Join(dir, name)
		data, err := renderPlot(format, w, h, date, draw)
		if err != nil {
			return fmt.Errorf("drawing %s: %v", path, err)
		}
		if err := WriteFileAtomic(path, func(w io.Writer) error {
			_, err := w.Write(data)
			return err
		}); err != nil {
			return err
		}
		files = append(files, path)
		return nil
	}
	if bc := BandData(res, sr); len(bc.Rows) > 0 {
		w, h := bandSize(bc)
		if err := write("band", i, sr, w, h, func(dc draw.Canvas) { drawBand(dc, res, bc) }); err != nil {
			return files, err
		}
	}
	if cm := ContourData(res, sr); cm != nil {
		if err := write("contour", i, sr, plotWidth, contourHeight, func(dc draw.Canvas) { drawContour(dc, res, cm) }); err != nil {
			return files, err
		}
	}
	if cs := CostData(res, sr); cs != nil {
		if err := write("cost", i, sr, plotWidth, costHeight, func(dc draw.Canvas) { drawCost(dc, res, cs) }); err != nil {
			return files, err
		}
	}
	for _, rs := range RequirementData(res, sr) {
		kind := requireKind(rs)
		if err := write(kind, i, sr, plotWidth, requirementHeight, func(dc draw.Canvas) { drawRequirement(dc, res, rs) }); err != nil {
			return files, err
		}
	}
	return files, nil
}

// renderPlot draws onto a fresh canvas of the format and returns the file
// contents.
func renderPlot(format string, w, h vg.Length, date string, drawFn func(draw.Canvas)) (out []byte, err error) {
	defer func() {
		// gonum/plot reports some drawing faults by panicking; turn them
		// into an error naming the file rather than stopping a batch.
		if r := recover(); r != nil {
			out, err = nil, fmt.Errorf("%v", r)
		}
	}()
	var c vg.CanvasWriterTo
	switch format {
	case PlotSVG:
		c = vgsvg.New(w, h)
	case PlotPDF:
		c = newPDFCanvas(w, h, pdfTime(date))
	default:
		c, img := newImageCanvas(w, h) // white already
		drawFn(draw.New(c))
		return encodePNG(img)
	}
	dc := draw.New(c)
	dc.FillPolygon(color.White, rectPoints(dc.Rectangle))
	drawFn(dc)
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		return nil, err
	}
	b := buf.Bytes()
	switch format {
	case PlotPDF:
		b = fixPDFDates(b, date)
	case PlotSVG:
		// The SVG names the font without embedding it; Arial and Helvetica
		// have the same metrics, so a viewer without Liberation Sans keeps
		// the layout.
		b = bytes.ReplaceAll(b, []byte("font-family:Liberation Sans;"), []byte("font-family:'Liberation Sans',Arial,Helvetica,sans-serif;"))
	}
	return b, nil
}

var pdfDateRE = regexp.MustCompile(`/(CreationDate|ModDate) \(D:[0-9]{14}\)`)

// fixPDFDates replaces the creation and modification dates the PDF
// library stamps with the clock by a fixed date of the same length, so the
// byte offsets of the file stay valid and the same result gives the same
// file.
func fixPDFDates(b []byte, date string) []byte {
	return pdfDateRE.ReplaceAllFunc(b, func(m []byte) []byte {
		key := m[:bytes.IndexByte(m, ' ')]
		return []byte(string(key) + " (D:" + date + ")")
	})
}

// pdfDate is the date stamped in PDF maps: the study's inputs_date when it
// is a date (YYYY-MM-DD), else 1970-01-01, as 14 digits.
func pdfDate(inputs string) string {
	if t, err := time.Parse("2006-01-02", strings.TrimSpace(inputs)); err == nil && t.Year() >= 1000 && t.Year() <= 9999 {
		return t.Format("20060102150405")
	}
	return "19700101000000"
}

func rectPoints(r vg.Rectangle) []vg.Point {
	return []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}}
}

// Fonts: Liberation Sans, embedded in gonum/plot, so every machine draws
// the same glyphs; it has the metrics of Arial, so an SVG viewer without
// it substitutes a font of the same widths.
var sansFont = font.Font{Typeface: "Liberation", Variant: "Sans"}

func textStyle(size vg.Length, clr color.Color) text.Style {
	return text.Style{
		Color:   clr,
		Font:    font.From(sansFont, size),
		XAlign:  draw.XLeft,
		YAlign:  draw.YBottom,
		Handler: plot.DefaultTextHandler,
	}
}

var (
	inkColor   = color.NRGBA{0x1A, 0x1A, 0x1A, 0xFF}
	faintColor = color.NRGBA{0x66, 0x66, 0x66, 0xFF}
	ruleColor  = color.NRGBA{0xD0, 0xD0, 0xD0, 0xFF}
)

// newPlot returns a plot set in Liberation Sans with a title and an x
// axis of scale.
func newPlot(title string, xmin, xmax float64) *plot.Plot {
	p := plot.New()
	p.Title.TextStyle.Font = font.From(sansFont, 10)
	// Titles wrap to the plot area (the figure less its margins and a
	// colour bar).
	p.Title.Text = wrapText(p.Title.TextStyle, title, plotWidth-1.5*vg.Inch)
	p.Title.Padding = 6
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font = font.From(sansFont, 10)
		ax.Tick.Label.Font = font.From(sansFont, 9)
		ax.Padding = 0
	}
	p.Legend.TextStyle.Font = font.From(sansFont, 8.5)
	p.Legend.Padding = 2 // rows of the legend one line apart, not closer
	if !(xmax > xmin) {
		xmin, xmax = xmin/1.1, xmax*1.1
	}
	p.X.Min, p.X.Max = xmin, xmax
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = logTicks{format: scaleLabel}
	p.X.Label.Text = ScaleAxisLabel
	return p
}

// scaleLabel writes a tick of the scale axis: "1:25".
func scaleLabel(kL float64) string { return "1:" + plainNumber(kL) }

// plainNumber prints a tick value without exponents where it can.
func plainNumber(v float64) string {
	if v == math.Round(v) && math.Abs(v) < 1e9 {
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'g', 3, 64)
}

// logTicks marks a log axis at 1, 2, 5 × 10ⁿ (or more mantissas on a short
// axis, or fewer on a long one) and labels them with format; the other
// integers × 10ⁿ are minor ticks. An axis too short for any of these gets
// evenly spaced labels.
type logTicks struct {
	format func(float64) string
	// perDecade, when known, is the axis length of a decade: a short axis
	// gets fewer labels so they do not run into each other.
	perDecade vg.Length
}

// sparseMantissas label a short axis: 1 × 10ⁿ, or 1 and 3 × 10ⁿ.
var sparseMantissas = [][]float64{{1}, {1, 3}}

var tickMantissas = [][]float64{{1}, {1, 2, 5}, {1, 2, 3, 5}, {1, 2, 3, 4, 5, 6, 7, 8, 9}}

func (t logTicks) Ticks(min, max float64) []plot.Tick {
	if !(min > 0) || !(max > min) {
		return plot.DefaultTicks{}.Ticks(min, max)
	}
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	in := func(v float64) bool { return v >= min*(1-1e-9) && v <= max*(1+1e-9) }
	values := func(ms []float64) []float64 {
		var out []float64
		for e := lo; e <= hi; e++ {
			for _, m := range ms {
				if v := m * math.Pow(10, float64(e)); in(v) {
					out = append(out, roundTick(v))
				}
			}
		}
		return out
	}
	var major []float64
	sets := tickMantissas
	if t.perDecade > 0 && t.perDecade < 110 {
		sets = sparseMantissas
	}
	for i, ms := range sets {
		vs := values(ms)
		if len(vs) > 12 && i > 0 {
			break
		}
		major = vs
		if len(vs) >= 4 {
			break
		}
	}
	for step := 2; len(major) > 12; step++ {
		// A very long axis: label every few decades.
		all := values(tickMantissas[0])
		major = major[:0]
		for i := 0; i < len(all); i += step {
			major = append(major, all[i])
		}
	}
	if len(major) < 2 {
		var ticks []plot.Tick
		for _, tk := range (plot.DefaultTicks{}).Ticks(min, max) {
			if !tk.IsMinor() {
				tk.Label = t.format(tk.Value)
			}
			ticks = append(ticks, tk)
		}
		return ticks
	}
	var ticks []plot.Tick
	isMajor := map[float64]bool{}
	for _, v := range major {
		isMajor[v] = true
		ticks = append(ticks, plot.Tick{Value: v, Label: t.format(v)})
	}
	if hi-lo <= 6 {
		for _, v := range values(tickMantissas[3]) {
			if !isMajor[v] {
				ticks = append(ticks, plot.Tick{Value: v})
			}
		}
	}
	return ticks
}

// roundTick removes the float noise of m × 10ⁿ.
func roundTick(v float64) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return r
}

// sampleIndices returns at most max indices into n points, evenly spread,
// always with the first and the last.
func sampleIndices(n, max int) []int {
	if n <= max {
		idx := make([]int, n)
		for i := range idx {
			idx[i] = i
		}
		return idx
	}
	idx := make([]int, max)
	for k := range idx {
		idx[k] = int(math.Round(float64(k) * float64(n-1) / float64(max-1)))
	}
	return idx
}

// pickAt is the values of a series given point by point at the indices
// idx.
func pickAt(at func(int) float64, idx []int) []float64 {
	out := make([]float64, len(idx))
	for k, i := range idx {
		out[k] = at(i)
	}
	return out
}

// pick is the values at the indices idx.
func pick(vals []float64, idx []int) []float64 {
	return pickAt(func(i int) float64 { return vals[i] }, idx)
}

// Edge is a window edge as the maps mark it.
type Edge struct {
	KL    float64
	Limit string // the limit that sets it (sweep.RangeLimit at the sweep's own ends)
	// Side is "large" for the large-model end of an interval (its Lo),
	// "small" for the small-model end (its Hi) and "only" for a window
	// that is a single scale.
	Side string
}

// WindowEdges lists the edges of a window in increasing kL.
func WindowEdges(w sweep.Window) []Edge {
	var out []Edge
	for _, iv := range w {
		if iv.Lo == iv.Hi {
			out = append(out, Edge{iv.Lo, iv.LoLimit, "only"})
			continue
		}
		out = append(out, Edge{iv.Lo, iv.LoLimit, "large"}, Edge{iv.Hi, iv.HiLimit, "small"})
	}
	return out
}

// edgeLabeller places the labels of window edges along one line of a
// canvas without overlaps: a label goes inside its interval when it fits,
// else outside, and is left out when neither side is free (the workbook
// lists every edge).
type edgeLabeller struct {
	c     draw.Canvas
	sty   text.Style
	taken [][2]vg.Length
	// pl, when set, also keeps the labels clear of the map's other labels
	// and obstacles (see labelPlacer).
	pl *labelPlacer
}

const edgeGap = vg.Length(2.5)

func (l *edgeLabeller) free(a, b vg.Length) bool {
	if a < l.c.Min.X || b > l.c.Max.X {
		return false
	}
	for _, t := range l.taken {
		if a < t[1]+edgeGap && b > t[0]-edgeGap {
			return false
		}
	}
	return true
}

// place draws the label of the edge at x, preferring the side dir
// (+1 right, -1 left), at baseline y; it reports whether it was drawn.
func (l *edgeLabeller) place(x, y vg.Length, label string, dir int, clr color.Color) bool {
	w := l.sty.Width(label)
	for _, d := range []int{dir, -dir} {
		a := x + edgeGap
		if d < 0 {
			a = x - edgeGap - w
		}
		box := labelBox(l.sty, vg.Point{X: a, Y: y - l.sty.FontExtents().Descent}, label)
		if l.free(a, a+w) && (l.pl == nil || l.pl.free(box)) {
			if l.pl != nil {
				l.pl.boxes = append(l.pl.boxes, box)
			}
			sty := l.sty
			sty.Color = clr
			sty.XAlign = draw.XLeft
			l.c.FillText(sty, vg.Point{X: a, Y: y}, label)
			l.taken = append(l.taken, [2]vg.Length{a, a + w})
			return true
		}
	}
	return false
}

// labelEdges labels the edges of a window on one line. xOf maps kL to the
// canvas.
func (l *edgeLabeller) labelEdges(w sweep.Window, xOf func(float64) vg.Length, y vg.Length) {
	for _, iv := range w {
		xl, xh := xOf(iv.Lo), xOf(iv.Hi)
		if iv.Lo == iv.Hi {
			l.place(xl, y, iv.LoLimit, +1, edgeColor(iv.LoLimit))
			continue
		}
		wl, wh := l.sty.Width(iv.LoLimit), l.sty.Width(iv.HiLimit)
		inside := xh-xl >= wl+wh+4*edgeGap
		dl, dh := +1, -1
		if !inside {
			dl, dh = -1, +1
		}
		l.place(xl, y, iv.LoLimit, dl, edgeColor(iv.LoLimit))
		l.place(xh, y, iv.HiLimit, dh, edgeColor(iv.HiLimit))
	}
}

// edgeColor greys the edges set by the sweep's own range: the window may
// go on beyond them.
func edgeColor(limit string) color.Color {
	if limit == sweep.RangeLimit {
		return faintColor
	}
	return inkColor
}

// clip shortens a label to n characters.
func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// fitText shortens s until it is at most w wide in sty: the longest
// prefix that fits with an ellipsis, at least one character. The width
// grows with the prefix, so the prefix is found by bisection.
func fitText(sty text.Style, s string, w vg.Length) string {
	if sty.Width(s) <= w {
		return s
	}
	r := []rune(s)
	if len(r) < 2 {
		return s
	}
	cut := func(k int) string { return string(r[:k]) + "…" }
	// The longest k in [1, len(r)−1] whose cut fits; 1 when none does.
	lo, hi := 1, len(r)-1
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if sty.Width(cut(mid)) <= w {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return cut(lo)
}

// comboLabel names a combination in a map: its case and candidate pair.
func comboLabel(c *sweep.ComboResult) string {
	s := Candidate(c)
	if c.Case != "" {
		s = c.Case + ": " + s
	}
	return s
}

// drawMarginBar draws the colour bar of the margin palette in r.
func drawMarginBar(c draw.Canvas, r vg.Rectangle, noData bool) {
	n := len(marginColors)
	label := textStyle(8, inkColor)
	head := textStyle(8, faintColor)
	barW := vg.Length(14)
	top, bottom := r.Max.Y-14, r.Min.Y+14
	if noData {
		bottom += 22
	}
	h := (top - bottom) / vg.Length(n)
	x0 := r.Min.X + 4
	for k := 0; k < n; k++ {
		y0 := bottom + vg.Length(k)*h
		c.FillPolygon(marginColors[k], rectPoints(vg.Rectangle{Min: vg.Point{X: x0, Y: y0}, Max: vg.Point{X: x0 + barW, Y: y0 + h}}))
	}
	outline := draw.LineStyle{Color: faintColor, Width: 0.5}
	c.StrokeLines(outline, []vg.Point{{X: x0, Y: bottom}, {X: x0 + barW, Y: bottom}, {X: x0 + barW, Y: top}, {X: x0, Y: top}, {X: x0, Y: bottom}})
	label.YAlign = draw.YCenter
	for k, e := range MarginEdges {
		y := bottom + vg.Length(k+1)*h
		sty := draw.LineStyle{Color: inkColor, Width: 0.5}
		if e == 0 {
			sty.Width = 2
			c.StrokeLine2(sty, x0-3, y, x0+barW+3, y)
		} else {
			c.StrokeLine2(sty, x0+barW, y, x0+barW+3, y)
		}
		s := strconv.FormatFloat(math.Abs(e), 'f', -1, 64)
		switch {
		case e > 0:
			s = "+" + s
		case e < 0:
			s = "−" + s
		}
		c.FillText(label, vg.Point{X: x0 + barW + 5, Y: y}, s)
	}
	head.XAlign = draw.XLeft
	c.FillText(head, vg.Point{X: x0, Y: top + 3}, "feasible")
	head.YAlign = draw.YTop
	c.FillText(head, vg.Point{X: x0, Y: bottom - 3}, "short")
	if noData {
		y0 := r.Min.Y + 4
		c.FillPolygon(noDataColor, rectPoints(vg.Rectangle{Min: vg.Point{X: x0, Y: y0}, Max: vg.Point{X: x0 + barW, Y: y0 + 10}}))
		c.FillText(label, vg.Point{X: x0 + barW + 5, Y: y0 + 5}, "no data")
	}
	axis := textStyle(9, inkColor)
	axis.XAlign, axis.YAlign = draw.XCenter, draw.YTop
	axis.Rotation = math.Pi / 2
	c.FillText(axis, vg.Point{X: x0 + barW + 34, Y: (top + bottom) / 2}, "margin [decades]")
}

// inset leaves a margin round a map.
func inset(dc draw.Canvas) draw.Canvas { return draw.Crop(dc, 10, -10, 6, -8) }

// splitRight splits a canvas into a plot area and a strip of width w on
// its right for the colour bar.
func splitRight(dc draw.Canvas, w vg.Length) (main, strip draw.Canvas) {
	main = draw.Crop(dc, 0, -w, 0, 0)
	strip = draw.Crop(dc, dc.Size().X-w, 0, 0, 0)
	return main, strip
}
