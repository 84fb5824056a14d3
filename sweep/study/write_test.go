package study

import (
	"bytes"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study/studytest"
)

func testLists() Lists {
	return Lists{
		Laws: []string{"inertia", "gravity", "viscosity", "surface_tension", "elasticity", "compressibility", "pressure",
			"cohesion", "friction", "bending", "flexure", "strength", "spring"},
		Quantities: []string{"length", "thickness", "area_moment", "velocity", "time", "frequency", "acceleration", "force",
			"moment", "pressure", "mass", "power", "energy", "stiffness", "gravity", "density", "viscosity",
			"kinematic_viscosity", "surface_tension", "sound_speed", "modulus", "strength", "poisson", "strain",
			"flexural_rigidity", "cohesion", "friction", "temperature"},
		Entries:       []string{"fresh_water", "seawater", "pvc", "air"},
		FacilityTypes: []string{"towing_tank", "wind_tunnel", "ice_tank", "soil_bin", "centrifuge", "shaking_table"},
		Techniques:    []string{"complete", "dominant", "special", "distorted", "simulated", "substitute"},
	}
}

// sameStudy compares two studies sheet by sheet, ignoring Source.
func sameStudy(t *testing.T, got, want *Study) {
	t.Helper()
	if got == nil {
		t.Fatal("no study")
	}
	g, w := *got, *want
	g.Source, w.Source = "", ""
	if w.Settings == nil {
		w.Settings = map[string]Setting{}
	}
	if reflect.DeepEqual(g, w) {
		return
	}
	gv, wv := reflect.ValueOf(g), reflect.ValueOf(w)
	for i := 0; i < gv.NumField(); i++ {
		if !reflect.DeepEqual(gv.Field(i).Interface(), wv.Field(i).Interface()) {
			t.Errorf("%s:\n got %#v\nwant %#v", gv.Type().Field(i).Name, gv.Field(i).Interface(), wv.Field(i).Interface())
		}
	}
}

// emptyStudy has no rows at all.
func emptyStudy() *Study { return &Study{Name: "empty", Settings: map[string]Setting{}} }

// packedStudy has rows without row numbers (a study built by a program):
// they are written one after another, from row 2.
func packedStudy() (in, want *Study) {
	in = &Study{Name: "packed", Settings: map[string]Setting{
		"scale_to":   {Name: "scale_to", Value: "50"},
		"scale_from": {Name: "scale_from", Value: "5"},
	}, Prototype: []Item{{Name: "a", Value: "1"}, {Name: "b", Value: "2", Row: 9}, {Name: "c", Value: "3", Row: 4}}}
	want = &Study{Name: "packed", Settings: map[string]Setting{
		"scale_from": {Name: "scale_from", Value: "5", Cell: Cell{"Study", 2, 2}},
		"scale_to":   {Name: "scale_to", Value: "50", Cell: Cell{"Study", 3, 2}},
	}, Prototype: []Item{{Name: "a", Value: "1", Row: 2}, {Name: "b", Value: "2", Row: 9}, {Name: "c", Value: "3", Row: 10}}}
	return in, want
}

func TestRoundTrip(t *testing.T) {
	packedIn, packedWant := packedStudy()
	studies := []struct {
		name     string
		in, want *Study
	}{
		{"sample", sampleStudy(), sampleStudy()},
		{"empty", emptyStudy(), emptyStudy()},
		{"packed", packedIn, packedWant},
	}
	formats := []struct {
		name  string
		write func(dir string, s *Study) (string, error)
	}{
		{"csv", func(dir string, s *Study) (string, error) {
			p := filepath.Join(dir, s.Name)
			return p, WriteCSV(p, s)
		}},
		{"xlsx", func(dir string, s *Study) (string, error) {
			p := filepath.Join(dir, s.Name+".xlsx")
			return p, WriteXLSX(p, s, testLists())
		}},
	}
	for _, st := range studies {
		for _, f := range formats {
			t.Run(st.name+"/"+f.name, func(t *testing.T) {
				p, err := f.write(t.TempDir(), st.in)
				if err != nil {
					t.Fatal(err)
				}
				got, err := Load(p)
				studytest.CheckProblems(t, err, nil)
				sameStudy(t, got, st.want)
				if got.Source != p {
					t.Errorf("source %q, want %q", got.Source, p)
				}
			})
		}
	}
}

