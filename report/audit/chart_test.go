package audit

import (
	"bytes"
	"strconv"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
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
