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
// O(limits²), without sweeping the grid (a limit that is not a product of
// powers falls back to a pass over the grid).

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
// largest value of the margins marginGrid and sweep compute.
func gridPeak(limits []compiled, us []float64, condU float64, failed bool) float64 {
	if failed || len(us) == 0 {
		return math.Inf(-1)
	}
	lines := make([]line, 0, len(limits)+2)
	for _, l := range limits {
		if !l.info.Linear {
			return scanPeak(limits, us, condU)
		}
		lines = append(lines, line{l.info.A, l.info.B})
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

// scanPeak is gridPeak by a pass over the grid, for limits that are not
// all products of powers.
func scanPeak(limits []compiled, us []float64, condU float64) float64 {
	peak := math.Inf(-1)
	for i, u := range us {
		m := math.Inf(1)
		for j := range limits {
			if v := limits[j].marginAt(i, u); v < m {
				m = v
			}
		}
		if !math.IsNaN(condU) {
			m = math.Min(m, -math.Abs(u-condU))
		}
		peak = math.Max(peak, m)
	}
	return peak
}