// TestCSVAndXLSXLoadIdentically: the same study as a folder and as a
// workbook reads the same, cell names included.
func TestCSVAndXLSXLoadIdentically(t *testing.T) {
	dir := t.TempDir()
	s := sampleStudy()
	if err := WriteCSV(filepath.Join(dir, "csv"), s); err != nil {
		t.Fatal(err)
	}
	if err := WriteXLSX(filepath.Join(dir, "s.xlsx"), s, testLists()); err != nil {
		t.Fatal(err)
	}
	a, err := Load(filepath.Join(dir, "csv"))
	studytest.CheckProblems(t, err, nil)
	b, err := Load(filepath.Join(dir, "s.xlsx"))
	studytest.CheckProblems(t, err, nil)
	sameStudy(t, a, b)
}

// TestFormulaLookingText: text that a spreadsheet program would take for a
// formula is stored as text, and reads back as typed.
func TestFormulaLookingText(t *testing.T) {
	f, p := sampleWorkbook(t)
	for _, tt := range []struct{ cell, want string }{
		{"B8", "=SUM(A1)"}, {"B9", "+1"}, {"B10", "-x"}, {"B11", "@a"}, {"B12", "007"}, {"B5", "1.2e4"}, {"B6", "-0.5"},
	} {
		formula, err := f.GetCellFormula("Prototype", tt.cell)
		if err != nil || formula != "" {
			t.Errorf("%s: formula %q (%v), want none", tt.cell, formula, err)
		}
		typ, _ := f.GetCellType("Prototype", tt.cell)
		if typ != excelize.CellTypeSharedString {
			t.Errorf("%s: cell type %v, want a shared string", tt.cell, typ)
		}
		if v, _ := f.GetCellValue("Prototype", tt.cell); v != tt.want {
			t.Errorf("%s = %q, want %q", tt.cell, v, tt.want)
		}
	}
	// Plain numbers are numbers.
	for _, cell := range []string{"B2", "B3", "B13"} {
		if typ, _ := f.GetCellType("Prototype", cell); typ != excelize.CellTypeUnset && typ != excelize.CellTypeNumber {
			t.Errorf("%s: cell type %v, want a number", cell, typ)
		}
	}
	s, err := Load(p)
	studytest.CheckProblems(t, err, nil)
	sameStudy(t, s, sampleStudy())
}

func TestPlainNumber(t *testing.T) {
	for _, tt := range []struct {
		v  string
		ok bool
	}{
		{"25", true}, {"-0.5", false}, {"-1", false}, {"@1", false}, {"=1", false}, {"1025.3", true}, {"0.000001", true}, {"0", true},
		{"1e3", false}, {"1.50", false}, {"007", false}, {"+1", false}, {"-", false}, {"", false},
		{"Inf", false}, {"NaN", false}, {"0x10", false}, {"1_000", false}, {" 1", false}, {"1,5", false},
		{"12345678901234567890", false}, {"123456789012345", true}, {"0.1234567890123456", false},
	} {
		if _, ok := plainNumber(tt.v); ok != tt.ok {
			t.Errorf("plainNumber(%q) = %v, want %v", tt.v, ok, tt.ok)
		}
	}
}

// TestDeterministic: the same study gives the same bytes.
func TestDeterministic(t *testing.T) {
	dir := t.TempDir()
	s := sampleStudy()
	for _, p := range []string{"a.xlsx", "b.xlsx"} {
		if err := WriteXLSX(filepath.Join(dir, p), s, testLists()); err != nil {
			t.Fatal(err)
		}
	}
	a, _ := os.ReadFile(filepath.Join(dir, "a.xlsx"))
	b, _ := os.ReadFile(filepath.Join(dir, "b.xlsx"))
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Errorf("two WriteXLSX runs differ (%d and %d bytes)", len(a), len(b))
	}
	for _, d := range []string{"a", "b"} {
		if err := WriteCSV(filepath.Join(dir, d), s); err != nil {
			t.Fatal(err)
		}
	}
	for _, sheet := range SheetNames {
		a, _ := os.ReadFile(filepath.Join(dir, "a", sheet+".csv"))
		b, _ := os.ReadFile(filepath.Join(dir, "b", sheet+".csv"))
		if len(a) == 0 || !bytes.Equal(a, b) {
			t.Errorf("%s.csv differs between two runs", sheet)
		}
	}
}

