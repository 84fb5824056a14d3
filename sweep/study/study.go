package study

import (
	"fmt"
	"strings"
)

// Cell is a place in a study: sheet, 1-based row and 1-based column.
type Cell struct {
	Sheet    string
	Row, Col int
}

// String prints the place the way a spreadsheet does: "Strategies!C4".
func (c Cell) String() string {
	if c.Row == 0 {
		return c.Sheet
	}
	if c.Col == 0 {
		return fmt.Sprintf("%s!%d", c.Sheet, c.Row)
	}
	return fmt.Sprintf("%s!%s%d", c.Sheet, ColumnLetters(c.Col), c.Row)
}

// ColumnLetters turns a 1-based column number into letters (1 → A, 27 → AA).
func ColumnLetters(col int) string {
	s := ""
	for col > 0 {
		col--
		s = string(rune('A'+col%26)) + s
		col /= 26
	}
	return s
}

// Problem is one error in a study, at a place.
type Problem struct {
	Cell Cell
	Msg  string
}

func (p Problem) Error() string { return p.Cell.String() + ": " + p.Msg }

// Problems is every error found in a study at once. It is an error when it
// is not empty.
type Problems []Problem

func (ps Problems) Error() string { return strings.Join(ps.Lines(), "\n") }

// Lines returns every problem on a line of its own, with its place.
func (ps Problems) Lines() []string {
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.Error()
	}
	return lines
}

// Add records a problem.
func (ps *Problems) Add(c Cell, format string, args ...any) {
	*ps = append(*ps, Problem{c, fmt.Sprintf(format, args...)})
}

// Err returns nil when there is no problem.
func (ps Problems) Err() error {
	if len(ps) == 0 {
		return nil
	}
	return ps
}

// Study is a study as read from its sheets: text and numbers with their
// places, not yet checked against the library, the laws or the units
// beyond what reading needs. Prepare checks it.
type Study struct {
	Name   string
	Source string // the path it was read from
	// Settings are the rows of the Study sheet by setting name.
	Settings   map[string]Setting
	Prototype  []Item
	Media      []Candidate
	Materials  []Candidate
	Custom     []CustomRow
	Facilities []FacilityRow
	Strategies []StrategyRow
	Limits     []LimitRow
	Costs      []CostRow
	Measures   []MeasureRow
	Uncertain  []UncertainRow
	// Warnings are what reading found but did not stop at (a file
	// that is no sheet of a study).
	Warnings Warnings
}

// UncertainRow gives an input a distribution: a prototype item (of blank),
// a prototype property (of "prototype"), a candidate's property (of the
// candidate's name) or a facility capability (of the facility's name).
type UncertainRow struct {
	Input, Of, Distribution, Spread string
	Row                             int
}

// MeasureRow is a measure the study asks to be reported at model scale
// (a stiffness per spring, a model Reynolds number), in a unit.
type MeasureRow struct {
	Measure, Expression, Unit string
	Row                       int
}

// Setting is one row of the Study sheet.
type Setting struct {
	Name, Value, Unit string
	Cell              Cell // the value cell
}

// Item is a prototype item: a named value that scales as a quantity (or
// "none" for a count that does not scale).
type Item struct {
	Name, Value, Unit, ScalesAs string
	Row                         int
}

// Candidate is a model medium or material: a library entry at conditions.
type Candidate struct {
	Name, Entry, Conditions string
	Row                     int
}

// CustomRow sets one property of a user's own library entry.
type CustomRow struct {
	Entry, Kind, Property, Value, Unit, Source string
	Row                                        int
}

// FacilityRow sets one capability of a facility.
type FacilityRow struct {
	Facility, Type, Capability, Value, Unit string
	Row                                     int
}

// StrategyRow is one strategy, or one case of a special-cases strategy.
// List cells hold names separated by commas or semicolons.
type StrategyRow struct {
	Strategy, Case, Technique                                             string
	Retain, Relax, Untie, Given, Tuned, Fix, Media, Materials, Facilities string
	Correction                                                            string
	Row                                                                   int
}

// LimitRow adds a limit or overrides a default one of the same name.
type LimitRow struct {
	AppliesTo, Limit, Expression, Source string
	Row                                  int
}

// CostRow is a cost item: coefficient × (measure in units of per).
type CostRow struct {
	Item, Coefficient, Per, Measure, Facility string
	Row                                       int
}

// At returns the cell of a named column on a row of a sheet.
func At(sheet string, row int, column string) Cell {
	for i, c := range Columns[sheet] {
		if c == column {
			return Cell{sheet, row, i + 1}
		}
	}
	return Cell{sheet, row, 0}
}
