package report

import (
	"bytes"
	"context"
	"fmt"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"sort"
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
	// formats maps a display format to its style (see sigCell).
	formats map[string]int
}

func newSheet(f *excelize.File, name string, header []string, widths []float64, bold int) (*sheetWriter, error) {
	if i, _ := f.GetSheetIndex(name); i < 0 {
		if _, err := f.NewSheet(name); err != nil {
			return nil, err
		}
	}
	if err := printSetup(f, name, len(header) > 0); err != nil {
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
		if x, ok := c.(sigNum); ok {
			v, err := s.sigCell(x)
			if err != nil {
				return err
			}
			cells[i] = v
		}
	}
	return s.sw.SetRow(cell, cells)
}

func (s *sheetWriter) close(filter bool) error {
	if filter && s.row > 1 && s.cols > 0 {
		// A table gives the header row its filter buttons; it is part of
		// the streamed sheet, so nothing is read back and rewritten.
		last, _ := excelize.CoordinatesToCellName(s.cols, s.row)
		off := false
		if err := s.sw.AddTable(&excelize.Table{Range: "A1:" + last, Name: tableName(s.name),
			StyleName: "TableStyleLight1", ShowRowStripes: &off}); err != nil {
			return err
		}
	}
	if err := printPages(s.f, s.name, s.row); err != nil {
		return err
	}
	return s.sw.Flush()
}

// tableName turns a sheet name into a valid, unique table name.
func tableName(sheet string) string {
	b := []rune("tbl_")
	for _, r := range sheet {
		if r == '_' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' {
			b = append(b, r)
		} else {
			b = append(b, '_')
		}
	}
	return string(b)
}

// WriteWorkbook writes the study workbook: a summary with the cautions
// and the best option of each strategy, the windows of every combination,
// and the scale laws with their prediction rules.
//
// Feasibility maps given as PNG files are embedded in a Maps sheet.
func WriteWorkbook(path string, res *sweep.Result, maps ...string) error {
	return WriteWorkbookContext(context.Background(), path, res, maps...)
}

// WriteWorkbookContext is WriteWorkbook that stops, writing nothing, when
// ctx is done: it checks between sheets and every rowsPerCheck rows of a
// map sheet.
func WriteWorkbookContext(ctx context.Context, path string, res *sweep.Result, maps ...string) error {
	return WriteFileAtomic(path, func(w io.Writer) error { return writeWorkbook(ctx, w, res, maps...) })
}

// rowsPerCheck is how many rows of a long sheet are written between two
// checks for an interrupt.
const rowsPerCheck = 1 << 14

