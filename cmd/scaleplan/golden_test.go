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

// TestGoldenRuns runs the built-in scenarios (scaleplan run, as text and
// as --json) and compares, per scenario, the text table, the JSON record
// and the memo with the golden files testdata/golden/run-NAME.txt,
// run-NAME.json and memo-NAME.md (go test ./cmd/scaleplan -update
// rewrites them; review the diff). The output folder is written OUT in
// them, so they do not depend on where the test runs.
func TestGoldenRuns(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every scenario")
	}
	list, err := study.Scenarios()
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	textOut, jsonOut := filepath.Join(dir, "text"), filepath.Join(dir, "json")
	text := strings.ReplaceAll(mustRun(t, 0, "run", "--out", textOut), textOut, "OUT")
	js := strings.ReplaceAll(mustRun(t, 0, "run", "--json", "--out", jsonOut), jsonOut, "OUT")

	// The text: one block per study, each opening with "Study NAME ".
	blocks := map[string]string{}
	var order []string
	for _, b := range strings.SplitAfter(text, "\n\nStudy ") {
		b = strings.TrimSuffix(b, "Study ")
		if !strings.HasPrefix(b, "Study ") {
			b = "Study " + b
		}
		name, _, _ := strings.Cut(strings.TrimPrefix(b, "Study "), " ")
		blocks[name] = b
		order = append(order, name)
	}
	var records []json.RawMessage
	if err := json.Unmarshal([]byte(js), &records); err != nil {
		t.Fatalf("run --json: %v", err)
	}
	if len(order) != len(list) || len(records) != len(list) {
		t.Fatalf("%d scenarios, %d text blocks, %d JSON records", len(list), len(order), len(records))
	}
	for i, sc := range list {
		s, err := study.LoadScenario(sc.Name)
		if err != nil {
			t.Fatal(err)
		}
		name := s.Settings["name"].Value
		t.Run(name, func(t *testing.T) {
			if order[i] != name {
				t.Errorf("text block %d is study %q, want %q", i+1, order[i], name)
			}
			goldenCheck(t, "run-"+name+".txt", []byte(blocks[name]))
			var rec bytes.Buffer
			if err := json.Indent(&rec, records[i], "", "  "); err != nil {
				t.Fatal(err)
			}
			goldenCheck(t, "run-"+name+".json", append(rec.Bytes(), '\n'))
			memo, err := os.ReadFile(filepath.Join(textOut, name+".memo.md"))
			if err != nil {
				t.Fatal(err)
			}
			jsMemo, err := os.ReadFile(filepath.Join(jsonOut, name+".memo.md"))
			if err != nil || !bytes.Equal(memo, jsMemo) {
				t.Errorf("the memo differs between two runs (%v)", err)
			}
			goldenCheck(t, "memo-"+name+".md", memo)
		})
	}
}

// goldenCheck compares got with testdata/golden/file, or rewrites the
// file with -update.
func goldenCheck(t *testing.T, file string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", "golden", file)
	if *update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/scaleplan -run %s -update to create it)", err, t.Name())
	}
	if !bytes.Equal(got, want) {
		t.Errorf("output differs from %s (go test ./cmd/scaleplan -update rewrites it; review the diff):\n%s", path, got)
	}
}
