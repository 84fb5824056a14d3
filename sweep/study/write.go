package study

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// sheetRecords lists the rows of one sheet of s, each with as many cells
// as the sheet has columns. Settings come in the order of their rows, then
// of their names; notes are not part of a Study, so note columns are
// written empty.
func sheetRecords(s *Study, sheet string) []Record {
	sh, _ := SheetOf(sheet)
	recs := sh.Rows(s)
	for i, r := range recs {
		full := make([]string, len(sh.Columns))
		copy(full, r.Cells)
		recs[i].Cells = full
	}
	placeRows(recs)
	return recs
}

// placeRows gives every record its row: the row it was read from when the
// rows still ascend (so that a study read and written again keeps its cell
// names, blank rows included), else the next free row. Row 1 is the header.
func placeRows(recs []Record) {
	next := 2
	for i := range recs {
		r := recs[i].Row
		if r < next || r > MaxRows {
			r = next
		}
		recs[i].Row = r
		next = r + 1
	}
}

// encodeCSV is one sheet of s as CSV: the header, then the rows, a blank
// row being a line of empty cells.
//
// Values are written as they are, with no quote or other guard against
// formula injection (a cell beginning with =, +, - or @ that a spreadsheet
// program might evaluate): these files are our own input format, read back
// by our reader, and must round-trip exactly (a guard would change "-1" or
// "=x" on the way back). A workbook for people is written by WriteXLSX,
// where every text is stored as text.
func encodeCSV(s *Study, sheet string) ([]byte, error) {
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	cols := Columns[sheet]
	if err := w.Write(cols); err != nil {
		return nil, err
	}
	blank := make([]string, len(cols))
	row := 1
	for _, rec := range sheetRecords(s, sheet) {
		for row++; row < rec.Row; row++ {
			if err := w.Write(blank); err != nil {
				return nil, err
			}
		}
		if err := w.Write(rec.Cells); err != nil {
			return nil, err
		}
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

// WriteCSV writes the study as a folder of NAME.csv files, one per sheet in
// SheetNames, empty sheets as a header row (creating dir; each file is
// written to a temporary file in dir and renamed when complete, so an
// interrupted write leaves no half file). Existing sheet files in dir are
// replaced: the caller decides whether dir may be written.
func WriteCSV(dir string, s *Study) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	for _, sheet := range SheetNames {
		data, err := encodeCSV(s, sheet)
		if err != nil {
			return fmt.Errorf("sheet %s: %w", sheet, err)
		}
		if err := WriteFileAtomic(filepath.Join(dir, sheet+".csv"), func(w io.Writer) error {
			_, err := w.Write(data)
			return err
		}); err != nil {
			return err
		}
	}
	return nil
}

// Lists are the names the drop-down lists of a written workbook offer.
type Lists struct {
	Laws, Quantities, Entries, FacilityTypes, Techniques []string
	// Capabilities lists each facility type's capabilities.
	Capabilities map[string][]string
}

// Fixed document properties, so that the same study gives the same bytes.
const (
	docTime    = "2000-01-01T00:00:00Z"
	docCreator = "scaleplan"
	listsSheet = "Lists"
	instrSheet = "Instructions"
)

// WriteXLSX writes the study as a workbook a program manager can fill:
// first an Instructions sheet, then one sheet per SheetNames (a bold,
// frozen header row, columns as wide as their contents, the rows of s,
// drop-down lists where a cell takes one name from a list, and an input
// message naming the allowed names where a cell takes a list of them), and
// last a Lists sheet holding the names the drop-down lists offer.
//
// Every value is written as text (a shared string, with SetCellStr), never
// as a formula, so "=SUM(A1)", "+1", "-x", "-0.5" or "@a" stay text;
// except that a plain unsigned decimal number ("25", "1025.3") is written
// as a number, so the sheet shows no "number stored as text" warnings, and
// reads back exactly as it was. The workbook is written to a
// temporary file and renamed, and the same study and lists give the same
// bytes.
func WriteXLSX(p string, s *Study, lists Lists) error {
	f := excelize.NewFile()
	defer f.Close()
	if err := buildWorkbook(f, s, lists); err != nil {
		return err
	}
	return WriteFileAtomic(p, func(w io.Writer) error { return f.Write(w) })
}

// plainNumber reports whether v is a plain decimal number that excelize
// stores and reads back exactly as typed. A value beginning with =, +, -
// or @ is never one (so "-0.5" is written as text, like every value a
// spreadsheet program might take for a formula).
func plainNumber(v string) (float64, bool) {
	if v == "" || len(v) > 24 || strings.ContainsAny(v[:1], "=+-@") || strings.ContainsAny(v, "eEInfinfa_xX") {
		return 0, false
	}
	x, err := strconv.ParseFloat(v, 64)
	if err != nil || strconv.FormatFloat(x, 'f', -1, 64) != v {
		return 0, false
	}
	digits := strings.TrimLeft(strings.ReplaceAll(v, ".", ""), "0")
	if len(digits) > 15 {
		return 0, false // excelize would round it to Excel's 15 digits
	}
	return x, true
}

func buildWorkbook(f *excelize.File, s *Study, lists Lists) error {
	if err := f.SetSheetName("Sheet1", instrSheet); err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	title, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Size: 14}})
	if err != nil {
		return err
	}
	wrap, err := f.NewStyle(&excelize.Style{Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"}})
	if err != nil {
		return err
	}
	if err := writeInstructions(f, title, bold, wrap); err != nil {
		return err
	}
	for _, sheet := range SheetNames {
		if _, err := f.NewSheet(sheet); err != nil {
			return err
		}
		if err := writeSheet(f, s, sheet, bold); err != nil {
			return fmt.Errorf("sheet %s: %w", sheet, err)
		}
	}
	if err := writeLists(f, s, lists, bold); err != nil {
		return err
	}
	if err := writeChoices(f, s, lists); err != nil {
		return err
	}
	if err := finishLayout(f); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	return f.SetDocProps(&excelize.DocProperties{
		Created:        docTime,
		Modified:       docTime,
		Creator:        docCreator,
		LastModifiedBy: docCreator,
		Title:          s.Name,
		Description:    "scaleplan study: a planning aid for physical model tests",
	})
}

// setCell writes one value: a plain number as a number, anything else as
// text.
func setCell(f *excelize.File, sheet string, col, row int, v string) error {
	ref, err := excelize.CoordinatesToCellName(col, row)
	if err != nil {
		return err
	}
	if x, ok := plainNumber(v); ok {
		return f.SetCellFloat(sheet, ref, x, -1, 64)
	}
	return f.SetCellStr(sheet, ref, v)
}

// widthOf is a column width, in characters, that shows v.
func widthOf(v string) float64 {
	w := 0
	for _, line := range strings.Split(v, "\n") {
		w = max(w, utf8.RuneCountInString(line))
	}
	return float64(w)
}

func writeSheet(f *excelize.File, s *Study, sheet string, bold int) error {
	cols := Columns[sheet]
	widths := make([]float64, len(cols))
	for i, c := range cols {
		if err := setCell(f, sheet, i+1, 1, c); err != nil {
			return err
		}
		widths[i] = widthOf(c)
	}
	last, err := excelize.CoordinatesToCellName(len(cols), 1)
	if err != nil {
		return err
	}
	if err := f.SetCellStyle(sheet, "A1", last, bold); err != nil {
		return err
	}
	for _, rec := range sheetRecords(s, sheet) {
		for i, v := range rec.Cells {
			if v == "" {
				continue
			}
			if err := setCell(f, sheet, i+1, rec.Row, v); err != nil {
				return err
			}
			widths[i] = max(widths[i], widthOf(v))
		}
	}
	for i, w := range widths {
		name := ColumnLetters(i + 1)
		if err := f.SetColWidth(sheet, name, name, min(max(w+2, 10), 60)); err != nil {
			return err
		}
	}
	return f.SetPanes(sheet, &excelize.Panes{
		Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft",
		Selection: []excelize.Selection{{SQRef: "A2", ActiveCell: "A2", Pane: "bottomLeft"}},
	})
}

// listColumn is a column of the Lists sheet.
type listColumn struct {
	header string
	names  []string
}

// listColumns are the columns of the Lists sheet, in order.
func listColumns(s *Study, lists Lists) []listColumn {
	quantities := append([]string(nil), lists.Quantities...)
	if len(quantities) > 0 && !contains(quantities, "none") {
		quantities = append(quantities, "none") // a count that does not scale
	}
	entries := append([]string(nil), lists.Entries...)
	for _, c := range s.Custom { // the study's own entries are valid too
		if c.Entry != "" && !contains(entries, c.Entry) {
			entries = append(entries, c.Entry)
		}
	}
	return []listColumn{
		{"law", lists.Laws},
		{"quantity", quantities},
		{"library_entry", entries},
		{"facility_type", lists.FacilityTypes},
		{"technique", lists.Techniques},
	}
}

func contains(list []string, v string) bool {
	for _, x := range list {
		if x == v {
			return true
		}
	}
	return false
}

// writeLists writes the Lists sheet (the names the drop-downs offer, one
// column per list) and gives the cells that take one of those names a
// drop-down, the list cells of the Strategies sheet a hint.
func writeLists(f *excelize.File, s *Study, lists Lists, bold int) error {
	cols := listColumns(s, lists)
	if err := writeListColumns(f, cols, bold); err != nil {
		return err
	}
	if err := listDropDowns(f, cols); err != nil {
		return err
	}
	return listHints(f, cols)
}

// writeListColumns writes the columns of the Lists sheet.
func writeListColumns(f *excelize.File, cols []listColumn, bold int) error {
	if _, err := f.NewSheet(listsSheet); err != nil {
		return err
	}
	for i, c := range cols {
		if err := f.SetCellStr(listsSheet, ColumnLetters(i+1)+"1", c.header); err != nil {
			return err
		}
		w := widthOf(c.header)
		for j, n := range c.names {
			if err := f.SetCellStr(listsSheet, ColumnLetters(i+1)+strconv.Itoa(j+2), n); err != nil {
				return err
			}
			w = max(w, widthOf(n))
		}
		name := ColumnLetters(i + 1)
		if err := f.SetColWidth(listsSheet, name, name, min(max(w+2, 10), 60)); err != nil {
			return err
		}
	}
	if err := f.SetCellStyle(listsSheet, "A1", ColumnLetters(len(cols))+"1", bold); err != nil {
		return err
	}
	if err := f.SetPanes(listsSheet, &excelize.Panes{
		Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft",
		Selection: []excelize.Selection{{SQRef: "A2", ActiveCell: "A2", Pane: "bottomLeft"}},
	}); err != nil {
		return err
	}
	return nil
}

// listDropDowns gives the cells that take one name of a list a drop-down.
func listDropDowns(f *excelize.File, cols []listColumn) error {
	// Drop-down lists refer to the Lists sheet (an inline list is limited
	// to 255 characters, too few for the quantities).
	ref := func(i int) string {
		c := listColumnLetter(i)
		return fmt.Sprintf("%s!$%s$2:$%s$%d", listsSheet, c, c, len(cols[i].names)+1)
	}
	type drop struct {
		sheet, column string
		list          int
		strict        bool
		msg           string
	}
	drops := []drop{
		{"Prototype", "scales_as", 1, true, "The quantity the item scales as (\"none\" for a count that does not scale)."},
		{"Media", "library_entry", 2, false, "A library entry, or an entry defined in the Custom sheet."},
		{"Materials", "library_entry", 2, false, "A library entry, or an entry defined in the Custom sheet."},
		{"Facilities", "type", 3, true, "The facility type; it brings the default limits of that type."},
		{"Strategies", "technique", 4, true, "How the strategy relaxes similitude."},
	}
	for _, d := range drops {
		if len(cols[d.list].names) == 0 {
			continue
		}
		dv := excelize.NewDataValidation(true)
		dv.Sqref = columnRange(d.sheet, d.column)
		dv.SetSqrefDropList(ref(d.list))
		dv.SetInput(d.column, clip(d.msg+" Names: see column "+listColumnLetter(d.list)+" of the Lists sheet."))
		if d.strict {
			dv.SetError(excelize.DataValidationErrorStyleStop, d.column, clip("Not a "+cols[d.list].header+": choose one from the list (column "+listColumnLetter(d.list)+" of the Lists sheet)."))
		} else {
			dv.SetError(excelize.DataValidationErrorStyleWarning, d.column, clip("Not a library entry: if it is your own entry, define it in the Custom sheet."))
		}
		if err := f.AddDataValidation(d.sheet, dv); err != nil {
			return err
		}
	}
	return nil
}

// listHints gives the list cells of the Strategies sheet an input message
// naming the allowed names.
func listHints(f *excelize.File, cols []listColumn) error {
	// List cells take several names, which a drop-down cannot check: an
	// input message names the allowed ones.
	type hint struct {
		column string
		list   int
		what   string
	}
	hints := []hint{
		{"retain", 0, "Laws retained (matched), separated by commas"},
		{"relax", 0, "Laws relaxed (monitored, not matched), separated by commas"},
		{"untie", 1, "Quantities untied from length, separated by commas"},
	}
	for _, h := range hints {
		names := cols[h.list].names
		if len(names) == 0 {
			continue
		}
		msg := h.what + ": " + strings.Join(names, ", ") + "."
		if utf8.RuneCountInString(msg) > 255 {
			msg = h.what + "; the names are in column " + listColumnLetter(h.list) + " of the Lists sheet."
		}
		dv := excelize.NewDataValidation(true)
		dv.Sqref = columnRange("Strategies", h.column)
		dv.SetInput(h.column, clip(msg))
		if err := f.AddDataValidation("Strategies", dv); err != nil {
			return err
		}
	}
	return nil
}

func listColumnLetter(i int) string { return ColumnLetters(i + 1) }

// columnRange is the data rows of a named column: "C2:C100000".
func columnRange(sheet, column string) string {
	c := ColumnLetters(At(sheet, 1, column).Col)
	return fmt.Sprintf("%s2:%s%d", c, c, MaxRows)
}

// clip keeps a message within Excel's 255 characters.
func clip(msg string) string {
	if utf8.RuneCountInString(msg) <= 255 {
		return msg
	}
	r := []rune(msg)
	return string(r[:254]) + "…"
}

// instructions are the lines of the Instructions sheet: a heading starts
// with "# ".
var instructions = []string{
	"# scaleplan study",
	"This workbook is a study for scaleplan, a planning aid for physical model tests: it sweeps the length scale, solves the similitude scale laws of each strategy, checks every dimensionless group and facility limit, and reports the feasible scale window, what limits it, the scale effects and the cost.",
	"Fill the sheets, then run `scaleplan check FILE` to find mistakes (every error names its sheet and cell, e.g. Strategies!C4) and `scaleplan run FILE` to plan the test.",
	"# Caution",
	"The results are a planning aid. Scale effects remain. The final test plan and any design decision rest with qualified engineers, the facility's operating rules, and the applicable codes and classification rules.",
	"Facility capabilities and the default limits of each facility type are typical values or common practice; check them against the facility's own data and operating rules before relying on a result.",
	"# Conventions",
	"A scale factor is k = prototype value / model value. \"Scale 1:25\" means kL = 25; a smaller model has a larger kL. Every table, plot and message uses this convention.",
	"Units: a number is in SI units unless its unit column names another unit (for example mm, km/h, t, kN, bar, degC). Write numbers with a decimal point.",
	"Row 1 of each sheet names its columns: keep these names and their order (a unit in brackets may follow a name, e.g. \"value [m]\"). You may add columns to the right for your own notes; they are ignored. Blank rows are ignored.",
	"List cells (retain, relax, untie, given, tuned, fix, media, materials, facilities) hold names separated by commas, semicolons or spaces.",
	"Drop-down lists offer the allowed names; the Lists sheet holds them all.",
	"A study may also be kept as a folder of CSV files, one per sheet (Study.csv, Prototype.csv, ...), with the same columns.",
	"# Sheets",
	"Study: the settings, one per row (setting, value, unit, note): the study's name, the scale range to sweep (scale_from and scale_to, as kL), the number of points, an optional second axis, the tolerance for substitute materials, the currency, and the rule for the recommended scale. Across strategies, one that relaxes a law beyond a mismatch factor of mismatch_threshold (10) ranks after one that does not; weak_laws lists laws whose relaxation costs nothing, governing_laws laws whose relaxation always counts.",
	"Prototype: the prototype items (item, value, unit, scales_as): each a named value and the quantity it scales as (length, velocity, force, ... or none for a count that does not scale).",
	"Media: candidate model fluids, soils or ices (name, library_entry, conditions), e.g. fresh water at 15C; one row per candidate.",
	"Materials: candidate model materials (name, library_entry, conditions); one row per candidate.",
	"Custom: your own library entries, one property per row (entry, kind, property, value, unit, source); give the source of every value.",
	"Facilities: the facilities to compare, one capability per row (facility, type, capability, value, unit); the type brings the default limits of that kind of facility.",
	"Strategies: the similitude strategies to compare, one row per strategy, or per case of a special-cases strategy (strategy, case, technique, the laws retained and relaxed, the quantities untied, the properties given, tuned or fixed, the candidate media, materials and facilities, and a known correction).",
	"Limits: limits added to the defaults of the facility types, or overriding a default of the same name (applies_to, limit, expression, source), e.g. design_speed * hull_length / kinematic_viscosity >= 2e6; give the source of each.",
	"Costs: cost items (item, coefficient, per, measure, facility): coefficient × the measure in units of per, e.g. a facility rate per hour.",
	"Measures: measures to report at model scale (measure, expression, unit), e.g. stiffness / springs in N/m for the stiffness of each spring.",
	"Uncertainty: inputs that vary (input, of, distribution, spread): a prototype item (of blank), a prototype property (of prototype), a candidate's property (of the candidate) or a facility capability (of the facility); distribution normal, lognormal or uniform; spread a coefficient of variation or half-width (0.1 or 10 %) or a standard deviation with a unit. Set samples, seed and robust_level on the Study sheet.",
	"Lists: the names the drop-down lists offer (laws, quantities, library entries, facility types, techniques). It is not read back.",
}

func writeInstructions(f *excelize.File, title, bold, wrap int) error {
	if err := f.SetColWidth(instrSheet, "A", "A", 110); err != nil {
		return err
	}
	for i, line := range instructions {
		ref := "A" + strconv.Itoa(i+1)
		style := wrap
		if h, ok := strings.CutPrefix(line, "# "); ok {
			line, style = h, bold
			if i == 0 {
				style = title
			}
		}
		if err := f.SetCellStr(instrSheet, ref, line); err != nil {
			return err
		}
		if err := f.SetCellStyle(instrSheet, ref, ref, style); err != nil {
			return err
		}
	}
	return nil
}
