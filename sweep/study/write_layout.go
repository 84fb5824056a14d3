package study

import (
	"math"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// instrCharsPerLine is about how many characters of the default font fit
// on one line of the Instructions column (110 characters wide).
const instrCharsPerLine = 100

// finishLayout gives every sheet of a template its true dimension (a
// reader in read-only mode trusts it), the Instructions sheet row heights
// for its wrapped lines, and every sheet a print setup: A4 landscape,
// fitted to the page width, the header row repeated on each page.
func finishLayout(f *excelize.File) error {
	for _, sheet := range f.GetSheetList() {
		rows, err := f.GetRows(sheet)
		if err != nil {
			return err
		}
		cols := 1
		for _, r := range rows {
			cols = max(cols, len(r))
		}
		if len(rows) > 0 {
			last, err := excelize.CoordinatesToCellName(cols, len(rows))
			if err != nil {
				return err
			}
			if err := f.SetSheetDimension(sheet, "A1:"+last); err != nil {
				return err
			}
		}
		if sheet == instrSheet {
			for i, r := range rows {
				if len(r) == 0 {
					continue
				}
				lines := math.Ceil(float64(utf8.RuneCountInString(r[0])) / instrCharsPerLine)
				if lines > 1 {
					if err := f.SetRowHeight(sheet, i+1, 15*lines); err != nil {
						return err
					}
				}
			}
		}
		fit := true
		if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
			return err
		}
		landscape, a4, wide, tall := "landscape", 9, 1, 0
		if err := f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Size: &a4, Orientation: &landscape, FitToWidth: &wide, FitToHeight: &tall}); err != nil {
			return err
		}
		if sheet != instrSheet && len(rows) > 1 {
			if err := f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", Scope: sheet, RefersTo: "'" + sheet + "'!$1:$1"}); err != nil {
				return err
			}
		}
	}
	return nil
}
