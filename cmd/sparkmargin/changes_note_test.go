package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/xuri/excelize/v2"
)

// assess does not use the Changes sheet: a bad row there is a note, not a
// rejected row. The demo survey has no rejected row (its golden), so with one
// bad Changes row the terminal still says 0 rejected and counts the note
// apart, the Summary's rows table says the sheet is not used, --strict exits
// 0, and the note's ID column names the change's target (BAG-CU), not its
// kind (earth). The rule: only whatif reads the Changes sheet (README).
func TestAssessChangesRowIsNotRejected(t *testing.T) {
	dir := t.TempDir()
	sh := inventory.DemoSurvey().Clone()
	var hdr []any
	for _, c := range inventory.SheetColumns(inventory.SheetChanges) {
		hdr = append(hdr, c.Header())
	}
	sh = append(sh, inventory.SheetRows{Name: inventory.SheetChanges, Rows: [][]any{hdr,
		{"earth", "BAG-CU", "lots", "a value that is no resistance (invented)"}}})
	var buf bytes.Buffer
	if err := inventory.WriteSurvey(&buf, sh); err != nil {
		t.Fatal(err)
	}
	survey := filepath.Join(dir, "planned.xlsx")
	if err := os.WriteFile(survey, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "a.xlsx")
	code, stdout, errOut := runCLI(t, "assess", survey, "-o", out, "--strict")
	if code != 0 {
		t.Fatalf("assess --strict exit %d, want 0 (the Changes sheet is not used): %s", code, errOut)
	}
	if !strings.Contains(stdout, " 0 rejected") || strings.Contains(stdout, "(Changes 1)") {
		t.Errorf("terminal counts the Changes row as rejected:\n%s", stdout)
	}
	if !strings.Contains(stdout, "Changes sheet not used by this command: 1 row(s) with a problem") {
		t.Errorf("terminal lacks the Changes note count:\n%s", stdout)
	}
	f, err := excelize.OpenFile(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, _ := f.GetRows("Rejected")
	found := false
	for _, r := range rows {
		if len(r) > 6 && r[2] == inventory.SheetChanges {
			found = true
			if r[6] != "BAG-CU" {
				t.Errorf("Changes note's ID %q, want the target BAG-CU: %q", r[6], r)
			}
		}
	}
	if !found {
		t.Errorf("no Changes note on the Rejected sheet: %q", rows)
	}
	sum, _ := f.GetRows("Summary")
	found = false
	for _, r := range sum {
		if len(r) > 3 && r[0] == inventory.SheetChanges {
			found = true
			if r[2] != "not used by this command" || !strings.HasPrefix(r[3], "none (1 row(s) with a problem") {
				t.Errorf("Summary's Changes row %q", r)
			}
		}
	}
	if !found {
		t.Error("the Summary's rows table has no Changes row")
	}
}
