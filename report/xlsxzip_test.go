package report_test

import (
	"archive/zip"
	"context"
	"io"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scaleplan/report"
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
			zr, err := zip.OpenReader(book)
			if err != nil {
				t.Fatal(err)
			}
			defer zr.Close()
			var names []string
			pngs := 0
			for _, f := range zr.File {
				names = append(names, f.Name)
				if strings.HasSuffix(f.Name, ".png") {
					pngs++
					if f.Method != zip.Store {
						t.Errorf("%s: method %d, want stored", f.Name, f.Method)
					}
				}
				if !strings.HasPrefix(f.Name, "xl/worksheets/sheet") || !strings.HasSuffix(f.Name, ".xml") {
					continue
				}
				r, err := f.Open()
				if err != nil {
					t.Fatal(err)
				}
				b, err := io.ReadAll(r)
				r.Close()
				if err != nil {
					t.Fatal(err)
				}
				// The extent of the cells, by hand: letters are a base-26
				// column number (A = 1, Z = 26, AA = 27), ECMA-376 §18.3.1.4.
				maxCol, maxRow := 0, 0
				for _, m := range cellRE.FindAllSubmatch(b, -1) {
					col := 0
					for _, ch := range m[1] {
						col = col*26 + int(ch-'A'+1)
					}
					row, _ := strconv.Atoi(string(m[2]))
					maxCol, maxRow = max(maxCol, col), max(maxRow, row)
				}
				want := "A1"
				if maxCol > 0 && (maxCol > 1 || maxRow > 1) {
					want = "A1:" + colName(maxCol) + strconv.Itoa(maxRow)
				}
				d := dimRE.FindSubmatch(b)
				if d == nil {
					t.Errorf("%s: no dimension", f.Name)
					continue
				}
				if string(d[1]) != want {
					t.Errorf("%s: declares %s, its cells cover %s", f.Name, d[1], want)
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

// colName is the letters of a column number (1 = A, 27 = AA).
func colName(n int) string {
	s := ""
	for n > 0 {
		n--
		s = string(rune('A'+n%26)) + s
		n /= 26
	}
	return s
}
