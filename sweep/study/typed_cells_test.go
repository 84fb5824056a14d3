package study

import "testing"

// The tests of this file read inputs as people type them: workbook cells
// by their number format, scales written 1:25, percentages, units in a
// header, decimal commas, and names with odd white space.

// TestNumFmtKind classifies number format codes. The expected kinds
// follow the format codes of ECMA-376 Part 1, §18.8.31 (numFmts): y, d and
// m beside them are date fields, h and s time fields, [h] an elapsed time,
// quoted text and escaped characters are literal, % a percentage.
func TestNumFmtKind(t *testing.T) {
	tests := []struct {
		code string
		want cellKind
	}{
		{"General", kindNumber},
		{"0.00", kindNumber},
		{"#,##0.00 \"€\"", kindNumber},
		{"0.00E+00", kindNumber},
		{"@", kindNumber},
		{"0%", kindPercent},
		{"0.0%", kindPercent},
		{"h:mm", kindTime},
		{"h:mm AM/PM", kindTime},
		{"h:mm:ss", kindDuration},
		{"mm:ss", kindDuration},
		{"[h]:mm:ss", kindDuration},
		{"[h]:mm", kindDuration},
		{"yyyy-mm-dd", kindDate},
		{"d-mmm-yy", kindDate},
		{"mmm-yy", kindDate},
		{"m/d/yy h:mm", kindDate},
		{"[$-409]dddd, mmmm dd, yyyy", kindDate},
		{"0.00 \"days\"", kindNumber}, // d inside quotes is text
		{"0\\h", kindNumber},          // an escaped h is text
		{"[Red]0.00;[Blue]-0.00", kindNumber},
		{"0.00;\"h\"", kindNumber}, // only the first section counts
	}
	for _, tt := range tests {
		if got := numFmtKind(tt.code); got != tt.want {
			t.Errorf("numFmtKind(%q) = %v, want %v", tt.code, got, tt.want)
		}
	}
}

// TestCellText turns stored serial numbers back into what was typed. A
// spreadsheet stores a time as a fraction of a day and a date as days
// since 1899-12-30 (ECMA-376 Part 1, §18.17.4.1): 1:25 is 85/1440 of a
// day; 2026-11-30 is day 46356 (45658 is 2025-01-01, plus 365 days of
// 2025 and 333 days of 2026).
func TestCellText(t *testing.T) {
	tests := []struct {
		raw  string
		kind cellKind
		want string
	}{
		{"0.059027777777777776", kindTime, "1:25"},
		{"0.0006944444444444445", kindDuration, "0:01:00"},
		{"0.0006944444444444445", kindTime, "0:01"},
		{"1.5", kindDuration, "36:00:00"}, // [h]:mm:ss counts hours on
		{"46356", kindDate, "2026-11-30"},
		{"45658", kindDate, "2025-01-01"},
		{"46356.5", kindDate, "2026-11-30 12:00:00"},
		{"0.1", kindPercent, "0.1"},
		{"text", kindDate, "text"},
		{"-3", kindDate, "-3"},
	}
	for _, tt := range tests {
		if got := cellText(tt.raw, tt.kind, false); got != tt.want {
			t.Errorf("cellText(%q, %v) = %q, want %q", tt.raw, tt.kind, got, tt.want)
		}
	}
}
