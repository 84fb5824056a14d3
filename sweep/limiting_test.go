package sweep

import (
	"math"
	"testing"
)

// TestMarginGridLimiting: each grid point names the limit with the
// smallest margin, or LimitingNone where no limit applies. Two products
// of powers by hand: margin 1 − log10 kL (0 at kL 10) and
// −1 + 0.5·log10 kL (0 at kL 100); at kL 1, 10, 100, 1000 the first gives
// 1, 0, −1, −2 and the second −1, −0.5, 0, 0.5.
func TestMarginGridLimiting(t *testing.T) {
	us := []float64{0, 1, 2, 3}
	m, arg := make([]float64, len(us)), make([]int, len(us))
	marginGrid(nil, us, m, arg)
	for i := range us {
		if !math.IsInf(m[i], 1) || arg[i] != LimitingNone {
			t.Errorf("no limits, point %d: margin %v, limiting %d, want +Inf and LimitingNone", i, m[i], arg[i])
		}
	}
	limits := []compiled{
		{info: LimitInfo{Name: "small", Linear: true, A: 1, B: -1}},
		{info: LimitInfo{Name: "large", Linear: true, A: -1, B: 0.5}},
	}
	marginGrid(limits, us, m, arg)
	want := []struct {
		m   float64
		arg int
	}{{-1, 1}, {-0.5, 1}, {-1, 0}, {-2, 0}}
	for i, w := range want {
		if m[i] != w.m || arg[i] != w.arg {
			t.Errorf("kL 1e%v: margin %v by limit %d, want %v by %d", us[i], m[i], arg[i], w.m, w.arg)
		}
	}
}
