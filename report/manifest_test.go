package report_test

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// Sequences of runs into one output folder: it holds one run's set of a
// study's files after each, and nothing scaleplan did not write is
// touched. Helpers start with mf.

// mfRun runs the tug scenario with its first n strategies and points.
func mfRun(t *testing.T, n int, points string) *sweep.Result {
	t.Helper()
	return rbRunEdited(t, "tug", points, func(s *study.Study) { s.Strategies = s.Strategies[:n] })
}

// mfSnapshot reads every regular file of a folder.
func mfSnapshot(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	for _, n := range rbEntries(t, dir) {
		if b, err := os.ReadFile(filepath.Join(dir, n)); err == nil {
			out[n] = b
		}
	}
	return out
}

// TestRerunKeepsOneSet: a run with three strategies, then one with two,
// leaves only the second run's files (the third strategy's maps are
// gone), and files of the user's own survive, also one named like an
// output.
func TestRerunKeepsOneSet(t *testing.T) {
	dir := t.TempDir()
	first, err := report.WriteStudy(context.Background(), dir, mfRun(t, 3, "40"))
	if err != nil {
		t.Fatal(err)
	}
	third := 0
	for _, f := range first {
		if strings.Contains(f, "substitute_fluid") { // the third strategy
			third++
		}
	}
	if third == 0 {
		t.Fatalf("the first run wrote no map of the third strategy: %v", first)
	}
	foreign := []string{"notes.txt", "harbour-tug.mine.txt", ".hidden"}
	for _, n := range foreign {
		os.WriteFile(filepath.Join(dir, n), []byte("mine"), 0o644)
	}
	second, err := report.WriteStudy(context.Background(), dir, mfRun(t, 2, "40"))
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]bool{report.ManifestName("harbour-tug"): true}
	for _, f := range append(second, foreign...) {
		want[filepath.Base(f)] = true
	}
	got := rbEntries(t, dir)
	for _, n := range got {
		if !want[n] {
			t.Errorf("left from the first run: %s", n)
		}
		delete(want, n)
	}
	for n := range want {
		t.Errorf("missing: %s", n)
	}
	if len(second) >= len(first) {
		t.Errorf("the second run wrote %d files, the first %d: want fewer", len(second), len(first))
	}
}

// TestStaleStagingRemoved: a staging folder and a temporary file left by a
// killed run of the study are removed by the next run; those of another
// study are not, also one whose name starts like this one's (it may be
// running beside it in a batch).
func TestStaleStagingRemoved(t *testing.T) {
	dir := t.TempDir()
	own := []string{".harbour-tug.partial-12345", ".harbour-tug.xlsx.partial-678"}
	others := []string{".pier.partial-999", ".harbour-tug-2.partial-999", ".harbour-tug-2.xlsx.partial-1"}
	os.Mkdir(filepath.Join(dir, own[0]), 0o755)
	os.WriteFile(filepath.Join(dir, own[0], "harbour-tug.xlsx"), []byte("half"), 0o644)
	os.WriteFile(filepath.Join(dir, own[1]), []byte("half"), 0o644)
	for _, o := range others {
		os.Mkdir(filepath.Join(dir, o), 0o755)
	}
	if _, err := report.WriteStudy(context.Background(), dir, mfRun(t, 2, "40")); err != nil {
		t.Fatal(err)
	}
	for _, n := range own {
		if _, err := os.Lstat(filepath.Join(dir, n)); err == nil {
			t.Errorf("left behind: %s", n)
		}
	}
	for _, o := range others {
		if _, err := os.Lstat(filepath.Join(dir, o)); err != nil {
			t.Errorf("another study's staging folder was removed: %v", err)
		}
	}
}

// TestBlockedRenameRollsBack: when one output cannot be moved into place
// (a folder stands where the memo goes), the files already moved are
// taken out again and the earlier run's files are put back: no new
// workbook beside old maps.
func TestBlockedRenameRollsBack(t *testing.T) {
	dir := t.TempDir()
	if _, err := report.WriteStudy(context.Background(), dir, mfRun(t, 3, "40")); err != nil {
		t.Fatal(err)
	}
	memo := filepath.Join(dir, "harbour-tug.memo.md")
	os.Remove(memo)
	if err := os.Mkdir(memo, 0o755); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(filepath.Join(memo, "blocker"), []byte("x"), 0o644)
	before := mfSnapshot(t, dir)
	_, err := report.WriteStudy(context.Background(), dir, mfRun(t, 2, "50"))
	if err == nil {
		t.Fatal("a blocked rename gave no error")
	}
	if !strings.Contains(err.Error(), "harbour-tug.memo.md") || !strings.Contains(err.Error(), "nothing was changed") {
		t.Errorf("the error does not say what failed and what was kept: %v", err)
	}
	after := mfSnapshot(t, dir)
	for n, b := range before {
		if !bytes.Equal(after[n], b) {
			t.Errorf("%s changed by the failed run", n)
		}
	}
	for n := range after {
		if _, ok := before[n]; !ok {
			t.Errorf("%s appeared", n)
		}
	}
	rbCheckComplete(t, dir, nil)
}
