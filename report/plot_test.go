package report

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"scaleplan/sweep"
)

// The map tests build their results by hand, so they test the drawing
// and its data series, not the scenarios.

// plotGrid returns n log-spaced kL from a to b.
func plotGrid(a, b float64, n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	g[n-1] = b
	return g
}

// plotPeak is a margin that peaks at kL = at with height h and falls by
// slope decades per decade of kL either side: feasible within h/slope
// decades of at.
func plotPeak(grid []float64, at, h, slope float64) []float64 {
	m := make([]float64, len(grid))
	for i, k := range grid {
		m[i] = h - slope*math.Abs(math.Log10(k/at))
	}
	return m
}

// plotResult is a study with one strategy of two combinations: one
// feasible from 1:peak/10^(h/slope) to 1:peak·10^(h/slope), with costs,
// and one infeasible everywhere.
func plotResult(n int) *sweep.Result {
	grid := plotGrid(4, 120, n)
	plan := &sweep.Plan{
		Settings: sweep.Settings{Name: "test study", Currency: "EUR", InputsDate: "2026-11-30", ScaleFrom: 4, ScaleTo: 120, Points: n},
		Grid:     grid,
	}
	d := 0.5 / 2.0 // h/slope
	lo, hi := 20/math.Pow(10, d), 20*math.Pow(10, d)
	good := &sweep.ComboResult{Strategy: "Froude scaling", Technique: "dominant", Medium: "fresh water", Facility: "Deepwater tank",
		Axis: math.NaN(), Window: sweep.Window{{Lo: lo, Hi: hi, LoLimit: "blockage", HiLimit: "model Reynolds number"}},
		Recommended: lo, Largest: lo, Cheapest: hi, CheapestCost: 1000 + 4e5/(hi*hi), Cost: 1000 + 4e5/(lo*lo),
		ModelLength: 28 / lo, Margins: plotPeak(grid, 20, 0.5, 2)}
	good.CostCurve = make([]float64, n)
	for i, k := range grid {
		good.CostCurve[i] = 1000 + 4e5/(k*k)
	}
	bad := &sweep.ComboResult{Strategy: "Froude scaling", Technique: "dominant", Medium: "glycerine", Facility: "Estuary tank",
		Axis: math.NaN(), Recommended: math.NaN(), Largest: math.NaN(), Cheapest: math.NaN(), CheapestCost: math.NaN(),
		Cost: math.NaN(), ModelLength: math.NaN(), Margins: plotPeak(grid, 30, -0.2, 1.5),
		Failing: "no scale satisfies every limit"}
	sr := &sweep.StrategyResult{Name: "Froude scaling", Technique: "dominant", Combos: []*sweep.ComboResult{good, bad}, Best: good}
	return &sweep.Result{Plan: plan, Name: plan.Settings.Name, Strategies: []*sweep.StrategyResult{sr}}
}

// plotAxisResult adds a second axis (carriage speed, m/s) to plotResult:
// the window narrows as the speed falls and closes below 1 m/s.
func plotAxisResult(n, na int) *sweep.Result {
	res := plotResult(n)
	p := res.Plan
	p.Settings.Axis = "carriage_speed_max"
	p.Settings.AxisFrom, p.Settings.AxisTo, p.Settings.AxisPoints = 0.5, 4, na
	p.AxisValues = plotGrid(0.5, 4, na)
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		panic(err)
	}
	p.Catalog = cat
	p.Facilities = []*sweep.Facility{{Name: "Deepwater tank", Type: "towing_tank"}}
	good := res.Strategies[0].Combos[0]
	for _, v := range p.AxisValues {
		row := plotPeak(p.Grid, 20, 0.5*math.Log10(v)/math.Log10(4), 2)
		good.AxisMargins = append(good.AxisMargins, row)
	}
	good.Axis = 4
	good.Margins = good.AxisMargins[na-1]
	return res
}

