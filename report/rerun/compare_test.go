package rerun

import (
	"bytes"
	"encoding/json"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// drumSurveys are two surveys of one drum filling station (invented for the
// demo): OLD is dated 2026-03-14 at "Invented test plant", RH 30 %, the drum
// unearthed (1e11 Ω) with 100 pF; NEW is dated a year EARLIER (reversed) at
// another site, RH 60 %, the drum earthed through 1e6 Ω with 150 pF.
// Source for the verdicts: reference section 10 item 6 (see TestEarthingTheDrum):
// unearthed, 47.6 kV and 113 mJ against 10 mJ, incendive; earthed through 1e6 Ω,
// 5 V, non-incendive (derived). The station is the only one: rank 1 on both sides.
func drumSurveys() (old, new *inventory.Survey) {
	drum := func(r, c float64) inventory.Object {
		return inventory.Object{ID: "DRUM", Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
			Resistance: known(r), Capacitance: known(c), ChargingTime: known(1)}
	}
	old = surveyOf(atmDust10, 30, drum(1e11, 100e-12))
	old.Path, old.SHA256 = "drum-2026.xlsx", strings.Repeat("a", 64)
	new = surveyOf(atmDust10, 60, drum(1e6, 150e-12))
	new.Path, new.SHA256 = "drum-2025.xlsx", strings.Repeat("b", 64)
	new.Site.Name = "Another invented works" // invented for the demo
	new.Site.SurveyDate = time.Date(2025, 3, 14, 0, 0, 0, 0, time.UTC)
	return old, new
}

func compareOf(old, new *inventory.Survey) *Comparison {
	a := assess.Assess(old, assess.Options{Limits: Limits(old)})
	b := assess.Assess(new, assess.Options{Limits: Limits(new)})
	return Compare(SideFromAudit(old.Path, a), SideFromAudit(new.Path, b))
}

// Reversed and mismatched surveys: both warnings, both identities, the Site RH
// change and the station whose verdict changed at the same rank.
func TestCompareReversedMismatched(t *testing.T) {
	old, new := drumSurveys()
	c := compareOf(old, new)
	for _, k := range []CautionKind{CautionDifferentSites, CautionReversedDates} {
		if !c.HasCaution(k) {
			t.Errorf("no %q warning: %+v", k, c.Cautions)
		}
	}
	if c.HasCaution(CautionSameFile) || c.HasCaution(CautionNoDate) {
		t.Errorf("unexpected warning: %+v", c.Cautions)
	}
	if c.Old.Identity.SiteText() != "Invented test plant" || c.New.Identity.DateText() != "2025-03-14" || c.Old.Identity.SHA256 != old.SHA256 {
		t.Errorf("identities %+v / %+v", c.Old.Identity, c.New.Identity)
	}
	var rh *FieldChange
	for i, ch := range c.SiteChanges {
		if ch.Field == "Relative humidity" {
			rh = &c.SiteChanges[i]
		}
	}
	if rh == nil || rh.Before.SI == nil || rh.After.SI == nil || *rh.Before.SI != 30 || *rh.After.SI != 60 || rh.After.Unit != "%" {
		t.Fatalf("Site RH change 30 %% → 60 %% not listed: %+v", c.SiteChanges)
	}
	if len(c.Stations) != 1 {
		t.Fatalf("stations listed %+v, want the drum station (verdict changed, rank 1 → 1)", c.Stations)
	}
	m := c.Stations[0]
	if m.RankBefore != 1 || m.RankAfter != 1 || m.VerdictBefore != "incendive" || m.VerdictAfter != "non-incendive" || m.Move() != "same rank, verdict changed" {
		t.Errorf("station %+v (%s)", m, m.Move())
	}

	var term, js bytes.Buffer
	if err := WriteCompareSummary(&term, c); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"drum-2026.xlsx", "drum-2025.xlsx", "Invented test plant", "Another invented works", "2026-03-14", "2025-03-14",
		"aaaaaaaaaaaa", "WARNING (different sites)", "WARNING (dates reversed)", "Relative humidity", "30 %", "60 %", "same rank, verdict changed"} {
		if !strings.Contains(term.String(), want) {
			t.Errorf("terminal lacks %q:\n%s", want, term.String())
		}
	}
	if err := WriteCompareJSON(&js, c); err != nil {
		t.Fatal(err)
	}
	var d struct {
		Old, New struct {
			Path, SHA256, Site string
			SurveyDate         *string `json:"survey_date"`
		}
		Warnings []struct{ Kind string }
		Cautions []string
		Stations []struct {
			ID            string
			VerdictBefore *string `json:"verdict_before"`
			VerdictAfter  *string `json:"verdict_after"`
		}
	}
	if err := json.Unmarshal(js.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	if d.Old.Path != "drum-2026.xlsx" || d.New.Site != "Another invented works" || d.New.SurveyDate == nil || *d.New.SurveyDate != "2025-03-14" ||
		len(d.Warnings) != 2 || len(d.Cautions) == 0 || len(d.Stations) != 1 ||
		d.Stations[0].VerdictAfter == nil || *d.Stations[0].VerdictAfter != "non-incendive" {
		t.Errorf("JSON: %s", js.String())
	}
}

// The same site named with other case and spaces, in date order: no warning.
func TestCompareSameSiteInOrder(t *testing.T) {
	old, new := drumSurveys()
	new.Site.Name = "  invented TEST   plant"
	new.Site.SurveyDate = time.Date(2027, 3, 14, 0, 0, 0, 0, time.UTC)
	if c := compareOf(old, new); len(c.Cautions) != 0 {
		t.Errorf("warnings %+v, want none", c.Cautions)
	}
	// A Site ID on one side only: compared by name, with a note for the portfolio.
	old.Site.ID = "C2"
	if c := compareOf(old, new); !c.HasCaution(CautionOneSiteID) || c.HasCaution(CautionDifferentSites) {
		t.Errorf("a Site ID on one side: %+v", c.Cautions)
	}
	// Site IDs win over names: the same name with two IDs is two sites.
	old.Site.ID, new.Site.ID = "C2", "C3"
	if c := compareOf(old, new); !c.HasCaution(CautionDifferentSites) {
		t.Errorf("two Site IDs: no warning")
	}
	new.Site.SurveyDate = time.Time{}
	if c := compareOf(old, new); !c.HasCaution(CautionNoDate) {
		t.Errorf("a draft: no missing-date warning")
	}
}

// A station setting (its own RH, the atmosphere's zone and MIE) is listed.
func TestCompareStationSettings(t *testing.T) {
	old, new := drumSurveys()
	new.Stations[0].RelativeHumidity = known(20)
	new.Atmospheres[0].Zone = "22"
	new.Atmospheres[0].MIE = known(30e-3)
	got := map[string][2]string{}
	for _, ch := range compareOf(old, new).StationChanges {
		got[ch.Field] = [2]string{ch.Before.Text, ch.After.Text}
	}
	want := map[string][2]string{"Relative humidity": {"the site's", "20 %"}, "Zone": {"21", "22"}, "MIE": {"10 mJ", "30 mJ"}}
	for k, w := range want {
		if got[k] != w {
			t.Errorf("station %s: %v, want %v (all: %v)", k, got[k], w, got)
		}
	}
}

// The workbook stores numbers as numbers, in the survey's display units: RH
// in %, capacitance in pF (100 and 150, not 1e-10), resistance in Ω; counts
// as numbers; both identities and the warnings on the Method sheet.
func TestCompareWorkbookNumbers(t *testing.T) {
	old, new := drumSurveys()
	c := compareOf(old, new)
	var buf bytes.Buffer
	if err := WriteCompareWorkbook(&buf, c, new, RunInfo{ToolVersion: "test"}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	for _, sh := range []string{SheetSummary, SheetSettings, SheetChanged, SheetStations, SheetMethod, SheetCautions} {
		if idx, _ := f.GetSheetIndex(sh); idx < 0 {
			t.Errorf("no sheet %s in %v", sh, f.GetSheetList())
		}
	}
	// findRow returns the row (1-based) whose cells include all of want.
	findRow := func(sheet string, want ...string) int {
		rows, _ := f.GetRows(sheet)
		for i, r := range rows {
			line := "|" + strings.Join(r, "|") + "|"
			ok := true
			for _, w := range want {
				ok = ok && strings.Contains(line, "|"+w+"|")
			}
			if ok {
				return i + 1
			}
		}
		t.Errorf("%s: no row with %v", sheet, want)
		return 0
	}
	number := func(sheet, cell string, want float64) {
		t.Helper()
		typ, err := f.GetCellType(sheet, cell)
		raw, _ := f.GetCellValue(sheet, cell, excelize.Options{RawCellValue: true})
		v, perr := strconv.ParseFloat(raw, 64)
		if err != nil || (typ != excelize.CellTypeNumber && typ != excelize.CellTypeUnset) || perr != nil || v != want {
			t.Errorf("%s!%s = %q (type %v), want the number %g", sheet, cell, raw, typ, want)
		}
	}
	if r := findRow(SheetSettings, "Site", "Relative humidity"); r > 0 {
		number(SheetSettings, "C"+strconv.Itoa(r), 30)
		number(SheetSettings, "D"+strconv.Itoa(r), 60)
	}
	if r := findRow(SheetChanged, "DRUM", "Capacitance"); r > 0 {
		number(SheetChanged, "D"+strconv.Itoa(r), 100) // 100e-12 F shown in pF
		number(SheetChanged, "E"+strconv.Itoa(r), 150)
		if u, _ := f.GetCellValue(SheetChanged, "F"+strconv.Itoa(r)); u != "pF" {
			t.Errorf("capacitance unit %q, want pF", u)
		}
	}
	if r := findRow(SheetChanged, "DRUM", "Resistance to earth"); r > 0 {
		number(SheetChanged, "D"+strconv.Itoa(r), 1e11)
		number(SheetChanged, "E"+strconv.Itoa(r), 1e6)
	}
	if r := findRow(SheetSummary, "Objects changed"); r > 0 {
		number(SheetSummary, "B"+strconv.Itoa(r), 1)
	}
	if r := findRow(SheetStations, "ST-DRUM"); r > 0 {
		number(SheetStations, "C"+strconv.Itoa(r), 1)
		number(SheetStations, "D"+strconv.Itoa(r), 1)
	}
	findRow(SheetMethod, "File", "drum-2026.xlsx", "drum-2025.xlsx")
	findRow(SheetMethod, "Survey date", "2026-03-14", "2025-03-14")
	findRow(SheetMethod, "different sites")
	findRow(SheetMethod, "What compare does not say")
}

// Golden terminal report and JSON of a compare of the drum surveys (regression
// guards; the values are checked in the tests above).
func TestCompareGolden(t *testing.T) {
	c := compareOf(drumSurveys())
	var term, js bytes.Buffer
	if err := WriteCompareSummary(&term, c); err != nil {
		t.Fatal(err)
	}
	if err := WriteCompareJSON(&js, c); err != nil {
		t.Fatal(err)
	}
	golden(t, "compare.txt", term.Bytes())
	golden(t, "compare.json", js.Bytes())
}
