package sweep

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"strconv"
	"sync"

	"scaleplan/materials"
	"scaleplan/sweep/study"
)

// Job is one study of a batch.
type Job struct {
	Name string
	Load func() (*study.Study, error)
	// MaxPoints, when above 0, replaces the study's max_points setting:
	// the largest sweep (grid points × combinations) the study may run
	// (scaleplan run --max-points). It is at most MaxPointsLimit.
	MaxPoints int
	// Done, when set, is called with the job's outcome as soon as it
	// finishes (from the job's goroutine): a progress display.
	Done func(Outcome)
}

// MaxPointsLimit is the largest max_points a study or a job may set.
const MaxPointsLimit = math.MaxInt32

// tooManyPoints is the advice for a sweep of n points, more than its
// max_points allows.
func tooManyPoints(n float64) string {
	if n > MaxPointsLimit {
		return fmt.Sprintf("reduce points (or axis_points): --max-points allows at most %d", MaxPointsLimit)
	}
	return "pass --max-points N to scaleplan run (or set max_points on the Study sheet) to allow it, or reduce points"
}

// Outcome is what a job gives: a result, or every problem of its study.
type Outcome struct {
	Name   string
	Result *Result
	Err    error
}

// RunBatch loads, checks and runs the studies in parallel, one per core at
// most, and returns their outcomes in the order of the jobs. Each study
// gets a library of its own, so custom entries never leak between them.
//
// When ctx is cancelled (an interrupt), no further study is started, a
// running one stops after the combination it is sweeping, and each job
// that did not finish has ctx's error as its Err.
func RunBatch(ctx context.Context, jobs []Job, cat *FacilityCatalog) []Outcome {
	out := make([]Outcome, len(jobs))
	sem := make(chan struct{}, max(1, runtime.GOMAXPROCS(0)))
	var wg sync.WaitGroup
	for i, j := range jobs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			sem <- struct{}{}
			defer func() { <-sem }()
			out[i] = runJob(ctx, j, cat)
			if j.Done != nil {
				j.Done(out[i])
			}
		}()
	}
	wg.Wait()
	return out
}

func runJob(ctx context.Context, j Job, cat *FacilityCatalog) Outcome {
	o := Outcome{Name: j.Name}
	if err := ctx.Err(); err != nil {
		o.Err = err
		return o
	}
	s, err := j.Load()
	if err != nil {
		o.Err = err
		return o
	}
	lib, err := materials.Default()
	if err != nil {
		o.Err = err
		return o
	}
	plan, err := Prepare(withMaxPoints(s, j.MaxPoints), lib, cat)
	if err != nil {
		o.Err = err
		return o
	}
	// The plan keeps the study as it was read: the outputs echo the input.
	plan.Study = s
	if err := ctx.Err(); err != nil {
		o.Err = err
		return o
	}
	o.Result, o.Err = plan.Run(ctx)
	if o.Err != nil {
		o.Result = nil
	}
	return o
}

// withMaxPoints returns s, or with n > 0 a copy of s whose max_points
// setting is n (in the cell of the study's own setting, if it has one).
func withMaxPoints(s *study.Study, n int) *study.Study {
	if n <= 0 {
		return s
	}
	c := *s
	c.Settings = make(map[string]study.Setting, len(s.Settings)+1)
	for k, v := range s.Settings {
		c.Settings[k] = v
	}
	set, ok := c.Settings["max_points"]
	if !ok {
		set = study.Setting{Name: "max_points", Cell: study.Cell{Sheet: "Study"}}
	}
	set.Value = strconv.Itoa(n)
	c.Settings["max_points"] = set
	return &c
}
