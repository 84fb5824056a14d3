package study

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep/study/studytest"
)

func TestWarnStrayWorksheet(t *testing.T) {
	b := workbook(t, sampleStudy(), func(f *excelize.File) {
		if _, err := f.NewSheet("Limit"); err != nil {
			t.Fatal(err)
		}
	})
	s, err := loadBytes(t, b)
	studytest.CheckProblems(t, err, nil)
	studytest.HasWarning(t, s.Warnings, `the worksheet "Limit" is not a sheet of a study and is not read; did you mean Limits?`)
	if len(s.Warnings) != 1 {
		t.Errorf("the template's own sheets must not warn: %q", s.Warnings.Strings())
	}
}

func TestRefuseCaseTwinSheets(t *testing.T) {
	dir := studytest.WriteFolder(t, studytest.MinimalCSV())
	if err := os.WriteFile(filepath.Join(dir, "limits.csv"), []byte("applies_to,limit,expression,source\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "Limits.csv"), []byte("applies_to,limit,expression,source\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if names, _ := os.ReadDir(dir); len(names) != 5 {
		t.Skip("the file system ignores case")
	}
	_, err := Load(dir)
	studytest.CheckProblems(t, err, []string{"Limits: the folder holds Limits.csv and limits.csv: names that differ only in case are one sheet, so which one counts is ambiguous; keep one of them"})
}

func TestRefuseCaseTwinWorksheets(t *testing.T) {
	// A spreadsheet program refuses such names; a generated file may hold
	// them. Rename a second sheet in the workbook's XML.
	b := workbook(t, sampleStudy(), func(f *excelize.File) {
		if _, err := f.NewSheet("LIMITX"); err != nil {
			t.Fatal(err)
		}
	})
	b = rezip(t, b, func(name string, data []byte) []byte {
		if name == "xl/workbook.xml" {
			return []byte(strings.Replace(string(data), `name="LIMITX"`, `name="limits"`, 1))
		}
		return data
	})
	_, err := loadBytes(t, b)
	if err == nil || !strings.Contains(err.Error(), "Limits: the workbook holds the worksheets Limits and limits") {
		t.Errorf("got %v", err)
	}
}
