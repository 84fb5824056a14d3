package study

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"os"
	"path"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// maxParts bounds the number of parts (zip entries) of a workbook: a study
// has about twenty.
const maxParts = 10000

// loadXLSX reads a workbook study.
func loadXLSX(p, base string) (*Study, error) {
	file := filepath.Base(p)
	info, err := os.Stat(p)
	if err != nil {
		return nil, fmt.Errorf("study %s: %w", p, err)
	}
	if info.Size() > maxFileBytes {
		s := newStudy(p)
		var ps Problems
		ps.Add(Cell{Sheet: file}, "the workbook is larger than %d MiB; a study is far smaller", maxFileBytes>>20)
		return finish(s, base, ps)
	}
	b, err := readRegular(p, maxFileBytes)
	if errors.Is(err, errTooLarge) {
		s := newStudy(p)
		var ps Problems
		ps.Add(Cell{Sheet: file}, "the workbook is larger than %d MiB; a study is far smaller", maxFileBytes>>20)
		return finish(s, base, ps)
	}
	if err != nil {
		return nil, fmt.Errorf("study %s: %w", p, err)
	}
	return readXLSX(b, p, file, base)
}

// readXLSX reads a workbook held in memory. file names the workbook in
// problems that concern the whole file.
//
// Values are read with excelize's streaming row iterator, as raw cell
// values: a number is its stored value, not its display format (so a cell
// formatted "0.00" or as a currency still gives its full value), a formula
// its cached value. A number formatted as a date or a time is read as the
// text a person typed (see cellText). Formulas without a cached value are
// found by a streaming scan of the worksheet XML, since the iterator gives
// them as empty cells.
func readXLSX(b []byte, source, file, base string) (st *Study, err error) {
	s := newStudy(source)
	var ps Problems
	whole := Cell{Sheet: file}
	defer func() {
		// excelize is a large third-party parser: a panic inside it on a
		// damaged file is reported as a problem of the file, never a crash.
		if v := recover(); v != nil {
			ps.Add(whole, "cannot read the workbook (the xlsx reader failed: %v): open it in a spreadsheet program and save it again as an Excel Workbook (.xlsx)", v)
			st, err = finish(s, base, ps)
		}
	}()
	zr, msg := openArchive(b)
	if msg != "" {
		ps.Add(whole, "%s", msg)
		return finish(s, base, ps)
	}
	parts, sst, perr := sheetParts(zr)
	if perr != nil {
		ps.Add(whole, "not an .xlsx workbook, or a damaged one (%v): save it again from a spreadsheet program as an Excel Workbook (.xlsx)", perr)
		return finish(s, base, ps)
	}
	texts, serr := countStrings(sst)
	if serr != nil {
		ps.Add(whole, "the workbook is damaged (its shared strings: %v): save it again from a spreadsheet program as an Excel Workbook (.xlsx)", serr)
		return finish(s, base, ps)
	}
	f, oerr := excelize.OpenReader(bytes.NewReader(b), excelize.Options{UnzipSizeLimit: maxFileBytes, UnzipXMLSizeLimit: maxXMLBytes})
	if oerr != nil {
		ps.Add(whole, "cannot read the workbook (%v): save it again from a spreadsheet program as an Excel Workbook (.xlsx)", oerr)
		return finish(s, base, ps)
	}
	defer f.Close()
	list := f.GetSheetList()
	for _, sheet := range SheetNames {
		name := ""
		for _, n := range list {
			if n == sheet {
				name = n
				break
			}
			if name == "" && strings.EqualFold(n, sheet) {
				name = n
			}
		}
		part, ok := parts[strings.ToLower(name)]
		if name == "" || !ok {
			if isRequired(sheet) {
				ps.Add(Cell{Sheet: sheet}, "sheet missing: the workbook has no worksheet named %s", sheet)
			}
			continue
		}
		readXLSXSheet(f, name, part, texts, newSheetReader(s, sheet, &ps))
	}
	strayWorksheets(list, s, &ps)
	return finish(s, base, ps)
}

