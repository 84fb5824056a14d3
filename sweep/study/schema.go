package study

import (
	"slices"
	"sort"
)

// The layout of a study is defined once, here: one table per sheet giving
// its name, its columns in order with their units, meaning and list
// values, and how a row of the sheet maps to the Study. The CSV reader,
// the workbook reader, the template writer and the workbook's Inputs echo
// (report) are all driven by Sheets; a test checks that the README's
// sheet table says the same.

// Kind says how the reader treats the cells of a column beyond keeping
// them as text.
type Kind int

const (
	// Text is kept as it is typed.
	Text Kind = iota
	// Name names something a report shows as a heading or a label: a
	// line break in it is refused.
	Name
	// Number holds a number: a decimal comma is read there in a CSV file
	// separated by semicolons (1,5 is 1.5).
	Number
	// Value holds a number whose unit the header may give in brackets
	// (value [ft]); it is a Number too.
	Value
	// UnitOf holds the unit of the Value column of its row.
	UnitOf
)

// Column is one column of a sheet.
type Column struct {
	Name    string
	Kind    Kind
	Unit    string   // the unit its values are in ("" for text)
	Meaning string   // what the cell says
	List    []string // the values it takes, when they are fixed
}

// Sheet is the table of one sheet of a study.
type Sheet struct {
	Name string
	// Required sheets must be present; the others may be missing or
	// empty.
	Required bool
	// Row says what a row of the sheet says (the README's sheet table
	// begins its third column with it).
	Row     string
	Columns []Column
	// rows lists the rows of the sheet in a study, each cell in the order
	// of Columns (the note column, which a Study does not keep, empty);
	// store keeps one row read (the Study sheet, whose settings are
	// checked for twins, is stored by the reader itself).
	rows  func(s *Study) []Record
	store func(s *Study, n int, v []string)
}

// Record is one row of a sheet of a study: the row it was read from and
// its cells in the order of the sheet's columns.
type Record struct {
	Row   int
	Cells []string
}

// Names of the columns, in order.
func (sh Sheet) Names() []string {
	names := make([]string, len(sh.Columns))
	for i, c := range sh.Columns {
		names[i] = c.Name
	}
	return names
}

// Rows lists the rows the sheet holds in s, in the order they were read
// (the Study sheet's settings by row, then by name).
func (sh Sheet) Rows(s *Study) []Record { return sh.rows(s) }

// column finds a column by name.
func (sh Sheet) column(name string) (Column, bool) {
	for _, c := range sh.Columns {
		if c.Name == name {
			return c, true
		}
	}
	return Column{}, false
}

// SheetOf returns the table of a sheet by name.
func SheetOf(name string) (Sheet, bool) {
	for _, sh := range Sheets {
		if sh.Name == name {
			return sh, true
		}
	}
	return Sheet{}, false
}

// note is the last column of most sheets: a note a study does not keep.
var note = Column{Name: "note", Meaning: "a note for people; not read"}

