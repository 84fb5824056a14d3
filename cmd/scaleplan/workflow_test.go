package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"scaleplan/sweep/study"
)

// TestInitCheckRun writes every scenario with init (as a workbook and as a
// CSV folder), checks it and runs it; the workbook and the CSV folder must
// give identical results.
func TestInitCheckRun(t *testing.T) {
	list, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	for _, sc := range list {
		t.Run(sc.Name, func(t *testing.T) {
			results := map[string]string{}
			for _, form := range []string{"xlsx", "csv"} {
				path := filepath.Join(dir, sc.Name+"-study")
				if form == "xlsx" {
					path += ".xlsx"
				}
				mustRun(t, 0, "init", path, "--scenario", sc.Name)
				out := mustRun(t, 0, "check", path)
				if !strings.Contains(out, "no problems") {
					t.Errorf("check %s: %q", path, out)
				}
				js := mustRun(t, 0, "run", path, "--out", filepath.Join(dir, sc.Name+"-"+form+"-out"), "--json")
				var data []map[string]any
				if err := json.Unmarshal([]byte(js), &data); err != nil {
					t.Fatalf("run --json: %v\n%s", err, js)
				}
				delete(data[0], "outputs")
				b, _ := json.Marshal(data)
				results[form] = string(b)
			}
			if results["xlsx"] != results["csv"] {
				t.Errorf("workbook and CSV give different results:\n%s\n%s", results["xlsx"], results["csv"])
			}
		})
	}
}

func mustRun(t *testing.T, want int, args ...string) string {
	t.Helper()
	var stdout, stderr bytes.Buffer
	if code := run(append([]string{"scaleplan"}, args...), &stdout, &stderr); code != want {
		t.Fatalf("scaleplan %s: exit %d, want %d\n%s", strings.Join(args, " "), code, want, stderr.String())
	}
	return stdout.String()
}

func TestInitList(t *testing.T) {
	out := mustRun(t, 0, "init", "--list")
	list, _ := study.Scenarios()
	for _, sc := range list {
		if !strings.Contains(out, sc.Name) || !strings.Contains(out, sc.Description) {
			t.Errorf("init --list lacks %s: %q", sc.Name, out)
		}
	}
}

func TestInitRefusesExisting(t *testing.T) {
	p := filepath.Join(t.TempDir(), "study.xlsx")
	if err := os.WriteFile(p, []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	if code := run([]string{"scaleplan", "init", p}, &stdout, &stderr); code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	if b, _ := os.ReadFile(p); string(b) != "mine" {
		t.Error("init wrote over an existing file")
	}
}

// TestRunDemo runs the built-in scenarios as the quick start does and
// checks that every study wrote its workbook and memo.
func TestRunDemo(t *testing.T) {
	out := filepath.Join(t.TempDir(), "out")
	text := mustRun(t, 0, "run", "--out", out)
	list, _ := study.Scenarios()
	for _, sc := range list {
		s, _ := study.LoadScenario(sc.Name)
		name := s.Settings["name"].Value
		for _, ext := range []string{".xlsx", ".memo.md"} {
			if _, err := os.Stat(filepath.Join(out, name+ext)); err != nil {
				t.Errorf("%s: %v", sc.Name, err)
			}
		}
		if !strings.Contains(text, "Study "+name) {
			t.Errorf("terminal output lacks study %s", name)
		}
	}
	if !strings.Contains(text, "1:11.4–1:18.9") {
		t.Errorf("tug window missing from the table:\n%s", text)
	}
}

// TestNoOutputFolderWhenAllFail: a run whose studies all have problems
// leaves no output folder behind.
func TestNoOutputFolderWhenAllFail(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad")
	mustRun(t, 0, "init", bad, "--scenario", "tug")
	if err := os.Remove(filepath.Join(bad, "Strategies.csv")); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	var stdout, stderr bytes.Buffer
	if code := run([]string{"scaleplan", "run", bad, "--out", out}, &stdout, &stderr); code != 1 {
		t.Fatalf("exit %d, want 1: %s", code, stderr.String())
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Errorf("output folder made although nothing was written (%v)", err)
	}
}
