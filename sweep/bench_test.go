package sweep

import (
	"context"
	"math"
	"testing"

	"scaleplan/materials"
	"scaleplan/sweep/study"
)

func preparedSynthetic(b testing.TB, points, axis, cands, strats int) *Plan {
	b.Helper()
	lib, err := materials.Default()
	if err != nil {
		b.Fatal(err)
	}
	cat, err := NewFacilityCatalog()
	if err != nil {
		b.Fatal(err)
	}
	p, err := Prepare(study.Synthetic(points, axis, cands, strats), lib, cat)
	if err != nil {
		b.Fatal(err)
	}
	return p
}

// BenchmarkMarginGrid measures the sweep core: limit margins evaluated per
// second on one core (products-of-powers limits over a log grid).
func BenchmarkMarginGrid(b *testing.B) {
	const n, nl = 2000, 12
	us := make([]float64, n)
	for i := range us {
		us[i] = math.Log10(4) + float64(i)*math.Log10(20)/n
	}
	limits := make([]compiled, nl)
	for j := range limits {
		limits[j].info = LimitInfo{Name: "l", Linear: true, A: float64(j) * 0.1, B: 0.5 - float64(j)*0.1}
	}
	m := make([]float64, n)
	arg := make([]int, n)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		marginGrid(limits, us, m, arg)
	}
	b.ReportMetric(float64(n*nl)*float64(b.N)/b.Elapsed().Seconds(), "margins/s")
}

// BenchmarkWindow measures window finding from the limits of one
// combination.
func BenchmarkWindow(b *testing.B) {
	p := preparedSynthetic(b, 2000, 0, 1, 1)
	x, err := p.newCombo(p.Strategies[0].Cases[0], p.Media[0], nil, p.Facilities[0], math.NaN())
	if err != nil {
		b.Fatal(err)
	}
	limits, _, err := x.limitsFor()
	if err != nil {
		b.Fatal(err)
	}
	us := make([]float64, len(p.Grid))
	for i, k := range p.Grid {
		us[i] = math.Log10(k)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		limitWindow(limits, us, nil)
	}
}

// BenchmarkSyntheticRun sweeps the large synthetic study of the
// performance figures: 2,000 kL points × 100 second-axis points × 40
// candidates × 4 strategies (32 million points).
func BenchmarkSyntheticRun(b *testing.B) {
	p := preparedSynthetic(b, 2000, 100, 40, 4)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := p.Run(context.Background()); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(32e6*float64(b.N)/b.Elapsed().Seconds(), "points/s")
}

// BenchmarkScenarios runs every built-in scenario's sweep.
func BenchmarkScenarios(b *testing.B) { benchScenarios(b, "") }

// benchScenarios runs every built-in scenario, with the given number of
// draws of its uncertain inputs ("" keeps the study's own).
func benchScenarios(b *testing.B, samples string) {
	list, err := study.Scenarios()
	if err != nil {
		b.Fatal(err)
	}
	cat, _ := NewFacilityCatalog()
	for i := 0; i < b.N; i++ {
		for _, sc := range list {
			s, err := study.LoadScenario(sc.Name)
			if err != nil {
				b.Fatal(err)
			}
			if samples != "" {
				s.Settings["samples"] = study.Setting{Name: "samples", Value: samples, Cell: study.Cell{Sheet: "Study", Row: 99, Col: 2}}
			}
			lib, _ := materials.Default()
			p, err := Prepare(s, lib, cat)
			if err != nil {
				b.Fatal(err)
			}
			if _, err := p.Run(context.Background()); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// BenchmarkScenariosRobust runs every built-in scenario with 10,000 draws
// of its uncertain inputs; compare with BenchmarkScenarios.
func BenchmarkScenariosRobust(b *testing.B) { benchScenarios(b, "10000") }