// readXLSXSheet reads one worksheet.
func readXLSXSheet(f *excelize.File, name string, part *zip.File, nStrings int, r *sheetReader) {
	kinds := cellKinds{kind: styleKinds(f), at: map[place]cellKind{}}
	issues, err := scanSheet(part, len(r.cols), nStrings, &kinds)
	if errors.Is(err, errTooWide) {
		for _, is := range issues {
			r.add(is.at.in(r.sheet), "%s", is.msg)
		}
		return
	}
	if err != nil {
		r.add(Cell{Sheet: r.sheet}, "the sheet is damaged (%v): save the workbook again from a spreadsheet program", err)
		return
	}
	for _, is := range issues {
		r.add(is.at.in(r.sheet), "%s", is.msg)
		if r.flagged == nil {
			r.flagged = map[place]bool{}
		}
		r.flagged[is.at] = true
	}
	use1904 := date1904(f)
	rows, err := f.Rows(name)
	if err != nil {
		r.add(Cell{Sheet: r.sheet}, "cannot read the sheet: %v", err)
		return
	}
	defer rows.Close()
	n := 0 // the iterator visits every row number in turn, blank ones too
	for rows.Next() {
		n++
		cells, err := rows.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			r.add(Cell{r.sheet, n, 0}, "cannot read the row: %v", err)
			if r.stopped {
				return
			}
			continue
		}
		typedCells(cells, n, kinds.at, use1904)
		if !r.row(n, cells) {
			return
		}
	}
	if err := rows.Error(); err != nil {
		r.add(Cell{Sheet: r.sheet}, "cannot read the sheet: %v", err)
		return
	}
	r.end()
}

// checkEntry unpacks a zip entry, discarding it, to find a damaged one.
func checkEntry(f *zip.File) error {
	rc, err := f.Open()
	if err != nil {
		return err
	}
	defer rc.Close()
	_, err = io.Copy(io.Discard, io.LimitReader(rc, maxFileBytes+1))
	return err
}

// place is a row and column in a sheet.
type place struct{ row, col int }

func (p place) in(sheet string) Cell { return Cell{sheet, p.row, p.col} }

// cellIssue is a cell the row iterator would read wrongly.
type cellIssue struct {
	at  place
	msg string
}

// scanSheet scans a worksheet part, streaming, for cells in the first cols
// columns that excelize's row iterator would silently read as empty or as
// text: a formula without a cached value (no <v> element), a formula whose
// cached value is an error (#DIV/0!), and a reference to a shared string
// that does not exist (nStrings is the number of shared strings). At most
// maxSheetProblems are returned. The same scan notes the cells whose
// number format makes them dates, times or percentages in kinds.
func scanSheet(part *zip.File, cols, nStrings int, kinds *cellKinds) ([]cellIssue, error) {
	return scanSheetCells(part, cols, nStrings, kinds)
}

// MaxColumns is the widest a study sheet may be: its own columns and room
// for the user's notes to the right.
const MaxColumns = 256

var errTooWide = errors.New("sheet too wide")

func scanSheetCells(part *zip.File, cols, nStrings int, kinds *cellKinds) ([]cellIssue, error) {
	rc, err := part.Open()
	if err != nil {
		return nil, err
	}
	defer rc.Close()
	d := xml.NewDecoder(io.LimitReader(rc, maxFileBytes))
	var (
		found              []cellIssue
		row, col           int
		typ, value         string
		inCell, hasF, hasV bool
		inV                bool
	)
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return found, nil
		}
		if err != nil {
			return nil, err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			switch t.Name.Local {
			case "row":
				row, col = rowNumber(t, row+1), 0
			case "c":
				col, row = cellPosition(t, col+1, row)
				if col > MaxColumns {
					// Reading such rows costs time in proportion to the
					// column; refuse the sheet instead.
					return append(found, tooWideIssue(row, col)), errTooWide
				}
				inCell, hasF, hasV, typ, value = true, false, false, attr(t, "t"), ""
				if col <= cols && row <= MaxRows {
					kinds.note(place{row, col}, typ, attr(t, "s"))
				}
			case "f":
				hasF = hasF || inCell
			case "v":
				if inCell {
					hasV, inV = true, true
				}
			}
		case xml.CharData:
			if inV && len(value) < 64 {
				value += string(t)
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "v":
				inV = false
			case "c":
				if !inCell || col > cols || row > MaxRows || len(found) >= maxSheetProblems {
					inCell = false
					continue
				}
				inCell = false
				if why := cellProblem(typ, strings.TrimSpace(value), hasF, hasV, nStrings); why != "" {
					found = append(found, cellIssue{place{row, col}, why})
				}
			}
		}
	}
}

