package main

import (
	"archive/zip"
	"bytes"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/report"
)

// What scaleplan run writes: the same bytes for the same input, text as
// text, exit statuses of the manual, the --max-points flag.

// hFiles reads every file under dir, by path relative to dir.
func hFiles(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	files := map[string][]byte{}
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := os.ReadFile(p)
		rel, _ := filepath.Rel(dir, p)
		files[rel] = data
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return files
}

// TestRunTwiceIdentical runs the same studies twice (a workbook study, a
// folder study and the built-in demo studies) and finds byte-identical
// outputs (spec §12).
func TestRunTwiceIdentical(t *testing.T) {
	dir := t.TempDir()
	csvStudy := hTugCSV(t, dir, "tug")
	hSet(t, csvStudy, "Study", "name", "value", "tug-folder")
	xlsxStudy := hTugXLSX(t, dir, "tug.xlsx")
	for _, args := range [][]string{{"run", xlsxStudy, csvStudy}, {"run"}} {
		var outs []map[string][]byte
		for i := range 2 {
			out := filepath.Join(dir, "out", strings.Join(args, "_")[:3], string(rune('a'+i)))
			hRunOK(t, append(args, "--out", out)...)
			outs = append(outs, hFiles(t, out))
		}
		var names []string
		for n := range outs[0] {
			names = append(names, n)
		}
		sort.Strings(names)
		if len(names) == 0 || len(outs[0]) != len(outs[1]) {
			t.Fatalf("%v: %d and %d files", args, len(outs[0]), len(outs[1]))
		}
		for _, n := range names {
			if !bytes.Equal(outs[0][n], outs[1][n]) {
				t.Errorf("%v: %s differs between two runs%s", args, n, zipLayout(outs[0][n], outs[1][n]))
			}
		}
	}
}

// zipLayout explains how two workbooks differ when their parts are the
// same: the order of the parts in the zip.
func zipLayout(a, b []byte) string {
	za, err1 := zip.NewReader(bytes.NewReader(a), int64(len(a)))
	zb, err2 := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err1 != nil || err2 != nil || len(za.File) != len(zb.File) {
		return ""
	}
	var order []string
	same := true
	for i := range za.File {
		if za.File[i].Name != zb.File[i].Name {
			order = append(order, za.File[i].Name+"/"+zb.File[i].Name)
		}
		if za.File[i].CRC32 != zb.File[i].CRC32 && za.File[i].Name == zb.File[i].Name {
			same = false
		}
	}
	if same && len(order) > 0 {
		return " (same parts, in another order in the zip: " + strings.Join(order[:min(3, len(order))], ", ") + " …)"
	}
	return ""
}

// formulaLike is user-typed text that a spreadsheet program would take
// for a formula if it were written as one.
var formulaLike = []string{`=HYPERLINK("http://example.com","x")`, "+1+1", "-2+3", "@SUM(A1)", "=cmd|' /C calc'!A0"}

// TestFormulaTextStaysText puts text that looks like a formula into every
// kind of name and free text a study has, runs it, and checks that the
// workbook holds it as text (an inline or shared string, never a formula)
// and that run writes no CSV file (the only files are the workbook, the
// Markdown memo and the maps).
func TestFormulaTextStaysText(t *testing.T) {
	dir := t.TempDir()
	s := hTugCSV(t, dir, "tug")
	hSet(t, s, "Study", "purpose", "value", formulaLike[0])
	hSet(t, s, "Strategies", "Froude scaling", "strategy", formulaLike[1])
	// New rows rather than renamed ones, so that no other sheet of the
	// scenario loses what it refers to.
	hAppend(t, s, "Media", formulaLike[2], "water", "20C")
	hEdit(t, s, "Facilities", func(r [][]string) [][]string {
		var more [][]string
		for _, row := range r[1:] {
			if row[0] == "Estuary tank" {
				c := append([]string(nil), row...)
				c[0] = formulaLike[3]
				more = append(more, c)
			}
		}
		return append(r, more...)
	})
	hSet(t, s, "Costs", "model manufacture", "item", formulaLike[4])
	hAppend(t, s, "Limits", "all", formulaLike[1], "hull_length >= 0.5 [m]", formulaLike[4])
	out := filepath.Join(dir, "out")
	hRunOK(t, "run", s, "--out", out)

	files := hFiles(t, out)
	for n := range files {
		switch ext := filepath.Ext(n); {
		case ext == ".xlsx", ext == ".md", ext == ".html", ext == ".png", ext == ".svg", ext == ".pdf": // workbooks, memos (Markdown; HTML with every text escaped), maps
		case report.IsManifest(n): // the list of what run wrote (JSON data)
		default:
			t.Errorf("run wrote %s: only workbooks, memos and maps are expected (a CSV would need its own guard)", n)
		}
	}
	wb := files["harbour-tug.xlsx"]
	zr, err := zip.NewReader(bytes.NewReader(wb), int64(len(wb)))
	if err != nil {
		t.Fatal(err)
	}
	formula := regexp.MustCompile(`<f[ >]`)
	for _, f := range zr.File {
		if !strings.HasPrefix(f.Name, "xl/worksheets/") {
			continue
		}
		rc, _ := f.Open()
		data, _ := io.ReadAll(rc)
		rc.Close()
		if loc := formula.FindIndex(data); loc != nil {
			t.Errorf("%s holds a formula: %s", f.Name, data[max(0, loc[0]-80):min(len(data), loc[1]+80)])
		}
	}
	book, err := excelize.OpenReader(bytes.NewReader(wb))
	if err != nil {
		t.Fatal(err)
	}
	defer book.Close()
	seen := map[string]bool{}
	for _, sheet := range book.GetSheetList() {
		rows, err := book.GetRows(sheet, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatal(err)
		}
		for r, row := range rows {
			for c, v := range row {
				for _, f := range formulaLike {
					if !strings.Contains(v, f) {
						continue
					}
					seen[f] = true
					cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
					typ, err := book.GetCellType(sheet, cell)
					if err != nil || typ != excelize.CellTypeInlineString && typ != excelize.CellTypeSharedString {
						t.Errorf("%s!%s = %q: cell type %v (%v), want text", sheet, cell, v, typ, err)
					}
				}
			}
		}
	}
	for _, f := range formulaLike {
		if !seen[f] {
			t.Errorf("%q is not in the workbook", f)
		}
	}
}

