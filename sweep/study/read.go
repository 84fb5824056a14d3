package study

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"strings"
	"unicode/utf8"
)

// Limits of what a study may hold. A study is a small table; anything far
// larger is a mistake (or a hostile file), refused with a Problem rather
// than read into memory.
const (
	// MaxRows is the largest row number a sheet may use (header included).
	MaxRows = 100000
	// MaxCellChars is the most characters a cell may hold.
	MaxCellChars = 10000
	// maxFileBytes bounds a CSV sheet file, an .xlsx file and what an .xlsx
	// unpacks to (excelize's UnzipSizeLimit).
	maxFileBytes = 64 << 20
	// maxXMLBytes is excelize's UnzipXMLSizeLimit: larger worksheet parts
	// are unpacked to a temporary file instead of memory.
	maxXMLBytes = 16 << 20
	// maxSheetProblems stops reading a sheet after this many problems.
	maxSheetProblems = 100
)

// Load reads a study from an .xlsx workbook or a folder of NAME.csv files
// (one per sheet in SheetNames; missing optional sheets are empty). Every
// problem found is returned at once as Problems, each with its sheet and
// cell; the study as far as it could be read is returned with them (nil
// only when the path cannot be read at all).
//
// The name of the study is its "name" setting, else the base name of the
// file (without extension) or folder. Settings are keyed by their name in
// lower case; Setting.Name keeps the name as typed.
func Load(p string) (*Study, error) {
	info, err := os.Stat(p)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return nil, fmt.Errorf("study %s: no such file or folder (a study is an .xlsx workbook or a folder of .csv sheets; `scaleplan init FILE` writes one)", p)
		}
		return nil, fmt.Errorf("study %s: %w", p, err)
	}
	if what := notRegular(info.Mode()); what != "" && !info.IsDir() {
		return nil, fmt.Errorf("study %s: it is %s, not a file or folder: a study is an .xlsx workbook or a folder of .csv sheets", p, what)
	}
	if info.IsDir() {
		return loadCSV(os.DirFS(p), ".", p, filepath.Base(filepath.Clean(p)))
	}
	ext := strings.ToLower(filepath.Ext(p))
	base := strings.TrimSuffix(filepath.Base(p), filepath.Ext(p))
	switch ext {
	case ".xlsx":
		return loadXLSX(p, base)
	case ".csv":
		return nil, fmt.Errorf("study %s: a single .csv file is one sheet; a CSV study is a folder holding %s: pass the folder %s instead", p, csvFileList(), filepath.Dir(p))
	case ".xls", ".xlsm", ".xlsb", ".ods":
		return nil, fmt.Errorf("study %s: %s files are not read: save the workbook as an Excel Workbook (.xlsx), or as a folder of .csv sheets", p, ext)
	}
	return nil, fmt.Errorf("study %s: not a study: give an .xlsx workbook or a folder of .csv sheets (%s)", p, csvFileList())
}

// LoadFS reads a CSV-folder study from a file system (used for studies
// embedded in the binary). dir is a slash-separated path in fsys; its base
// name is the study's name when it has no "name" setting.
func LoadFS(fsys fs.FS, dir string) (*Study, error) {
	base := path.Base(path.Clean(dir))
	if base == "." || base == "/" {
		base = "study"
	}
	return loadCSV(fsys, dir, dir, base)
}

func csvFileList() string {
	names := make([]string, len(SheetNames))
	for i, s := range SheetNames {
		names[i] = s + ".csv"
	}
	return strings.Join(names, ", ")
}

func isRequired(sheet string) bool {
	for _, s := range RequiredSheets {
		if s == sheet {
			return true
		}
	}
	return false
}

// newStudy is an empty study as the readers fill it.
func newStudy(source string) *Study {
	return &Study{Source: source, Settings: map[string]Setting{}}
}

// finish names the study and returns it with its problems.
func finish(s *Study, base string, ps Problems) (*Study, error) {
	if set, ok := s.Settings["name"]; ok && set.Value != "" {
		s.Name = set.Value
	} else {
		s.Name = base
	}
	return s, ps.Err()
}

// sheetReader turns the rows of one sheet, given in order with their
// 1-based row numbers, into rows of a study. Both readers feed it, so CSV
// and xlsx studies follow exactly the same rules.
type sheetReader struct {
	sheet    string
	cols     []string
	study    *Study
	ps       *Problems
	problems int
	stopped  bool
	header   bool // the header row has been seen
	lastRow  int
	settings map[string]int // setting key → row of its first appearance
	// flagged cells have been reported already (a formula without a
	// cached value); a row holding one is not kept.
	flagged map[place]bool
	// units are the units in brackets in the header, by column index
	// (see checkHeaderUnits); decimalComma is set for a CSV file
	// separated by semicolons.
	units        map[int]string
	decimalComma bool
}

func newSheetReader(s *Study, sheet string, ps *Problems) *sheetReader {
	return &sheetReader{sheet: sheet, cols: Columns[sheet], study: s, ps: ps, settings: map[string]int{}}
}

// add records a problem of this sheet; after maxSheetProblems it records
// one last problem and stops reading the sheet.
func (r *sheetReader) add(c Cell, format string, args ...any) {
	if r.stopped {
		return
	}
	r.problems++
	if r.problems > maxSheetProblems {
		r.ps.Add(Cell{Sheet: r.sheet}, "more than %d problems: fix these first", maxSheetProblems)
		r.stopped = true
		return
	}
	r.ps.Add(c, format, args...)
}

// clean is a cell value as a study keeps it: line breaks as "\n", and
// surrounding spaces removed.
func clean(v string) string {
	if strings.IndexByte(v, '\r') >= 0 {
		v = strings.ReplaceAll(v, "\r\n", "\n")
		v = strings.ReplaceAll(v, "\r", "\n")
	}
	return strings.TrimSpace(v)
}

