package sweep

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"runtime/debug"
	"strings"
	"testing"

	"scaleplan/sweep/study"
	"scaleplan/sweep/study/studytest"
)

// withSetting returns the tug study with settings changed (value, unit).
func tugWith(t *testing.T, settings map[string][2]string) *study.Study {
	t.Helper()
	s := scenario(t, "tug")
	row := 100
	for k, v := range settings {
		set, ok := s.Settings[k]
		if !ok {
			set = study.Setting{Name: k, Cell: study.Cell{Sheet: "Study", Row: row, Col: 2}}
			row++
		}
		set.Value, set.Unit = v[0], v[1]
		s.Settings[k] = set
	}
	return s
}

// TestDomainProblems: values outside what a sweep can take are refused
// when the study is checked, at their cell, with the reason and the fix.
func TestDomainProblems(t *testing.T) {
	tests := []struct {
		name     string
		settings map[string][2]string
		limits   []study.LimitRow
		want     string
	}{
		{"a scale range from 1e-200 to 1e200", map[string][2]string{"scale_from": {"1e-200", ""}, "scale_to": {"1e200", ""}}, nil,
			"Study!B5: the scale range 1e-200 to 1e+200 reaches beyond kL = 0.001 to 1e+06"},
		{"scale_from 5e-324", map[string][2]string{"scale_from": {"5e-324", ""}}, nil,
			"Study!B5: the scale range 5e-324 to 60 reaches beyond kL = 0.001 to 1e+06"},
		{"tank depths from -3 m", map[string][2]string{"axis": {"tank_depth", ""}, "axis_from": {"-3", "m"}, "axis_to": {"6", "m"}, "axis_spacing": {"linear", ""}}, nil,
			"the axis tank_depth must be positive (a facility capability), got -3 to 6: start it above 0"},
		{"a linear axis over ±1e308", map[string][2]string{"axis": {"temperature", ""}, "axis_from": {"-1e308", ""}, "axis_to": {"1e308", ""}, "axis_spacing": {"linear", ""}}, nil,
			"the axis temperature from -1e+308 to 1e+308 reaches beyond ±1e+12 (SI)"},
		{"a log axis over 25 decades", map[string][2]string{"axis": {"tank_depth", ""}, "axis_from": {"1e-15", "m"}, "axis_to": {"1e10", "m"}}, nil,
			"the axis tank_depth spans 25 decades"},
		{"a limit that divides by zero", nil, []study.LimitRow{{AppliesTo: "all", Limit: "zero_gap", Expression: "hull_length / (beam - beam) >= 1", Row: 2}},
			`Limits!C2: limit "zero_gap" has no finite value at kL = 4`},
		{"a limit with the root of a negative number", nil, []study.LimitRow{{AppliesTo: "all", Limit: "root", Expression: "sqrt(beam - hull_length) * sqrt(beam) >= 1 [m]", Row: 2}},
			`Limits!C2: limit "root" has no finite value at kL = 4`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := tugWith(t, tt.settings)
			s.Limits = append(s.Limits, tt.limits...)
			_, err := prepare(t, s)
			got := studytest.ProblemLines(t, err)
			for _, g := range got {
				if strings.Contains(g, tt.want) {
					return
				}
			}
			t.Errorf("no problem with %q; got:\n  %s", tt.want, strings.Join(got, "\n  "))
		})
	}
	// A temperature axis in °C may start below zero.
	s := tugWith(t, map[string][2]string{"axis": {"temperature", ""}, "axis_from": {"-1", "°C"}, "axis_to": {"30", "°C"}, "axis_spacing": {"linear", ""}, "axis_points": {"3", ""}})
	if _, err := prepare(t, s); err != nil && strings.Contains(err.Error(), "must be positive") {
		t.Errorf("a temperature axis from -1 °C refused: %v", err)
	}
}

