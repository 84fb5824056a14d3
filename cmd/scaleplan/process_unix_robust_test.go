//go:build unix

package main

import (
	"bufio"
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"

	"scaleplan/report"
)

// Tests that run the command in a child process (the test binary itself,
// see TestMain): its peak memory, and what Ctrl-C does.

// hChildEnv starts the command in a child process with more environment.
func hChildEnv(t *testing.T, env []string, args ...string) (*exec.Cmd, *bytes.Buffer, *bytes.Buffer) {
	t.Helper()
	cmd := exec.Command(os.Args[0], args...)
	cmd.Env = append(append(os.Environ(), "SCALEPLAN_TEST_MAIN=1"), env...)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	return cmd, &stdout, &stderr
}

// hExit waits for a child and returns its exit status (-1 when killed by
// a signal).
func hExit(t *testing.T, cmd *exec.Cmd) int {
	t.Helper()
	err := cmd.Wait()
	if err == nil {
		return 0
	}
	if ee, ok := err.(*exec.ExitError); ok {
		return ee.ExitCode()
	}
	t.Fatal(err)
	return -1
}

// hPeak runs the command in a child process and returns its peak resident
// memory in MB (VmHWM, Linux only: the test is skipped elsewhere), its exit
// status and what it printed on stderr.
func hPeak(t *testing.T, args ...string) (float64, int, string) {
	t.Helper()
	if runtime.GOOS != "linux" {
		t.Skip("peak memory is read from /proc (Linux)")
	}
	peak := filepath.Join(t.TempDir(), "peak")
	cmd, _, stderr := hChildEnv(t, []string{"SCALEPLAN_TEST_PEAK=" + peak}, args...)
	code := hExit(t, cmd)
	line, err := os.ReadFile(peak)
	if err != nil {
		t.Fatalf("no peak memory: %v (stderr %s)", err, stderr)
	}
	var kb float64
	if _, err := fmt.Sscanf(strings.TrimPrefix(string(line), "VmHWM:"), "%f kB", &kb); err != nil {
		t.Fatalf("peak memory %q: %v", line, err)
	}
	return kb / 1024, code, stderr.String()
}

// maxMemoryMB bounds the peak memory (resident set) of the command on any
// hostile file.
const maxMemoryMB = 200

// TestHostileMemory: the zip bombs, the enormous sheets and the oversized
// files are refused with bounded memory. The peak resident memory of the
// child process is measured (getrusage, as /usr/bin/time -v does).
func TestHostileMemory(t *testing.T) {
	kinds := map[string]bool{
		"zip bomb (declares its size)":           true,
		"zip bomb (lies about its size)":         true,
		"enormous sheet (200,000 rows)":          true,
		"enormous sheet (a cell at XFD1048576)":  true,
		"enormous cell":                          true,
		"workbook file too large":                true,
		"CSV sheet file too large":               true,
		"sweep larger than max_points":           true,
		"wide sheet (a cell at XFD in each row)": true,
	}
	cases := append(hostileCases(), hostileCase{"wide sheet (a cell at XFD in each row)", xlsxCase(func(t *testing.T, s string) {
		_, parts := hParts(t, s)
		hReplacePart(t, s, hSheetPart(t, parts, "Prototype"), hugeSheet(5000, "XFD"), 0)
	}), 1, "Prototype", ""})
	for _, c := range cases {
		if !kinds[c.kind] {
			continue
		}
		delete(kinds, c.kind)
		t.Run(c.kind, func(t *testing.T) {
			dir := t.TempDir()
			args := c.build(t, dir)
			start := time.Now()
			mb, code, stderr := hPeak(t, args...)
			took := time.Since(start)
			if code != c.code || !strings.Contains(stderr, c.want) {
				t.Errorf("exit %d, want %d; stderr %s", code, c.code, stderr)
			}
			t.Logf("peak memory %.0f MB, %.1f s", mb, took.Seconds())
			if mb > maxMemoryMB {
				t.Errorf("peak memory %.0f MB, more than %d MB", mb, maxMemoryMB)
			}
			hNoOutputs(t, dir)
		})
	}
	for k := range kinds {
		t.Errorf("no hostile case %q", k)
	}
}

