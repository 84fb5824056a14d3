package study

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// cellKind is what a workbook cell's number format says its number is.
type cellKind int

const (
	kindNumber   cellKind = iota // a plain number (General, 0.00, a currency, text "@", …)
	kindDate                     // a calendar date, perhaps with a time of day
	kindTime                     // a time of day to the minute (h:mm)
	kindPercent                  // a percentage: the stored value is the fraction
	kindDuration                 // a time with seconds or an elapsed time (h:mm:ss, mm:ss, [h]:mm)
	kindUnknown                  // the style could not be read
	maxCellKinds                 // bound of the kinds (for caches)
)

// numFmtKind classifies a number format code the way a spreadsheet program
// shows the number: a code with a year or day field (y, d, or m beside
// them) is a date, one with an hour or second field is a time, [h] an
// elapsed duration, a % a percentage. Quoted text ("kg"), escaped
// characters (\m), colours and locales in brackets ([Red], [$-409]) and
// AM/PM markers are not fields. Only the first section (positive numbers)
// counts.
func numFmtKind(code string) cellKind {
	code = strings.ToLower(code)
	if code == "" || code == "general" || code == "@" {
		return kindNumber
	}
	var b strings.Builder
	elapsed := false
	for i := 0; i < len(code); i++ {
		c := code[i]
		switch c {
		case '"':
			j := strings.IndexByte(code[i+1:], '"')
			if j < 0 {
				i = len(code)
			} else {
				i += j + 1
			}
		case '\\', '_', '*':
			i++ // the next character is literal, or padding
		case '[':
			j := strings.IndexByte(code[i:], ']')
			if j < 0 {
				i = len(code)
				continue
			}
			in := code[i+1 : i+j]
			if in != "" && strings.Trim(in, "hms") == "" {
				elapsed = true
				b.WriteString(in)
			}
			i += j
		case ';':
			i = len(code) // first section only
		default:
			b.WriteByte(c)
		}
	}
	f := strings.NewReplacer("am/pm", "", "a/p", "").Replace(b.String())
	switch {
	case strings.ContainsAny(f, "yd") || strings.Contains(f, "e") && !strings.ContainsAny(f, "0#?"):
		// e is the year of some East Asian date formats (not the exponent
		// of 0.00e+00, which comes with digit placeholders).
		return kindDate
	case elapsed || strings.Contains(f, "s"):
		return kindDuration
	case strings.Contains(f, "h"):
		return kindTime
	case strings.Contains(f, "m"):
		return kindDate // a month on its own (mmm-yy handled above)
	case strings.Contains(f, "%"):
		return kindPercent
	}
	return kindNumber
}

// styleKind returns the kind of a cell style of a workbook.
func styleKind(f *excelize.File, idx int) cellKind {
	st, err := f.GetStyle(idx)
	if err != nil || st == nil {
		return kindUnknown
	}
	if st.CustomNumFmt != nil {
		return numFmtKind(*st.CustomNumFmt)
	}
	id := st.NumFmt
	// Built-in formats of East Asian and Thai locales are dates
	// (ECMA-376 Part 1, §18.8.30, and excelize's table of them).
	if 27 <= id && id <= 36 || 50 <= id && id <= 62 || 67 <= id && id <= 81 {
		return kindDate
	}
	code, ok := builtinFormats[id]
	if !ok {
		return kindNumber
	}
	return numFmtKind(code)
}

// builtinFormats are the built-in number formats of ECMA-376 Part 1,
// §18.8.30, that are not plain numbers.
var builtinFormats = map[int]string{
	9: "0%", 10: "0.00%",
	14: "mm-dd-yy", 15: "d-mmm-yy", 16: "d-mmm", 17: "mmm-yy",
	18: "h:mm AM/PM", 19: "h:mm:ss AM/PM", 20: "h:mm", 21: "h:mm:ss", 22: "m/d/yy h:mm",
	45: "mm:ss", 46: "[h]:mm:ss", 47: "mm:ss.0",
	49: "@",
}

// cellKinds collects, while a worksheet is scanned, the numeric cells
// whose style makes them a date, a time, a duration or a percentage (kind
// gives a style's kind). Other cells are not listed.
type cellKinds struct {
	kind func(int) cellKind
	at   map[place]cellKind
}

// note looks at a cell's type (t) and style (s) attributes.
func (k *cellKinds) note(at place, typ, style string) {
	if k == nil || style == "" || style == "0" || (typ != "" && typ != "n" && typ != "d") {
		return
	}
	idx, err := strconv.Atoi(style)
	if err != nil {
		return
	}
	if c := k.kind(idx); c != kindNumber {
		k.at[at] = c
	}
}

// cellText turns a raw cell value into the text a person typed, by the
// kind of its number format: a date becomes 2026-12-02 (with the time of
// day when it has one), a time of day or a duration h:mm or h:mm:ss (hours
// counted on past a day). A percentage keeps its stored value (0.1 for a
// cell showing 10 %). Values that are not numbers are kept as they are.
func cellText(raw string, k cellKind, date1904 bool) string {
	v, err := strconv.ParseFloat(strings.TrimSpace(raw), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return raw
	}
	switch k {
	case kindDate:
		if v < 0 || v > 2958465 { // beyond 9999-12-31: not a date
			return raw
		}
		t, err := excelize.ExcelDateToTime(v, date1904)
		if err != nil {
			return raw
		}
		t = t.Round(1e9)
		if t.Hour() == 0 && t.Minute() == 0 && t.Second() == 0 {
			return t.Format("2006-01-02")
		}
		return t.Format("2006-01-02 15:04:05")
	case kindTime, kindDuration:
		if v < 0 || v > 1e6 {
			return raw
		}
		secs := int64(math.Round(v * 86400))
		h, m, s := secs/3600, secs/60%60, secs%60
		if s == 0 && k == kindTime {
			return fmt.Sprintf("%d:%02d", h, m)
		}
		return fmt.Sprintf("%d:%02d:%02d", h, m, s)
	}
	return raw
}

// styleKinds returns the kind of each style of a workbook, read once.
func styleKinds(f *excelize.File) func(int) cellKind {
	cache := map[int]cellKind{}
	return func(idx int) cellKind {
		k, ok := cache[idx]
		if !ok {
			k = styleKind(f, idx)
			cache[idx] = k
		}
		return k
	}
}

// date1904 reports whether a workbook counts dates from 1904.
func date1904(f *excelize.File) bool {
	p, err := f.GetWorkbookProps()
	return err == nil && p.Date1904 != nil && *p.Date1904
}

// typedCells rewrites the raw values of row n by their cells' kinds.
func typedCells(cells []string, n int, kinds map[place]cellKind, use1904 bool) {
	if len(kinds) == 0 {
		return
	}
	for i := range cells {
		if k, ok := kinds[place{n, i + 1}]; ok {
			cells[i] = cellText(cells[i], k, use1904)
		}
	}
}
