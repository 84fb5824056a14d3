package study

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// choicesSheet is a hidden sheet with the lists behind the template's
// drop-downs for the enumerations (settings, kinds, distributions, …) and
// one list of capabilities per facility type. It is not read back.
const choicesSheet = "Choices"

// choiceList is a column of the Choices sheet.
type choiceList struct {
	name   string // also its defined name, for the capability lists
	values []string
}

// writeChoices writes the Choices sheet (hidden) and gives every cell a
// user types an enumeration or a name into a drop-down: the setting
// names, the recommend and axis_spacing values, a custom entry's kind, a
// facility's capabilities (the list of its type, chosen by the type
// typed in the same row), the skin-friction correction, what a limit
// applies to and an input's distribution.
//
// Without lists (a workbook written for a program, not a person) there is
// no Choices sheet and no drop-down, like the Lists sheet's own.
func writeChoices(f *excelize.File, s *Study, lists Lists) error {
	if len(lists.Laws) == 0 && len(lists.FacilityTypes) == 0 && len(lists.Entries) == 0 && len(lists.Quantities) == 0 && len(lists.Techniques) == 0 {
		return nil
	}
	if _, err := f.NewSheet(choicesSheet); err != nil {
		return err
	}
	applies := append([]string{"all"}, lists.FacilityTypes...)
	seen := map[string]bool{}
	for _, fr := range s.Facilities {
		if fr.Facility != "" && !seen[fr.Facility] && !contains(applies, fr.Facility) {
			seen[fr.Facility] = true
			applies = append(applies, fr.Facility)
		}
	}
	cols := []choiceList{
		{"setting", listOf("Study", "setting")},
		{"recommend", []string{"largest", "cheapest"}},
		{"axis_spacing", []string{"log", "linear"}},
		{"kind", listOf("Custom", "kind")},
		{"correction", listOf("Strategies", "correction")},
		{"applies_to", applies},
		{"distribution", listOf("Uncertainty", "distribution")},
	}
	types := make([]string, 0, len(lists.Capabilities))
	for t := range lists.Capabilities {
		types = append(types, t)
	}
	sort.Strings(types)
	for _, t := range types {
		cols = append(cols, choiceList{"caps_" + t, lists.Capabilities[t]})
	}
	ref, err := writeChoiceColumns(f, cols)
	if err != nil {
		return err
	}
	if err := f.SetSheetVisible(choicesSheet, false); err != nil {
		return err
	}
	drops := []drop{
		{"Study", columnRange("Study", "setting"), ref["setting"], "setting", "A setting name (the list shows every one).", true},
		{"Custom", columnRange("Custom", "kind"), ref["kind"], "kind", "What the custom entry is: solid, fluid, soil or ice.", true},
		{"Strategies", columnRange("Strategies", "correction"), ref["correction"], "correction", "A skin-friction correction, or empty for none.", true},
		{"Limits", columnRange("Limits", "applies_to"), ref["applies_to"], "applies_to", "all, a facility type, or a facility of this study.", false},
		{"Uncertainty", columnRange("Uncertainty", "distribution"), ref["distribution"], "distribution", "How the input varies.", true},
	}
	if len(types) > 0 {
		typeCol := ColumnLetters(At("Facilities", 1, "type").Col)
		drops = append(drops, drop{"Facilities", columnRange("Facilities", "capability"), xmlText(fmt.Sprintf(`INDIRECT("caps_"&$%s2)`, typeCol)),
			"capability", "A capability of the facility's type (typed in the type column of this row).", true})
	}
	// The value cells of the enumerated settings the template holds.
	rows, err := f.GetRows("Study")
	if err != nil {
		return err
	}
	valueCol := ColumnLetters(At("Study", 1, "value").Col)
	for i, r := range rows {
		if len(r) > 0 && (r[0] == "recommend" || r[0] == "axis_spacing") {
			drops = append(drops, drop{"Study", valueCol + strconv.Itoa(i+1), ref[r[0]], r[0], "The values " + r[0] + " takes.", true})
		}
	}
	return addDropDowns(f, drops)
}

// xmlText escapes a formula for the data-validation element, which the
// spreadsheet library writes as it is given.
func xmlText(s string) string {
	return strings.NewReplacer("&", "&amp;", `"`, "&quot;", "<", "&lt;", ">", "&gt;").Replace(s)
}

// listOf is the list of values a column of a sheet takes (Sheets).
func listOf(sheet, col string) []string {
	sh, _ := SheetOf(sheet)
	c, _ := sh.column(col)
	return c.List
}

// drop is a drop-down list on a range of a sheet: the list it offers, its
// prompt, and whether a value not in the list is refused (strict) or only
// warned of.
type drop struct {
	sheet, sqref, list, title, msg string
	strict                         bool
}

// writeChoiceColumns writes the lists of the Choices sheet, one column
// each, and returns the reference of each list by name; the capability
// lists (from the eighth column on) get a defined name, for INDIRECT.
func writeChoiceColumns(f *excelize.File, cols []choiceList) (map[string]string, error) {
	ref := map[string]string{}
	for i, c := range cols {
		col := ColumnLetters(i + 1)
		if err := f.SetCellStr(choicesSheet, col+"1", c.name); err != nil {
			return nil, err
		}
		for j, v := range c.values {
			if err := f.SetCellStr(choicesSheet, col+strconv.Itoa(j+2), v); err != nil {
				return nil, err
			}
		}
		last := len(c.values) + 1
		if last < 2 {
			last = 2
		}
		ref[c.name] = fmt.Sprintf("%s!$%s$2:$%s$%d", choicesSheet, col, col, last)
		if i >= 7 {
			if err := f.SetDefinedName(&excelize.DefinedName{Name: c.name, RefersTo: ref[c.name]}); err != nil {
				return nil, err
			}
		}
	}
	return ref, nil
}

// addDropDowns gives each range its drop-down list.
func addDropDowns(f *excelize.File, drops []drop) error {
	for _, d := range drops {
		dv := excelize.NewDataValidation(true)
		dv.Sqref = d.sqref
		dv.SetSqrefDropList(d.list)
		dv.SetInput(d.title, clip(d.msg))
		style := excelize.DataValidationErrorStyleStop
		msg := "Choose a value from the list."
		if !d.strict {
			style, msg = excelize.DataValidationErrorStyleWarning, "Not in the list: check the name."
		}
		dv.SetError(style, d.title, msg)
		if err := f.AddDataValidation(d.sheet, dv); err != nil {
			return err
		}
	}
	return nil
}
