package report

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
)

// RequirementSeries is the data behind a requirement plot: one facility
// capability that limits a window of the strategy, the value the model
// needs at each scale, and what each study facility has.
type RequirementSeries struct {
	Strategy, Capability, Unit, Limit string
	X                                 []float64
	Curves                            []RequirementCurve
}

// RequirementCurve is the requirement of one combination against its
// facility's capability.
type RequirementCurve struct {
	Label   string
	Needed  []float64
	Have    float64
	AtLeast bool
}

// RequirementData returns, for each capability that sets an edge of a
// window of the strategy, the requirement of every combination that names
// it.
func RequirementData(res *sweep.Result, sr *sweep.StrategyResult) []RequirementSeries {
	grid := res.Plan.Grid
	idx := displayIndices(len(grid))
	limiting := map[string]bool{}
	for _, c := range sr.Combos {
		for _, iv := range c.Window {
			limiting[iv.LoLimit], limiting[iv.HiLimit] = true, true
		}
	}
	var out []RequirementSeries
	index := map[string]int{}
	for _, c := range sr.Combos {
		for _, r := range c.Requirements {
			if !limiting[r.Limit] {
				continue
			}
			key := r.Capability + "\x00" + r.Limit
			i, ok := index[key]
			if !ok {
				i = len(out)
				index[key] = i
				out = append(out, RequirementSeries{Strategy: sr.Name, Capability: r.Capability, Unit: r.Unit, Limit: r.Limit, X: pick(grid, idx)})
			}
			out[i].Curves = append(out[i].Curves, RequirementCurve{Label: comboLabel(c), Needed: pickAt(r.At, idx), Have: r.Have, AtLeast: r.AtLeast})
		}
	}
	return out
}

// requirementColors tell the combinations apart (our own choice: dark,
// distinct hues that stay apart in grey print).
var requirementColors = []color.NRGBA{
	{0x0D, 0x34, 0x66, 0xFF}, {0xA8, 0x43, 0x00, 0xFF}, {0x2E, 0x7D, 0x32, 0xFF}, {0x6A, 0x1B, 0x9A, 0xFF}, {0x45, 0x45, 0x45, 0xFF},
}

const requirementHeight = 4.6 * vg.Inch

func drawRequirement(dc draw.Canvas, res *sweep.Result, rs RequirementSeries) {
	dir := "at least"
	if len(rs.Curves) > 0 && !rs.Curves[0].AtLeast {
		dir = "at most"
	}
	title := fmt.Sprintf("%s: %s, %s the model needs (limit %q)\nsolid: needed at each scale; dashed: what each facility has", res.Name, rs.Strategy, Label(rs.Capability), rs.Limit)
	p := newPlot(title, rs.X[0], rs.X[len(rs.X)-1])
	// A centrifuge's capacity is a payload mass times the g-level: shown
	// in g·t as the trade states it, not in kg.
	unit, scale := rs.Unit, 1.0
	if rs.Capability == "capacity" && rs.Unit == "kg" {
		unit, scale = "g·t", 1e-3
	}
	p.Y.Label.Text = fmt.Sprintf("%s needed (%s) [%s]", Label(rs.Capability), dir, unit)
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = logTicks{format: plainNumber}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, c := range rs.Curves {
		for _, v := range append(append([]float64(nil), c.Needed...), c.Have) {
			if v *= scale; v > 0 && !math.IsInf(v, 0) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	if !(hi > lo) {
		lo, hi = lo/2, lo*2
	}
	p.Y.Min, p.Y.Max = lo/1.3, hi*1.3
	for i, c := range rs.Curves {
		clr := requirementColors[i%len(requirementColors)]
		var xy plotter.XYs
		for k, v := range c.Needed {
			if v *= scale; v > 0 && !math.IsInf(v, 0) {
				xy = append(xy, plotter.XY{X: rs.X[k], Y: v})
			}
		}
		if len(xy) > 1 {
			l, err := plotter.NewLine(xy)
			if err == nil {
				l.LineStyle = draw.LineStyle{Color: clr, Width: 1.6}
				label := clip(c.Label, 60)
				// A curve identical to an earlier one is drawn in dashes
				// over it, so both colours show, and the legend says so.
				if j := sameCurve(rs.Curves[:i], c.Needed); j >= 0 {
					l.LineStyle.Dashes = []vg.Length{6, 6}
					l.LineStyle.Width = 2.2
					label = clip(c.Label, 40) + " (same as " + clip(rs.Curves[j].Label, 30) + ")"
				}
				p.Add(l)
				p.Legend.Add(label, l)
			}
		}
		h, err := plotter.NewLine(plotter.XYs{{X: rs.X[0], Y: c.Have * scale}, {X: rs.X[len(rs.X)-1], Y: c.Have * scale}})
		if err == nil {
			h.LineStyle = draw.LineStyle{Color: clr, Width: 1.1, Dashes: []vg.Length{5, 3}}
			p.Add(h)
		}
	}
	p.Legend.Top = true
	p.Draw(inset(dc))
}

// sameCurve is the index of the first curve whose needs equal needed, or
// -1.
func sameCurve(curves []RequirementCurve, needed []float64) int {
	for j, c := range curves {
		if len(c.Needed) != len(needed) {
			continue
		}
		same := true
		for k, v := range c.Needed {
			w := needed[k]
			if math.IsNaN(v) || math.IsNaN(w) {
				if math.IsNaN(v) != math.IsNaN(w) {
					same = false
					break
				}
				continue
			}
			if v != w && math.Abs(v-w) > 1e-12*math.Abs(v) {
				same = false
				break
			}
		}
		if same {
			return j
		}
	}
	return -1
}
