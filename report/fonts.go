package report

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
	"time"

	pdf "codeberg.org/go-pdf/fpdf"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// pdfCanvas draws a map into a PDF with the fonts embedded as Unicode
// (TrueType subsets with a ToUnicode table), so every character we print —
// the minus sign, ▲, thin spaces, names like Øresund — comes out as drawn
// and reads back as text.
//
// gonum/plot's own PDF canvas (vg/vgpdf) embeds its fonts with the one-byte
// code page 1252 and passes UTF-8 strings through unchanged, which garbles
// every non-ASCII character; it offers no way to embed a font as Unicode.
// This canvas follows the same drawing model (the fpdf library vgpdf is
// built on, the same transforms) and differs in how it handles text.
type pdfCanvas struct {
	doc   *pdf.Fpdf
	w, h  vg.Length
	stack []pdfContext
	fonts map[string]bool
	nimg  int
}

type pdfContext struct{ width vg.Length }

// pdfDPI is the resolution of PDF user space: one unit is one point.
const pdfDPI = 72

// newPDFCanvas returns a one-page PDF canvas of size w × h whose creation
// and modification dates are date (so the same map gives the same file).
func newPDFCanvas(w, h vg.Length, date time.Time) *pdfCanvas {
	doc := pdf.NewCustom(&pdf.InitType{UnitStr: "pt", Size: pdf.SizeType{Wd: w.Points(), Ht: h.Points()}})
	doc.SetCatalogSort(true)
	doc.SetCreationDate(date)
	doc.SetModificationDate(date)
	doc.SetMargins(0, 0, 0)
	doc.SetAutoPageBreak(false, 0)
	doc.AddPage()
	c := &pdfCanvas{doc: doc, w: w, h: h, stack: []pdfContext{{}}, fonts: map[string]bool{}}
	c.Push()
	c.Translate(vg.Point{X: 0, Y: h})
	c.Scale(1, -1)
	vg.Initialize(c)
	return c
}

func (c *pdfCanvas) unit(l vg.Length) float64 { return l.Dots(pdfDPI) }

func (c *pdfCanvas) point(p vg.Point) (float64, float64) { return c.unit(p.X), c.unit(p.Y) }

func (c *pdfCanvas) Size() (vg.Length, vg.Length) { return c.w, c.h }

func (c *pdfCanvas) SetLineWidth(w vg.Length) {
	c.stack[len(c.stack)-1].width = w
	c.doc.SetLineWidth(c.unit(w))
}

func (c *pdfCanvas) SetLineDash(dashes []vg.Length, offs vg.Length) {
	ds := make([]float64, len(dashes))
	for i, d := range dashes {
		ds[i] = c.unit(d)
	}
	c.doc.SetDashPattern(ds, c.unit(offs))
}

func (c *pdfCanvas) SetColor(clr color.Color) {
	if clr == nil {
		clr = color.Black
	}
	r, g, b, a := clr.RGBA()
	c.doc.SetFillColor(int(r>>8), int(g>>8), int(b>>8))
	c.doc.SetDrawColor(int(r>>8), int(g>>8), int(b>>8))
	c.doc.SetTextColor(int(r>>8), int(g>>8), int(b>>8))
	c.doc.SetAlpha(float64(a)/math.MaxUint16, "Normal")
}

func (c *pdfCanvas) Rotate(r float64) { c.doc.TransformRotate(-r*180/math.Pi, 0, 0) }

func (c *pdfCanvas) Translate(pt vg.Point) {
	x, y := c.point(pt)
	c.doc.TransformTranslate(x, y)
}

func (c *pdfCanvas) Scale(x, y float64) { c.doc.TransformScale(x*100, y*100, 0, 0) }

func (c *pdfCanvas) Push() {
	c.stack = append(c.stack, c.stack[len(c.stack)-1])
	c.doc.TransformBegin()
}

func (c *pdfCanvas) Pop() {
	c.doc.TransformEnd()
	c.stack = c.stack[:len(c.stack)-1]
}

