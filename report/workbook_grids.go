package report

import (
	"context"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep"
)

// The workbook's grid sheets: a margin map per strategy and the
// requirement grid, with the facility fit read from it.

// mapSheetName is a valid, unique sheet name for a strategy's map (sheet
// names are at most 31 characters and may not hold []:*?/\).
func mapSheetName(i int, name string) string {
	clean := strings.Map(func(r rune) rune {
		if strings.ContainsRune(`[]:*?/\'`, r) {
			return '_'
		}
		return r
	}, name)
	prefix := fmt.Sprintf("Map %d ", i+1)
	return prefix + shortName(clean, 31-len(prefix))
}

// writeMap writes the margin of every combination of a strategy at every
// grid scale: scale down, combinations across, with a colour scale and the
// limit that gives each margin. Its rows are written into the archive
// when the workbook is saved (see rowsFunc), by part name in rows.
func writeMap(ctx context.Context, f *excelize.File, res *sweep.Result, sr *sweep.StrategyResult, i, bold int, bins []int, rows map[string]rowsFunc) error {
	grid := res.Plan.Grid
	header := []string{"scale (1:x)", "kL [-]"}
	widths := []float64{12, 10}
	for _, c := range sr.Combos {
		label := Candidate(c)
		if c.Case != "" {
			label = c.Case + ": " + label
		}
		header = append(header, "margin [decades] "+label, "limited by ("+label+")")
		widths = append(widths, 16, 26)
	}
	name := mapSheetName(i, sr.Name)
	step := 1
	if len(grid)+2 > MaxSheetRows {
		step = (len(grid) + MaxSheetRows - 3) / (MaxSheetRows - 3)
	}
	nrows := 1 + (len(grid)+step-1)/step
	if step > 1 {
		nrows++ // the note on thinning
	}
	s, err := newSheetSized(f, name, header, widths, bold, nrows, len(header))
	if err != nil {
		return err
	}
	// The texts of the limiting limits are made once per combination, not
	// once per cell.
	names := make([]limitNames, len(sr.Combos))
	for ci, c := range sr.Combos {
		names[ci] = newLimitNames(c)
	}
	// The number formats of the scales are styles, made now, in row order.
	kL := make([]rowCell, 0, nrows)
	for gi := 0; gi < len(grid); gi += step {
		c, err := s.sigRowCell(grid[gi])
		if err != nil {
			return err
		}
		kL = append(kL, c)
	}
	part, err := sheetPart(f, name)
	if err != nil {
		return err
	}
	rows[part] = func(w io.Writer) error {
		rw := newRowWriter(w, 2)
		row := make([]rowCell, 0, len(header))
		for gi := 0; gi < len(grid); gi += step {
			if gi/step%rowsPerCheck == 0 {
				if err := ctx.Err(); err != nil {
					return err
				}
			}
			row = append(row[:0], textCell(sweep.Scale(grid[gi])), kL[gi/step])
			for ci, c := range sr.Combos {
				if c.Margins == nil {
					row = append(row, textCell(""), textCell(c.Err))
					continue
				}
				m := c.Margins[gi]
				lim := textCell(names[ci].of(c.Limiting[gi], m < 0 && !math.IsInf(m, 0)))
				if math.IsInf(m, 0) {
					row = append(row, textCell(""), lim)
					continue
				}
				row = append(row, numCell(bins[marginBin(m)], math.Round(m*1000)/1000), lim)
			}
			if err := rw.add(row...); err != nil {
				return err
			}
		}
		if step > 1 {
			if err := rw.add(textCell(fmt.Sprintf("grid thinned to every %d-th point to fit the spreadsheet row limit", step))); err != nil {
				return err
			}
		}
		return rw.flush()
	}
	s.row = nrows
	return s.close(false)
}

// requirementLabel names a requirement column.
func requirementLabel(r sweep.Requirement) string {
	dir := "≥"
	if !r.AtLeast {
		dir = "≤"
	}
	u := r.Unit
	if u == "" {
		u = "1"
	}
	return fmt.Sprintf("%s %s needed (%s) [%s]", r.Capability, dir, r.Limit, u)
}

