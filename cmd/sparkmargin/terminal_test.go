package main

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/templates"
)

// TestAssessTopAndQuiet: --top 1 prints one station row and counts the rest;
// --quiet prints no station table; both keep the counts line, the cautions
// line and the files written.
func TestAssessTopAndQuiet(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	full, out, errOut := runCLI(t, "assess", demo, "-o", filepath.Join(dir, "full.xlsx"))
	if full != exitOK {
		t.Fatalf("assess exit %d: %s", full, errOut)
	}
	rows := stationRows(out)
	if rows < 2 {
		t.Fatalf("the demo needs 2 stations or more for this test, has %d:\n%s", rows, out)
	}
	cases := []struct {
		name     string
		args     []string
		rows     int
		want     []string
		noHeader bool
	}{
		{"top 1", []string{"--top", "1"}, 1, []string{"... " + itoa(rows-1) + " more station(s)"}, false},
		{"quiet", []string{"--quiet"}, 0, nil, true},
		{"quiet short", []string{"-q", "--top", "2"}, 0, nil, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			xlsx := filepath.Join(dir, strings.ReplaceAll(c.name, " ", "-")+".xlsx")
			code, out, errOut := runCLI(t, append([]string{"assess", demo, "-o", xlsx}, c.args...)...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			if got := stationRows(out); got != c.rows {
				t.Errorf("%d station rows, want %d:\n%s", got, c.rows, out)
			}
			for _, w := range append(c.want, "Objects: ", templates.CautionLine, "Audit workbook: "+xlsx) {
				if !strings.Contains(out, w) {
					t.Errorf("stdout lacks %q:\n%s", w, out)
				}
			}
			if c.noHeader && strings.Contains(out, "Rank") {
				t.Errorf("quiet output holds the station table:\n%s", out)
			}
		})
	}
	if code, _, errOut := runCLI(t, "assess", demo, "--top", "-1"); code != exitUsage || !strings.Contains(errOut, "--top") {
		t.Errorf("--top -1: exit %d, stderr %q; want a usage error naming --top", code, errOut)
	}
}

// stationRows counts the station table's rows: the lines after the header
// "Rank ..." up to the first blank line.
func stationRows(out string) int {
	n, in := 0, false
	for _, l := range strings.Split(out, "\n") {
		switch {
		case strings.HasPrefix(l, "Rank"):
			in = true
		case in && strings.TrimSpace(l) == "":
			return n
		case in && !strings.HasPrefix(l, "..."):
			n++
		}
	}
	return n
}
