package sweep

import (
	"context"
	"errors"
	"strings"
	"sync/atomic"
	"testing"

	"scaleplan/sweep/study"
)

// tugJob is a job running the tug scenario with its points changed (when
// points is not "").
func tugJob(name, points string, maxPoints int) Job {
	return Job{Name: name, MaxPoints: maxPoints, Load: func() (*study.Study, error) {
		s, err := study.LoadScenario("tug")
		if err != nil {
			return nil, err
		}
		if points != "" {
			set := s.Settings["points"]
			set.Value = points
			s.Settings["points"] = set
		}
		return s, nil
	}}
}

// TestRunBatchMaxPoints: a job's MaxPoints replaces the study's
// max_points both ways, and the plan keeps the study as it was read.
func TestRunBatchMaxPoints(t *testing.T) {
	cat, err := NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	// 400 points × 6 combinations = 2400.
	out := RunBatch(context.Background(), []Job{tugJob("default", "", 0), tugJob("tight", "", 2399), tugJob("enough", "", 2400)}, cat)
	if out[0].Err != nil || out[2].Err != nil {
		t.Fatalf("errors: %v / %v", out[0].Err, out[2].Err)
	}
	want := "Study!B7: the sweep has 2.4e+03 points (400 grid points × 6 combinations), more than 2399: pass --max-points N to scaleplan run (or set max_points on the Study sheet) to allow it, or reduce points"
	if out[1].Err == nil || out[1].Err.Error() != want {
		t.Errorf("tight: %v, want %s", out[1].Err, want)
	}
	res := out[2].Result
	if res.Plan.Settings.MaxPoints != 2400 {
		t.Errorf("MaxPoints %d", res.Plan.Settings.MaxPoints)
	}
	if _, ok := res.Plan.Study.Settings["max_points"]; ok {
		t.Error("the plan's study holds a max_points setting the study does not have")
	}
	// Beyond what any flag may allow, the advice says so.
	s, _ := study.LoadScenario("tug")
	s.Settings["points"] = study.Setting{Name: "points", Value: "10000000", Cell: s.Settings["points"].Cell}
	s.Settings["axis"] = study.Setting{Name: "axis", Value: "temperature", Cell: study.Cell{Sheet: "Study", Row: 40, Col: 2}}
	s.Settings["axis_from"] = study.Setting{Name: "axis_from", Value: "5", Unit: "C", Cell: study.Cell{Sheet: "Study", Row: 41, Col: 2}}
	s.Settings["axis_to"] = study.Setting{Name: "axis_to", Value: "30", Unit: "C", Cell: study.Cell{Sheet: "Study", Row: 42, Col: 2}}
	s.Settings["axis_points"] = study.Setting{Name: "axis_points", Value: "1000", Cell: study.Cell{Sheet: "Study", Row: 43, Col: 2}}
	out = RunBatch(context.Background(), []Job{{Name: "huge", Load: func() (*study.Study, error) { return s, nil }, MaxPoints: MaxPointsLimit}}, cat)
	if out[0].Err == nil || !strings.Contains(out[0].Err.Error(), "the sweep has 6e+10 points (10000000000 grid points × 6 combinations), more than 2147483647: reduce points (or axis_points): --max-points allows at most 2147483647") {
		t.Errorf("huge: %v", out[0].Err)
	}
}

// TestRunBatchCancelled: a batch whose context is cancelled before it
// starts runs nothing and gives every job the context's error.
func TestRunBatchCancelled(t *testing.T) {
	cat, err := NewFacilityCatalog()
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	var loaded atomic.Int32
	jobs := []Job{}
	for range 20 {
		j := tugJob("x", "2000000", 0)
		load := j.Load
		j.Load = func() (*study.Study, error) { loaded.Add(1); return load() }
		jobs = append(jobs, j)
	}
	out := RunBatch(ctx, jobs, cat)
	for _, o := range out {
		if !errors.Is(o.Err, context.Canceled) || o.Result != nil {
			t.Errorf("%s: %v %v", o.Name, o.Err, o.Result)
		}
	}
	if n := loaded.Load(); n != 0 {
		t.Errorf("%d studies loaded after the interrupt", n)
	}
}
