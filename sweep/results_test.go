package sweep

import (
	"math"
	"testing"
)

// TestLimitMarginAt: a products-of-powers limit's margin at a scale, in
// decades. A limit speed_model <= 6 m/s with a prototype speed of 12 m/s
// under Froude scaling (speed ∝ kL^-1/2): margin = log10(6/12) + ½·log10 kL,
// so A = log10(0.5) = −0.30103, B = 0.5; at kL = 16 the model speed is
// 3 m/s and the margin log10(6/3) = 0.30103 decades (by hand).
func TestLimitMarginAt(t *testing.T) {
	l := LimitInfo{Name: "carriage speed", Linear: true, A: math.Log10(0.5), B: 0.5}
	if got := l.MarginAt(16); math.Abs(got-math.Log10(2)) > 1e-12 {
		t.Errorf("margin at 1:16 = %v decades, want log10 2 = 0.30103", got)
	}
	if got := l.MarginAt(4); math.Abs(got) > 1e-12 {
		t.Errorf("margin at 1:4 = %v decades, want 0 (the model runs at 6 m/s)", got)
	}
	for _, c := range []struct {
		l  LimitInfo
		kL float64
	}{{LimitInfo{Linear: false, A: 1, B: 1}, 10}, {l, math.NaN()}} {
		if got := c.l.MarginAt(c.kL); !math.IsNaN(got) {
			t.Errorf("MarginAt(%v) of %+v = %v, want NaN", c.kL, c.l, got)
		}
	}
}

// ScaleBeside gives a scale next to another enough figures to read
// differently (the cases written out by hand).
func TestScaleBeside(t *testing.T) {
	for _, tc := range []struct {
		kL, ref float64
		want    string
	}{
		{11.38, 11.43, "1:11.38"}, // both read 1:11.4 at Scale's figures
		{148.9, 150.0, "1:148.9"}, // already different
		{8.7, 8.75, "1:8.7"},
		{5.9999, 6.0001, "1:5.9999"},
		{25, 25, "1:25"},
		{math.NaN(), 3, "-"},
	} {
		if got := ScaleBeside(tc.kL, tc.ref); got != tc.want {
			t.Errorf("ScaleBeside(%v, %v) = %q, want %q", tc.kL, tc.ref, got, tc.want)
		}
	}
}