func writeWorkbook(ctx context.Context, w io.Writer, res *sweep.Result, maps ...string) error {
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
	// The new file's first sheet becomes the summary, so no sheet has to
	// be deleted afterwards (which would re-read every streamed sheet).
	if err := f.SetSheetName("Sheet1", "Summary"); err != nil {
		return err
	}
	if err := writeSummary(f, res, bold, title); err != nil {
		return err
	}
	if err := writeWindows(f, res, bold); err != nil {
		return err
	}
	if err := writeTradeoffs(f, res, bold); err != nil {
		return err
	}
	if err := writeLaws(f, res, bold); err != nil {
		return err
	}
	bins, err := marginStyles(f)
	if err != nil {
		return err
	}
	rows := map[string]rowsFunc{}
	for i, sr := range res.Strategies {
		if err := writeMap(ctx, f, res, sr, i, bold, bins, rows); err != nil {
			return err
		}
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	if err := writeLimits(f, res, bold); err != nil {
		return err
	}
	if err := writeRequirements(f, res, bold, rows); err != nil {
		return err
	}
	if err := writeFit(f, res, bold); err != nil {
		return err
	}
	if err := writeMaps(f, maps, title); err != nil {
		return err
	}
	if err := writeInputs(f, res, bold); err != nil {
		return err
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	// The archive is written straight to w, parts compressed once, in name
	// order (see xlsxZip).
	f.SetZipWriter(func(io.Writer) excelize.ZipWriter { return &xlsxZip{w: w, rows: rows} })
	return f.Write(io.Discard)
}

var defaultType = regexp.MustCompile(`<Default [^>]*>(</Default>)?`)

// sortDefaults sorts the contiguous Default entries of a content-types
// part: the spreadsheet library lists image types in map order.
func sortDefaults(b []byte) []byte {
	locs := defaultType.FindAllIndex(b, -1)
	if len(locs) > 1 {
		parts := make([]string, len(locs))
		contiguous := true
		for i, l := range locs {
			parts[i] = string(b[l[0]:l[1]])
			if i > 0 && l[0] != locs[i-1][1] {
				contiguous = false
			}
		}
		if contiguous {
			sort.Strings(parts)
			var out []byte
			out = append(out, b[:locs[0][0]]...)
			out = append(out, strings.Join(parts, "")...)
			out = append(out, b[locs[len(locs)-1][1]:]...)
			b = out
		}
	}
	return b
}

// zipOrder keeps the content-types part first, as spreadsheet programs
// expect, and sorts the rest by name.
func zipOrder(name string) string {
	if name == "[Content_Types].xml" {
		return ""
	}
	return name
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
		excelize.Cell{StyleID: bold, Value: "best candidate / reason"},
		excelize.Cell{StyleID: bold, Value: fmt.Sprintf("robust window, P ≥ %.0f %% (1:x)", 100*st.RobustLevel)},
		excelize.Cell{StyleID: bold, Value: "map sheet"},
		excelize.Cell{StyleID: bold, Value: "rank"}, excelize.Cell{StyleID: bold, Value: "why it ranks there"},
		excelize.Cell{StyleID: bold, Value: "assumptions"}})
	for i, sr := range res.Strategies {
		c := sr.Best
		rank, why := rankText(res, sr), ""
		if e := res.RankOf(sr.Name); e != nil {
			why = e.Reason
		}
		if c == nil {
			rows = append(rows, []any{sr.Name, sr.Technique, "none", "", "", "", "", "", firstFailing(sr), "", mapSheetName(i, sr.Name), rank, why})
			continue
		}
		large, small := Edges(c.Window)
		rows = append(rows, []any{sr.Name, sr.Technique, WindowText(c.Window), large, small, sweep.Scale(c.Recommended),
			sig(c.ModelLength), money(c.Cost), Candidate(c), RobustText(c), mapSheetName(i, sr.Name), rank, why, strings.Join(AssumptionLines(res, sr), "; ")})
	}
	// The map sheet names link to their sheets.
	first := len(rows) - len(res.Strategies) + 1
	for i, sr := range res.Strategies {
		if err := sheetLink(f, "Summary", 11, first+i, mapSheetName(i, sr.Name)); err != nil {
			return err
		}
	}
	rows = append(rows, summaryVerdicts(res, bold)...)
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

// sig is a number stored at full precision and shown to four significant
// figures; NaN and infinities leave the cell empty.
func sig(x float64) any {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return ""
	}
	return sigNum(x)
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
		"cheapest kL [-]", "required and measured at recommended scale (model values, SI unless stated)", "relaxed groups π_p/π_m", "notes", "robust window (1:x)", "robust: input that matters most"}
	widths := []float64{22, 16, 14, 16, 16, 18, 12, 22, 11, 11, 26, 26, 14, 12, 12, 12, 12, 40, 40, 60}
	recipeQs := recipeQuantities(res)
	for _, q := range recipeQs {
		header = append(header, "recipe per scale band: "+q)
	}
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
					q += " (library: " + matchList(pv.Quantity, pv.Matches) + ")"
				} else if c.Technique == "substitute" {
					q += " (no library entry meets it)"
				}
				req = append(req, q)
			}
			for _, m := range c.Measures {
				req = append(req, fmt.Sprintf("%s %s %s", m.Name, Num3(m.AtRecommended), m.Unit))
			}
			if !math.IsNaN(c.AddedMass) {
				req = append(req, fmt.Sprintf("added mass %s kg (%s kg/m^3)", Num3(c.AddedMass), Num3(c.AddedDensity)))
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
			cells := []any{c.Strategy, c.Case, c.Technique, c.Medium, c.Material, c.Facility, sig(c.Axis),
				WindowText(c.Window), sig(lo), sig(hi), large, small, sweep.Scale(c.Recommended), sig(c.Recommended),
				sig(c.ModelLength), money(c.Cost), sig(c.Cheapest), strings.Join(req, "; "), strings.Join(mm, "; "),
				strings.Join(notes, "; "), RobustText(c), robustInput(c)}
			for _, q := range recipeQs {
				cells = append(cells, recipeCell(c, q))
			}
			if err := s.add(cells...); err != nil {
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
			values, _ := sr.CaseFactors(c, sr.Best)
			for _, l := range sol.Laws {
				if l.Status.String() == "unset" {
					continue
				}
				k := math.NaN()
				if v, ok := values[l.Quantity]; ok {
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

// MaxSheetRows is the row limit of a spreadsheet; map sheets are thinned to
// stay under it.
const MaxSheetRows = 1048576

// writeLimits lists the limits applied to each strategy's combinations,
// with their sources.
func writeLimits(f *excelize.File, res *sweep.Result, bold int) error {
	header := []string{"strategy", "facility", "limit", "expression", "source", "edge found", "margin at recommended scale [decades]"}
	s, err := newSheet(f, "Limits", header, []float64{22, 18, 26, 60, 60, 14, 18}, bold)
	if err != nil {
		return err
	}
	for _, sr := range res.Strategies {
		seen := map[string]bool{}
		for _, c := range sr.Combos {
			for _, l := range c.Limits {
				key := c.Facility + "\x00" + l.Name
				if seen[key] {
					continue
				}
				seen[key] = true
				how := "by bisection (0.1 %)"
				if l.Linear {
					how = "exactly"
				}
				if err := s.add(sr.Name, c.Facility, l.Name, l.Expression, l.Source, how, sig(l.MarginAt(c.Recommended))); err != nil {
					return err
				}
			}
		}
	}
	return s.close(true)
}

// writeMaps embeds the PNG feasibility maps, one below the other.
func writeMaps(f *excelize.File, maps []string, title int) error {
	var pngs []string
	for _, m := range maps {
		if strings.HasSuffix(strings.ToLower(m), ".png") {
			pngs = append(pngs, m)
		}
	}
	if len(pngs) == 0 {
		return nil
	}
	const sheet = "Maps"
	if _, err := f.NewSheet(sheet); err != nil {
		return err
	}
	if err := f.SetCellValue(sheet, "A1", "Feasibility maps (scale 1:x, k = prototype/model; colour: margin in decades, blue feasible, orange infeasible)"); err != nil {
		return err
	}
	if err := f.SetCellStyle(sheet, "A1", "A1", title); err != nil {
		return err
	}
	row := 3
	for _, path := range pngs {
		b, err := os.ReadFile(path)
		if err != nil {
			return err
		}
		cfg, err := png.DecodeConfig(bytes.NewReader(b))
		if err != nil {
			return fmt.Errorf("map %s: %v", path, err)
		}
		cell, _ := excelize.CoordinatesToCellName(1, row)
		if err := f.SetCellValue(sheet, cell, filepath.Base(path)); err != nil {
			return err
		}
		cell, _ = excelize.CoordinatesToCellName(1, row+1)
		scale := 0.6
		if err := f.AddPictureFromBytes(sheet, cell, &excelize.Picture{Extension: ".png", File: b,
			Format: &excelize.GraphicOptions{ScaleX: scale, ScaleY: scale, AltText: filepath.Base(path)}}); err != nil {
			return err
		}
		row += 3 + int(float64(cfg.Height)*scale/20)
	}
	return nil
}

// RobustText prints a combination's robust window, or "" without
// uncertain inputs.
func RobustText(c *sweep.ComboResult) string {
	if c == nil || c.Robust == nil {
		return ""
	}
	return WindowText(c.Robust.Window)
}

func robustInput(c *sweep.ComboResult) string {
	if c.Robust == nil || len(c.Robust.Sensitivity) == 0 {
		return ""
	}
	g := c.Robust.Sensitivity[0]
	return fmt.Sprintf("%s (knowing it exactly widens the window by %.2f decades)", g.Input, g.Gain)
}
