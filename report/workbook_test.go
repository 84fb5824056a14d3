package report_test

import (
	"archive/zip"
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"

	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// The workbook tests: every demo study's workbook opens in LibreOffice,
// reads back with excelize with the same numbers as the results and the
// memo, is byte-identical from run to run, and holds user-typed text that
// looks like a formula as text.

// wbWrite writes a result's workbook into dir and returns its path.
func wbWrite(t *testing.T, dir, file string, res *sweep.Result) string {
	t.Helper()
	path := filepath.Join(dir, file)
	if err := report.WriteWorkbook(path, res); err != nil {
		t.Fatalf("WriteWorkbook: %v", err)
	}
	return path
}

// loCSVFilter exports every sheet of a workbook to its own UTF-8 CSV file
// named <file>-<sheet>.csv (LibreOffice 7.2 and later): comma separated,
// double-quoted, raw values rather than as formatted, computed values
// rather than formulas, sheet -1 = all sheets.
const loCSVFilter = "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1"

// loBinary finds LibreOffice. Without it the test is skipped on a
// developer's machine and fails on CI, which must install it.
func loBinary(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"soffice", "libreoffice"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI") != "" {
		t.Fatal("LibreOffice (soffice) is not installed: CI must install libreoffice-calc (see .ci/run)")
	}
	t.Skip("LibreOffice (soffice) is not installed; install libreoffice-calc to run this test")
	return ""
}

// loConvert converts workbooks to CSV, one file per sheet, in one
// LibreOffice run with a private profile, and returns what it printed.
func loConvert(t *testing.T, soffice, outDir string, books []string) string {
	t.Helper()
	return loConvertTo(t, soffice, outDir, loCSVFilter, books)
}

// loConvertTo converts files with a LibreOffice filter ("pdf", a CSV
// filter), in one run with a private profile, and returns what it printed.
func loConvertTo(t *testing.T, soffice, outDir, filter string, books []string) string {
	t.Helper()
	profile := url.URL{Scheme: "file", Path: filepath.ToSlash(filepath.Join(t.TempDir(), "lo-profile"))}
	args := []string{"-env:UserInstallation=" + profile.String(), "--headless", "--norestore", "--nolockcheck",
		"--convert-to", filter, "--outdir", outDir}
	args = append(args, books...)
	ctx, cancel := context.WithTimeout(context.Background(), 120*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, soffice, args...)
	cmd.WaitDelay = 5 * time.Second
	out, err := cmd.CombinedOutput()
	if ctx.Err() != nil {
		t.Fatalf("LibreOffice did not finish the conversion within 120 s:\n%s", out)
	}
	if err != nil {
		t.Fatalf("LibreOffice conversion failed: %v\n%s", err, out)
	}
	// LibreOffice exits with status 0 even when it cannot load a file;
	// it says so on its output instead.
	for _, line := range strings.Split(string(out), "\n") {
		if strings.HasPrefix(strings.TrimSpace(line), "Error") {
			t.Errorf("LibreOffice: %s", line)
		}
	}
	return string(out)
}

// loReadCSV reads a CSV file LibreOffice wrote.
func loReadCSV(t *testing.T, path string) [][]string {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("LibreOffice wrote no %s: %v", filepath.Base(path), err)
	}
	if len(data) == 0 {
		t.Fatalf("LibreOffice wrote an empty %s", filepath.Base(path))
	}
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", filepath.Base(path), err)
	}
	return recs
}