// hInterruptAt runs the command in a child process that pauses at a known
// point (pauseEnv, e.g. "batch:3"), calls atPause there, sends it Ctrl-C
// (SIGINT) and returns its exit status and all it wrote on stderr. The
// signal goes when the child says it is paused, never after a delay.
func hInterruptAt(t *testing.T, pause string, atPause func(), args ...string) (int, string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], args...)
	cmd.Env = append(os.Environ(), "SCALEPLAN_TEST_MAIN=1", pauseEnv+"="+pause)
	pipe, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	var stderr strings.Builder
	paused := false
	lines := bufio.NewScanner(pipe)
	for lines.Scan() {
		stderr.WriteString(lines.Text() + "\n")
		if !paused && strings.HasPrefix(lines.Text(), pausedLine) {
			paused = true
			atPause()
			if err := cmd.Process.Signal(os.Interrupt); err != nil {
				t.Fatal(err)
			}
		}
	}
	code := hExit(t, cmd)
	if !paused {
		t.Fatalf("the run never paused at %s: exit %d, stderr %s", pause, code, stderr.String())
	}
	return code, stderr.String()
}

// TestInterruptRun sends Ctrl-C (SIGINT) to scaleplan run while it sweeps
// a batch of four studies (at the third check for an interrupt, so inside
// the batch): it stops with exit status 1 and says so, and the output
// folder holds no file at all: no temporary file, no half-written output,
// and no output of the studies that had finished. (How soon a running
// study stops after the interrupt is report.TestInterruptLargeBatch.)
func TestInterruptRun(t *testing.T) {
	dir := t.TempDir()
	var studies []string
	for _, name := range []string{"a", "b", "c", "d"} {
		s := hTugCSV(t, dir, name)
		hSet(t, s, "Study", "name", "value", "study-"+name)
		studies = append(studies, s)
	}
	out := filepath.Join(dir, "out")
	code, stderr := hInterruptAt(t, "batch:3", func() {}, append(append([]string{"run"}, studies...), "--out", out)...)
	if code != 1 || !strings.Contains(stderr, "scaleplan: interrupted: 0 of 4 studies were written") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	// The folder is made only when a study is written, so it may not
	// exist at all; if it does, it must be empty.
	if es, err := os.ReadDir(out); (err != nil && !os.IsNotExist(err)) || len(es) != 0 {
		var names []string
		for _, e := range es {
			names = append(names, e.Name())
		}
		t.Errorf("the output folder holds %v after Ctrl-C (%v)", names, err)
	}
	hNoOutputs(t, dir)
}

// TestBaselineMemory measures an ordinary run, to compare with the
// hostile ones.
func TestBaselineMemory(t *testing.T) {
	dir := t.TempDir()
	s := hTugXLSX(t, dir, "tug.xlsx")
	mb, code, stderr := hPeak(t, runStudy(dir, s)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	t.Logf("peak memory %.0f MB", mb)
}

// TestInterruptRunWhileWriting sends Ctrl-C while the outputs of a study
// are being written: the run pauses at the eighth check for an interrupt
// while writing, when its staging folder already holds a finished output
// (checked), and gets Ctrl-C there. (The strategies' maps are drawn
// concurrently, so the first checks of the workers may all come before
// any map is finished; the tug study's eighth check, before its trade-off
// plot, comes after all six strategy maps on any number of cores.) It stops with exit 1 and
// "interrupted", and the output folder is empty: no temporary file, no
// staging folder, never some outputs without the others.
func TestInterruptRunWhileWriting(t *testing.T) {
	dir := t.TempDir()
	s := hTugCSV(t, dir, "tug")
	out := filepath.Join(dir, "out")
	code, stderr := hInterruptAt(t, "write:8", func() {
		var staged []string
		for _, n := range rbNames(t, out) {
			if report.IsPartial(n) {
				staged = rbNames(t, filepath.Join(out, n))
			}
		}
		if len(staged) == 0 {
			t.Errorf("paused while writing, but no staging folder with an output in %s: %v", out, rbNames(t, out))
		}
	}, "run", s, "--out", out)
	if code != 1 || !strings.Contains(stderr, "scaleplan: interrupted: 0 of 1 studies were written") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	if got := rbNames(t, out); len(got) != 0 {
		t.Errorf("the output folder holds %v after Ctrl-C", got)
	}
	hNoOutputs(t, dir)
}

// rbNames lists a folder's entries (none when it does not exist).
func rbNames(t *testing.T, dir string) []string {
	t.Helper()
	es, _ := os.ReadDir(dir)
	var names []string
	for _, e := range es {
		names = append(names, e.Name())
	}
	return names
}
