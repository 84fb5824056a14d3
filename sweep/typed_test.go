package sweep

import (
	"math"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study"
	"scaleplan/sweep/study/studytest"
)

// The tests of this file read inputs as people type them: workbook cells
// by their number format, scales written 1:25, percentages, units in a
// header, decimal commas, and names with odd white space.

// settingCell finds the value cell of a row of a sheet by its first cell.
func settingCell(t *testing.T, f *excelize.File, sheet, key string) string {
	t.Helper()
	rows, err := f.GetRows(sheet)
	if err != nil {
		t.Fatal(err)
	}
	for i, r := range rows {
		if len(r) > 0 && r[0] == key {
			c, _ := excelize.CoordinatesToCellName(2, i+1)
			return c
		}
	}
	t.Fatalf("%s has no row %s", sheet, key)
	return ""
}

// styled sets a cell to a number with a built-in number format (ECMA-376
// Part 1, §18.8.30: 9 is 0%, 14 a date, 20 h:mm, 21 h:mm:ss).
func styled(t *testing.T, f *excelize.File, sheet, key string, v float64, numFmt int) {
	t.Helper()
	style, err := f.NewStyle(&excelize.Style{NumFmt: numFmt})
	if err != nil {
		t.Fatal(err)
	}
	c := settingCell(t, f, sheet, key)
	if err := f.SetCellFloat(sheet, c, v, -1, 64); err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellStyle(sheet, c, c, style); err != nil {
		t.Fatal(err)
	}
}

// TestTypedWorkbookCells: a workbook's cells are read by their number
// format, and the forms a person types are accepted where they mean one
// thing.
func TestTypedWorkbookCells(t *testing.T) {
	b := workbook(t, scenario(t, "tug"), func(f *excelize.File) {
		styled(t, f, "Study", "scale_to", 85.0/1440, 20)            // 1:25 typed, stored as a time of day
		styled(t, f, "Study", "tolerance", 0.1, 9)                  // 10 %
		styled(t, f, "Study", "inputs_date", 46356, 14)             // a date
		styled(t, f, "Prototype", "measuring_time", 60.0/86400, 21) // 0:01:00
	})
	s, err := loadBytes(t, b)
	studytest.CheckProblems(t, err, nil)
	if got := s.Settings["scale_to"].Value; got != "1:25" {
		t.Errorf("scale_to read as %q, want 1:25", got)
	}
	if got := s.Settings["inputs_date"].Value; got != "2026-11-30" {
		t.Errorf("inputs_date read as %q, want 2026-11-30", got)
	}
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	st := plan.Settings
	if st.ScaleTo != 25 || st.Tolerance != 0.1 || st.InputsDate != "2026-11-30" {
		t.Errorf("scale_to %v (want 25), tolerance %v (want 0.1), inputs_date %q", st.ScaleTo, st.Tolerance, st.InputsDate)
	}
	if it := plan.Items["measuring_time"]; it.Value != 60 {
		t.Errorf("measuring_time %v s, want 60 (typed 0:01:00)", it.Value)
	}
}

// TestTypedCSVValues: the same forms typed in CSV text, the unit of a
// header, a decimal comma in a semicolon file and odd white space.
func TestTypedCSVValues(t *testing.T) {
	sheets := studytest.MinimalCSV()
	sheets["Study"] = "setting;value;unit;note\nname;mini;;\nscale_from;1:5;;\nscale_to;1:50,5;;\ntolerance;12,5 %;;\n"
	// 28 ft = 8.5344 m (1 ft = 0.3048 m exactly, NIST SP 811 B.8); the
	// row that states m keeps it.
	sheets["Prototype"] = "item,value [ft],unit,scales_as,note\nhull_length,28,,length,\nbeam,11,ft,length,\n"
	sheets["Strategies"] = "strategy,case,technique,retain,relax,untie,given,tuned,fix,media,materials,facilities,correction,note\n" +
		"froude,,dominant,\"inertia, gravity\",viscosity,,,,\"density=1, velocity=1\",,,,,\n"
	sheets["Facilities"] = "facility,type,capability,value,unit,note\n" +
		"Estuary\u00a0tank,towing_tank,tank_length,120,m,\n" +
		"Estuary  tank ,towing_tank,tank_depth,3,m,\n" +
		"Estuary\ttank,towing_tank,tank_width,6,m,\n"
	dir := studytest.WriteFolder(t, sheets)
	s, err := study.Load(dir)
	studytest.CheckProblems(t, err, nil)
	plan, err := prepare(t, s)
	if err != nil {
		t.Fatal(err)
	}
	st := plan.Settings
	if st.ScaleFrom != 5 || st.ScaleTo != 50.5 || math.Abs(st.Tolerance-0.125) > 1e-15 {
		t.Errorf("scale %v to %v (want 5 to 50.5), tolerance %v (want 0.125)", st.ScaleFrom, st.ScaleTo, st.Tolerance)
	}
	if v := plan.Items["hull_length"].Value; math.Abs(v-8.5344) > 1e-12 {
		t.Errorf("hull_length %v m, want 8.5344 (28 ft)", v)
	}
	if v := plan.Items["beam"].Value; math.Abs(v-3.3528) > 1e-12 {
		t.Errorf("beam %v m, want 3.3528 (11 ft)", v)
	}
	if len(plan.Facilities) != 1 || plan.Facilities[0].Name != "Estuary tank" || len(plan.Facilities[0].Caps) != 3 {
		var names []string
		for _, f := range plan.Facilities {
			names = append(names, f.Name)
		}
		t.Errorf("facilities %q, want one \"Estuary tank\" with three capabilities", names)
	}
}

