package audit

import (
	"strings"
	"testing"
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
