package sweep

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study"
)

// The helpers of this file give the tests of the engine studies as files:
// a folder of CSV sheets or a workbook edited cell by cell, written and
// read through the study package's own API.

// minimalCSV is a valid folder study, sheet by sheet.
func minimalCSV() map[string]string {
	return map[string]string{
		"Study":      "setting,value,unit,note\nname,mini,,\nscale_from,10,,\nscale_to,50,,\n",
		"Prototype":  "item,value,unit,scales_as,note\nhull_length,120,m,length,\n",
		"Strategies": "strategy,case,technique,retain,relax,untie,given,tuned,fix,media,materials,facilities,correction,note\nfroude,,dominant,\"inertia, gravity\",viscosity,,,,,,,,,\n",
	}
}

// writeFolder writes the sheets (name → content) as NAME.csv in a new
// folder and returns it.
func writeFolder(t *testing.T, sheets map[string]string) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "study")
	if err := os.Mkdir(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	for name, content := range sheets {
		if err := os.WriteFile(filepath.Join(dir, name+".csv"), []byte(content), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// problemLines is the problems of err, one line each; it fails the test
// when err is not nil and not Problems.
func problemLines(t *testing.T, err error) []string {
	t.Helper()
	if err == nil {
		return nil
	}
	var ps study.Problems
	if !errors.As(err, &ps) {
		t.Fatalf("error is not Problems: %v", err)
	}
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.Error()
	}
	return lines
}

// checkProblems checks that every wanted problem was reported, and that
// there are no problems when none are wanted.
func checkProblems(t *testing.T, err error, want []string) {
	t.Helper()
	got := problemLines(t, err)
	if len(want) == 0 && len(got) > 0 {
		t.Fatalf("unexpected problems:\n%s", strings.Join(got, "\n"))
	}
	for _, w := range want {
		found := false
		for _, g := range got {
			if g == w {
				found = true
			}
		}
		if !found {
			t.Errorf("missing problem\n  %s\ngot:\n  %s", w, strings.Join(got, "\n  "))
		}
	}
}

// workbook is s written as a workbook (without drop-down lists), edited
// by edit.
func workbook(t testing.TB, s *study.Study, edit func(f *excelize.File)) []byte {
	t.Helper()
	p := filepath.Join(t.TempDir(), "w.xlsx")
	if err := study.WriteXLSX(p, s, study.Lists{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(p)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if edit != nil {
		edit(f)
	}
	buf, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// loadBytes writes an .xlsx file and loads it.
func loadBytes(t *testing.T, b []byte) (*study.Study, error) {
	t.Helper()
	p := filepath.Join(t.TempDir(), "s.xlsx")
	if err := os.WriteFile(p, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return study.Load(p)
}