// rowNumber is the number of the row element t: its r attribute, else
// next (the row after the one before).
func rowNumber(t xml.StartElement, next int) int {
	if r := attr(t, "r"); r != "" {
		if v, err := strconv.Atoi(r); err == nil {
			return v
		}
	}
	return next
}

// cellPosition is the column and row of the cell element t: its r
// attribute, else the next column in the current row.
func cellPosition(t xml.StartElement, nextCol, row int) (int, int) {
	if r := attr(t, "r"); r != "" {
		if c, rr, err := excelize.CellNameToCoordinates(r); err == nil {
			return c, rr
		}
	}
	return nextCol, row
}

// tooWideIssue is the problem of a sheet with a cell beyond MaxColumns.
func tooWideIssue(row, col int) cellIssue {
	cell, _ := excelize.CoordinatesToCellName(min(col, excelize.MaxColumns), max(row, 1))
	return cellIssue{place{row, 0}, fmt.Sprintf("the sheet has a cell at %s, beyond column %s: a study sheet uses its first %d columns; delete the cells far to the right", cell, ColumnLetters(MaxColumns), len(Columns["Strategies"]))}
}

// cellProblem says what is wrong with a cell of type typ and cached value
// value (trimmed), "" when nothing is: a formula without a cached value, a
// spreadsheet error, or a shared text the workbook does not hold.
func cellProblem(typ, value string, hasF, hasV bool, nStrings int) string {
	switch {
	case hasF && !hasV:
		return "formula without a cached value: open and save the workbook in a spreadsheet program, or type the value"
	case typ == "e":
		return fmt.Sprintf("the cell holds the spreadsheet error %s: correct it, or type the value", value)
	case typ == "s" && hasV:
		if i, err := strconv.Atoi(value); err != nil || i < 0 || i >= nStrings {
			return "the cell refers to a text that the workbook does not hold (the workbook is damaged): type the value again"
		}
	}
	return ""
}

// countStrings counts the shared strings of a workbook (0 without them).
func countStrings(sst *zip.File) (int, error) {
	if sst == nil {
		return 0, nil
	}
	rc, err := sst.Open()
	if err != nil {
		return 0, err
	}
	defer rc.Close()
	d := xml.NewDecoder(io.LimitReader(rc, maxFileBytes))
	n, depth := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return n, nil
		}
		if err != nil {
			return 0, err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			if depth == 2 && t.Name.Local == "si" {
				n++
			}
		case xml.EndElement:
			depth--
		}
	}
}

