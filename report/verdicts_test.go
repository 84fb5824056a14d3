package report_test

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// anchorRun runs the invented drag-anchor study of sweep/testdata/anchor
// (a 1 g clay bin at 1:120 that relaxes gravity, a centrifuge at 1:160
// that relaxes nothing; the edges are worked by hand in
// sweep/rank_test.go) with extra Study settings.
func anchorRun(t *testing.T, settings ...string) *sweep.Result {
	t.Helper()
	s, err := study.Load("../sweep/testdata/anchor")
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i+1 < len(settings); i += 2 {
		s.Settings[settings[i]] = study.Setting{Name: settings[i], Value: settings[i+1], Cell: study.Cell{Sheet: "Study", Row: 50 + i, Col: 2}}
	}
	return wbRun(t, s)
}

// TestMemoSaysWhy: by default the centrifuge, which relaxes nothing,
// outranks the larger 1 g model whose Froude number is off by √120; with
// gravity marked weak the larger model wins. The memo says why in both.
func TestMemoSaysWhy(t *testing.T) {
	cases := []struct {
		settings []string
		want     []string
	}{
		{nil, []string{
			"Use **centrifuge** (simulated) at **1:160**",
			"**Why this strategy.** It ranks first of 3 (2 with a feasible scale): it relaxes no law.",
			// √120 ≈ 11: the Froude number's mismatch at 1:120 in 1 g.
			"1 g bin ranks 2 although its model is larger (1:120): it relaxes the gravity law (the model's Froude number is 11 times the prototype's, beyond the threshold 10), and a strategy without such a scale effect ranks first whatever the model sizes",
			"full similarity at 1 g ranks 3: no feasible scale",
		}},
		{[]string{"weak_laws", "gravity"}, []string{
			"Use **1 g bin** (dominant) at **1:120**",
			"It ranks first of 3 (2 with a feasible scale): it relaxes only laws the study marks weak (the gravity law).",
			"centrifuge ranks 2 (1:160, a smaller model): it relaxes no law.",
		}},
	}
	for _, c := range cases {
		rec := wbMemoSection(t, report.Memo(anchorRun(t, c.settings...)), "Recommendation")
		for _, want := range c.want {
			if !strings.Contains(rec, want) {
				t.Errorf("%v: the recommendation lacks %q:\n%s", c.settings, want, rec)
			}
		}
	}
}

// TestMemoTradeoffTable: the memo's trade-off table has five short
// columns (a document converter keeps them whole); each strategy's reason
// is a list item below it, with the hand-worked mismatch.
func TestMemoTradeoffTable(t *testing.T) {
	sec := wbMemoSection(t, report.Memo(anchorRun(t)), "Trade-offs")
	rows := wbMemoTable(sec)
	want := [][]string{
		{"1", "centrifuge ◆", "1:160, 0.075 m long", "9,000 EUR", "none"},
		{"2", "1 g bin ◆", "1:120, 0.1 m long", "1,500 EUR"},
		{"3", "full similarity at 1 g", "none", "–", "–"},
	}
	if len(rows) != len(want) {
		t.Fatalf("rows %q", rows)
	}
	for i, w := range want {
		if len(rows[i]) > 5 {
			t.Errorf("row %d has %d columns, at most 5 wanted", i+1, len(rows[i]))
		}
		for j, cell := range w {
			if j < len(rows[i]) && rows[i][j] != cell {
				t.Errorf("row %d cell %d: %q, want %q", i+1, j+1, rows[i][j], cell)
			}
		}
	}
	// π_p/π_m = 1/√120 (sweep/rank_test.go), printed to three figures.
	if got := rows[1][4]; got != "Froude number (gravity law), π_p/π_m = 0.0913" {
		t.Errorf("worst mismatch %q", got)
	}
	for _, reason := range []string{
		"- Rank 1, centrifuge: relaxes no law.",
		"- Rank 2, 1 g bin: relaxes the gravity law (the model's Froude number is 11 times the prototype's, beyond the threshold 10).",
		"- Rank 3, full similarity at 1 g: no feasible scale",
	} {
		if !strings.Contains(sec, reason) {
			t.Errorf("the trade-off section lacks %q:\n%s", reason, sec)
		}
	}
}

