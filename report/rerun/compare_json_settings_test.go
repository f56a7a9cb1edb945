package rerun

import (
	"bytes"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review item N4: an audit JSON (OLD) against a survey (NEW). The JSON holds
// the site RH (30 %), so its move to 45 % is listed; it holds no station RH,
// so the station's own RH (20 % then 35 %) is said to be not compared (audit
// JSON side), never hidden under "no setting changed". Invented for the demo,
// after the reviewer's two surveys of one plant.
func TestCompareJSONSideSettings(t *testing.T) {
	old := surveyOf(atmToluene, 30, drumAt("D1", "", 1e11, 100e-12))
	old.Stations[0].RelativeHumidity = inventory.Known(20)
	newer := surveyOf(atmToluene, 45, drumAt("D1", "", 1e11, 100e-12))
	newer.Stations[0].RelativeHumidity = inventory.Known(35)
	var buf bytes.Buffer
	if err := writeAuditJSON(&buf, assess.Assess(old, assess.Options{Limits: Limits(old)})); err != nil {
		t.Fatal(err)
	}
	oldSide, err := SideFromJSON("old.json", buf.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	newSide := SideFromAudit("new.xlsx", assess.Assess(newer, assess.Options{Limits: Limits(newer)}))
	newSide.Identity.Results = true // as compare reads a survey against a JSON
	c := Compare(oldSide, newSide)
	var rh *FieldChange
	for i := range c.SiteChanges {
		if c.SiteChanges[i].Field == "Relative humidity" {
			rh = &c.SiteChanges[i]
		}
	}
	if rh == nil || rh.Before.Text != "30 %" || rh.After.Text != "45 %" {
		t.Errorf("site RH change %+v, want 30 %% -> 45 %%; all: %+v", rh, c.SiteChanges)
	}
	if !slices.Contains(c.NotCompared, "station relative humidity") {
		t.Errorf("not compared %v, want the station RH named", c.NotCompared)
	}
	for _, ch := range c.StationChanges {
		if ch.Field == "Relative humidity" {
			t.Errorf("station RH compared against a JSON that does not hold it: %+v", ch)
		}
	}
	var term bytes.Buffer
	if err := WriteCompareSummary(&term, c); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(term.String(), "not compared (audit JSON side)") || strings.Contains(term.String(), "no Site item or station setting changed") {
		t.Errorf("terminal:\n%s", term.String())
	}
}

// Review item N13: on the compare workbook's Stations sheet the ratio columns
// sit between the ranks and the verdicts, never beside the Move text (a
// right-aligned number ran into it), and the Method's note on the assumed
// ratio names the charging current as well as the resistance to earth (the
// two assumed inputs of assess.AssumedInputDominates). Drums invented for the
// demo: earthing D1 through 1e6 Ω moves its station.
func TestCompareStationsSheetLayout(t *testing.T) {
	old := surveyOf(atmToluene, 30, drumAt("D1", "", 1e11, 100e-12), drumAt("D2", "", 1e5, 100e-12))
	newer := surveyOf(atmToluene, 30, drumAt("D1", "", 1e6, 100e-12), drumAt("D2", "", 1e5, 100e-12))
	c := Compare(SideFromAudit("old.xlsx", assess.Assess(old, assess.Options{Limits: Limits(old)})),
		SideFromAudit("new.xlsx", assess.Assess(newer, assess.Options{Limits: Limits(newer)})))
	var x bytes.Buffer
	if err := WriteCompareWorkbook(&x, c, newer, RunInfo{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&x)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, _ := f.GetRows(SheetStations)
	hdr := rows[0]
	move := slices.Index(hdr, "Move")
	if move < 1 || strings.HasPrefix(hdr[move-1], "Worst ratio") {
		t.Errorf("Stations header %q: a ratio column beside Move", hdr)
	}
	if w, _ := f.GetColWidth(SheetStations, "I"); hdr[8] != "Move" || w < 50 {
		t.Errorf("Move column %q width %g, want column I at least 50", hdr[8], w)
	}
	method, _ := f.GetRows(SheetMethod)
	found := false
	for _, r := range method {
		for _, v := range r {
			if strings.Contains(v, "or charging current") {
				found = true
			}
		}
	}
	if !found {
		t.Error("the Method's assumed-ratio note does not name the charging current")
	}
}
