package main

import (
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"time"
)

// progress shows a one-line count of the objects assessed on standard error,
// rewritten in place with '\r', when standard error is a terminal and the
// work has taken more than a second; at most ten updates a second. Silent
// otherwise (a file, a pipe, a test buffer). The total is not known while a
// survey streams in (the rows are counted as they are read), so the line
// gives the count and the survey's place among several, not a percentage.
type progress struct {
	w       io.Writer
	enabled bool
	now     func() time.Time
	start   time.Time
	last    time.Time
	label   string
	width   int // length of the last line written, to blank it
}

// newProgress returns a progress line on w, enabled when w is a terminal.
func newProgress(w io.Writer) *progress {
	p := &progress{w: w, now: time.Now}
	if f, ok := w.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			p.enabled = true
		}
	}
	return p
}

// Begin starts the count of one survey (label names it).
func (p *progress) Begin(label string) {
	p.label = label
	p.start = p.now()
	p.last = time.Time{}
}

// Set reports n objects assessed so far.
func (p *progress) Set(n int) {
	if !p.enabled {
		return
	}
	t := p.now()
	if t.Sub(p.start) < time.Second || (!p.last.IsZero() && t.Sub(p.last) < 100*time.Millisecond) {
		return
	}
	p.last = t
	line := fmt.Sprintf("assessing %s: %s objects (%s)", p.label, grouped(n), t.Sub(p.start).Truncate(time.Second))
	pad := ""
	if len(line) < p.width {
		pad = strings.Repeat(" ", p.width-len(line))
	}
	p.width = len(line)
	fmt.Fprint(p.w, "\r"+line+pad)
}

// End blanks the line, if one was written.
func (p *progress) End() {
	if p.width > 0 {
		fmt.Fprint(p.w, "\r"+strings.Repeat(" ", p.width)+"\r")
		p.width = 0
	}
}

// grouped writes n with a space between groups of three digits: 1 048 575.
func grouped(n int) string {
	s := strconv.Itoa(n)
	var b strings.Builder
	for i, c := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(' ')
		}
		b.WriteRune(c)
	}
	return b.String()
}
