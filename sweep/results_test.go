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
