package report

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"context"
	"fmt"
	"io"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/materials"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

func syntheticResult(b *testing.B) *sweep.Result {
	b.Helper()
	return runStudy(b, study.Synthetic(2000, 0, 40, 4))
}

// runStudy prepares a study with a fresh library and facility catalogue
// and runs it.
func runStudy(tb testing.TB, s *study.Study) *sweep.Result {
	tb.Helper()
	lib, err := materials.Default()
	if err != nil {
		tb.Fatal(err)
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		tb.Fatal(err)
	}
	p, err := sweep.Prepare(s, lib, cat)
	if err != nil {
		tb.Fatal(err)
	}
	res, err := p.Run(context.Background())
	if err != nil {
		tb.Fatal(err)
	}
	return res
}

// countCells counts the non-empty cells of a workbook.
func countCells(b *testing.B, data []byte) (cells, cols int) {
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		b.Fatal(err)
	}
	defer f.Close()
	for _, sh := range f.GetSheetList() {
		rows, err := f.GetRows(sh)
		if err != nil {
			b.Fatal(err)
		}
		for _, r := range rows {
			for _, c := range r {
				if c != "" {
					cells++
				}
			}
			cols = max(cols, len(r))
		}
	}
	return cells, cols
}

// BenchmarkWorkbook writes the workbook of a synthetic study (2,000 kL
// points × 40 candidates × 4 strategies) and reports cells per second.
func BenchmarkWorkbook(b *testing.B) {
	res := syntheticResult(b)
	var buf bytes.Buffer
	if err := writeWorkbook(context.Background(), &buf, res); err != nil {
		b.Fatal(err)
	}
	cells, _ := countCells(b, buf.Bytes())
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := writeWorkbook(context.Background(), io.Discard, res); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(cells)*float64(b.N)/b.Elapsed().Seconds(), "cells/s")
}

// BenchmarkStreamWriterAlone writes as many cells as BenchmarkWorkbook with
// the spreadsheet library's streaming writer alone, numbers and short
// texts in rows of 80: the yardstick for the workbook's overhead.
func BenchmarkStreamWriterAlone(b *testing.B) { benchStreamWriter(b, nil) }

// BenchmarkStreamWriterAloneLevel2 is BenchmarkStreamWriterAlone with the
// archive compressed at the workbook's deflate level (zipLevel) rather
// than the library's default, so that the two differ only in what they
// write.
func BenchmarkStreamWriterAloneLevel2(b *testing.B) {
	benchStreamWriter(b, func(w io.Writer) excelize.ZipWriter {
		zw := zip.NewWriter(w)
		zw.RegisterCompressor(zip.Deflate, func(out io.Writer) (io.WriteCloser, error) { return flate.NewWriter(out, zipLevel) })
		return zw
	})
}

func benchStreamWriter(b *testing.B, zipWriter func(io.Writer) excelize.ZipWriter) {
	res := syntheticResult(b)
	var buf bytes.Buffer
	if err := writeWorkbook(context.Background(), &buf, res); err != nil {
		b.Fatal(err)
	}
	cells, _ := countCells(b, buf.Bytes())
	const width = 80
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		f := excelize.NewFile()
		if zipWriter != nil {
			f.SetZipWriter(zipWriter)
		}
		sw, err := f.NewStreamWriter("Sheet1")
		if err != nil {
			b.Fatal(err)
		}
		row := make([]any, width)
		for n, r := 0, 1; n < cells; r++ {
			for k := range row {
				if k%2 == 0 {
					row[k] = float64(n) * 0.001
				} else {
					row[k] = fmt.Sprintf("limit %d", k)
				}
			}
			cell, _ := excelize.CoordinatesToCellName(1, r)
			if err := sw.SetRow(cell, row); err != nil {
				b.Fatal(err)
			}
			n += width
		}
		if err := sw.Flush(); err != nil {
			b.Fatal(err)
		}
		if err := f.Write(io.Discard); err != nil {
			b.Fatal(err)
		}
		f.Close()
	}
	b.ReportMetric(float64(cells)*float64(b.N)/b.Elapsed().Seconds(), "cells/s")
}

// BenchmarkPlots renders every feasibility map of the synthetic study as
// PNG.
func BenchmarkPlots(b *testing.B) {
	res := syntheticResult(b)
	dir := b.TempDir()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := WritePlots(dir, "bench", res, PlotPNG); err != nil {
			b.Fatal(err)
		}
	}
}