func (c *pdfCanvas) Stroke(p vg.Path) {
	if c.stack[len(c.stack)-1].width > 0 {
		c.path(p, "D")
	}
}

func (c *pdfCanvas) Fill(p vg.Path) { c.path(p, "F") }

func (c *pdfCanvas) path(p vg.Path, style string) {
	var x0, y0 float64
	for _, comp := range p {
		switch comp.Type {
		case vg.MoveComp:
			x0, y0 = c.point(comp.Pos)
			c.doc.MoveTo(x0, y0)
		case vg.LineComp:
			c.doc.LineTo(c.point(comp.Pos))
		case vg.ArcComp:
			// Arcs as short chords: our maps draw only small markers.
			n := int(math.Ceil(math.Abs(comp.Angle) / (math.Pi / 16)))
			if n < 1 {
				n = 1
			}
			for k := 0; k <= n; k++ {
				a := comp.Start + comp.Angle*float64(k)/float64(n)
				pt := vg.Point{X: comp.Pos.X + comp.Radius*vg.Length(math.Cos(a)), Y: comp.Pos.Y + comp.Radius*vg.Length(math.Sin(a))}
				c.doc.LineTo(c.point(pt))
			}
		case vg.CurveComp:
			px, py := c.point(comp.Pos)
			switch len(comp.Control) {
			case 1:
				cx, cy := c.point(comp.Control[0])
				c.doc.CurveTo(cx, cy, px, py)
			case 2:
				cx, cy := c.point(comp.Control[0])
				dx, dy := c.point(comp.Control[1])
				c.doc.CurveBezierCubicTo(cx, cy, dx, dy, px, py)
			}
		case vg.CloseComp:
			c.doc.LineTo(x0, y0)
			c.doc.ClosePath()
		}
	}
	c.doc.DrawPath(style)
}

// FillString draws str with its baseline starting at pt, in the face's
// TrueType font embedded as Unicode.
func (c *pdfCanvas) FillString(fnt font.Face, pt vg.Point, str string) {
	if fnt.Font.Size == 0 || fnt.Face == nil {
		return
	}
	name := fnt.Name()
	if !c.fonts[name] {
		var raw bytes.Buffer
		if _, err := fnt.Face.WriteSourceTo(nil, &raw); err != nil {
			panic(fmt.Sprintf("font %s for PDF: %v", name, err))
		}
		c.doc.AddUTF8FontFromBytes(name, "", raw.Bytes())
		c.fonts[name] = true
	}
	c.doc.SetFont(name, "", c.unit(fnt.Font.Size))
	c.Push()
	defer c.Pop()
	c.Translate(pt)
	c.Scale(1, -1) // text upright in fpdf's top-down space
	c.doc.Text(0, 0, str)
}

// DrawImage draws an image into rect.
func (c *pdfCanvas) DrawImage(rect vg.Rectangle, img image.Image) {
	var buf bytes.Buffer
	if err := png.Encode(&buf, img); err != nil {
		panic(fmt.Sprintf("image for PDF: %v", err))
	}
	opts := pdf.ImageOptions{ImageType: "png"}
	c.nimg++
	name := fmt.Sprintf("image_%03d", c.nimg)
	c.doc.RegisterImageOptionsReader(name, opts, &buf)
	x, y := c.point(rect.Min)
	w, h := c.point(rect.Size())
	c.doc.ImageOptions(name, x, y, w, h, false, opts, 0, "")
}

// WriteTo closes the page and writes the PDF.
func (c *pdfCanvas) WriteTo(w io.Writer) (int64, error) {
	c.Pop()
	c.doc.Close()
	var buf bytes.Buffer
	if err := c.doc.Output(&buf); err != nil {
		return 0, err
	}
	n, err := w.Write(buf.Bytes())
	return int64(n), err
}

// pdfTime reads a date as pdfDate writes it.
func pdfTime(date string) time.Time {
	t, err := time.Parse("20060102150405", date)
	if err != nil {
		return time.Unix(0, 0).UTC()
	}
	return t
}