// TestOneTypoOneError: a prototype item whose unit is misspelt is one
// problem, at its row; the limits, costs, measures and settings that name
// the item do not report it again as unknown.
func TestOneTypoOneError(t *testing.T) {
	s := scenario(t, "tug")
	for i := range s.Prototype {
		if s.Prototype[i].Name == "beam" {
			s.Prototype[i].Unit = "mx"
		}
	}
	s.Limits = append(s.Limits, study.LimitRow{AppliesTo: "all", Limit: "wide", Expression: "beam >= 0.1 [m]", Row: 2})
	s.Measures = append(s.Measures, study.MeasureRow{Measure: "model beam", Expression: "beam", Unit: "mm", Row: 2})
	s.Costs = append(s.Costs, study.CostRow{Item: "paint", Coefficient: "10", Per: "m", Measure: "beam", Row: 9})
	s.Uncertain = append(s.Uncertain, study.UncertainRow{Input: "beam", Distribution: "normal", Spread: "5%", Row: 2})
	_, err := prepare(t, s)
	got := studytest.ProblemLines(t, err)
	if len(got) != 1 || !strings.HasPrefix(got[0], `Prototype!B3: unit "mx"`) && !strings.HasPrefix(got[0], `Prototype!B3: value "11 mx"`) {
		t.Errorf("want one problem at Prototype!B3 (the misspelt unit), got:\n  %s", strings.Join(got, "\n  "))
	}
}

// TestMemoryRefusedUpFront: the 10,000,000-point study of the synthetic
// generator needs more than the soft memory limit of `scaleplan run`
// (768 MiB); it is refused when checked, with the memory it would need,
// before anything is allocated for the sweep.
func TestMemoryRefusedUpFront(t *testing.T) {
	old := debug.SetMemoryLimit(DefaultMemoryBudget)
	defer debug.SetMemoryLimit(old)
	big := study.Synthetic(10_000_000, 0, 1, 1)
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	_, err := prepare(t, big)
	runtime.ReadMemStats(&after)
	// Refused before the grid is made: the grid alone would be 80 MB (the
	// library and the catalogue take about 1 MB).
	if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 16<<20 {
		t.Errorf("the refused check allocated %d bytes", alloc)
	}
	got := studytest.ProblemLines(t, err)
	// 10^7 points × (80 + 160) bytes = 2.4e9 bytes = 2288.82 MiB, and 96
	// MiB for the program: 2385 MiB. At most 10^7 × (768 − 96) MiB /
	// 2288.82 MiB = 2936012 points fit.
	want := "Study!B6: the sweep would need about 2385 MiB of memory (10000000 grid points × 1 combinations), more than the soft limit of 768 MiB: reduce points to at most 2936012 "
	if len(got) != 1 || !strings.HasPrefix(got[0], want) {
		t.Errorf("want %q, got:\n  %s", want, strings.Join(got, "\n  "))
	}
	// Within the budget, the study is accepted.
	if _, err := prepare(t, study.Synthetic(1_000_000, 0, 1, 1)); err != nil {
		t.Errorf("1,000,000 points refused: %v", err)
	}
}

// BenchmarkSyntheticPeak sweeps the synthetic study and reports the heap
// the result holds per grid point and combination (live bytes after a
// collection), the figure bytesPerPoint rounds up with room for the
// outputs. Run with -benchtime=1x.
func BenchmarkSyntheticPeak(b *testing.B) {
	for _, size := range []struct{ points, cands int }{{200_000, 1}, {200_000, 4}} {
		b.Run(fmt.Sprintf("%dx%d", size.points, size.cands), func(b *testing.B) {
			plan := preparedSynthetic(b, size.points, 0, size.cands, 1)
			var before, after runtime.MemStats
			runtime.GC()
			runtime.ReadMemStats(&before)
			res, err := plan.Run(context.Background())
			if err != nil {
				b.Fatal(err)
			}
			runtime.GC()
			runtime.ReadMemStats(&after)
			n := float64(size.points * size.cands)
			b.ReportMetric(float64(after.HeapAlloc-before.HeapAlloc)/n, "B/point")
			b.ReportMetric(float64(after.HeapAlloc)/(1<<20), "MiB-live")
			runtime.KeepAlive(res)
		})
	}
}

