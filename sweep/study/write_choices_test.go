package study

import (
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/materials"
)

// choicesRange reads the values of a drop-down's list ("Choices!$A$2:$A$9").
func choicesRange(t *testing.T, f *excelize.File, ref string) []string {
	t.Helper()
	m := regexp.MustCompile(`^(?:<formula1>)?([A-Za-z]+)!\$([A-Z]+)\$([0-9]+):\$([A-Z]+)\$([0-9]+)(?:</formula1>)?$`).FindStringSubmatch(strings.TrimSpace(ref))
	if m == nil {
		t.Fatalf("not a list range: %q", ref)
	}
	rows, err := f.GetCols(m[1])
	if err != nil {
		t.Fatal(err)
	}
	col, _ := excelize.ColumnNameToNumber(m[2])
	var out []string
	for _, v := range rows[col-1][1:] {
		if v != "" {
			out = append(out, v)
		}
	}
	return out
}

// TestTemplateDropDowns: the template offers a drop-down for every
// enumeration and name a user types (the lists hold exactly the values the
// reader accepts), a facility's capability list follows the type typed
// in its row, and the lists sit on a hidden sheet.
func TestTemplateDropDowns(t *testing.T) {
	s, err := LoadScenario("tine")
	if err != nil {
		t.Fatal(err)
	}
	lists := testLists()
	lists.Capabilities = map[string][]string{
		"towing_tank": {"tank_length", "tank_depth", "carriage_speed_max"},
		"wind_tunnel": {"section_width", "section_height", "speed_max"},
	}
	path := filepath.Join(t.TempDir(), "t.xlsx")
	if err := WriteXLSX(path, s, lists); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if visible, err := f.GetSheetVisible(choicesSheet); err != nil || visible {
		t.Errorf("the %s sheet is visible (%v)", choicesSheet, err)
	}
	var kinds []string
	for _, k := range materials.Kinds() {
		kinds = append(kinds, string(k))
	}
	for _, want := range []struct {
		sheet, column string
		values        []string
	}{
		{"Study", "setting", SettingNames()},
		{"Custom", "kind", kinds},
		{"Strategies", "correction", Corrections},
		{"Uncertainty", "distribution", Distributions},
	} {
		dvs, err := f.GetDataValidations(want.sheet)
		if err != nil {
			t.Fatal(err)
		}
		sq := columnRange(want.sheet, want.column)
		found := false
		for _, dv := range dvs {
			if dv.Sqref == sq && dv.Type == "list" {
				found = true
				if got := choicesRange(t, f, dv.Formula1); !slices.Equal(got, want.values) {
					t.Errorf("%s!%s offers %v, want %v", want.sheet, want.column, got, want.values)
				}
			}
		}
		if !found {
			t.Errorf("%s!%s (%s) has no drop-down", want.sheet, want.column, sq)
		}
	}
	// Capabilities: a list per type, chosen by the row's type.
	dvs, _ := f.GetDataValidations("Facilities")
	found := false
	for _, dv := range dvs {
		if dv.Sqref == columnRange("Facilities", "capability") {
			f1 := strings.NewReplacer("&amp;", "&", "&quot;", `"`).Replace(dv.Formula1)
			found = strings.Contains(f1, `INDIRECT("caps_"&$B2)`)
		}
	}
	if !found {
		t.Error("Facilities!capability has no drop-down that follows the type")
	}
	names := map[string]string{}
	for _, dn := range f.GetDefinedName() {
		names[dn.Name] = dn.RefersTo
	}
	for ty, caps := range lists.Capabilities {
		ref, ok := names["caps_"+ty]
		if !ok {
			t.Errorf("no capability list for type %s", ty)
			continue
		}
		if got := choicesRange(t, f, ref); !slices.Equal(got, caps) {
			t.Errorf("capabilities of %s: %v, want %v", ty, got, caps)
		}
	}
	// The template still reads back as the study it was written from.
	back, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	sameStudy(t, back, s)
}

// TestInstructionsRowHeights: a wrapped line of the Instructions sheet
// gets a row tall enough for its lines (15 pt a line at the default font),
// so printed lines do not run over each other.
func TestInstructionsRowHeights(t *testing.T) {
	f, _ := sampleWorkbook(t)
	rows, err := f.GetRows(instrSheet)
	if err != nil {
		t.Fatal(err)
	}
	long := 0
	for i, r := range rows {
		if len(r) == 0 {
			continue
		}
		n := len([]rune(r[0]))
		h, err := f.GetRowHeight(instrSheet, i+1)
		if err != nil {
			t.Fatal(err)
		}
		// A 110-character column holds at most about 110 characters a
		// line; want at least one line of 15 pt per 110 characters.
		if want := 15 * float64((n+109)/110); n > 110 && h < want {
			t.Errorf("Instructions row %d (%d characters) is %.0f pt tall, want at least %.0f", i+1, n, h, want)
		}
		if n > 110 {
			long++
		}
	}
	if long == 0 {
		t.Fatal("no instruction wraps: the test checks nothing")
	}
	if dim, err := f.GetSheetDimension(instrSheet); err != nil || dim == "A1" {
		t.Errorf("Instructions declares its dimension as %q (%v)", dim, err)
	}
}