func TestParsePlotFormat(t *testing.T) {
	for in, want := range map[string]string{"": "png", "png": "png", "SVG": "svg", ".pdf": "pdf", " Png ": "png"} {
		got, err := ParsePlotFormat(in)
		if err != nil || got != want {
			t.Errorf("ParsePlotFormat(%q) = %q, %v; want %q", in, got, err, want)
		}
	}
	for _, in := range []string{"jpg", "eps", "png2"} {
		if _, err := ParsePlotFormat(in); err == nil || !strings.Contains(err.Error(), "png, svg or pdf") {
			t.Errorf("ParsePlotFormat(%q): got error %v, want one listing png, svg or pdf", in, err)
		}
	}
}

func TestBandData(t *testing.T) {
	res := plotResult(200)
	sr := res.Strategies[0]
	bc := BandData(res, sr)
	grid := res.Plan.Grid
	if len(bc.X) != len(grid) || bc.X[0] != grid[0] || bc.X[len(bc.X)-1] != grid[len(grid)-1] {
		t.Fatalf("X: %d samples from %v to %v, want the grid (%d from %v to %v)", len(bc.X), bc.X[0], bc.X[len(bc.X)-1], len(grid), grid[0], grid[len(grid)-1])
	}
	if len(bc.Rows) != 2 || bc.More != 0 {
		t.Fatalf("rows: got %d (+%d more), want 2", len(bc.Rows), bc.More)
	}
	for r, row := range bc.Rows {
		c := sr.Combos[r]
		if row.Combo != c {
			t.Errorf("row %d: shows another combination", r)
		}
		if want := Candidate(c); row.Label != want {
			t.Errorf("row %d: label %q, want %q", r, row.Label, want)
		}
		if row.Best != (c == sr.Best) {
			t.Errorf("row %d: Best = %v", r, row.Best)
		}
		for i := range grid {
			if row.Margin[i] != c.Margins[i] {
				t.Fatalf("row %d: margin %d is %v, want %v", r, i, row.Margin[i], c.Margins[i])
			}
		}
		var want []Edge
		for _, iv := range c.Window {
			want = append(want, Edge{iv.Lo, iv.LoLimit, "large"}, Edge{iv.Hi, iv.HiLimit, "small"})
		}
		if fmt.Sprint(row.Edges) != fmt.Sprint(want) {
			t.Errorf("row %d: edges %v, want %v", r, row.Edges, want)
		}
	}
	// The colours agree with the window: feasible classes inside it,
	// infeasible ones outside.
	row := bc.Rows[0]
	for i, k := range bc.X {
		feasible := MarginClass(row.Margin[i]) >= MarginClass(0)
		if feasible != row.Combo.Window.Contains(k) {
			t.Errorf("at 1:%.4g margin %.3f is drawn feasible=%v, but the window %s says otherwise", k, row.Margin[i], feasible, WindowText(row.Combo.Window))
		}
	}
	// The case joins the label when there is one.
	sr.Combos[1].Case = "loaded"
	if got := BandData(res, sr).Rows[1].Label; got != "loaded: glycerine in Estuary tank" {
		t.Errorf("label with a case: %q", got)
	}
}

