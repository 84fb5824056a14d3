package main

import (
	"bytes"
	"os"
	"strings"
	"testing"
)

// TestProgressOnlyOnATerminal: a file, a pipe and a buffer are not
// terminals, so a run that writes its errors there shows no progress line.
func TestProgressOnlyOnATerminal(t *testing.T) {
	f, err := os.Create(t.TempDir() + "/stderr.txt")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r, w, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	defer w.Close()
	for name, out := range map[string]any{"file": f, "pipe": w, "buffer": &bytes.Buffer{}} {
		wr := out.(interface{ Write([]byte) (int, error) })
		if isTerminal(wr) {
			t.Errorf("a %s is taken for a terminal", name)
		}
		if p := newProgress(wr, 3); p != nil {
			t.Errorf("a %s gets a progress display", name)
		}
	}
	// A nil display is off: every method is safe.
	var p *progress
	p.swept("x")
	p.writing(1, 2, "x")
	p.clear()
}

// TestProgressLines: the display counts the studies swept (from several
// goroutines), names the study being written, and clears its line.
func TestProgressLines(t *testing.T) {
	var buf bytes.Buffer
	p := startProgress(&buf, 3)
	done := make(chan struct{})
	for _, n := range []string{"a", "b", "c"} {
		go func() { p.swept(n); done <- struct{}{} }()
	}
	for range 3 {
		<-done
	}
	p.writing(2, 3, "b")
	p.clear()
	out := buf.String()
	for _, want := range []string{"sweeping 3 studies…", "swept 1 of 3: ", "swept 3 of 3: ", "writing outputs 2 of 3: b"} {
		if !strings.Contains(out, want) {
			t.Errorf("progress output lacks %q: %q", want, out)
		}
	}
	if !strings.HasSuffix(out, "\r\x1b[K") {
		t.Errorf("the last thing drawn does not clear the line: %q", out)
	}
	if strings.Contains(out, "\n") {
		t.Errorf("the progress display uses more than one line: %q", out)
	}
}