// TestTradeoffSheetMatchesWindows reads the Trade-offs and Windows sheets
// back and finds each strategy's numbers on its recommended combination's
// row of the Windows sheet.
func TestTradeoffSheetMatchesWindows(t *testing.T) {
	results := map[string]*sweep.Result{"drag-anchor": anchorRun(t)}
	for _, name := range []string{"tug", "tine", "conductor"} {
		results[name] = wbRunScenario(t, name)
	}
	for name, res := range results {
		t.Run(name, func(t *testing.T) {
			f := wbOpen(t, wbWrite(t, t.TempDir(), "s.xlsx", res))
			idx, _ := f.GetSheetIndex(report.TradeoffSheet)
			if len(res.Strategies) < 2 {
				if idx >= 0 {
					t.Error("a study with one strategy has no trade-offs")
				}
				return
			}
			if idx < 0 {
				t.Fatal("no Trade-offs sheet")
			}
			trade := wbRows(t, f, report.TradeoffSheet)
			win := wbRows(t, f, "Windows")
			tc := wbColumns(t, "Trade-offs", trade[0], "rank", "strategy", "feasible", "case", "medium", "material", "facility",
				"recommended kL", "model length", "cost [", "π_p/π_m", "mismatch factor")
			wc := wbColumns(t, "Windows", win[0], "strategy", "case", "medium", "material", "facility", "recommended kL", "model length", "cost [")
			n := 0
			for _, r := range trade[1:] {
				if wbAt(r, tc["rank"]) == "" {
					break
				}
				n++
				if rank, _ := strconv.Atoi(wbAt(r, tc["rank"])); rank != n {
					t.Errorf("row %d has rank %q", n, wbAt(r, tc["rank"]))
				}
				if wbAt(r, tc["feasible"]) != "yes" {
					continue
				}
				found := false
				for _, w := range win[1:] {
					same := true
					for _, k := range []string{"strategy", "case", "medium", "material", "facility"} {
						same = same && wbAt(w, wc[k]) == wbAt(r, tc[k])
					}
					if !same || wbAt(w, wc["recommended kL"]) != wbAt(r, tc["recommended kL"]) {
						continue
					}
					found = true
					for _, k := range []string{"model length", "cost ["} {
						if wbAt(w, wc[k]) != wbAt(r, tc[k]) {
							t.Errorf("%s: %s %q on Trade-offs, %q on Windows", wbAt(r, tc["strategy"]), k, wbAt(r, tc[k]), wbAt(w, wc[k]))
						}
					}
				}
				if !found {
					t.Errorf("%s: no Windows row with its combination and recommended kL %s", wbAt(r, tc["strategy"]), wbAt(r, tc["recommended kL"]))
				}
				// The mismatch factor is the ratio or its inverse, at least 1.
				if ratio, err := strconv.ParseFloat(wbAt(r, tc["π_p/π_m"]), 64); err == nil {
					size, _ := strconv.ParseFloat(wbAt(r, tc["mismatch factor"]), 64)
					if want := max(ratio, 1/ratio); !wbClose(size, want, 2e-3) {
						t.Errorf("%s: mismatch factor %v for π_p/π_m %v", wbAt(r, tc["strategy"]), size, ratio)
					}
				}
			}
			if n != len(res.Strategies) {
				t.Errorf("%d ranked rows, want %d", n, len(res.Strategies))
			}
		})
	}
}

func wbClose(a, b, tol float64) bool { return a == b || (a-b)/b < tol && (b-a)/b < tol }

func TestTradeoffPlotWritten(t *testing.T) {
	res := anchorRun(t)
	dir := t.TempDir()
	files, err := report.WritePlots(dir, "anchor", res, report.PlotSVG)
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, report.TradeoffPlotName("anchor", report.PlotSVG))
	if !strings.Contains(strings.Join(files, " "), path) {
		t.Fatalf("no trade-off plot among %v", files)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"1 g bin, 1500 EUR", "centrifuge, 9000 EUR", "threshold 10"} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("the plot lacks %q", want)
		}
	}
	// The infeasible strategy is not drawn.
	if bytes.Contains(b, []byte("full similarity")) {
		t.Error("an infeasible strategy is drawn")
	}
	// A study with one strategy has no trade-off plot.
	files, err = report.WritePlots(t.TempDir(), "c", wbRunScenario(t, "conductor"), report.PlotSVG)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range files {
		if strings.Contains(f, "tradeoffs") {
			t.Errorf("a trade-off plot for one strategy: %s", f)
		}
	}
}

func TestRunTextStatesVerdicts(t *testing.T) {
	var b bytes.Buffer
	if err := report.WriteRunText(&b, anchorRun(t)); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	for _, want := range []string{
		"Recommended: centrifuge at 1:160 (relaxes no law)",
		// Hand: soil_depth ≥ 3 × 12 m / kL at the grid point below 1:120.
		"1 g bin: a larger model (1:119.1) would need soil_depth at least 0.302 m (has 0.3 m; limit \"soil depth\")",
		"1 g bin: cheapest feasible option over all combinations: 1:120 with bin clay in Clay bin, 1500 EUR",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("the terminal table lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "Warnings") {
		t.Errorf("the anchor study has no warnings:\n%s", out)
	}
}

// TestNoAxisForAFixedCase: the conductor sweeps its velocity scale; with
// the velocity fixed on its strategy row the axis does not apply: no
// contour map, no axis value stated, the fix stated instead.
func TestNoAxisForAFixedCase(t *testing.T) {
	res := wbRunScenario(t, "conductor")
	sr := res.Strategies[0]
	if report.ContourData(res, sr) == nil {
		t.Fatal("the swept conductor has no contour map")
	}
	if lines := strings.Join(report.AssumptionLines(res, sr), "\n"); !strings.Contains(lines, "second axis at velocity scale k = ") {
		t.Errorf("no axis value stated: %s", lines)
	}
	s := wbLoad(t, "conductor")
	s.Strategies[0].Fix = "velocity=2"
	res = wbRun(t, s)
	sr = res.Strategies[0]
	if report.ContourData(res, sr) != nil {
		t.Error("a contour map over the velocity scale for a strategy that fixes it")
	}
	lines := strings.Join(report.AssumptionLines(res, sr), "\n")
	if strings.Contains(lines, "second axis") || !strings.Contains(lines, "free choice fixed: velocity=2") {
		t.Errorf("assumptions: %s", lines)
	}
}
