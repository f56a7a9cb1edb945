package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestCompareReversedOtherSite: compare NEW OLD of two different sites, in
// reverse date order, with the site RH changed: both warnings on the
// terminal, in the JSON and on the workbook; both identities; the RH change
// listed. Survey values invented for the demo.
func TestCompareReversedOtherSite(t *testing.T) {
	dir := t.TempDir()
	later, earlier := filepath.Join(dir, "c2-2026.xlsx"), filepath.Join(dir, "other-2025.xlsx")
	writeDemoSite(t, later, map[string]any{"Survey date": "2026-02-10"})
	writeDemoSite(t, earlier, map[string]any{"Survey date": "2025-02-10", "Site": "Bramley mill (invented)", "Relative humidity": 55.0})
	js, wb := filepath.Join(dir, "c.json"), filepath.Join(dir, "c.xlsx")
	code, out, errOut := runCLI(t, "compare", later, earlier, "-o", wb, "--json", js)
	// different sites: written, warned, and exit 1 (README: Exit codes)
	if code != exitProblems || !strings.Contains(errOut, "different sites") {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"WARNING (different sites)", "WARNING (dates reversed)", "c2-2026.xlsx", "other-2025.xlsx", "2026-02-10", "2025-02-10", "Bramley mill (invented)", "Relative humidity  Site   35 %    55 %"} {
		if !strings.Contains(out, want) {
			t.Errorf("terminal lacks %q:\n%s", want, out)
		}
	}
	data, err := os.ReadFile(js)
	if err != nil {
		t.Fatal(err)
	}
	var d struct {
		Old, New struct {
			Path, SHA256, Site string
			SurveyDate         string `json:"survey_date"`
		}
		Warnings    []struct{ Kind string }
		SiteChanges []struct{ Field string } `json:"site_changes"`
	}
	if err := json.Unmarshal(data, &d); err != nil {
		t.Fatal(err)
	}
	var kinds []string
	for _, w := range d.Warnings {
		kinds = append(kinds, w.Kind)
	}
	if !slices.Equal(kinds, []string{"different sites", "dates reversed"}) || d.Old.SurveyDate != "2026-02-10" || d.New.Site != "Bramley mill (invented)" ||
		len(d.Old.SHA256) != 64 || d.Old.SHA256 == d.New.SHA256 || len(d.SiteChanges) != 1 || d.SiteChanges[0].Field != "Relative humidity" {
		t.Errorf("JSON: %s", data)
	}
	f, err := excelize.OpenFile(wb)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if got := f.GetSheetList(); !slices.Equal(got, []string{"Summary", "Settings changed", "Added", "Removed", "Rejected objects", "Changed", "Stations", "Method", "Cautions"}) {
		t.Errorf("sheets %v", got)
	}
	rows, _ := f.GetRows("Method")
	text := ""
	for _, r := range rows {
		text += strings.Join(r, "|") + "\n"
	}
	for _, want := range []string{"File|" + later + "|" + earlier, "Survey date|2026-02-10|2025-02-10", "different sites|", "dates reversed|", "What compare does not say|"} {
		if !strings.Contains(text, want) {
			t.Errorf("Method sheet lacks %q:\n%s", want, text)
		}
	}
}
