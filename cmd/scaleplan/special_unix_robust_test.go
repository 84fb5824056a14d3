//go:build unix

package main

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"
)

// Studies and sheets that are not regular files: a device would be read
// for ever and a named pipe would wait for a writer, so both are refused
// before they are opened for reading. If one were read, the test would
// hang until go test's own timeout stops it.
func specialCases() []hostileCase {
	link := func(t *testing.T, target, p string) {
		t.Helper()
		if err := os.Symlink(target, p); err != nil {
			t.Skip("no symbolic links:", err)
		}
	}
	fifo := func(t *testing.T, p string) {
		t.Helper()
		if err := syscall.Mkfifo(p, 0o644); err != nil {
			t.Skip("no named pipes:", err)
		}
	}
	return []hostileCase{
		{"a study that is a link to /dev/zero", func(t *testing.T, dir string) []string {
			p := filepath.Join(dir, "zero.xlsx")
			link(t, "/dev/zero", p)
			return runStudy(dir, p)
		}, 1, "study ", "it is a device, not a file or folder"},
		{"a study that is a named pipe", func(t *testing.T, dir string) []string {
			p := filepath.Join(dir, "pipe.xlsx")
			fifo(t, p)
			return runStudy(dir, p)
		}, 1, "study ", "it is a named pipe, not a file or folder"},
		{"a sheet that is a link to /dev/zero", csvCase(func(t *testing.T, s string) {
			p := filepath.Join(s, "Costs.csv")
			os.Remove(p)
			link(t, "/dev/zero", p)
		}), 1, "Costs", "cannot read Costs.csv: it is a device, not a file"},
		{"a sheet that is a named pipe", csvCase(func(t *testing.T, s string) {
			p := filepath.Join(s, "Study.csv")
			os.Remove(p)
			fifo(t, p)
		}), 1, "Study", "cannot read Study.csv: it is a named pipe, not a file"},
	}
}

// TestSpecialFileInputs runs every case of a file that is not a file
// through the command.
func TestSpecialFileInputs(t *testing.T) {
	for _, c := range specialCases() {
		t.Run(c.kind, func(t *testing.T) { hCheck(t, c) })
	}
}