// TestExitStatuses: exit 0 on success, also when nothing is feasible; 1
// on bad input; 2 on bad usage (spec §11).
func TestExitStatuses(t *testing.T) {
	dir := t.TempDir()
	s := hTugCSV(t, dir, "tug")
	// No model fits: a sweep of tiny scales only, in a tank too short.
	hSet(t, s, "Study", "scale_from", "value", "1.01")
	hSet(t, s, "Study", "scale_to", "value", "1.02")
	code, stdout, stderr := hRun("run", s, "--out", filepath.Join(dir, "out"))
	if code != 0 || !strings.Contains(stdout, "none") {
		t.Errorf("infeasible study: exit %d, stdout %s, stderr %s", code, stdout, stderr)
	}
	for _, c := range []struct {
		args []string
		code int
	}{
		{[]string{"run", s, "--out", filepath.Join(dir, "o2"), "--max-points", "1e9"}, 0},
		{[]string{"run", s, "--bogus"}, 2},
		{[]string{"run", s, "--out", filepath.Join(dir, "o3"), "--max-points", "many"}, 2},
		{[]string{"run", s, "--out", filepath.Join(dir, "o3"), "--max-points", "3e9"}, 2},
		{[]string{"check", s, s}, 2},
		{[]string{"run", filepath.Join(dir, "missing"), "--out", filepath.Join(dir, "o3")}, 1},
	} {
		code, _, stderr := hRun(c.args...)
		if code != c.code {
			t.Errorf("scaleplan %s: exit %d, want %d (%s)", strings.Join(c.args, " "), code, c.code, stderr)
		}
	}
}

// TestMaxPointsFlag: --max-points allows a sweep larger than the study's
// max_points, and overrides a smaller limit; the workbook still echoes the
// study as it was read.
func TestMaxPointsFlag(t *testing.T) {
	dir := t.TempDir()
	s := hTugCSV(t, dir, "tug")
	hAppend(t, s, "Study", "max_points", "1000")
	out := filepath.Join(dir, "out")
	code, _, stderr := hRun("run", s, "--out", out)
	if code != 1 || !strings.Contains(stderr, "Study!B7: the sweep has 2.4e+03 points (400 grid points × 6 combinations), more than 1000: pass --max-points N to scaleplan run") {
		t.Errorf("without the flag: exit %d, %s", code, stderr)
	}
	hRunOK(t, "run", s, "--out", out, "--max-points", "2400")
	code, _, stderr = hRun("run", s, "--out", out, "--max-points", "2399")
	if code != 1 || !strings.Contains(stderr, "more than 2399") {
		t.Errorf("--max-points 2399: exit %d, %s", code, stderr)
	}
	book, err := excelize.OpenFile(filepath.Join(out, "harbour-tug.xlsx"))
	if err != nil {
		t.Fatal(err)
	}
	defer book.Close()
	rows, _ := book.GetRows("Inputs")
	echoed := false
	for _, r := range rows {
		if len(r) > 2 && r[1] == "max_points" {
			echoed = r[2] == "1000"
		}
	}
	if !echoed {
		t.Error("the Inputs sheet does not echo max_points = 1000 as the study has it")
	}
}