// writeRequirements writes the capability each combination needs at each
// scale: scale down, capabilities across. Its rows are written into the
// archive when the workbook is saved (see rowsFunc), by part name in rows.
func writeRequirements(f *excelize.File, res *sweep.Result, bold int, rows map[string]rowsFunc) error {
	var labels []string
	index := map[string]int{}
	for _, sr := range res.Strategies {
		for _, c := range sr.Combos {
			for _, r := range c.Requirements {
				l := requirementLabel(r)
				if _, ok := index[l]; !ok {
					index[l] = len(labels)
					labels = append(labels, l)
				}
			}
		}
	}
	header := append([]string{"strategy", "case", "candidate and facility", "scale (1:x)", "kL [-]"}, labels...)
	widths := []float64{22, 14, 34, 12, 10}
	for range labels {
		widths = append(widths, 22)
	}
	grid := res.Plan.Grid
	step := max(1, len(grid)/200)
	nrows := 1
	for _, sr := range res.Strategies {
		for _, c := range sr.Combos {
			if len(c.Requirements) > 0 {
				nrows += (len(grid) + step - 1) / step
			}
		}
	}
	s, err := newSheetSized(f, "Requirements", header, widths, bold, nrows, len(header))
	if err != nil {
		return err
	}
	// each calls add with every row. The first pass makes the number
	// formats' styles, in row order; the second, when the workbook is
	// saved, finds them made.
	each := func(add func([]rowCell) error) error {
		row := make([]rowCell, 0, len(header))
		vals := make([]float64, len(labels))
		for _, sr := range res.Strategies {
			for _, c := range sr.Combos {
				if len(c.Requirements) == 0 {
					continue
				}
				cols := make([]int, len(c.Requirements))
				for k, r := range c.Requirements {
					cols[k] = index[requirementLabel(r)]
				}
				for i := 0; i < len(grid); i += step {
					row = append(row[:0], textCell(sr.Name), textCell(c.Case), textCell(Candidate(c)), textCell(sweep.Scale(grid[i])))
					for k := range vals {
						vals[k] = math.NaN() // an empty cell
					}
					for k, r := range c.Requirements {
						vals[cols[k]] = r.At(i)
					}
					for _, x := range append([]float64{grid[i]}, vals...) {
						cell, err := s.sigRowCell(x)
						if err != nil {
							return err
						}
						row = append(row, cell)
					}
					if err := add(row); err != nil {
						return err
					}
				}
			}
		}
		return nil
	}
	if err := each(func([]rowCell) error { return nil }); err != nil {
		return err
	}
	part, err := sheetPart(f, "Requirements")
	if err != nil {
		return err
	}
	rows[part] = func(w io.Writer) error {
		rw := newRowWriter(w, 2)
		if err := each(func(row []rowCell) error { return rw.add(row...) }); err != nil {
			return err
		}
		return rw.flush()
	}
	s.row = nrows
	return s.close(true)
}

// FitLines describes, for a combination, what a facility would need to
// hold the largest model the other limits allow, and where the study's
// facility stops fitting.
func FitLines(res *sweep.Result, c *sweep.ComboResult) (need []string, stops []string) {
	grid := res.Plan.Grid
	if math.IsNaN(c.AnyFacility) {
		return nil, nil
	}
	i := nearest(grid, c.AnyFacility)
	for _, r := range c.Requirements {
		dir := "at least"
		if !r.AtLeast {
			dir = "at most"
		}
		v := r.At(i)
		if math.IsNaN(v) {
			continue
		}
		need = append(need, fmt.Sprintf("%s %s %s %s (has %s)", r.Capability, dir, Num3(v), r.Unit, Num3(r.Have)))
		for _, k := range r.FitEdges(grid) {
			stops = append(stops, fmt.Sprintf("%s (%s) at %s", r.Capability, r.Limit, sweep.Scale(k)))
		}
	}
	return need, stops
}

func nearest(grid []float64, k float64) int {
	best := 0
	for i, g := range grid {
		if math.Abs(math.Log(g/k)) < math.Abs(math.Log(grid[best]/k)) {
			best = i
		}
	}
	return best
}

// writeFit lists, per strategy and combination, the largest model any
// facility could take, the capabilities a facility needs for it, and the
// scales at which the study's facility stops fitting.
func writeFit(f *excelize.File, res *sweep.Result, bold int) error {
	header := []string{"strategy", "case", "candidate and facility", "largest model without facility limits (1:x)",
		"a facility would need", "the facility stops fitting at", "the facility's own window (1:x)"}
	s, err := newSheet(f, "Facility fit", header, []float64{22, 14, 34, 18, 70, 60, 22}, bold)
	if err != nil {
		return err
	}
	for _, sr := range res.Strategies {
		for _, c := range sr.Combos {
			if c.Facility == "" {
				continue
			}
			need, stops := FitLines(res, c)
			if err := s.add(sr.Name, c.Case, Candidate(c), sweep.Scale(c.AnyFacility), strings.Join(need, "; "),
				strings.Join(stops, "; "), WindowText(c.Window)); err != nil {
				return err
			}
		}
	}
	return s.close(true)
}