func TestBandDataThinsLargeGrids(t *testing.T) {
	res := plotResult(5001)
	c := res.Strategies[0].Combos[0]
	grid := res.Plan.Grid
	// An infeasible dip one grid point wide, inside the feasible stretch
	// around 1:20, must survive the thinning.
	dip := 0
	for i, k := range grid {
		if math.Abs(math.Log(k/20)) < math.Abs(math.Log(grid[dip]/20)) {
			dip = i
		}
	}
	c.Margins[dip+1] = -0.05
	bc := BandData(res, res.Strategies[0])
	if len(bc.X) != DisplayColumns || bc.X[0] != grid[0] || bc.X[len(bc.X)-1] != grid[len(grid)-1] {
		t.Fatalf("X: %d samples from %v to %v, want %d from %v to %v", len(bc.X), bc.X[0], bc.X[len(bc.X)-1], DisplayColumns, grid[0], grid[len(grid)-1])
	}
	shown := 0
	for _, m := range bc.Rows[0].Margin {
		if m == -0.05 {
			shown++
		}
	}
	if shown != 1 {
		t.Errorf("the one infeasible grid point shows in %d samples, want 1", shown)
	}
	// Every sample is the smallest margin of the grid points nearest to
	// it: a sample is drawn feasible only where all its points are.
	for k, x := range bc.X {
		lo, hi := x, x
		if k > 0 {
			lo = math.Sqrt(bc.X[k-1] * x)
		}
		if k < len(bc.X)-1 {
			hi = math.Sqrt(x * bc.X[k+1])
		}
		for i, g := range grid {
			if g > lo*1.0001 && g < hi/1.0001 && c.Margins[i] < bc.Rows[0].Margin[k] {
				t.Fatalf("sample %d (1:%.4g) shows margin %v above grid point 1:%.4g with %v", k, x, bc.Rows[0].Margin[k], g, c.Margins[i])
			}
		}
	}
}

func TestBandRowsCapped(t *testing.T) {
	res := plotResult(50)
	sr := res.Strategies[0]
	base := sr.Combos[1]
	var combos []*sweep.ComboResult
	for i := 0; i < MaxBandRows+9; i++ {
		c := *base
		c.Facility = fmt.Sprintf("tank %02d", i)
		combos = append(combos, &c)
	}
	combos = append(combos, sr.Best) // last in sweep order
	sr.Combos = combos
	bc := BandData(res, sr)
	if len(bc.Rows) != MaxBandRows || bc.More != 10 {
		t.Fatalf("got %d rows (+%d more), want %d (+10 more)", len(bc.Rows), bc.More, MaxBandRows)
	}
	if !bc.Rows[len(bc.Rows)-1].Best {
		t.Errorf("the recommended combination is left out of a capped chart")
	}
	w, h := bandSize(bc)
	if w != plotWidth || h < bandFixedH+vg.Length(len(bc.Rows))*bandRowHDense {
		t.Errorf("size %v × %v: too small for %d rows", w, h, len(bc.Rows))
	}
	dir := t.TempDir()
	files, err := WritePlots(dir, "many", res, "png")
	if err != nil {
		t.Fatal(err)
	}
	plotCheckPNG(t, files[0])
}

