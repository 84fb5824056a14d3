package study

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// readmeSheets parses the sheet table of the README's "Studies" section:
// the sheet, its columns and what a row says, in the README's order.
func readmeSheets(t *testing.T) [][3]string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	_, studies, ok := strings.Cut(string(b), "\n## Studies\n")
	if !ok {
		t.Fatal("README.md has no Studies section")
	}
	_, table, ok := strings.Cut(studies, "| sheet | columns | what a row says |\n|---|---|---|\n")
	if !ok {
		t.Fatal("the Studies section of README.md has no sheet table")
	}
	var rows [][3]string
	for _, line := range strings.Split(table, "\n") {
		if !strings.HasPrefix(line, "| ") {
			break
		}
		cells := strings.SplitN(strings.Trim(line, "| "), " | ", 3)
		if len(cells) != 3 {
			t.Fatalf("README sheet table: %q is not three cells", line)
		}
		rows = append(rows, [3]string{cells[0], cells[1], cells[2]})
	}
	return rows
}

// TestSchemaReadme: the README's sheet table names the sheets of Sheets
// in order, each with its columns in order, and says what a row says in
// the schema's words.
func TestSchemaReadme(t *testing.T) {
	rows := readmeSheets(t)
	if len(rows) != len(Sheets) {
		t.Fatalf("the README's sheet table has %d rows, the schema %d sheets", len(rows), len(Sheets))
	}
	for i, sh := range Sheets {
		r := rows[i]
		if r[0] != sh.Name {
			t.Errorf("README row %d is sheet %q, the schema's sheet %d is %q", i+1, r[0], i+1, sh.Name)
			continue
		}
		if got := strings.Split(r[1], ", "); !slices.Equal(got, sh.Names()) {
			t.Errorf("README: %s has the columns %q, the schema %q", sh.Name, got, sh.Names())
		}
		if !strings.HasPrefix(r[2], sh.Row) {
			t.Errorf("README: a row of %s says %q…, the schema %q", sh.Name, r[2][:min(len(r[2]), 40)], sh.Row)
		}
	}
}

// TestSchemaTemplate: the template, as a workbook and as CSV files, heads
// every sheet with the README's columns, and the reader takes back every
// row of every sheet (the tug scenario has rows in most sheets; one row
// is added to each empty one).
func TestSchemaTemplate(t *testing.T) {
	s, err := LoadScenario("tug")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Measures) == 0 {
		s.Measures = []MeasureRow{{Measure: "model_reynolds", Expression: "design_speed * hull_length / kinematic_viscosity", Unit: "1", Row: 2}}
	}
	if len(s.Custom) == 0 {
		s.Custom = []CustomRow{{Entry: "my_foam", Kind: "solid", Property: "density", Value: "35", Unit: "kg/m^3", Source: "maker's datasheet", Row: 2}}
	}
	if len(s.Limits) == 0 {
		s.Limits = []LimitRow{{AppliesTo: "all", Limit: "short", Expression: "hull_length <= 1 m", Source: "invented", Row: 2}}
	}
	want := map[string][]string{}
	for _, r := range readmeSheets(t) {
		want[r[0]] = strings.Split(r[1], ", ")
	}
	dir := t.TempDir()
	xlsx := filepath.Join(dir, "t.xlsx")
	if err := WriteXLSX(xlsx, s, testLists()); err != nil {
		t.Fatal(err)
	}
	if err := WriteCSV(filepath.Join(dir, "csv"), s); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	for sheet, cols := range want {
		rows, err := f.GetRows(sheet)
		if err != nil || len(rows) == 0 {
			t.Errorf("template: no sheet %s (%v)", sheet, err)
			continue
		}
		if !slices.Equal(rows[0], cols) {
			t.Errorf("template: %s is headed %q, want %q", sheet, rows[0], cols)
		}
		b, err := os.ReadFile(filepath.Join(dir, "csv", sheet+".csv"))
		if err != nil {
			t.Fatal(err)
		}
		recs, err := csv.NewReader(strings.NewReader(string(b))).ReadAll()
		if err != nil || len(recs) == 0 || !slices.Equal(recs[0], cols) {
			t.Errorf("template: %s.csv is headed %v, want %q (%v)", sheet, recs[:min(len(recs), 1)], cols, err)
		}
	}
	for _, p := range []string{xlsx, filepath.Join(dir, "csv")} {
		back, err := Load(p)
		if err != nil {
			t.Fatal(err)
		}
		counts := []struct {
			sheet     string
			got, want int
		}{
			{"Study", len(back.Settings), len(s.Settings)}, {"Prototype", len(back.Prototype), len(s.Prototype)},
			{"Media", len(back.Media), len(s.Media)}, {"Materials", len(back.Materials), len(s.Materials)},
			{"Custom", len(back.Custom), len(s.Custom)}, {"Facilities", len(back.Facilities), len(s.Facilities)},
			{"Strategies", len(back.Strategies), len(s.Strategies)}, {"Limits", len(back.Limits), len(s.Limits)},
			{"Costs", len(back.Costs), len(s.Costs)}, {"Measures", len(back.Measures), len(s.Measures)},
			{"Uncertainty", len(back.Uncertain), len(s.Uncertain)},
		}
		for _, c := range counts {
			if c.got != c.want || c.want == 0 && c.sheet != "Costs" && c.sheet != "Materials" {
				t.Errorf("%s: %s read back with %d rows, written with %d", filepath.Base(p), c.sheet, c.got, c.want)
			}
		}
	}
}

// TestSchemaLists: the list values the schema gives are the ones the
// checks of the engine accept (they are the same variables) and the ones
// the README names: the techniques and the distributions.
func TestSchemaLists(t *testing.T) {
	tests := []struct {
		sheet, column string
		want          []string // as the README's Studies section lists them
	}{
		{"Strategies", "technique", []string{"complete", "dominant", "special_cases", "distorted", "simulated", "substitute"}},
		{"Uncertainty", "distribution", []string{"normal", "lognormal", "uniform"}},
		{"Custom", "kind", []string{"solid", "fluid", "soil", "ice"}},
	}
	for _, tt := range tests {
		if got := listOf(tt.sheet, tt.column); !slices.Equal(got, tt.want) {
			t.Errorf("%s.%s lists %q, want %q", tt.sheet, tt.column, got, tt.want)
		}
	}
}
