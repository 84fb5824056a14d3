package study

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"path"
	"strings"
)

// loadCSV reads a folder study: one NAME.csv per sheet. A file whose name
// differs from the sheet's only in case (prototype.csv) is accepted when
// the exact name is absent.
func loadCSV(fsys fs.FS, dir, source, base string) (*Study, error) {
	entries, err := fs.ReadDir(fsys, dir)
	if err != nil {
		return nil, fmt.Errorf("study %s: %w", source, err)
	}
	s := newStudy(source)
	var ps Problems
	for _, sheet := range SheetNames {
		want := sheet + ".csv"
		name := ""
		for _, e := range entries { // sorted by name
			if e.IsDir() {
				continue
			}
			if e.Name() == want {
				name = want
				break
			}
			if name == "" && strings.EqualFold(e.Name(), want) {
				name = e.Name()
			}
		}
		if name == "" {
			if isRequired(sheet) {
				ps.Add(Cell{Sheet: sheet}, "sheet missing: the folder %s has no %s", source, want)
			}
			continue
		}
		if fi, err := fs.Stat(fsys, path.Join(dir, name)); err == nil && !fi.IsDir() {
			if what := notRegular(fi.Mode()); what != "" {
				ps.Add(Cell{Sheet: sheet}, "cannot read %s: it is %s, not a file: put the sheet's own file there", name, what)
				continue
			}
		}
		f, err := fsys.Open(path.Join(dir, name))
		if err != nil {
			ps.Add(Cell{Sheet: sheet}, "cannot read %s: %v", name, err)
			continue
		}
		readCSVSheet(f, name, newSheetReader(s, sheet, &ps))
		f.Close()
	}
	var names []string
	for _, e := range entries {
		if !e.IsDir() {
			names = append(names, e.Name())
		}
	}
	strayCSVFiles(names, s, &ps)
	return finish(s, base, ps)
}

// readCSVSheet reads one sheet file. Row numbers are the rows a spreadsheet
// program shows when it opens the file: a blank line is a row, a quoted
// cell spanning lines is one row. A UTF-8 byte order mark is skipped. The
// separator is a comma, or a semicolon when the header line has semicolons
// and no comma (the CSV that spreadsheet programs save in locales with a
// decimal comma).
//
// Quotes are read leniently (csv.Reader.LazyQuotes: a quote inside a cell,
// as in 12" pipe, is kept as typed), so the reader itself never rejects a
// line. Two mistakes that leniency would hide are reported as malformed
// lines: a quoted cell that is never closed (it would swallow the rest of
// the file), and a quoted cell that runs over several lines and holds a
// stray quote (a closing quote is probably missing).
func readCSVSheet(f io.Reader, name string, r *sheetReader) {
	raw, ok := readCSVBytes(f, name, r)
	if !ok {
		return
	}
	comma, decimalComma := csvSeparator(raw)
	if decimalComma {
		r.decimalComma = true // the separator of locales with a decimal comma
	}
	issues := quoteIssues(raw, comma)
	cr := csv.NewReader(bytes.NewReader(raw))
	cr.Comma = rune(comma)
	cr.FieldsPerRecord = -1
	cr.LazyQuotes = true
	// row is the spreadsheet row of the last record, endLine the file line
	// on which it ended.
	row, endLine := 0, 0
	for !r.stopped {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil { // not expected with LazyQuotes
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				row += max(pe.StartLine-endLine, 1)
				endLine = max(pe.Line, pe.StartLine)
				r.add(Cell{r.sheet, row, 0}, "malformed CSV line %d in %s: %v", pe.StartLine, name, pe.Err)
				continue
			}
			r.add(Cell{Sheet: r.sheet}, "cannot read %s: %v", name, err)
			return
		}
		start, _ := cr.FieldPos(0)
		row += max(start-endLine, 1)
		last, _ := cr.FieldPos(len(rec) - 1)
		endLine = last + strings.Count(rec[len(rec)-1], "\n")
		var bad bool
		issues, bad = r.quoteProblems(issues, start, endLine, row, name)
		if bad {
			if row == 1 {
				return // no header to read the rest by
			}
			continue
		}
		if !r.row(row, rec) {
			return
		}
	}
	r.end()
}

