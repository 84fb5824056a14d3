package report

import (
	"github.com/xuri/excelize/v2"

	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// writeInputs echoes every sheet of the study as it was read, sheet by
// sheet of the study's layout (study.Sheets): a bold line naming the sheet
// and its columns, then its rows (the note column, which a study does not
// keep, empty), then a blank line.
func writeInputs(f *excelize.File, res *sweep.Result, bold int) error {
	s, err := newSheet(f, "Inputs", nil, []float64{18, 22, 22, 22, 22, 22, 22, 22, 22, 22, 22, 22, 22, 22}, bold)
	if err != nil {
		return err
	}
	for _, sh := range study.Sheets {
		head := []any{excelize.Cell{StyleID: bold, Value: "sheet " + sh.Name}}
		for _, c := range sh.Names() {
			head = append(head, excelize.Cell{StyleID: bold, Value: c})
		}
		if err := s.add(head...); err != nil {
			return err
		}
		for _, r := range sh.Rows(res.Plan.Study) {
			cells := []any{""}
			for _, v := range r.Cells {
				cells = append(cells, v)
			}
			if err := s.add(cells...); err != nil {
				return err
			}
		}
		if err := s.add(); err != nil {
			return err
		}
	}
	return s.close(false)
}
