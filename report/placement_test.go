package report

import (
	"fmt"
	"image"
	"image/color"
	"math"
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// textRecorder is a canvas that draws nothing and records the box of
// every text drawn upright, in page coordinates: its advance width from
// the font, one em tall from the bottom of the descenders (lines of a
// multi-line text are one em apart) (rotated text, the vertical axis labels, is left out).
type textRecorder struct {
	w, h  vg.Length
	stack []textState
	texts []drawnText
	// rules are the long vertical lines stroked (window edges, axes).
	rules [][2]vg.Point
}

type textState struct {
	off     vg.Point
	rotated bool
}

type drawnText struct {
	s    string
	size vg.Length
	box  vg.Rectangle
}

func newTextRecorder(w, h vg.Length) *textRecorder {
	return &textRecorder{w: w, h: h, stack: []textState{{}}}
}

func (r *textRecorder) top() *textState                    { return &r.stack[len(r.stack)-1] }
func (r *textRecorder) SetLineWidth(vg.Length)             {}
func (r *textRecorder) SetLineDash([]vg.Length, vg.Length) {}
func (r *textRecorder) SetColor(color.Color)               {}
func (r *textRecorder) Rotate(a float64)                   { r.top().rotated = r.top().rotated || a != 0 }
func (r *textRecorder) Translate(p vg.Point)               { t := r.top(); t.off.X += p.X; t.off.Y += p.Y }
func (r *textRecorder) Scale(float64, float64)             {}
func (r *textRecorder) Push()                              { r.stack = append(r.stack, *r.top()) }
func (r *textRecorder) Pop()                               { r.stack = r.stack[:len(r.stack)-1] }
func (r *textRecorder) Stroke(p vg.Path) {
	if len(p) != 2 || p[0].Type != vg.MoveComp || p[1].Type != vg.LineComp {
		return
	}
	a, b := p[0].Pos, p[1].Pos
	if math.Abs(float64(a.X-b.X)) < 0.01 && math.Abs(float64(a.Y-b.Y)) > 0.4*float64(r.h) {
		off := r.top().off
		a.X, a.Y, b.X, b.Y = a.X+off.X, a.Y+off.Y, b.X+off.X, b.Y+off.Y
		r.rules = append(r.rules, [2]vg.Point{a, b})
	}
}
func (r *textRecorder) Fill(vg.Path)                        {}
func (r *textRecorder) DrawImage(vg.Rectangle, image.Image) {}
func (r *textRecorder) Size() (vg.Length, vg.Length)        { return r.w, r.h }

func (r *textRecorder) FillString(f font.Face, pt vg.Point, s string) {
	t := r.top()
	if t.rotated || s == "" {
		return
	}
	ext := f.Extents()
	x, y := pt.X+t.off.X, pt.Y+t.off.Y
	r.texts = append(r.texts, drawnText{s, f.Font.Size, vg.Rectangle{
		Min: vg.Point{X: x, Y: y - ext.Descent}, Max: vg.Point{X: x + f.Width(s), Y: y - ext.Descent + f.Font.Size}}})
}

// placementScenario runs a built-in scenario.
func placementScenario(t *testing.T, name string) *sweep.Result {
	t.Helper()
	s, err := study.LoadScenario(name)
	if err != nil {
		t.Fatal(err)
	}
	return runStudy(t, s)
}

// mapTexts draws every map of a result onto recorders and returns, per
// map, its size and the texts drawn.
func mapTexts(res *sweep.Result) map[string]*textRecorder {
	out := map[string]*textRecorder{}
	record := func(name string, w, h vg.Length, fn func(draw.Canvas)) {
		rec := newTextRecorder(w, h)
		fn(draw.New(rec))
		out[name] = rec
	}
	for i, sr := range res.Strategies {
		if bc := BandData(res, sr); len(bc.Rows) > 0 {
			w, h := bandSize(bc)
			record(fmt.Sprintf("band-%d", i+1), w, h, func(dc draw.Canvas) { drawBand(dc, res, bc) })
		}
		if cm := ContourData(res, sr); cm != nil {
			record(fmt.Sprintf("contour-%d", i+1), plotWidth, contourHeight, func(dc draw.Canvas) { drawContour(dc, res, cm) })
		}
		if cs := CostData(res, sr); cs != nil {
			record(fmt.Sprintf("cost-%d", i+1), plotWidth, costHeight, func(dc draw.Canvas) { drawCost(dc, res, cs) })
		}
		for _, rs := range RequirementData(res, sr) {
			record(fmt.Sprintf("%s-%d", requireKind(rs), i+1), plotWidth, requirementHeight, func(dc draw.Canvas) { drawRequirement(dc, res, rs) })
		}
	}
	return out
}

// TestMapLabelsDoNotCollide draws every map of every built-in scenario
// and checks, from the text actually drawn and the font's metrics, that no
// two texts overlap, that no long vertical line (a window edge) runs
// through a text, that every text lies inside the figure (nothing
// clipped) and that no text is smaller than 8 pt (the figures are made at
// the width they are printed, 6.3 in, so text keeps its size on a portrait
// page).
func TestMapLabelsDoNotCollide(t *testing.T) {
	list, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	const tol = 0.25 // points of overlap tolerated (rounding of metrics)
	for _, sc := range list {
		res := placementScenario(t, sc.Name)
		for name, rec := range mapTexts(res) {
			where := sc.Name + " " + name
			if rec.w > plotWidth {
				t.Errorf("%s: %.2f in wide, more than the %.2f in of a portrait page", where, float64(rec.w/vg.Inch), float64(plotWidth/vg.Inch))
			}
			for i, a := range rec.texts {
				if a.size < 8 {
					t.Errorf("%s: %q is set in %.1f pt, under 8 pt", where, a.s, a.size)
				}
				if a.box.Min.X < -tol || a.box.Min.Y < -tol || a.box.Max.X > rec.w+tol || a.box.Max.Y > rec.h+tol {
					t.Errorf("%s: %q lies outside the figure (%v in %vx%v)", where, a.s, a.box, rec.w, rec.h)
				}
				for _, l := range rec.rules {
					lo, hi := math.Min(float64(l[0].Y), float64(l[1].Y)), math.Max(float64(l[0].Y), float64(l[1].Y))
					if l[0].X > a.box.Min.X+tol && l[0].X < a.box.Max.X-tol && hi > float64(a.box.Min.Y)+tol && lo < float64(a.box.Max.Y)-tol {
						t.Errorf("%s: the line at x = %.1f runs through %q", where, l[0].X, a.s)
					}
				}
				for _, b := range rec.texts[i+1:] {
					dx := math.Min(float64(a.box.Max.X), float64(b.box.Max.X)) - math.Max(float64(a.box.Min.X), float64(b.box.Min.X))
					dy := math.Min(float64(a.box.Max.Y), float64(b.box.Max.Y)) - math.Max(float64(a.box.Min.Y), float64(b.box.Min.Y))
					if dx > tol && dy > tol {
						t.Errorf("%s: %q and %q overlap (%v, %v)", where, a.s, b.s, a.box, b.box)
					}
				}
			}
		}
	}
}
