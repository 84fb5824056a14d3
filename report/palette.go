package report

import (
	"fmt"
	"image/color"
	"math"

	"github.com/xuri/excelize/v2"
)

// The margin palette of the feasibility maps.
//
// A margin is "decades of room" to the tightest limit (§2): ≥ 0 is
// feasible. The maps colour it in ten classes, five on each side of zero,
// with edges at ±0.1, ±0.3, ±1 and ±2 decades (a factor 1.26, 2, 10 and
// 100 of room or of shortfall). The infeasible side runs through oranges,
// dark for far short of a limit to pale just short of it; the feasible
// side through blues, pale just inside the limits to dark for ample room.
//
// Why it reads for the common colour-vision deficiencies: the two sides
// differ in hue along the blue–yellow axis, which protanopes and
// deuteranopes (the red–green deficiencies, by far the most common) keep,
// and along the red–green axis, which tritanopes keep; no class depends on
// telling red from green. Within each side the lightness falls steadily
// away from zero (CIE L* about 87, 71, 56, 42, 27 on the orange side and
// 88, 75, 58, 40, 22 on the blue side), so the order of the classes can be
// read from lightness alone. Simulated with the Machado, Oliveira and
// Fernandes (2009) matrices at full severity, adjacent classes stay at
// least ΔE*ab 15 apart and the two classes either side of zero at least 34
// (checked in plot_test.go). In greyscale the sign is carried by the edge
// ticks of the band charts and the bold zero contour, never by colour
// alone. The colours are our own choice, not a published scheme.

// MarginEdges are the class edges of the margin palette, in decades.
var MarginEdges = []float64{-2, -1, -0.3, -0.1, 0, 0.1, 0.3, 1, 2}

// marginColors holds one colour per class: below MarginEdges[0], between
// consecutive edges, and above the last edge.
var marginColors = []color.NRGBA{
	{0x6B, 0x2C, 0x00, 0xFF}, // < −2: far short of a limit
	{0xA8, 0x43, 0x00, 0xFF}, // −2 … −1
	{0xD9, 0x65, 0x0F, 0xFF}, // −1 … −0.3
	{0xF2, 0x9B, 0x4B, 0xFF}, // −0.3 … −0.1
	{0xFB, 0xD2, 0xA6, 0xFF}, // −0.1 … 0: just short
	{0xC9, 0xE1, 0xF5, 0xFF}, // 0 … 0.1: just inside
	{0x8D, 0xBD, 0xE6, 0xFF}, // 0.1 … 0.3
	{0x4F, 0x91, 0xCD, 0xFF}, // 0.3 … 1
	{0x22, 0x60, 0x9F, 0xFF}, // 1 … 2
	{0x0D, 0x34, 0x66, 0xFF}, // > 2: ample room
}

// noDataColor marks a point without a margin (NaN).
var noDataColor = color.NRGBA{0xB8, 0xB8, 0xB8, 0xFF}

// MarginClass returns the palette class of a margin: 0 … len(MarginEdges),
// or -1 for NaN. A margin exactly on an edge belongs to the class above
// it, so a margin of 0 is feasible.
func MarginClass(m float64) int {
	if math.IsNaN(m) {
		return -1
	}
	for i, e := range MarginEdges {
		if m < e {
			return i
		}
	}
	return len(MarginEdges)
}

// MarginColor returns the palette colour of a margin.
func MarginColor(m float64) color.NRGBA {
	k := MarginClass(m)
	if k < 0 {
		return noDataColor
	}
	return marginColors[k]
}

// MarginColors returns the class colours, most infeasible first.
func MarginColors() []color.NRGBA {
	return append([]color.NRGBA(nil), marginColors...)
}

// The workbook's map sheets colour their margin cells with the same
// classes and colours (marginBin, marginStyles).

// marginBin is the index in marginStyles of a margin's cell style: its
// palette class, or the last style (no data) for NaN.
func marginBin(m float64) int {
	if k := MarginClass(m); k >= 0 {
		return k
	}
	return len(marginColors)
}

// marginStyles adds one cell style per palette class to f, then one for
// no data: the class colour as fill, white text on the dark classes (CIE
// L* under 50) and black text on the others, two decimals.
func marginStyles(f *excelize.File) ([]int, error) {
	fills := append(MarginColors(), noDataColor)
	ids := make([]int, len(fills))
	for i, c := range fills {
		font := &excelize.Font{Color: "000000"}
		if lightness(c) < 50 {
			font.Color = "FFFFFF"
		}
		id, err := f.NewStyle(&excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{hexColor(c)}}, Font: font, NumFmt: 2})
		if err != nil {
			return nil, err
		}
		ids[i] = id
	}
	return ids, nil
}

// hexColor writes a colour as RRGGBB, as spreadsheets store fills.
func hexColor(c color.NRGBA) string {
	return fmt.Sprintf("%02X%02X%02X", c.R, c.G, c.B)
}

// lightness is the CIE L* of an sRGB colour (D65; IEC 61966-2-1 for the
// transfer curve, CIE 15 for L*).
func lightness(c color.NRGBA) float64 {
	lin := func(v uint8) float64 {
		x := float64(v) / 255
		if x <= 0.04045 {
			return x / 12.92
		}
		return math.Pow((x+0.055)/1.055, 2.4)
	}
	y := 0.2126*lin(c.R) + 0.7152*lin(c.G) + 0.0722*lin(c.B)
	if y > 216.0/24389 {
		return 116*math.Cbrt(y) - 16
	}
	return 24389.0 / 27 * y
}