func TestContourData(t *testing.T) {
	if cm := ContourData(plotResult(100), plotResult(100).Strategies[0]); cm != nil {
		t.Errorf("a one-axis sweep has a contour map")
	}
	res := plotAxisResult(150, 12)
	sr := res.Strategies[0]
	cm := ContourData(res, sr)
	if cm == nil {
		t.Fatal("no contour map for a two-axis sweep")
	}
	p := res.Plan
	if cm.Combo != sr.Best || cm.Axis != "carriage_speed_max" || cm.Unit != "m/s" || !cm.YLog {
		t.Errorf("map of %v, axis %q [%s], log %v", cm.Label, cm.Axis, cm.Unit, cm.YLog)
	}
	if cm.X[0] != p.Grid[0] || cm.X[len(cm.X)-1] != p.Grid[len(p.Grid)-1] || len(cm.X) != len(p.Grid) {
		t.Errorf("X runs from %v to %v, want the grid", cm.X[0], cm.X[len(cm.X)-1])
	}
	if cm.Y[0] != p.AxisValues[0] || cm.Y[len(cm.Y)-1] != p.AxisValues[len(p.AxisValues)-1] {
		t.Errorf("Y runs from %v to %v, want the axis", cm.Y[0], cm.Y[len(cm.Y)-1])
	}
	if len(cm.Z) != len(cm.Y) || len(cm.Z[0]) != len(cm.X) {
		t.Fatalf("Z is %d × %d, want %d × %d", len(cm.Z), len(cm.Z[0]), len(cm.Y), len(cm.X))
	}
	for j := range cm.Z {
		for i := range cm.Z[j] {
			if cm.Z[j][i] != sr.Best.AxisMargins[j][i] {
				t.Fatalf("Z[%d][%d] = %v, want %v", j, i, cm.Z[j][i], sr.Best.AxisMargins[j][i])
			}
		}
	}
	has0 := false
	for _, l := range cm.Levels {
		has0 = has0 || l == 0
	}
	if !has0 {
		t.Errorf("levels %v lack 0", cm.Levels)
	}
	if fmt.Sprint(cm.Levels) != "[-1 -0.3 -0.1 0 0.1 0.3]" {
		t.Errorf("levels %v, want the palette edges within the data", cm.Levels)
	}
	// The zero contour runs along the window edges: here the margin is
	// linear in log kL on either side of the peak and linear in log speed,
	// so the interpolated crossings are exact to float noise.
	u, v := (&contourPlotter{cm: cm}).coords()
	z := make([][]float64, len(cm.Z))
	copy(z, cm.Z)
	lines := isolines(u, v, z, 0)
	if len(lines) == 0 {
		t.Fatal("no zero contour")
	}
	for _, line := range lines {
		for _, q := range line {
			y := math.Pow(10, q.v)
			h := 0.5 * math.Log10(y) / math.Log10(4)
			if h < 0 {
				t.Fatalf("zero contour at an axis value %v where nothing is feasible", y)
			}
			if d := math.Abs(math.Abs(q.u-math.Log10(20)) - h/2); d > 1e-9 {
				t.Fatalf("zero contour point (1:%.4g, %.4g) is %.3g decades off the window edge", math.Pow(10, q.u), y, d)
			}
		}
	}
}

func TestIsolinesSimple(t *testing.T) {
	// z = u − 0.35 on a 3 × 3 grid: one straight zero line at u = 0.35.
	u, v := []float64{0, 0.5, 1}, []float64{0, 1, 2}
	z := [][]float64{{-0.35, 0.15, 0.65}, {-0.35, 0.15, 0.65}, {-0.35, 0.15, 0.65}}
	lines := isolines(u, v, z, 0)
	if len(lines) != 1 || len(lines[0]) != 3 {
		t.Fatalf("got %v, want one line of three points", lines)
	}
	for _, q := range lines[0] {
		if math.Abs(q.u-0.35) > 1e-12 {
			t.Errorf("point %v off u = 0.35", q)
		}
	}
	// A closed level: a peak in the middle gives one loop.
	z = [][]float64{{-1, -1, -1}, {-1, 1, -1}, {-1, -1, -1}}
	lines = isolines(u, v, z, 0)
	if len(lines) != 1 || len(lines[0]) != 5 || lines[0][0] != lines[0][4] {
		t.Errorf("got %v, want one closed loop of four points", lines)
	}
}

func TestCostData(t *testing.T) {
	res := plotResult(300)
	sr := res.Strategies[0]
	cs := CostData(res, sr)
	if cs == nil {
		t.Fatal("no cost series")
	}
	grid := res.Plan.Grid
	if cs.Combo != sr.Best || cs.Currency != "EUR" || fmt.Sprint(cs.Window) != fmt.Sprint(sr.Best.Window) {
		t.Errorf("series of %q in %q, window %v", cs.Label, cs.Currency, cs.Window)
	}
	if len(cs.X) != len(grid) || cs.X[0] != grid[0] || cs.X[len(cs.X)-1] != grid[len(grid)-1] {
		t.Errorf("X runs from %v to %v, want the grid", cs.X[0], cs.X[len(cs.X)-1])
	}
	for i := range cs.X {
		if cs.Cost[i] != sr.Best.CostCurve[i] {
			t.Fatalf("cost %d: %v, want %v", i, cs.Cost[i], sr.Best.CostCurve[i])
		}
	}
	sr.Best.CostCurve = nil
	if cs := CostData(res, sr); cs != nil {
		t.Errorf("a study without cost curves has a cost plot")
	}
	// A large grid is thinned by picking grid points.
	res = plotResult(4500)
	cs = CostData(res, res.Strategies[0])
	if len(cs.X) != MaxPlotPoints || cs.X[0] != res.Plan.Grid[0] || cs.X[len(cs.X)-1] != res.Plan.Grid[4499] {
		t.Errorf("thinned X: %d points from %v to %v", len(cs.X), cs.X[0], cs.X[len(cs.X)-1])
	}
}

