package report_test

import (
	"archive/zip"
	"bytes"
	"context"
	"errors"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync/atomic"
	"testing"
	"unicode/utf8"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// Robustness of the outputs: names, atomic writes, interrupts. Helpers
// start with rb so that they do not clash with other test files.

// TestFileNameSanitised: a study name never climbs out of the output
// folder, never names a hidden or device file, and stays valid UTF-8.
func TestFileNameSanitised(t *testing.T) {
	cases := map[string]string{
		"../x":              "x",
		"a/b":               "a_b",
		`a\b`:               "a_b",
		"":                  "study",
		".":                 "study",
		"..":                "study",
		"../../etc/passwd":  "etc_passwd",
		"/abs/path":         "abs_path",
		".hidden":           "hidden",
		"harbour-tug":       "harbour-tug",
		"tug: 1:25 (draft)": "tug__1_25__draft",
		"CON":               "CON_",
		"nul":               "nul_",
		"com1":              "com1_",
		"LPT9":              "LPT9_",
		"console":           "console",
		"x\x00y":            "x_y",
		"Fjärd über":        "Fjärd_über",
		"=HYPERLINK(1)":     "HYPERLINK_1",
	}
	for in, want := range cases {
		if got := report.FileName(in); got != want {
			t.Errorf("FileName(%q) = %q, want %q", in, got, want)
		}
	}
	// Long names are cut to 80 bytes between characters.
	for _, in := range []string{strings.Repeat("a", 200), strings.Repeat("é", 100), "a" + strings.Repeat("日", 60)} {
		got := report.FileName(in)
		if len(got) > 80 || !utf8.ValidString(got) || got == "" {
			t.Errorf("FileName(%d bytes) = %q (%d bytes)", len(in), got, len(got))
		}
	}
	// Whatever the name, the file stays in its folder.
	for _, in := range []string{"../x", "a/../../b", "~/x", "..\\..\\x", "x/.", "\u202e/evil"} {
		name := report.FileName(in)
		if strings.ContainsAny(name, `/\.`) || filepath.Base(name) != name {
			t.Errorf("FileName(%q) = %q is not a plain file name", in, name)
		}
	}
}

// rbRun runs a built-in scenario, its points changed when points > 0.
func rbRun(t *testing.T, name string, points string) *sweep.Result {
	t.Helper()
	return rbRunEdited(t, name, points, nil)
}

// rbRunEdited is rbRun with the study changed by edit (when not nil).
func rbRunEdited(t *testing.T, name string, points string, edit func(*study.Study)) *sweep.Result {
	t.Helper()
	s, err := study.LoadScenario(name)
	if err != nil {
		t.Fatal(err)
	}
	if edit != nil {
		edit(s)
	}
	if points != "" {
		set := s.Settings["points"]
		set.Value = points
		s.Settings["points"] = set
	}
	lib, err := materials.Default()
	if err != nil {
		t.Fatal(err)
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	plan, err := sweep.Prepare(s, lib, cat)
	if err != nil {
		t.Fatal(err)
	}
	res, err := plan.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// rbEntries lists the names in a folder, sorted.
func rbEntries(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range es {
		names = append(names, e.Name())
	}
	sort.Strings(names)
	return names
}

// rbCheckComplete checks an output folder after a write or an interrupt:
// no temporary file or staging folder is left, every study has all of its
// outputs or none, and each workbook is a whole zip.
func rbCheckComplete(t *testing.T, dir string, bases []string) {
	t.Helper()
	have := map[string]bool{}
	for _, n := range rbEntries(t, dir) {
		if report.IsPartial(n) || strings.Contains(n, "partial") {
			t.Errorf("%s: partial file %s left", dir, n)
		}
		have[n] = true
	}
	for _, b := range bases {
		wb, memo := have[b+".xlsx"], have[b+".memo.md"]
		if wb != memo {
			t.Errorf("%s: study %s has only some of its outputs (workbook %v, memo %v)", dir, b, wb, memo)
		}
		if wb {
			data, err := os.ReadFile(filepath.Join(dir, b+".xlsx"))
			if err != nil {
				t.Fatal(err)
			}
			if _, err := zip.NewReader(bytes.NewReader(data), int64(len(data))); err != nil {
				t.Errorf("%s.xlsx is not a whole workbook: %v", b, err)
			}
		}
	}
}

// countdownCtx is a context that reports itself cancelled from the n-th
// call of Err on: it stops WriteStudy between any two of its steps.
type countdownCtx struct {
	context.Context
	left atomic.Int64
}

func (c *countdownCtx) Err() error {
	if c.left.Add(-1) < 0 {
		return context.Canceled
	}
	return nil
}

// TestWriteStudyInterrupted: an interrupt at any step of WriteStudy leaves
// the folder with all of the study's outputs or none of them, and no
// temporary file; an interrupt before it starts writes nothing at all.
func TestWriteStudyInterrupted(t *testing.T) {
	res := rbRun(t, "tug", "")
	base := report.FileName(res.Name)
	for n := int64(0); n < 8; n++ {
		dir := t.TempDir()
		ctx := &countdownCtx{Context: context.Background()}
		ctx.left.Store(n)
		files, err := report.WriteStudy(ctx, dir, res)
		rbCheckComplete(t, dir, []string{base})
		got := rbEntries(t, dir)
		if err != nil {
			if !errors.Is(err, context.Canceled) {
				t.Fatalf("after %d steps: %v", n, err)
			}
			if len(got) != 0 || len(files) != 0 {
				t.Errorf("cancelled after %d steps: folder holds %v, files %v", n, got, files)
			}
			continue
		}
		// The outputs, and the manifest that lists them.
		if len(got) < 3 || len(files) != len(got)-1 || !report.IsManifest(got[0]) {
			t.Errorf("not cancelled (%d steps): folder holds %v, files %v", n, got, files)
		}
	}
	// A cancelled context writes nothing.
	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := report.WriteStudy(ctx, dir, res); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled WriteStudy: %v", err)
	}
	if got := rbEntries(t, dir); len(got) != 0 {
		t.Errorf("cancelled WriteStudy wrote %v", got)
	}
}

// TestWriteStudyKeepsOldOutputs: an interrupted write leaves the outputs
// of an earlier run as they were.
func TestWriteStudyKeepsOldOutputs(t *testing.T) {
	res := rbRun(t, "tug", "")
	dir := t.TempDir()
	if _, err := report.WriteStudy(context.Background(), dir, res); err != nil {
		t.Fatal(err)
	}
	before := map[string][]byte{}
	for _, n := range rbEntries(t, dir) {
		before[n], _ = os.ReadFile(filepath.Join(dir, n))
	}
	res2 := rbRun(t, "tug", "50")
	for n := int64(1); n < 4; n++ {
		ctx := &countdownCtx{Context: context.Background()}
		ctx.left.Store(n)
		if _, err := report.WriteStudy(ctx, dir, res2); err == nil {
			continue
		}
		for name, data := range before {
			now, err := os.ReadFile(filepath.Join(dir, name))
			if err != nil || !bytes.Equal(now, data) {
				t.Errorf("interrupted after %d steps: %s changed (%v)", n, name, err)
			}
		}
	}
}

// TestWriteStudyError: an output that cannot be written leaves nothing
// behind (the output folder is read-only here, or gone).
func TestWriteStudyError(t *testing.T) {
	res := rbRun(t, "tug", "")
	gone := filepath.Join(t.TempDir(), "missing", "deeper")
	if _, err := report.WriteStudy(context.Background(), gone, res); err == nil {
		t.Error("writing into a missing folder: no error")
	} else if strings.Contains(err.Error(), "partial") {
		t.Errorf("the error names the temporary file: %v", err)
	}
}

// TestWriteFileAtomicFailure: a failing or panicking writer leaves the
// target as it was and no temporary file.
func TestWriteFileAtomicFailure(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "out.txt")
	if err := os.WriteFile(target, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	err := report.WriteFileAtomic(target, func(w io.Writer) error {
		io.WriteString(w, "half")
		return errors.New("disk full")
	})
	if err == nil || !strings.Contains(err.Error(), "disk full") {
		t.Errorf("error %v", err)
	}
	func() {
		defer func() { recover() }()
		report.WriteFileAtomic(target, func(w io.Writer) error {
			io.WriteString(w, "half")
			panic("writer bug")
		})
	}()
	if got := rbEntries(t, dir); len(got) != 1 || got[0] != "out.txt" {
		t.Errorf("folder holds %v", got)
	}
	if data, _ := os.ReadFile(target); string(data) != "old" {
		t.Errorf("target now %q", data)
	}
	// A complete write replaces the target, readable by others.
	if err := report.WriteFileAtomic(target, func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err }); err != nil {
		t.Fatal(err)
	}
	info, err := os.Stat(target)
	if err != nil || info.Mode().Perm() != 0o644 {
		t.Errorf("target mode %v (%v)", info.Mode(), err)
	}
}

// TestInterruptLargeBatch runs a large batch (the tug study with 200,000
// grid points, four times over, after two small studies), cancels it
// while it sweeps, the way Ctrl-C does in scaleplan run, and writes the
// outcomes as the command does: every large study stops without a
// result, and the output folder holds no temporary file and no output at
// all.
//
// The cancel comes at a known point, not after a delay: at the third
// check of the context after the first large study was loaded. A large
// study checks its context more often than that before it can finish
// (after preparing, before each combination, every 65,536 points of a
// sampled limit), so none of the four can finish first.
func TestInterruptLargeBatch(t *testing.T) {
	if testing.Short() {
		t.Skip("large batch")
	}
	parent, cancel := context.WithCancel(context.Background())
	defer cancel()
	ctx := &rbCancelAt{Context: parent, cancel: cancel}
	ctx.left.Store(3)
	var jobs []sweep.Job
	var bases []string
	for i, points := range []string{"", "", "200000", "200000", "200000", "200000"} {
		name := "batch-" + string(rune('a'+i))
		bases = append(bases, name)
		jobs = append(jobs, sweep.Job{Name: name, Load: func() (*study.Study, error) {
			s, err := study.LoadScenario("tug")
			if err != nil {
				return nil, err
			}
			s.Settings["name"] = study.Setting{Name: "name", Value: name, Cell: s.Settings["name"].Cell}
			if points != "" {
				set := s.Settings["points"]
				set.Value = points
				s.Settings["points"] = set
				ctx.armed.Store(true)
			}
			return s, nil
		}})
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	outcomes := sweep.RunBatch(ctx, jobs, cat)
	if parent.Err() == nil {
		t.Fatal("the batch finished without being cancelled")
	}
	cancelled := 0
	for i, o := range outcomes {
		if errors.Is(o.Err, context.Canceled) {
			cancelled++
			if o.Result != nil {
				t.Errorf("%s: cancelled with a result", o.Name)
			}
		} else if i >= 2 {
			t.Errorf("%s (200,000 points): %v, want it cancelled", o.Name, o.Err)
		}
		if o.Result != nil {
			if _, err := report.WriteStudy(ctx, dir, o.Result); !errors.Is(err, context.Canceled) {
				t.Errorf("%s: written after the interrupt (%v)", o.Name, err)
			}
		}
	}
	if cancelled < 4 {
		t.Errorf("%d of %d studies cancelled, want the 4 large ones at least", cancelled, len(jobs))
	}
	rbCheckComplete(t, dir, bases)
	if got := rbEntries(t, dir); len(got) != 0 {
		t.Errorf("written after the interrupt: %v", got)
	}
}

// rbCancelAt is a context that cancels itself at the left-th check of
// Err once armed.
type rbCancelAt struct {
	context.Context
	cancel context.CancelFunc
	armed  atomic.Bool
	left   atomic.Int64
}

func (c *rbCancelAt) Err() error {
	if c.armed.Load() && c.left.Add(-1) == 0 {
		c.cancel()
	}
	return c.Context.Err()
}

// TestWriteStudyTwiceIdentical: the same study gives byte-identical
// outputs.
func TestWriteStudyTwiceIdentical(t *testing.T) {
	for _, sc := range []string{"tug", "pier"} {
		var dirs []string
		for range 2 {
			dir := t.TempDir()
			if _, err := report.WriteStudy(context.Background(), dir, rbRun(t, sc, "")); err != nil {
				t.Fatal(err)
			}
			dirs = append(dirs, dir)
		}
		a, b := rbEntries(t, dirs[0]), rbEntries(t, dirs[1])
		if strings.Join(a, ",") != strings.Join(b, ",") {
			t.Fatalf("%s: files %v and %v", sc, a, b)
		}
		for _, n := range a {
			x, _ := os.ReadFile(filepath.Join(dirs[0], n))
			y, _ := os.ReadFile(filepath.Join(dirs[1], n))
			if !bytes.Equal(x, y) {
				t.Errorf("%s: %s differs between two runs", sc, n)
			}
		}
	}
}
