package report

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"

	"scaleplan/feasibility"
	"scaleplan/sweep"
)

// fixedTime makes workbooks byte-identical from run to run.
const fixedTime = "2000-01-01T00:00:00Z"

// sheetWriter streams one sheet with a bold, frozen header row, filters
// and fitted column widths.
type sheetWriter struct {
	f      *excelize.File
	sw     *excelize.StreamWriter
	row    int
	widths []float64
	bold   int
	name   string
	cols   int
}

func newSheet(f *excelize.File, name string, header []string, widths []float64, bold int) (*sheetWriter, error) {
	if _, err := f.NewSheet(name); err != nil {
		return nil, err
	}
	sw, err := f.NewStreamWriter(name)
	if err != nil {
		return nil, err
	}
	s := &sheetWriter{f: f, sw: sw, widths: widths, bold: bold, name: name, cols: len(header)}
	for i, w := range widths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return nil, err
		}
	}
	if len(header) > 0 {
		if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
			return nil, err
		}
		cells := make([]any, len(header))
		for i, h := range header {
			cells[i] = excelize.Cell{StyleID: bold, Value: h}
		}
		if err := s.add(cells...); err != nil {
			return nil, err
		}
	}
	return s, nil
}

// add writes a row. Strings are always written as text, never as
// formulas, whatever they begin with.
func (s *sheetWriter) add(cells ...any) error {
	s.row++
	cell, _ := excelize.CoordinatesToCellName(1, s.row)
	for i, c := range cells {
		if f, ok := c.(float64); ok && (math.IsNaN(f) || math.IsInf(f, 0)) {
			cells[i] = ""
		}
	}
	return s.sw.SetRow(cell, cells)
}

func (s *sheetWriter) close(filter bool) error {
	if err := s.sw.Flush(); err != nil {
		return err
	}
	if filter && s.row > 1 && s.cols > 0 {
		last, _ := excelize.CoordinatesToCellName(s.cols, s.row)
		if err := s.f.AutoFilter(s.name, "A1:"+last, nil); err != nil {
			return err
		}
	}
	return nil
}

// WriteWorkbook writes the study workbook: a summary with the cautions
// and the best option of each strategy, the windows of every combination,
// and the scale laws with their prediction rules.
func WriteWorkbook(path string, res *sweep.Result) error {
	return WriteFileAtomic(path, func(w io.Writer) error { return writeWorkbook(w, res) })
}

func writeWorkbook(w io.Writer, res *sweep.Result) error {
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetDocProps(&excelize.DocProperties{Creator: "scaleplan", LastModifiedBy: "scaleplan",
		Created: fixedTime, Modified: fixedTime, Title: res.Name, Description: "scaleplan study results"}); err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"DCE6F0"}}})
	if err != nil {
		return err
	}
	title, _ := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Size: 14}})
	if err := writeSummary(f, res, bold, title); err != nil {
		return err
	}
	if err := writeWindows(f, res, bold); err != nil {
		return err
	}
	if err := writeLaws(f, res, bold); err != nil {
		return err
	}
	if err := f.DeleteSheet("Sheet1"); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	return f.Write(w)
}

func writeSummary(f *excelize.File, res *sweep.Result, bold, title int) error {
	st := res.Plan.Settings
	s, err := newSheet(f, "Summary", nil, []float64{26, 16, 20, 30, 30, 14, 16, 16, 40}, bold)
	if err != nil {
		return err
	}
	rows := [][]any{
		{excelize.Cell{StyleID: title, Value: "Study: " + res.Name}},
		{"Purpose", st.Purpose},
		{"Inputs dated", orDash(st.InputsDate)},
		{"Scale convention", Convention},
		{"Sweep", fmt.Sprintf("%s to %s, %d points", sweep.Scale(st.ScaleFrom), sweep.Scale(st.ScaleTo), st.Points)},
		{},
		{excelize.Cell{StyleID: bold, Value: "Cautions"}},
	}
	for _, c := range Cautions {
		rows = append(rows, []any{"", c})
	}
	rows = append(rows, []any{}, []any{
		excelize.Cell{StyleID: bold, Value: "strategy"}, excelize.Cell{StyleID: bold, Value: "technique"},
		excelize.Cell{StyleID: bold, Value: "window (1:x)"}, excelize.Cell{StyleID: bold, Value: "large-model edge set by"},
		excelize.Cell{StyleID: bold, Value: "small-model edge set by"}, excelize.Cell{StyleID: bold, Value: "recommended (1:x)"},
		excelize.Cell{StyleID: bold, Value: "model length [m]"}, excelize.Cell{StyleID: bold, Value: "cost [" + st.Currency + "]"},
		excelize.Cell{StyleID: bold, Value: "best candidate / reason"}})
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			rows = append(rows, []any{sr.Name, sr.Technique, "none", "", "", "", "", "", firstFailing(sr)})
			continue
		}
		large, small := Edges(c.Window)
		rows = append(rows, []any{sr.Name, sr.Technique, WindowText(c.Window), large, small, sweep.Scale(c.Recommended),
			sig(c.ModelLength), money(c.Cost), Candidate(c)})
	}
	for _, r := range rows {
		if err := s.add(r...); err != nil {
			return err
		}
	}
	return s.close(false)
}

