package main

import (
	"testing"

	"github.com/xuri/excelize/v2"
)

// Inputs as people type them, and values outside their domain: each is
// refused through the command at its cell, with the fix, like the hostile
// cases (DEVELOPERS.md, "Bad input and what it gets", lists them as
// TestTypedInputs/<kind>).

// hStyled sets a cell of a workbook study to a number with a built-in
// number format (ECMA-376 Part 1, §18.8.30: 14 is a date, 20 h:mm, 21
// h:mm:ss).
func hStyled(sheet, cell string, v float64, numFmt int) func(t *testing.T, path string) {
	return func(t *testing.T, path string) {
		hXLSXSet(t, path, func(f *excelize.File) error {
			style, err := f.NewStyle(&excelize.Style{NumFmt: numFmt})
			if err != nil {
				return err
			}
			if err := f.SetCellFloat(sheet, cell, v, -1, 64); err != nil {
				return err
			}
			return f.SetCellStyle(sheet, cell, cell, style)
		})
	}
}

func typedCases() []hostileCase {
	set := func(sheet, key, col, v string) func(t *testing.T, s string) {
		return func(t *testing.T, s string) { hSet(t, s, sheet, key, col, v) }
	}
	axis := func(name, from, to, unit, spacing string) func(t *testing.T, s string) {
		return func(t *testing.T, s string) {
			hAppend(t, s, "Study", "axis", name)
			hAppend(t, s, "Study", "axis_from", from, unit)
			hAppend(t, s, "Study", "axis_to", to, unit)
			hAppend(t, s, "Study", "axis_spacing", spacing)
		}
	}
	limit := func(name, expr string) func(t *testing.T, s string) {
		return func(t *testing.T, s string) { hAppend(t, s, "Limits", "all", name, expr, "test") }
	}
	return []hostileCase{
		// Workbook cells read by their number format: 1:25 typed into a
		// cell is stored as the time 1:25 (85/1440 of a day), 0:01:00 as
		// 60/86400, 2026-11-30 as day 46356.
		{"a scale typed 1:25 where a length is needed", xlsxCase(hStyled("Prototype", "B2", 85.0/1440, 20)),
			1, "Prototype!B2", `"1:25" is a time (a spreadsheet stores 1:25 typed into a cell as a time of day): type the number`},
		{"a duration where a count is needed", xlsxCase(hStyled("Prototype", "B7", 60.0/86400, 21)),
			1, "Prototype!B7", `"0:01:00" is a time`},
		{"a date where a length is needed", xlsxCase(hStyled("Prototype", "B3", 46356, 14)),
			1, "Prototype!B3", `"2026-11-30" is a date (the cell is formatted as a date): format the cell as Number`},
		{"a date as a scale", xlsxCase(hStyled("Study", "B5", 46356, 14)),
			1, "Study!B5", `scale_from: "2026-11-30" is a date`},
		// Units in a header.
		{"a header unit that the unit cell contradicts", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Prototype", func(recs [][]string) [][]string { recs[0][1] = "value [ft]"; return recs })
		}), 1, "Prototype!C2", `unit "m" disagrees with the unit [ft] in the header of column value (Prototype!B1): give the unit in one place`},
		{"a header unit that is not a unit", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Prototype", func(recs [][]string) [][]string { recs[0][1] = "value [feet]"; return recs })
		}), 1, "Prototype!B1", `the unit [feet] in the header: unit "feet": unknown symbol`},
		// Text hygiene.
		{"a right-to-left override in a facility name", csvCase(set("Facilities", "Estuary tank", "facility", "Estuary\u202e tank")),
			1, "Facilities!A2", "the cell holds an invisible or direction-changing character (U+202E), so it may not read as it shows: retype the text"},
		{"a C1 control in a medium name", csvCase(set("Media", "tank water", "name", "tank\u0085water")),
			1, "Media!A2", "the cell holds a control character (U+0085): delete it"},
		{"DEL in a unit", csvCase(set("Prototype", "beam", "unit", "m\x7f")),
			1, "Prototype!C3", "the cell holds a control character (U+007F): delete it"},
		{"a line break in the study name", csvCase(set("Study", "name", "value", "harbour-tug\n# Forged heading")),
			1, "Study!B2", "the study name holds a line break: put it on one line"},
		// Values outside their domain.
		{"tank depths from -3 m on the second axis", csvCase(axis("tank_depth", "-3", "6", "m", "linear")),
			1, "Study!B", "the axis tank_depth must be positive (a facility capability), got -3 to 6: start it above 0"},
		{"a scale range from 1e-200 to 1e200", csvCase(func(t *testing.T, s string) {
			hSet(t, s, "Study", "scale_from", "value", "1e-200")
			hSet(t, s, "Study", "scale_to", "value", "1e200")
		}), 1, "Study!B5", "the scale range 1e-200 to 1e+200 reaches beyond kL = 0.001 to 1e+06"},
		{"scale_from 5e-324", csvCase(set("Study", "scale_from", "value", "5e-324")),
			1, "Study!B5", "the scale range 5e-324 to 60 reaches beyond kL = 0.001 to 1e+06"},
		{"a linear axis over ±1e308", csvCase(axis("temperature", "-1e308", "1e308", "", "linear")),
			1, "Study!B", "the axis temperature from -1e+308 to 1e+308 reaches beyond ±1e+12 (SI)"},
		{"a limit that divides by zero", csvCase(limit("zero_gap", "hull_length / (beam - beam) >= 1")),
			1, "Limits!C2", `limit "zero_gap" has no finite value at kL = 4`},
		{"a limit with the root of a negative number", csvCase(limit("root", "sqrt(beam - hull_length) * sqrt(beam) >= 1 [m]")),
			1, "Limits!C2", `limit "root" has no finite value at kL = 4`},
		{"10,000,000 points", csvCase(set("Study", "points", "value", "10000000")),
			1, "Study!B7", "the sweep would need about"},
		// One typo is one problem (the limit that names the item does not
		// report it again as unknown).
		{"a misspelt unit on an item a limit names", csvCase(func(t *testing.T, s string) {
			hSet(t, s, "Prototype", "beam", "unit", "mx")
			hAppend(t, s, "Limits", "all", "wide", "beam >= 0.1 [m]", "test")
		}), 1, "Prototype!B3", `unit "mx"`},
	}
}

// TestTypedInputs runs every typed case through the command.
func TestTypedInputs(t *testing.T) {
	for _, c := range typedCases() {
		t.Run(c.kind, func(t *testing.T) { hCheck(t, c) })
	}
}