// TestTypedProblems: forms that cannot mean what the cell needs are
// refused at their cell, with the fix.
func TestTypedProblems(t *testing.T) {
	tests := []struct {
		name   string
		sheets map[string]string
		want   string
	}{
		{"a time where a length is needed", map[string]string{"Prototype": "item,value,unit,scales_as,note\nhull_length,1:25,,length,\n"},
			`Prototype!B2: "1:25" is a time`},
		{"a date where a number is needed", map[string]string{"Prototype": "item,value,unit,scales_as,note\nhull_length,2026-11-30,,length,\n"},
			`Prototype!B2: "2026-11-30" is a date`},
		{"a time where a scale count is needed", map[string]string{"Study": "setting,value,unit,note\nscale_from,10,,\nscale_to,50,,\npoints,0:01:00,,\n"},
			`Study!B4: points: "0:01:00" must be a whole number`},
		{"a time in a setting that is not a scale", map[string]string{"Study": "setting,value,unit,note\nscale_from,10,,\nscale_to,50,,\nrobust_level,0:45,,\n"},
			`Study!B4: robust_level: "0:45" is a time`},
		{"a header unit the unit cell contradicts", map[string]string{"Prototype": "item,value [ft],unit,scales_as,note\nhull_length,28,m,length,\n"},
			`Prototype!C2: unit "m" disagrees with the unit [ft] in the header of column value (Prototype!B1)`},
		{"a header unit that is not a unit", map[string]string{"Prototype": "item,value [feet],unit,scales_as,note\nhull_length,28,,length,\n"},
			`Prototype!B1: the unit [feet] in the header`},
		{"a unit in a header that takes none", map[string]string{"Prototype": "item [m],value,unit,scales_as,note\nhull_length,28,m,length,\n"},
			`Prototype!A1: a unit in the header of column item is not read`},
		{"a right-to-left override in a name", map[string]string{"Prototype": "item,value,unit,scales_as,note\nhull_length,28,m,length,\n", "Media": "name,library_entry,conditions,note\nwa\u202eter,fresh_water,15C,\n"},
			`Media!A2: the cell holds an invisible or direction-changing character (U+202E)`},
		{"a zero-width space in a name", map[string]string{"Media": "name,library_entry,conditions,note\nwa\u200bter,fresh_water,15C,\n"},
			`Media!A2: the cell holds an invisible or direction-changing character (U+200B)`},
		{"a byte order mark inside text", map[string]string{"Media": "name,library_entry,conditions,note\nwa\ufeffter,fresh_water,15C,\n"},
			`Media!A2: the cell holds an invisible or direction-changing character (U+FEFF)`},
		{"a C1 control", map[string]string{"Media": "name,library_entry,conditions,note\nwa\u0085ter,fresh_water,15C,\n"},
			`Media!A2: the cell holds a control character (U+0085)`},
		{"DEL", map[string]string{"Media": "name,library_entry,conditions,note\nwa\x7fter,fresh_water,15C,\n"},
			`Media!A2: the cell holds a control character (U+007F)`},
		{"a line break in a facility name", map[string]string{"Facilities": "facility,type,capability,value,unit,note\n\"Estuary\n# tank\",towing_tank,tank_length,120,m,\n"},
			`Facilities!A2: a name holds a line break`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			sheets := studytest.MinimalCSV()
			for k, v := range tt.sheets {
				sheets[k] = v
			}
			s, err := study.Load(studytest.WriteFolder(t, sheets))
			if err == nil {
				_, err = prepare(t, s)
			}
			got := studytest.ProblemLines(t, err)
			for _, g := range got {
				if strings.HasPrefix(g, tt.want) {
					return
				}
			}
			t.Errorf("no problem starting %q; got:\n  %s", tt.want, strings.Join(got, "\n  "))
		})
	}
}

// TestStudyNameLineBreak: a study name on two lines would forge a heading
// in the memo; it is refused, and a purpose on several lines is read as
// one paragraph.
func TestStudyNameLineBreak(t *testing.T) {
	sheets := studytest.MinimalCSV()
	sheets["Study"] = "setting,value,unit,note\nname,\"tug\n# Forged heading\",,\nscale_from,10,,\nscale_to,50,,\n"
	s, err := study.Load(studytest.WriteFolder(t, sheets))
	studytest.CheckProblems(t, err, nil)
	_, err = prepare(t, s)
	studytest.CheckProblems(t, err, []string{"Study!B2: the study name holds a line break: put it on one line (it heads every output)"})

	tug := scenario(t, "tug")
	set := tug.Settings["purpose"]
	set.Value = "Resistance\n## Forged heading"
	tug.Settings["purpose"] = set
	plan, err := prepare(t, tug)
	if err != nil {
		t.Fatal(err)
	}
	if got := plan.Settings.Purpose; got != "Resistance ## Forged heading" {
		t.Errorf("purpose %q, want one line", got)
	}
}
