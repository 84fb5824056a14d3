package report_test

import (
	"archive/zip"
	"bytes"
	"context"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scaleplan/report"
	"scaleplan/sweep/study"
)

// TestWorkbookArchive checks the archive the workbook is written as, part
// by part, for every built-in scenario with its maps embedded: every
// sheet declares the range its cells cover (a reader in read-only mode
// trusts the declaration; the long sheets declare it before they are
// written, the others are fixed afterwards), the parts are in name order
// with the content types first, and the PNG maps are stored as they are
// (a PNG is compressed already).
func TestWorkbookArchive(t *testing.T) {
	dimRE := regexp.MustCompile(`<dimension ref="([^"]*)"`)
	cellRE := regexp.MustCompile(`<c r="([A-Z]+)([0-9]+)"`)
	for _, sc := range wbScenarios(t) {
		t.Run(sc.Name, func(t *testing.T) {
			dir := t.TempDir()
			res := wbRunScenario(t, sc.Name)
			files, err := report.WriteStudy(context.Background(), dir, res)
			if err != nil {
				t.Fatal(err)
			}
			book := ""
			for _, f := range files {
				if strings.HasSuffix(f, ".xlsx") {
					book = f
				}
			}
			data, err := os.ReadFile(book)
			if err != nil {
				t.Fatal(err)
			}
			zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
			if err != nil {
				t.Fatal(err)
			}
			pngs := 0
			for _, f := range zr.File {
				if strings.HasSuffix(f.Name, ".png") {
					pngs++
					if f.Method != zip.Store {
						t.Errorf("%s: method %d, want stored", f.Name, f.Method)
					}
				}
			}
			names := wbZipOrder(t, data)
			for name, b := range wbZipParts(t, data) {
				if !strings.HasPrefix(name, "xl/worksheets/sheet") || !strings.HasSuffix(name, ".xml") {
					continue
				}
				// The extent of the cells, by hand: letters are a base-26
				// column number (A = 1, Z = 26, AA = 27), ECMA-376 §18.3.1.4.
				maxCol, maxRow := 0, 0
				for _, m := range cellRE.FindAllStringSubmatch(b, -1) {
					col := 0
					for _, ch := range m[1] {
						col = col*26 + int(ch-'A'+1)
					}
					row, _ := strconv.Atoi(m[2])
					maxCol, maxRow = max(maxCol, col), max(maxRow, row)
				}
				want := "A1"
				if maxCol > 0 && (maxCol > 1 || maxRow > 1) {
					want = "A1:" + study.ColumnLetters(maxCol) + strconv.Itoa(maxRow)
				}
				d := dimRE.FindStringSubmatch(b)
				if d == nil {
					t.Errorf("%s: no dimension", name)
					continue
				}
				if d[1] != want {
					t.Errorf("%s: declares %s, its cells cover %s", name, d[1], want)
				}
			}
			if pngs == 0 {
				t.Error("no map embedded")
			}
			if names[0] != "[Content_Types].xml" {
				t.Errorf("first part %s", names[0])
			}
			for i := 2; i < len(names); i++ {
				if names[i-1] > names[i] {
					t.Errorf("parts out of order: %s before %s", names[i-1], names[i])
				}
			}
		})
	}
}
