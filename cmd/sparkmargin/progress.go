package main

import (
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"time"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/report"
)

// progress shows one line on standard error while a survey is assessed,
// when standard error is a terminal and the work has taken more than a
// second, at most ten updates a second: the objects assessed out of the rows
// the Objects sheet declares, the percentage and the time left
// ("assessing big.xlsx: 42 000 of 50 000 objects (84 %), 0:12 left"); with no
// declared total, or past it, the count and the time so far.
//
// The line is rewritten in place with a carriage return and blanked with
// spaces: no colour, cursor or erase codes, so any console shows it,
// Windows' console host without virtual-terminal processing included.
//
// Our own rather than a progress-bar library: the line needs a total that
// may be absent or wrong (a writer's claim, see inventory's
// DeclaredObjectRows), carriage returns only, an injected clock for the
// tests and nothing else; the libraries that fit bring cursor and colour
// handling (and their dependencies) that would have to be switched off.
type progress struct {
	w     io.Writer
	now   func() time.Time
	start time.Time
	last  time.Time
	label string
	total int // rows the sheet declares; 0 unknown
	width int // length of the last line written, in characters, to blank it
}

// progressFor returns the progress line on w when w is a terminal, else nil
// (the pipeline then neither counts rows for it nor reports to it).
func progressFor(w io.Writer) report.Progress {
	if !isTerminal(w) {
		return nil
	}
	return newProgress(w)
}

func newProgress(w io.Writer) *progress { return &progress{w: w, now: time.Now} }

// isTerminal reports whether w is a character device (a terminal or a
// console). /dev/null and NUL are character devices too: a line written
// there is seen by nobody, which does no harm.
func isTerminal(w io.Writer) bool {
	f, ok := rawOut(w).(*os.File)
	if !ok {
		return false
	}
	fi, err := f.Stat()
	return err == nil && fi.Mode()&os.ModeCharDevice != 0
}

// Begin starts the line of one survey (label names it).
func (p *progress) Begin(label string) {
	p.label, p.total = label, 0
	p.start = p.now()
	p.last = time.Time{}
}

// Total gives the rows the survey's Objects sheet declares (0: unknown).
func (p *progress) Total(rows int) { p.total = rows }

// Set reports n objects assessed so far.
func (p *progress) Set(n int) {
	t := p.now()
	if t.Sub(p.start) < time.Second || (!p.last.IsZero() && t.Sub(p.last) < 100*time.Millisecond) {
		return
	}
	p.last = t
	line := progressLine(p.label, n, p.total, t.Sub(p.start))
	w := utf8.RuneCountInString(line)
	pad := ""
	if w < p.width {
		pad = strings.Repeat(" ", p.width-w)
	}
	p.width = w
	fmt.Fprint(p.w, "\r"+line+pad)
}

// End blanks the line, if one was written.
func (p *progress) End() {
	if p.width > 0 {
		fmt.Fprint(p.w, "\r"+strings.Repeat(" ", p.width)+"\r")
		p.width = 0
	}
}

// progressLine is the text of the line: with a total not yet reached, the
// percentage and the time left at the rate so far; else the count and the
// time so far.
func progressLine(label string, n, total int, elapsed time.Duration) string {
	if total > 0 && n <= total {
		line := fmt.Sprintf("assessing %s: %s of %s objects (%d %%)", label, grouped(n), grouped(total), min(99, n*100/total))
		if n > 0 {
			left := time.Duration(float64(elapsed) * float64(total-n) / float64(n))
			line += ", " + clockText(left) + " left"
		}
		return line
	}
	return fmt.Sprintf("assessing %s: %s objects, %s so far", label, grouped(n), clockText(elapsed))
}

// clockText writes a duration as m:ss, or h:mm:ss from an hour.
func clockText(d time.Duration) string {
	s := int(d.Round(time.Second) / time.Second)
	if s >= 3600 {
		return fmt.Sprintf("%d:%02d:%02d", s/3600, s/60%60, s%60)
	}
	return fmt.Sprintf("%d:%02d", s/60, s%60)
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