// TestWriteLeavesNoTemporaryFiles, and replaces what was there.
func TestWriteLeavesNoTemporaryFiles(t *testing.T) {
	dir := t.TempDir()
	for i := 0; i < 2; i++ {
		if err := WriteCSV(filepath.Join(dir, "csv"), sampleStudy()); err != nil {
			t.Fatal(err)
		}
		if err := WriteXLSX(filepath.Join(dir, "s.xlsx"), sampleStudy(), testLists()); err != nil {
			t.Fatal(err)
		}
	}
	var names []string
	filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if !d.IsDir() {
			rel, _ := filepath.Rel(dir, p)
			names = append(names, rel)
		}
		return nil
	})
	want := []string{"s.xlsx"}
	for _, sheet := range SheetNames {
		want = append(want, filepath.Join("csv", sheet+".csv"))
	}
	sort.Strings(names)
	sort.Strings(want)
	if !reflect.DeepEqual(names, want) {
		t.Errorf("files %v, want %v", names, want)
	}
	if info, err := os.Stat(filepath.Join(dir, "s.xlsx")); err != nil || info.Mode().Perm() != 0o644 {
		t.Errorf("mode %v (%v)", info.Mode(), err)
	}
	if err := WriteXLSX(filepath.Join(dir, "no such folder", "s.xlsx"), sampleStudy(), testLists()); err == nil {
		t.Error("no error writing into a missing folder")
	}
}

func TestCSVLayout(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "s")
	if err := WriteCSV(dir, sampleStudy()); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "Study.csv"))
	want := "setting,value,unit,note\n" +
		"name,barge,,\n" +
		"scale_from,10,,\n" +
		"scale_to,100,,\n" +
		",,,\n" +
		"Purpose,\"Roll of the \"\"Nordkapp\"\" barge, in waves; see memo\nsecond line\",,\n" +
		"tolerance,0.10,,\n" +
		"axis_from,4,°C,\n"
	if string(b) != want {
		t.Errorf("Study.csv:\n%s\nwant:\n%s", b, want)
	}
	b, _ = os.ReadFile(filepath.Join(dir, "Limits.csv"))
	if !strings.HasPrefix(string(b), "applies_to,limit,expression,source\n") {
		t.Errorf("Limits.csv:\n%s", b)
	}
}

