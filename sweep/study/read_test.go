package study

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"testing/fstest"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study/studytest"
)

// sampleStudy has rows in every sheet, blank rows between some of them,
// and values that test the writers: quotes, commas, line breaks, non-ASCII
// text, numbers in several forms and formula-looking text.
func sampleStudy() *Study {
	return &Study{
		Name: "barge",
		Settings: map[string]Setting{
			"name":       {Name: "name", Value: "barge", Cell: Cell{"Study", 2, 2}},
			"scale_from": {Name: "scale_from", Value: "10", Cell: Cell{"Study", 3, 2}},
			"scale_to":   {Name: "scale_to", Value: "100", Cell: Cell{"Study", 4, 2}},
			"purpose":    {Name: "Purpose", Value: "Roll of the \"Nordkapp\" barge, in waves; see memo\nsecond line", Cell: Cell{"Study", 6, 2}},
			"tolerance":  {Name: "tolerance", Value: "0.10", Unit: "", Cell: Cell{"Study", 7, 2}},
			"axis_from":  {Name: "axis_from", Value: "4", Unit: "°C", Cell: Cell{"Study", 8, 2}},
		},
		Prototype: []Item{
			{Name: "hull_length", Value: "120", Unit: "m", ScalesAs: "length", Row: 2},
			{Name: "design_speed", Value: "12", Unit: "kn", ScalesAs: "velocity", Row: 3},
			{Name: "displacement", Value: "1.2e4", Unit: "t", ScalesAs: "mass", Row: 5},
			{Name: "draft", Value: "-0.5", Unit: "m", ScalesAs: "length", Row: 6},
			{Name: "big", Value: "12345678901234567890", ScalesAs: "none", Row: 7},
			{Name: "sum", Value: "=SUM(A1)", ScalesAs: "none", Row: 8},
			{Name: "plus", Value: "+1", ScalesAs: "none", Row: 9},
			{Name: "minus", Value: "-x", ScalesAs: "none", Row: 10},
			{Name: "at", Value: "@a", ScalesAs: "none", Row: 11},
			{Name: "leading zero", Value: "007", ScalesAs: "none", Row: 12},
			{Name: "tab inside", Value: "0.000001", ScalesAs: "none", Row: 13}, // a tab would be read back as a space (normSpace)
		},
		Media: []Candidate{
			{Name: "fresh water", Entry: "fresh_water", Conditions: "15C", Row: 2},
			{Name: "sea", Entry: "seawater", Conditions: "15C, 35g/kg", Row: 3},
		},
		Materials: []Candidate{{Name: "pvc", Entry: "pvc", Row: 2}},
		Custom: []CustomRow{
			{Entry: "my_foam", Kind: "solid", Property: "density", Value: "35", Unit: "kg/m^3", Source: "maker's datasheet, 2024", Row: 2},
		},
		Facilities: []FacilityRow{
			{Facility: "tank A", Type: "towing_tank", Capability: "length", Value: "200", Unit: "m", Row: 2},
			{Facility: "tank A", Type: "towing_tank", Capability: "speed_max", Value: "6", Unit: "m/s", Row: 3},
		},
		Strategies: []StrategyRow{
			{Strategy: "froude", Technique: "dominant", Retain: "inertia, gravity", Relax: "viscosity",
				Given: "density; gravity", Media: "fresh water, sea", Materials: "pvc", Facilities: "tank A", Correction: "ittc1957", Row: 2},
			{Strategy: "cases", Case: "wind", Technique: "special", Retain: "inertia gravity", Row: 4},
			{Strategy: "cases", Case: "water", Technique: "special", Retain: "inertia;gravity;viscosity", Untie: "thickness", Tuned: "density", Fix: "velocity", Row: 5},
		},
		Limits: []LimitRow{
			{AppliesTo: "towing_tank", Limit: "reynolds_min", Expression: "design_speed * hull_length / kinematic_viscosity >= 2e6", Source: "ITTC", Row: 2},
		},
		Costs: []CostRow{
			{Item: "build", Coefficient: "5000", Per: "m", Measure: "hull_length", Row: 2},
			{Item: "tank hours", Coefficient: "300", Per: "h", Measure: "hours", Facility: "tank A", Row: 3},
		},
	}
}

