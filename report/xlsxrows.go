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
	// texts remembers the encoding of texts already written: a map sheet
	// repeats its names on every row.
	texts map[string]encodedText
}

type encodedText struct {
	val      string
	preserve bool
}

// maxRememberedTexts bounds rowWriter.texts; it starts again when full.
const maxRememberedTexts = 4096

// encode is trimCellText, remembered.
func (r *rowWriter) encode(text string) encodedText {
	if e, ok := r.texts[text]; ok {
		return e
	}
	val, preserve := trimCellText(text)
	if r.texts == nil || len(r.texts) >= maxRememberedTexts {
		r.texts = map[string]encodedText{}
	}
	e := encodedText{val, preserve}
	r.texts[text] = e
	return e
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
			b.Write(strconv.AppendInt(b.AvailableBuffer(), int64(c.style), 10))
			b.WriteString(`"`)
		}
		if c.isNum && !math.IsNaN(c.num) && !math.IsInf(c.num, 0) {
			// A number's digits, sign and point need no XML escaping.
			b.WriteString(`><v>`)
			b.Write(appendCellFloat(b.AvailableBuffer(), c.num))
			b.WriteString(`</v></c>`)
			continue
		}
		text := c.text
		if c.isNum {
			text = fmt.Sprint(c.num)
		}
		e := r.encode(text)
		b.WriteString(` t="inlineStr"><is><t`)
		if e.preserve {
			b.WriteString(` xml:space="preserve"`)
		}
		b.WriteString(`>`)
		b.WriteString(e.val)
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

// appendCellFloat appends a number formatted as the library does: the shortest
// decimal that reads back as the same number, cut to 15 significant
// digits (the spreadsheet's precision).
func appendCellFloat(dst []byte, value float64) []byte {
	n := len(dst)
	dst = strconv.AppendFloat(dst, value, 'f', -1, 64)
	str := dst[n:]
	if math.Abs(value) == math.MaxFloat64 {
		return dst
	}
	const maxPrec = 15
	decimal := bytes.IndexByte(str, '.')
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
			return bytes.TrimSuffix(dst[:n+idx], []byte("."))
		}
		if decimal < 0 {
			decimal = len(str)
		}
		dst = dst[:n+decimal]
		for ; idx < decimal; idx++ {
			dst[n+idx] = '0'
		}
		return dst
	}
	return dst
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
	id, err := s.sigStyle(x)
	if err != nil {
		return rowCell{}, err
	}
	return numCell(id, x), nil
}