func TestWorkbookOpensInLibreOffice(t *testing.T) {
	soffice := loBinary(t)
	dir := t.TempDir()
	in, out := filepath.Join(dir, "in"), filepath.Join(dir, "out")
	for _, d := range []string{in, out} {
		if err := os.Mkdir(d, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	type book struct {
		name, path string
		res        *sweep.Result
	}
	var books []book
	for _, sc := range wbScenarios(t) {
		res, err := wbRunScenarioE(sc.Name)
		if err != nil {
			t.Errorf("scenario %s: %v", sc.Name, err)
			continue
		}
		books = append(books, book{sc.Name, wbWrite(t, in, sc.Name+".xlsx", res), res})
	}
	// The study with formula-looking text goes through LibreOffice too:
	// a formula would come out of it computed, not as the text typed.
	formulas := wbRun(t, formulaStudy(t))
	books = append(books, book{"formula-looking", wbWrite(t, in, "formula-looking.xlsx", formulas), formulas})

	paths := make([]string, len(books))
	for i, b := range books {
		paths[i] = b.path
	}
	start := time.Now()
	log := loConvert(t, soffice, out, paths)
	t.Logf("LibreOffice converted %d workbooks in %v", len(books), time.Since(start).Round(time.Millisecond))

	sheetCSV := map[string]map[string][][]string{}
	for _, b := range books {
		t.Run(b.name, func(t *testing.T) {
			f := wbOpen(t, b.path)
			sheets := map[string][][]string{}
			for _, sheet := range f.GetSheetList() {
				csvPath := filepath.Join(out, strings.TrimSuffix(filepath.Base(b.path), ".xlsx")+"-"+sheet+".csv")
				if _, err := os.Stat(csvPath); err != nil {
					if _, one := os.Stat(strings.TrimSuffix(csvPath, "-"+sheet+".csv") + ".csv"); one == nil {
						t.Fatalf("LibreOffice wrote one CSV file for all of %s: exporting every sheet needs LibreOffice 7.2 or later", filepath.Base(b.path))
					}
					t.Errorf("LibreOffice did not convert sheet %q of %s: %v\nLibreOffice said:\n%s", sheet, filepath.Base(b.path), err, log)
					continue
				}
				sheets[sheet] = loReadCSV(t, csvPath)
			}
			sheetCSV[b.name] = sheets
			// LibreOffice sees the same windows as the results.
			win, ok := sheets["Windows"]
			if !ok {
				t.Fatal("no Windows sheet converted")
			}
			cols := wbColumns(t, "Windows (LibreOffice)", win[0], "strategy", "window (1:x)")
			var want []*sweep.ComboResult
			for _, sr := range b.res.Strategies {
				want = append(want, wbCombos(sr)...)
			}
			if len(win)-1 != len(want) {
				t.Fatalf("LibreOffice reads %d rows of windows, want %d", len(win)-1, len(want))
			}
			for j, c := range want {
				row := win[j+1]
				if got := wbAt(row, cols["strategy"]); got != c.Strategy {
					t.Errorf("Windows row %d (LibreOffice): strategy %q, want %q", j+2, got, c.Strategy)
				}
				if got, w := wbAt(row, cols["window (1:x)"]), report.WindowText(c.Window); got != w {
					t.Errorf("Windows row %d (LibreOffice): window %q, want %q", j+2, got, w)
				}
			}
		})
	}

	// The formula-looking text comes out of LibreOffice as typed.
	sheets := sheetCSV["formula-looking"]
	for _, w := range []struct{ sheet, text string }{
		{"Summary", fStrategy}, {"Summary", fPurpose}, {"Summary", fLimit},
		{"Windows", fStrategy}, {"Windows", fMedium}, {"Windows", fFacility}, {"Windows", fLimit},
		{"Limits", fSource}, {"Limits", fLimit},
		{"Inputs", fStudy}, {"Inputs", fCost}, {"Inputs", fSource},
	} {
		if !wbHasCell(sheets[w.sheet], w.text) {
			t.Errorf("LibreOffice reads no cell %q on sheet %s of the formula-looking study", w.text, w.sheet)
		}
	}
}

// wbHasCell reports whether a cell of the rows holds exactly text.
func wbHasCell(rows [][]string, text string) bool {
	for _, r := range rows {
		if slices.Contains(r, text) {
			return true
		}
	}
	return false
}

func TestWorkbookReadsBack(t *testing.T) {
	for _, sc := range wbScenarios(t) {
		t.Run(sc.Name, func(t *testing.T) {
			res := wbRunScenario(t, sc.Name)
			path := wbWrite(t, t.TempDir(), "study.xlsx", res)
			f := wbOpen(t, path)
			sheets := wbCheckSheets(t, f, res)
			sum := wbCheckSummary(t, sheets["Summary"], res)
			wbCheckWindows(t, sheets["Windows"], res, sum)
			for i, sr := range res.Strategies {
				wbCheckMap(t, sheets[wbMapSheet(f, i)], res, sr)
			}
			wbCheckLimits(t, sheets["Limits"], res)
			wbCheckInputs(t, sheets["Inputs"], res)
			wbCheckPanes(t, f, res)
			t.Run("memo", func(t *testing.T) { wbCheckMemo(t, report.Memo(res), res, sum) })
		})
	}
}

// wbMapSheet is the name of strategy i's map sheet ("Map 1 …"), "" when
// there is none.
func wbMapSheet(f *excelize.File, i int) string {
	prefix := fmt.Sprintf("Map %d ", i+1)
	for _, s := range f.GetSheetList() {
		if strings.HasPrefix(s, prefix) {
			return s
		}
	}
	return ""
}

// wbCheckSheets reads every sheet of the workbook, checks that the sheets
// of §10 are all there, in order, with names a spreadsheet accepts, and
// returns the rows of each.
func wbCheckSheets(t *testing.T, f *excelize.File, res *sweep.Result) map[string][][]string {
	t.Helper()
	list := f.GetSheetList()
	want := []string{"Summary", "Windows", "Scale laws"}
	for i := range res.Strategies {
		m := wbMapSheet(f, i)
		if m == "" {
			t.Errorf("no map sheet for strategy %d %q (sheets: %q)", i+1, res.Strategies[i].Name, list)
			continue
		}
		want = append(want, m)
	}
	want = append(want, "Limits", "Inputs")
	last := -1
	for _, w := range want {
		i := slices.Index(list, w)
		if i < 0 {
			t.Errorf("no sheet %q (sheets: %q)", w, list)
			continue
		}
		if i < last {
			t.Errorf("sheet %q is out of order (sheets: %q)", w, list)
		}
		last = i
	}
	if len(list) == 0 || list[0] != "Summary" || f.GetActiveSheetIndex() != 0 {
		t.Errorf("the workbook must open on the Summary: sheets %q, active %d", list, f.GetActiveSheetIndex())
	}
	seen := map[string]bool{}
	sheets := map[string][][]string{}
	for _, s := range list {
		if n := utf8.RuneCountInString(s); n == 0 || n > 31 || strings.ContainsAny(s, `[]:*?/\`) ||
			strings.HasPrefix(s, "'") || strings.HasSuffix(s, "'") {
			t.Errorf("sheet name %q is not valid in a spreadsheet", s)
		}
		if k := strings.ToLower(s); seen[k] {
			t.Errorf("sheet name %q appears twice (names are compared without case)", s)
		} else {
			seen[k] = true
		}
		rows := wbRows(t, f, s)
		if len(rows) == 0 {
			t.Errorf("sheet %q is empty", s)
		}
		for r, row := range rows {
			for c, v := range row {
				if utf8.RuneCountInString(v) > 32767 {
					name, _ := excelize.CoordinatesToCellName(c+1, r+1)
					t.Errorf("%s!%s holds %d characters, more than a cell may", s, name, utf8.RuneCountInString(v))
				}
			}
		}
		sheets[s] = rows
	}
	return sheets
}

// wbSummary is the strategy table of the Summary sheet, one row per
// strategy of the result.
type wbSummary struct {
	cols map[string]int
	rows [][]string
}

func (s wbSummary) cell(i int, col string) string { return wbAt(s.rows[i], s.cols[col]) }

var wbSummaryCols = []string{"strategy", "technique", "window (1:x)", "large-model edge", "small-model edge",
	"recommended (1:x)", "model length [m]", "cost [", "best candidate"}

func wbCheckSummary(t *testing.T, rows [][]string, res *sweep.Result) wbSummary {
	t.Helper()
	text := map[string]bool{}
	for _, r := range rows {
		for _, c := range r {
			text[c] = true
		}
	}
	if !text["Study: "+res.Name] {
		t.Errorf("Summary: no title for study %q", res.Name)
	}
	for _, c := range report.Cautions {
		if !text[c] {
			t.Errorf("Summary: caution %q is missing (§13)", c)
		}
	}
	if !text[report.Convention] {
		t.Errorf("Summary: the scale convention %q is missing (§2)", report.Convention)
	}
	h := -1
	for i, r := range rows {
		if wbAt(r, 0) == "strategy" && wbAt(r, 1) == "technique" {
			h = i
			break
		}
	}
	if h < 0 {
		t.Fatal("Summary: no strategy table (a row headed strategy, technique)")
	}
	sum := wbSummary{cols: wbColumns(t, "Summary", rows[h], wbSummaryCols...)}
	if got := len(rows) - h - 1; got < len(res.Strategies) {
		t.Fatalf("Summary: %d strategy rows, want %d", got, len(res.Strategies))
	}
	sum.rows = rows[h+1 : h+1+len(res.Strategies)]
	for i, sr := range res.Strategies {
		where := func(col string) string { return fmt.Sprintf("Summary row %d (%s) %s", h+2+i, sr.Name, col) }
		eq := func(col, want string) {
			t.Helper()
			if got := sum.cell(i, col); got != want {
				t.Errorf("%s: got %q, want %q", where(col), got, want)
			}
		}
		eq("strategy", sr.Name)
		eq("technique", sr.Technique)
		c := sr.Best
		if c == nil {
			eq("window (1:x)", "none")
			eq("recommended (1:x)", "")
			continue
		}
		large, small := report.Edges(c.Window)
		eq("window (1:x)", report.WindowText(c.Window))
		eq("large-model edge", large)
		eq("small-model edge", small)
		eq("recommended (1:x)", sweep.Scale(c.Recommended))
		eq("best candidate", report.Candidate(c))
		wbCheckSig(t, where("model length"), sum.cell(i, "model length [m]"), c.ModelLength)
		wbCheckMoney(t, where("cost"), sum.cell(i, "cost ["), c.Cost)
		if !c.Window.Contains(c.Recommended) {
			t.Errorf("%s: the recommended scale %v lies outside the window %s", where("recommended"), c.Recommended, report.WindowText(c.Window))
		}
	}
	return sum
}

var wbWindowCols = []string{"strategy", "case", "technique", "medium", "material", "facility", "axis value",
	"window (1:x)", "from kL", "to kL", "large-model edge", "small-model edge", "recommended (1:x)",
	"recommended kL", "model length [m]", "cost [", "cheapest kL"}

func wbCheckWindows(t *testing.T, rows [][]string, res *sweep.Result, sum wbSummary) {
	t.Helper()
	if len(rows) == 0 {
		t.Fatal("Windows: no header row")
	}
	cols := wbColumns(t, "Windows", rows[0], wbWindowCols...)
	var all []*sweep.ComboResult
	for _, sr := range res.Strategies {
		all = append(all, wbCombos(sr)...)
	}
	if len(rows)-1 != len(all) {
		t.Fatalf("Windows: %d rows, want one per combination and joint window: %d", len(rows)-1, len(all))
	}
	rowOf := map[*sweep.ComboResult][]string{}
	for j, c := range all {
		row := rows[j+1]
		rowOf[c] = row
		where := func(col string) string { return fmt.Sprintf("Windows row %d (%s) %s", j+2, c.Strategy, col) }
		eq := func(col, want string) {
			t.Helper()
			if got := wbAt(row, cols[col]); got != want {
				t.Errorf("%s: got %q, want %q", where(col), got, want)
			}
		}
		eq("strategy", c.Strategy)
		eq("case", c.Case)
		eq("technique", c.Technique)
		eq("medium", c.Medium)
		eq("material", c.Material)
		eq("facility", c.Facility)
		wbCheckSig(t, where("axis value"), wbAt(row, cols["axis value"]), c.Axis)
		eq("window (1:x)", report.WindowText(c.Window))
		lo, hi := math.NaN(), math.NaN()
		if !c.Window.Empty() {
			lo, hi = c.Window[0].Lo, c.Window[len(c.Window)-1].Hi
		}
		wbCheckSig(t, where("from kL"), wbAt(row, cols["from kL"]), lo)
		wbCheckSig(t, where("to kL"), wbAt(row, cols["to kL"]), hi)
		large, small := report.Edges(c.Window)
		eq("large-model edge", large)
		eq("small-model edge", small)
		eq("recommended (1:x)", sweep.Scale(c.Recommended))
		wbCheckSig(t, where("recommended kL"), wbAt(row, cols["recommended kL"]), c.Recommended)
		wbCheckSig(t, where("model length"), wbAt(row, cols["model length [m]"]), c.ModelLength)
		wbCheckMoney(t, where("cost"), wbAt(row, cols["cost ["]), c.Cost)
		wbCheckSig(t, where("cheapest kL"), wbAt(row, cols["cheapest kL"]), c.Cheapest)
	}
	// The Summary shows each strategy's best option exactly as the
	// Windows sheet shows that combination.
	for i, sr := range res.Strategies {
		if sr.Best == nil {
			continue
		}
		row, ok := rowOf[sr.Best]
		if !ok {
			t.Errorf("strategy %q: its best option is none of its combinations", sr.Name)
			continue
		}
		for _, pair := range [][2]string{{"window (1:x)", "window (1:x)"}, {"large-model edge", "large-model edge"},
			{"small-model edge", "small-model edge"}, {"recommended (1:x)", "recommended (1:x)"},
			{"model length [m]", "model length [m]"}, {"cost [", "cost ["}} {
			if s, w := sum.cell(i, pair[0]), wbAt(row, cols[pair[1]]); s != w {
				t.Errorf("strategy %q: Summary %s %q, but Windows %q for the same combination", sr.Name, pair[0], s, w)
			}
		}
	}
}

// wbCheckMap checks a strategy's map sheet against the margins of its
// combinations, and the margins against the windows: feasible points lie
// in the window, infeasible ones outside it.
func wbCheckMap(t *testing.T, rows [][]string, res *sweep.Result, sr *sweep.StrategyResult) {
	t.Helper()
	if rows == nil {
		return // reported by wbCheckSheets
	}
	grid := res.Plan.Grid
	if len(grid)+1 > report.MaxSheetRows {
		t.Skip("grid thinned to fit the sheet; not checked point by point")
	}
	if got, want := len(rows[0]), 2+2*len(sr.Combos); got != want {
		t.Errorf("map %s: %d columns, want %d (scale, kL, and margin and limit per combination)", sr.Name, got, want)
		return
	}
	if len(rows)-1 != len(grid) {
		t.Errorf("map %s: %d rows, want one per grid point: %d", sr.Name, len(rows)-1, len(grid))
		return
	}
	const tol = 1e-3 // decades: window edges found by bisection are good to 0.1 %
	for gi, kL := range grid {
		row := rows[gi+1]
		if got, want := wbAt(row, 0), sweep.Scale(kL); got != want {
			t.Errorf("map %s row %d: scale %q, want %q", sr.Name, gi+2, got, want)
		}
		wbCheckSig(t, fmt.Sprintf("map %s row %d kL", sr.Name, gi+2), wbAt(row, 1), kL)
		for k, c := range sr.Combos {
			mc, lc := wbAt(row, 2+2*k), wbAt(row, 3+2*k)
			where := fmt.Sprintf("map %s row %d (%s)", sr.Name, gi+2, report.Candidate(c))
			if c.Margins == nil {
				if mc != "" || lc != c.Err {
					t.Errorf("%s: got %q, %q, want no margin and the error %q", where, mc, lc, c.Err)
				}
				continue
			}
			m := c.Margins[gi]
			if math.IsInf(m, 0) || math.IsNaN(m) {
				if mc != "" {
					t.Errorf("%s: margin %q, want an empty cell for %v", where, mc, m)
				}
				continue
			}
			v, err := strconv.ParseFloat(mc, 64)
			if err != nil || math.Abs(v-math.Round(m*1000)/1000) > 1e-9 {
				t.Errorf("%s: margin %q, want %.3f", where, mc, m)
			}
			if m < 0 && !strings.HasPrefix(lc, "infeasible: ") {
				t.Errorf("%s: margin %.3f but the limit cell %q does not say infeasible", where, m, lc)
			}
			in := c.Window.Contains(kL)
			if m > tol && !in {
				t.Errorf("%s: margin %.4f at kL %.4g, but the window %s does not hold it", where, m, kL, report.WindowText(c.Window))
			}
			if m < -tol && in {
				t.Errorf("%s: margin %.4f at kL %.4g, but the window %s holds it", where, m, kL, report.WindowText(c.Window))
			}
		}
	}
}

func wbCheckLimits(t *testing.T, rows [][]string, res *sweep.Result) {
	t.Helper()
	if len(rows) == 0 {
		t.Fatal("Limits: no header row")
	}
	cols := wbColumns(t, "Limits", rows[0], "strategy", "facility", "limit", "expression", "source")
	names := map[string]bool{}
	for _, sr := range res.Strategies {
		names[sr.Name] = true
	}
	listed := map[string]bool{}
	for r, row := range rows[1:] {
		s := wbAt(row, cols["strategy"])
		if !names[s] {
			t.Errorf("Limits row %d: unknown strategy %q", r+2, s)
		}
		if wbAt(row, cols["source"]) == "" {
			t.Errorf("Limits row %d (%s): the limit %q has no source (§6)", r+2, s, wbAt(row, cols["limit"]))
		}
		listed[s+"\x00"+wbAt(row, cols["facility"])+"\x00"+wbAt(row, cols["limit"])] = true
	}
	for _, sr := range res.Strategies {
		for _, c := range sr.Combos {
			for _, l := range c.Limits {
				if !listed[sr.Name+"\x00"+c.Facility+"\x00"+l.Name] {
					t.Errorf("Limits: limit %q of %s in %q is not listed", l.Name, sr.Name, c.Facility)
				}
			}
		}
	}
}

// wbCheckInputs checks that the Inputs sheet echoes every sheet of the
// study under its column names (written out here as the study layout of
// the spec and README has them, not taken from the code's table) with one
// row per input row.
func wbCheckInputs(t *testing.T, rows [][]string, res *sweep.Result) {
	t.Helper()
	in := res.Plan.Study
	want := []struct {
		sheet string
		n     int
		cols  string
	}{{"Study", len(in.Settings), "setting value unit note"},
		{"Prototype", len(in.Prototype), "item value unit scales_as note"},
		{"Media", len(in.Media), "name library_entry conditions note"},
		{"Materials", len(in.Materials), "name library_entry conditions note"},
		{"Custom", len(in.Custom), "entry kind property value unit source"},
		{"Facilities", len(in.Facilities), "facility type capability value unit note"},
		{"Strategies", len(in.Strategies), "strategy case technique retain relax untie given tuned fix media materials facilities correction note"},
		{"Limits", len(in.Limits), "applies_to limit expression source"},
		{"Costs", len(in.Costs), "item coefficient per measure facility note"},
		// The Measures and Uncertainty sheets were once left out of the echo.
		{"Measures", len(in.Measures), "measure expression unit note"},
		{"Uncertainty", len(in.Uncertain), "input of distribution spread note"}}
	for _, w := range want {
		h := slices.IndexFunc(rows, func(r []string) bool { return wbAt(r, 0) == "sheet "+w.sheet })
		if h < 0 {
			t.Errorf("Inputs: the %s sheet of the study is not echoed", w.sheet)
			continue
		}
		if got := strings.Join(slices.DeleteFunc(slices.Clone(rows[h][1:]), func(s string) bool { return s == "" }), " "); got != w.cols {
			t.Errorf("Inputs: the %s sheet is echoed under the columns %q, want %q", w.sheet, got, w.cols)
		}
		n := 0
		for _, r := range rows[h+1:] {
			if !slices.ContainsFunc(r, func(s string) bool { return s != "" }) || strings.HasPrefix(wbAt(r, 0), "sheet ") {
				break
			}
			n++
		}
		if n != w.n {
			t.Errorf("Inputs: %d rows echo the %s sheet, want %d", n, w.sheet, w.n)
		}
	}
}

// wbCheckPanes checks that every sheet with a header row keeps it frozen.
func wbCheckPanes(t *testing.T, f *excelize.File, res *sweep.Result) {
	t.Helper()
	sheets := []string{"Windows", "Scale laws", "Limits"}
	for i := range res.Strategies {
		if m := wbMapSheet(f, i); m != "" {
			sheets = append(sheets, m)
		}
	}
	for _, s := range sheets {
		p, err := f.GetPanes(s)
		if err != nil {
			t.Errorf("GetPanes(%q): %v", s, err)
			continue
		}
		if !p.Freeze || p.YSplit != 1 || p.TopLeftCell != "A2" {
			t.Errorf("sheet %q: panes %+v, want the header row frozen (Freeze, YSplit 1, top-left A2)", s, p)
		}
	}
}

func TestWorkbookDeterministic(t *testing.T) {
	for _, sc := range wbScenarios(t) {
		t.Run(sc.Name, func(t *testing.T) {
			dir := t.TempDir()
			res := wbRunScenario(t, sc.Name)
			a := wbWrite(t, dir, "a.xlsx", res)
			b := wbWrite(t, dir, "b.xlsx", res)
			wbSameFile(t, "the same result written twice", a, b)
			// A fresh run of the same study.
			again := wbRunScenario(t, sc.Name)
			c := wbWrite(t, dir, "c.xlsx", again)
			wbSameFile(t, "the same study run twice", a, c)

			memos := []string{filepath.Join(dir, "a.memo.md"), filepath.Join(dir, "b.memo.md"), filepath.Join(dir, "c.memo.md")}
			for i, r := range []*sweep.Result{res, res, again} {
				if err := report.WriteMemo(memos[i], r); err != nil {
					t.Fatalf("WriteMemo: %v", err)
				}
			}
			wbSameFile(t, "the same memo written twice", memos[0], memos[1])
			wbSameFile(t, "the memo of the same study run twice", memos[0], memos[2])
			if data, _ := os.ReadFile(memos[0]); string(data) != report.Memo(res) {
				t.Error("WriteMemo does not write what Memo returns")
			}

			// Nothing but the outputs is left behind (§12: written to a
			// temporary file and renamed).
			entries, err := os.ReadDir(dir)
			if err != nil {
				t.Fatal(err)
			}
			var names []string
			for _, e := range entries {
				names = append(names, e.Name())
			}
			if want := []string{"a.memo.md", "a.xlsx", "b.memo.md", "b.xlsx", "c.memo.md", "c.xlsx"}; !slices.Equal(names, want) {
				t.Errorf("files written: %q, want %q", names, want)
			}
		})
	}
}

// wbSameFile fails unless two files are byte-identical, naming the parts
// of a workbook that differ.
func wbSameFile(t *testing.T, what, a, b string) {
	t.Helper()
	da, err := os.ReadFile(a)
	if err != nil {
		t.Fatal(err)
	}
	db, err := os.ReadFile(b)
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Equal(da, db) {
		return
	}
	if !strings.HasSuffix(a, ".xlsx") {
		t.Errorf("%s: %s and %s differ", what, filepath.Base(a), filepath.Base(b))
		return
	}
	pa, pb := wbZipParts(t, da), wbZipParts(t, db)
	if oa, ob := wbZipOrder(t, da), wbZipOrder(t, db); !slices.Equal(oa, ob) {
		i := 0
		for i < len(oa) && i < len(ob) && oa[i] == ob[i] {
			i++
		}
		t.Errorf("%s: %s and %s store their parts in a different order (part %d is %s in one, %s in the other)",
			what, filepath.Base(a), filepath.Base(b), i+1, wbAt(oa, i), wbAt(ob, i))
	}
	var diff []string
	for name, x := range pa {
		if y, ok := pb[name]; !ok || x != y {
			diff = append(diff, name)
		}
	}
	for name := range pb {
		if _, ok := pa[name]; !ok {
			diff = append(diff, name)
		}
	}
	slices.Sort(diff)
	if len(diff) > 0 {
		t.Errorf("%s: %s and %s differ in the parts %q", what, filepath.Base(a), filepath.Base(b), diff)
	} else if slices.Equal(wbZipOrder(t, da), wbZipOrder(t, db)) {
		t.Errorf("%s: %s and %s differ in their zip headers", what, filepath.Base(a), filepath.Base(b))
	}
}

// wbZipOrder lists the parts of a workbook in the order they are stored.
func wbZipOrder(t *testing.T, data []byte) []string {
	t.Helper()
	z, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatalf("the workbook is not a zip file: %v", err)
	}
	var names []string
	for _, f := range z.File {
		names = append(names, f.Name)
	}
	return names
}

// wbZipParts returns the uncompressed parts of a workbook by name.
func wbZipParts(t *testing.T, data []byte) map[string]string {
	t.Helper()
	z, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatalf("the workbook is not a zip file: %v", err)
	}
	parts := map[string]string{}
	for _, f := range z.File {
		r, err := f.Open()
		if err != nil {
			t.Fatal(err)
		}
		b, err := io.ReadAll(r)
		r.Close()
		if err != nil {
			t.Fatal(err)
		}
		parts[f.Name] = string(b)
	}
	return parts
}

// Text a user typed that a spreadsheet would take for a formula, put
// wherever the study allows free text.
const (
	fStudy    = "=1+2"
	fPurpose  = "@risk: calm-water resistance of a harbour tug"
	fStrategy = "=SUM(A1)"
	fMedium   = "+cmd"
	fFacility = "-east"
	fCost     = "-build"
	fLimit    = "@draft in the tank"
	fSource   = `=HYPERLINK("http://example.com","our source")`
)

// formulaStudy is the tug scenario with formula-looking text in its
// study name, purpose, a strategy, the medium, a facility, a cost item
// and an added limit (name and source). The limit sets the large-model
// edge of the renamed strategy, so its name reaches the Summary.
func formulaStudy(t *testing.T) *study.Study {
	t.Helper()
	s := wbLoad(t, "tug")
	set := func(name, v string) {
		st, ok := s.Settings[name]
		if !ok {
			t.Fatalf("the tug scenario has no %s setting", name)
		}
		st.Value = v
		s.Settings[name] = st
	}
	set("name", fStudy)
	set("purpose", fPurpose)
	n := 0
	for i := range s.Strategies {
		if s.Strategies[i].Strategy == "Froude scaling" {
			s.Strategies[i].Strategy = fStrategy
			n++
		}
	}
	for i := range s.Media {
		if s.Media[i].Name == "tank water" {
			s.Media[i].Name = fMedium
			n++
		}
	}
	for i := range s.Uncertain {
		if s.Uncertain[i].Of == "tank water" {
			s.Uncertain[i].Of = fMedium
		}
	}
	for i := range s.Facilities {
		if s.Facilities[i].Facility == "Estuary tank" {
			s.Facilities[i].Facility = fFacility
			n++
		}
	}
	for i := range s.Costs {
		if s.Costs[i].Item == "model manufacture" {
			s.Costs[i].Item = fCost
			n++
		}
	}
	if n < 4 {
		t.Fatalf("the tug scenario changed: only %d of the renamed rows found", n)
	}
	s.Limits = append(s.Limits, study.LimitRow{AppliesTo: "towing_tank", Limit: fLimit,
		Expression: "draft <= 0.4 m", Source: fSource, Row: len(s.Limits) + 2})
	return s
}

func TestFormulaLookingTextStaysText(t *testing.T) {
	res := wbRun(t, formulaStudy(t))
	if res.Name != fStudy {
		t.Fatalf("study name %q, want %q", res.Name, fStudy)
	}
	var froude *sweep.StrategyResult
	for _, sr := range res.Strategies {
		if sr.Name == fStrategy {
			froude = sr
		}
	}
	if froude == nil || froude.Best == nil || froude.Best.Window[0].LoLimit != fLimit {
		t.Fatalf("setup: the limit %q should set the large-model edge of strategy %q", fLimit, fStrategy)
	}
	path := wbWrite(t, t.TempDir(), report.FileName(res.Name)+".xlsx", res)
	f := wbOpen(t, path)

	// Every cell of every sheet: no formula, and text that looks like a
	// formula is a string cell.
	sheets := map[string][][]string{}
	for _, s := range f.GetSheetList() {
		rows := wbRows(t, f, s)
		sheets[s] = rows
		for r, row := range rows {
			for c, v := range row {
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				formula, err := f.GetCellFormula(s, cell)
				if err != nil {
					t.Fatalf("GetCellFormula(%s!%s): %v", s, cell, err)
				}
				if formula != "" {
					t.Errorf("%s!%s holds the formula %q (value %q)", s, cell, formula, v)
				}
				if v == "" || !strings.ContainsRune("=+-@", rune(v[0])) {
					continue
				}
				if _, err := strconv.ParseFloat(v, 64); err == nil {
					continue // a negative number
				}
				typ, err := f.GetCellType(s, cell)
				if err != nil {
					t.Fatalf("GetCellType(%s!%s): %v", s, cell, err)
				}
				if typ != excelize.CellTypeInlineString && typ != excelize.CellTypeSharedString {
					t.Errorf("%s!%s holds %q as cell type %v, want a string", s, cell, v, typ)
				}
			}
		}
	}
	// Nothing in the sheets' XML is a formula either.
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	for name, part := range wbZipParts(t, data) {
		if strings.HasPrefix(name, "xl/worksheets/") && (strings.Contains(part, "<f>") || strings.Contains(part, "<f ")) {
			t.Errorf("%s holds a formula element", name)
		}
	}

	mapSheet := wbMapSheet(f, slices.Index(res.Strategies, froude))
	for _, w := range []struct{ sheet, text string }{
		{"Summary", "Study: " + fStudy}, {"Summary", fPurpose}, {"Summary", fStrategy}, {"Summary", fLimit},
		{"Windows", fStrategy}, {"Windows", fMedium}, {"Windows", fFacility}, {"Windows", fLimit},
		{"Scale laws", fStrategy},
		{"Limits", fStrategy}, {"Limits", fFacility}, {"Limits", fLimit}, {"Limits", fSource},
		{"Inputs", fStudy}, {"Inputs", fPurpose}, {"Inputs", fStrategy}, {"Inputs", fMedium},
		{"Inputs", fFacility}, {"Inputs", fCost}, {"Inputs", fLimit}, {"Inputs", fSource},
		{mapSheet, fLimit},
	} {
		if !wbHasCell(sheets[w.sheet], w.text) {
			t.Errorf("sheet %q: no cell holds the text %q as typed", w.sheet, w.text)
		}
	}
	if !strings.HasSuffix(mapSheet, fStrategy) {
		t.Errorf("map sheet of strategy %q is named %q", fStrategy, mapSheet)
	}
	memo := report.Memo(res)
	for _, s := range []string{fStrategy, fPurpose, fLimit} {
		if !strings.Contains(memo, s) {
			t.Errorf("the memo does not quote %q as typed", s)
		}
	}
}
