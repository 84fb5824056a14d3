package report_test

import (
	"context"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// openpyxlRows is a Python script that opens each workbook named on its
// command line with openpyxl in read-only mode (which trusts the sheet's
// declared dimension) and prints, per workbook and sheet, the number of
// rows it yields that hold a value.
const openpyxlRows = `
import json, sys
import openpyxl
out = {}
for path in sys.argv[1:]:
    wb = openpyxl.load_workbook(path, read_only=True)
    sheets = {}
    for ws in wb.worksheets:
        sheets[ws.title] = sum(1 for row in ws.iter_rows(values_only=True) if any(v is not None and v != "" for v in row))
    out[path] = sheets
    wb.close()
json.dump(out, sys.stdout)
`

// python3WithOpenpyxl finds a python3 that imports openpyxl (Debian:
// python3-openpyxl). Without it the test is skipped on a developer's
// machine and fails on CI, which must install it (see .ci/run).
func python3WithOpenpyxl(t *testing.T) string {
	t.Helper()
	for _, p := range []string{"/usr/bin/python3", "python3"} {
		if path, err := exec.LookPath(p); err == nil && exec.Command(path, "-c", "import openpyxl").Run() == nil {
			return path
		}
	}
	if os.Getenv("CI") != "" {
		t.Fatal("python3 with openpyxl is not installed: CI must install python3-openpyxl (see .ci/run)")
	}
	t.Skip("python3 with openpyxl is not installed; install python3-openpyxl to run this test")
	return ""
}

// wbTemplate writes the study template of a scenario as init does, with
// the library's and catalogue's lists.
func wbTemplate(t *testing.T, dir, scenario string) string {
	t.Helper()
	lib, err := materials.Default()
	if err != nil {
		t.Fatal(err)
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	lists := sweep.DefaultLists(lib, cat)
	path := filepath.Join(dir, "template-"+scenario+".xlsx")
	if err := study.WriteXLSX(path, wbLoad(t, scenario), lists); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestWorkbooksReadOnlyThirdParty opens every result workbook of the
// built-in scenarios, and the template init writes, with openpyxl in
// read-only mode and finds on every sheet as many rows with a value as
// excelize reads.
func TestWorkbooksReadOnlyThirdParty(t *testing.T) {
	py := python3WithOpenpyxl(t)
	dir := t.TempDir()
	var books []string
	for _, sc := range wbScenarios(t) {
		res := wbRunScenario(t, sc.Name)
		books = append(books, wbWrite(t, dir, sc.Name+".xlsx", res))
	}
	books = append(books, wbTemplate(t, dir, wbScenarios(t)[0].Name))
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	defer cancel()
	out, err := exec.CommandContext(ctx, py, append([]string{"-c", openpyxlRows}, books...)...).Output()
	if err != nil {
		t.Fatalf("openpyxl: %v", err)
	}
	var seen map[string]map[string]int
	if err := json.Unmarshal(out, &seen); err != nil {
		t.Fatalf("openpyxl output: %v\n%s", err, out)
	}
	for _, b := range books {
		f := wbOpen(t, b)
		for _, sheet := range f.GetSheetList() {
			want := 0
			for _, row := range wbRows(t, f, sheet) {
				if strings.Join(row, "") != "" {
					want++
				}
			}
			if got, ok := seen[b][sheet]; !ok || got != want {
				t.Errorf("%s, sheet %s: openpyxl (read-only) sees %d rows with values, excelize %d", filepath.Base(b), sheet, got, want)
			}
		}
	}
}

var pdfPagesRE = regexp.MustCompile(`(?m)^Pages:\s+([0-9]+)`)

// Page budgets of the printed workbooks (LibreOffice's PDF export, A4
// landscape, fitted to the page width). The template has 14 sheets: a page
// each, two for the Instructions and the Lists; before the print setup it
// took 22 pages and a result workbook up to 182.
const (
	maxTemplatePages = 16
	maxResultPages   = 40
)

// TestWorkbooksPrintWithinPages converts the template and every result
// workbook to PDF with LibreOffice and counts the pages with pdfinfo: the
// print setup (landscape, fitted to width, header rows repeated, long grid
// tables fitted to about 100 rows a page) keeps the template within 16
// pages and a result workbook within 40.
func TestWorkbooksPrintWithinPages(t *testing.T) {
	soffice := loBinary(t)
	pdfinfo := report.SysTool(t, "pdfinfo", "poppler-utils")
	dir, out := t.TempDir(), t.TempDir()
	books := []string{wbTemplate(t, dir, wbScenarios(t)[0].Name)}
	for _, sc := range wbScenarios(t) {
		books = append(books, wbWrite(t, dir, sc.Name+".xlsx", wbRunScenario(t, sc.Name)))
	}
	loConvertTo(t, soffice, out, "pdf", books)
	for i, b := range books {
		pdf := filepath.Join(out, strings.TrimSuffix(filepath.Base(b), ".xlsx")+".pdf")
		info, err := exec.Command(pdfinfo, pdf).Output()
		if err != nil {
			t.Errorf("pdfinfo %s: %v", filepath.Base(pdf), err)
			continue
		}
		m := pdfPagesRE.FindSubmatch(info)
		if m == nil {
			t.Errorf("pdfinfo %s: no page count in %q", filepath.Base(pdf), info)
			continue
		}
		pages, _ := strconv.Atoi(string(m[1]))
		limit := maxResultPages
		if i == 0 {
			limit = maxTemplatePages
		}
		t.Logf("%s prints on %d pages (at most %d)", filepath.Base(b), pages, limit)
		if pages > limit {
			t.Errorf("%s prints on %d pages, more than %d", filepath.Base(b), pages, limit)
		}
	}
}

// TestSummaryLinksToMapSheets: in every scenario's workbook, each
// strategy's row of the Summary links to that strategy's map sheet, and
// every link lands on a sheet of the workbook.
func TestSummaryLinksToMapSheets(t *testing.T) {
	dir := t.TempDir()
	for _, sc := range wbScenarios(t) {
		res := wbRunScenario(t, sc.Name)
		f := wbOpen(t, wbWrite(t, dir, sc.Name+".xlsx", res))
		sheets := map[string]bool{}
		for _, s := range f.GetSheetList() {
			sheets[s] = true
		}
		links := 0
		for r, row := range wbRows(t, f, "Summary") {
			for c := range row {
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				ok, target, err := f.GetCellHyperLink("Summary", cell)
				if err != nil || !ok {
					continue
				}
				links++
				name := strings.TrimSuffix(strings.Trim(strings.TrimSuffix(target, "!A1"), "'"), "'")
				if !sheets[name] {
					t.Errorf("%s: Summary!%s links to %q, which is no sheet", sc.Name, cell, target)
				}
				if i := slices.IndexFunc(res.Strategies, func(sr *sweep.StrategyResult) bool { return sr.Name == wbAt(row, 0) }); i < 0 || !strings.HasPrefix(name, fmt.Sprintf("Map %d ", i+1)) {
					t.Errorf("%s: Summary!%s (row of %q) links to %q, not its strategy's map", sc.Name, cell, wbAt(row, 0), name)
				}
			}
		}
		if links != len(res.Strategies) {
			t.Errorf("%s: %d links in the Summary, want one per strategy (%d)", sc.Name, links, len(res.Strategies))
		}
	}
}