func TestLogTicks(t *testing.T) {
	labels := func(min, max float64) []string {
		var out []string
		for _, tk := range (logTicks{format: scaleLabel}).Ticks(min, max) {
			if tk.Label != "" {
				if tk.Value < min*(1-1e-9) || tk.Value > max*(1+1e-9) {
					t.Errorf("tick %v outside %v … %v", tk.Value, min, max)
				}
				out = append(out, tk.Label)
			}
		}
		return out
	}
	for _, c := range []struct {
		min, max float64
		want     string
	}{
		{4, 60, "[1:5 1:10 1:20 1:50]"},
		{10, 1000, "[1:10 1:20 1:50 1:100 1:200 1:500 1:1000]"},
		{1, 1e8, "[1:1 1:10 1:100 1:1000 1:10000 1:100000 1:1000000 1:10000000 1:100000000]"},
		{12, 19, "[1:12 1:15 1:18]"},
	} {
		if got := fmt.Sprint(labels(c.min, c.max)); got != c.want {
			t.Errorf("ticks %v … %v: %s, want %s", c.min, c.max, got, c.want)
		}
	}
	if got := labels(21, 29); len(got) < 2 {
		t.Errorf("a short axis gets labels %v", got)
	}
}

// plotCheckPNG decodes a PNG map and checks that it has the width of the
// maps and is not blank: several colours, some of the margin palette.
func plotCheckPNG(t *testing.T, path string) image.Image {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	b := img.Bounds()
	if want := int(plotWidth.Points() / 72 * plotDPI); b.Dx() != want || b.Dy() < 3*plotDPI {
		t.Errorf("%s: %d × %d px, want %d wide and at least %d high", path, b.Dx(), b.Dy(), want, 3*plotDPI)
	}
	colours := map[color.NRGBA]int{}
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			colours[color.NRGBAModel.Convert(img.At(x, y)).(color.NRGBA)]++
		}
	}
	white := colours[color.NRGBA{255, 255, 255, 255}]
	if len(colours) <= 3 || white == b.Dx()*b.Dy() {
		t.Errorf("%s looks blank: %d colours, %d of %d pixels white", path, len(colours), white, b.Dx()*b.Dy())
	}
	if white < b.Dx()*b.Dy()/20 {
		t.Errorf("%s has almost no white background", path)
	}
	return img
}

// plotHasColour reports whether at least n pixels of img have colour c.
func plotHasColour(img image.Image, c color.NRGBA, n int) bool {
	b := img.Bounds()
	count := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			if color.NRGBAModel.Convert(img.At(x, y)).(color.NRGBA) == c {
				count++
			}
		}
	}
	return count >= n
}