func TestLoadCSVProblems(t *testing.T) {
	huge := strings.Repeat("x", MaxCellChars+1)
	var many strings.Builder
	many.WriteString("item,value,unit,scales_as,note\n")
	for i := 2; i <= MaxRows+1; i++ {
		many.WriteString("l,1,m,length,\n")
	}
	tests := []struct {
		name   string
		sheets map[string]string // replaces sheets of minimalCSV; "" removes one
		want   []string
	}{
		{"missing sheet", map[string]string{"Strategies": ""},
			[]string{"Strategies: sheet missing: the folder DIR has no Strategies.csv"}},
		{"missing optional sheet", map[string]string{"Costs": ""}, nil},
		{"bad header", map[string]string{"Prototype": "item,value,units,scales_as,note\nl,1,m,length,\n"},
			[]string{`Prototype!C1: expected column "unit", found "units"`,
				"Prototype: row 1 must name the columns item, value, unit, scales_as, note, in this order (a unit in brackets may follow a name; extra columns to the right are ignored); the sheet's rows were not read"}},
		{"missing header column", map[string]string{"Prototype": "item,value,unit,scales_as\nl,1,m,length\n"},
			[]string{`Prototype!E1: expected column "note", found nothing`}},
		{"header not on row 1", map[string]string{"Prototype": "\nitem,value,unit,scales_as,note\n"},
			[]string{`Prototype!A1: expected column "item", found nothing`}},
		{"header with units, case and spaces", map[string]string{"Prototype": " Item , VALUE [SI or as unit],unit[-], scales_as ,Note,my notes\nl,1,m,length,,mine\n"}, nil},
		{"empty required sheet", map[string]string{"Prototype": ""},
			[]string{"Prototype: sheet missing: the folder DIR has no Prototype.csv"}},
		{"empty file of a required sheet", map[string]string{"Prototype": "\n"},
			[]string{"Prototype!A1: the sheet is empty: row 1 must name the columns item, value, unit, scales_as, note"}},
		{"huge cell", map[string]string{"Prototype": "item,value,unit,scales_as,note\nl," + huge + ",m,length,\n"},
			[]string{"Prototype!B2: the cell holds 10001 characters; a study cell holds at most 10000"}},
		{"huge cell in an ignored column", map[string]string{"Prototype": "item,value,unit,scales_as,note,mine\nl,1,m,length,," + huge + "\n"}, nil},
		{"duplicate setting", map[string]string{"Study": "setting,value,unit,note\nname,a,,\nscale_from,10,,\nNAME,b,,\nscale_to,50,,\n"},
			[]string{`Study!A4: setting "NAME" is given twice (first at Study!A2)`}},
		{"setting without a name", map[string]string{"Study": "setting,value,unit,note\nname,a,,\n,10,,\n"},
			[]string{`Study!A3: setting name missing (the row has the value "10")`}},
		{"too many rows", map[string]string{"Prototype": many.String()},
			[]string{"Prototype!100001: more than 100000 rows: a study sheet holds at most 100000 rows"}},
		{"unclosed quote", map[string]string{"Prototype": "item,value,unit,scales_as,note\nl,1,m,length,\nd,\"2,m,length,\nx,3,m,length,\n"},
			[]string{"Prototype!3: malformed CSV line 3 in Prototype.csv: a quoted cell is never closed, so it runs to the end of the file: add the closing quote"}},
		{"stray quote in a multi-line cell", map[string]string{"Prototype": "item,value,unit,scales_as,note\nl,\"1\nm\"x,length,\nd,2,m,length,\"y\"\n"},
			[]string{"Prototype!2: malformed CSV line 2 in Prototype.csv: a quoted cell runs over several lines and holds a stray quote: check its quotes (a quote inside a quoted cell is written twice)"}},
		{"inch mark is kept", map[string]string{"Prototype": "item,value,unit,scales_as,note\npipe 12\",1,m,length,\n\"quoted \"\"ok\"\"\",2,m,length,\n"}, nil},
		{"not UTF-8", map[string]string{"Prototype": "item,value,unit,scales_as,note\nl,4,\xb0C,temperature,\n"},
			[]string{`Prototype!C2: not UTF-8 text: save the sheet with UTF-8 encoding ("CSV UTF-8")`}},
		{"control character", map[string]string{"Prototype": "item,value,unit,scales_as,note\n\x000\n"}, // found by FuzzReadCSV
			[]string{"Prototype!A2: the cell holds a control character (U+0000): delete it"}},
		{"byte order mark and CRLF", map[string]string{"Prototype": "\xef\xbb\xbfitem,value,unit,scales_as,note\r\nl,1,m,length,\r\n"}, nil},
		{"semicolons", map[string]string{"Prototype": "item;value;unit;scales_as;note\nl;1,5;m;length;\n"}, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			sheets := studytest.MinimalCSV()
			for k, v := range tt.sheets {
				if v == "" {
					delete(sheets, k)
					continue
				}
				sheets[k] = v
			}
			dir := studytest.WriteFolder(t, sheets)
			s, err := Load(dir)
			if s == nil {
				t.Fatalf("no study returned: %v", err)
			}
			want := make([]string, len(tt.want))
			for i, w := range tt.want {
				want[i] = strings.ReplaceAll(w, "DIR", dir)
			}
			studytest.CheckProblems(t, err, want)
		})
	}
}

