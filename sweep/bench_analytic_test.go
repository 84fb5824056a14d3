package sweep

import (
	"context"
	"fmt"
	"math"
	"testing"
)

// The analytic paths work from the compiled limits alone: their cost must
// not depend on the number of grid points. Each benchmark runs at 1e3 and
// 1e6 points of the synthetic tug study (100 tank depths as second axis);
// compare the ns/op of the two sizes.

var analyticSizes = []int{1000, 1000000}

// analyticSetup prepares one combination of the synthetic study at a grid
// of n points, with its limits compiled and the grid margins of the limits
// that are not products of powers sampled once (as the sweep does for the
// first axis value).
func analyticSetup(b *testing.B, n int) (*axisSweep, sampleCache) {
	b.Helper()
	p := preparedSynthetic(b, n, 100, 1, 1)
	us := make([]float64, len(p.Grid))
	for i, k := range p.Grid {
		us[i] = math.Log10(k)
	}
	ax := &axisSweep{plan: p, cas: p.Strategies[0].Cases[0], medium: p.Media[0], fac: p.Facilities[0],
		axes: p.AxisValues, us: us, lp: &limitPlan{}}
	cache := sampleCache{}
	if _, _, _, err := ax.choose(context.Background(), cache); err != nil {
		b.Fatal(err)
	}
	return ax, cache
}

func forSizes(b *testing.B, run func(b *testing.B, ax *axisSweep, cache sampleCache)) {
	for _, n := range analyticSizes {
		b.Run(fmt.Sprintf("points=%.0e", float64(n)), func(b *testing.B) {
			ax, cache := analyticSetup(b, n)
			b.ReportAllocs()
			b.ResetTimer()
			run(b, ax, cache)
		})
	}
}

// BenchmarkAnalyticWindow finds one combination's window at one axis
// value from its compiled limits.
func BenchmarkAnalyticWindow(b *testing.B) {
	forSizes(b, func(b *testing.B, ax *axisSweep, cache sampleCache) {
		x, err := ax.combo(ax.axes[len(ax.axes)/2])
		if err != nil {
			b.Fatal(err)
		}
		limits, _, err := x.compiledLimits()
		if err != nil {
			b.Fatal(err)
		}
		if err := sample(context.Background(), limits, ax.us, cache); err != nil {
			b.Fatal(err)
		}
		b.ResetTimer()
		for i := 0; i < b.N; i++ {
			if w := limitWindow(limits, ax.us, nil); len(w) == 0 {
				b.Fatal("empty window")
			}
		}
	})
}

// BenchmarkAnalyticAxis chooses the best of 100 second-axis values of one
// combination: each value's limits re-formed and its window found.
func BenchmarkAnalyticAxis(b *testing.B) {
	forSizes(b, func(b *testing.B, ax *axisSweep, cache sampleCache) {
		for i := 0; i < b.N; i++ {
			if _, _, _, err := ax.choose(context.Background(), cache); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkAnalyticRequirement solves one combination's limits for the
// capabilities they name (the log-linear requirement forms).
func BenchmarkAnalyticRequirement(b *testing.B) {
	forSizes(b, func(b *testing.B, ax *axisSweep, cache sampleCache) {
		x, err := ax.combo(ax.axes[0])
		if err != nil {
			b.Fatal(err)
		}
		limits, _, err := x.compiledLimits()
		if err != nil {
			b.Fatal(err)
		}
		b.ResetTimer()
		for i := 0; i < b.N; i++ {
			if len(x.requirementForms(limits)) == 0 {
				b.Fatal("no requirements")
			}
		}
	})
}
