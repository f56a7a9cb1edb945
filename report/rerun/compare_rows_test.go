package rerun

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// drumAt is a drum filled at 0.5 kg/s with 10 µC/kg for 1 s (invented for
// the demo): with R 1e11 Ω and C c its potential is 47.6 kV and its energy
// C V²/2 (reference section 10 item 6, derived); with R 1e6 Ω it holds 5 V
// and cannot spark (derived). r < 0: resistance to earth not measured.
func drumAt(id, station string, r, c float64) inventory.Object {
	o := inventory.Object{ID: id, Station: station, Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
		Capacitance: known(c), ChargingTime: known(1)}
	if r > 0 {
		o.Resistance = known(r)
	}
	return o
}

// stationsSurvey is a survey of two stations ST-A and ST-B in a dust of
// MIE 10 mJ (invented for the demo) holding the given objects.
func stationsSurvey(path string, objs ...inventory.Object) *inventory.Survey {
	s := surveyOf(atmDust10, 30)
	s.Path, s.SHA256 = path, strings.Repeat("c", 63)+path[len(path)-1:]
	for i, id := range []string{"ST-A", "ST-B"} {
		s.Stations = append(s.Stations, inventory.Station{ID: id, Name: "Station " + id, Atmosphere: atmDust10.ID, Row: i + 2})
	}
	for i, o := range objs {
		o.Row = i + 2
		s.Objects = append(s.Objects, o)
	}
	return s
}

