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
		got, want := gridPeak(limits, us, condU, false, nil), scanPeak(limits, us, condU, nil)
		if got != want {
			t.Fatalf("trial %d (%d lines, pin %v): peak %v, a pass over the grid gives %v", trial, n, condU, got, want)
		}
	}
	if p := gridPeak(nil, us, math.NaN(), true, nil); !math.IsInf(p, -1) {
		t.Errorf("a failed condition: peak %v, want -Inf", p)
	}
}

// With limits that are not products of powers, the peak is found by a
// ternary search when their sampled margins are concave (a run length: a
// sum of products of powers against one, whose margin −log10 of a sum of
// exponentials is concave) and by a pass over the grid otherwise; both
// agree with the pass to a rounding error.
func TestGridPeakWithSampledLimits(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	// Unequal steps, as a grid whose last point is the range's end has.
	us := make([]float64, 2000)
	for i := range us {
		us[i] = math.Log10(4) + (math.Log10(80)-math.Log10(4))*(float64(i)+0.4*rng.Float64())/float64(len(us))
	}
	for trial := range 500 {
		n := 1 + rng.IntN(6)
		limits := make([]compiled, n+1)
		for j := range n {
			limits[j].info = LimitInfo{Linear: true, A: rng.NormFloat64(), B: 3 * rng.NormFloat64()}
		}
		// A run length v·t + c·L ≤ tank: margin log10(tank) − log10(Σ e^{aᵢ + bᵢ ln kL}).
		a1, b1, a2, b2, tank := rng.NormFloat64(), -1.5+rng.Float64(), rng.NormFloat64(), -1+rng.Float64(), 1+3*rng.Float64()
		wavy := trial%4 == 0
		vals := make([]float64, len(us))
		for i, u := range us {
			ln := u * math.Ln10
			vals[i] = math.Log10(tank) - math.Log10(math.Exp(a1+b1*ln)+math.Exp(a2+b2*ln))
			if wavy {
				vals[i] += 0.3 * math.Sin(9*u)
			}
		}
		limits[n].vals = vals
		limits[n].concave = concaveSamples(us, vals)
		if limits[n].concave == wavy {
			t.Fatalf("trial %d: samples concave %v, want %v", trial, limits[n].concave, !wavy)
		}
		condU := math.NaN()
		if trial%3 == 0 {
			condU = us[0] + (us[len(us)-1]-us[0])*rng.Float64()
		}
		got, want := gridPeak(limits, us, condU, false, nil), scanPeak(limits, us, condU, nil)
		if math.Abs(got-want) > 1e-12*(1+math.Abs(want)) {
			t.Fatalf("trial %d (wavy %v, pin %v): peak %v, a pass over the grid gives %v", trial, wavy, condU, got, want)
		}
	}
}
