package main

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

// TestProgress: no line for a non-terminal; on a terminal nothing in the
// first second, then at most ten lines a second with the total, the
// percentage and the time left, blanked at the end; carriage returns only,
// no escape codes.
func TestProgress(t *testing.T) {
	var buf bytes.Buffer
	if p := progressFor(&buf); p != nil {
		t.Fatal("a progress line on a buffer")
	}
	clock := time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC)
	p := newProgress(&buf)
	p.now = func() time.Time { return clock }
	p.Begin("big.xlsx")
	p.Total(1048575)
	for i := 0; i < 100; i++ { // 0.99 s in steps of 10 ms (timings invented for the test)
		p.Set(i * 1000)
		clock = clock.Add(10 * time.Millisecond)
	}
	if buf.Len() != 0 {
		t.Fatalf("wrote %q within the first second", buf.String())
	}
	for i := 0; i < 200; i++ { // 2 s more in steps of 10 ms
		p.Set(349525) // a third of the rows
		clock = clock.Add(10 * time.Millisecond)
	}
	n := strings.Count(buf.String(), "\r")
	if n < 15 || n > 21 {
		t.Errorf("%d updates in 2 s, want about 20", n)
	}
	// A third done after about 3 s: about 6 s left (2:1 at the same rate).
	if !strings.Contains(buf.String(), "assessing big.xlsx: 349 525 of 1 048 575 objects (33 %), 0:06 left") {
		t.Errorf("line %q", buf.String()[strings.LastIndex(buf.String(), "\r"):])
	}
	if strings.Contains(buf.String(), "\x1b") {
		t.Error("an escape code in the progress line")
	}
	p.End()
	if !strings.HasSuffix(buf.String(), "\r") {
		t.Error("the line was not blanked at the end")
	}
}

// TestProgressLine: the line with and without a declared total. Expected
// times by hand: 30 s for 1000 of 4000 leaves 3000 at 1000 per 30 s, 90 s.
func TestProgressLine(t *testing.T) {
	for _, c := range []struct {
		n, total int
		elapsed  time.Duration
		want     string
	}{
		{1000, 4000, 30 * time.Second, "assessing s.xlsx: 1 000 of 4 000 objects (25 %), 1:30 left"},
		{0, 4000, 2 * time.Second, "assessing s.xlsx: 0 of 4 000 objects (0 %)"},
		{4000, 4000, 2 * time.Second, "assessing s.xlsx: 4 000 of 4 000 objects (99 %), 0:00 left"},
		{5000, 4000, 65 * time.Second, "assessing s.xlsx: 5 000 objects, 1:05 so far"},
		{1000, 0, 3725 * time.Second, "assessing s.xlsx: 1 000 objects, 1:02:05 so far"},
	} {
		if got := progressLine("s.xlsx", c.n, c.total, c.elapsed); got != c.want {
			t.Errorf("progressLine(%d, %d, %v) = %q, want %q", c.n, c.total, c.elapsed, got, c.want)
		}
	}
}
