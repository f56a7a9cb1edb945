package main

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

// TestProgress: silent on a non-terminal; on a terminal nothing in the first
// second, then at most ten lines a second, blanked at the end.
func TestProgress(t *testing.T) {
	var buf bytes.Buffer
	if p := newProgress(&buf); p.enabled {
		t.Fatal("progress enabled on a buffer")
	}
	clock := time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC)
	p := &progress{w: &buf, enabled: true, now: func() time.Time { return clock }}
	p.Begin("big.xlsx")
	for i := 0; i < 100; i++ { // 0.99 s in steps of 10 ms (timings invented for the test)
		p.Set(i * 1000)
		clock = clock.Add(10 * time.Millisecond)
	}
	if buf.Len() != 0 {
		t.Fatalf("wrote %q within the first second", buf.String())
	}
	for i := 0; i < 200; i++ { // 2 s more in steps of 10 ms
		p.Set(1048575)
		clock = clock.Add(10 * time.Millisecond)
	}
	n := strings.Count(buf.String(), "\r")
	if n < 15 || n > 21 {
		t.Errorf("%d updates in 2 s, want about 20", n)
	}
	if !strings.Contains(buf.String(), "assessing big.xlsx: 1 048 575 objects") {
		t.Errorf("line %q", buf.String())
	}
	p.End()
	if !strings.HasSuffix(buf.String(), "\r") {
		t.Error("the line was not blanked at the end")
	}
}
