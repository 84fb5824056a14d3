package report_test

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"testing"

	"scaleplan/report"
)

// TestWriteWorkbookCancelled: the workbook checks for an interrupt
// between its sheets and along its map sheets; cancelled at any of its
// checks, it stops with the context's error and leaves no file. The
// cancellation is driven by the context (countdownCtx), not a clock.
func TestWriteWorkbookCancelled(t *testing.T) {
	res := rbRun(t, "tug", "")
	stopped := 0
	for n := int64(0); n < 12; n++ {
		dir := t.TempDir()
		p := filepath.Join(dir, "tug.xlsx")
		ctx := &countdownCtx{Context: context.Background()}
		ctx.left.Store(n)
		err := report.WriteWorkbookContext(ctx, p, res)
		if err == nil {
			continue
		}
		if !errors.Is(err, context.Canceled) {
			t.Fatalf("after %d checks: %v", n, err)
		}
		stopped++
		if es, _ := os.ReadDir(dir); len(es) != 0 {
			t.Errorf("cancelled after %d checks: the folder holds %d files", n, len(es))
		}
	}
	// Three map sheets and the checks between sheets: at least four
	// places where an interrupt stops the workbook.
	if stopped < 4 {
		t.Errorf("the workbook stopped at %d checks, want at least 4", stopped)
	}
}

// TestWritePlotsCancelled: the maps check for an interrupt before each
// map; cancelled at the n-th check, exactly n maps are written.
func TestWritePlotsCancelled(t *testing.T) {
	res := rbRun(t, "tug", "")
	all, err := report.WritePlots(t.TempDir(), "tug", res, report.PlotPNG)
	if err != nil {
		t.Fatal(err)
	}
	for n := int64(0); n < int64(len(all)); n++ {
		ctx := &countdownCtx{Context: context.Background()}
		ctx.left.Store(n)
		files, err := report.WritePlotsContext(ctx, t.TempDir(), "tug", res, report.PlotPNG)
		if !errors.Is(err, context.Canceled) || int64(len(files)) != n {
			t.Errorf("cancelled at check %d: %d maps written, error %v", n, len(files), err)
		}
	}
}