func TestWritePlotsPNG(t *testing.T) {
	res := plotAxisResult(200, 10)
	dir := t.TempDir()
	files, err := WritePlots(dir, "test_study", res, "")
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"test_study.band-1-Froude_scaling.png", "test_study.contour-1-Froude_scaling.png", "test_study.cost-1-Froude_scaling.png"}
	var got []string
	for _, f := range files {
		if filepath.Dir(f) != dir {
			t.Errorf("%s is not in %s", f, dir)
		}
		got = append(got, filepath.Base(f))
	}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Fatalf("files %v, want %v", got, want)
	}
	band := plotCheckPNG(t, files[0])
	contour := plotCheckPNG(t, files[1])
	plotCheckPNG(t, files[2])
	// The band of the feasible row shows the feasible colours, that of the
	// infeasible row the infeasible ones; the contour map fills both.
	for _, m := range []float64{-0.5, -0.2, -0.05, 0.05, 0.2} {
		if !plotHasColour(band, MarginColor(m), 50) {
			t.Errorf("band chart lacks the colour of margin %v", m)
		}
		if !plotHasColour(contour, MarginColor(m), 50) {
			t.Errorf("contour map lacks the colour of margin %v", m)
		}
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != len(files) {
		t.Errorf("the folder holds %d files, want the %d maps (no temporary files left)", len(entries), len(files))
	}
	// The same result gives the same bytes.
	dir2 := t.TempDir()
	files2, err := WritePlots(dir2, "test_study", res, "png")
	if err != nil {
		t.Fatal(err)
	}
	plotSameFiles(t, files, files2)
}

func plotSameFiles(t *testing.T, a, b []string) {
	t.Helper()
	if len(a) != len(b) {
		t.Fatalf("%d files, then %d", len(a), len(b))
	}
	for i := range a {
		x, err1 := os.ReadFile(a[i])
		y, err2 := os.ReadFile(b[i])
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if !bytes.Equal(x, y) {
			t.Errorf("%s differs between two writes of the same result", filepath.Base(a[i]))
		}
	}
}

func TestWritePlotsSVGAndPDF(t *testing.T) {
	res := plotAxisResult(120, 8)
	for _, format := range []string{"svg", "pdf"} {
		dir, dir2 := t.TempDir(), t.TempDir()
		files, err := WritePlots(dir, "s", res, format)
		if err != nil {
			t.Fatal(err)
		}
		if len(files) != 3 {
			t.Fatalf("%s: %d files, want 3", format, len(files))
		}
		for _, f := range files {
			if !strings.HasSuffix(f, "."+format) {
				t.Errorf("%s: name lacks .%s", f, format)
			}
			b, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			switch format {
			case "svg":
				if !bytes.HasPrefix(b, []byte("<?xml")) || !bytes.Contains(b[:200], []byte("<svg")) {
					t.Errorf("%s does not start like an SVG: %q", f, b[:min(60, len(b))])
				}
				if !bytes.Contains(b, []byte("margin [decades]")) && !strings.Contains(f, "cost") {
					t.Errorf("%s lacks the colour-bar label", f)
				}
			case "pdf":
				if !bytes.HasPrefix(b, []byte("%PDF-")) {
					t.Errorf("%s does not start like a PDF: %q", f, b[:min(20, len(b))])
				}
				if !regexp.MustCompile(`/CreationDate \(D:20261130000000\)`).Match(b) {
					t.Errorf("%s: the creation date is not the fixed inputs date", f)
				}
			}
		}
		files2, err := WritePlots(dir2, "s", res, format)
		if err != nil {
			t.Fatal(err)
		}
		plotSameFiles(t, files, files2)
	}
}

