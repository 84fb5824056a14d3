package sweep

import (
	"math"
	"sort"
)

// The peak of a combination's margin: how close to feasible it comes. The
// margin at a scale is the smallest margin of its limits there; for
// products of powers every margin is a line in u = log10 kL, and the
// similarity condition pinning a scale adds −|u − u_pin| (two lines), so
// the margin is the smallest of lines: a concave function. Its largest
// value over an interval lies at an end or where two lines cross, and its
// largest value over the grid at one of the two grid points around that
// place. A contour map picks, among combinations with no window, the one
// whose margin peaks highest over the grid and the second axis: the peak is
// found this way at every axis value while the windows are found, in
// O(limits²), without sweeping the grid. A limit that is not a product of
// powers but whose sampled margins are concave along the grid (a run
// length) keeps the margin concave, and a ternary search over the grid
// points finds the peak; any other falls back to a pass over the grid. It
// is found at the axis values where the window is empty; a combination
// with a window somewhere has its peak swept on demand
// (ComboResult.AxisMarginPeak). The same peak, over the grid at the chosen
// axis value, names the combination that explains a strategy with no
// window (StrategyResult.Closest).

// line is a margin A + B·u.
type line struct{ a, b float64 }

func (l line) at(u float64) float64 { return l.a + l.b*u }

// lowest is the smallest of the lines at u (+Inf for none).
func lowest(lines []line, u float64) float64 {
	m := math.Inf(1)
	for _, l := range lines {
		if v := l.at(u); v < m {
			m = v
		}
	}
	return m
}

// concavePeak returns the u in [lo, hi] where the smallest of the lines is
// largest, and that value.
func concavePeak(lines []line, lo, hi float64) (float64, float64) {
	bu, bm := math.NaN(), math.Inf(-1)
	try := func(u float64) {
		if m := lowest(lines, u); m > bm {
			bu, bm = u, m
		}
	}
	try(lo)
	try(hi)
	for i := range lines {
		for j := i + 1; j < len(lines); j++ {
			a, b := lines[i], lines[j]
			if a.b == b.b {
				continue
			}
			if u := (b.a - a.a) / (a.b - b.b); u > lo && u < hi {
				try(u)
			}
		}
	}
	return bu, bm
}

// gridPeak is the largest margin over the grid us of the limits with the
// similarity conditions' term: −Inf when a condition fails (failed), and
// −|u − condU| when one pins log10 kL to condU (NaN: none). It equals the
// largest value of the margins marginGrid and sweep compute. buf (nil, or
// a slice made on first need) is scratch for a pass over the grid.
func gridPeak(limits []compiled, us []float64, condU float64, failed bool, buf *[]float64) float64 {
	if failed || len(us) == 0 {
		return math.Inf(-1)
	}
	lines := make([]line, 0, len(limits)+2)
	for _, l := range limits {
		switch {
		case l.info.Linear:
			lines = append(lines, line{l.info.A, l.info.B})
		case l.vals != nil && l.concave:
			return concaveGridPeak(limits, us, condU)
		default:
			return scanPeak(limits, us, condU, buf)
		}
	}
	if !math.IsNaN(condU) {
		lines = append(lines, line{-condU, 1}, line{condU, -1})
	}
	if len(lines) == 0 {
		return math.Inf(1)
	}
	u, _ := concavePeak(lines, us[0], us[len(us)-1])
	k := sort.SearchFloat64s(us, u)
	peak := math.Inf(-1)
	for _, i := range []int{k - 1, k} {
		if i >= 0 && i < len(us) {
			peak = math.Max(peak, gridMargin(lines, us[i], condU))
		}
	}
	return peak
}

