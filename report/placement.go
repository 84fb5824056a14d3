package report

import (
	"image/color"
	"strings"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// labelPlacer places the labels of a map without collisions: each label
// has candidate positions, tried in order; a position is taken only when
// the label's box stays inside the area and clear of every label placed
// before and of the obstacles (window-edge lines, markers). A label with
// no free position is left out (the workbook lists every value).
type labelPlacer struct {
	area      vg.Rectangle
	boxes     []vg.Rectangle // labels placed
	obstacles []vg.Rectangle
}

// labelPad keeps placed labels this far apart.
const labelPad = vg.Length(1.5)

func newLabelPlacer(area vg.Rectangle) *labelPlacer { return &labelPlacer{area: area} }

// avoid adds an obstacle.
func (p *labelPlacer) avoid(r vg.Rectangle) { p.obstacles = append(p.obstacles, r) }

// avoidVertical adds a vertical line at x as an obstacle.
func (p *labelPlacer) avoidVertical(x vg.Length) {
	p.avoid(vg.Rectangle{Min: vg.Point{X: x - 1, Y: p.area.Min.Y}, Max: vg.Point{X: x + 1, Y: p.area.Max.Y}})
}

func overlaps(a, b vg.Rectangle, pad vg.Length) bool {
	return a.Min.X < b.Max.X+pad && b.Min.X < a.Max.X+pad && a.Min.Y < b.Max.Y+pad && b.Min.Y < a.Max.Y+pad
}

// free reports whether a box can be taken.
func (p *labelPlacer) free(r vg.Rectangle) bool {
	if r.Min.X < p.area.Min.X || r.Max.X > p.area.Max.X || r.Min.Y < p.area.Min.Y || r.Max.Y > p.area.Max.Y {
		return false
	}
	for _, b := range p.boxes {
		if overlaps(r, b, labelPad) {
			return false
		}
	}
	for _, o := range p.obstacles {
		if overlaps(r, o, 0) {
			return false
		}
	}
	return true
}

// labelBox is the box of text s with its bottom-left corner at at (the
// bottom of the descenders).
func labelBox(sty text.Style, at vg.Point, s string) vg.Rectangle {
	return vg.Rectangle{Min: at, Max: vg.Point{X: at.X + sty.Width(s), Y: at.Y + sty.Height(s)}}
}

// place draws s at the first free candidate (bottom-left corners), on a
// white veil when veil is set, and reports whether it found one.
func (p *labelPlacer) place(c draw.Canvas, sty text.Style, s string, corners []vg.Point, veil bool) (vg.Rectangle, bool) {
	for _, at := range corners {
		r := labelBox(sty, at, s)
		if !p.free(r) {
			continue
		}
		p.boxes = append(p.boxes, r)
		if veil {
			c.FillPolygon(color.NRGBA{0xFF, 0xFF, 0xFF, 0xD0}, rectPoints(vg.Rectangle{
				Min: vg.Point{X: r.Min.X - 1, Y: r.Min.Y}, Max: vg.Point{X: r.Max.X + 1, Y: r.Max.Y}}))
		}
		st := sty
		st.XAlign, st.YAlign = draw.XLeft, draw.YBottom
		c.FillText(st, vg.Point{X: at.X, Y: at.Y + sty.FontExtents().Descent}, s)
		return r, true
	}
	return vg.Rectangle{}, false
}

// around lists corners for a label of size w × h near a point: above
// right, above left, below right, below left, centred above and below,
// then the same farther out.
func around(pt vg.Point, w, h, gap vg.Length) []vg.Point {
	var out []vg.Point
	for k := vg.Length(0); k < 4; k++ {
		d := gap + k*(h+gap)
		out = append(out,
			vg.Point{X: pt.X + gap, Y: pt.Y + d}, vg.Point{X: pt.X - gap - w, Y: pt.Y + d},
			vg.Point{X: pt.X + gap, Y: pt.Y - d - h}, vg.Point{X: pt.X - gap - w, Y: pt.Y - d - h},
			vg.Point{X: pt.X - w/2, Y: pt.Y + d}, vg.Point{X: pt.X - w/2, Y: pt.Y - d - h})
	}
	return out
}

// wrapText breaks each line of s at spaces so no line is wider than w in
// sty (a single word wider than w stays whole).
func wrapText(sty text.Style, s string, w vg.Length) string {
	var out []string
	for _, line := range strings.Split(s, "\n") {
		cur := ""
		for _, word := range strings.Fields(line) {
			try := word
			if cur != "" {
				try = cur + " " + word
			}
			if cur != "" && sty.Width(try) > w {
				out = append(out, cur)
				cur = word
				continue
			}
			cur = try
		}
		out = append(out, cur)
	}
	return strings.Join(out, "\n")
}