// Review item 3: ST-A loses its worst object BIG (unearthed drum of 100 pF:
// 113 mJ against 10 mJ, ratio 11.3) and keeps SMALL (earthed through 1e6 Ω,
// 5 V, no spark); ST-B's drum of 50 pF (57 mJ, ratio 5.7) then ranks first.
// ST-A drops because BIG is missing, not because it improved: no "better".
// Item 2: when BIG's row is rejected in NEW instead, it is not "removed".
func TestCompareObjectsMissingAtStation(t *testing.T) {
	old := stationsSurvey("old-1", drumAt("BIG", "ST-A", 1e11, 100e-12), drumAt("SMALL", "ST-A", 1e6, 100e-12), drumAt("MID", "ST-B", 1e11, 50e-12))
	removed := stationsSurvey("new-2", drumAt("SMALL", "ST-A", 1e6, 100e-12), drumAt("MID", "ST-B", 1e11, 50e-12))
	c := compareOf(old, removed)
	if len(c.Removed) != 1 || c.Removed[0] != "BIG" || c.Rejected() != 0 {
		t.Fatalf("removed %v, rejected %d; want BIG removed", c.Removed, c.Rejected())
	}
	moves := map[string]RankMove{}
	for _, m := range c.Stations {
		moves[m.ID] = m
	}
	a := moves["ST-A"]
	if a.RankBefore != 1 || a.RankAfter != 2 {
		t.Fatalf("ST-A ranks %d → %d, want 1 → 2", a.RankBefore, a.RankAfter)
	}
	if got, want := a.Move(), "down 1: object BIG removed"; got != want {
		t.Errorf("ST-A move %q, want %q", got, want)
	}
	// ST-B's objects and result (57 mJ, ratio 5.7) are the same on both
	// sides: it moved up only because ST-A lost BIG, so it is not "worse".
	if got, want := moves["ST-B"].Move(), "up 1: its own result unchanged, objects added, removed or rejected at other stations"; got != want {
		t.Errorf("ST-B move %q, want %q", got, want)
	}

	rejected := stationsSurvey("new-3", drumAt("SMALL", "ST-A", 1e6, 100e-12), drumAt("MID", "ST-B", 1e11, 50e-12))
	rejected.Rejected = []inventory.Rejected{{Sheet: inventory.SheetObjects, Row: 2, ID: "BIG", Station: "ST-A",
		Problems: []inventory.Problem{{Sheet: inventory.SheetObjects, Row: 2, Message: `material "Steal" is neither built in nor on the Materials sheet`}}}}
	c = compareOf(old, rejected)
	if len(c.Removed) != 0 || len(c.RejectedNew) != 1 || c.RejectedNew[0].ID != "BIG" || !c.HasCaution(CautionRejected) {
		t.Fatalf("removed %v, rejected in NEW %+v, cautions %+v: want BIG rejected, not removed, with a warning", c.Removed, c.RejectedNew, c.Cautions)
	}
	for _, m := range c.Stations {
		if m.ID == "ST-A" && m.Move() != "down 1: object BIG rejected on one side (not compared)" {
			t.Errorf("ST-A move %q", m.Move())
		}
	}
	var term, js bytes.Buffer
	if err := WriteCompareSummary(&term, c); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Removed (0): none", "Rejected in NEW (1", "see its audit / Rejected sheet", "BIG (row 2"} {
		if !strings.Contains(term.String(), want) {
			t.Errorf("terminal lacks %q:\n%s", want, term.String())
		}
	}
	if strings.Contains(term.String(), "better") {
		t.Errorf("terminal calls a move better:\n%s", term.String())
	}
	if err := WriteCompareJSON(&js, c); err != nil {
		t.Fatal(err)
	}
	var d struct {
		Removed     []string `json:"removed"`
		RejectedNew []struct {
			ID string `json:"id"`
		} `json:"rejected_new"`
	}
	if err := json.Unmarshal(js.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	if len(d.Removed) != 0 || len(d.RejectedNew) != 1 || d.RejectedNew[0].ID != "BIG" {
		t.Errorf("JSON removed %v rejected_new %v", d.Removed, d.RejectedNew)
	}
}

// Review item 5: a drum whose resistance to earth is not measured is taken as
// unearthed (no leakage, reference section 12): its ratio is at least 1 and
// its size no figure, so compare shows the mark, not the number.
func TestCompareKeepsAssumedResistanceMark(t *testing.T) {
	old := stationsSurvey("old-1", drumAt("BIG", "ST-A", -1, 100e-12), drumAt("MID", "ST-B", 1e6, 50e-12))
	new := stationsSurvey("new-2", drumAt("BIG", "ST-A", 1e6, 100e-12), drumAt("MID", "ST-B", 1e6, 50e-12))
	c := compareOf(old, new)
	var st RankMove
	for _, m := range c.Stations {
		if m.ID == "ST-A" {
			st = m
		}
	}
	if !st.WorstRatioAssumedBefore || st.WorstRatioAssumedAfter {
		t.Fatalf("ST-A assumed before %v after %v; want before only (%+v)", st.WorstRatioAssumedBefore, st.WorstRatioAssumedAfter, c.Stations)
	}
	var term, js bytes.Buffer
	WriteCompareSummary(&term, c)
	if !strings.Contains(term.String(), assess.RatioAssumedText) {
		t.Errorf("terminal lacks %q:\n%s", assess.RatioAssumedText, term.String())
	}
	WriteCompareJSON(&js, c)
	if !strings.Contains(js.String(), `"worst_ratio_before_assumed_resistance": true`) {
		t.Errorf("JSON lacks the assumed mark:\n%s", js.String())
	}
	// An audit JSON carries the mark through compare as well.
	a := assess.Assess(old, assess.Options{Limits: Limits(old)})
	var buf bytes.Buffer
	if err := writeAuditJSON(&buf, a); err != nil {
		t.Fatal(err)
	}
	side, err := SideFromJSON("old.json", buf.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	if !side.Stations[0].WorstRatioAssumed || !side.Objects[0].RatioAssumed {
		t.Errorf("audit JSON side lost the mark: %+v %+v", side.Stations[0], side.Objects[0])
	}
}

// Review item 14: an audit JSON compared with the survey it was made from is
// the same survey (the checksum recorded in the JSON), not "two versions".
func TestCompareAuditJSONWithItsSurvey(t *testing.T) {
	s := stationsSurvey("survey-1", drumAt("BIG", "ST-A", 1e11, 100e-12), drumAt("MID", "ST-B", 1e6, 50e-12))
	a := assess.Assess(s, assess.Options{Limits: Limits(s)})
	var buf bytes.Buffer
	if err := writeAuditJSON(&buf, a); err != nil {
		t.Fatal(err)
	}
	js, err := SideFromJSON("audit.json", buf.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	if js.Identity.SHA256 != s.SHA256 || js.Identity.FileSHA256 == "" || js.Identity.FileSHA256 == s.SHA256 {
		t.Fatalf("JSON side identity %+v: want the survey's checksum %s and the file's apart", js.Identity, s.SHA256)
	}
	sv := SideFromAudit("survey-1", a)
	c := Compare(js, sv)
	if !c.HasCaution(CautionSameFile) || c.HasCaution(CautionSameDate) {
		t.Fatalf("cautions %+v: want the same survey, not two versions", c.Cautions)
	}
	for _, k := range c.Cautions {
		if k.Kind == CautionSameFile && !strings.Contains(k.Text, "the same survey") {
			t.Errorf("caution %q does not say the same survey", k.Text)
		}
		if strings.Contains(k.Text, "two versions") {
			t.Errorf("caution %q", k.Text)
		}
	}
}

// Review item 15: two different sites: the stations on one side only are
// counted apart from those whose rank or verdict moved.
func TestCompareDifferentSitesCountsStations(t *testing.T) {
	old := stationsSurvey("old-1", drumAt("BIG", "ST-A", 1e11, 100e-12), drumAt("MID", "ST-B", 1e6, 50e-12))
	old.Site.ID = "HF-P4" // invented for the demo
	new := surveyOf(atmDust10, 30, drumAt("TANK", "", 1e11, 100e-12))
	new.Path, new.SHA256, new.Site.ID = "other-2", strings.Repeat("d", 64), "BR-D1" // invented for the demo
	c := compareOf(old, new)
	if !c.HasCaution(CautionDifferentSites) {
		t.Fatalf("no different-sites warning: %+v", c.Cautions)
	}
	// OLD: ST-A, ST-B; NEW: ST-TANK (surveyOf names the station after the object).
	if c.StationsMoved() != 0 || c.StationsAdded() != 1 || c.StationsRemoved() != 2 {
		t.Errorf("moved %d added %d removed %d, want 0, 1, 2", c.StationsMoved(), c.StationsAdded(), c.StationsRemoved())
	}
	var term bytes.Buffer
	WriteCompareSummary(&term, c)
	if !strings.Contains(term.String(), "0 on both sides whose rank or verdict moved, 1 only in NEW, 2 only in OLD") {
		t.Errorf("terminal:\n%s", term.String())
	}
}
