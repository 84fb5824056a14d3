//go:build unix

package main

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"testing"
	"time"

	"scaleplan/report"
)

// Tests that run the command in a child process (the test binary itself,
// see TestMain): its peak memory, and what Ctrl-C does.

// hChild starts the command in a child process.
func hChild(t *testing.T, args ...string) (*exec.Cmd, *bytes.Buffer, *bytes.Buffer) {
	t.Helper()
	return hChildEnv(t, nil, args...)
}

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

// TestInterruptRun sends Ctrl-C (SIGINT) to scaleplan run during a large
// batch: it stops within seconds with exit status 1 and says so, and the
// output folder holds no file at all: no temporary file, no half-written
// output, and no output of the studies that had not finished.
func TestInterruptRun(t *testing.T) {
	if testing.Short() {
		t.Skip("large batch")
	}
	dir := t.TempDir()
	var studies []string
	for _, name := range []string{"a", "b", "c", "d"} {
		s := hTugCSV(t, dir, name)
		hSet(t, s, "Study", "name", "value", "big-"+name)
		hSet(t, s, "Study", "points", "value", "200000")
		studies = append(studies, s)
	}
	out := filepath.Join(dir, "out")
	cmd, _, stderr := hChild(t, append(append([]string{"run"}, studies...), "--out", out)...)
	// Wait until the batch runs (the output folder is made just before).
	for i := 0; i < 100; i++ {
		if _, err := os.Stat(out); err == nil {
			break
		}
		time.Sleep(20 * time.Millisecond)
	}
	time.Sleep(1500 * time.Millisecond)
	if err := cmd.Process.Signal(os.Interrupt); err != nil {
		t.Fatal(err)
	}
	sent := time.Now()
	done := make(chan int, 1)
	go func() { done <- hExit(t, cmd) }()
	var code int
	select {
	case code = <-done:
	case <-time.After(60 * time.Second):
		cmd.Process.Kill()
		t.Fatal("scaleplan run did not stop within 60 s of Ctrl-C")
	}
	t.Logf("stopped %.1f s after Ctrl-C", time.Since(sent).Seconds())
	if code != 1 || !strings.Contains(stderr.String(), "scaleplan: interrupted: 0 of 4 studies were written") {
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

// TestInterruptRunWhileWriting sends Ctrl-C while the outputs of a large
// study are being written (as soon as its staging folder appears): the run
// stops with exit 1 and "interrupted", and the output folder is empty (or,
// if the write won the race, every output is there and complete); never a
// temporary file, never some outputs without the others.
func TestInterruptRunWhileWriting(t *testing.T) {
	if testing.Short() {
		t.Skip("large study")
	}
	dir := t.TempDir()
	s := hTugCSV(t, dir, "tug")
	hSet(t, s, "Study", "points", "value", "100000")
	out := filepath.Join(dir, "out")
	cmd, _, stderr := hChild(t, "run", s, "--out", out)
	staging := ""
	for deadline := time.Now().Add(60 * time.Second); staging == "" && time.Now().Before(deadline); time.Sleep(2 * time.Millisecond) {
		for _, n := range rbNames(t, out) {
			if report.IsPartial(n) {
				staging = n
			}
		}
	}
	if staging == "" {
		cmd.Process.Kill()
		t.Fatal("no staging folder appeared within 60 s")
	}
	cmd.Process.Signal(os.Interrupt)
	code := hExit(t, cmd)
	got := rbNames(t, out)
	switch {
	case code == 1 && strings.Contains(stderr.String(), "scaleplan: interrupted: 0 of 1 studies were written") && len(got) == 0:
		t.Logf("Ctrl-C while writing (%s): stopped, nothing written", staging)
	case code == 0 && slices.Contains(got, "harbour-tug.memo.md") && slices.Contains(got, "harbour-tug.xlsx"):
		t.Logf("Ctrl-C while writing (%s): came too late, the run finished", staging)
	default:
		t.Errorf("Ctrl-C while writing: exit %d, folder %v, stderr %s", code, got, stderr)
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
