package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"sync"
	"time"

	"golang.org/x/term"
)

// progress draws a one-line bar on a terminal for work that takes longer
// than about a second. It draws nothing when the writer is not a terminal
// (a pipe, a log file, a Makefile run) or when quiet is set.
type progress struct {
	mu      sync.Mutex
	w       io.Writer
	label   string
	total   int
	start   time.Time
	last    time.Time
	enabled bool
	drawn   bool
}

// newProgress returns a bar for total steps on w.
func newProgress(w io.Writer, label string, total int, quiet bool) *progress {
	p := &progress{w: w, label: label, total: total, start: time.Now()}
	if f, ok := w.(*os.File); ok && !quiet && term.IsTerminal(int(f.Fd())) {
		p.enabled = true
	}
	return p
}

// set records that done steps are finished. Safe for concurrent use.
func (p *progress) set(done int) {
	if !p.enabled {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	now := time.Now()
	if now.Sub(p.start) < time.Second || now.Sub(p.last) < 100*time.Millisecond {
		return
	}
	p.last = now
	const width = 30
	filled := width * done / max(p.total, 1)
	fmt.Fprintf(p.w, "\r%s [%s%s] %3d%%", p.label, strings.Repeat("#", filled), strings.Repeat(".", width-filled), 100*done/max(p.total, 1))
	p.drawn = true
}

// finish clears the bar if one was drawn.
func (p *progress) finish() {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.drawn {
		fmt.Fprintf(p.w, "\r%s\r", strings.Repeat(" ", len(p.label)+40))
	}
}

// progressFor returns the study's progress callback: one bar per stage on
// w.
func progressFor(w io.Writer, quiet bool) func(stage string, total int) (func(int), func()) {
	return func(stage string, total int) (func(int), func()) {
		bar := newProgress(w, stage, total, quiet)
		return bar.set, bar.finish
	}
}