// Sheets are the sheets of a study, in the order they appear in a
// workbook. A folder study holds one NAME.csv per sheet.
var Sheets = []Sheet{
	{Name: "Study", Required: true, Row: "one setting",
		Columns: []Column{
			{Name: "setting", Kind: Name, Meaning: "the setting's name", List: SettingNames()},
			{Name: "value", Kind: Number, Meaning: "its value (a number, a name or a list, by setting)"},
			{Name: "unit", Meaning: "the unit of the value, where it has one"},
			note},
		rows: settingRecords},
	{Name: "Prototype", Required: true, Row: "a prototype value and the quantity it scales as",
		Columns: []Column{
			{Name: "item", Meaning: "the item's name"},
			{Name: "value", Kind: Value, Unit: "the unit column, or the header's [unit]", Meaning: "its prototype value"},
			{Name: "unit", Kind: UnitOf, Meaning: "the unit of the value"},
			{Name: "scales_as", Meaning: "the quantity it scales as, or none for a count"},
			note},
		rows: func(s *Study) []Record {
			return records(s.Prototype, func(v Item) (int, []string) { return v.Row, []string{v.Name, v.Value, v.Unit, v.ScalesAs} })
		},
		store: func(s *Study, n int, v []string) {
			s.Prototype = append(s.Prototype, Item{Name: v[0], Value: v[1], Unit: v[2], ScalesAs: v[3], Row: n})
		}},
	{Name: "Media", Row: "a candidate fluid or soil", Columns: candidateColumns("medium"),
		rows:  func(s *Study) []Record { return candidateRecords(s.Media) },
		store: func(s *Study, n int, v []string) { s.Media = append(s.Media, candidate(n, v)) }},
	{Name: "Materials", Row: "a candidate model material", Columns: candidateColumns("material"),
		rows:  func(s *Study) []Record { return candidateRecords(s.Materials) },
		store: func(s *Study, n int, v []string) { s.Materials = append(s.Materials, candidate(n, v)) }},
	{Name: "Custom", Row: "one property of a library entry of the study's own",
		Columns: []Column{
			{Name: "entry", Kind: Name, Meaning: "the entry's name"},
			{Name: "kind", Meaning: "what the entry is", List: materialKinds},
			{Name: "property", Meaning: "the property set"},
			{Name: "value", Kind: Value, Unit: "the unit column, or the header's [unit]", Meaning: "its value, or a tunable range LO to HI"},
			{Name: "unit", Kind: UnitOf, Meaning: "the unit of the value"},
			{Name: "source", Meaning: "where the value comes from"}},
		rows: func(s *Study) []Record {
			return records(s.Custom, func(v CustomRow) (int, []string) {
				return v.Row, []string{v.Entry, v.Kind, v.Property, v.Value, v.Unit, v.Source}
			})
		},
		store: func(s *Study, n int, v []string) {
			s.Custom = append(s.Custom, CustomRow{Entry: v[0], Kind: v[1], Property: v[2], Value: v[3], Unit: v[4], Source: v[5], Row: n})
		}},
	{Name: "Facilities", Row: "one capability of a facility",
		Columns: []Column{
			{Name: "facility", Kind: Name, Meaning: "the facility's name"},
			{Name: "type", Meaning: "the kind of facility, which brings its default limits"},
			{Name: "capability", Meaning: "the capability set"},
			{Name: "value", Kind: Value, Unit: "the unit column, or the header's [unit]", Meaning: "its value"},
			{Name: "unit", Kind: UnitOf, Meaning: "the unit of the value"},
			note},
		rows: func(s *Study) []Record {
			return records(s.Facilities, func(v FacilityRow) (int, []string) {
				return v.Row, []string{v.Facility, v.Type, v.Capability, v.Value, v.Unit}
			})
		},
		store: func(s *Study, n int, v []string) {
			s.Facilities = append(s.Facilities, FacilityRow{Facility: v[0], Type: v[1], Capability: v[2], Value: v[3], Unit: v[4], Row: n})
		}},
	{Name: "Strategies", Required: true, Row: "one strategy, or one case of a special-cases strategy",
		Columns: []Column{
			{Name: "strategy", Kind: Name, Meaning: "the strategy's name"},
			{Name: "case", Kind: Name, Meaning: "the case, for a special-cases strategy"},
			{Name: "technique", Meaning: "a label for the report", List: Techniques},
			{Name: "retain", Meaning: "the laws kept (a list)"},
			{Name: "relax", Meaning: "the laws relaxed (a list)"},
			{Name: "untie", Meaning: "the quantities untied from the length scale (a list)"},
			{Name: "given", Meaning: "the quantities whose scale factor the candidate fixes (a list)"},
			{Name: "tuned", Meaning: "the properties tuned to what the strategy requires (a list)"},
			{Name: "fix", Meaning: "scale factors fixed, quantity=k (a list)"},
			{Name: "media", Meaning: "the candidate media (a list; empty for all)"},
			{Name: "materials", Meaning: "the candidate materials (a list; empty for all)"},
			{Name: "facilities", Meaning: "the facilities (a list; empty for all)"},
			{Name: "correction", Meaning: "a skin-friction correction, or empty for none", List: Corrections},
			note},
		rows: func(s *Study) []Record {
			return records(s.Strategies, func(v StrategyRow) (int, []string) {
				return v.Row, []string{v.Strategy, v.Case, v.Technique, v.Retain, v.Relax, v.Untie, v.Given, v.Tuned, v.Fix,
					v.Media, v.Materials, v.Facilities, v.Correction}
			})
		},
		store: func(s *Study, n int, v []string) {
			s.Strategies = append(s.Strategies, StrategyRow{
				Strategy: v[0], Case: v[1], Technique: v[2],
				Retain: v[3], Relax: v[4], Untie: v[5], Given: v[6], Tuned: v[7], Fix: v[8],
				Media: v[9], Materials: v[10], Facilities: v[11], Correction: v[12], Row: n,
			})
		}},
	{Name: "Limits", Row: "a limit added, or overriding a default one of the same name",
		Columns: []Column{
			{Name: "applies_to", Meaning: "all, a facility type or a facility"},
			{Name: "limit", Kind: Name, Meaning: "the limit's name"},
			{Name: "expression", Meaning: "the condition, e.g. speed <= speed_max"},
			{Name: "source", Meaning: "where the limit comes from"}},
		rows: func(s *Study) []Record {
			return records(s.Limits, func(v LimitRow) (int, []string) { return v.Row, []string{v.AppliesTo, v.Limit, v.Expression, v.Source} })
		},
		store: func(s *Study, n int, v []string) {
			s.Limits = append(s.Limits, LimitRow{AppliesTo: v[0], Limit: v[1], Expression: v[2], Source: v[3], Row: n})
		}},
	{Name: "Costs", Row: "a cost item",
		Columns: []Column{
			{Name: "item", Kind: Name, Meaning: "the cost item's name"},
			{Name: "coefficient", Kind: Number, Unit: "currency per unit of per", Meaning: "the price of one unit of per"},
			{Name: "per", Meaning: "the unit the coefficient is per"},
			{Name: "measure", Meaning: "what is counted (an expression at model scale)"},
			{Name: "facility", Meaning: "the facility it applies to, or empty for all"},
			note},
		rows: func(s *Study) []Record {
			return records(s.Costs, func(v CostRow) (int, []string) {
				return v.Row, []string{v.Item, v.Coefficient, v.Per, v.Measure, v.Facility}
			})
		},
		store: func(s *Study, n int, v []string) {
			s.Costs = append(s.Costs, CostRow{Item: v[0], Coefficient: v[1], Per: v[2], Measure: v[3], Facility: v[4], Row: n})
		}},
	{Name: "Measures", Row: "a measure to report at model scale",
		Columns: []Column{
			{Name: "measure", Kind: Name, Meaning: "the measure's name"},
			{Name: "expression", Meaning: "how it is computed at model scale"},
			{Name: "unit", Meaning: "the unit it is reported in"},
			note},
		rows: func(s *Study) []Record {
			return records(s.Measures, func(v MeasureRow) (int, []string) { return v.Row, []string{v.Measure, v.Expression, v.Unit} })
		},
		store: func(s *Study, n int, v []string) {
			s.Measures = append(s.Measures, MeasureRow{Measure: v[0], Expression: v[1], Unit: v[2], Row: n})
		}},
	{Name: "Uncertainty", Row: "an input that varies",
		Columns: []Column{
			{Name: "input", Meaning: "the item, property or capability that varies"},
			{Name: "of", Meaning: "blank (a prototype item), prototype, a candidate or a facility"},
			{Name: "distribution", Meaning: "how it varies", List: Distributions},
			{Name: "spread", Kind: Number, Unit: "a fraction, a percentage or the input's unit", Meaning: "a coefficient of variation or half-width, or a standard deviation with a unit"},
			note},
		rows: func(s *Study) []Record {
			return records(s.Uncertain, func(v UncertainRow) (int, []string) {
				return v.Row, []string{v.Input, v.Of, v.Distribution, v.Spread}
			})
		},
		store: func(s *Study, n int, v []string) {
			s.Uncertain = append(s.Uncertain, UncertainRow{Input: v[0], Of: v[1], Distribution: v[2], Spread: v[3], Row: n})
		}},
}

