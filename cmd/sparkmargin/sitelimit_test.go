package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/audit"
)

// surveyWithSiteRow writes the demo survey with one more Site row
// (item | value) and returns its path and the row number.
func surveyWithSiteRow(t *testing.T, dir, item, value string) (string, int) {
	t.Helper()
	demo := writeDemo(t, dir)
	f, err := excelize.OpenFile(demo)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows(inventory.SheetSite)
	if err != nil {
		t.Fatal(err)
	}
	row := len(rows) + 1
	f.SetCellValue(inventory.SheetSite, "A"+strconv.Itoa(row), item)
	f.SetCellValue(inventory.SheetSite, "B"+strconv.Itoa(row), value)
	p := filepath.Join(dir, "bad-limit.xlsx")
	if err := f.SaveAs(p); err != nil {
		t.Fatal(err)
	}
	return p, row
}

// rejectedRowsOf returns the Place and Status texts of the Rejected sheet of a workbook.
func rejectedSiteRows(t *testing.T, xlsx string, row int) []string {
	t.Helper()
	var out []string
	for _, r := range sheetRows(t, xlsx, "Rejected") {
		line := strings.Join(r, " | ")
		if strings.Contains(line, "Shock energy") && strings.Contains(line, strconv.Itoa(row)) {
			out = append(out, line)
		}
	}
	return out
}

// TestBadSiteLimitRow: a Site limit row whose value is not a number
// ("Shock energy [mJ] | abc", the fault reproduced in issue 14) is one
// rejected row everywhere: check reports the error and exits 1; assess lists
// it as rejected and its JSON counts the Site row rejected, not accepted;
// whatif's and sweep's Rejected sheets list it alike.
func TestBadSiteLimitRow(t *testing.T) {
	dir := t.TempDir()
	survey, row := surveyWithSiteRow(t, dir, "Shock energy [mJ]", "abc")

	code, out, errOut := runCLI(t, "check", survey)
	if code != exitProblems {
		t.Fatalf("check: exit %d, want 1\n%s%s", code, out, errOut)
	}
	if !strings.Contains(out, "Shock energy [mJ]") || !strings.Contains(out, `"abc" is not a number`) {
		t.Errorf("check does not name the bad limit row:\n%s", out)
	}
	code, out, _ = runCLI(t, "check", "--json", survey)
	if code != exitProblems {
		t.Fatalf("check --json: exit %d, want 1", code)
	}
	var cj audit.CheckReport
	if err := json.Unmarshal([]byte(out), &cj); err != nil {
		t.Fatal(err)
	}
	found := false
	for _, p := range cj.Problems {
		if p.Sheet == inventory.SheetSite && p.Row == row && p.Severity == "error" && p.Column == "B" {
			found = true
		}
	}
	if !found {
		t.Errorf("check --json has no error at Site!B%d: %+v", row, cj.Problems)
	}

	xlsx, js := filepath.Join(dir, "audit.xlsx"), filepath.Join(dir, "audit.json")
	if code, _, errOut := runCLI(t, "assess", survey, "-o", xlsx, "--json", js); code != exitOK {
		t.Fatalf("assess: exit %d: %s", code, errOut)
	}
	if got := rejectedSiteRows(t, xlsx, row); len(got) != 1 || !strings.Contains(got[0], "row rejected") {
		t.Errorf("assess Rejected sheet, the bad limit row: %q, want one line marked row rejected", got)
	}
	data, err := os.ReadFile(js)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Counts struct {
			Rows []struct {
				Sheet                    string
				Read, Accepted, Rejected int
			}
		}
		Rejected []struct {
			Sheet string
			Row   int
		}
		Warnings []struct {
			Sheet string
			Row   int
		}
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	var site struct{ Read, Accepted, Rejected int }
	for _, r := range doc.Counts.Rows {
		if r.Sheet == inventory.SheetSite {
			site.Read, site.Accepted, site.Rejected = r.Read, r.Accepted, r.Rejected
		}
	}
	if site.Rejected != 1 || site.Accepted+site.Rejected != site.Read {
		t.Errorf("JSON Site rows %+v: want the bad row rejected once and accepted + rejected = read", site)
	}
	inRejected := 0
	for _, p := range doc.Rejected {
		if p.Sheet == inventory.SheetSite && p.Row == row {
			inRejected++
		}
	}
	for _, p := range doc.Warnings {
		if p.Sheet == inventory.SheetSite && p.Row == row {
			t.Errorf("the rejected Site row %d is also a warning", row)
		}
	}
	if inRejected != 1 {
		t.Errorf("JSON rejected lists Site row %d %d times, want 1", row, inRejected)
	}

	for _, c := range [][]string{
		{"whatif", survey, "--rh", "55", "-o", filepath.Join(dir, "whatif.xlsx")},
		{"sweep", survey, "--rh", "30:50:20", "-o", filepath.Join(dir, "sweep.xlsx")},
	} {
		if code, _, errOut := runCLI(t, c...); code != exitOK {
			t.Fatalf("%s: exit %d: %s", c[0], code, errOut)
		}
		if got := rejectedSiteRows(t, c[len(c)-1], row); len(got) != 1 {
			t.Errorf("%s Rejected sheet, the bad limit row: %q, want one line", c[0], got)
		}
	}
}

// TestUnknownSiteItemWarnsOnce: a Site item that names nothing known is one
// warning, the same in check and in assess, and its row stays accepted.
func TestUnknownSiteItemWarnsOnce(t *testing.T) {
	dir := t.TempDir()
	survey, row := surveyWithSiteRow(t, dir, "Colour of the door", "red")
	code, out, _ := runCLI(t, "check", "--json", survey)
	if code != exitOK {
		t.Fatalf("check: exit %d, want 0 (a warning only)", code)
	}
	var cj audit.CheckReport
	if err := json.Unmarshal([]byte(out), &cj); err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, p := range cj.Problems {
		if p.Sheet == inventory.SheetSite && p.Row == row {
			n++
			if p.Severity != "warning" {
				t.Errorf("unknown item: %+v, want a warning", p)
			}
		}
	}
	if n != 1 {
		t.Errorf("check reports the unknown item %d times, want once", n)
	}
}