// isControl reports whether a character cannot be text in a study: a
// control character other than tab and line break, or one that XML (and so
// a workbook) cannot hold.
func isControl(r rune) bool {
	return r < 0x20 && r != '\t' && r != '\n' || r == 0xfffe || r == 0xffff
}

// headerMatches reports whether a header cell names col: case-insensitive,
// surrounding spaces ignored, with an optional unit in brackets after the
// name ("value [SI or as unit]").
func headerMatches(cell, col string) bool {
	cell = strings.TrimSpace(cell)
	if strings.HasSuffix(cell, "]") {
		if i := strings.IndexByte(cell, '['); i >= 0 {
			cell = strings.TrimSpace(cell[:i])
		}
	}
	return strings.EqualFold(cell, col)
}

// shorten quotes a value for a message, cut to a readable length.
func shorten(v string) string {
	const max = 40
	if utf8.RuneCountInString(v) <= max {
		return fmt.Sprintf("%q", v)
	}
	n := 0
	for i := range v {
		if n == max {
			return fmt.Sprintf("%q…", v[:i])
		}
		n++
	}
	return fmt.Sprintf("%q", v)
}

// row takes the cells of row n. It returns false when the sheet should not
// be read any further.
func (r *sheetReader) row(n int, cells []string) bool {
	if r.stopped {
		return false
	}
	r.lastRow = n
	if !r.header {
		r.header = true
		if n != 1 {
			cells = nil // row 1 is blank, so the header is missing
		}
		if !r.checkHeader(cells) {
			r.stopped = true
			return false
		}
		return true
	}
	if len(cells) == 0 && len(r.flagged) == 0 {
		return true // blank, and cheap: the xlsx iterator visits gaps
	}
	// A row is blank when every column the study keeps is empty: a row
	// holding only a note is a comment.
	vals := make([]string, len(r.cols))
	blank, bad := true, false
	for i, col := range r.cols {
		if r.flagged[place{n, i + 1}] {
			blank, bad = false, true
			continue
		}
		if i < len(cells) {
			vals[i] = clean(cells[i])
		}
		if vals[i] != "" && col != "note" {
			blank = false
		}
	}
	if blank {
		return true
	}
	if n > MaxRows {
		r.add(Cell{r.sheet, n, 0}, "more than %d rows: a study sheet holds at most %d rows", MaxRows, MaxRows)
		r.stopped = true
		return false
	}
	for i, v := range vals {
		c, col := Cell{r.sheet, n, i + 1}, r.cols[i]
		if !utf8.ValidString(v) {
			r.add(c, "not UTF-8 text: save the sheet with UTF-8 encoding (\"CSV UTF-8\")")
			bad = true
		} else if k := utf8.RuneCountInString(v); k > MaxCellChars {
			r.add(c, "the cell holds %d characters; a study cell holds at most %d", k, MaxCellChars)
			bad = true
		} else if i := strings.IndexFunc(v, isControl); i >= 0 {
			ch, _ := utf8.DecodeRuneInString(v[i:])
			r.add(c, "the cell holds a control character (U+%04X): delete it", ch)
			bad = true
		} else if t, msg := r.tidyCell(col, v); msg != "" {
			r.add(c, "%s", msg)
			bad = true
		} else {
			vals[c.Col-1] = t
		}
	}
	if !bad && !r.applyHeaderUnit(n, vals) {
		bad = true
	}
	if !bad {
		r.store(n, vals)
	}
	return !r.stopped
}

// end is called when the sheet has been read to its end.
func (r *sheetReader) end() {
	if !r.header && isRequired(r.sheet) {
		r.add(Cell{r.sheet, 1, 1}, "the sheet is empty: row 1 must name the columns %s", strings.Join(r.cols, ", "))
	}
}

// checkHeader checks the header row and reports each wrong cell.
func (r *sheetReader) checkHeader(cells []string) bool {
	ok := true
	for i, col := range r.cols {
		got := ""
		if i < len(cells) {
			got = strings.TrimSpace(cells[i])
		}
		if headerMatches(got, col) || r.flagged[place{1, i + 1}] {
			if !headerMatches(got, col) {
				ok = false
			}
			continue
		}
		ok = false
		c := Cell{r.sheet, 1, i + 1}
		if got == "" {
			r.add(c, "expected column %q, found nothing", col)
		} else {
			r.add(c, "expected column %q, found %s", col, shorten(got))
		}
	}
	if ok && !r.checkHeaderUnits(cells) {
		return false
	}
	if !ok {
		r.add(Cell{Sheet: r.sheet}, "row 1 must name the columns %s, in this order (a unit in brackets may follow a name; extra columns to the right are ignored); the sheet's rows were not read", strings.Join(r.cols, ", "))
	}
	return ok
}

// store keeps one non-blank data row.
func (r *sheetReader) store(n int, v []string) {
	s := r.study
	switch r.sheet {
	case "Study":
		name := v[0]
		if name == "" {
			if v[1] != "" {
				r.add(Cell{r.sheet, n, 1}, "setting name missing (the row has the value %s)", shorten(v[1]))
			}
			return
		}
		key := strings.ToLower(name)
		if first, dup := r.settings[key]; dup {
			r.add(Cell{r.sheet, n, 1}, "setting %q is given twice (first at %s)", name, Cell{r.sheet, first, 1})
			return
		}
		r.settings[key] = n
		s.Settings[key] = Setting{Name: name, Value: v[1], Unit: v[2], Cell: Cell{r.sheet, n, 2}}
	default:
		if sh, ok := SheetOf(r.sheet); ok {
			sh.store(s, n, v)
		}

	}
}
