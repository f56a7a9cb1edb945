package audit

import (
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// TestReportSheet: the condensed report is the first sheet, prints in
// portrait one page wide over a print area, and holds the identity, every
// station with its verdict, the findings with their mitigations, the cautions
// and the sign-off block.
func TestReportSheet(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	if got := f.GetSheetList()[0]; got != SheetReport {
		t.Fatalf("first sheet %q, want %q", got, SheetReport)
	}
	pl, err := f.GetPageLayout(SheetReport)
	if err != nil || pl.Orientation == nil || *pl.Orientation != "portrait" || pl.FitToWidth == nil || *pl.FitToWidth != 1 || pl.FitToHeight == nil || *pl.FitToHeight != 0 {
		t.Errorf("Report page layout %+v (%v): want portrait, one page wide, as many pages tall as it takes", pl, err)
	}
	names := map[string]string{}
	for _, d := range f.GetDefinedName() {
		names[d.Scope+"/"+d.Name] = d.RefersTo
	}
	if a := names[SheetReport+"/_xlnm.Print_Area"]; !strings.HasPrefix(a, "'Report'!$A$1:$F$") {
		t.Errorf("Report print area %q", a)
	}
	if tr := names[SheetReport+"/_xlnm.Print_Titles"]; tr != "'Report'!$1:$1" {
		t.Errorf("Report print titles %q, want the title row", tr)
	}
	flat := ""
	for _, r := range rowsOf(t, f, SheetReport) {
		flat += strings.Join(r, "|") + "\n"
	}
	a := testAudit()
	want := []string{"Riverside Films Works", "Stations, worst first", "Findings and actions", "Cautions", "Sign-off", "Prepared by", "Approved by"}
	for i := range a.Stations {
		want = append(want, a.Stations[i].Station.ID+"|"+a.Stations[i].Verdict.String())
	}
	for i := range a.Findings {
		want = append(want, a.Findings[i].Mitigation)
	}
	for _, w := range want {
		if !strings.Contains(flat, w) {
			t.Errorf("Report lacks %q", w)
		}
	}
}

// TestGroupFindingsWorstLeads: a group of one station, check and severity is
// led by its worst object (the highest ratio of energy to MIE) whatever the
// order of the findings, and each action stays with its object. The case is
// the review's ST-PWD group: PWD-DRU1 at ratio 12.5 listed first with an
// action typed against it, PWD-LIN at 100 with none; the expected lead is
// PWD-LIN by the rule "the worst finding leads".
func TestGroupFindingsWorstLeads(t *testing.T) {
	r1, r2 := 12.5, 100.0
	a := &assess.Audit{
		Objects: []assess.ObjectResult{
			{Object: inventory.Object{ID: "PWD-DRU1"}, Ratio: &r1, Findings: []assess.Finding{{ObjectID: "PWD-DRU1"}}},
			{Object: inventory.Object{ID: "PWD-LIN"}, Ratio: &r2, Findings: []assess.Finding{{ObjectID: "PWD-LIN"}}},
		},
		Stations: []assess.StationResult{{Station: inventory.Station{ID: "ST-PWD"}, Rank: 1}},
		Findings: []assess.Finding{
			{ObjectID: "PWD-DRU1", StationID: "ST-PWD", Check: "energy-vs-mie", Severity: assess.Incendive, Message: "drum message"},
			{ObjectID: "PWD-LIN", StationID: "ST-PWD", Check: "energy-vs-mie", Severity: assess.Incendive, Message: "liner message"},
		},
	}
	pl := &ActionPlan{Open: []Action{{Owner: "M. Kell", Status: "in progress"}, {}}}
	gs := groupFindings(a, pl, objectRatios(a.Objects, nil))
	if len(gs) != 1 {
		t.Fatalf("%d groups, want 1", len(gs))
	}
	g := gs[0]
	if g.message != "liner message" || strings.Join(g.objects, ",") != "PWD-LIN,PWD-DRU1" {
		t.Errorf("group led by %q with objects %v; want the liner (ratio 100) first", g.message, g.objects)
	}
	if want := []string{"PWD-DRU1: M. Kell · in progress"}; strings.Join(g.actions, "|") != strings.Join(want, "|") {
		t.Errorf("actions %q, want %q (the drum's action under its name, none for the liner)", g.actions, want)
	}
}

// Review N14: the Report's survey block gives the relative humidity: the
// fixture's Site row enters 40 %RH and station S1 its own 35 %RH (fixture_test.go).
func TestReportSurveyBlockHumidity(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	for _, r := range rowsOf(t, f, SheetReport) {
		if len(r) > 2 && r[0] == "Relative humidity" { // label in A:B, value in C:F
			if !strings.HasPrefix(r[2], "40 % at the site") || !strings.Contains(r[2], "1 station(s) with their own") {
				t.Errorf("survey block RH %q", r[2])
			}
			return
		}
	}
	t.Error("the Report's survey block has no relative humidity")
}
