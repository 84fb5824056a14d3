package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"sync/atomic"
)

// pauseEnv names a test-only environment variable (DEVELOPERS.md, "Bad
// input and what it gets"). SCALEPLAN_TEST_PAUSE=PHASE:N, PHASE batch or
// write, makes scaleplan run stop at the N-th time it checks for an
// interrupt in that phase (sweeping the studies, or writing their
// outputs), say "scaleplan: paused (PHASE N)" on stderr, and wait for the
// interrupt. The interrupt tests send Ctrl-C when they read that line, at
// a known point, rather than after a delay on the clock. Unset (always,
// outside the tests), run is unchanged.
const pauseEnv = "SCALEPLAN_TEST_PAUSE"

// pausedLine starts the line a paused run writes on stderr.
const pausedLine = "scaleplan: paused"

// pauseAt returns ctx, or, when pauseEnv names phase, a context that
// pauses at the N-th call of its Err method until ctx is done.
func pauseAt(ctx context.Context, phase string, stderr io.Writer) context.Context {
	p, n, ok := strings.Cut(os.Getenv(pauseEnv), ":")
	at, err := strconv.ParseInt(n, 10, 64)
	if !ok || p != phase || err != nil || at < 1 {
		return ctx
	}
	return &pauseCtx{Context: ctx, at: at, say: func() {
		fmt.Fprintf(stderr, "%s (%s %d)\n", pausedLine, phase, at)
	}}
}

// pauseCtx counts the checks of a context and holds the at-th one until
// the context is done.
type pauseCtx struct {
	context.Context
	calls atomic.Int64
	at    int64
	say   func()
}

func (c *pauseCtx) Err() error {
	if c.calls.Add(1) == c.at {
		c.say()
		<-c.Done()
	}
	return c.Context.Err()
}
