package report

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"sort"
	"strings"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
)

// TradeoffSheet is the name of the workbook sheet that sets the strategies
// side by side.
const TradeoffSheet = "Trade-offs"

// TradeoffRow is one strategy in the trade-off table and plot, from the
// study's ranking.
type TradeoffRow struct {
	Entry sweep.RankEntry
	// Size is the worst relaxed mismatch as a factor of at least 1 (1
	// when no law that counts is relaxed, NaN when it cannot be
	// evaluated).
	Size float64
	// NonDominated is set for a feasible strategy no other feasible one
	// beats on both model size and worst mismatch.
	NonDominated bool
}

// TradeoffData returns the rows of the trade-off table in ranking order,
// or nil for a study with fewer than two strategies.
func TradeoffData(res *sweep.Result) []TradeoffRow {
	if len(res.Strategies) < 2 {
		return nil
	}
	rows := make([]TradeoffRow, len(res.Ranking))
	for i, e := range res.Ranking {
		rows[i] = TradeoffRow{Entry: e, Size: 1}
		if w := e.WorstMismatch; w != nil {
			rows[i].Size = w.Size()
		}
	}
	for i := range rows {
		a := rows[i]
		if !a.Entry.Feasible || math.IsNaN(a.Size) {
			continue
		}
		dominated := false
		for j, b := range rows {
			if j == i || !b.Entry.Feasible || math.IsNaN(b.Size) {
				continue
			}
			// b dominates a: a model at least as large (kL no larger) with
			// a mismatch no worse, and better in one.
			if b.Entry.Recommended <= a.Entry.Recommended && b.Size <= a.Size &&
				(b.Entry.Recommended < a.Entry.Recommended || b.Size < a.Size) {
				dominated = true
				break
			}
		}
		rows[i].NonDominated = !dominated
	}
	return rows
}