// TestLoadCSVValues checks what is read: row numbers as a spreadsheet
// shows them (blank lines are rows, a multi-line cell is one row), trimmed
// values, the semicolon separator, and the study's name.
func TestLoadCSVValues(t *testing.T) {
	sheets := studytest.MinimalCSV()
	sheets["Prototype"] = "\xef\xbb\xbfitem,value [m],unit,scales_as,note,mine\r\n" +
		"\r\n" + // row 2 is blank
		"  hull_length , 120 ,m,length,,extra\r\n" + // row 3
		"\"two\r\nlines\",5,m,length,\r\n" + // row 4, over two lines
		",,,,,only a note of mine\r\n" + // row 5: blank in the study's columns
		"beam,\"2,5\",m,length\r\n" // row 6: short row
	sheets["Media"] = "name;library_entry;conditions;note\nwater;fresh_water;15C, 1 bar;\n\nsea;seawater;\"a;b\";\n"
	dir := studytest.WriteFolder(t, sheets)
	s, err := Load(dir)
	studytest.CheckProblems(t, err, nil)
	wantItems := []Item{
		{Name: "hull_length", Value: "120", Unit: "m", ScalesAs: "length", Row: 3},
		{Name: "two\nlines", Value: "5", Unit: "m", ScalesAs: "length", Row: 4},
		{Name: "beam", Value: "2,5", Unit: "m", ScalesAs: "length", Row: 6},
	}
	if !reflect.DeepEqual(s.Prototype, wantItems) {
		t.Errorf("Prototype:\n got %#v\nwant %#v", s.Prototype, wantItems)
	}
	wantMedia := []Candidate{
		{Name: "water", Entry: "fresh_water", Conditions: "15C, 1 bar", Row: 2},
		{Name: "sea", Entry: "seawater", Conditions: "a;b", Row: 4},
	}
	if !reflect.DeepEqual(s.Media, wantMedia) {
		t.Errorf("Media:\n got %#v\nwant %#v", s.Media, wantMedia)
	}
	if s.Name != "mini" || s.Source != dir {
		t.Errorf("name %q source %q", s.Name, s.Source)
	}
	if got := s.Settings["scale_to"]; got != (Setting{Name: "scale_to", Value: "50", Cell: Cell{"Study", 4, 2}}) {
		t.Errorf("scale_to = %#v", got)
	}

	// Without a name setting, the folder's name.
	sheets["Study"] = "setting,value,unit,note\nscale_from,10,,\n"
	s, err = Load(studytest.WriteFolder(t, sheets))
	studytest.CheckProblems(t, err, nil)
	if s.Name != "study" {
		t.Errorf("name %q, want the folder's name", s.Name)
	}
}

func TestLoadCSVFileNameCase(t *testing.T) {
	dir := studytest.WriteFolder(t, studytest.MinimalCSV())
	if err := os.Rename(filepath.Join(dir, "Prototype.csv"), filepath.Join(dir, "prototype.csv")); err != nil {
		t.Fatal(err)
	}
	s, err := Load(dir)
	studytest.CheckProblems(t, err, nil)
	if len(s.Prototype) != 1 {
		t.Errorf("prototype.csv not read: %#v", s.Prototype)
	}
}