// SheetNames are the names of Sheets, in order.
var SheetNames = sheetNames()

// Columns are the column names of each sheet, in order; the header row of
// a sheet must name them (extra columns to the right are ignored, so users
// may add notes).
var Columns = columnNames()

// RequiredSheets must be present; the others may be missing or empty.
var RequiredSheets = requiredSheets()

func sheetNames() []string {
	var names []string
	for _, sh := range Sheets {
		names = append(names, sh.Name)
	}
	return names
}

func columnNames() map[string][]string {
	m := map[string][]string{}
	for _, sh := range Sheets {
		m[sh.Name] = sh.Names()
	}
	return m
}

func requiredSheets() []string {
	var names []string
	for _, sh := range Sheets {
		if sh.Required {
			names = append(names, sh.Name)
		}
	}
	return names
}

// isKind reports whether a column of a sheet is of one of the kinds.
func isKind(sheet, col string, kinds ...Kind) bool {
	sh, ok := SheetOf(sheet)
	if !ok {
		return false
	}
	c, ok := sh.column(col)
	return ok && slices.Contains(kinds, c.Kind)
}

// unitColumns are the value column and its unit column of a sheet whose
// header may give the unit of the value column in brackets.
func unitColumns(sheet string) ([2]string, bool) {
	sh, _ := SheetOf(sheet)
	var uc [2]string
	for _, c := range sh.Columns {
		switch c.Kind {
		case Value:
			uc[0] = c.Name
		case UnitOf:
			uc[1] = c.Name
		}
	}
	return uc, uc[0] != "" && uc[1] != ""
}