func TestWritePlotsEdgeCases(t *testing.T) {
	dir := t.TempDir()
	if _, err := WritePlots(dir, "x", plotResult(10), "gif"); err == nil {
		t.Error("an unknown format is accepted")
	}
	if files, err := WritePlots(dir, "x", nil, "png"); err != nil || len(files) != 0 {
		t.Errorf("a nil result: %v, %v", files, err)
	}
	// A strategy where nothing is feasible, with a condition that cannot
	// hold (margins −Inf), a NaN margin and a failed combination still
	// gets its band chart.
	res := plotResult(60)
	sr := res.Strategies[0]
	sr.Best = nil
	sr.Combos[0].Window = nil
	sr.Combos[0].CostCurve = nil
	for i := range sr.Combos[0].Margins {
		sr.Combos[0].Margins[i] = math.Inf(-1)
	}
	sr.Combos[1].Margins[5] = math.NaN()
	sr.Combos = append(sr.Combos, &sweep.ComboResult{Medium: "air", Err: "Costs!D3: unknown quantity", Recommended: math.NaN()})
	// A single-scale window from a similarity condition.
	sr.Joint = []*sweep.ComboResult{{Case: "all cases (a + b)", Facility: "Deepwater tank", Recommended: 20,
		Window: sweep.Window{{Lo: 20, Hi: 20, LoLimit: "similarity: Froude", HiLimit: "similarity: Froude"}}}}
	files, err := WritePlots(dir, "x", res, "png")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) != 1 || !strings.Contains(files[0], ".band-1-") {
		t.Fatalf("files %v, want the band chart only", files)
	}
	img := plotCheckPNG(t, files[0])
	if !plotHasColour(img, noDataColor, 50) {
		t.Error("rows without margins are not drawn grey")
	}
	bc := BandData(res, sr)
	if len(bc.Rows) != 4 || fmt.Sprint(bc.Rows[3].Edges) != "[{20 similarity: Froude only}]" {
		t.Errorf("rows %d, joint edges %v", len(bc.Rows), bc.Rows[3].Edges)
	}
}

func TestFitText(t *testing.T) {
	sty := textStyle(8, inkColor)
	long := strings.Repeat("limit short by 0.5 decades; ", 40)
	got := fitText(sty, long, 300)
	if sty.Width(got) > 300 || !strings.HasSuffix(got, "…") || !strings.HasPrefix(long, strings.TrimSuffix(got, "…")) {
		t.Errorf("fitText: %q is %v wide", got, sty.Width(got))
	}
	if got := fitText(sty, "short", 300); got != "short" {
		t.Errorf("fitText shortened a text that fits: %q", got)
	}
	// The longest prefix that fits, as dropping one character at a time
	// finds it.
	oneByOne := func(s string, w vg.Length) string {
		r := []rune(s)
		for n := len(r); n > 1 && sty.Width(s) > w; n-- {
			s = string(r[:n-1]) + "…"
		}
		return s
	}
	for _, s := range []string{"water–glycerol 60 % in Deepwater tank [recommended]", "ü", "ab", "Ω·m²/s ≤ 3×10⁻⁶"} {
		for _, w := range []vg.Length{0, 5, 20, 40, 80, 160, 400} {
			if got, want := fitText(sty, s, w), oneByOne(s, w); got != want {
				t.Errorf("fitText(%q, %v) = %q, want %q", s, w, got, want)
			}
		}
	}
}

func TestPaletteClasses(t *testing.T) {
	if MarginClass(0) != len(MarginEdges)/2+1 || MarginClass(-1e-9) != len(MarginEdges)/2 {
		t.Errorf("0 is not the first feasible class")
	}
	if MarginClass(math.Inf(-1)) != 0 || MarginClass(math.Inf(1)) != len(marginColors)-1 || MarginClass(math.NaN()) != -1 {
		t.Error("infinite or NaN margins are misclassed")
	}
	if len(marginColors) != len(MarginEdges)+1 {
		t.Fatal("one colour per class")
	}
}

// Colour-vision deficiency simulation (Machado, Oliveira & Fernandes 2009,
// "A physiologically-based model for simulation of color vision
// deficiency", IEEE TVCG 15(6), severity 1.0), applied to linear sRGB;
// differences in CIE L*a*b* (D65).
var plotCVD = map[string][3][3]float64{
	"normal":       {{1, 0, 0}, {0, 1, 0}, {0, 0, 1}},
	"protanopia":   {{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}},
	"deuteranopia": {{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}},
	"tritanopia":   {{1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602}, {0.004733, 0.691367, 0.303900}},
}

