package study

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"unicode"

	"scaleplan/feasibility"
)

// hiddenChar returns the first character of a cell that is invisible or
// changes the direction of text (so two names that look alike differ, or
// a name shows other than it reads), a C1 control or DEL. A byte order
// mark at the start of a CSV file is removed before cells are read; inside
// text it is refused like the others.
func hiddenChar(v string) (rune, bool) {
	for _, r := range v {
		switch {
		case r == 0x7f, r >= 0x80 && r <= 0x9f: // DEL, C1 controls
			return r, true
		case r >= 0x200b && r <= 0x200f, // zero-width space and joiners, direction marks
			r >= 0x202a && r <= 0x202e, // direction embeddings and overrides
			r >= 0x2060 && r <= 0x2064, // word joiner and invisible operators
			r >= 0x2066 && r <= 0x2069, // direction isolates
			r == 0xfeff:                // byte order mark, zero-width no-break space
			return r, true
		}
	}
	return 0, false
}

// hiddenMessage explains a refused character.
func hiddenMessage(r rune) string {
	if r == 0x7f || r >= 0x80 && r <= 0x9f {
		return fmt.Sprintf("the cell holds a control character (U+%04X): delete it", r)
	}
	return fmt.Sprintf("the cell holds an invisible or direction-changing character (U+%04X), so it may not read as it shows: retype the text", r)
}

// normSpace makes the white space of a cell plain: every space character
// (no-break space, tab, thin space, …) becomes a space, runs of spaces
// become one, and spaces around line breaks and at the ends go. So
// "Estuary\u00a0tank" and "Estuary  tank" are the facility "Estuary tank".
func normSpace(v string) string {
	clean := true
	prev := ' '
	for _, r := range v {
		if r != ' ' && r != '\n' && unicode.IsSpace(r) || r == ' ' && (prev == ' ' || prev == '\n') {
			clean = false
			break
		}
		prev = r
	}
	if clean && v == strings.TrimSpace(v) && !strings.Contains(v, " \n") {
		return v
	}
	lines := strings.Split(v, "\n")
	for i, l := range lines {
		lines[i] = strings.Join(strings.FieldsFunc(l, func(r rune) bool { return r != '\n' && unicode.IsSpace(r) }), " ")
	}
	return strings.TrimSpace(strings.Join(lines, "\n"))
}

// decimalComma matches a number written with a decimal comma.
// (or a scale 1:12,5).
var decimalComma = regexp.MustCompile(`^([0-9]+\s*:\s*)?[+-]?[0-9]*,[0-9]+([eE][+-]?[0-9]+)?\s*%?$`)

// fromDecimalComma turns 1,5 into 1.5 (other text is kept).
func fromDecimalComma(v string) string {
	if strings.Count(v, ",") == 1 && decimalComma.MatchString(v) {
		return strings.Replace(v, ",", ".", 1)
	}
	return v
}

// headerUnit returns the text in brackets after a column name ("ft" in
// "value [ft]"), or "".
func headerUnit(cell string) string {
	cell = strings.TrimSpace(cell)
	if !strings.HasSuffix(cell, "]") {
		return ""
	}
	i := strings.IndexByte(cell, '[')
	if i < 0 {
		return ""
	}
	return strings.TrimSpace(cell[i+1 : len(cell)-1])
}

// noUnit reports whether a unit text says "no unit".
func noUnit(u string) bool { return u == "" || u == "-" || u == "1" }

// unitNote reports whether the text in brackets of a header is a note
// rather than a unit: "SI", or "SI or as unit" as the README shows it.
func unitNote(u string) bool {
	return noUnit(u) || strings.EqualFold(u, "SI") || strings.EqualFold(u, "SI or as unit")
}

// checkHeaderUnits reads the units in the header row: on a value column
// of the sheets in unitColumns it must be a unit (it is then the unit of
// every row whose unit cell is empty); on any other column a unit would be
// ignored, so it is refused.
func (r *sheetReader) checkHeaderUnits(cells []string) bool {
	ok := true
	uc, hasUnits := unitColumns(r.sheet)
	for i, col := range r.cols {
		if i >= len(cells) {
			break
		}
		u := headerUnit(cells[i])
		if unitNote(u) {
			continue
		}
		c := Cell{r.sheet, 1, i + 1}
		if !hasUnits || col != uc[0] {
			where := "the unit column of each row"
			if r.sheet == "Study" {
				where = "the unit column of a setting that takes one (axis_from)"
			}
			r.add(c, "a unit in the header of column %s is not read: delete [%s] and give units in %s", col, u, where)
			ok = false
			continue
		}
		if _, err := feasibility.ParseUnit(u); err != nil {
			r.add(c, "the unit [%s] in the header: %v", u, err)
			ok = false
			continue
		}
		if r.units == nil {
			r.units = map[int]string{}
		}
		r.units[i] = u
	}
	return ok
}

// applyHeaderUnit gives the rows of a sheet the unit of their value
// column's header where their unit cell is empty, and refuses a row whose
// unit disagrees with it.
func (r *sheetReader) applyHeaderUnit(n int, vals []string) bool {
	if len(r.units) == 0 {
		return true
	}
	uc, _ := unitColumns(r.sheet)
	vi, ui := -1, -1
	for i, col := range r.cols {
		switch col {
		case uc[0]:
			vi = i
		case uc[1]:
			ui = i
		}
	}
	hu, ok := r.units[vi]
	if !ok || vals[vi] == "" {
		return true
	}
	if vals[ui] == "" {
		vals[ui] = hu
		return true
	}
	if noUnit(vals[ui]) {
		return true // "-" or "1": this row has no unit (a count)
	}
	if sameUnit(vals[ui], hu) {
		return true
	}
	r.add(Cell{r.sheet, n, ui + 1}, "unit %q disagrees with the unit [%s] in the header of column %s (%s): give the unit in one place, or make them agree", vals[ui], hu, uc[0], Cell{r.sheet, 1, vi + 1})
	return false
}