// readCSVBytes reads a CSV sheet whole, without a byte-order mark; ok is
// false, the problem said, when it cannot be read or is too large (a file
// that says it is too large is refused before it is read).
func readCSVBytes(f io.Reader, name string, r *sheetReader) ([]byte, bool) {
	if st, ok := f.(interface{ Stat() (fs.FileInfo, error) }); ok {
		if fi, err := st.Stat(); err == nil && fi.Size() > maxFileBytes {
			r.add(Cell{Sheet: r.sheet}, "%s is larger than %d MiB; a study sheet is far smaller", name, maxFileBytes>>20)
			return nil, false
		}
	}
	raw, err := io.ReadAll(io.LimitReader(f, maxFileBytes+1))
	if err != nil {
		r.add(Cell{Sheet: r.sheet}, "cannot read %s: %v", name, err)
		return nil, false
	}
	if len(raw) > maxFileBytes {
		r.add(Cell{Sheet: r.sheet}, "%s is larger than %d MiB; a study sheet is far smaller", name, maxFileBytes>>20)
		return nil, false
	}
	return bytes.TrimPrefix(raw, []byte("\xef\xbb\xbf")), true
}

// csvSeparator is the separator of a CSV sheet: ';' when its first line
// has semicolons and no comma (the locales with a decimal comma), else ','.
func csvSeparator(raw []byte) (comma byte, decimalComma bool) {
	head := raw
	if i := bytes.IndexByte(head, '\n'); i >= 0 {
		head = head[:i]
	}
	if bytes.IndexByte(head, ',') < 0 && bytes.IndexByte(head, ';') >= 0 {
		return ';', true
	}
	return ',', false
}

// quoteProblems says the quoting mistakes of the record on file lines
// start to endLine (spreadsheet row row), and returns the issues still to
// come; bad is true when the record has one.
func (r *sheetReader) quoteProblems(issues []quoteIssue, start, endLine, row int, name string) (rest []quoteIssue, bad bool) {
	for len(issues) > 0 && issues[0].line <= endLine {
		is := issues[0]
		issues = issues[1:]
		if is.line < start {
			continue
		}
		bad = true
		if is.unclosed {
			r.add(Cell{r.sheet, row, 0}, "malformed CSV line %d in %s: a quoted cell is never closed, so it runs to the end of the file: add the closing quote", is.line, name)
		} else {
			r.add(Cell{r.sheet, row, 0}, "malformed CSV line %d in %s: a quoted cell runs over several lines and holds a stray quote: check its quotes (a quote inside a quoted cell is written twice)", is.line, name)
		}
	}
	return issues, bad
}

// quoteIssue is a quoting mistake found by quoteIssues, on a 1-based line.
type quoteIssue struct {
	line     int
	unclosed bool
}

// quoteIssues follows the quotes of a CSV file the way csv.Reader does with
// LazyQuotes and reports the quoted cells that are never closed, or that
// span lines and hold a stray (undoubled) quote. At most maxSheetProblems
// are reported.
func quoteIssues(raw []byte, comma byte) []quoteIssue {
	var issues []quoteIssue
	line := 1
	atStart := true // at the start of a field
	for i := 0; i < len(raw) && len(issues) < maxSheetProblems; i++ {
		c := raw[i]
		if !atStart || c != '"' {
			atStart = c == comma || c == '\n'
			if c == '\n' {
				line++
			}
			continue
		}
		// A quoted field, from i.
		startLine, stray, closed := line, false, false
		for i++; i < len(raw); i++ {
			c := raw[i]
			if c == '\n' {
				line++
				continue
			}
			if c != '"' {
				continue
			}
			next := byte(0)
			if i+1 < len(raw) {
				next = raw[i+1]
			}
			switch {
			case next == '"':
				i++ // an escaped quote
			case i+1 == len(raw) || next == comma || next == '\n' ||
				next == '\r' && i+2 < len(raw) && raw[i+2] == '\n' || next == '\r' && i+2 == len(raw):
				closed = true
			default:
				stray = true // kept as typed by LazyQuotes
			}
			if closed {
				break
			}
		}
		switch {
		case !closed:
			issues = append(issues, quoteIssue{startLine, true})
		case stray && line > startLine:
			issues = append(issues, quoteIssue{startLine, false})
		}
		atStart = false
	}
	return issues
}
