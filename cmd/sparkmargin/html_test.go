package main

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestDemoHTMLGolden: demo writes its HTML report beside the audit, the same
// bytes on every run, and it equals testdata/demo/demo-audit.golden.html
// (rewritten with -update) once the demo's folder, which the Method part
// records in the command line, is written as DIR.
func TestDemoHTMLGolden(t *testing.T) {
	read := func() []byte {
		dir := t.TempDir()
		if code, out, errOut := runCLI(t, "demo", "-o", dir); code != exitOK {
			t.Fatalf("demo: exit %d\n%s%s", code, out, errOut)
		} else if !strings.Contains(out, "HTML report:") {
			t.Errorf("demo does not say where its HTML report is:\n%s", out)
		}
		b, err := os.ReadFile(filepath.Join(dir, "demo-survey-audit.html"))
		if err != nil {
			t.Fatalf("demo did not write its HTML report: %v", err)
		}
		return bytes.ReplaceAll(b, []byte(dir), []byte("DIR"))
	}
	got := read()
	if again := read(); !bytes.Equal(got, again) {
		t.Fatal("two demo runs wrote different HTML reports")
	}
	h := string(got)
	for _, re := range []*regexp.Regexp{
		regexp.MustCompile(`(?i)https?:`), regexp.MustCompile(`(?i)\bsrc\s*=`), regexp.MustCompile(`(?i)\bhref\s*=`),
		regexp.MustCompile(`(?i)<script`), regexp.MustCompile(`(?i)url\(`), regexp.MustCompile(`(?i)@import`),
	} {
		if m := re.FindString(h); m != "" {
			t.Errorf("the demo's HTML report holds %q: it must not fetch anything", m)
		}
	}
	for _, want := range []string{"competent person", "Verdict against relative humidity", "Energy against the MIE", "@media print"} {
		if !strings.Contains(h, want) {
			t.Errorf("the demo's HTML report lacks %q", want)
		}
	}
	golden := filepath.Join("..", "..", "testdata", "demo", "demo-audit.golden.html")
	if *update {
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/sparkmargin -run TestDemoHTMLGolden -update)", err)
	}
	if !bytes.Equal(got, want) {
		g, w := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
		for i := 0; i < len(g) && i < len(w); i++ {
			if g[i] != w[i] {
				t.Fatalf("demo HTML report differs from the golden at line %d:\n got: %s\nwant: %s", i+1, g[i], w[i])
			}
		}
		t.Fatalf("demo HTML report differs from the golden in length: %d lines, want %d", len(g), len(w))
	}
}

// TestAssessHTMLFlag: --html writes the report for one survey (with
// --samples, the spread part), and refuses standard output, a workbook or
// JSON name, the audit workbook's own name and several surveys, as usage errors.
func TestAssessHTMLFlag(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	page := filepath.Join(dir, "report.html")
	if code, out, errOut := runCLI(t, "assess", survey, "--samples", "200", "--html", page); code != exitOK {
		t.Fatalf("assess --html: exit %d\n%s%s", code, out, errOut)
	} else if !strings.Contains(out, page) {
		t.Errorf("assess does not name the HTML report it wrote:\n%s", out)
	}
	b, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), "Monte Carlo, 200 samples per object") || strings.Contains(string(b), "No uncertainty run") {
		t.Error("the HTML report of a sampled run does not say so")
	}
	other := writeDemo(t, t.TempDir())
	for _, c := range []struct {
		name string
		args []string
		want string
	}{
		{"stdout", []string{"assess", survey, "--html", "-"}, "file name"},
		{"workbook name", []string{"assess", survey, "--html", filepath.Join(dir, "r.xlsx")}, "not a workbook"},
		{"json name", []string{"assess", survey, "--html", filepath.Join(dir, "r.json")}, "not a workbook or JSON"},
		{"the audit workbook", []string{"assess", survey, "-o", page, "--html", page}, "same file"},
		{"several surveys", []string{"assess", survey, other, "--html", page}, "one survey"},
	} {
		code, _, errOut := runCLI(t, c.args...)
		if code != exitUsage || !strings.Contains(errOut, c.want) {
			t.Errorf("%s: exit %d, stderr %q; want %d and %q", c.name, code, errOut, exitUsage, c.want)
		}
	}
}
