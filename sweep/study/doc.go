// Package study is the study document: what a person fills in to plan a
// model test, as an .xlsx workbook or a folder of .csv sheets. It holds
// the model of a study as read ([Study]: text and numbers with their
// places, not yet checked against the library or the laws — package
// sweep does that), the layout of its sheets, the readers and the template
// writer, the built-in scenarios and the synthetic generator.
//
//	s, err := study.Load("tug.xlsx")     // or a folder of CSV sheets
//	err = study.WriteXLSX(path, s, lists) // a template with drop-downs
//	s, err = study.LoadScenario("tug")    // a built-in scenario
//
// # The layout, defined once
//
// [Sheets] is one declarative table per sheet: its name, whether it is
// required, what a row says, and its columns in order with their kind
// (text, a name, a number, a value with a unit in the header), unit,
// meaning and list values. The CSV reader and the workbook reader (one
// sheetReader for both), the template writer with its drop-downs, and
// the Inputs echo of the report workbook are all driven by it; a test
// checks the README's sheet table and the template against it.
//
// # Reading
//
// Cells are read as people type them (typed cells by their number format,
// 1:25, 10 %, decimal commas in semicolon files, a unit in a header) and
// text is made plain (text.go); invisible and control characters, line
// breaks in names, formulas without a cached value, oversized files and
// files that are not regular files are refused at their cell
// ([Problems], every one at once). A file in a study folder that is no
// sheet of a study is a [Warning], said in every output.
//
// # Where things are
//
//	study.go                     the model: Study, Setting, Item, Candidate, rows; Cell, Problems
//	schema.go, listvalues.go     the layout of the sheets and their list values
//	read.go, read_csv.go,        the readers; cellformat.go typed cells,
//	read_xlsx.go                 text.go text hygiene, regular.go regular files
//	write.go, write_choices.go,  the template writer (CSV and workbook)
//	write_layout.go
//	scenarios.go, synthetic.go   built-in scenarios (testdata/scenarios) and large invented studies
//	atomic.go                    the one atomic file writer of scaleplan
//	warnings.go                  warnings of reading (stray files and sheets)
package study
