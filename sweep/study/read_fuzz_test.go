package study

import (
	"archive/zip"
	"bytes"
	"fmt"
	"hash/crc32"
	"strings"
	"testing"
	"testing/fstest"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study/studytest"
)

// checkRead checks what any read must give: a study, problems that name a
// sheet of the study or the file, and rows that follow the reading rules.
func checkRead(t *testing.T, s *Study, err error, file string) {
	t.Helper()
	if s == nil {
		t.Fatalf("no study: %v", err)
	}
	for _, p := range studytest.ProblemLines(t, err) {
		ok := strings.HasPrefix(p, file+": ")
		for _, sheet := range SheetNames {
			ok = ok || strings.HasPrefix(p, sheet+": ") || strings.HasPrefix(p, sheet+"!")
		}
		if !ok {
			t.Errorf("problem without a place: %s", p)
		}
	}
	checkValue := func(where string, v string) {
		if v != strings.TrimSpace(v) || strings.Contains(v, "\r") || !utf8.ValidString(v) || utf8.RuneCountInString(v) > MaxCellChars {
			t.Errorf("%s: value %q not as a study keeps it", where, v)
		}
	}
	for k, set := range s.Settings {
		if k != strings.ToLower(set.Name) || k == "" || set.Cell.Sheet != "Study" || set.Cell.Col != 2 || set.Cell.Row < 2 || set.Cell.Row > MaxRows {
			t.Errorf("setting %q: %#v", k, set)
		}
		checkValue(set.Cell.String(), set.Value)
	}
	last := 1
	for _, it := range s.Prototype {
		if it.Row <= last || it.Row > MaxRows {
			t.Errorf("Prototype row %d after %d", it.Row, last)
		}
		last = it.Row
		for _, v := range []string{it.Name, it.Value, it.Unit, it.ScalesAs} {
			checkValue(fmt.Sprintf("Prototype!%d", it.Row), v)
		}
	}
}

// csvFS is a study as an in-memory folder, written by our CSV writer.
func csvFS(t *testing.T, s *Study) fstest.MapFS {
	t.Helper()
	fsys := fstest.MapFS{}
	for _, sheet := range SheetNames {
		data, err := encodeCSV(s, sheet)
		if err != nil {
			t.Fatal(err)
		}
		fsys[sheet+".csv"] = &fstest.MapFile{Data: data}
	}
	return fsys
}

// roundTrip checks that a study read without problems is written and read
// again, as CSV and (when xlsx, which is slower) as a workbook, unchanged.
func roundTrip(t *testing.T, s *Study, xlsx bool) {
	t.Helper()
	again, err := LoadFS(csvFS(t, s), ".")
	studytest.CheckProblems(t, err, nil)
	want := *s
	want.Name = again.Name // a study without a name takes its folder's
	sameStudy(t, again, &want)
	if !xlsx {
		return
	}

	f := excelize.NewFile()
	defer f.Close()
	if err := buildWorkbook(f, s, testLists()); err != nil {
		t.Fatal(err)
	}
	buf, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	again, err = readXLSX(buf.Bytes(), "s.xlsx", "s.xlsx", "s")
	studytest.CheckProblems(t, err, nil)
	want.Name = again.Name
	sameStudy(t, again, &want)
}

// FuzzReadCSV reads a fuzzed sheet file in an otherwise valid folder study:
// the first argument picks the sheet (an index into SheetNames).
func FuzzReadCSV(f *testing.F) {
	for i, sheet := range SheetNames {
		f.Add(uint8(i), []byte(strings.Join(Columns[sheet], ",")+"\n"))
	}
	f.Add(uint8(1), []byte("item,value,unit,scales_as,note\nl,1,m,length,\n\n\"two\nlines\",2,m,length,x\n"))
	f.Fuzz(func(t *testing.T, which uint8, data []byte) {
		sheet := SheetNames[int(which)%len(SheetNames)]
		fsys := fstest.MapFS{}
		for name, content := range studytest.MinimalCSV() {
			fsys[name+".csv"] = &fstest.MapFile{Data: []byte(content)}
		}
		fsys[sheet+".csv"] = &fstest.MapFile{Data: data}
		s, err := LoadFS(fsys, ".")
		checkRead(t, s, err, "")
		if err == nil {
			roundTrip(t, s, true)
		}
	})
}

