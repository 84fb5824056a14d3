package report

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf16"

	"github.com/xuri/excelize/v2"
)

// The long sheets (the maps) are not held in memory until the workbook is
// saved, as the spreadsheet library's stream writer holds every streamed
// sheet below 16 MiB: the library streams the header row and the sheet's
// frame, and the rows are written by a rowsFunc straight into the
// archive writer when it compresses that sheet (xlsxZip.rows). The rows are
// encoded exactly as the library's stream writer encodes them (rowWriter),
// so the file is the same byte for byte.

// rowsFunc writes a sheet's rows, as XML, to w (with a rowWriter).
type rowsFunc func(w io.Writer) error

// sheetPart is the archive part of a sheet the library created (sheets are
// stored as xl/worksheets/sheetN.xml, N the sheet's id).
func sheetPart(f *excelize.File, name string) (string, error) {
	for id, n := range f.GetSheetMap() {
		if n == name {
			return fmt.Sprintf("xl/worksheets/sheet%d.xml", id), nil
		}
	}
	return "", fmt.Errorf("workbook: no sheet %q", name)
}

// rowWriter encodes rows of cells as the library's stream writer does.
type rowWriter struct {
	w   io.Writer
	buf bytes.Buffer
	row int
	err error
	// cols are the column letters, by column index.
	cols []string
}

func newRowWriter(w io.Writer, firstRow int) *rowWriter {
	return &rowWriter{w: w, row: firstRow - 1}
}

// rowCell is one cell of a row written by a rowWriter: a number (with a
// style) or a text.
type rowCell struct {
	style int
	num   float64
	text  string
	isNum bool
}

func numCell(style int, v float64) rowCell { return rowCell{style: style, num: v, isNum: true} }
func textCell(s string) rowCell            { return rowCell{text: s} }

// add writes the next row.
func (r *rowWriter) add(cells ...rowCell) error {
	if r.err != nil {
		return r.err
	}
	r.row++
	row := strconv.Itoa(r.row)
	b := &r.buf
	b.WriteString(`<row r="`)
	b.WriteString(row)
	b.WriteString(`">`)
	for i, c := range cells {
		for len(r.cols) <= i {
			name, err := excelize.ColumnNumberToName(len(r.cols) + 1)
			if err != nil {
				return err
			}
			r.cols = append(r.cols, name)
		}
		b.WriteString(`<c r="`)
		b.WriteString(r.cols[i])
		b.WriteString(row)
		b.WriteString(`"`)
		if c.style != 0 {
			b.WriteString(` s="`)
			b.WriteString(strconv.Itoa(c.style))
			b.WriteString(`"`)
		}
		if c.isNum && !math.IsNaN(c.num) && !math.IsInf(c.num, 0) {
			b.WriteString(`><v>`)
			_ = xml.EscapeText(b, []byte(formatCellFloat(c.num)))
			b.WriteString(`</v></c>`)
			continue
		}
		text := c.text
		if c.isNum {
			text = fmt.Sprint(c.num)
		}
		val, preserve := trimCellText(text)
		b.WriteString(` t="inlineStr"><is><t`)
		if preserve {
			b.WriteString(` xml:space="preserve"`)
		}
		b.WriteString(`>`)
		b.WriteString(val)
		b.WriteString(`</t></is></c>`)
	}
	b.WriteString(`</row>`)
	if b.Len() >= 1<<16 {
		return r.flush()
	}
	return nil
}

// flush writes the encoded rows out.
func (r *rowWriter) flush() error {
	if r.err == nil {
		_, r.err = r.buf.WriteTo(r.w)
	}
	r.buf.Reset()
	return r.err
}

// formatCellFloat formats a number as the library does: the shortest
// decimal that reads back as the same number, cut to 15 significant
// digits (the spreadsheet's precision).
func formatCellFloat(value float64) string {
	str := strconv.FormatFloat(value, 'f', -1, 64)
	if math.Abs(value) == math.MaxFloat64 {
		return str
	}
	const maxPrec = 15
	decimal := strings.IndexByte(str, '.')
	significant := 0
	for idx := range str {
		if str[idx] < '0' || str[idx] > '9' || significant == 0 && str[idx] == '0' {
			continue
		}
		significant++
		if significant <= maxPrec {
			continue
		}
		if decimal >= 0 && idx > decimal {
			return strings.TrimSuffix(str[:idx], ".")
		}
		if decimal < 0 {
			decimal = len(str)
		}
		truncated := []byte(str[:decimal])
		for ; idx < len(truncated); idx++ {
			truncated[idx] = '0'
		}
		return string(truncated)
	}
	return str
}

// maxCellChars is the most UTF-16 units a cell holds.
const maxCellChars = 32767

// trimCellText prepares a text as the library does: cut to the cell's
// length, XML-escaped (line feeds kept), "_xHHHH_" sequences escaped, and
// whether leading or trailing white space must be preserved.
func trimCellText(value string) (string, bool) {
	units := 0
	for i, r := range value {
		if units += utf16.RuneLen(r); units > maxCellChars {
			value = value[:i]
			break
		}
	}
	preserve := false
	if value != "" {
		prefix, suffix := value[0], value[len(value)-1]
		for _, ascii := range []byte{9, 10, 13, 32} {
			if prefix == ascii || suffix == ascii {
				preserve = true
				break
			}
		}
		var buf strings.Builder
		_ = xml.EscapeText(&buf, []byte(value))
		value = strings.ReplaceAll(buf.String(), "&#xA;", "\n")
	}
	return escapeCodeUnits(value), preserve
}

var (
	codeUnitRE       = regexp.MustCompile(`_x[a-fA-F\d]{4}_`)
	codeUnitEscapeRE = regexp.MustCompile(`x[a-fA-F\d]{4}_`)
)

// escapeCodeUnits escapes text that a reader would take for an escaped
// character (_xHHHH_), as the library does.
func escapeCodeUnits(s string) string {
	if !strings.Contains(s, "_x") {
		return s
	}
	var result strings.Builder
	matches, l, cursor := codeUnitRE.FindAllStringSubmatchIndex(s, -1), len(s), 0
	for _, match := range matches {
		result.WriteString(s[cursor:match[0]])
		subStr := s[match[0]:match[1]]
		if subStr == "_x005F_" {
			cursor = match[1]
			if match[1]+6 <= l && codeUnitEscapeRE.MatchString(s[match[1]:match[1]+6]) {
				if _, err := strconv.Unquote(`"\u` + s[match[1]+1:match[1]+5] + `"`); err == nil {
					result.WriteString(subStr + "x005F" + subStr)
					continue
				}
			}
			result.WriteString(subStr + "x005F_")
			continue
		}
		if codeUnitRE.MatchString(subStr) {
			cursor = match[1]
			if _, err := strconv.Unquote(`"\u` + s[match[0]+2:match[1]-1] + `"`); err == nil {
				result.WriteString("_x005F" + subStr)
				continue
			}
		}
	}
	if cursor < l {
		result.WriteString(s[cursor:])
	}
	return result.String()
}

// sigRowCell is the cell of sig(x) for a rowWriter: x to four significant
// figures (see sigCell), or empty when x is not a number.
func (s *sheetWriter) sigRowCell(x float64) (rowCell, error) {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return textCell(""), nil
	}
	c, err := s.sigCell(sigNum(x))
	if err != nil {
		return rowCell{}, err
	}
	if v, ok := c.(excelize.Cell); ok {
		if f, ok := v.Value.(float64); ok {
			return numCell(v.StyleID, f), nil
		}
	}
	return textCell(""), nil
}
