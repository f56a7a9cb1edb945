package main

import (
	"encoding/json"
	"os"
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
		{"quiet short", []string{"-q"}, 0, []string{"Survey rows: "}, true},
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
	// --top and --quiet contradict each other: a usage error naming both.
	if code, _, errOut := runCLI(t, "assess", demo, "-q", "--top", "2"); code != exitUsage || !strings.Contains(errOut, "--quiet") {
		t.Errorf("-q --top 2: exit %d, stderr %q; want a usage error naming --top and --quiet", code, errOut)
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
		case in && l[0] >= '0' && l[0] <= '9': // a station row starts with its rank; its reason and the notes are indented
			n++
		}
	}
	return n
}

// TestJSONToStdout: --json - puts the JSON, and only it, on standard output
// (it parses whole) and the terminal summary with its cautions line on
// standard error; no file named "-" is written.
func TestJSONToStdout(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	t.Chdir(dir)
	cases := []struct {
		name string
		args []string
	}{
		{"assess", []string{"assess", demo, "-o", filepath.Join(dir, "a.xlsx"), "--json", "-"}},
		{"assess portfolio", []string{"assess", demo, "-o", filepath.Join(dir, "b.xlsx"), "--portfolio-json", "-"}},
		{"whatif", []string{"whatif", demo, "--rh", "55", "-o", filepath.Join(dir, "w.xlsx"), "--json", "-"}},
		{"sweep", []string{"sweep", demo, "--rh", "20:60:20", "--json", "-"}},
		{"compare", []string{"compare", demo, demo, "--json", "-"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			code, out, errOut := runCLI(t, c.args...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			var v any
			if err := json.Unmarshal([]byte(out), &v); err != nil {
				t.Errorf("stdout is not one JSON document (%v):\n%.300s", err, out)
			}
			if !strings.Contains(errOut, "standard output") {
				t.Errorf("stderr does not say the JSON went to standard output:\n%s", errOut)
			}
			if _, err := os.Stat(filepath.Join(dir, "-")); err == nil {
				t.Error(`a file named "-" was written`)
			}
		})
	}
	// The assess and rerun summaries carry the cautions line, on stderr here.
	if _, _, errOut := runCLI(t, "assess", demo, "-o", filepath.Join(dir, "c.xlsx"), "--json", "-"); !strings.Contains(errOut, templates.CautionLine) {
		t.Errorf("stderr lacks the cautions line:\n%s", errOut)
	}
}

// TestOutputFormatChecks: a workbook flag given "-" or a .json name, or a
// JSON flag given a workbook name, is a usage error naming the flag; two
// outputs to standard output are refused.
func TestOutputFormatChecks(t *testing.T) {
	dir := t.TempDir()
	demo := writeDemo(t, dir)
	cases := []struct {
		name string
		args []string
		want string // in stderr
	}{
		{"assess -o json", []string{"assess", demo, "-o", filepath.Join(dir, "audit.json")}, "-o " + filepath.Join(dir, "audit.json") + ": -o writes a workbook (.xlsx), not JSON"},
		{"assess --json xlsx", []string{"assess", demo, "--json", filepath.Join(dir, "audit.xlsx")}, "--json writes JSON, not a workbook"},
		{"assess --json upper-case XLSX", []string{"assess", demo, "--json", filepath.Join(dir, "AUDIT.XLSX")}, "--json writes JSON"},
		{"assess -o -", []string{"assess", demo, "-o", "-"}, "a workbook cannot be written to standard output"},
		{"assess --portfolio -", []string{"assess", demo, "--portfolio", "-"}, "--portfolio -: a workbook cannot"},
		{"assess --portfolio-json xlsx", []string{"assess", demo, "--portfolio-json", "p.xlsx"}, "--portfolio-json writes JSON"},
		{"assess two stdout", []string{"assess", demo, "-o", filepath.Join(dir, "x.xlsx"), "--json", "-", "--portfolio-json", "-"}, "both name standard output"},
		{"assess several --json -", []string{"assess", demo, demo, "--json", "-"}, "with several surveys --json names a folder"},
		{"whatif -o json", []string{"whatif", demo, "--rh", "55", "-o", "w.json"}, "-o writes a workbook"},
		{"whatif --json xlsx", []string{"whatif", demo, "--rh", "55", "--json", "w.xlsx"}, "--json writes JSON"},
		{"sweep -o -", []string{"sweep", demo, "-o", "-"}, "a workbook cannot be written to standard output"},
		{"compare --json xlsm", []string{"compare", demo, demo, "--json", "c.xlsm"}, "--json writes JSON"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			code, out, errOut := runCLI(t, c.args...)
			if code != exitUsage {
				t.Fatalf("exit %d, want %d (stderr %q)", code, exitUsage, errOut)
			}
			if !strings.Contains(errOut, c.want) {
				t.Errorf("stderr %q lacks %q", errOut, c.want)
			}
			if out != "" {
				t.Errorf("stdout not empty: %q", out)
			}
		})
	}
	for _, f := range []string{"audit.json", "audit.xlsx", "AUDIT.XLSX", "x.xlsx"} {
		if _, err := os.Stat(filepath.Join(dir, f)); err == nil {
			t.Errorf("%s was written despite the usage error", f)
		}
	}
}

