package report_test

import (
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/materials"
	"scaleplan/sweep"
)

// Helpers shared by the workbook and memo tests. Their names start with
// wb so that they do not clash with the helpers of other test files of
// the package.

// wbScenarios lists the built-in scenarios; every test that takes "every
// demo study" iterates over it.
func wbScenarios(t *testing.T) []sweep.Scenario {
	t.Helper()
	list, err := sweep.Scenarios()
	if err != nil {
		t.Fatalf("sweep.Scenarios: %v", err)
	}
	if len(list) == 0 {
		t.Fatal("sweep.Scenarios lists no built-in scenario")
	}
	return list
}

// wbLoad reads a built-in scenario.
func wbLoad(t *testing.T, name string) *sweep.Study {
	t.Helper()
	s, err := sweep.LoadScenario(name)
	if err != nil {
		t.Fatalf("LoadScenario(%q): %v", name, err)
	}
	return s
}

// wbRun prepares a study with a fresh library and facility catalogue and
// runs it.
func wbRun(t *testing.T, s *sweep.Study) *sweep.Result {
	t.Helper()
	res, err := wbRunE(s)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// wbRunE is wbRun returning its error.
func wbRunE(s *sweep.Study) (*sweep.Result, error) {
	lib, err := materials.Default()
	if err != nil {
		return nil, fmt.Errorf("materials.Default: %v", err)
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		return nil, fmt.Errorf("sweep.NewFacilityCatalog: %v", err)
	}
	plan, err := sweep.Prepare(s, lib, cat)
	if err != nil {
		return nil, fmt.Errorf("Prepare(%s): %v", s.Name, err)
	}
	res, err := plan.Run(context.Background())
	if err != nil {
		return nil, fmt.Errorf("Run(%s): %v", s.Name, err)
	}
	return res, nil
}

// wbRunScenarioE loads and runs a built-in scenario, returning the error.
func wbRunScenarioE(name string) (*sweep.Result, error) {
	s, err := sweep.LoadScenario(name)
	if err != nil {
		return nil, fmt.Errorf("LoadScenario(%q): %v", name, err)
	}
	return wbRunE(s)
}

// wbRunScenario loads and runs a built-in scenario.
func wbRunScenario(t *testing.T, name string) *sweep.Result {
	t.Helper()
	return wbRun(t, wbLoad(t, name))
}

// wbOpen opens a workbook with excelize and closes it at the end of the
// test.
func wbOpen(t *testing.T, path string) *excelize.File {
	t.Helper()
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatalf("excelize.OpenFile(%s): %v", path, err)
	}
	t.Cleanup(func() { f.Close() })
	return f
}

// wbRows reads every row of a sheet with raw cell values (numbers as
// stored, not as formatted).
func wbRows(t *testing.T, f *excelize.File, sheet string) [][]string {
	t.Helper()
	rows, err := f.GetRows(sheet, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatalf("GetRows(%q): %v", sheet, err)
	}
	return rows
}

// wbAt returns cell i of a row, "" past its end (excelize trims trailing
// empty cells).
func wbAt(row []string, i int) string {
	if i < 0 || i >= len(row) {
		return ""
	}
	return row[i]
}

// wbColumns maps header prefixes to column indexes; a prefix that matches
// no header cell fails the test.
func wbColumns(t *testing.T, sheet string, header []string, prefixes ...string) map[string]int {
	t.Helper()
	cols := map[string]int{}
	for _, p := range prefixes {
		found := -1
		for i, h := range header {
			if strings.HasPrefix(h, p) {
				found = i
				break
			}
		}
		if found < 0 {
			t.Fatalf("%s: no column headed %q in %q", sheet, p, header)
		}
		cols[p] = found
	}
	return cols
}

// wbCheckSig checks that a cell holds x at full precision (the workbook
// stores values unrounded and shows them to four significant figures with
// a display format). A NaN or infinite x must leave the cell empty.
func wbCheckSig(t *testing.T, where, cell string, x float64) {
	t.Helper()
	if math.IsNaN(x) || math.IsInf(x, 0) {
		if cell != "" {
			t.Errorf("%s: got %q, want an empty cell (value %v)", where, cell, x)
		}
		return
	}
	v, err := strconv.ParseFloat(cell, 64)
	if err != nil {
		t.Errorf("%s: got %q, want the number %v", where, cell, x)
		return
	}
	if math.Abs(v-x) > 1e-14*math.Abs(x) {
		t.Errorf("%s: got %v, want %v at full precision", where, v, x)
	}
}

// wbCheckMoney checks that a cost cell holds the cost rounded to a whole
// currency unit, or is empty without a cost.
func wbCheckMoney(t *testing.T, where, cell string, x float64) {
	t.Helper()
	if math.IsNaN(x) {
		if cell != "" {
			t.Errorf("%s: got %q, want an empty cell (no cost)", where, cell)
		}
		return
	}
	v, err := strconv.ParseFloat(cell, 64)
	if err != nil || v != math.Round(x) {
		t.Errorf("%s: got %q, want %v (cost %v rounded)", where, cell, math.Round(x), x)
	}
}

// wbCombos lists a strategy's combinations in the order of the Windows
// sheet: every case × candidate × facility, then the joint windows.
func wbCombos(sr *sweep.StrategyResult) []*sweep.ComboResult {
	return append(append([]*sweep.ComboResult(nil), sr.Combos...), sr.Joint...)
}

// wbRecommended picks the recommended strategy by the rule of the spec
// (§8): the best option that allows the largest model (smallest kL), or
// the cheapest when the study asks for it; the first strategy wins a tie.
func wbRecommended(res *sweep.Result) *sweep.StrategyResult {
	var best *sweep.StrategyResult
	cheapest := res.Plan.Settings.Recommend == "cheapest"
	for _, sr := range res.Strategies {
		c := sr.Best
		if c == nil {
			continue
		}
		if best == nil ||
			(cheapest && c.Cost < best.Best.Cost) ||
			(!cheapest && c.Recommended < best.Best.Recommended) {
			best = sr
		}
	}
	return best
}
