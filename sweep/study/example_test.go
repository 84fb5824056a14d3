package study_test

import (
	"fmt"
	"strings"

	"scaleplan/sweep/study"
)

// The layout of a study is one table per sheet: a newcomer finds every
// sheet, its columns and what a row says in study.Sheets.
func ExampleSheets() {
	for _, sh := range study.Sheets {
		if sh.Name == "Measures" || sh.Name == "Uncertainty" {
			fmt.Printf("%s (%s): %s\n", sh.Name, sh.Row, strings.Join(sh.Names(), ", "))
		}
	}
	// Output:
	// Measures (a measure to report at model scale): measure, expression, unit, note
	// Uncertainty (an input that varies): input, of, distribution, spread, note
}

// A built-in scenario is a study like any other: its rows keep the row
// they were read from, so a problem can name its cell.
func ExampleLoadScenario() {
	s, err := study.LoadScenario("tug")
	if err != nil {
		fmt.Println(err)
		return
	}
	it := s.Prototype[0]
	fmt.Printf("%s = %s %s (%s), at %s\n", it.Name, it.Value, it.Unit, it.ScalesAs, study.At("Prototype", it.Row, "value"))
	// Output:
	// hull_length = 28 m (length), at Prototype!B2
}