// sameUnit reports whether two unit texts are the same unit.
func sameUnit(a, b string) bool {
	if strings.EqualFold(strings.TrimSpace(a), strings.TrimSpace(b)) {
		return true
	}
	ua, ea := feasibility.ParseUnit(a)
	ub, eb := feasibility.ParseUnit(b)
	if ea != nil || eb != nil || !ua.Dim.Equal(ub.Dim) || ua.Offset != ub.Offset {
		return false
	}
	d := ua.Factor - ub.Factor
	return d < 1e-12*ua.Factor && -d < 1e-12*ua.Factor
}

// tidyCell checks and tidies one cell of a data row: it returns the value
// to keep, or a message when the cell is refused.
func (r *sheetReader) tidyCell(col, v string) (string, string) {
	if col == "note" {
		return v, "" // notes are not kept, nor shown
	}
	if ch, bad := hiddenChar(v); bad {
		return v, hiddenMessage(ch)
	}
	v = normSpace(v)
	if strings.Contains(v, "\n") && isKind(r.sheet, col, Name) {
		return v, "a name holds a line break: put it on one line (a name is a heading or label in every output)"
	}
	if r.decimalComma && isKind(r.sheet, col, Number, Value) {
		v = fromDecimalComma(v)
	}
	return v, ""
}

// clockText matches a time typed as h:mm or h:mm:ss (as the xlsx reader
// writes a cell formatted as a time, or as typed in a CSV file).
var clockText = regexp.MustCompile(`^([0-9]+):([0-5][0-9])(?::([0-5][0-9](?:\.[0-9]+)?))?$`)

// dateText matches a calendar date as the xlsx reader writes a cell
// formatted as a date (2026-12-02, perhaps with a time of day).
var dateText = regexp.MustCompile(`^[0-9]{4}-[0-9]{2}-[0-9]{2}( [0-9]{2}:[0-9]{2}:[0-9]{2})?$`)

// clockSeconds returns the seconds of a time typed h:mm or h:mm:ss.
func clockSeconds(v string) (float64, bool) {
	m := clockText.FindStringSubmatch(strings.TrimSpace(v))
	if m == nil {
		return 0, false
	}
	h, _ := strconv.ParseFloat(m[1], 64)
	mi, _ := strconv.ParseFloat(m[2], 64)
	s := 0.0
	if m[3] != "" {
		s, _ = strconv.ParseFloat(m[3], 64)
	}
	return h*3600 + mi*60 + s, true
}

// ratioScale reads a scale written as a ratio, 1:25 (kL = 25), as a scale
// setting accepts it. A spreadsheet stores 1:25 typed into a cell as the
// time 1:25; the xlsx reader gives it back as the text 1:25.
func ratioScale(v string) (float64, bool) {
	a, b, ok := strings.Cut(strings.TrimSpace(v), ":")
	if !ok || strings.TrimSpace(a) != "1" {
		return 0, false
	}
	k, err := strconv.ParseFloat(strings.TrimSpace(b), 64)
	if err != nil || !(k > 0) || k > 1e300 {
		return 0, false
	}
	return k, true
}

// typedAsClock explains a value that is a time or a date where a number
// is needed, or returns "".
func TypedAsClock(v string) string {
	v = strings.TrimSpace(v)
	switch {
	case clockText.MatchString(v):
		return fmt.Sprintf("%q is a time (a spreadsheet stores 1:25 typed into a cell as a time of day): type the number; for a scale give kL (25 for 1:25); to type 1:25 as text, format the cell as Text first", v)
	case dateText.MatchString(v):
		return fmt.Sprintf("%q is a date (the cell is formatted as a date): format the cell as Number and type the number", v)
	}
	return ""
}

// timeValue reads a value typed as a duration (0:01:00, a cell formatted
// as a time) where a time is expected: it returns the seconds as the value
// and s as the unit. Values that are not durations are returned as given;
// a duration where no time is expected, or with a unit that is not a
// time, is an error.
func TimeValue(value, unit string, want feasibility.Dimension) (string, string, error) {
	secs, ok := clockSeconds(value)
	if !ok {
		if msg := TypedAsClock(value); msg != "" {
			return value, unit, fmt.Errorf("%s", msg)
		}
		return value, unit, nil
	}
	time := feasibility.Dim(0, 0, 1, 0)
	u, uerr := feasibility.ParseUnit(unit)
	if want.Equal(time) && (noUnit(strings.TrimSpace(unit)) || uerr == nil && u.Dim.Equal(time)) {
		// h:mm:ss is a duration whatever time unit the row names.
		return strconv.FormatFloat(secs, 'g', -1, 64), "s", nil
	}
	return value, unit, fmt.Errorf("%s", TypedAsClock(value))
}

// settingNumber reads a setting's number in the forms a person types
// beside the plain one: a scale as a ratio (scale_from = 1:25) and a
// fraction as a percentage (tolerance = 10%).
func SettingNumber(name, v string) (float64, bool) {
	switch name {
	case "scale_from", "scale_to":
		return ratioScale(v)
	case "tolerance", "robust_level":
		t := strings.TrimSpace(v)
		if !strings.HasSuffix(t, "%") {
			return 0, false
		}
		x, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimSuffix(t, "%")), 64)
		if err != nil || x != x || x < 0 || x > 100 {
			return 0, false
		}
		return x / 100, true
	}
	return 0, false
}
