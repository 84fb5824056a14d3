package sweep

import (
	"math"
	"math/rand/v2"
	"testing"
)

// gridPeak finds the peak of products-of-powers limits from their lines;
// it must equal the largest margin of a pass over the grid (scanPeak, the
// arithmetic of marginGrid), with and without a condition pinning a scale.
func TestGridPeakEqualsScan(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	us := make([]float64, 401)
	for i := range us {
		us[i] = math.Log10(4) + (math.Log10(80)-math.Log10(4))*float64(i)/float64(len(us)-1)
	}
	for trial := range 2000 {
		n := 1 + rng.IntN(8)
		limits := make([]compiled, n)
		for j := range limits {
			limits[j].info = LimitInfo{Linear: true, A: rng.NormFloat64(), B: 3 * rng.NormFloat64()}
		}
		condU := math.NaN()
		if trial%3 == 0 {
			condU = us[0] + (us[len(us)-1]-us[0])*(1.4*rng.Float64()-0.2)
		}
		got, want := gridPeak(limits, us, condU, false), scanPeak(limits, us, condU)
		if got != want {
			t.Fatalf("trial %d (%d lines, pin %v): peak %v, a pass over the grid gives %v", trial, n, condU, got, want)
		}
	}
	if p := gridPeak(nil, us, math.NaN(), true); !math.IsInf(p, -1) {
		t.Errorf("a failed condition: peak %v, want -Inf", p)
	}
}