// concaveGridPeak is gridPeak when every limit that is not a product of
// powers has margins concave along the grid: the smallest of concave
// sequences is concave, so a ternary search over the grid points finds
// its peak in O(limits · log points). Samples that are concave only to
// rounding (concaveSamples) can put the peak found a rounding error below
// the largest sample. A function concave in u peaks between two grid
// points where it is equal, whatever the grid's steps.
func concaveGridPeak(limits []compiled, us []float64, condU float64) float64 {
	for _, l := range limits {
		if !l.info.Linear && (l.vals == nil || !l.concave) {
			return scanPeak(limits, us, condU, nil)
		}
	}
	at := func(i int) float64 {
		m := math.Inf(1)
		for j := range limits {
			l := &limits[j]
			v := l.info.A + l.info.B*us[i]
			if !l.info.Linear {
				v = l.vals[i]
			}
			if v < m {
				m = v
			}
		}
		if !math.IsNaN(condU) {
			m = math.Min(m, -math.Abs(us[i]-condU))
		}
		return m
	}
	lo, hi := 0, len(us)-1
	for hi-lo > 8 {
		m1, m2 := lo+(hi-lo)/3, hi-(hi-lo)/3
		switch f1, f2 := at(m1), at(m2); {
		case f1 < f2:
			lo = m1 + 1
		case f1 > f2:
			hi = m2 - 1
		default: // a concave sequence peaks between two equal points
			lo, hi = m1, m2
		}
	}
	peak := math.Inf(-1)
	for i := lo; i <= hi; i++ {
		peak = math.Max(peak, at(i))
	}
	return peak
}

// concaveSamples says whether margins v sampled at the grid us are finite
// and concave: every slope between neighbours no steeper upwards than the
// one before, to a rounding error of the values (the grid's steps need not
// be equal: its last point is the range's end).
func concaveSamples(us, v []float64) bool {
	for i, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
		if i >= 2 {
			// slope (i−1, i) ≤ slope (i−2, i−1), multiplied out.
			d := (x-v[i-1])*(us[i-1]-us[i-2]) - (v[i-1]-v[i-2])*(us[i]-us[i-1])
			if d > 1e-12*(math.Abs(x)+math.Abs(v[i-1])+math.Abs(v[i-2])+1)*(us[i]-us[i-2]) {
				return false
			}
		}
	}
	return true
}

// gridMargin is the margin at a grid point as sweep computes it: the
// limits' lines, then the pinning condition's −|u − condU|.
func gridMargin(lines []line, u, condU float64) float64 {
	n := len(lines)
	if !math.IsNaN(condU) {
		n -= 2
	}
	m := lowest(lines[:n], u)
	if !math.IsNaN(condU) {
		m = math.Min(m, -math.Abs(u-condU))
	}
	return m
}

// scanPeak is gridPeak by passes over the grid, one per limit as in
// marginGrid, for limits that are not all products of powers; scratch
// (nil, or a slice kept between calls) holds the margins.
func scanPeak(limits []compiled, us []float64, condU float64, scratch *[]float64) float64 {
	var buf []float64
	if scratch != nil {
		buf = *scratch
	}
	if len(buf) != len(us) {
		buf = make([]float64, len(us))
		if scratch != nil {
			*scratch = buf
		}
	}
	for i := range buf {
		buf[i] = math.Inf(1)
	}
	for j := range limits {
		l := &limits[j]
		switch {
		case l.info.Linear:
			a, b := l.info.A, l.info.B
			for i, u := range us {
				if v := a + b*u; v < buf[i] {
					buf[i] = v
				}
			}
		case l.vals != nil:
			for i, v := range l.vals {
				if v < buf[i] {
					buf[i] = v
				}
			}
		default:
			for i, u := range us {
				if v := l.margin(u); v < buf[i] || math.IsNaN(v) {
					buf[i] = v
				}
			}
		}
	}
	peak := math.Inf(-1)
	for i, m := range buf {
		if !math.IsNaN(condU) {
			if v := -math.Abs(us[i] - condU); v < m {
				m = v
			}
		}
		if m > peak {
			peak = m
		}
	}
	return peak
}