func orDash(s string) string {
	if s == "" {
		return "-"
	}
	return s
}

// sig rounds to four significant figures for display cells.
func sig(x float64) any {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return ""
	}
	if x == 0 {
		return 0.0
	}
	d := math.Pow(10, 3-math.Floor(math.Log10(math.Abs(x))))
	return math.Round(x*d) / d
}

func money(x float64) any {
	if math.IsNaN(x) {
		return ""
	}
	return math.Round(x)
}

func writeWindows(f *excelize.File, res *sweep.Result, bold int) error {
	header := []string{"strategy", "case", "technique", "medium", "material", "facility", "axis value [SI]",
		"window (1:x)", "from kL [-]", "to kL [-]", "large-model edge set by", "small-model edge set by",
		"recommended (1:x)", "recommended kL [-]", "model length [m]", "cost [" + res.Plan.Settings.Currency + "]",
		"cheapest kL [-]", "required at recommended scale", "relaxed groups π_p/π_m", "notes"}
	widths := []float64{22, 16, 14, 16, 16, 18, 12, 22, 11, 11, 26, 26, 14, 12, 12, 12, 12, 40, 40, 60}
	s, err := newSheet(f, "Windows", header, widths, bold)
	if err != nil {
		return err
	}
	for _, sr := range res.Strategies {
		all := append(append([]*sweep.ComboResult(nil), sr.Combos...), sr.Joint...)
		for _, c := range all {
			lo, hi := math.NaN(), math.NaN()
			if !c.Window.Empty() {
				lo, hi = c.Window[0].Lo, c.Window[len(c.Window)-1].Hi
			}
			large, small := Edges(c.Window)
			var req []string
			for _, pv := range c.Required {
				q := fmt.Sprintf("%s %s", pv.Quantity, Num3(pv.AtRecommended))
				if len(pv.Matches) > 0 {
					q += " (library: " + strings.Join(pv.Matches, ", ") + ")"
				} else if c.Technique == "substitute" {
					q += " (no library entry meets it)"
				}
				req = append(req, q)
			}
			var mm []string
			for _, m := range c.Mismatches {
				mm = append(mm, fmt.Sprintf("%s %s", m.Group, Num3(m.Ratio)))
			}
			notes := append([]string(nil), c.Notes...)
			if c.Failing != "" {
				notes = append([]string{c.Failing}, notes...)
			}
			if c.Err != "" {
				notes = append([]string{c.Err}, notes...)
			}
			if c.Friction != nil {
				notes = append(notes, fmt.Sprintf("ITTC-1957: C_F model %.4g, ship %.4g, ΔC_F %.4g", c.Friction.CFModel, c.Friction.CFProto, c.Friction.Delta))
			}
			if err := s.add(c.Strategy, c.Case, c.Technique, c.Medium, c.Material, c.Facility, sig(c.Axis),
				WindowText(c.Window), sig(lo), sig(hi), large, small, sweep.Scale(c.Recommended), sig(c.Recommended),
				sig(c.ModelLength), money(c.Cost), sig(c.Cheapest), strings.Join(req, "; "), strings.Join(mm, "; "),
				strings.Join(notes, "; ")); err != nil {
				return err
			}
		}
	}
	return s.close(true)
}

func writeLaws(f *excelize.File, res *sweep.Result, bold int) error {
	header := []string{"strategy", "case", "quantity", "unit [SI]", "scale law k = prototype/model", "k at recommended scale [-]", "prediction rule: prototype = model ×"}
	s, err := newSheet(f, "Scale laws", header, []float64{22, 16, 20, 10, 50, 18, 26}, bold)
	if err != nil {
		return err
	}
	for _, sr := range res.Strategies {
		for _, c := range sr.Cases {
			sol := c.Solution
			var values map[string]float64
			if b := sr.Best; b != nil && !math.IsNaN(b.Recommended) {
				values = b.Factors
			}
			for _, l := range sol.Laws {
				if l.Status.String() == "unset" {
					continue
				}
				k := math.NaN()
				if v, ok := values[l.Quantity]; ok && (sr.Best.Case == c.Case || len(sr.Cases) == 1) {
					k = v
				}
				if err := s.add(sr.Name, c.Case, l.Quantity, unitOf(l.Quantity), sol.LawString(l.Quantity), sig(k), sig(k)); err != nil {
					return err
				}
			}
		}
	}
	return s.close(true)
}

func unitOf(q string) string {
	for _, qq := range feasibility.Quantities() {
		if qq.Name == q {
			return qq.SI
		}
	}
	return ""
}