// TestRequirementsCancelled: the requirement curves (the longest step of
// a combination at a million points) stop when the context is done.
func TestRequirementsCancelled(t *testing.T) {
	plan, x := froudeCombo(t, nil)
	limits, _, err := x.limitsFor()
	if err != nil {
		t.Fatal(err)
	}
	us := make([]float64, 1000)
	for i := range us {
		us[i] = math.Log10(plan.Grid[0]) + float64(i)/float64(len(us))
	}
	if got := x.requirements(context.Background(), limits, us); len(got) == 0 {
		t.Fatal("no requirement to compute: the test needs a facility limit")
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if got := x.requirements(ctx, limits, us); got != nil {
		t.Errorf("a cancelled context still gave %d requirement curves", len(got))
	}
}

// TestMemoryOfDraws: ten million draws of the uncertain inputs, held by
// each combination being sampled, count against the memory budget too.
func TestMemoryOfDraws(t *testing.T) {
	old := debug.SetMemoryLimit(DefaultMemoryBudget)
	defer debug.SetMemoryLimit(old)
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(2))
	s := tugWith(t, map[string][2]string{"samples": {"10000000", ""}})
	inputs := len(s.Uncertain) + 1 // 3
	s.Uncertain = append(s.Uncertain, study.UncertainRow{Input: "beam", Distribution: "normal", Spread: "2%", Row: 9})
	_, err := prepare(t, s)
	// With the tug's two uncertain inputs and beam: 10^7 draws × (24 +
	// 8 × 3) bytes × 2 combinations at once = 960 MB, above 768 MiB
	// (805 MB).
	if got := studytest.ProblemLines(t, err); len(got) != 1 || !strings.HasPrefix(got[0], "Study!") || !strings.Contains(got[0], fmt.Sprintf("(10000000 draws × %d inputs)", inputs)) || !strings.Contains(got[0], "reduce samples to at most") {
		t.Errorf("want the memory refusal of the draws, got:\n  %s", strings.Join(got, "\n  "))
	}
	// A thousand draws fit.
	s = tugWith(t, map[string][2]string{"samples": {"1000", ""}})
	s.Uncertain = append(s.Uncertain, study.UncertainRow{Input: "hull_length", Distribution: "normal", Spread: "2%", Row: 2})
	if _, err := prepare(t, s); err != nil {
		t.Errorf("1000 draws refused: %v", err)
	}
}

// TestRobustCancelled: sampling the uncertain inputs stops when the
// context is done.
func TestRobustCancelled(t *testing.T) {
	plan, x := froudeCombo(t, map[string][2]string{"samples": {"50000", ""}})
	us := make([]float64, len(plan.Grid))
	for i, k := range plan.Grid {
		us[i] = math.Log10(k)
	}
	out, err := x.sweep(context.Background(), us, sampleCache{}, make([]int, len(us)))
	if err != nil {
		t.Fatal(err)
	}
	if r := out.robust(context.Background(), us, 1, 0); r == nil || len(r.Probability) != len(us) {
		t.Fatal("no robust result to compare with")
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if r := out.robust(ctx, us, 1, 0); r != nil {
		t.Error("a cancelled context still gave a robust result")
	}
}

// froudeCombo prepares the tug study with settings changed and returns
// the combination of its Froude-scaling strategy in its first medium and
// facility.
func froudeCombo(t *testing.T, settings map[string][2]string) (*Plan, *combo) {
	t.Helper()
	plan, err := prepare(t, tugWith(t, settings))
	if err != nil {
		t.Fatal(err)
	}
	c := plan.Strategies[1].Cases[0]
	x, err := plan.newCombo(c, c.Media[0], nil, c.Facilities[0], math.NaN())
	if err != nil {
		t.Fatal(err)
	}
	return plan, x
}