// TestInterruptMessageNamesStandardOutput: a JSON copied to standard output
// before an interrupt is named as such, not as a file called "-".
func TestInterruptMessageNamesStandardOutput(t *testing.T) {
	msg := interruptMessage(os.Interrupt, []string{"a.xlsx", "-"})
	if !strings.Contains(msg, "a.xlsx, standard output") {
		t.Errorf("message %q does not name standard output", msg)
	}
}

// TestLibraryJSON: library --json is one JSON document with the four lists
// and the cautions; a limit with a Site item is given in that item's unit.
// Check values: the shock energy default converted by hand to mJ; the brush
// energy 4 mJ (CLC/TR 50404 summaries, upper end of 3-4 mJ); the IIB
// transferred charge 25 nC (IEC 60079-0:2017 7.4.2, from memory).
func TestLibraryJSON(t *testing.T) {
	code, out, errOut := runCLI(t, "library", "--json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var lib struct {
		Materials, Substances []map[string]any
		Limits                []struct {
			Limit, Unit string
			UnitSI      string  `json:"unit_si"`
			SiteItem    *string `json:"site_item"`
			Value       *float64
		}
		SiteItems []map[string]any `json:"site_items"`
		Cautions  string
	}
	if err := json.Unmarshal([]byte(out), &lib); err != nil {
		t.Fatalf("not JSON: %v", err)
	}
	if len(lib.Materials) == 0 || len(lib.Substances) == 0 || len(lib.SiteItems) == 0 || lib.Cautions != templates.CautionLine {
		t.Errorf("lists or cautions missing: %d materials, %d substances, %d site items, cautions %q",
			len(lib.Materials), len(lib.Substances), len(lib.SiteItems), lib.Cautions)
	}
	want := map[string]struct {
		item, unit string
		value      float64
	}{
		"BrushEnergy":            {"brush energy", "mJ", 4},
		"TransferredCharge[IIB]": {"transferred charge iib", "nC", 25},
	}
	found := 0
	for _, l := range lib.Limits {
		w, ok := want[l.Limit]
		if !ok {
			continue
		}
		found++
		if l.UnitSI == "" || l.SiteItem == nil || *l.SiteItem != w.item || l.Unit != w.unit || l.Value == nil || *l.Value != w.value {
			t.Errorf("%s: item %v, %v %s; want %q, %g %s", l.Limit, l.SiteItem, l.Value, l.Unit, w.item, w.value, w.unit)
		}
	}
	if found != len(want) {
		t.Errorf("found %d of the %d limits checked", found, len(want))
	}
}