func TestLoadFS(t *testing.T) {
	fsys := fstest.MapFS{}
	for name, content := range studytest.MinimalCSV() {
		fsys["demo/froude/"+name+".csv"] = &fstest.MapFile{Data: []byte(content)}
	}
	s, err := LoadFS(fsys, "demo/froude")
	studytest.CheckProblems(t, err, nil)
	if s.Name != "mini" || s.Source != "demo/froude" || len(s.Strategies) != 1 || s.Strategies[0].Retain != "inertia, gravity" {
		t.Errorf("study %#v", s)
	}
	delete(fsys, "demo/froude/Study.csv")
	s, err = LoadFS(fsys, "demo/froude")
	studytest.CheckProblems(t, err, []string{"Study: sheet missing: the folder demo/froude has no Study.csv"})
	if s.Name != "froude" {
		t.Errorf("name %q, want froude", s.Name)
	}
	if _, err := LoadFS(fsys, "nowhere"); err == nil {
		t.Error("no error for a missing folder")
	}
}

func TestLoadPaths(t *testing.T) {
	dir := t.TempDir()
	write := func(name string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte("x"), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	tests := []struct {
		path, want string
	}{
		{filepath.Join(dir, "none.xlsx"), "no such file or folder"},
		{write("Prototype.csv"), "a single .csv file is one sheet; a CSV study is a folder holding Study.csv, Prototype.csv"},
		{write("old.xls"), ".xls files are not read: save the workbook as an Excel Workbook (.xlsx)"},
		{write("notes.txt"), "not a study: give an .xlsx workbook or a folder of .csv sheets"},
	}
	for _, tt := range tests {
		s, err := Load(tt.path)
		if s != nil || err == nil || !strings.Contains(err.Error(), tt.want) || !strings.Contains(err.Error(), tt.path) {
			t.Errorf("Load(%s) = %v, %v; want an error naming the path and %q", tt.path, s, err, tt.want)
		}
		var ps Problems
		if errors.As(err, &ps) {
			t.Errorf("Load(%s): a path error should not be Problems", tt.path)
		}
	}
}

// workbook is sampleStudy written as a workbook, edited by edit.
func workbook(t testing.TB, s *Study, edit func(f *excelize.File)) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	if err := buildWorkbook(f, s, testLists()); err != nil {
		t.Fatal(err)
	}
	if edit != nil {
		edit(f)
	}
	buf, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// loadBytes writes an .xlsx file and loads it.
func loadBytes(t *testing.T, b []byte) (*Study, error) {
	t.Helper()
	p := filepath.Join(t.TempDir(), "s.xlsx")
	if err := os.WriteFile(p, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return Load(p)
}

// rezip rewrites a zip archive, passing each entry through edit, which
// returns the new content (nil drops the entry).
func rezip(t *testing.T, b []byte, edit func(name string, data []byte) []byte) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, f := range zr.File {
		rc, err := f.Open()
		if err != nil {
			t.Fatal(err)
		}
		data, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			t.Fatal(err)
		}
		if data = edit(f.Name, data); data == nil {
			continue
		}
		w, err := zw.Create(f.Name)
		if err != nil {
			t.Fatal(err)
		}
		w.Write(data)
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

// partName is the zip entry of a worksheet.
func partName(t *testing.T, b []byte, sheet string) string {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	parts, _, err := sheetParts(zr)
	if err != nil {
		t.Fatal(err)
	}
	p, ok := parts[strings.ToLower(sheet)]
	if !ok {
		t.Fatalf("no sheet %s", sheet)
	}
	return p.Name
}

// bomb is a zip holding one entry of n zero bytes, compressed.
func bomb(t *testing.T, n int) []byte {
	t.Helper()
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	zw.RegisterCompressor(zip.Deflate, func(w io.Writer) (io.WriteCloser, error) {
		return flate.NewWriter(w, flate.BestSpeed)
	})
	w, err := zw.Create("xl/worksheets/sheet1.xml")
	if err != nil {
		t.Fatal(err)
	}
	zero := make([]byte, 1<<20)
	for n > 0 {
		k := min(n, len(zero))
		w.Write(zero[:k])
		n -= k
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

func TestLoadXLSXProblems(t *testing.T) {
	valid := workbook(t, sampleStudy(), nil)
	huge := strings.Repeat("é", MaxCellChars+1)
	tests := []struct {
		name string
		file func(t *testing.T) []byte
		want []string
	}{
		{"valid", func(*testing.T) []byte { return valid }, nil},
		{"missing sheet", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.DeleteSheet("Strategies") })
		}, []string{"Strategies: sheet missing: the workbook has no worksheet named Strategies"}},
		{"missing optional sheet", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.DeleteSheet("Costs") })
		}, nil},
		{"sheet name case", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetSheetName("Costs", "costs") })
		}, nil},
		{"bad header", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Prototype", "C1", "units") })
		}, []string{`Prototype!C1: expected column "unit", found "units"`}},
		{"header with unit", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Prototype", "B1", "Value [SI or as unit]") })
		}, nil},
		{"formula without a cached value", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) {
				f.SetCellStr("Prototype", "A20", "rate")
				f.SetCellFormula("Prototype", "B20", "2*60")
			})
		}, []string{"Prototype!B20: formula without a cached value: open and save the workbook in a spreadsheet program, or type the value"}},
		{"formula in an ignored column", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellFormula("Prototype", "H2", "2*60") })
		}, nil},
		{"not a zip", func(*testing.T) []byte { return []byte("item,value\n") },
			[]string{"s.xlsx: not an .xlsx workbook, or a damaged or truncated one (zip: not a valid zip file): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"empty file", func(*testing.T) []byte { return nil },
			[]string{"s.xlsx: not an .xlsx workbook, or a damaged or truncated one (zip: not a valid zip file): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"old xls", func(*testing.T) []byte {
			return append([]byte{0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1}, make([]byte, 512)...)
		},
			[]string{"s.xlsx: not an .xlsx workbook: it is an old .xls workbook or a password-protected one; save it as an unprotected Excel Workbook (.xlsx)"}},
		{"truncated", func(*testing.T) []byte { return valid[:len(valid)/2] },
			[]string{"s.xlsx: not an .xlsx workbook, or a damaged or truncated one (zip: not a valid zip file): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"zip without a workbook", func(t *testing.T) []byte {
			return rezip(t, valid, func(name string, data []byte) []byte {
				if name == "xl/workbook.xml" {
					return nil
				}
				return data
			})
		}, []string{"s.xlsx: not an .xlsx workbook, or a damaged one (no part xl/workbook.xml): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"zip bomb", func(t *testing.T) []byte { return bomb(t, maxFileBytes+1) },
			[]string{"s.xlsx: the workbook unpacks to more than 64 MiB: refused (a study is far smaller; this may be a zip bomb)"}},
		{"entry larger than it says", func(t *testing.T) []byte {
			// The Prototype sheet's entry claims 100 bytes but unpacks to 1 MiB.
			name := partName(t, valid, "Prototype")
			big := bomb(t, 1<<20)
			zr, _ := zip.NewReader(bytes.NewReader(big), int64(len(big)))
			raw, _ := zr.File[0].OpenRaw()
			comp, _ := io.ReadAll(raw)
			var out bytes.Buffer
			zw := zip.NewWriter(&out)
			src, _ := zip.NewReader(bytes.NewReader(valid), int64(len(valid)))
			for _, f := range src.File {
				if f.Name == name {
					w, _ := zw.CreateRaw(&zip.FileHeader{Name: name, Method: zip.Deflate, CompressedSize64: uint64(len(comp)), UncompressedSize64: 100})
					w.Write(comp)
					continue
				}
				zw.Copy(f)
			}
			zw.Close()
			return out.Bytes()
		}, []string{"s.xlsx: the workbook is damaged (xl/worksheets/sheet3.xml: zip: not a valid zip file): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"checksum error", func(t *testing.T) []byte {
			// Flip a byte of a stored entry's data: the zip reader finds
			// the checksum wrong (excelize alone would read on).
			name := partName(t, valid, "Prototype")
			var out bytes.Buffer
			zw := zip.NewWriter(&out)
			src, _ := zip.NewReader(bytes.NewReader(valid), int64(len(valid)))
			for _, f := range src.File {
				rc, _ := f.Open()
				data, _ := io.ReadAll(rc)
				w, _ := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Store})
				if f.Name == name {
					data = bytes.Replace(data, []byte("<sheetData>"), []byte("<sheetDatX>"), 1)
					w, _ = zw.CreateRaw(&zip.FileHeader{Name: f.Name, Method: zip.Store, CRC32: f.CRC32,
						CompressedSize64: uint64(len(data)), UncompressedSize64: uint64(len(data))})
				}
				w.Write(data)
			}
			zw.Close()
			return out.Bytes()
		}, []string{"s.xlsx: the workbook is damaged (xl/worksheets/sheet3.xml: zip: checksum error): save it again from a spreadsheet program as an Excel Workbook (.xlsx)"}},
		{"too many rows", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Prototype", fmt.Sprintf("A%d", MaxRows+1), "far") })
		}, []string{"Prototype!100001: more than 100000 rows: a study sheet holds at most 100000 rows"}},
		{"blank row beyond the limit", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Prototype", fmt.Sprintf("H%d", MaxRows+5), "note of mine") })
		}, nil},
		{"huge cell", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Prototype", "E3", huge) })
		}, []string{"Prototype!E3: the cell holds 10001 characters; a study cell holds at most 10000"}},
		{"duplicate setting", func(t *testing.T) []byte {
			return workbook(t, sampleStudy(), func(f *excelize.File) { f.SetCellStr("Study", "A5", "Scale_To") })
		}, []string{`Study!A5: setting "Scale_To" is given twice (first at Study!A4)`}},
		{"damaged sheet XML", func(t *testing.T) []byte {
			name := partName(t, valid, "Prototype")
			return rezip(t, valid, func(n string, data []byte) []byte {
				if n == name {
					return data[:len(data)/2]
				}
				return data
			})
		}, []string{"Prototype: the sheet is damaged (XML syntax error on line 2: unexpected EOF): save the workbook again from a spreadsheet program"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := loadBytes(t, tt.file(t))
			if s == nil {
				t.Fatalf("no study returned: %v", err)
			}
			studytest.CheckProblems(t, err, tt.want)
		})
	}
}