// MismatchText names a strategy's worst relaxed mismatch, for people:
// "Froude number (gravity law), π_p/π_m = 0.0913", or "none".
func MismatchText(e sweep.RankEntry) string {
	w := e.WorstMismatch
	if w == nil {
		if !e.Feasible {
			return ""
		}
		return "none"
	}
	if math.IsNaN(w.Ratio) {
		return fmt.Sprintf("%s (%s): not evaluated", w.Group, LawLabel(w.Law))
	}
	return fmt.Sprintf("%s (%s), π_p/π_m = %s", w.Group, LawLabel(w.Law), HumanNumber(w.Ratio))
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// writeTradeoffs writes the Trade-offs sheet: every strategy with its
// rank, model size, cost and worst relaxed mismatch, and why it ranks
// where it does. The numbers are those of the recommended combination's
// row of the Windows sheet.
func writeTradeoffs(f *excelize.File, res *sweep.Result, bold int) error {
	rows := TradeoffData(res)
	if rows == nil {
		return nil
	}
	st := res.Plan.Settings
	header := []string{"rank", "strategy", "technique", "feasible", "case", "medium", "material", "facility",
		"recommended (1:x)", "recommended kL [-]", "model length [m]", "cost [" + st.Currency + "]",
		"worst relaxed law", "group", "π_p/π_m [-]", "mismatch factor [-]", "counts as a scale effect", "non-dominated", "reason"}
	s, err := newSheet(f, TradeoffSheet, header, []float64{6, 24, 14, 9, 14, 16, 16, 18, 14, 12, 12, 12, 16, 20, 12, 12, 12, 12, 80}, bold)
	if err != nil {
		return err
	}
	for _, r := range rows {
		e := r.Entry
		law, group, ratio, size := "", "", math.NaN(), math.NaN()
		if w := e.WorstMismatch; w != nil {
			law, group, ratio, size = w.Law, w.Group, w.Ratio, w.Size()
		} else if e.Feasible {
			size = 1
		}
		var cs, med, mat, fac string
		if c := e.Best; c != nil {
			cs, med, mat, fac = c.Case, c.Medium, c.Material, c.Facility
		}
		if err := s.add(e.Rank, e.Strategy, e.Result.Technique, yesNo(e.Feasible), cs, med, mat, fac,
			sweep.Scale(e.Recommended), sig(e.Recommended), sig(e.ModelLength), money(e.Cost),
			law, group, sig(ratio), sig(size), yesNo(e.ScaleEffect), yesNo(r.NonDominated), e.Reason); err != nil {
			return err
		}
	}
	if err := s.add(); err != nil {
		return err
	}
	if err := s.add("", fmt.Sprintf("A feasible strategy whose relaxed laws stay within a mismatch factor of %s (mismatch_threshold), or relaxes only weak laws (weak_laws), ranks before one with a larger mismatch or a relaxed governing law (governing_laws), whatever the model sizes; within a class the larger model ranks first (the cheaper with recommend = cheapest).", Num3(st.MismatchThreshold))); err != nil {
		return err
	}
	return s.close(false)
}

// memoTradeoffs writes the trade-off table of the memo: five short
// columns (a document converter keeps them whole), the reasons as a list
// below, and a pointer to the trade-off figure when there is one.
func memoTradeoffs(b *strings.Builder, res *sweep.Result, figures []Figure) {
	rows := TradeoffData(res)
	if rows == nil {
		return
	}
	st := res.Plan.Settings
	b.WriteString("## Trade-offs\n\n")
	fmt.Fprintf(b, "Strategies ranked by scale effect first, then by model size%s. A relaxed law counts as a scale effect when its group is off by more than a factor %s, or when the study marks it governing; laws marked weak never count.\n\n",
		map[bool]string{true: " (then cost: the study asks for the cheapest)", false: ""}[st.Recommend == "cheapest"], HumanNumber(st.MismatchThreshold))
	b.WriteString("| rank | strategy | model | cost | worst relaxed mismatch |\n|---|---|---|---|---|\n")
	for _, r := range rows {
		e := r.Entry
		name := md(e.Strategy)
		if r.NonDominated {
			name += " ◆"
		}
		model, mismatch := "none", "–"
		if e.Feasible {
			model = sweep.Scale(e.Recommended)
			if !math.IsNaN(e.ModelLength) {
				model += ", " + HumanNumber(e.ModelLength) + " m long"
			}
			mismatch = md(MismatchText(e))
		}
		fmt.Fprintf(b, "| %d | %s | %s | %s | %s |\n", e.Rank, name, model, HumanMoney(e.Cost, st.Currency), mismatch)
	}
	b.WriteString("\n◆ non-dominated: no other feasible strategy gives a model at least as large with a mismatch no worse.\n\n")
	keep := userNames(res)
	for _, r := range rows {
		fmt.Fprintf(b, "- Rank %d, %s: %s.\n", r.Entry.Rank, md(r.Entry.Strategy), md(memoReason(res, r.Entry, keep)))
	}
	b.WriteString("\n")
	for i, f := range figures {
		if isTradeoffPlot(f.Path) {
			fmt.Fprintf(b, "Figure %d draws the feasible strategies side by side: recommended scale against worst relaxed mismatch.\n\n", i+1)
		}
	}
}

// isTradeoffPlot reports whether a map file is a study's trade-off plot.
func isTradeoffPlot(path string) bool {
	return strings.HasSuffix(strings.TrimSuffix(filepath.Base(path), filepath.Ext(path)), ".tradeoffs")
}

// TradeoffPlotName is the file name of a study's trade-off plot.
func TradeoffPlotName(base, format string) string { return base + ".tradeoffs." + format }

const tradeoffHeight = 5.5 * vg.Inch

var (
	frontColor     = color.NRGBA{0x0D, 0x34, 0x66, 0xFF} // dark blue: non-dominated
	dominatedColor = color.NRGBA{0x80, 0x80, 0x80, 0xFF}
	thresholdColor = color.NRGBA{0xC2, 0x5B, 0x00, 0xFF} // orange, as infeasible margins
)

// markerShapes gives each strategy its own marker.
var markerShapes = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}, draw.PyramidGlyph{}, draw.BoxGlyph{}, draw.RingGlyph{}, draw.CrossGlyph{}, draw.PlusGlyph{}}