func plotLab(c color.NRGBA, m [3][3]float64) [3]float64 {
	lin := func(v uint8) float64 {
		x := float64(v) / 255
		if x <= 0.04045 {
			return x / 12.92
		}
		return math.Pow((x+0.055)/1.055, 2.4)
	}
	in := [3]float64{lin(c.R), lin(c.G), lin(c.B)}
	var s [3]float64
	for i := range s {
		s[i] = math.Max(0, math.Min(1, m[i][0]*in[0]+m[i][1]*in[1]+m[i][2]*in[2]))
	}
	x := (0.4124564*s[0] + 0.3575761*s[1] + 0.1804375*s[2]) / 0.95047
	y := 0.2126729*s[0] + 0.7151522*s[1] + 0.0721750*s[2]
	z := (0.0193339*s[0] + 0.1191920*s[1] + 0.9503041*s[2]) / 1.08883
	f := func(t float64) float64 {
		if t > 216.0/24389 {
			return math.Cbrt(t)
		}
		return (24389.0/27*t + 16) / 116
	}
	return [3]float64{116*f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))}
}

func plotDeltaE(a, b [3]float64) float64 {
	return math.Sqrt((a[0]-b[0])*(a[0]-b[0]) + (a[1]-b[1])*(a[1]-b[1]) + (a[2]-b[2])*(a[2]-b[2]))
}

func TestPaletteColourBlindSafe(t *testing.T) {
	zero := MarginClass(0) // the first feasible class
	for name, m := range plotCVD {
		labs := make([][3]float64, len(marginColors))
		for i, c := range marginColors {
			labs[i] = plotLab(c, m)
		}
		for i := 1; i < len(labs); i++ {
			if d := plotDeltaE(labs[i-1], labs[i]); d < 15 {
				t.Errorf("%s: classes %d and %d are only ΔE %.1f apart", name, i-1, i, d)
			}
		}
		if d := plotDeltaE(labs[zero-1], labs[zero]); d < 30 {
			t.Errorf("%s: the classes either side of 0 are only ΔE %.1f apart", name, d)
		}
		// Mirror classes (same size of margin, opposite sign) differ.
		for i := 0; i < zero; i++ {
			if d := plotDeltaE(labs[i], labs[len(labs)-1-i]); d < 30 {
				t.Errorf("%s: class %d and its mirror are only ΔE %.1f apart", name, i, d)
			}
		}
		// Lightness rises towards 0 on the infeasible side and falls away
		// from it on the feasible side.
		for i := 1; i < len(labs); i++ {
			up := labs[i][0] > labs[i-1][0]
			if (i < zero) != up && i != zero {
				t.Errorf("%s: lightness of class %d (%.0f) against class %d (%.0f) breaks the order", name, i, labs[i][0], i-1, labs[i-1][0])
			}
		}
	}
}

func TestWritePlotsConcurrently(t *testing.T) {
	// Studies of a batch run in parallel; their maps must not interfere.
	res := plotAxisResult(80, 6)
	want := t.TempDir()
	ref, err := WritePlots(want, "c", res, "png")
	if err != nil {
		t.Fatal(err)
	}
	dirs := make([]string, 4)
	errs := make(chan error, len(dirs))
	for i := range dirs {
		dirs[i] = t.TempDir()
		go func(dir, format string) {
			_, err := WritePlots(dir, "c", plotAxisResult(80, 6), format)
			errs <- err
		}(dirs[i], []string{"png", "svg", "pdf", "png"}[i])
	}
	for range dirs {
		if err := <-errs; err != nil {
			t.Error(err)
		}
	}
	for _, i := range []int{0, 3} { // the PNG writers
		got, _ := filepath.Glob(filepath.Join(dirs[i], "c.*-1-Froude_scaling.png")) // sorted: band, contour, cost
		plotSameFiles(t, ref, got)
	}
}
