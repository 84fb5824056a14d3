package report

import (
	"bytes"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// sigNum is a number stored at full precision and shown to four
// significant figures (sheetWriter.add gives it its display format).
type sigNum float64

// sigFormat is a number format that shows x to four significant figures:
// decimals by magnitude, thousands separators from 1,000, and a
// scientific format outside 10⁻³ … 10⁹.
func sigFormat(x float64) string {
	if x == 0 {
		return "0"
	}
	e := int(math.Floor(math.Log10(math.Abs(x))))
	switch {
	case e >= 9 || e < -3:
		return "0.000E+00"
	case e >= 3:
		return "#,##0"
	default: // 3 − e decimals, 1 to 6
		return [...]string{"0.0", "0.00", "0.000", "0.0000", "0.00000", "0.000000"}[2-e]
	}
}

// sigCell turns a sigNum into a cell with its display format.
func (s *sheetWriter) sigCell(x sigNum) (any, error) {
	v := float64(x)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "", nil
	}
	id, err := s.sigStyle(v)
	if err != nil {
		return nil, err
	}
	return excelize.Cell{StyleID: id, Value: v}, nil
}

// sigStyle is the style of a cell showing v to four significant figures,
// made on first use.
func (s *sheetWriter) sigStyle(v float64) (int, error) {
	f := sigFormat(v)
	id, ok := s.formats[f]
	if !ok {
		var err error
		id, err = s.f.NewStyle(&excelize.Style{CustomNumFmt: &f})
		if err != nil {
			return 0, err
		}
		if s.formats == nil {
			s.formats = map[string]int{}
		}
		s.formats[f] = id
	}
	return id, nil
}

// printRowsPerPage is the most rows a long table prints per page: its
// grid of scales is fitted to pages of about this many rows (small type,
// but the table stays whole on a few pages).
const printRowsPerPage = 100

// printSetup makes a sheet print on A4 landscape, fitted to the page width,
// with its header row repeated on every page. It must come before the
// sheet's stream writer, which writes the sheet properties first.
func printSetup(f *excelize.File, sheet string, header bool) error {
	fit := true
	if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	if err := printPages(f, sheet, 0); err != nil {
		return err
	}
	if !header {
		return nil
	}
	return f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", Scope: sheet,
		RefersTo: "'" + sheet + "'!$1:$1"})
}

// printPages sets the page layout of a sheet of rows rows: one page wide,
// and as many pages tall as it needs, or, for a long table, fitted to a
// page per printRowsPerPage rows. The stream writer writes the page
// layout last, so this may be called until the sheet is flushed.
func printPages(f *excelize.File, sheet string, rows int) error {
	landscape, a4, wide, tall := "landscape", 9, 1, 0
	if rows > printRowsPerPage {
		tall = (rows + printRowsPerPage - 1) / printRowsPerPage
	}
	return f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Size: &a4, Orientation: &landscape, FitToWidth: &wide, FitToHeight: &tall})
}

var (
	sheetPartRE = regexp.MustCompile(`^xl/worksheets/sheet[0-9]+\.xml$`)
	dimensionRE = regexp.MustCompile(`<dimension ref="[^"]*"\s*(/>|></dimension>)`)
	cellRefRE   = regexp.MustCompile(`<c r="([A-Z]+)([0-9]+)"`)
)

// fixDimension sets a sheet's declared dimension to the range its cells
// cover: the stream writer declares "A1" before any row is written, and a
// reader in read-only mode trusts the declaration.
func fixDimension(b []byte) []byte {
	loc := dimensionRE.FindIndex(b)
	if loc == nil {
		return b
	}
	maxCol, maxRow := 0, 0
	for _, m := range cellRefRE.FindAllSubmatch(b, -1) {
		col, err := excelize.ColumnNameToNumber(string(m[1]))
		if err != nil {
			continue
		}
		row, _ := strconv.Atoi(string(m[2]))
		maxCol, maxRow = max(maxCol, col), max(maxRow, row)
	}
	if maxCol == 0 {
		return b
	}
	last, err := excelize.CoordinatesToCellName(maxCol, maxRow)
	if err != nil {
		return b
	}
	ref := "A1"
	if last != "A1" {
		ref = "A1:" + last
	}
	var out bytes.Buffer
	out.Write(b[:loc[0]])
	out.WriteString(`<dimension ref="` + ref + `"/>`)
	out.Write(b[loc[1]:])
	return out.Bytes()
}

// shortName shortens a name to at most n characters readably: cut after a
// whole word where one ends in its second half, and marked with "…".
func shortName(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	cut := r[:n-1]
	for j := len(cut); j > n/2; j-- {
		if cut[j-1] != ' ' && (j == len(r) || r[j] == ' ') {
			cut = cut[:j]
			break
		}
	}
	return strings.TrimRight(string(cut), " -_,;") + "…"
}

// sheetLink makes the cell at col, row of a sheet being streamed a link
// to another sheet of the workbook (a location hyperlink, not a formula:
// the stream writer writes it with the sheet).
func sheetLink(f *excelize.File, sheet string, col, row int, target string) error {
	cell, err := excelize.CoordinatesToCellName(col, row)
	if err != nil {
		return err
	}
	tip := "open the sheet " + target
	return f.SetCellHyperLink(sheet, cell, "'"+target+"'!A1", "Location", excelize.HyperlinkOpts{Tooltip: &tip})
}
