package main

import (
	"fmt"
	"io"
	"os"
	"sync"
)

// progress shows on one line of a terminal how far a batch is: the
// studies swept, then the studies written. It draws nothing when stderr is
// not a terminal (a file, a pipe, a test's buffer), so logs and captured
// output stay clean; a nil *progress is off.
type progress struct {
	w     io.Writer
	total int
	mu    sync.Mutex
	done  int
}

// isTerminal reports whether w is a character device (a terminal).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	info, err := f.Stat()
	return err == nil && info.Mode()&os.ModeCharDevice != 0
}

// newProgress returns a progress display on stderr for a batch of total
// studies, or nil when stderr is not a terminal.
func newProgress(stderr io.Writer, total int) *progress {
	if !isTerminal(stderr) {
		return nil
	}
	return startProgress(stderr, total)
}

// startProgress starts a display on w whatever w is.
func startProgress(w io.Writer, total int) *progress {
	p := &progress{w: w, total: total}
	p.show(fmt.Sprintf("sweeping %d %s…", total, plural(total, "study", "studies")))
	return p
}

// show replaces the progress line.
func (p *progress) show(s string) { fmt.Fprintf(p.w, "\r\x1b[K%s", s) }

// swept counts a study whose sweep finished; safe from several goroutines.
func (p *progress) swept(name string) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	p.done++
	p.show(fmt.Sprintf("swept %d of %d: %s", p.done, p.total, name))
}

// writing says which study's outputs are being written (the k-th of n).
func (p *progress) writing(k, n int, name string) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	p.show(fmt.Sprintf("writing outputs %d of %d: %s", k, n, name))
}

// clear removes the progress line before the results are printed.
func (p *progress) clear() {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	fmt.Fprint(p.w, "\r\x1b[K")
}
