package audit

import (
	"bytes"
	"strconv"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/xuri/excelize/v2"
)

// TestChartShowsAssumedStation: a station whose worst ratio rests on an assumed
// resistance to earth (">= 1 (assumed R)") is drawn as a bar at 1 with that
// label, so the worst-ranked station is never missing from the Summary chart;
// the ratio column is wide enough for the text (17 characters).
func TestChartShowsAssumedStation(t *testing.T) {
	a := testAudit()
	a.Stations[0].WorstRatioAssumed = true
	a.Stations[0].Verdict = assess.Incendive
	var b bytes.Buffer
	if err := WriteWorkbook(&b, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	st := rowsOf(t, f, SheetStations)
	label, value := colIndex(t, st[0], chartLabelHeader), colIndex(t, st[0], chartValueHeader)
	want := a.Stations[0].Station.ID + " incendive (" + assess.RatioAssumedText + ")"
	if got := st[1][label]; got != want {
		t.Errorf("chart label %q, want %q", got, want)
	}
	if v, err := strconv.ParseFloat(st[1][value], 64); err != nil || v != 1 {
		t.Errorf("chart ratio %q, want 1 (a bar at the MIE)", st[1][value])
	}
	if len(assess.RatioAssumedText) > ratioTextWidth {
		t.Errorf("ratio columns %d wide, the text %q is %d", ratioTextWidth, assess.RatioAssumedText, len(assess.RatioAssumedText))
	}
	for _, s := range []string{SheetStations, SheetObjects} {
		ratio := colIndex(t, rowsOf(t, f, s)[0], map[string]string{SheetStations: "Worst ratio E/MIE [–]", SheetObjects: "Ratio E/MIE [–]"}[s])
		name := string(rune('A' + ratio))
		w, err := f.GetColWidth(s, name)
		if err != nil || w < float64(len(assess.RatioAssumedText)) {
			t.Errorf("%s ratio column %s width %v (%v), want at least %d", s, name, w, err, len(assess.RatioAssumedText))
		}
	}
}

// Review N12: the Stations sheet's chart helper columns are hidden (no figure
// to read; the chart reads hidden columns: plotVisOnly off) and the sheet
// prints landscape two pages wide with rank and station repeated.
func TestStationsHelperColumnsHiddenAndPrintable(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	hdr := rowsOf(t, f, SheetStations)[0]
	for _, h := range []string{chartLabelHeader, chartValueHeader} {
		col, _ := excelize.ColumnNumberToName(colIndex(t, hdr, h) + 1)
		if vis, err := f.GetColVisible(SheetStations, col); err != nil || vis {
			t.Errorf("column %s (%s) visible %v (%v), want hidden", col, h, vis, err)
		}
	}
	if vis, _ := f.GetColVisible(SheetStations, "B"); !vis {
		t.Error("station column hidden")
	}
	pl, err := f.GetPageLayout(SheetStations)
	if err != nil || pl.Orientation == nil || *pl.Orientation != "landscape" || pl.FitToWidth == nil || *pl.FitToWidth != 2 {
		t.Errorf("Stations page layout %+v (%v): want landscape, two pages wide", pl, err)
	}
	for _, d := range f.GetDefinedName() {
		if d.Scope == SheetStations && d.Name == "_xlnm.Print_Titles" && d.RefersTo != "'Stations'!$A:$B,'Stations'!$1:$1" {
			t.Errorf("Stations print titles %q", d.RefersTo)
		}
	}
}
