package sweep

import (
	"context"
	"runtime"
	"sync"

	"scaleplan/materials"
)

// Job is one study of a batch.
type Job struct {
	Name string
	Load func() (*Study, error)
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
	plan, err := Prepare(s, lib, cat)
	if err != nil {
		o.Err = err
		return o
	}
	o.Result, o.Err = plan.Run(ctx)
	return o
}