// TestLoadXLSXCachedFormula: a formula with a cached value gives the value.
func TestLoadXLSXCachedFormula(t *testing.T) {
	b := workbook(t, sampleStudy(), func(f *excelize.File) {
		f.SetCellStr("Prototype", "A20", "rate")
		f.SetCellFormula("Prototype", "B20", "2*60")
		f.SetCellStr("Prototype", "A21", "label")
		f.SetCellFormula("Prototype", "B21", "UPPER(A21)")
	})
	name := partName(t, b, "Prototype")
	b = rezip(t, b, func(n string, data []byte) []byte {
		if n != name {
			return data
		}
		s := strings.Replace(string(data), "<f>2*60</f>", "<f>2*60</f><v>120</v>", 1)
		for _, c := range []string{`<c r="B21"><f>UPPER(A21)</f></c>`, `<c r="B21" t="str"><f>UPPER(A21)</f></c>`} {
			s = strings.Replace(s, c, `<c r="B21" t="str"><f>UPPER(A21)</f><v>LABEL</v></c>`, 1)
		}
		return []byte(s)
	})
	s, err := loadBytes(t, b)
	studytest.CheckProblems(t, err, nil)
	n := len(s.Prototype)
	got := s.Prototype[n-2:]
	want := []Item{{Name: "rate", Value: "120", Row: 20}, {Name: "label", Value: "LABEL", Row: 21}}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("got %#v, want %#v", got, want)
	}
}