func TestXLSXLayout(t *testing.T) {
	f, _ := sampleWorkbook(t)
	wantSheets := append(append([]string{"Instructions"}, SheetNames...), "Lists", choicesSheet)
	if got := f.GetSheetList(); !reflect.DeepEqual(got, wantSheets) {
		t.Errorf("sheets %v, want %v", got, wantSheets)
	}
	if f.GetActiveSheetIndex() != 0 {
		t.Errorf("active sheet %d, want the instructions", f.GetActiveSheetIndex())
	}
	rows, _ := f.GetRows("Instructions")
	var text strings.Builder
	for _, r := range rows {
		text.WriteString(strings.Join(r, " ") + "\n")
	}
	for _, want := range []string{"k = prototype value / model value", "planning aid", "qualified engineers",
		"operating rules", "codes and classification rules", "SI units", "Strategies:", "Lists"} {
		if !strings.Contains(text.String(), want) {
			t.Errorf("the instructions do not say %q", want)
		}
	}
	props, _ := f.GetDocProps()
	if props.Created != docTime || props.Modified != docTime || props.Creator != "scaleplan" {
		t.Errorf("document properties %+v", props)
	}
	for _, sheet := range SheetNames {
		for i, col := range Columns[sheet] {
			cell := Cell{sheet, 1, i + 1}
			ref := ColumnLetters(i+1) + "1"
			if v, _ := f.GetCellValue(sheet, ref); v != col {
				t.Errorf("%s = %q, want %q", cell, v, col)
			}
			style, _ := f.GetCellStyle(sheet, ref)
			st, err := f.GetStyle(style)
			if err != nil || st.Font == nil || !st.Font.Bold {
				t.Errorf("%s is not bold", cell)
			}
		}
		panes, err := f.GetPanes(sheet)
		if err != nil || !panes.Freeze || panes.YSplit != 1 {
			t.Errorf("%s: header row not frozen: %+v %v", sheet, panes, err)
		}
	}
	if w, _ := f.GetColWidth("Limits", "C"); w < float64(len("design_speed * hull_length / kinematic_viscosity >= 2e6")) {
		t.Errorf("Limits column C is %v wide", w)
	}
	dvs := map[string]*excelize.DataValidation{}
	for _, sheet := range SheetNames {
		list, err := f.GetDataValidations(sheet)
		if err != nil {
			t.Fatal(err)
		}
		for _, dv := range list {
			dvs[sheet+"!"+dv.Sqref] = dv
		}
	}
	for _, tt := range []struct{ at, list, prompt string }{
		{"Prototype!D2:D100000", "Lists!$B$2:$B$30", ""},
		{"Media!B2:B100000", "Lists!$C$2:$C$6", ""},
		{"Materials!B2:B100000", "Lists!$C$2:$C$6", ""},
		{"Facilities!B2:B100000", "Lists!$D$2:$D$7", ""},
		{"Strategies!C2:C100000", "Lists!$E$2:$E$7", ""},
		{"Strategies!D2:D100000", "", "Laws retained (matched), separated by commas: inertia, gravity, viscosity"},
		{"Strategies!E2:E100000", "", "Laws relaxed (monitored, not matched), separated by commas: inertia,"},
		{"Strategies!F2:F100000", "", "the names are in column B of the Lists sheet"},
	} {
		dv, ok := dvs[tt.at]
		if !ok {
			t.Errorf("no data validation on %s", tt.at)
			continue
		}
		if tt.list != "" && (dv.Type != "list" || dv.Formula1 != tt.list) {
			t.Errorf("%s: validation %s %q, want a list from %s", tt.at, dv.Type, dv.Formula1, tt.list)
		}
		if tt.prompt != "" && (dv.Prompt == nil || !strings.Contains(*dv.Prompt, tt.prompt)) {
			t.Errorf("%s: input message %v, want %q", tt.at, dv.Prompt, tt.prompt)
		}
		if tt.prompt != "" && dv.Type == "list" {
			t.Errorf("%s: a list cell must not be restricted to one name", tt.at)
		}
	}
	// The custom entry is offered with the library's, and "none" with the
	// quantities.
	if v, _ := f.GetCellValue("Lists", "C6"); v != "my_foam" {
		t.Errorf("Lists!C6 = %q, want the custom entry", v)
	}
	if v, _ := f.GetCellValue("Lists", "B30"); v != "none" {
		t.Errorf("Lists!B30 = %q, want none", v)
	}

	// Without lists, no validation.
	p2 := filepath.Join(t.TempDir(), "s.xlsx")
	if err := WriteXLSX(p2, emptyStudy(), Lists{}); err != nil {
		t.Fatal(err)
	}
	f2, err := excelize.OpenFile(p2)
	if err != nil {
		t.Fatal(err)
	}
	defer f2.Close()
	if list, _ := f2.GetDataValidations("Strategies"); len(list) != 0 {
		t.Errorf("validations without lists: %v", list)
	}
}

// sampleWorkbook writes sampleStudy as a template and opens it; it returns
// the file's path too.
func sampleWorkbook(t *testing.T) (*excelize.File, string) {
	t.Helper()
	p := filepath.Join(t.TempDir(), "s.xlsx")
	if err := WriteXLSX(p, sampleStudy(), testLists()); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(p)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { f.Close() })
	return f, p
}
