package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestInitMissingFolder: init into a folder that does not exist must fail
// with the writer's error and say nothing about having written (it once
// dropped the workbook writer's error and printed "wrote …" with exit 0).
func TestInitMissingFolder(t *testing.T) {
	// (A CSV study is a folder: init makes it with its parents.)
	for _, name := range []string{"study.xlsx", "study.XLSX"} {
		t.Run(name, func(t *testing.T) {
			p := filepath.Join(t.TempDir(), "missing", "dir", name)
			var stdout, stderr bytes.Buffer
			if code := run([]string{"scaleplan", "init", p, "--scenario", "tug"}, &stdout, &stderr); code != 1 {
				t.Errorf("exit %d, want 1; stdout %q", code, stdout.String())
			}
			if strings.Contains(stdout.String(), "wrote") {
				t.Errorf("init claims to have written: %q", stdout.String())
			}
			if stderr.Len() == 0 {
				t.Error("no error on stderr")
			}
			if _, err := os.Stat(p); !os.IsNotExist(err) {
				t.Errorf("%s: %v, want it absent", p, err)
			}
		})
	}
}
