package study

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

// TestWriteFileAtomic: a writer that fails or panics leaves the target as
// it was and no temporary file (the CSV and workbook templates go through
// this writer); a complete write replaces the target, readable by others.
func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "Study.csv")
	if err := os.WriteFile(target, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	check := func(when string) {
		t.Helper()
		es, _ := os.ReadDir(dir)
		if len(es) != 1 || es[0].Name() != "Study.csv" {
			var names []string
			for _, e := range es {
				names = append(names, e.Name())
			}
			t.Errorf("%s: the folder holds %v, want Study.csv only", when, names)
		}
		if b, _ := os.ReadFile(target); string(b) != "old" {
			t.Errorf("%s: the target holds %q, want it unchanged", when, b)
		}
	}
	err := WriteFileAtomic(target, func(w io.Writer) error {
		io.WriteString(w, "half")
		return errors.New("disk full")
	})
	if err == nil {
		t.Error("a failing writer gave no error")
	}
	check("after a failing writer")
	func() {
		defer func() {
			if recover() == nil {
				t.Error("the panic did not come through")
			}
		}()
		WriteFileAtomic(target, func(w io.Writer) error {
			io.WriteString(w, "half")
			panic("writer bug")
		})
	}()
	check("after a panicking writer")
	if err := WriteFileAtomic(target, func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err }); err != nil {
		t.Fatal(err)
	}
	if info, err := os.Stat(target); err != nil || info.Mode().Perm() != 0o644 {
		t.Errorf("target mode %v (%v), want 0644", info.Mode(), err)
	}
	if b, _ := os.ReadFile(target); string(b) != "new" {
		t.Errorf("the target holds %q, want new", b)
	}
}
