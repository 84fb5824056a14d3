package sweep

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study"
)

// The helpers of this file give the tests of the engine studies as files:
// a folder of CSV sheets or a workbook edited cell by cell, written and
// read through the study package's own API.

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