// TestLoadXLSXRawNumbers: a number is read as stored, whatever its display
// format.
func TestLoadXLSXRawNumbers(t *testing.T) {
	b := workbook(t, sampleStudy(), func(f *excelize.File) {
		money, _ := f.NewStyle(&excelize.Style{NumFmt: 7}) // $#,##0.00
		short, _ := f.NewStyle(&excelize.Style{NumFmt: 2}) // 0.00
		f.SetCellFloat("Costs", "B2", 1234.5678, -1, 64)
		f.SetCellStyle("Costs", "B2", "B2", money)
		f.SetCellFloat("Costs", "B3", 0.00089, -1, 64)
		f.SetCellStyle("Costs", "B3", "B3", short)
	})
	s, err := loadBytes(t, b)
	studytest.CheckProblems(t, err, nil)
	if s.Costs[0].Coefficient != "1234.5678" || s.Costs[1].Coefficient != "0.00089" {
		t.Errorf("coefficients %q %q", s.Costs[0].Coefficient, s.Costs[1].Coefficient)
	}
}

// TestLoadNeverPanics feeds damaged variants of a workbook: every byte
// flipped in turn (at a stride), and every cut. A cut workbook is always a
// problem; a flipped byte may fall where it does not matter.
func TestLoadNeverPanics(t *testing.T) {
	valid := workbook(t, sampleStudy(), nil)
	for i := 0; i < len(valid); i += 1 + len(valid)/200 {
		b := append([]byte(nil), valid...)
		b[i] ^= 0xff
		if s, _ := readXLSX(b, "s.xlsx", "s.xlsx", "s"); s == nil {
			t.Fatalf("flipped byte %d: no study", i)
		}
		if _, err := readXLSX(valid[:i], "s.xlsx", "s.xlsx", "s"); err == nil {
			t.Errorf("a workbook cut at %d bytes gave no problem", i)
		}
	}
}