func attr(t xml.StartElement, name string) string {
	for _, a := range t.Attr {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

// relationships is an OPC relationships part.
type relationships struct {
	Rel []struct {
		ID     string `xml:"Id,attr"`
		Type   string `xml:"Type,attr"`
		Target string `xml:"Target,attr"`
		Mode   string `xml:"TargetMode,attr"`
	} `xml:"Relationship"`
}

// sheetParts maps each worksheet's name, in lower case, to its part in the
// package, the way a spreadsheet program finds it: the package
// relationships name the workbook, whose relationships name the sheets. sst
// is the shared strings part (nil if there is none).
func sheetParts(zr *zip.Reader) (sheets map[string]*zip.File, sst *zip.File, err error) {
	files := map[string]*zip.File{}
	for _, f := range zr.File {
		files[strings.ToLower(strings.TrimPrefix(strings.ReplaceAll(f.Name, `\`, "/"), "/"))] = f
	}
	read := func(name string, v any) error {
		f, ok := files[strings.ToLower(name)]
		if !ok {
			return fmt.Errorf("no part %s", name)
		}
		rc, err := f.Open()
		if err != nil {
			return err
		}
		defer rc.Close()
		if err := xml.NewDecoder(io.LimitReader(rc, maxXMLBytes)).Decode(v); err != nil {
			return fmt.Errorf("part %s: %v", name, err)
		}
		return nil
	}
	resolve := func(from, target string) string {
		if strings.HasPrefix(target, "/") {
			return strings.TrimPrefix(target, "/")
		}
		return path.Join(path.Dir(from), target)
	}
	workbook := "xl/workbook.xml"
	var root relationships
	if err := read("_rels/.rels", &root); err == nil {
		for _, r := range root.Rel {
			if strings.HasSuffix(r.Type, "/officeDocument") {
				workbook = resolve("", r.Target)
				break
			}
		}
	}
	var wb struct {
		Sheets []struct {
			Name string `xml:"name,attr"`
			ID   string `xml:"id,attr"`
		} `xml:"sheets>sheet"`
	}
	if err := read(workbook, &wb); err != nil {
		return nil, nil, err
	}
	var rels relationships
	relsName := path.Join(path.Dir(workbook), "_rels", path.Base(workbook)+".rels")
	if err := read(relsName, &rels); err != nil {
		return nil, nil, err
	}
	// excelize reads the shared strings from this fixed part, whatever the
	// relationships say; so does the check of references to them.
	sst = files["xl/sharedstrings.xml"]
	parts := map[string]*zip.File{}
	for _, sh := range wb.Sheets {
		for _, r := range rels.Rel {
			if r.ID != sh.ID || strings.EqualFold(r.Mode, "External") {
				continue
			}
			if f, ok := files[strings.ToLower(resolve(workbook, r.Target))]; ok {
				key := strings.ToLower(sh.Name)
				if _, dup := parts[key]; !dup {
					parts[key] = f
				}
			}
		}
	}
	return parts, sst, nil
}

// openArchive opens a workbook's zip archive after the checks that keep a
// hostile or damaged file from reaching the spreadsheet library: its size,
// the number of its parts, what they unpack to, and every entry's
// checksum. It returns the problem of the file ("" when it may be read).
func openArchive(b []byte) (*zip.Reader, string) {
	if len(b) > maxFileBytes {
		return nil, fmt.Sprintf("the workbook is larger than %d MiB; a study is far smaller", maxFileBytes>>20)
	}
	zr, zerr := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if errors.Is(zerr, zip.ErrInsecurePath) {
		zerr = nil // names like ../x do not matter: nothing is extracted
	}
	if zerr != nil {
		if bytes.HasPrefix(b, []byte{0xd0, 0xcf, 0x11, 0xe0}) {
			return nil, "not an .xlsx workbook: it is an old .xls workbook or a password-protected one; save it as an unprotected Excel Workbook (.xlsx)"
		}
		return nil, fmt.Sprintf("not an .xlsx workbook, or a damaged or truncated one (%v): save it again from a spreadsheet program as an Excel Workbook (.xlsx)", zerr)
	}
	if len(zr.File) > maxParts {
		return nil, fmt.Sprintf("the workbook holds %d parts; a study workbook holds a few dozen: refused", len(zr.File))
	}
	var unpacked uint64
	for _, f := range zr.File {
		unpacked += min(f.UncompressedSize64, 1<<62)
		if unpacked > maxFileBytes {
			return nil, fmt.Sprintf("the workbook unpacks to more than %d MiB: refused (a study is far smaller; this may be a zip bomb)", maxFileBytes>>20)
		}
	}
	// excelize reads on past a damaged entry (a wrong checksum, or more
	// data than the entry's header says); check every entry first.
	for _, f := range zr.File {
		if err := checkEntry(f); err != nil {
			return nil, fmt.Sprintf("the workbook is damaged (%s: %v): save it again from a spreadsheet program as an Excel Workbook (.xlsx)", f.Name, err)
		}
	}
	return zr, ""
}
