package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// TestRunNoFiles checks that run --no-files prints the same summary as a
// run that writes its outputs, writes nothing and makes no folder, even
// with --out naming the study's own folder.
func TestRunNoFiles(t *testing.T) {
	dir := t.TempDir()
	study := filepath.Join(dir, "tug")
	mustRun(t, 0, "init", study, "--scenario", "tug")
	before := listFiles(t, dir)

	out := filepath.Join(dir, "never")
	js := mustRun(t, 0, "run", study, "--out", out, "--json", "--no-files")
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Errorf("--no-files made the output folder %s (%v)", out, err)
	}
	mustRun(t, 0, "run", study, "--out", study, "--no-files")
	if after := listFiles(t, dir); !reflect.DeepEqual(before, after) {
		t.Errorf("--no-files wrote files: before %v, after %v", before, after)
	}

	written := mustRun(t, 0, "run", study, "--out", filepath.Join(dir, "out"), "--json")
	var a, b []map[string]any
	if err := json.Unmarshal([]byte(js), &a); err != nil {
		t.Fatalf("--no-files --json: %v\n%s", err, js)
	}
	if err := json.Unmarshal([]byte(written), &b); err != nil {
		t.Fatal(err)
	}
	if len(a) != 1 || len(b) != 1 {
		t.Fatalf("%d and %d studies, want 1", len(a), len(b))
	}
	// outputs is always present (a stable key), empty when nothing is
	// written.
	if o, ok := a[0]["outputs"].([]any); !ok || len(o) != 0 {
		t.Errorf("--no-files lists outputs: %v", a[0]["outputs"])
	}
	delete(a[0], "outputs")
	if _, ok := b[0]["outputs"]; !ok {
		t.Errorf("a run that writes lists no outputs")
	}
	delete(b[0], "outputs")
	if !reflect.DeepEqual(a, b) {
		t.Errorf("--no-files summary differs from the written run's:\n%s\n%s", js, written)
	}

	text := mustRun(t, 0, "run", study, "--no-files", "--out", out)
	if strings.Contains(text, "written:") || !strings.Contains(text, "Froude scaling") {
		t.Errorf("text summary with --no-files:\n%s", text)
	}
}

func listFiles(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	err := filepath.Walk(dir, func(p string, info os.FileInfo, err error) error {
		if err != nil {
			return err
		}
		out = append(out, p)
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}