// zipOf packs files (name → content, in the order of names) as a zip
// without compression.
func zipOf(names []string, files map[string][]byte) []byte {
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, name := range names {
		data := files[name]
		w, _ := zw.CreateRaw(&zip.FileHeader{Name: name, Method: zip.Store, CRC32: crc32.ChecksumIEEE(data),
			CompressedSize64: uint64(len(data)), UncompressedSize64: uint64(len(data))})
		w.Write(data)
	}
	zw.Close()
	return out.Bytes()
}

// smallWorkbook is the smallest package a spreadsheet program reads: the
// three required sheets, with inline strings; prototype is the Prototype
// sheet's XML.
func smallWorkbook(prototype []byte) []byte {
	const ns = `xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"`
	sheet := func(rows ...[]string) []byte {
		var b strings.Builder
		b.WriteString(`<?xml version="1.0" encoding="UTF-8"?><worksheet ` + ns + `><sheetData>`)
		for i, row := range rows {
			fmt.Fprintf(&b, `<row r="%d">`, i+1)
			for j, v := range row {
				fmt.Fprintf(&b, `<c r="%s%d" t="inlineStr"><is><t>%s</t></is></c>`, ColumnLetters(j+1), i+1, v)
			}
			b.WriteString(`</row>`)
		}
		b.WriteString(`</sheetData></worksheet>`)
		return []byte(b.String())
	}
	names := []string{"[Content_Types].xml", "_rels/.rels", "xl/workbook.xml", "xl/_rels/workbook.xml.rels",
		"xl/worksheets/sheet1.xml", "xl/worksheets/sheet2.xml", "xl/worksheets/sheet3.xml"}
	files := map[string][]byte{
		"[Content_Types].xml": []byte(`<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
			`<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>` +
			`<Default Extension="xml" ContentType="application/xml"/>` +
			`<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>` +
			`<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>` +
			`<Override PartName="/xl/worksheets/sheet2.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>` +
			`<Override PartName="/xl/worksheets/sheet3.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>`),
		"_rels/.rels": []byte(`<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
			`<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`),
		"xl/workbook.xml": []byte(`<?xml version="1.0" encoding="UTF-8"?><workbook ` + ns + ` xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets>` +
			`<sheet name="Study" sheetId="1" r:id="rId1"/><sheet name="Prototype" sheetId="2" r:id="rId2"/><sheet name="Strategies" sheetId="3" r:id="rId3"/></sheets></workbook>`),
		"xl/_rels/workbook.xml.rels": []byte(`<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
			`<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/>` +
			`<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet2.xml"/>` +
			`<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="/xl/worksheets/sheet3.xml"/></Relationships>`),
		"xl/worksheets/sheet1.xml": sheet(Columns["Study"], []string{"name", "small"}, []string{"scale_from", "10"}, []string{"scale_to", "50"}),
		"xl/worksheets/sheet2.xml": prototype,
		"xl/worksheets/sheet3.xml": sheet(Columns["Strategies"], []string{"froude", "", "dominant", "inertia, gravity"}),
	}
	if prototype == nil {
		files["xl/worksheets/sheet2.xml"] = sheet(Columns["Prototype"], []string{"hull_length", "120", "m", "length"})
	}
	return zipOf(names, files)
}

// FuzzReadXLSX reads a fuzzed workbook: the whole file, or (sheet true)
// the XML of the Prototype sheet inside an otherwise valid workbook.
func FuzzReadXLSX(f *testing.F) {
	f.Add(smallWorkbook(nil), false)
	f.Add([]byte(`<worksheet><sheetData><row><c t="inlineStr"><is><t>item</t></is></c><c><v>1</v></c></row></sheetData></worksheet>`), true)
	f.Fuzz(func(t *testing.T, data []byte, sheet bool) {
		if sheet {
			data = smallWorkbook(data)
		}
		s, err := readXLSX(data, "s.xlsx", "s.xlsx", "s")
		checkRead(t, s, err, "s.xlsx")
		if err == nil {
			roundTrip(t, s, false)
		}
	})
}

// TestSmallWorkbook: the fuzz seed workbook is a valid study.
func TestSmallWorkbook(t *testing.T) {
	s, err := readXLSX(smallWorkbook(nil), "s.xlsx", "s.xlsx", "s")
	studytest.CheckProblems(t, err, nil)
	if s.Name != "small" || len(s.Prototype) != 1 || s.Prototype[0] != (Item{Name: "hull_length", Value: "120", Unit: "m", ScalesAs: "length", Row: 2}) ||
		len(s.Strategies) != 1 || s.Strategies[0].Retain != "inertia, gravity" {
		t.Errorf("study %#v", s)
	}
	roundTrip(t, s, true)
}
