package batch

import (
	"fmt"
	"io"
	"strings"
	"time"
)

// NewProgress reports a batch on w: a bar redrawn in place on a terminal, one plain
// line per card file otherwise (logs, CI).
func NewProgress(w io.Writer, terminal bool) Progress {
	return &progress{w: w, terminal: terminal}
}

type progress struct {
	w        io.Writer
	terminal bool
	total    int
	done     int
	start    time.Time
}

func (p *progress) Start(total int) {
	p.total, p.start = total, time.Now()
	if p.terminal {
		p.draw()
	}
}

func (p *progress) Done(r JobResult) {
	p.done++
	if p.terminal {
		p.draw()
		return
	}
	switch {
	case r.Canceled:
		fmt.Fprintf(p.w, "[%d/%d] not made (interrupted): %s\n", p.done, p.total, r.Entry.label())
	case r.Err != nil:
		fmt.Fprintf(p.w, "[%d/%d] FAILED %s: %v\n", p.done, p.total, r.Entry.label(), firstLine(r.Err.Error()))
	default:
		fmt.Fprintf(p.w, "[%d/%d] wrote %s (%d page(s))\n", p.done, p.total, r.Entry.label(), r.Pages)
	}
}

func (p *progress) Finish() {
	if p.terminal {
		fmt.Fprintln(p.w)
	}
}

func (p *progress) draw() {
	const width = 30
	filled := 0
	if p.total > 0 {
		filled = p.done * width / p.total
	}
	fmt.Fprintf(p.w, "\r[%s%s] %d/%d card files  %.1f s", strings.Repeat("#", filled), strings.Repeat(".", width-filled), p.done, p.total, time.Since(p.start).Seconds())
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i] + " ..."
	}
	return s
}
