package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files under testdata/golden")

// manualExamples returns the example command lines of the manual in doc.go
// (lines that start with a tab and "$ scaleplan").
func manualExamples(t *testing.T) []string {
	t.Helper()
	src, err := os.ReadFile("doc.go")
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, line := range strings.Split(string(src), "\n") {
		if cmd, ok := strings.CutPrefix(line, "\t$ "); ok {
			out = append(out, cmd)
		}
	}
	if len(out) == 0 {
		t.Fatal("no examples found in doc.go")
	}
	return out
}

var nonWord = regexp.MustCompile(`[^a-z0-9]+`)

func goldenName(cmd string) string {
	s := nonWord.ReplaceAllString(strings.ToLower(strings.TrimPrefix(cmd, "scaleplan ")), "-")
	s = strings.Trim(s, "-")
	if len(s) > 80 {
		s = s[:80]
	}
	return filepath.Join("testdata", "golden", s+".txt")
}

// TestManualExamples runs every example of the manual and compares its
// output with the golden file (go test -update rewrites them; review the
// diff).
func TestManualExamples(t *testing.T) {
	for _, cmd := range manualExamples(t) {
		t.Run(cmd, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			// An example that writes outputs writes them into a temporary
			// folder, named in the output as the example names it.
			args := strings.Fields(cmd)
			out := ""
			for i, a := range args {
				if a == "--out" && i+1 < len(args) {
					out, args[i+1] = args[i+1], t.TempDir()
				}
			}
			code := run(args, &stdout, &stderr)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, stderr.String())
			}
			if out != "" {
				got := strings.ReplaceAll(stdout.String(), slashes(args[slices.Index(args, "--out")+1]), slashes(out))
				stdout.Reset()
				stdout.WriteString(got)
			}
			goldenCheck(t, filepath.Base(goldenName(cmd)), stdout.Bytes())
		})
	}
}

// slashes is a path as JSON writes it (a backslash escaped).
func slashes(p string) string { return strings.ReplaceAll(p, `\`, `\\`) }
