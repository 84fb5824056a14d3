package report

import (
	"archive/zip"
	"bytes"
	"io"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestRowWriterMatchesStreamWriter encodes rows with rowWriter and with the
// spreadsheet library's own stream writer and wants the same XML: the map
// sheets written straight into the archive must not differ from what the
// library would have written.
func TestRowWriterMatchesStreamWriter(t *testing.T) {
	long := strings.Repeat("é", maxCellChars+5)
	rows := [][]rowCell{
		{textCell("1:25"), numCell(3, 25), numCell(0, 0.1), numCell(7, -1.234), textCell("")},
		{numCell(0, 1.0/3), numCell(0, 123456789012345678), numCell(0, 1e-20), numCell(0, math.MaxFloat64), numCell(2, math.Copysign(0, -1))},
		{textCell(" leading"), textCell("trailing\t"), textCell("a&b<c>\"'\nline"), textCell("_x0041_ and _x005F_x0041_ and _xZZZZ_"), textCell("infeasible: limit")},
		{numCell(4, math.NaN()), numCell(0, math.Inf(1)), textCell(long), textCell("∆ κ 日本")},
		// Texts written before (the row writer remembers their encoding)
		// and numbers cut to 15 digits on either side of the point.
		{textCell(" leading"), textCell("a&b<c>\"'\nline"), textCell(long), numCell(0, 1234567.891234567891), numCell(5, -9876543210.123456789), numCell(0, 12345678901234567890)},
	}
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		t.Fatal(err)
	}
	var want bytes.Buffer
	for i, r := range rows {
		cells := make([]any, len(r))
		for j, c := range r {
			switch {
			case c.isNum && c.style != 0:
				cells[j] = excelize.Cell{StyleID: c.style, Value: c.num}
			case c.isNum:
				cells[j] = c.num
			default:
				cells[j] = c.text
			}
		}
		cell, _ := excelize.CoordinatesToCellName(1, i+2)
		if err := sw.SetRow(cell, cells); err != nil {
			t.Fatal(err)
		}
	}
	if err := sw.Flush(); err != nil {
		t.Fatal(err)
	}
	buf, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	z, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	if err != nil {
		t.Fatal(err)
	}
	r, err := z.Open("xl/worksheets/sheet1.xml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := io.ReadAll(r)
	if err != nil {
		t.Fatal(err)
	}
	sheet := string(b)
	m := regexp.MustCompile(`(?s)<sheetData>(.*)</sheetData>`).FindStringSubmatch(sheet)
	if m == nil {
		t.Fatalf("no sheet data in the library's sheet: %.300s", sheet)
	}
	want.WriteString(m[1])

	var got bytes.Buffer
	rw := newRowWriter(&got, 2)
	for _, r := range rows {
		if err := rw.add(r...); err != nil {
			t.Fatal(err)
		}
	}
	if err := rw.flush(); err != nil {
		t.Fatal(err)
	}
	if got.String() != want.String() {
		g, w := got.String(), want.String()
		i := 0
		for i < len(g) && i < len(w) && g[i] == w[i] {
			i++
		}
		t.Errorf("rows differ from the library's at byte %d:\n got …%.200s\nwant …%.200s", i, g[min(i, len(g)):], w[min(i, len(w)):])
	}
}
