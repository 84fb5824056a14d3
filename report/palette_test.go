package report

import (
	"image/color"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// TestMarginColoursAgree: a margin gets the same class and colour in the
// workbook's map sheet and in the PNG band chart. The good combination's
// margins run from −3 to 3 decades, through every class, with one point
// without a margin.
func TestMarginColoursAgree(t *testing.T) {
	const n = 241
	res := plotResult(n)
	good := res.Strategies[0].Combos[0]
	for i := range good.Margins {
		good.Margins[i] = -3 + 6*float64(i)/(n-1)
	}
	good.Margins[7] = math.NaN()
	res.Plan.Study = &study.Study{} // nothing to echo on the Inputs sheet
	for _, c := range res.Strategies[0].Combos {
		c.Limiting = make([]int, n) // every point limited by the first limit
		c.Limits = []sweep.LimitInfo{{Name: "blockage"}}
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "study.xlsx")
	if err := WriteWorkbook(path, res); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sheet := ""
	for _, s := range f.GetSheetList() {
		if strings.HasPrefix(s, "Map 1 ") {
			sheet = s
		}
	}
	if sheet == "" {
		t.Fatalf("no map sheet in %v", f.GetSheetList())
	}
	fill := func(gi int) string {
		cell, _ := excelize.CoordinatesToCellName(3, gi+2) // the first combination's margin
		id, err := f.GetCellStyle(sheet, cell)
		if err != nil {
			t.Fatal(err)
		}
		st, err := f.GetStyle(id)
		if err != nil || len(st.Fill.Color) == 0 {
			t.Fatalf("%s!%s: style %d has no fill (%v)", sheet, cell, id, err)
		}
		c := strings.ToUpper(strings.TrimPrefix(st.Fill.Color[0], "#"))
		return c[len(c)-6:]
	}
	classes := map[int]bool{}
	for gi, m := range good.Margins {
		if got, want := fill(gi), hexColor(MarginColor(m)); got != want {
			t.Errorf("margin %.3f (class %d): workbook fill %s, the maps' colour %s", m, MarginClass(m), got, want)
		}
		classes[MarginClass(m)] = true
	}
	if len(classes) != len(MarginEdges)+2 {
		t.Errorf("the sheet shows %d classes, want all %d and no data", len(classes), len(MarginEdges)+2)
	}
	// The palette as palette.go declares it, written out: far short, just
	// short, just inside, ample room.
	for _, c := range []struct {
		m    float64
		want string
	}{{-2.5, "6B2C00"}, {-0.05, "FBD2A6"}, {0.05, "C9E1F5"}, {2.5, "0D3466"}} {
		gi := int(math.Round((c.m + 3) / 6 * (n - 1)))
		if got := fill(gi); got != c.want {
			t.Errorf("margin %.3f: workbook fill %s, want %s", good.Margins[gi], got, c.want)
		}
	}

	// The band chart of the same result shows every class colour.
	files, err := WritePlots(dir, "study", res, "png")
	if err != nil {
		t.Fatal(err)
	}
	band := plotCheckPNG(t, files[0])
	if !strings.Contains(files[0], ".band-") {
		t.Fatalf("the first map is %s, want the band chart", files[0])
	}
	for k, c := range MarginColors() {
		if !plotHasColour(band, c, 20) {
			t.Errorf("the band chart lacks class %d (%s)", k, hexColor(c))
		}
	}
}

// TestLightness checks the CIE L* that picks white or black text on a
// fill: white has L* 100, black 0, and the mid grey #808080 53.59 (the
// common textbook conversion: sRGB 128 → linear 0.2159 → L* 53.59).
func TestLightness(t *testing.T) {
	for _, c := range []struct {
		c    color.NRGBA
		want float64
	}{{color.NRGBA{255, 255, 255, 255}, 100}, {color.NRGBA{0, 0, 0, 255}, 0}, {color.NRGBA{128, 128, 128, 255}, 53.59}} {
		if got := lightness(c.c); math.Abs(got-c.want) > 0.01 {
			t.Errorf("L* of %s = %.2f, want %.2f", hexColor(c.c), got, c.want)
		}
	}
}
