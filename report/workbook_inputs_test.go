package report_test

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestInputsEchoReadme: the workbook's Inputs sheet echoes every sheet the
// README's sheet table lists ("Studies" section), in its order, under the
// columns the table gives. The conductor scenario has rows in the Measures
// and Uncertainty sheets, which the echo once left out.
func TestInputsEchoReadme(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	_, table, ok := strings.Cut(string(b), "| sheet | columns | what a row says |\n|---|---|---|\n")
	if !ok {
		t.Fatal("README.md has no sheet table")
	}
	var want [][]string // sheet name, then its columns
	for _, line := range strings.Split(table, "\n") {
		if !strings.HasPrefix(line, "| ") {
			break
		}
		cells := strings.SplitN(strings.Trim(line, "| "), " | ", 3)
		want = append(want, append([]string{"sheet " + cells[0]}, strings.Split(cells[1], ", ")...))
	}
	if len(want) < 11 {
		t.Fatalf("the README's sheet table has %d rows", len(want))
	}
	res := wbRunScenario(t, "conductor")
	f := wbOpen(t, wbWrite(t, t.TempDir(), "study.xlsx", res))
	rows, err := f.GetRows("Inputs")
	if err != nil {
		t.Fatal(err)
	}
	var got [][]string
	for _, r := range rows {
		if strings.HasPrefix(wbAt(r, 0), "sheet ") {
			got = append(got, slices.DeleteFunc(slices.Clone(r), func(s string) bool { return s == "" }))
		}
	}
	if !slices.EqualFunc(got, want, slices.Equal) {
		t.Errorf("the Inputs sheet echoes\n  %q\nthe README lists\n  %q", got, want)
	}
	// The rows of conductor/Measures.csv and Uncertainty.csv, as typed.
	for _, w := range []struct {
		sheet string
		row   []string
	}{
		{"Measures", []string{"", "stiffness per spring", "stiffness / springs", "N/m"}},
		{"Uncertainty", []string{"", "design_speed", "", "normal", "10%"}},
	} {
		h := slices.IndexFunc(rows, func(r []string) bool { return wbAt(r, 0) == "sheet "+w.sheet })
		if h < 0 || h+1 >= len(rows) || !slices.Equal(rows[h+1][:min(len(rows[h+1]), len(w.row))], w.row) {
			t.Errorf("Inputs: the first %s row is not echoed as %q", w.sheet, w.row)
		}
	}
}