// drawTradeoffs draws the feasible strategies of a study by scale (x, log,
// larger models to the left) and worst relaxed mismatch (y, log), each
// with its own marker and labelled with its name and cost; the
// non-dominated ones are dark and joined, the threshold is a dashed line.
func drawTradeoffs(dc draw.Canvas, res *sweep.Result, rows []TradeoffRow) {
	st := res.Plan.Settings
	var pts []TradeoffRow
	for _, r := range rows {
		if r.Entry.Feasible && !math.IsNaN(r.Size) {
			pts = append(pts, r)
		}
	}
	xmin, xmax, ymax := math.Inf(1), math.Inf(-1), st.MismatchThreshold
	for _, r := range pts {
		xmin, xmax = math.Min(xmin, r.Entry.Recommended), math.Max(xmax, r.Entry.Recommended)
		ymax = math.Max(ymax, r.Size)
	}
	if len(pts) == 0 {
		xmin, xmax = st.ScaleFrom, st.ScaleTo
	}
	title := fmt.Sprintf("%s: strategies side by side, recommended scale against worst relaxed mismatch\ndark and joined: non-dominated (no other is larger and better matched); label: strategy, cost; dashed: threshold %s",
		res.Name, Num3(st.MismatchThreshold))
	p := newPlot(title, xmin/1.5, xmax*1.5)
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = logTicks{format: plainNumber}
	p.Y.Min, p.Y.Max = 0.8, ymax*3
	p.Y.Label.Text = "worst relaxed mismatch, factor (1: none)"
	p.Add(&plotter.Line{XYs: plotter.XYs{{X: p.X.Min, Y: st.MismatchThreshold}, {X: p.X.Max, Y: st.MismatchThreshold}},
		LineStyle: draw.LineStyle{Color: thresholdColor, Width: 1.2, Dashes: []vg.Length{5, 3}}})
	var front plotter.XYs
	for _, r := range pts {
		if r.NonDominated {
			front = append(front, plotter.XY{X: r.Entry.Recommended, Y: r.Size})
		}
	}
	sort.Slice(front, func(i, j int) bool { return front[i].X < front[j].X })
	if len(front) > 1 {
		p.Add(&plotter.Line{XYs: front, LineStyle: draw.LineStyle{Color: frontColor, Width: 1.6}})
	}
	var legend []legendEntry
	for i, r := range pts {
		clr := color.Color(dominatedColor)
		if r.NonDominated {
			clr = frontColor
		}
		sc, err := plotter.NewScatter(plotter.XYs{{X: r.Entry.Recommended, Y: r.Size}})
		if err != nil {
			continue
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: clr, Radius: 5, Shape: markerShapes[i%len(markerShapes)]}
		p.Add(sc)
		label := r.Entry.Strategy
		if !math.IsNaN(r.Entry.Cost) {
			label += ", " + Money(r.Entry.Cost, st.Currency)
		}
		lb, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{{X: r.Entry.Recommended, Y: r.Size}}, Labels: []string{clip(label, 40)}})
		if err == nil {
			for j := range lb.TextStyle {
				lb.TextStyle[j] = textStyle(8.5, inkColor)
			}
			lb.Offset = vg.Point{X: 7, Y: 4 + vg.Length(i%3)*9}
			p.Add(lb)
		}
		legend = append(legend, legendEntry{fmt.Sprintf("%d. %s", r.Entry.Rank, clip(r.Entry.Strategy, 24)), glyphThumb{sc.GlyphStyle.Shape}})
	}
	area := inset(dc)
	p.Draw(draw.Crop(area, 0, 0, legendRowH, 0))
	drawLegendRow(draw.Crop(area, 0, 0, 0, legendRowH-area.Size().Y), legend)
}

// writeTradeoffPlot writes the trade-off plot of a study and returns its
// path.
func writeTradeoffPlot(dir, base, format, date string, res *sweep.Result, rows []TradeoffRow) (string, error) {
	path := filepath.Join(dir, TradeoffPlotName(base, format))
	data, err := renderPlot(format, plotWidth, tradeoffHeight, date, func(dc draw.Canvas) { drawTradeoffs(dc, res, rows) })
	if err != nil {
		return "", fmt.Errorf("drawing %s: %v", path, err)
	}
	return path, WriteFileAtomic(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}