func candidateColumns(what string) []Column {
	return []Column{
		{Name: "name", Kind: Name, Meaning: "the candidate's name"},
		{Name: "library_entry", Meaning: "the library entry (or an entry of the Custom sheet) the " + what + " is"},
		{Name: "conditions", Meaning: "the conditions it is at (18C, 15C,35g/kg, 3bar)"},
		note}
}

func candidate(n int, v []string) Candidate {
	return Candidate{Name: v[0], Entry: v[1], Conditions: v[2], Row: n}
}

func candidateRecords(cs []Candidate) []Record {
	return records(cs, func(v Candidate) (int, []string) { return v.Row, []string{v.Name, v.Entry, v.Conditions} })
}

// records turns rows of a study into records.
func records[T any](rows []T, cells func(T) (int, []string)) []Record {
	recs := make([]Record, 0, len(rows))
	for _, r := range rows {
		n, c := cells(r)
		recs = append(recs, Record{n, c})
	}
	return recs
}

// settingRecords are the settings in the order of their rows, then of
// their names.
func settingRecords(s *Study) []Record {
	keys := make([]string, 0, len(s.Settings))
	for k := range s.Settings {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool {
		a, b := s.Settings[keys[i]], s.Settings[keys[j]]
		if a.Cell.Row != b.Cell.Row {
			return a.Cell.Row < b.Cell.Row
		}
		return keys[i] < keys[j]
	})
	recs := make([]Record, 0, len(keys))
	for _, k := range keys {
		set := s.Settings[k]
		name := set.Name
		if name == "" {
			name = k
		}
		recs = append(recs, Record{set.Cell.Row, []string{name, set.Value, set.Unit}})
	}
	return recs
}