// TestLoadXLSXSheetXML reads worksheet XML the way other programs write
// it: inline and rich text, rows and cells without their reference,
// cached formula values, booleans and errors.
func TestLoadXLSXSheetXML(t *testing.T) {
	const header = `<row r="1"><c r="A1" t="inlineStr"><is><t>item</t></is></c><c r="B1" t="inlineStr"><is><t>value</t></is></c>` +
		`<c r="C1" t="inlineStr"><is><t>unit</t></is></c><c r="D1" t="inlineStr"><is><t>scales_as</t></is></c><c r="E1" t="inlineStr"><is><t>note</t></is></c></row>`
	sheet := func(rows string) []byte {
		return []byte(`<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>` +
			header + rows + `</sheetData></worksheet>`)
	}
	tests := []struct {
		name  string
		rows  string
		items []Item
		want  []string
	}{
		{"values",
			`<row r="2"><c r="A2" t="inlineStr"><is><t xml:space="preserve"> hull_length </t></is></c><c r="B2"><v>120.5</v></c>` +
				`<c r="C2" t="inlineStr"><is><t>m</t></is></c><c r="D2" t="inlineStr"><is><t>length</t></is></c></row>` +
				`<row r="4"><c r="A4" t="str"><f>"x"&amp;"y"</f><v>xy</v></c><c r="B4"><f>2*3</f><v>6</v></c><c r="C4" t="b"><v>1</v></c></row>` +
				`<row><c t="inlineStr"><is><r><t>rich</t></r><r><t xml:space="preserve"> text</t></r></is></c><c><v>1E-3</v></c></row>` +
				`<row r="7"><c r="B7" t="inlineStr"><is><t>two_x000D_&#10;lines</t></is></c></row>`,
			[]Item{
				{Name: "hull_length", Value: "120.5", Unit: "m", ScalesAs: "length", Row: 2},
				{Name: "xy", Value: "6", Unit: "1", Row: 4},
				{Name: "rich text", Value: "1E-3", Row: 5},
				{Value: "two\nlines", Row: 7}, // _x000D_ and a line feed: one line break
			}, nil},
		{"spreadsheet error", `<row r="2"><c r="A2" t="inlineStr"><is><t>l</t></is></c><c r="B2" t="e"><f>1/0</f><v>#DIV/0!</v></c></row>`,
			nil, []string{"Prototype!B2: the cell holds the spreadsheet error #DIV/0!: correct it, or type the value"}},
		{"missing shared string", `<row r="2"><c r="A2" t="s"><v>0</v></c></row>`,
			nil, []string{"Prototype!A2: the cell refers to a text that the workbook does not hold (the workbook is damaged): type the value again"}},
		{"formula without a cached value", `<row r="3"><c r="A3" t="inlineStr"><is><t>l</t></is></c><c r="B3"><f>2*60</f></c></row>` +
			`<row r="4"><c r="A4" t="inlineStr"><is><t>m</t></is></c><c r="B4"><v>2</v></c></row>`,
			[]Item{{Name: "m", Value: "2", Row: 4}},
			[]string{"Prototype!B3: formula without a cached value: open and save the workbook in a spreadsheet program, or type the value"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := readXLSX(smallWorkbook(sheet(tt.rows)), "s.xlsx", "s.xlsx", "s")
			studytest.CheckProblems(t, err, tt.want)
			if tt.want == nil || tt.items != nil {
				if !reflect.DeepEqual(s.Prototype, tt.items) {
					t.Errorf("Prototype:\n got %#v\nwant %#v", s.Prototype, tt.items)
				}
			}
		})
	}
}
