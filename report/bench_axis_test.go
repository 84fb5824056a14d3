package report

import (
	"context"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// BenchmarkSyntheticEndToEnd sweeps the 32-million-point synthetic study
// (2,000 kL points × 100 tank depths × 40 waters × 4 strategies) and
// writes every output (workbook, maps, memo), as `scaleplan run` does.
func BenchmarkSyntheticEndToEnd(b *testing.B) {
	p := syntheticPlan(b, 2000, 100, 40, 4)
	dir := b.TempDir()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		res, err := p.Run(context.Background())
		if err != nil {
			b.Fatal(err)
		}
		if _, err := WriteStudy(context.Background(), dir, res, PlotPNG); err != nil {
			b.Fatal(err)
		}
	}
}

// syntheticPlan prepares the synthetic study of the given size.
func syntheticPlan(b testing.TB, points, axis, cands, strats int) *sweep.Plan {
	b.Helper()
	lib, err := materials.Default()
	if err != nil {
		b.Fatal(err)
	}
	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		b.Fatal(err)
	}
	p, err := sweep.Prepare(study.Synthetic(points, axis, cands, strats), lib, cat)
	if err != nil {
		b.Fatal(err)
	}
	return p
}

// BenchmarkSyntheticWriteStudy writes every output of the 32-million-point
// synthetic study (swept once, outside the timing), as `scaleplan run`
// does: the part of the run a CPU profile of the writers looks at.
func BenchmarkSyntheticWriteStudy(b *testing.B) {
	res, err := syntheticPlan(b, 2000, 100, 40, 4).Run(context.Background())
	if err != nil {
		b.Fatal(err)
	}
	dir := b.TempDir()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := WriteStudy(context.Background(), dir, res, PlotPNG); err != nil {
			b.Fatal(err)
		}
	}
}
